// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Cli.Sweeps;

namespace Periodic.Cli.Tests.Sweeps;

/// <summary>What sweep and merge say about bad paths, bad parts and bad values, and what they leave behind.</summary>
public sealed partial class SweepCommandTest
{
    private const string TwoWidths = """{"field": "cell[0].width", "values": [4, 5]}""";

    [Fact]
    public void Sweep_OutInAMissingFolder_IsRefusedLikeEveryOutputBeforeAJournalIsMade()
    {
        var folder = Folder();
        var spec = Spec(folder, TwoWidths, bands: 1);
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "nodir", "sub", "s.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--out", run.Stderr);
        Assert.Contains("does not exist", run.Stderr);
        Assert.DoesNotContain("journal", run.Stderr);
        Assert.False(Directory.Exists(Path.Combine(folder, "nodir")));
    }

    [Theory]
    [InlineData("dir.csv")]
    [InlineData("dir.parquet")]
    public void Sweep_OutIsADirectory_IsRefusedAndLeavesNoJournal(string name)
    {
        var folder = Folder();
        var spec = Spec(folder, TwoWidths, bands: 1);
        var output = Path.Combine(folder, name);
        Directory.CreateDirectory(output);
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("is a directory", run.Stderr);
        Assert.False(File.Exists(output + ".journal"));
    }

    /// <summary>Writes shard tables of a three-design sweep, one per entry of <paramref name="parts"/> ("0/3.csv" → part-0.csv).</summary>
    private static string[] Shards(string folder, string spec, params string[] parts) =>
        parts.Select(p =>
        {
            var (shard, extension) = (p[..p.IndexOf('.', StringComparison.Ordinal)], p[p.IndexOf('.', StringComparison.Ordinal)..]);
            var path = Path.Combine(folder, $"part-{shard[0]}{extension}");
            var run = ToolRunner.Invoke("sweep", spec, "--shard", shard, "--out", path);
            Assert.True(run.ExitCode == 0, run.Stderr);
            return path;
        }).ToArray();

    [Fact]
    public void Merge_CsvAndParquetParts_SaysTheFormatsDiffer()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5, 6]}""", bands: 1);
        var parts = Shards(folder, spec, "0/3.csv", "1/3.parquet", "2/3.csv");
        var output = Path.Combine(folder, "x.csv");
        var run = ToolRunner.Invoke("merge", parts[0], parts[1], parts[2], "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("\"" + parts[1] + "\" is Parquet but the first part \"" + parts[0] + "\" is CSV", run.Stderr);
        Assert.DoesNotContain("another sweep", run.Stderr);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Merge_Help_SaysWhatIsCheckedForCsvAndForParquetParts()
    {
        var run = ToolRunner.Invoke("merge", "--help");
        Assert.Equal(0, run.ExitCode);
        var help = string.Join(' ', run.Stdout.Split((char[])[' ', '\n', '\r'], StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("Parquet parts carry the sweep's fingerprint", help);
        Assert.Contains("CSV parts are checked only by their header and design numbers", help);
    }

    [Fact]
    public async Task Merge_CsvPartsIntoParquet_LeavesTheFingerprintOut()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5, 6]}""", bands: 1);
        var parts = Shards(folder, spec, "0/2.csv", "1/2.csv");
        var merged = Path.Combine(folder, "merged.parquet");
        var run = ToolRunner.Invoke("merge", parts[0], parts[1], "--out", merged);
        Assert.True(run.ExitCode == 0, run.Stderr);
        await using (var stream = File.OpenRead(merged))
        await using (var reader = await Parquet.ParquetReader.CreateAsync(stream))
        {
            Assert.False(reader.CustomMetadata.ContainsKey("periodic.fingerprint"));
            Assert.Equal("3", reader.CustomMetadata["periodic.designs"]);
        }
        // The converted table merges again (as one part) and reads back with its rows.
        var again = Path.Combine(folder, "again.csv");
        run = ToolRunner.Invoke("merge", merged, "--out", again);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal(3, Rows(again).Length);
    }

    [Fact]
    public void Sweep_InvalidDesign_ErrorNamesTheDesignAndFieldWithoutAPositionInsideIt()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[1].width", "values": [-1, 2]}""", bands: 1);
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal("design 0: cell[1].width: must be positive; got -1 nm.", Rows(output)[0][^1]);
    }

    [Theory]
    [InlineData("sweep", "--threads", "x")]
    [InlineData("transmission", "--periods", "1.5")]
    [InlineData("bloch", "--points", "many")]
    public void WholeNumberOption_NotAWholeNumber_NamesTheOptionAndValue(string command, string option, string value)
    {
        var folder = Folder();
        string[] args = command == "sweep"
            ? ["sweep", Spec(folder, TwoWidths, bands: 1), option, value, "--out", Path.Combine(folder, "o.csv")]
            : [command, ToolRunner.Example("superlattice.json"), option, value];
        var run = ToolRunner.Invoke(args);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"{option} \"{value}\" is not a whole number", run.Stderr);
        Assert.DoesNotContain("System.", run.Stderr);
        Assert.Empty(Directory.GetFiles(folder, "o.csv*"));
    }

    [Fact]
    public void Merge_OverlapAndGap_NameTheParts()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5, 6]}""", bands: 1);
        var csv = Shards(folder, spec, "0/3.csv", "1/3.csv");
        var output = Path.Combine(folder, "x.csv");
        var run = ToolRunner.Invoke("merge", csv[0], csv[1], csv[0], "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"design 0 is in \"{csv[0]}\", which is given twice", run.Stderr);
        // Parquet parts say which shard they are: the missing one is named.
        var parquet = Shards(folder, spec, "0/3.parquet", "2/3.parquet");
        run = ToolRunner.Invoke("merge", parquet[0], parquet[1], "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("design 1 is in none of the 2 parts given (it belongs to shard 1/3, whose table is missing)", run.Stderr);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Sweep_ResumedWithNoSpaceChargeOnAnUndopedStructure_IsTheSameSweep()
    {
        // The flag changes nothing for an undoped structure, so a journal written without it is resumed with it.
        var folder = Folder();
        var spec = Spec(folder, TwoWidths, bands: 1);
        var sweep = SweepSpec.Load(spec);
        var output = Path.Combine(folder, "o.csv");
        File.WriteAllText(output + ".journal",
            $$"""{"periodicSweepJournal":{{SweepJournal.Format}},"fingerprint":"{{sweep.Fingerprint}}","shard":"0/1","columns":{{new SweepRunner(sweep).Columns.Count}}}""" + "\n");
        var run = ToolRunner.Invoke("sweep", spec, "--no-space-charge", "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("resuming", run.Stderr);
        Assert.False(File.Exists(output + ".journal"));
    }

    [Fact]
    public void Sweep_OutputColumnsEmptyInEveryRow_WarnOncePerGroup()
    {
        // The demo superlattice's first layer is a well: the one-period stack between leads of that well binds nothing.
        var folder = Folder();
        var structure = ToolRunner.Example("superlattice.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{{TwoWidths}}], "outputs": {"bands": 1, "levels": 2, "transitions": ["1-2"]""" + "}}");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.True(run.ExitCode == 0, run.Stderr);
        var warnings = run.Stderr.Split('\n').Where(l => l.StartsWith("periodic: warning:", StringComparison.Ordinal)).ToArray();
        Assert.Equal(2, warnings.Length);
        Assert.StartsWith("periodic: warning: level1, level2: empty in every row;", warnings[0], StringComparison.Ordinal);
        Assert.Contains("first layer", warnings[0]);
        Assert.StartsWith("periodic: warning: transition1-2.energy, transition1-2.wavelength: empty in every row;", warnings[1], StringComparison.Ordinal);
        // Bands have values: no warning for them; a sweep whose outputs all have values warns of nothing.
        run = ToolRunner.Invoke("sweep", Spec(folder, TwoWidths, bands: 1), "--out", Path.Combine(folder, "b.csv"));
        Assert.DoesNotContain("warning", run.Stderr);
    }

    [Fact]
    public void Sweep_FieldTheStructureLeavesOut_SaysToWriteItIn()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[1].nonParabolicity", "values": [0.1, 0.2]}""", bands: 1);
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("write one into it, e.g. \"nonParabolicity\": 0 in cell[1], to sweep it", run.Stderr);
    }
}
