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

    [Fact]
    public void Dispersion_LongGrid_CsvEqualsJsonAndLibraryBitForBit()
    {
        // 1201 points: beyond BandStructure.FastPathMinimumPoints, so the Chebyshev inversion is used and reported.
        var file = ToolRunner.Example("superlattice.json");
        var json = ToolRunner.Invoke("dispersion", file, "--count", "3", "--points", "1201", "--json").Json();
        Assert.Equal("chebyshev", json.GetProperty("accuracy").GetProperty("method").GetString());
        var bands = BandStructure.Compute(StructureFile.Load(file).Cell, 3);
        var k = json.GetProperty("wavevectors").EnumerateArray().Select(x => x.GetDouble()).ToArray();
        var csv = ToolRunner.Invoke("dispersion", file, "--count", "3", "--points", "1201", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("k (1/nm),kd/pi,E1 (eV),E2 (eV),E3 (eV)", csv[0]);
        Assert.Equal(1202, csv.Length);
        for (var n = 1; n <= 3; n++)
        {
            // The tool forms the Bloch cosines cos(kd) with Math.Cos and calls EnergiesAtBlochCosines (bitwise); the library's
            // EnergiesAt takes them from a vector cosine that may differ by an ulp, so it agrees within the inversion's error.
            var expected = new double[k.Length];
            bands.DispersionOf(n).EnergiesAtBlochCosines(k.Select(x => Math.Cos(x * bands.PeriodNanometres)).ToArray(), expected);
            var library = new double[k.Length];
            bands.EnergiesAt(n, k, library);
            var band = json.GetProperty("bands")[n - 1];
            Assert.Equal(expected, band.GetProperty("energies").EnumerateArray().Select(x => x.GetDouble()).ToArray());
            for (var i = 0; i < k.Length; i++)
            {
                Assert.Equal(library[i], expected[i], bands.DispersionOf(n).ErrorEstimateElectronVolts);
            }
            Assert.Equal(bands.DispersionOf(n).ErrorEstimateElectronVolts, band.GetProperty("errorEstimate").GetDouble());
            for (var i = 0; i < k.Length; i += 97)
            {
                var cells = csv[i + 1].Split(',');
                Assert.Equal(k[i], double.Parse(cells[0], System.Globalization.CultureInfo.InvariantCulture));
                Assert.Equal(expected[i], double.Parse(cells[n + 1], System.Globalization.CultureInfo.InvariantCulture));
            }
        }
    }

    [Theory]
    [InlineData("10000001", "--points must be between 2 and 10000000; got 10000001.")]
    [InlineData("1", "--points must be between 2 and 10000000; got 1.")]
    public void Dispersion_PointsOutOfRange_ExitsTwoWithoutFile(string points, string message)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "e.csv");
        var run = ToolRunner.Invoke("dispersion", ToolRunner.Example("superlattice.json"), "--points", points, "--csv", "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Theory]
    [InlineData("bands")]
    [InlineData("dos", "--from", "0.01", "--to", "0.3", "--points", "5")]
    [InlineData("transmission", "--from", "0.01", "--to", "0.3", "--points", "5", "--periods", "3")]
    public void Out_EveryFormat_WritesWhatStdoutWould(string command, params string[] options)
    {
        var file = ToolRunner.Example("superlattice.json");
        foreach (var format in new[] { "--csv", "--json", "" })
        {
            var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
            var target = Path.Combine(directory, "out.txt");
            string[] args = [command, file, .. options, .. format.Length > 0 ? new[] { format } : []];
            var toFile = ToolRunner.Invoke([.. args, "--out", target]);
            Assert.True(toFile.ExitCode == 0, toFile.Stderr);
            Assert.Equal(string.Empty, toFile.Stdout);
            Assert.Equal(ToolRunner.Invoke(args).Stdout, File.ReadAllText(target));
        }
    }

    [Fact]
    public void Dispersion_LatticeFileUnitElectronVolt_CsvEqualsJsonBitForBit()
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var json = ToolRunner.Invoke("dispersion", file, "-k", "5", "--json").Json();
        var csv = ToolRunner.Invoke("dispersion", file, "-k", "5", "--unit", "eV", "--csv");
        Assert.True(csv.ExitCode == 0, csv.Stderr);
        var lines = csv.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("q/k_L,E1 (eV),E2 (eV),E3 (eV)", lines[0]);
        var k = json.GetProperty("wavevectors");
        var e1 = json.GetProperty("bands")[0].GetProperty("energies");
        var lattice = Periodic.Serialization.StructureFile.Load(file).OpticalLattice!;
        for (var i = 0; i < 5; i++)
        {
            var cells = lines[i + 1].Split(',');
            Assert.Equal(e1[i].GetDouble(), double.Parse(cells[1], System.Globalization.CultureInfo.InvariantCulture));
            // q/k_L with k_L = 2π/λ = π/d: the zone boundary is q = k_L, i.e. 1 [derived].
            Assert.Equal(lattice.ToLatticeWavenumbers(k[i].GetDouble()), double.Parse(cells[0], System.Globalization.CultureInfo.InvariantCulture));
        }
        Assert.Equal(1.0, double.Parse(lines[5].Split(',')[0], System.Globalization.CultureInfo.InvariantCulture), 1e-15);
    }
}
