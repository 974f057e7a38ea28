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
                $"{{\"periodicSweepJournal\":{SweepJournal.Format},\"fingerprint\":\"{sweep.Fingerprint}\",\"shard\":\"{index}/{of}\",\"columns\":{runner.Columns.Count}{(rigid ? ",\"rigidBands\":true" : "")}}}");
            var rows = new SweepRow?[sweep.DesignCount];
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
            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{mine.Length} designs{(shardText is null ? "" : $" (shard {shardText} of {sweep.DesignCount})")}, {failed} failed (their rows give the error); written to {outPath}"));
            return 0;
        });
        return command;
    }

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
        var command = new Command("merge", "Join the parts of a sharded sweep into one table in design order; refuses parts that overlap, miss designs or come from different sweeps.");
        command.Arguments.Add(parts);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var outPath = result.GetValue(output)!;
            SweepTable.IsParquet(outPath, "--out");
            var tables = result.GetValue(parts)!.Select(SweepTable.Read).ToArray();
            var first = tables[0];
            foreach (var (table, name) in tables.Zip(result.GetValue(parts)!))
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
            var rows = tables.SelectMany(t => t.Rows).OrderBy(r => r.Design).ToArray();
            var expected = first.TotalDesigns >= 0 ? first.TotalDesigns : rows.Length;
            for (var i = 0; i < rows.Length; i++)
            {
                if (rows[i].Design != i)
                {
                    var what = i > 0 && rows[i].Design == rows[i - 1].Design ? $"design {rows[i].Design} appears in two parts" : $"design {i} is in no part";
                    throw new UsageException($"merge: {what}; give every shard's table once.");
                }
            }
            if (rows.Length != expected)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"merge: the parts hold {rows.Length} of the sweep's {expected} designs; give every shard's table."));
            }
            new SweepTable(first.Columns, first.Fingerprint, expected, null, rows).Write(outPath);
            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{rows.Length} designs from {tables.Length} parts; written to {outPath}"));
            return 0;
        });
        return command;
    }
}
