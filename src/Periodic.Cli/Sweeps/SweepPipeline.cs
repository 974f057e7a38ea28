// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;
using System.Runtime.ExceptionServices;
using System.Runtime.InteropServices;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// Runs a sweep's designs on worker threads and streams the rows, in design order, into the output while they compute.
/// </summary>
/// <remarks>
/// The designs (this shard's, in order) are cut into chunks of <see cref="DesignsPerChunk"/>. Each worker takes the next
/// chunk (a shared counter: no barrier, a fast worker just takes more), computes its designs into reused buffers and
/// formats them itself: the CSV lines into the chunk's pooled byte buffer (they are also the journal's lines, see
/// <see cref="SweepJournal"/>; for Parquet, or a chunk with designs resumed from the journal, the journal's lines of the new
/// designs go to a buffer of their own). Then whichever worker finds the next chunk in design order ready writes it (and every ready chunk
/// after it) to the output and the journal, so <c>--threads N</c> runs N threads and no more; the calling thread only
/// shows progress and forces the output written so far onto the disk now and then. At most <see cref="ChunksInFlight"/>
/// chunks are between a worker and the output, so memory stays bounded and no row is kept once written. Parquet (one row
/// group, so the same bytes as a table written at once) keeps the rows and writes them after the last design. The rows
/// are those each design gives alone: the same bytes for any number of workers.
/// </remarks>
internal sealed class SweepPipeline
{
    /// <summary>Designs per chunk: a few milliseconds of work, so that the end of the run waits little for the last chunk.</summary>
    private const int DesignsPerChunk = 64;

    private readonly SweepRunner _runner;
    private readonly int[] _designs;
    private readonly SweepRow?[] _resumed;
    private readonly SweepJournal _journal;
    private readonly int _workers;
    private readonly Chunk[] _slots;
    private readonly int _chunkCount;
    private readonly object _writer = new();
    private readonly ManualResetEventSlim _finished = new();
    private int _nextChunk = -1;
    private int _nextToWrite;
    private long _bytesWritten;
    private int _designsWritten;
    private Stream? _output;
    private ExceptionDispatchInfo? _failure;

    /// <param name="runner">Computes a design.</param>
    /// <param name="designs">The designs to output (this shard's), in design order.</param>
    /// <param name="resumed">Rows a previous run finished, by design number (null: compute the design).</param>
    /// <param name="journal">Where the newly computed rows go as they are written.</param>
    /// <param name="workers">Worker threads.</param>
    /// <param name="parquet">True to keep the rows for a Parquet table, false to stream CSV.</param>
    public SweepPipeline(SweepRunner runner, int[] designs, SweepRow?[] resumed, SweepJournal journal, int workers, bool parquet)
    {
        _runner = runner;
        _designs = designs;
        _resumed = resumed;
        _journal = journal;
        _workers = workers;
        _chunkCount = (designs.Length + DesignsPerChunk - 1) / DesignsPerChunk;
        _slots = new Chunk[ChunksInFlight];
        for (var s = 0; s < _slots.Length; s++)
        {
            _slots[s] = new Chunk();
        }
        Rows = parquet ? new SweepRow[designs.Length] : null;
    }

    // A few chunks per worker: enough that no worker waits for a slower one's chunk, few enough that the buffers stay in cache
    // (the disk flushes happen on the calling thread, so no worker waits for the disk).
    private int ChunksInFlight => 4 * _workers + 4;

    /// <summary>For Parquet, the rows in design order once <see cref="Run"/> has returned; null for CSV.</summary>
    public SweepRow[]? Rows { get; }

    /// <summary>Wall time from the start of <see cref="Run"/> until the last chunk was handed over.</summary>
    public TimeSpan Elapsed { get; private set; }

    /// <summary>Processor time the workers spent formatting CSV and journal lines, summed over the workers (see <see cref="ThreadClock"/>).</summary>
    public TimeSpan FormatTime { get; private set; }

    /// <summary>Processor time the workers spent writing to the output and the journal, summed over the workers.</summary>
    public TimeSpan WriteTime { get; private set; }

    /// <summary>Processor time the workers spent computing designs, summed over the workers (see <see cref="ThreadClock"/>).</summary>
    public TimeSpan ComputeTime { get; private set; }

    /// <summary>Rows that hold an error (computed or resumed).</summary>
    public int Failed { get; private set; }

    /// <summary>Designs computed (not resumed from the journal).</summary>
    public int Computed { get; private set; }

