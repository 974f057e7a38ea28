// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Serialization;

namespace Periodic.Cli.Tests.Commands;

public sealed class DispersionCommandTest
{
    [Fact]
    public void Dispersion_Json_MatchesLibrary()
    {
        var file = ToolRunner.Example("nonparabolic.json");
        var run = ToolRunner.Invoke("dispersion", file, "--count", "2", "--points", "9", "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var bands = BandStructure.Compute(StructureFile.Load(file).Cell, 2);
        var k = json.GetProperty("wavevectors").EnumerateArray().Select(x => x.GetDouble()).ToArray();
        Assert.Equal(9, k.Length);
        Assert.Equal(0.0, k[0]);
        Assert.Equal(Math.PI / bands.PeriodNanometres, k[^1]);
        for (var n = 1; n <= 2; n++)
        {
            var expected = new double[k.Length];
            bands.EnergiesAt(n, k, expected);
            var got = json.GetProperty("bands")[n - 1].GetProperty("energies").EnumerateArray().Select(x => x.GetDouble()).ToArray();
            Assert.Equal(expected, got); // shortest round-trip JSON: exact
        }
    }

    [Fact]
    public void Dispersion_Out_WritesTheFileAndNoTemporaryFile()
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "e-of-k.csv");
        var run = ToolRunner.Invoke("dispersion", ToolRunner.Example("superlattice.json"), "--points", "5", "--csv", "--out", target);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        var expected = ToolRunner.Invoke("dispersion", ToolRunner.Example("superlattice.json"), "--points", "5", "--csv").Stdout;
        Assert.Equal(expected, File.ReadAllText(target));
        Assert.Equal(new[] { "e-of-k.csv", "structure.json" }, Directory.GetFiles(directory).Select(f => Path.GetFileName(f)).Order(StringComparer.Ordinal).ToArray());
    }

    [Fact]
    public void Dispersion_OutIntoMissingDirectory_FailsWithoutWriting()
    {
        var target = Path.Combine(Path.GetTempPath(), "periodic-no-such-dir-" + Guid.NewGuid().ToString("N"), "x.json");
        var run = ToolRunner.Invoke("dispersion", ToolRunner.Example("superlattice.json"), "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("does not exist", run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }
}
