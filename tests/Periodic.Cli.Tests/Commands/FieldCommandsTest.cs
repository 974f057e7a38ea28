// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Serialization;
using Periodic.Structures;

namespace Periodic.Cli.Tests.Commands;

public sealed class FieldCommandsTest
{
    [Fact]
    public void Drift_Json_MatchesLibraryAndRoundTrips()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("drift", file, "--scattering-time", "0.1", "--points", "5", "--max-field", "20", "--density", "1e16", "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var drift = MinibandDrift.Create(BandStructure.Compute(StructureFile.Load(file).Cell, 1), 1, 0.1e-12);
        var points = json.GetProperty("points");
        Assert.Equal(5, points.GetArrayLength());
        // Shortest round-trip JSON numbers: the library's doubles come back bit for bit (20 kV/cm · 3/4 = 15 kV/cm = 1.5e6 V/m).
        Assert.Equal(drift.VelocityAt(1.5e6), points[3].GetProperty("velocity").GetDouble());
        Assert.Equal(drift.PeakVelocityMetresPerSecond, json.GetProperty("peakVelocity").GetDouble());
        Assert.Equal("kV/cm", json.GetProperty("units").GetProperty("field").GetString());
    }

    [Fact]
    public void Drift_FieldBeyondSingleMinibandLimit_ExitsTwoNamingOption()
    {
        var run = ToolRunner.Invoke("drift", ToolRunner.Example("superlattice.json"), "--scattering-time", "0.1", "--max-field", "1e6");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--max-field", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Ladder_BadField_ExitsTwoNamingOption()
    {
        foreach (var value in new[] { "0", "-5", "1e6" })
        {
            var run = ToolRunner.Invoke("ladder", ToolRunner.Example("superlattice.json"), "--field", value);
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("--field", run.Stderr, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void InPlaneWavevector_BandsMatchLibraryCellAtKParallel()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("bands", file, "--in-plane-wavevector", "0.4", "--json");
        Assert.Equal(0, run.ExitCode);
        var expected = BandStructure.Compute(InPlaneMotion.CellAt(StructureFile.Load(file).Cell, 0.4), 4);
        Assert.Equal(expected.Bands[0].BottomElectronVolts, run.Json().GetProperty("bands")[0].GetProperty("bottom").GetDouble());
    }

    [Theory]
    [InlineData("bands")]
    [InlineData("dispersion")]
    [InlineData("dos")]
    [InlineData("transmission")]
    public void InPlaneWavevector_NegativeOrNotANumber_ExitsTwoNamingOption(string command)
    {
        foreach (var value in new[] { "-0.1", "nan", "abc" })
        {
            string[] args = command is "dos" or "transmission"
                ? [command, ToolRunner.Example("superlattice.json"), "--in-plane-wavevector", value, "--energies", "0.1"]
                : [command, ToolRunner.Example("superlattice.json"), "--in-plane-wavevector", value];
            var run = ToolRunner.Invoke(args);
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("--in-plane-wavevector", run.Stderr, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Drift_BlochFrequency_IsEFdOverPlanck()
    {
        // ω_B = eFd/ħ, f_B = eFd/h (Esaki & Tsu 1970), with the exact SI e and h (CODATA 2018); d = 7 nm (5 nm + 2 nm).
        var run = ToolRunner.Invoke("drift", ToolRunner.Example("superlattice.json"), "--scattering-time", "0.1", "--points", "5", "--max-field", "20", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        foreach (var point in run.Json().GetProperty("points").EnumerateArray())
        {
            var f = point.GetProperty("field").GetDouble() * 1e5; // kV/cm → V/m
            var expected = 1.602176634e-19 * f * 7e-9 / 6.62607015e-34;
            // 1e-14 relative: a few roundings of the same product.
            Assert.Equal(expected, point.GetProperty("blochFrequency").GetDouble(), 1e-14 * Math.Max(expected, 1));
        }
    }

    [Fact]
    public void Drift_WeakField_IsDrudeWithTheBandBottomMass()
    {
        // Esaki & Tsu's v(F) starts linearly: v = eτF/m* with m* the band-bottom mass ħ²/(d²E/dk²) along the growth axis (the Drude
        // limit of the Boltzmann solution for carriers at the band bottom, T = 0). Taken at F = 1e-4 ħ/(edτ), where the next term is
        // (ω_Bτ)² ≈ 1e-8 relative (times the harmonics' weights); tolerance 1e-7 for that and for the drift's Fourier series of E(k)
        // (measured: 2e-9).
        var file = ToolRunner.Example("superlattice.json");
        var probe = ToolRunner.Invoke("drift", file, "--scattering-time", "0.1", "--json").Json();
        var field = 1e-4 * probe.GetProperty("criticalField").GetDouble();
        var run = ToolRunner.Invoke("drift", file, "--scattering-time", "0.1", "--points", "2", "--max-field", field.ToString("R", CultureInfo.InvariantCulture), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var mass = ToolRunner.Invoke("bands", file, "--count", "1", "--json").Json().GetProperty("bands")[0].GetProperty("massAtBottom").GetDouble();
        var expected = 1.602176634e-19 * 0.1e-12 * field * 1e5 / (mass * 9.1093837015e-31); // CODATA 2018 e and m_e
        Assert.Equal(expected, run.Json().GetProperty("points")[1].GetProperty("velocity").GetDouble(), 1e-7 * expected);
    }

    [Fact]
    public void Ladder_Spacing_IsEFdInTheMiddle()
    {
        // Wannier–Stark ladder: rungs eFd apart (Wannier 1960; Esaki & Tsu 1970), exactly eFd in an infinite superlattice; in the middle
        // of a 30-period stack the contacts' influence has decayed to far below 1e-8 (the acceptance bound).
        var run = ToolRunner.Invoke("ladder", ToolRunner.Example("superlattice.json"), "--field", "10", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var efd = 10e5 * 7e-9; // eV: F (V/m) x d (m)
        Assert.Equal(efd, json.GetProperty("spacing").GetDouble(), 1e-15 * efd);
        Assert.Equal(efd, json.GetProperty("centralSpacing").GetDouble(), 1e-8 * efd);
        // The rungs are the library's, bit for bit (shortest round-trip JSON).
        var expected = Periodic.Stacks.WannierStarkLadder.Find(StructureFile.Load(ToolRunner.Example("superlattice.json")).Cell, 1, 30, 1e6);
        var rungs = json.GetProperty("rungs");
        Assert.Equal(expected.Rungs.Count, rungs.GetArrayLength());
        for (var i = 0; i < expected.Rungs.Count; i++)
        {
            Assert.Equal(expected.Rungs[i].EnergyElectronVolts, rungs[i].GetProperty("energy").GetDouble());
            var width = expected.Rungs[i].WidthElectronVolts; // null in JSON where T never falls to half its peak
            Assert.Equal(double.IsFinite(width) ? width : double.NaN,
                rungs[i].GetProperty("width").ValueKind == System.Text.Json.JsonValueKind.Null ? double.NaN : rungs[i].GetProperty("width").GetDouble());
        }
        Assert.Equal("eV", json.GetProperty("units").GetProperty("energy").GetString());
        var csv = ToolRunner.Invoke("ladder", ToolRunner.Example("superlattice.json"), "--field", "10", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("energy (eV),width (eV),log10 peak T,middle", csv[0]);
        // CSV at full precision: the first rung's energy equals the JSON's bit for bit.
        Assert.Equal(json.GetProperty("rungs")[0].GetProperty("energy").GetDouble(), double.Parse(csv[1].Split(',')[0], CultureInfo.InvariantCulture));
    }

    [Theory]
    [InlineData("drift", "rubidium-lattice.json", "drift applies an electric field to charged carriers", "--scattering-time", "0.1")]
    [InlineData("ladder", "rubidium-lattice.json", "ladder applies an electric field to charged carriers", "--field", "10")]
    [InlineData("ladder", "nonparabolic.json", "the ladder puts 30 periods of the cell under the field, which needs parabolic layers and delta barriers", "--field", "10")]
    public void FieldCommands_CellTheFieldCannotAct_ExitsTwoWithoutOutput(string command, string example, string message, params string[] options)
    {
        var target = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "out.json");
        var run = ToolRunner.Invoke([command, ToolRunner.Example(example), "--json", "--out", target, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }
}
