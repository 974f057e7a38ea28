// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The finished rows of a sweep that is still running, beside its output (<c>OUT.journal</c>), so that a killed
/// sweep restarted with the same command redoes none of them. The first line says which sweep and shard the journal
/// belongs to (and its format, <see cref="Format"/>); then one line per finished design, exactly the design's CSV row of the
/// table (<see cref="SweepTable.AppendCsvRow"/>: the values in shortest round-trip decimal form, which read back bit for bit,
/// and the error, quoted where it holds a comma; errors are one line). A sweep that streams CSV therefore writes the bytes it
/// formatted for the table a second time here, and formats nothing twice. Only lines ended by a line break count: a line cut
/// short by the kill is dropped and its design recomputed. The journal is deleted once the output file is written.
/// </summary>
internal sealed class SweepJournal : IDisposable
{
    /// <summary>Longest time finished rows stay in the operating system's cache before they are forced onto the disk.</summary>
    private static readonly TimeSpan DiskSyncInterval = TimeSpan.FromSeconds(2);

    /// <summary>The journal format this version writes and resumes (in the first line, <c>"periodicSweepJournal":N</c>).</summary>
    public const int Format = 3;

    private readonly FileStream _stream;
    private readonly Microsoft.Win32.SafeHandles.SafeFileHandle? _handle;
    private long _lastDiskSync = System.Diagnostics.Stopwatch.GetTimestamp();

    private SweepJournal(string path, FileStream stream, List<SweepRow> done, bool resumed)
    {
        // The stream is unbuffered, so its handle can be synchronised from another thread than the one writing.
        _handle = OperatingSystem.IsLinux() ? stream.SafeFileHandle : null;
        Resumed = resumed;
        Path = path;
        _stream = stream;
        Done = done;
    }

    /// <summary>Where the journal lives.</summary>
    public string Path { get; }

    /// <summary>True when the journal was there already: a previous run of the same sweep was stopped.</summary>
    public bool Resumed { get; }

    /// <summary>Rows a previous run of the same sweep finished.</summary>
    public IReadOnlyList<SweepRow> Done { get; }

    /// <summary>Opens the journal of <paramref name="outPath"/>, resuming it when it belongs to the same sweep and shard.</summary>
    /// <param name="outPath">The sweep's output file.</param>
    /// <param name="identity">The first line: the format, the sweep's fingerprint, the shard and the column count (one line of JSON).</param>
    /// <param name="columns">Values per row.</param>
    public static SweepJournal Open(string outPath, string identity, int columns)
    {
        var path = outPath + ".journal";
        var done = new List<SweepRow>();
        var resumed = File.Exists(path);
        if (resumed)
        {
            var text = File.ReadAllText(path, Encoding.UTF8);
            // Only lines ended by a line break are whole; what follows the last one was cut short by a kill.
            var lines = text.Split('\n');
            var complete = lines.Length - 1;
            if (complete == 0 || lines[0] != identity)
            {
                if (complete > 0 && !lines[0].StartsWith(string.Create(CultureInfo.InvariantCulture, $"{{\"periodicSweepJournal\":{Format},"), StringComparison.Ordinal)
                    && lines[0].StartsWith("{\"periodicSweepJournal\":", StringComparison.Ordinal))
                {
                    throw new UsageException($"{Printable.Quote(path)} was written by another version of periodic (another journal format); this version does not resume it. Delete it and run the sweep again.");
                }
                throw new UsageException($"{Printable.Quote(path)} is the journal of another sweep, shard or mode (with or without --no-space-charge); delete it, or give another --out.");
            }
            for (var i = 1; i < complete; i++)
            {
                if (TryParse(lines[i], columns) is { } row)
                {
                    done.Add(row);
                }
                else
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{Printable.Quote(path)} line {i + 1} is damaged; delete the journal to start the sweep again."));
                }
            }
            if (lines[^1].Length > 0)
            {
                // Rewrite without the torn last line, so that appended rows start on a line of their own.
                File.WriteAllText(path, text[..(text.LastIndexOf('\n') + 1)], new UTF8Encoding(false));
            }
        }
        try
        {
            if (!resumed)
            {
                File.WriteAllText(path, identity + "\n", new UTF8Encoding(false));
            }
            // Unbuffered: the lines come a chunk of designs at a time, already gathered in one buffer.
            var stream = new FileStream(path, FileMode.Append, FileAccess.Write, FileShare.Read, 0);
            return new SweepJournal(path, stream, done, resumed);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new UsageException($"cannot write the journal {Printable.Quote(path)} beside {OutputFile.Option} {Printable.Quote(outPath)}: {e.Message}");
        }
    }

    /// <summary>Appends journal lines: CSV rows as <see cref="SweepTable.AppendCsvRow"/> formats them.</summary>
    public void Write(ReadOnlySpan<byte> lines) => _stream.Write(lines);

    /// <summary>Hands the appended lines to the operating system (and to the disk at most every <see cref="DiskSyncInterval"/>).</summary>
    public void Flush()
    {
        // Finished rows reach the operating system as they are handed over, so a killed sweep (SIGKILL, a scheduler's
        // preemption) loses no row written before. Forcing them onto the disk costs a few milliseconds per call on shared
        // storage, so it happens at most once per DiskSyncInterval: a machine crash loses at most that much work, which the
        // resumed run recomputes (a torn last line is dropped; see Open).
        var now = System.Diagnostics.Stopwatch.GetTimestamp();
        var synced = System.Diagnostics.Stopwatch.GetElapsedTime(_lastDiskSync, now) >= DiskSyncInterval;
        _stream.Flush(flushToDisk: synced);
        if (synced)
        {
            _lastDiskSync = now;
        }
    }

    /// <summary>
    /// True when <see cref="SyncToDiskIfDue"/> forces the journal onto the disk from any thread (Linux: fsync on its handle);
    /// otherwise the writing thread calls <see cref="Flush"/>.
    /// </summary>
    public bool SyncsFromAnyThread => _handle is not null;

    /// <summary>Forces the lines written so far onto the disk when <see cref="DiskSyncInterval"/> has passed (see <see cref="Flush"/>).</summary>
    public void SyncToDiskIfDue()
    {
        var now = System.Diagnostics.Stopwatch.GetTimestamp();
        if (_handle is not null && System.Diagnostics.Stopwatch.GetElapsedTime(_lastDiskSync, now) >= DiskSyncInterval)
        {
            _lastDiskSync = now;
            PosixFile.Sync(_handle);
        }
    }

    /// <summary>Removes the journal once the output it served is written.</summary>
    public void Complete()
    {
        _stream.Dispose();
        File.Delete(Path);
    }

    public void Dispose() => _stream.Dispose();

    /// <summary>A row line as <see cref="SweepTable.AppendCsvRow"/> writes it, or null when it is not one (damaged).</summary>
    private static SweepRow? TryParse(string line, int columns)
    {
        var cells = Csv.Split(line);
        if (cells.Count != columns + 2 || !int.TryParse(cells[0], NumberStyles.None, CultureInfo.InvariantCulture, out var design))
        {
            return null;
        }
        var values = new double?[columns];
        for (var j = 0; j < columns; j++)
        {
            var cell = cells[j + 1];
            if (cell.Length == 0)
            {
                continue;
            }
            // The shortest round-trip form reads back to the very double that was written (IEEE 754 round to nearest).
            if (!double.TryParse(cell, NumberStyles.Float, CultureInfo.InvariantCulture, out var value))
            {
                return null;
            }
            values[j] = value;
        }
        return new SweepRow(design, values, cells[^1].Length == 0 ? null : cells[^1]);
    }
}
