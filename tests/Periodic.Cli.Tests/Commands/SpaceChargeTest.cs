// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Serialization;
using Periodic.SpaceCharge;

namespace Periodic.Cli.Tests.Commands;

/// <summary>A doped structure file: every command works on the self-consistent cell unless --no-space-charge is given.</summary>
public sealed class SpaceChargeTest
{
    private static string Doped => ToolRunner.Example("doped-superlattice.json");

    [Fact]
    public void Bands_DopedFile_JsonCarriesTheSelfConsistentSolutionOfTheLibrary()
    {
        var run = ToolRunner.Invoke("bands", Doped, "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var sc = json.GetProperty("selfConsistent");
        var library = SpaceChargeSolver.Solve(StructureFile.Load(Doped).Doping!);
        Assert.True(sc.GetProperty("converged").GetBoolean());
        // Same input, same deterministic computation: the numbers come back bit for bit (shortest round-trip JSON).
        Assert.Equal(library.FermiLevelElectronVolts, sc.GetProperty("fermiLevel").GetDouble());
        Assert.Equal(library.Iterations, sc.GetProperty("iterations").GetInt32());
        Assert.True(sc.GetProperty("neutralityError").GetDouble() <= 1e-10); // the required neutrality
        var hartree = sc.GetProperty("hartree");
        Assert.Equal(library.PositionsNanometres.Count, hartree.GetProperty("positions").GetArrayLength());
        Assert.Equal(library.HartreeElectronVolts[7], hartree.GetProperty("values")[7].GetDouble());
        Assert.Equal(library.ElectronDensityPerCubicCentimetre.Count, sc.GetProperty("electronDensity").GetProperty("values").GetArrayLength());
        // The band table is that of the self-consistent cell.
        var expected = BandSolver.Compute(library.Cell, 4).Structure;
        Assert.Equal(expected.GetBand(1).BottomElectronVolts, json.GetProperty("bands")[0].GetProperty("bottom").GetDouble(), 1e-12);
    }

    [Fact]
    public void Bands_NoSpaceCharge_GivesTheRigidBands()
    {
        var run = ToolRunner.Invoke("bands", Doped, "--json", "--no-space-charge");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.False(json.TryGetProperty("selfConsistent", out _));
        var rigid = BandStructure.Compute(StructureFile.Load(Doped).Cell, 4);
        Assert.Equal(rigid.GetBand(1).BottomElectronVolts, json.GetProperty("bands")[0].GetProperty("bottom").GetDouble());
    }

    [Fact]
    public void Table_DopedFile_PrintsASummaryLine()
    {
        var run = ToolRunner.Invoke("dispersion", Doped, "--points", "5");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("Self-consistent (Schrödinger–Poisson) potential at 77 K", run.Stdout);
    }

    [Fact]
    public void Bands_AcceptorsInAPlainPotentialLayer_ExitsTwoNamingTheField()
    {
        // A layer given by potential and mass has no valence band for the holes the acceptors make.
        var file = ToolRunner.TempFile("""
            {"name": "p", "temperature": 300, "cell": [{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12.9, "donors": 1e17, "acceptors": 3e17}]}
            """);
        var run = ToolRunner.Invoke("bands", file, "--json");
        Assert.Equal(2, run.ExitCode);
        Assert.Equal("", run.Stdout);
        Assert.Contains("cell[0].acceptors", run.Stderr);
        Assert.Contains("valence band", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
    }

    private static string PDoped => ToolRunner.Example("p-doped-superlattice.json");

    [Fact]
    public void Bands_PTypeMaterialFile_JsonCarriesTheHoleDensityOfTheLibrary()
    {
        var run = ToolRunner.Invoke("bands", PDoped, "--json");
        Assert.Equal(0, run.ExitCode);
        var sc = run.Json().GetProperty("selfConsistent");
        var library = SpaceChargeSolver.Solve(StructureFile.Load(PDoped).Doping!);
        // Same input, same deterministic computation: bit for bit (shortest round-trip JSON).
        Assert.Equal(library.FermiLevelElectronVolts, sc.GetProperty("fermiLevel").GetDouble());
        Assert.True(sc.GetProperty("neutralityError").GetDouble() <= 1e-10); // the required neutrality
        var holes = sc.GetProperty("holeDensity").GetProperty("values");
        Assert.Equal(library.HoleDensityPerCubicCentimetre.Count, holes.GetArrayLength());
        Assert.Equal(library.HoleDensityPerCubicCentimetre[10], holes[10].GetDouble());
        Assert.Equal(sc.GetProperty("electronDensity").GetProperty("values").GetArrayLength(), holes.GetArrayLength());
        Assert.Equal("cm^-3", sc.GetProperty("units").GetProperty("holeDensity").GetString());
        var bands = sc.GetProperty("valenceBands");
        Assert.Equal("heavy holes", bands[0].GetProperty("name").GetString());
        Assert.Equal("light holes", bands[1].GetProperty("name").GetString());
        Assert.Contains("single parabolic band", sc.GetProperty("model").GetString());
    }

    [Fact]
    public void Levels_PTypeStackOfMaterials_SolvesWithHoles()
    {
        // A p-type modulation-doped stack of material layers and leads: its holes are carriers, levels exits 0 and the JSON
        // carries p(z); every acceptor is ionised, so the holes per area equal N_A times the doped width (full ionisation;
        // common practice, no single source), to 1e-2 relative: the trapezoid rule on the 0.1 nm grid and the holes' share
        // spilling into the 30 nm lead buffers both stay well inside that.
        var file = ToolRunner.TempFile("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4, "acceptors": "5e18 cm^-3"},
              {"material": "GaAs", "width": 8}],
             "stack": {"periods": 2, "leads": {"material": "Al0.3Ga0.7As"}}}
            """);
        var run = ToolRunner.Invoke("levels", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var sc = run.Json().GetProperty("selfConsistent");
        Assert.True(sc.GetProperty("converged").GetBoolean());
        Assert.True(sc.GetProperty("neutralityError").GetDouble() <= 1e-10);
        var holes = sc.GetProperty("holeDensity");
        var x = holes.GetProperty("positions").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var p = holes.GetProperty("values").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var total = 0.0;
        for (var i = 1; i < x.Length; i++)
        {
            total += 0.5 * (p[i] + p[i - 1]) * (x[i] - x[i - 1]) * 1e-7; // cm⁻²
        }
        Assert.Equal(2 * 5e18 * 4e-7, total, 1e-2 * 2 * 5e18 * 4e-7);
        Assert.Equal("cm^-3", sc.GetProperty("units").GetProperty("holeDensity").GetString());
        Assert.Equal("heavy holes", sc.GetProperty("valenceBands")[0].GetProperty("name").GetString());
        Assert.Contains("holes", sc.GetProperty("model").GetString());
    }

    [Fact]
    public void Levels_PTypeStackWithLeadOfPotential_ExitsTwoNamingWhatIsNotModelled()
    {
        // A lead given by potential and mass has no valence band: the stack's space charge is refused, the rigid stack offered.
        var file = ToolRunner.TempFile("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4, "acceptors": "5e18 cm^-3"},
              {"material": "GaAs", "width": 8}],
             "stack": {"periods": 2, "leads": {"potential": 0.25, "mass": 0.092}}}
            """);
        var run = ToolRunner.Invoke("levels", file, "--json");
        Assert.Equal(2, run.ExitCode);
        Assert.Equal("", run.Stdout);
        Assert.Contains("every layer and lead is of a material with a hole mass", run.Stderr);
        Assert.Contains("--no-space-charge", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
        Assert.Equal(0, ToolRunner.Invoke("levels", file, "--json", "--no-space-charge").ExitCode);
    }

    [Fact]
    public void Levels_AcceptorsOnlyInAStackWithALayerOfPotential_ExitsTwoInsteadOfTheRigidStack()
    {
        // The cell is undoped and the stack's acceptors sit beside a layer given by potential and mass (no valence band):
        // the stack's space charge is refused, never silently replaced by the rigid stack.
        var file = ToolRunner.TempFile("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4},
              {"material": "GaAs", "width": 8}],
             "stack": {"leads": {"material": "GaAs"}, "parts": [
               {"material": "GaAs", "width": 20, "acceptors": "1e18 cm^-3"},
               {"width": 5, "potential": 0, "mass": 0.067, "permittivity": 12.9},
               {"material": "Al0.3Ga0.7As", "width": 4}]}}
            """);
        var run = ToolRunner.Invoke("levels", file, "--json");
        Assert.Equal(2, run.ExitCode);
        Assert.Equal("", run.Stdout);
        Assert.Contains("every layer and lead is of a material with a hole mass", run.Stderr);
        Assert.Contains("--no-space-charge", run.Stderr);
        Assert.Equal(0, ToolRunner.Invoke("levels", file, "--json", "--no-space-charge").ExitCode);
    }

    [Theory]
    [InlineData("doped-superlattice.json")]
    [InlineData("p-doped-superlattice.json")] // holes only: the density axis is scaled to p(z)
    public void Plot_Profile_DopedFile_WritesThePicture(string example)
    {
        var path = Path.Combine(Path.GetTempPath(), $"periodic-sc-{Guid.NewGuid():N}.png");
        try
        {
            var run = ToolRunner.Invoke("plot", ToolRunner.Example(example), "--show", "profile", "--out", path);
            Assert.Equal(0, run.ExitCode);
            Assert.True(new FileInfo(path).Length > 1000);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Theory]
    [InlineData("ladder", "--field", "10")]
    [InlineData("iv", "--fermi-level", "0.05")]
    public void Plot_LadderOrIv_DopedFile_ExitsTwoPointingToTheRigidBands(string show, string option, string value)
    {
        var path = Path.Combine(Path.GetTempPath(), $"periodic-sc-{Guid.NewGuid():N}.png");
        var run = ToolRunner.Invoke("plot", Doped, "--show", show, option, value, "--out", path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-space-charge", run.Stderr);
        Assert.False(File.Exists(path));
    }

    [Fact]
    public void DopedCellOfIsolatedWell_FailureSaysToGiveAStack()
    {
        // One doped 6 nm GaAs well between 20 nm Al0.3Ga0.7As barriers, no stack: the cell is solved as a superlattice whose wells,
        // 40 nm apart, are too isolated for its Bloch states (exit 1); the message points to the finite stack, which works.
        const string cell = """
            {"name": "doped well", "temperature": "77 K", "cell": [{"material": "Al0.3Ga0.7As", "width": "20 nm"}, {"material": "GaAs", "width": "6 nm", "donors": "1e18 cm^-3"}, {"material": "Al0.3Ga0.7As", "width": "20 nm"}]
            """;
        var file = ToolRunner.TempFile(cell + "}");
        var run = ToolRunner.Invoke("transitions", file);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("solved as a superlattice", run.Stderr);
        Assert.Contains("give the file a \"stack\"", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
        var stack = ToolRunner.TempFile(cell + """, "stack": {"periods": 1, "leads": {"material": "Al0.3Ga0.7As"}}}""");
        run = ToolRunner.Invoke("transitions", stack);
        Assert.True(run.ExitCode == 0, run.Stderr);
    }
}
