// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Security.Cryptography;
using System.Text.Json.Nodes;

namespace Periodic.Cli.Tests.Sweeps;

public sealed partial class SweepCommandTest
{
    /// <summary>Makes the tool read every design as a document (the reference the short way from values to cell must equal).</summary>
    private static readonly Dictionary<string, string> EveryDesignRead = new() { ["PERIODIC_SWEEP_READ_EVERY_DESIGN"] = "1" };

    /// <summary>Runs <paramref name="spec"/> the short way and the document way (CSV, then Parquet) and asserts the same bytes.</summary>
    private static void AssertSameAsDocumentPath(string spec, string folder, bool expectTemplate)
    {
        foreach (var extension in new[] { "csv", "parquet" })
        {
            var fast = Path.Combine(folder, "fast." + extension);
            var reference = Path.Combine(folder, "document." + extension);
            var run = ToolRunner.Invoke("sweep", spec, "--out", fast, "--verbose");
            Assert.True(run.ExitCode == 0, run.Stderr);
            Assert.Contains(expectTemplate ? "each design built from the structure read once" : "each design read as a document", run.Stderr);
            var slow = ToolRunner.Invoke(EveryDesignRead, "sweep", spec, "--out", reference, "--verbose");
            Assert.True(slow.ExitCode == 0, slow.Stderr);
            Assert.Contains("each design read as a document", slow.Stderr);
            Assert.Equal(File.ReadAllBytes(reference), File.ReadAllBytes(fast));
        }
    }

    public static TheoryData<string> ExampleSweeps()
    {
        var data = new TheoryData<string>();
        foreach (var file in Directory.GetFiles(Path.Combine(ToolRunner.RepositoryRoot, "docs", "examples", "sweeps"), "*.json").Order(StringComparer.Ordinal))
        {
            data.Add(Path.GetFileName(file));
        }
        return data;
    }

    [Theory]
    [MemberData(nameof(ExampleSweeps))]
    public void Sweep_ExampleSweep_StructureReadOnceGivesTheSameBytesAsEveryDesignRead(string name)
    {
        // Every example sweep, its quasi-random designs cut to the first 300 (the rows of a prefix are the same designs).
        var folder = Folder();
        var source = Path.Combine(ToolRunner.RepositoryRoot, "docs", "examples", "sweeps", name);
        var sweep = JsonNode.Parse(File.ReadAllText(source))!.AsObject();
        if (sweep["structure"] is JsonValue relative)
        {
            sweep["structure"] = Path.GetFullPath(Path.Combine(Path.GetDirectoryName(source)!, relative.GetValue<string>())).Replace("\\", "/", StringComparison.Ordinal);
        }
        if (sweep["design"] is JsonObject design && design["quasiRandom"]!.GetValue<int>() > 300)
        {
            design["quasiRandom"] = 300;
        }
        var spec = Path.Combine(folder, name);
        File.WriteAllText(spec, sweep.ToJsonString());
        // The short way serves cells of numbers with band outputs only; materials and stack outputs read every design.
        var numbersOnly = !File.ReadAllText(sweep["structure"]!.GetValue<string>()).Contains("\"material\"", StringComparison.Ordinal);
        var bandsOnly = sweep["outputs"]!.AsObject().All(p => p.Key is "bands" or "sensitivities");
        AssertSameAsDocumentPath(spec, folder, numbersOnly && bandsOnly);
    }

    [Fact]
    public void Sweep_ValuesAtAndBeyondTheReadersLimits_FailWithTheSameErrorsEitherWay()
    {
        // Widths through zero and below the smallest width, potentials at and past ±1000 eV, masses at and past their bounds,
        // a delta strength past its bound: the rows that fail must carry the structure reader's own error.
        var folder = Folder();
        var spec = Path.Combine(folder, "limits.json");
        File.WriteAllText(spec, """
            {"structure": {"name": "limits", "cell": [{"width": 5, "potential": 0, "mass": 0.067}, {"delta": 0.1}, {"width": "2 nm", "potential": "250 meV", "mass": 0.092}]},
             "parameters": [
               {"field": "cell[2].width", "values": [-1, 0, 1e-7, 1e-6, 2, 1e6, 1.0000001e6]},
               {"field": "cell[2].potential", "values": [-1000.0000001, -1000, 0.3, 1000]},
               {"field": "cell[0].mass", "values": [0, 9e-5, 1e-4, 0.067, 1e7, 2e7]},
               {"field": "cell[1].delta", "values": [-0.2, 0, 1000, 1000.5]}
             ],
             "design": "grid", "outputs": {"bands": 1}}
            """);
        AssertSameAsDocumentPath(spec, folder, expectTemplate: true);
        var errors = File.ReadAllLines(Path.Combine(folder, "fast.csv")).Skip(1).Count(l => !l.EndsWith(',')); // a failed row ends in its error
        Assert.InRange(errors, 1, 7 * 4 * 6 * 4 - 1);
    }

    [Fact]
    public void Sweep_Sensitivities_StructureReadOnceGivesTheSameBytesAsEveryDesignRead()
    {
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "from": 3, "to": 7}, {"field": "cell[1].potential", "from": 0.1, "to": 0.4}""", """{"quasiRandom": 50, "seed": 4}""");
        File.WriteAllText(spec, File.ReadAllText(spec).Replace("\"bands\": 2", "\"bands\": 2, \"sensitivities\": true", StringComparison.Ordinal));
        AssertSameAsDocumentPath(spec, folder, expectTemplate: true);
    }

    [Fact]
    public void Sweep_JournalWithAFailedRowAndATornLine_ResumesThemBitForBit()
    {
        // A journal written by hand in the documented format: design 0 finished (with an error holding a comma), design 1
        // torn by a kill. The resumed sweep must take row 0 from the journal (its error is not one the tool would give now)
        // and compute design 1 and the rest afresh.
        var folder = Folder();
        var spec = Spec(folder, """{"field": "cell[0].width", "values": [4, 5, 6]}""", bands: 1);
        var structure = ToolRunner.Example("superlattice.json");
        var fingerprint = Convert.ToHexString(SHA256.HashData([.. File.ReadAllBytes(spec), 0, .. File.ReadAllBytes(structure)]))[..16].ToLowerInvariant();
        var output = Path.Combine(folder, "o.csv");
        File.WriteAllText(output + ".journal",
            $"{{\"periodicSweepJournal\":3,\"fingerprint\":\"{fingerprint}\",\"shard\":\"0/1\",\"columns\":7}}\n"
            + "0,4,0.5,,,,,,\"a made-up error, with a comma\"\n"
            + "1,4,0.5");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var lines = File.ReadAllLines(output);
        Assert.Equal("0,4,0.5,,,,,,\"a made-up error, with a comma\"", lines[1]);
        var reference = Path.Combine(folder, "reference.csv");
        Assert.Equal(0, ToolRunner.Invoke("sweep", spec, "--out", reference).ExitCode);
        Assert.Equal(File.ReadAllLines(reference)[2..], lines[2..]);
        Assert.False(File.Exists(output + ".journal"));
    }
}
