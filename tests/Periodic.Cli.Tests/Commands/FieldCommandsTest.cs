// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

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
}