    /// <summary>
    /// Computes every design and writes the CSV rows (not the header) to <paramref name="output"/> in design order
    /// (for Parquet, fills <see cref="Rows"/>); the newly computed rows go to the journal.
    /// </summary>
    public void Run(Stream? output, Progress progress)
    {
        var clock = Stopwatch.StartNew();
        _output = output;
        // Taken before the workers start (FileStream flushes its buffer when it hands out its handle).
        var disk = output is FileStream file && OperatingSystem.IsLinux() ? file.SafeFileHandle : null;
        using var free = new SemaphoreSlim(_slots.Length, _slots.Length);
        using var cancel = new CancellationTokenSource();
        if (_chunkCount == 0)
        {
            _finished.Set();
        }
        var workerTimes = new (long Compute, long Format, long Write, int Computed, int Failed)[_workers];
        var threads = new Thread[_workers];
        for (var w = 0; w < threads.Length; w++)
        {
            var worker = w;
            threads[w] = new Thread(() => workerTimes[worker] = Work(free, cancel.Token)) { IsBackground = true, Name = "sweep worker" };
            threads[w].Start();
        }
        try
        {
            long synced = 0;
            while (!_finished.Wait(100))
            {
                progress.Report(Volatile.Read(ref _designsWritten));
                _journal.SyncToDiskIfDue();
                // The page cache is written to the disk while the designs compute, so that the flush the output needs before
                // it replaces --out (OutputFile) is left only the last part: fsync(2) from this thread, which waits anyway,
                // while the workers go on writing.
                var written = Volatile.Read(ref _bytesWritten);
                if (disk is not null && written - synced >= DiskFlushBytes)
                {
                    synced = written;
                    if (!PosixFile.Sync(disk))
                    {
                        disk = null; // a file that cannot be synchronised (a device, a FIFO): the final flush reports real failures
                    }
                }
            }
            _failure?.Throw();
            progress.Report(_designsWritten);
            _journal.Flush();
        }
        finally
        {
            cancel.Cancel();
            foreach (var thread in threads)
            {
                thread.Join();
            }
        }
        Elapsed = clock.Elapsed;
        ComputeTime = TimeSpan.FromTicks(workerTimes.Sum(t => t.Compute) / 100);
        FormatTime = TimeSpan.FromTicks(workerTimes.Sum(t => t.Format) / 100);
        WriteTime = TimeSpan.FromTicks(workerTimes.Sum(t => t.Write) / 100);
        Computed = workerTimes.Sum(t => t.Computed);
        Failed = workerTimes.Sum(t => t.Failed);
    }

    /// <summary>Output bytes between flushes to disk while the designs compute.</summary>
    private const long DiskFlushBytes = 4 << 20;

    /// <summary>
    /// Writes the chunks that are next in design order and ready, unless another worker is at it (that one then writes what
    /// this worker just made ready, since it looks again after it lets go). Returns the processor time spent.
    /// </summary>
    private long WriteReady(SemaphoreSlim free)
    {
        long spent = 0;
        while (Monitor.TryEnter(_writer))
        {
            var start = ThreadClock.Nanoseconds();
            try
            {
                while (_nextToWrite < _chunkCount && Volatile.Read(ref _slots[_nextToWrite % _slots.Length].Number) == _nextToWrite)
                {
                    var slot = _slots[_nextToWrite % _slots.Length];
                    _output?.Write(slot.Csv, 0, slot.CsvLength);
                    _journal.Write(slot.JournalIsCsv ? slot.Csv.AsSpan(0, slot.CsvLength) : slot.Journal.AsSpan(0, slot.JournalLength));
                    Volatile.Write(ref _bytesWritten, _bytesWritten + slot.CsvLength);
                    Volatile.Write(ref _designsWritten, _designsWritten + slot.Count);
                    _nextToWrite++;
                    free.Release();
                }
                if (!_journal.SyncsFromAnyThread)
                {
                    _journal.Flush();
                }
                if (_nextToWrite == _chunkCount)
                {
                    _finished.Set();
                }
            }
            finally
            {
                Monitor.Exit(_writer);
                spent += ThreadClock.Nanoseconds() - start;
            }
            // A chunk made ready while this worker held the writer found it taken: look again.
            if (_nextToWrite >= _chunkCount || Volatile.Read(ref _slots[_nextToWrite % _slots.Length].Number) != _nextToWrite)
            {
                break;
            }
        }
        return spent;
    }

