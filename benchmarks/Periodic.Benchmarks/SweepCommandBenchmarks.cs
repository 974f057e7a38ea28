// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using Periodic.Cli.Commands;
using Periodic.Cli.Output;
using Periodic.Cli.Sweeps;

namespace Periodic.Benchmarks;

/// <summary>
/// The tool's <c>sweep</c> command in this process, warmed up: 10^5 quasi-random two-layer designs × 3 bands
/// (<c>docs/examples/sweeps/scaling-1e5.json</c>) into a CSV table with its journal, on one thread (the baseline) and on
/// two. The third case is the output alone: the same 10^5 rows, computed beforehand, formatted and written the way the
/// sweep writes them (table through the atomic output file, journal beside it), on one thread. Its ratio to the
/// baseline is the share of a sweep's time that goes to output; the parallel case's ratio is the inverse of the speed-up.
/// </summary>
/// <remarks>
/// Against the whole-process runs of <c>benchmarks/sweep-scaling.sh</c>, this leaves out what a measurement in one process
/// cannot hold still: start-up, and the just-in-time compiler's background thread (in a fresh process it compiles the hot
/// methods on the free core of a serial run but competes with the workers of a parallel one). Each invocation takes
/// seconds, so one invocation per iteration; three launches, since a process's placement on the host moves its ratio.
/// </remarks>
[MemoryDiagnoser]
[BenchmarkCategory("Sweep")]
[SimpleJob(RunStrategy.Monitoring, launchCount: 3, warmupCount: 2, iterationCount: 5)]
public class SweepCommandBenchmarks
{
    private const int DesignsPerChunk = 64; // as the sweep's pipeline

    private string _spec = null!;
    private string _directory = null!;
    private Command _root = null!;
    private SweepRunner _runner = null!;
    private double?[][] _rows = null!;
    private string?[] _errors = null!;

    [GlobalSetup]
    public void Setup()
    {
        _spec = Path.Combine(Scenarios.RepositoryRoot, "docs", "examples", "sweeps", "scaling-1e5.json");
        _directory = Directory.CreateTempSubdirectory("periodic-sweep-benchmark-").FullName;
        // The tool's root as Program builds it, with the one subcommand measured here.
        _root = new Command("periodic");
        _root.Options.Add(Common.Verbose);
        _root.Options.Add(Common.NoSpaceCharge);
        _root.Subcommands.Add(SweepCommand.Create());
        var spec = SweepSpec.Load(_spec);
        _runner = new SweepRunner(spec);
        _rows = new double?[spec.DesignCount][];
        _errors = new string?[spec.DesignCount];
        for (var d = 0; d < _rows.Length; d++)
        {
            _rows[d] = new double?[_runner.Columns.Count];
            _errors[d] = _runner.Evaluate(d, _rows[d]);
        }
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(_directory, recursive: true);

    /// <summary><c>periodic sweep scaling-1e5.json --threads 1 --out table.csv</c>.</summary>
    [Benchmark(Baseline = true)]
    public int SweepSerial() => Sweep(1);

    /// <summary>The same on two threads.</summary>
    [Benchmark]
    public int SweepTwoThreads() => Sweep(2);

    /// <summary>The output of the serial sweep alone: the 10^5 rows formatted, written to the table and the journal, flushed.</summary>
    [Benchmark]
    public long OutputOnly()
    {
        var path = Path.Combine(_directory, "output-only.csv");
        var identity = "{\"benchmark\":\"output only\"}";
        using var journal = SweepJournal.Open(path, identity, _runner.Columns.Count);
        var buffer = new byte[1 << 15];
        long bytes = 0;
        OutputFile.WriteAtomically(path, stream =>
        {
            SweepTable.WriteCsvHeader(stream, _runner.Columns);
            for (var first = 0; first < _rows.Length; first += DesignsPerChunk)
            {
                var length = 0;
                for (var d = first; d < Math.Min(_rows.Length, first + DesignsPerChunk); d++)
                {
                    SweepTable.AppendCsvRow(d, _rows[d], _errors[d], ref buffer, ref length);
                }
                stream.Write(buffer, 0, length);
                journal.Write(buffer.AsSpan(0, length));
                journal.SyncToDiskIfDue();
                bytes += length;
            }
            journal.Flush();
        });
        journal.Complete();
        return bytes;
    }

    /// <summary>The formatting part of <see cref="OutputOnly"/>: the 10^5 rows into one reused buffer, nothing written.</summary>
    [Benchmark]
    public long FormatOnly()
    {
        var buffer = new byte[1 << 15];
        long bytes = 0;
        for (var first = 0; first < _rows.Length; first += DesignsPerChunk)
        {
            var length = 0;
            for (var d = first; d < Math.Min(_rows.Length, first + DesignsPerChunk); d++)
            {
                SweepTable.AppendCsvRow(d, _rows[d], _errors[d], ref buffer, ref length);
            }
            bytes += length;
        }
        return bytes;
    }

    private int Sweep(int threads)
    {
        var code = _root.Parse(["sweep", _spec, "--threads", threads.ToString(System.Globalization.CultureInfo.InvariantCulture), "--out", Path.Combine(_directory, $"table-{threads}.csv")]).Invoke();
        if (code != 0)
        {
            throw new InvalidOperationException($"the sweep exited with {code}");
        }
        return code;
    }
}
