// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;
using System.Globalization;
using Periodic.Bands;
using Periodic.Serialization;

namespace Periodic.Cli.Tests.Sweeps;

public sealed partial class SweepCommandTest
{
    private static string Folder()
    {
        var folder = Path.Combine(Path.GetTempPath(), "periodic-sweep-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        return folder;
    }

    /// <summary>A sweep file over the demo superlattice (absolute structure path), written to a fresh folder.</summary>
    private static string Spec(string folder, string parameters, string design = "\"grid\"", int bands = 2)
    {
        var structure = ToolRunner.Example("superlattice.json").Replace("\\", "/", StringComparison.Ordinal);
        var path = Path.Combine(folder, "sweep.json");
        File.WriteAllText(path, $$"""{"structure": "{{structure}}", "parameters": [{{parameters}}], "design": {{design}}, "outputs": {"bands": {{bands}} """ + "}}");
        return path;
    }

    private static string[][] Rows(string csv) =>
        File.ReadAllLines(csv).Skip(1).Select(l => l.Split(',')).ToArray();

    [Fact]
    public void Sweep_Grid_RowsEqualTheBandsOfEachDesignBitForBit()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5.5]}, {"field": "cell[1].potential", "from": 0.2, "to": 0.3, "count": 3}""");
        var output = Path.Combine(folder, "out.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var rows = Rows(output);
        Assert.Equal(6, rows.Length);
        double[] widths = [4, 5.5], potentials = [0.2, 0.25, 0.3];
        for (var d = 0; d < 6; d++)
        {
            // Grid order: the last parameter varies fastest.
            var width = widths[d / 3];
            var potential = potentials[d % 3];
            Assert.Equal(d.ToString(CultureInfo.InvariantCulture), rows[d][0]);
            Assert.Equal(width, double.Parse(rows[d][1], CultureInfo.InvariantCulture));
            Assert.Equal(potential, double.Parse(rows[d][2], CultureInfo.InvariantCulture));
            var cell = StructureFile.Parse(
                $$"""{"name": "x", "cell": [{"width": {{width.ToString("R", CultureInfo.InvariantCulture)}}, "potential": 0, "mass": 0.067}, {"width": 2, "potential": {{potential.ToString("R", CultureInfo.InvariantCulture)}}, "mass": 0.092}]}""", "t").Cell;
            var bands = BandStructure.Compute(cell, 2);
            // The CSV keeps the shortest round-trip form: the library's doubles come back bit for bit.
            Assert.Equal(bands.Bands[0].BottomElectronVolts, double.Parse(rows[d][3], CultureInfo.InvariantCulture));
            Assert.Equal(bands.Bands[1].TopElectronVolts, double.Parse(rows[d][10], CultureInfo.InvariantCulture));
            Assert.Equal(bands.Gaps[1].WidthElectronVolts, double.Parse(rows[d][14], CultureInfo.InvariantCulture));
            Assert.Equal("", rows[d][^1]);
        }
    }

    [Theory]
    [InlineData("csv")]
    [InlineData("parquet")]
    public void Sweep_ShardsMergedInAnyOrder_EqualTheWholeRunByteForByte(string extension)
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "from": 3, "to": 7}, {"field": "cell[1].width", "from": 1, "to": 3}""", """{"quasiRandom": 37, "seed": 5}""");
        var whole = Path.Combine(folder, "whole." + extension);
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--out", whole).ExitCode);
        var parts = new List<string>();
        for (var i = 0; i < 3; i++)
        {
            var part = Path.Combine(folder, $"part{i}.{extension}");
            Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--shard", $"{i}/3", "--out", part).ExitCode);
            parts.Add(part);
        }
        var merged = Path.Combine(folder, "merged." + extension);
        var run = ToolRunner.Invoke(["merge", parts[2], parts[0], parts[1], "--out", merged]);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal(File.ReadAllBytes(whole), File.ReadAllBytes(merged));
    }

    [Fact]
    public void Sweep_OneThreadOrMany_SameBytes()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "from": 3, "to": 7}, {"field": "cell[1].mass", "from": 0.07, "to": 0.1}""", """{"quasiRandom": 600, "seed": 1}""");
        var serial = Path.Combine(folder, "serial.csv");
        var parallel = Path.Combine(folder, "parallel.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--threads", "1", "--out", serial).ExitCode);
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--threads", "4", "--out", parallel).ExitCode);
        Assert.Equal(File.ReadAllBytes(serial), File.ReadAllBytes(parallel));
    }

    [Fact]
    public void Sweep_QuasiRandom_OneParameterIsEvenlySpacedModuloOne()
    {
        // The first 2^m points of the base-2 radical inverse are the multiples of 2^-m in some order (Halton 1960,
        // van der Corput's sequence); a constant shift modulo 1 keeps them evenly spaced on the circle.
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[1].potential", "from": 0.2, "to": 0.3}""", """{"quasiRandom": 64, "seed": 9}""", bands: 1);
        var output = Path.Combine(folder, "q.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--out", output).ExitCode);
        var u = Rows(output).Select(r => (double.Parse(r[1], CultureInfo.InvariantCulture) - 0.2) / 0.1).Order().ToArray();
        Assert.Equal(64, u.Length);
        for (var i = 1; i < u.Length; i++)
        {
            // Spacing 1/64 up to the rounding of from + (to − from)·u and its inverse (a few ulps of 0.3).
            Assert.Equal(1.0 / 64, u[i] - u[i - 1], 1e-12);
        }
        Assert.Equal(1.0 / 64, u[0] + 1 - u[^1], 1e-12);
    }

    [Fact]
    public void Sweep_KilledAndRestarted_FinishesWithTheSameRowsAsAnUninterruptedRun()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "from": 3, "to": 8}, {"field": "cell[1].width", "from": 1, "to": 3}""", """{"quasiRandom": 20000, "seed": 3}""", bands: 3);
        var reference = Path.Combine(folder, "reference.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--out", reference).ExitCode);

        var output = Path.Combine(folder, "resumed.csv");
        var journal = output + ".journal";
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var arg in new[] { "exec", Path.Combine(AppContext.BaseDirectory, "Periodic.Cli.dll"), "sweep", spec, "--threads", "1", "--out", output })
        {
            start.ArgumentList.Add(arg);
        }
        using (var process = Process.Start(start)!)
        {
            var clock = Stopwatch.StartNew();
            // Kill once at least two batches are journaled and before the sweep ends.
            while (!process.HasExited && clock.Elapsed < TimeSpan.FromSeconds(60)
                && (!File.Exists(journal) || new FileInfo(journal).Length < 200_000))
            {
                Thread.Sleep(20);
            }
            Assert.False(process.HasExited, "the sweep finished before it could be killed; make it longer");
            process.Kill();
            process.WaitForExit();
        }
        Assert.False(File.Exists(output));
        var journaled = File.ReadAllLines(journal).Length - 1;
        Assert.InRange(journaled, 1, 19_999);

        // The killed run streamed rows into a temporary file beside the output; the resumed run removes it.
        Assert.NotEmpty(Directory.GetFiles(folder, ".resumed.csv.*.tmp"));
        var rerun = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(rerun.ExitCode == 0, rerun.Stderr);
        // The resumed run says so, with the journal's whole rows (a line torn by the kill is not one of them).
        var resumed = System.Text.RegularExpressions.Regex.Match(rerun.Stderr, @"resuming .*: (\d+) of 20000 designs already computed");
        Assert.True(resumed.Success, rerun.Stderr);
        Assert.InRange(int.Parse(resumed.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture), journaled - 1, journaled);
        Assert.Equal(File.ReadAllBytes(reference), File.ReadAllBytes(output));
        Assert.False(File.Exists(journal));
        Assert.Empty(Directory.GetFiles(folder, ".resumed.csv.*.tmp"));
    }

    [Theory]
    [InlineData("{\"periodicSweepJournal\":3,\"fingerprint\":\"0000\"}\n", "journal of another sweep")]
    // Format 2 (hexadecimal bits) is refused the same way.
    [InlineData("{\"periodicSweepJournal\":2,\"fingerprint\":\"0123456789abcdef\",\"shard\":\"0/1\",\"columns\":7}\n", "another version of periodic (another journal format); this version does not resume it. Delete it")]
    // A journal of the earlier format (JSON rows) says so: this version does not resume it.
    [InlineData("{\"periodicSweepJournal\":1,\"fingerprint\":\"0123456789abcdef\",\"shard\":\"0/1\",\"columns\":13}\n{\"d\":0,\"v\":[4]}\n", "another version of periodic (another journal format); this version does not resume it. Delete it")]
    public void Sweep_JournalOfAnotherSweepOrFormat_IsRefused(string journal, string message)
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5]}""");
        var output = Path.Combine(folder, "o.csv");
        File.WriteAllText(output + ".journal", journal);
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Sweep_InlineStructureWithoutName_IsSolved()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, """{"structure": {"cell": [{"width": 6, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.3, "mass": 0.067}]}, "parameters": [{"field": "cell[0].width", "values": [3, 9]}], "outputs": {"bands": 1}}""");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("0 failed", run.Stdout);
        Assert.All(File.ReadAllLines(output)[1..], line => Assert.EndsWith(",", line, StringComparison.Ordinal));
    }

    [Fact]
    public void Sweep_InvalidLayerInARange_IsARowWithItsError()
    {
        var folder = Folder();
        // Widths from -1 to 3 nm: the first designs make a layer of negative width, which the structure reader refuses.
        var spec = Spec(folder, """{"field": "cell[1].width", "from": -1, "to": 3, "count": 5}""", bands: 1);
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("failed", run.Stdout);
        var lines = File.ReadAllLines(output);
        Assert.Equal(6, lines.Length);
        Assert.Contains("width", lines[1]);
        Assert.StartsWith("0,-1,,", lines[1], StringComparison.Ordinal);
        Assert.EndsWith(",", lines[5].Split(',')[..^1].Aggregate((a, b) => a + "," + b) + ",", StringComparison.Ordinal);
        Assert.Equal("", lines[5].Split(',')[^1]);
    }

    [Fact]
    public void Sweep_Sensitivities_EqualTheLibrarysExactDerivativesBitForBit()
    {
        var folder = Folder();
        var structure = ToolRunner.Example("superlattice.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{"field": "cell[0].width", "values": [4.5]}, {"field": "cell[1].potential", "values": [0.22]}], "outputs": {"bands": 2, "sensitivities": true} """ + "}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var header = File.ReadLines(output).First().Split(',');
        var row = Rows(output)[0];
        var cell = StructureFile.Parse("""{"name": "x", "cell": [{"width": 4.5, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.22, "mass": 0.092}]}""", "t").Cell;
        var exact = Periodic.Design.EdgeSensitivities.Compute(BandStructure.Compute(cell, 2));
        double Cell(string name) => double.Parse(row[Array.IndexOf(header, name)], CultureInfo.InvariantCulture);
        Assert.Equal(exact.Bottom(1, 0, Periodic.Design.LayerQuantity.Width)!.Value, Cell("dBand1.bottom/dcell[0].width (eV/nm)"));
        Assert.Equal(exact.Top(2, 1, Periodic.Design.LayerQuantity.Potential)!.Value, Cell("dBand2.top/dcell[1].potential (eV/eV)"));
    }

    [Fact]
    public void Sweep_SensitivitiesOfACompositionField_AreRefused()
    {
        var folder = Folder();
        var structure = ToolRunner.Example("gaas-algaas.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{"field": "cell[1].composition", "values": [0.2]}], "outputs": {"bands": 1, "sensitivities": true} """ + "}");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("outputs.sensitivities", run.Stderr);
        Assert.Contains("cell[1].composition", run.Stderr);
    }

    [Fact]
    public void Sweep_UnknownField_ListsTheAllowedOnes()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].thickness", "values": [4]}""");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("parameters[0].field", run.Stderr);
        Assert.Contains("cell[0].width, cell[0].potential, cell[0].mass, cell[1].width", run.Stderr);
    }

    [Theory]
    [InlineData("4/4")]
    [InlineData("-1/4")]
    [InlineData("1/0")]
    [InlineData("one/two")]
    public void Sweep_ShardOutsideItsRange_IsRefused(string shard)
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5]}""");
        var run = ToolRunner.Invoke("sweep", spec, "--shard", shard, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--shard", run.Stderr);
        Assert.Contains("0 ≤ I < N", run.Stderr);
    }

    [Fact]
    public void Merge_MissingOrRepeatedPart_IsRefused()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [3, 4, 5, 6]}""");
        var a = Path.Combine(folder, "a.csv");
        var b = Path.Combine(folder, "b.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--shard", "0/2", "--out", a).ExitCode);
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--shard", "1/2", "--out", b).ExitCode);
        var missing = ToolRunner.Invoke("merge", a, "--out", Path.Combine(folder, "m.csv"));
        Assert.Equal(2, missing.ExitCode);
        Assert.Contains($"design 1 is in none of the 1 part given (\"{a}\")", missing.Stderr);
        var twice = ToolRunner.Invoke("merge", a, b, a, "--out", Path.Combine(folder, "m.csv"));
        Assert.Equal(2, twice.ExitCode);
        Assert.Contains($"design 0 is in \"{a}\", which is given twice", twice.Stderr);
        Assert.False(File.Exists(Path.Combine(folder, "m.csv")));
    }

    [Fact]
    public void Sweep_OutputWithoutKnownExtension_IsRefused()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4]}""");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.txt"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(".csv or .parquet", run.Stderr);
    }

    [Fact]
    public void Sweep_Composition_WritesTheAlloyFractionIntoTheMaterial()
    {
        // The alloy fraction x of AlxGa1-xAs replaces both fractions of the formula; the row must equal the bands of
        // the structure file written with that formula by hand.
        var folder = Folder();
        var structure = ToolRunner.Example("gaas-algaas.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{"field": "cell[1].composition", "values": [0.25]}], "outputs": {"bands": 1} """ + "}");
        var output = Path.Combine(folder, "o.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--out", output).ExitCode);
        var text = File.ReadAllText(structure).Replace("Al0.3Ga0.7As", "Al0.25Ga0.75As", StringComparison.Ordinal);
        var expected = BandStructure.Compute(StructureFile.Parse(text, "hand").Cell, 1);
        Assert.Equal(expected.Bands[0].BottomElectronVolts, double.Parse(Rows(output)[0][2], CultureInfo.InvariantCulture));
    }
}
