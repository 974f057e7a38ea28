// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Optics;
using Periodic.Serialization;
using Periodic.SpaceCharge;
using Periodic.Stacks;

namespace Periodic.Cli.Tests.Commands;

/// <summary>A file whose stack holds dopants: the stack commands solve the stack's own space charge at zero bias.</summary>
public sealed class SpaceChargeStackTest
{
    private static string Doped => ToolRunner.Example("modulation-doped-well.json");

    private static SelfConsistentStack Library() => SpaceChargeSolver.SolveStack(StructureFile.Load(Doped).StackDoping!);

    /// <summary>An energy <paramref name="above"/> eV above the rigid leads' band edge, as the tool's invariant text.</summary>
    private static string AboveEdge(double above) =>
        (StructureFile.Load(Doped).Stack!.LeftLead.Potential.ElectronVolts + above).ToString("R", System.Globalization.CultureInfo.InvariantCulture);

    [Fact]
    public void Levels_DopedStack_JsonCarriesTheLibrarySolutionAndItsLevels()
    {
        var run = ToolRunner.Invoke("levels", Doped, "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var library = Library();
        var sc = json.GetProperty("selfConsistent");
        Assert.True(sc.GetProperty("converged").GetBoolean());
        // Same input, same deterministic computation: bit for bit through shortest round-trip JSON.
        Assert.Equal(library.FermiLevelElectronVolts, sc.GetProperty("fermiLevel").GetDouble());
        Assert.Equal(library.Iterations, sc.GetProperty("iterations").GetInt32());
        Assert.True(sc.GetProperty("neutralityError").GetDouble() <= 1e-10); // the required neutrality
        Assert.Equal(library.PositionsNanometres.Count, sc.GetProperty("hartree").GetProperty("positions").GetArrayLength());
        Assert.Equal(library.BufferNanometres, sc.GetProperty("leadBuffer").GetDouble());
        // The levels are those of the self-consistent stack.
        var expected = BoundStateSpectrum.Find(library.Stack);
        var levels = json.GetProperty("levels");
        Assert.Equal(expected.Levels.Count, levels.GetArrayLength());
        Assert.Equal(expected.Levels[0].EnergyElectronVolts, levels[0].GetProperty("energy").GetDouble());
        // The electrons fill the lowest level: the Fermi level lies above it (a degenerate 2D gas at 1e12 cm⁻², 77 K; common practice).
        Assert.True(library.FermiLevelElectronVolts > expected.Levels[0].EnergyElectronVolts);
    }

    [Fact]
    public void Levels_NoSpaceCharge_GivesTheRigidStack()
    {
        var run = ToolRunner.Invoke("levels", Doped, "--json", "--no-space-charge");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.False(json.TryGetProperty("selfConsistent", out _));
        var rigid = BoundStateSpectrum.Find(StructureFile.Load(Doped).Stack!);
        Assert.Equal(rigid.Levels[0].EnergyElectronVolts, json.GetProperty("levels")[0].GetProperty("energy").GetDouble());
    }

    [Fact]
    public void Levels_Table_PrintsTheSummaryLine()
    {
        var run = ToolRunner.Invoke("levels", Doped);
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("Self-consistent (Schrödinger–Poisson) stack at zero bias, 77 K", run.Stdout);
        // The Hartree potential is zero in the leads up to round-off of either sign: a round-off below a µeV prints as
        // 0.000 meV, never as "-0.000" (common practice for tables: no sign on a displayed zero).
        Assert.Contains("Hartree potential from 0.000 to ", run.Stdout);
        Assert.DoesNotContain("from -0.000 ", run.Stdout);
    }

    [Fact]
    public void Transmission_DopedStack_IsThatOfTheSelfConsistentStack()
    {
        var energy = AboveEdge(0.35);
        var run = ToolRunner.Invoke("transmission", Doped, "--json", "--energies", AboveEdge(0.3) + "," + energy);
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.True(json.GetProperty("selfConsistent").GetProperty("converged").GetBoolean());
        var expected = StackTransmission.Create(Library().Stack).Evaluate(double.Parse(energy, System.Globalization.CultureInfo.InvariantCulture)).Transmission;
        Assert.Equal(expected, json.GetProperty("points")[1].GetProperty("transmission").GetDouble());
    }

    [Fact]
    public void Resonances_DopedStack_Runs()
    {
        var run = ToolRunner.Invoke("resonances", Doped, "--json", "--from", AboveEdge(0.2), "--to", AboveEdge(0.6));
        Assert.Equal(0, run.ExitCode);
        Assert.True(run.Json().GetProperty("selfConsistent").GetProperty("converged").GetBoolean());
    }

    [Fact]
    public void Transmission_DopedStackUnderBias_ExitsTwoNamingTheOptionAndWritesNothing()
    {
        var path = Path.Combine(Path.GetTempPath(), $"periodic-scs-{Guid.NewGuid():N}.json");
        var run = ToolRunner.Invoke("transmission", Doped, "--json", "--energies", AboveEdge(0.1), "--bias", "0.05", "--out", path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--bias", run.Stderr);
        Assert.Contains("--no-space-charge", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
        Assert.False(File.Exists(path));
    }

    [Fact]
    public void Levels_DopedStackWithPeriods_ExitsTwoNamingTheOption()
    {
        var run = ToolRunner.Invoke("levels", Doped, "--periods", "3");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--periods", run.Stderr);
    }

    [Fact]
    public void Transitions_DopedStack_AreThoseOfTheSelfConsistentStack()
    {
        var run = ToolRunner.Invoke("transitions", Doped, "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.True(json.GetProperty("selfConsistent").GetProperty("converged").GetBoolean());
        var expected = IntersubbandSpectrum.Compute(Library().Stack).Transitions[0];
        var first = json.GetProperty("transitions")[0];
        Assert.Equal(expected.EnergyElectronVolts, first.GetProperty("energy").GetDouble());
        Assert.Equal(Math.Abs(expected.DipoleNanometres), first.GetProperty("dipole").GetDouble());
    }

    [Fact]
    public void Absorption_DopedStack_Runs()
    {
        var run = ToolRunner.Invoke("absorption", Doped, "--json", "--density", "1e12");
        Assert.Equal(0, run.ExitCode);
        Assert.True(run.Json().GetProperty("selfConsistent").GetProperty("converged").GetBoolean());
    }

    [Theory]
    [InlineData("current", "--fermi-level", "0.05", "--bias", "0.1")]
    [InlineData("ladder", "--field", "10")]
    public void BiasedCommands_DopedStack_ExitTwoPointingToTheRigidBands(string command, params string[] options)
    {
        var run = ToolRunner.Invoke([command, Doped, "--json", .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-space-charge", run.Stderr);
        Assert.Equal("", run.Stdout);
    }

    [Fact]
    public void Transitions_DopedStackInterband_ExitsTwo()
    {
        var run = ToolRunner.Invoke("transitions", Doped, "--carrier", "interband");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-space-charge", run.Stderr);
    }

    [Fact]
    public void Levels_TooManyStatesToSum_ExitsOneAndWritesNothing()
    {
        // 100 periods of 10 nm, heavy electrons at 1000 K: thousands of states of the domain lie within 40 k_BT of the
        // Fermi level, beyond the bound on the sum over states: a numerical refusal (exit 1), no output file.
        var file = ToolRunner.TempFile("""
            {"name": "hot", "temperature": 1000, "cell": [{"width": 10, "potential": 0, "mass": 1, "permittivity": 12, "donors": 1e20}],
             "stack": {"parts": [{"repeat": 100}], "leads": {"potential": 0, "mass": 1}}}
            """);
        var path = Path.Combine(Path.GetTempPath(), $"periodic-scs-{Guid.NewGuid():N}.json");
        var run = ToolRunner.Invoke("levels", file, "--json", "--out", path);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("states", run.Stderr);
        Assert.False(File.Exists(path));
    }

    [Fact]
    public void Levels_DopedStackFileBias_ExitsTwoNamingTheField()
    {
        var file = ToolRunner.TempFile("""
            {"name": "b", "temperature": 77, "cell": [{"width": 8, "potential": 0, "mass": 0.067, "permittivity": 12.9, "sheetDonors": 1e11}, {"width": 10, "potential": 0.25, "mass": 0.092, "permittivity": 12.2}],
             "stack": {"periods": 2, "leads": {"potential": 0.25, "mass": 0.092}, "bias": 0.05}}
            """);
        var run = ToolRunner.Invoke("transmission", file, "--energies", "0.3");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("stack.bias", run.Stderr);
    }

    [Fact]
    public void Plot_Stack_DopedStack_WritesThePicture()
    {
        var path = Path.Combine(Path.GetTempPath(), $"periodic-scs-{Guid.NewGuid():N}.png");
        try
        {
            var run = ToolRunner.Invoke("plot", Doped, "--show", "stack", "--out", path);
            Assert.Equal(0, run.ExitCode);
            Assert.True(new FileInfo(path).Length > 1000);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
