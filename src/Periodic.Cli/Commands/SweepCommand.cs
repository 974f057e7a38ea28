// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using System.Text.RegularExpressions;
using Periodic.Cli.Output;
using Periodic.Cli.Sweeps;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>sweep SPEC --out FILE</c>: every design of a sweep file, one row each, on all local cores; resumable;
/// <c>--shard I/N</c> runs the designs whose number is I modulo N, for a batch scheduler's array job.
/// </summary>
internal static partial class SweepCommand
{
    public static Command Create()
    {
        var spec = new Argument<string>("spec") { Description = "Sweep file (JSON): structure, parameters, design, outputs (docs/sweeps.md)." };
        var output = new Option<string>("--out", "-o") { Description = "Result table: .csv or .parquet (the extension chooses). Required.", Required = true };
        var shard = new Option<string?>("--shard") { Description = "Run only shard I of N (I from 0 to N-1): the designs whose number is I modulo N. For array jobs; join the parts with 'periodic merge'." };
        var threads = new Option<int?>("--threads") { Description = "Worker threads (default: all cores). The rows are the same, bit for bit, for any number." };
        var command = new Command("sweep", "Compute every design of a sweep file (grid or quasi-random) into one CSV or Parquet table; a killed sweep resumes where it stopped.");
        command.Arguments.Add(spec);
        command.Options.Add(output);
        command.Options.Add(shard);
        command.Options.Add(threads);
        command.SetAction(result =>
        {
            var outPath = result.GetValue(output)!;
            SweepTable.IsParquet(outPath, "--out");
            var (index, of) = ParseShard(result.GetValue(shard));
            var workers = result.GetValue(threads) ?? Environment.ProcessorCount;
            if (workers < 1 || workers > 1024)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--threads must be between 1 and 1024; got {workers}."));
            }
            var sweep = SweepSpec.Load(result.GetValue(spec)!);
            var rigid = result.GetValue(Common.NoSpaceCharge);
            var runner = new SweepRunner(sweep, rigid);
            if (sweep.Sensitivities && runner.SolvesSpaceCharge)
            {
                throw new UsageException("sweep: the structure is doped, so each design is solved self-consistently, and sensitivities of a self-consistent design are not computed (the exact derivatives hold the potential fixed); add --no-space-charge for the rigid bands and their derivatives, or drop \"sensitivities\".");
            }
            const long MaximumCells = 50_000_000; // 400 MB of doubles held until the table is written
            if ((long)sweep.DesignCount * runner.Columns.Count > MaximumCells)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"{sweep.DesignCount} designs × {runner.Columns.Count} columns exceed {MaximumCells} values held in memory; ask for fewer bands, or split the sweep with --shard."));
            }
            var mine = Enumerable.Range(0, sweep.DesignCount).Where(d => d % of == index).ToArray();
            var shardText = of == 1 ? null : string.Create(CultureInfo.InvariantCulture, $"{index}/{of}");
            var identity = string.Create(CultureInfo.InvariantCulture,
                $"{{\"periodicSweepJournal\":{SweepJournal.Format},\"fingerprint\":\"{sweep.Fingerprint}\",\"shard\":\"{index}/{of}\",\"columns\":{runner.Columns.Count}{(rigid && runner.IsDoped ? ",\"rigidBands\":true" : "")}}}");
            var rows = new SweepRow?[sweep.DesignCount];
            // Every refusal of --out comes before the journal is created beside it, so a refused run leaves nothing behind.
            OutputFile.Validate(outPath);
            using var journal = SweepJournal.Open(outPath, identity, runner.Columns.Count);
            if (journal.Resumed)
            {
                // Resuming a killed run: its partial output (the temporary file its rows streamed into) goes.
                OutputFile.RemoveStaleTemporaries(outPath);
            }
            foreach (var row in journal.Done)
            {
                if (row.Design < 0 || row.Design >= rows.Length || row.Design % of != index)
                {
                    throw new UsageException($"{Printable.Quote(journal.Path)} holds design {row.Design}, which is not in this sweep or shard; delete it.");
                }
                rows[row.Design] = row;
                runner.NoteValues(row.Values);
            }
            if (journal.Resumed)
            {
                Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"periodic: resuming {Printable.Quote(journal.Path)}: {journal.Done.Count} of {mine.Length} designs already computed"));
            }
            var parquet = SweepTable.IsParquet(outPath, "--out");
            var pipeline = new SweepPipeline(runner, mine, rows, journal, workers, parquet);
            var clock = System.Diagnostics.Stopwatch.StartNew();
            var failed = 0;
            // The output's temporary file is open while the designs compute: the CSV rows stream into it in design order and
            // it replaces --out only once every row is in (a failure or a kill leaves no partial output; the journal resumes).
            OutputFile.WriteAtomically(outPath, stream =>
            {
                if (!parquet)
                {
                    SweepTable.WriteCsvHeader(stream, runner.Columns);
                }
                using (var progress = new Progress("sweep", mine.Length))
                {
                    pipeline.Run(parquet ? null : stream, progress);
                }
                if (parquet)
                {
                    new SweepTable(runner.Columns, sweep.Fingerprint, sweep.DesignCount, shardText, pipeline.Rows!).WriteParquet(stream).GetAwaiter().GetResult();
                }
                failed = pipeline.Failed;
            });
            var total = clock.Elapsed;
            journal.Complete();
            if (result.GetValue(Common.Verbose))
            {
                // Where the time went. The workers compute the designs, format their rows (CSV and journal lines) and write
                // them in design order; the tail is what follows the last row
                // (Parquet's table, the flush to disk, the rename). Output's share of the run: its share of the processor
                // time while the designs computed, applied to that phase, plus the tail, over the whole run.
                var compute = pipeline.ComputeTime.TotalSeconds;
                var format = pipeline.FormatTime.TotalSeconds;
                var write = pipeline.WriteTime.TotalSeconds;
                var tail = (total - pipeline.Elapsed).TotalSeconds;
                var outputShare = compute + format + write > 0 ? (format + write) / (compute + format + write) : 0;
                var share = (outputShare * pipeline.Elapsed.TotalSeconds + tail) / total.TotalSeconds;
                Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"periodic: {pipeline.Computed} designs computed in {pipeline.Elapsed.TotalSeconds:F3} s on {workers} threads ({(ThreadClock.IsProcessorTime ? "processor" : "wall")} time: designs {compute:F3} s, formatting rows {format:F3} s, writing {write:F3} s); then {tail:F3} s to finish the file; output share {100 * share:F1} %; whole run {total.TotalSeconds:F3} s; garbage collections {GC.CollectionCount(0)} (pauses {GC.GetTotalPauseDuration().TotalSeconds:F3} s); {(runner.UsesTemplate ? "each design built from the structure read once" : "each design read as a document")}"));
            }
            if (failed < mine.Length)
            {
                WarnOfEmptyColumns(runner);
            }
            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{mine.Length} designs{(shardText is null ? "" : $" (shard {shardText} of {sweep.DesignCount})")}, {failed} failed (their rows give the error); written to {outPath}"));
            return 0;
        });
        return command;
    }

    /// <summary>
    /// One warning line per group of output columns (bands, levels, resonances, transitions, Hubbard, sensitivities) that
    /// is empty in every row although some design succeeded: the sweep asked for quantities its designs do not have.
    /// </summary>
    private static void WarnOfEmptyColumns(SweepRunner runner)
    {
        var groups = new List<(string Group, List<string> Names)>();
        for (var j = runner.ParameterCount; j < runner.Columns.Count; j++)
        {
            if (runner.HasValue(j))
            {
                continue;
            }
            var name = runner.Columns[j].Name;
            var group = ColumnGroup(name);
            var at = groups.FindIndex(g => g.Group == group);
            if (at < 0)
            {
                groups.Add((group, []));
                at = groups.Count - 1;
            }
            groups[at].Names.Add(name);
        }
        foreach (var (group, names) in groups)
        {
            var why = group switch
            {
                "transitions" => "no design has both levels of these transitions in its stack; a structure without \"stack\" is one period between leads of its first layer's material, so a first layer that is a well binds nothing (docs/sweeps.md, \"The sweep file\")",
                "levels" => "no design has bound levels in its stack; a structure without \"stack\" is one period between leads of its first layer's material, so a first layer that is a well binds nothing (docs/sweeps.md, \"The sweep file\")",
                "resonances" => "no design has transmission resonances in its stack below its leads' barrier (docs/sweeps.md, \"The sweep file\")",
                _ => "no design has a finite value there",
            };
            var list = names.Count <= 4 ? string.Join(", ", names) : $"{string.Join(", ", names.Take(3))} … {names[^1]}";
            Console.Error.WriteLine($"periodic: warning: {list}: empty in every row; {why}.");
        }
    }

    private static string ColumnGroup(string name) =>
        name.StartsWith("dLevel", StringComparison.Ordinal) || name.StartsWith("level", StringComparison.Ordinal) ? "levels"
        : name.StartsWith("dResonance", StringComparison.Ordinal) || name.StartsWith("resonance", StringComparison.Ordinal) ? "resonances"
        : name.StartsWith("dTransition", StringComparison.Ordinal) || name.StartsWith("transition", StringComparison.Ordinal) ? "transitions"
        : name.StartsWith("hubbard", StringComparison.Ordinal) ? "hubbard"
        : "bands";

    private static (int Index, int Of) ParseShard(string? text)
    {
        if (text is null)
        {
            return (0, 1);
        }
        var match = ShardPattern().Match(text);
        if (!match.Success || !int.TryParse(match.Groups[1].Value, NumberStyles.None, CultureInfo.InvariantCulture, out var index)
            || !int.TryParse(match.Groups[2].Value, NumberStyles.None, CultureInfo.InvariantCulture, out var of) || of < 1 || index >= of)
        {
            throw new UsageException($"--shard {Printable.Quote(text)}: give I/N with whole numbers 0 ≤ I < N (e.g. --shard 0/4 … --shard 3/4).");
        }
        return (index, of);
    }

    [GeneratedRegex(@"^\s*(\d{1,9})\s*/\s*(\d{1,9})\s*$", RegexOptions.CultureInvariant)]
    private static partial Regex ShardPattern();
}