    /// <summary>One worker's loop; returns its compute and format times (nanoseconds of the thread's processor time) and its counts.</summary>
    private (long Compute, long Format, long Write, int Computed, int Failed) Work(SemaphoreSlim free, CancellationToken cancel)
    {
        // Kept in locals, not in a shared array, so that the workers never write to the same cache line.
        (long Compute, long Format, long Write, int Computed, int Failed) time = default;
        var columns = _runner.Columns.Count;
        // A chunk's rows: computed first, then formatted (two clock readings per chunk, not per design).
        var values = new double?[DesignsPerChunk][];
        for (var i = 0; i < values.Length; i++)
        {
            values[i] = new double?[columns];
        }
        var errors = new string?[DesignsPerChunk];
        try
        {
            while (true)
            {
                free.Wait(cancel);
                var c = Interlocked.Increment(ref _nextChunk);
                if (c >= _chunkCount)
                {
                    return time;
                }
                var slot = _slots[c % _slots.Length];
                // The chunk's buffers and lengths live in locals while it is formatted: the slots are small objects side by
                // side, so lengths updated row by row in them would share cache lines between the workers.
                var csv = slot.Csv;
                var journal = slot.Journal;
                int csvLength = 0, journalLength = 0;
                var first = c * DesignsPerChunk;
                var end = Math.Min(_designs.Length, first + DesignsPerChunk);
                var t0 = ThreadClock.Nanoseconds();
                var resumedInChunk = 0;
                for (var i = first; i < end; i++)
                {
                    var design = _designs[i];
                    if (_resumed[design] is null)
                    {
                        errors[i - first] = _runner.Evaluate(design, values[i - first]);
                        time.Computed++;
                    }
                    else
                    {
                        resumedInChunk++;
                    }
                }
                var t1 = ThreadClock.Nanoseconds();
                // The journal's lines are the table's CSV rows: when the chunk streams CSV and resumed none of its designs
                // (the usual case), the journal gets the very bytes of the table, formatted once.
                var journalIsCsv = Rows is null && resumedInChunk == 0;
                for (var i = first; i < end; i++)
                {
                    var design = _designs[i];
                    var done = _resumed[design];
                    var row = done?.Values ?? values[i - first];
                    var error = done is null ? errors[i - first] : done.Error;
                    if (Rows is not null)
                    {
                        Rows[i] = done ?? new SweepRow(design, values[i - first].ToArray(), error);
                    }
                    else
                    {
                        SweepTable.AppendCsvRow(design, row, error, ref csv, ref csvLength);
                    }
                    if (done is null && !journalIsCsv)
                    {
                        SweepTable.AppendCsvRow(design, row, error, ref journal, ref journalLength);
                    }
                    if (error is not null)
                    {
                        time.Failed++;
                    }
                }
                var t2 = ThreadClock.Nanoseconds();
                time.Compute += t1 - t0;
                time.Format += t2 - t1;
                slot.Csv = csv;
                slot.CsvLength = csvLength;
                slot.Journal = journal;
                slot.JournalLength = journalLength;
                slot.JournalIsCsv = journalIsCsv;
                slot.Count = end - first;
                Volatile.Write(ref slot.Number, c);
                time.Write += WriteReady(free);
            }
        }
        catch (OperationCanceledException) when (cancel.IsCancellationRequested)
        {
            // The run stopped (another worker failed, or writing did): nothing more to compute.
        }
        catch (Exception e)
        {
            Interlocked.CompareExchange(ref _failure, ExceptionDispatchInfo.Capture(e), null);
            _finished.Set();
        }
        return time;
    }

    /// <summary>One chunk's formatted lines, reused for chunk numbers that are <see cref="ChunksInFlight"/> apart.</summary>
    private sealed class Chunk
    {
        public int Number = -1;
        public int Count;
        public byte[] Csv = new byte[1 << 15];
        public int CsvLength;
        public byte[] Journal = new byte[1 << 15];
        public int JournalLength;
        public bool JournalIsCsv;
    }
}

/// <summary>
/// The calling thread's processor time where the system gives it (Linux: <c>clock_gettime(CLOCK_THREAD_CPUTIME_ID)</c>), else
/// wall time: on a busy machine a thread's wall time also counts the time other processes held its core.
/// </summary>
internal static class ThreadClock
{
    private const int ThreadCpuTimeClock = 3; // CLOCK_THREAD_CPUTIME_ID on Linux

    private static readonly bool UsesProcessorTime = OperatingSystem.IsLinux() && TryRead(out _);

    /// <summary>True when <see cref="Nanoseconds"/> counts the thread's processor time rather than wall time.</summary>
    public static bool IsProcessorTime => UsesProcessorTime;

    /// <summary>A reading in nanoseconds; only differences between readings on one thread mean something.</summary>
    public static long Nanoseconds()
    {
        if (UsesProcessorTime && TryRead(out var nanoseconds))
        {
            return nanoseconds;
        }
        return (long)(Stopwatch.GetTimestamp() * (1e9 / Stopwatch.Frequency));
    }

    private static bool TryRead(out long nanoseconds)
    {
        nanoseconds = 0;
        try
        {
            if (ClockGetTime(ThreadCpuTimeClock, out var time) != 0)
            {
                return false;
            }
            nanoseconds = time.Seconds * 1_000_000_000 + time.Nanoseconds;
            return true;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            return false;
        }
    }

    [StructLayout(LayoutKind.Sequential)]
    private struct TimeSpec
    {
        public long Seconds;
        public long Nanoseconds;
    }

    // Runtime marshalling (DllImport) rather than the LibraryImport generator, which needs unsafe code enabled.
    [DllImport("libc.so.6", EntryPoint = "clock_gettime", ExactSpelling = true)]
    private static extern int ClockGetTime(int clock, out TimeSpec time);
}

/// <summary>fsync(2): forces a file's written data onto the disk; safe while another thread writes to the same file.</summary>
internal static class PosixFile
{
    /// <summary>True when the system synchronised the file; false where it cannot (a device, a FIFO) or has no fsync.</summary>
    public static bool Sync(Microsoft.Win32.SafeHandles.SafeFileHandle file)
    {
        try
        {
            return FileSync(file) == 0;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            return false;
        }
    }

    // Runtime marshalling (DllImport) rather than the LibraryImport generator, which needs unsafe code enabled.
    [DllImport("libc.so.6", EntryPoint = "fsync", ExactSpelling = true)]
    private static extern int FileSync(Microsoft.Win32.SafeHandles.SafeFileHandle file);
}
