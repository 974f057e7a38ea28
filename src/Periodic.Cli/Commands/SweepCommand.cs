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
    /// <summary>Designs per batch: computed in parallel, then journaled in design order.</summary>
    private const int BatchSize = 512;

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
            foreach (var row in journal.Done)
            {
                if (row.Design < 0 || row.Design >= rows.Length || row.Design % of != index)
                {
                    throw new UsageException($"{Printable.Quote(journal.Path)} holds design {row.Design}, which is not in this sweep or shard; delete it.");
                }
                rows[row.Design] = row;
            }
            var pending = mine.Where(d => rows[d] is null).ToArray();
            var clock = System.Diagnostics.Stopwatch.StartNew();
            var journalTime = TimeSpan.Zero;
            using (var progress = new Progress("sweep", mine.Length))
            {
                var finished = mine.Length - pending.Length;
                var options = new ParallelOptions { MaxDegreeOfParallelism = workers };
                // The journal of one batch is written while the next is computed; the time the loop waits for it is
                // the journal's share of the run.
                Task? writing = null;
                void AwaitJournal()
                {
                    var journalStart = clock.Elapsed;
                    writing?.GetAwaiter().GetResult();
                    journalTime += clock.Elapsed - journalStart;
                }
                for (var start = 0; start < pending.Length; start += BatchSize)
                {
                    var batch = pending.AsSpan(start, Math.Min(BatchSize, pending.Length - start)).ToArray();
                    var computed = new SweepRow[batch.Length];
                    Parallel.For(0, batch.Length, options, i => computed[i] = runner.Evaluate(batch[i]));
                    AwaitJournal();
                    writing = Task.Run(() => journal.Append(computed));
                    foreach (var row in computed)
                    {
                        rows[row.Design] = row;
                    }
                    finished += batch.Length;
                    progress.Report(finished);
                }
                AwaitJournal();
            }
            var computeSeconds = (clock.Elapsed - journalTime).TotalSeconds;
            var journalSeconds = journalTime.TotalSeconds;
            var tableStart = clock.Elapsed;
            var table = new SweepTable(runner.Columns, sweep.Fingerprint, sweep.DesignCount, shardText, mine.Select(d => rows[d]!).ToArray());
            table.Write(outPath, workers);
            journal.Complete();
            if (result.GetValue(Common.Verbose))
            {
                // Where the time went: computing the designs against writing (the journal of finished rows while running, then the table).
                Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"periodic: {pending.Length} designs computed in {computeSeconds:F3} s on {workers} threads; journal written in {journalSeconds:F3} s; table written in {(clock.Elapsed - tableStart).TotalSeconds:F3} s; {(runner.UsesTemplate ? "each design built from the structure read once" : "each design read as a document")}"));
            }
            var failed = table.Rows.Count(r => r.Error is not null);
            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{table.Rows.Count} designs{(shardText is null ? "" : $" (shard {shardText} of {sweep.DesignCount})")}, {failed} failed (their rows give the error); written to {outPath}"));
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