/// <summary><c>merge PART… --out FILE</c>: joins the tables of a sharded sweep in design order, checking that they fit.</summary>
internal static class MergeCommand
{
    public static Command Create()
    {
        var parts = new Argument<string[]>("parts") { Description = "Tables written by 'periodic sweep --shard' (all .csv or all .parquet), in any order.", Arity = ArgumentArity.OneOrMore };
        var output = new Option<string>("--out", "-o") { Description = "The joined table (.csv or .parquet). Required.", Required = true };
        var command = new Command("merge", "Join the parts of a sharded sweep into one table in design order; refuses parts that overlap, miss designs or mix CSV and Parquet. Parquet parts carry the sweep's fingerprint, so parts of different sweeps are refused; CSV parts are checked only by their header and design numbers.");
        command.Arguments.Add(parts);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var outPath = result.GetValue(output)!;
            SweepTable.IsParquet(outPath, "--out");
            var names = result.GetValue(parts)!;
            var firstParquet = SweepTable.IsParquet(names[0], "merge");
            foreach (var name in names)
            {
                if (SweepTable.IsParquet(name, "merge") != firstParquet)
                {
                    throw new UsageException($"merge: {Printable.Quote(name)} is {Format(!firstParquet)} but the first part {Printable.Quote(names[0])} is {Format(firstParquet)}; give the parts in one format (all .csv or all .parquet), as one sweep's shards wrote them.");
                }
            }
            var tables = names.Select(SweepTable.Read).ToArray();
            OutputFile.Validate(outPath);
            var first = tables[0];
            foreach (var (table, name) in tables.Zip(names))
            {
                if (!table.Columns.SequenceEqual(first.Columns))
                {
                    throw new UsageException($"merge: {Printable.Quote(name)} has other columns than the first part; all parts must come from one sweep file.");
                }
                if (table.Fingerprint != first.Fingerprint || table.TotalDesigns != first.TotalDesigns)
                {
                    throw new UsageException($"merge: {Printable.Quote(name)} comes from another sweep (or another version of its files) than the first part.");
                }
            }
            // Each row with the part it came from, so that an overlap or a gap names the files.
            var rows = tables.SelectMany((t, p) => t.Rows.Select(r => (Row: r, Part: p))).OrderBy(x => x.Row.Design).ThenBy(x => x.Part).ToArray();
            var expected = first.TotalDesigns >= 0 ? first.TotalDesigns : rows.Length;
            for (var i = 0; i < Math.Max(rows.Length, expected); i++)
            {
                if (i > 0 && i < rows.Length && rows[i].Row.Design == rows[i - 1].Row.Design)
                {
                    var (a, b) = (names[rows[i - 1].Part], names[rows[i].Part]);
                    var where = rows[i - 1].Part == rows[i].Part ? $"twice in {Printable.Quote(a)}"
                        : a == b ? $"in {Printable.Quote(a)}, which is given twice" : $"in both {Printable.Quote(a)} and {Printable.Quote(b)}";
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"merge: design {rows[i].Row.Design} is {where}; give every shard's table once."));
                }
                if (i >= rows.Length || rows[i].Row.Design != i)
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"merge: design {i} is in none of the {Common.Plural(tables.Length, "part")} given ({Missing(i, tables, names)}); give every shard's table."));
                }
            }
            new SweepTable(first.Columns, first.Fingerprint, expected, null, rows.Select(x => x.Row).ToArray()).Write(outPath);
            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{rows.Length} designs from {tables.Length} parts; written to {outPath}"));
            return 0;
        });
        return command;
    }

    private static string Format(bool parquet) => parquet ? "Parquet" : "CSV";

    /// <summary>Where a missing design should have come from: its shard, when the parts say which shards they are; else the parts given.</summary>
    private static string Missing(int design, SweepTable[] tables, string[] names)
    {
        if (tables[0].Shard is { } shard && shard.Split('/') is [_, var total] && int.TryParse(total, NumberStyles.None, CultureInfo.InvariantCulture, out var of) && of > 0)
        {
            return string.Create(CultureInfo.InvariantCulture, $"it belongs to shard {design % of}/{of}, whose table is missing");
        }
        return string.Join(", ", names.Select(Printable.Quote));
    }
}
