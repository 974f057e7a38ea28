// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The finished rows of a sweep that is still running, beside its output (<c>OUT.journal</c>), so that a killed
/// sweep restarted with the same command redoes none of them. The first line says which sweep and shard the journal
/// belongs to (and its format, <see cref="Format"/>); then one line per design: <c>DESIGN,V1,…,VN,E</c> where each value is
/// the 16 hexadecimal digits of its IEEE 754 bits (read back bit for bit, and far cheaper to write than decimal) or empty
/// where none, and <c>E</c> is empty or <c>!</c> followed by the design's error. Only lines ended by a line break count: a
/// line cut short by the kill is dropped and its design recomputed. The journal is deleted once the output file is written.
/// </summary>
internal sealed class SweepJournal : IDisposable
{
    /// <summary>Longest time finished rows stay in the operating system's cache before they are forced onto the disk.</summary>
    private static readonly TimeSpan DiskSyncInterval = TimeSpan.FromSeconds(2);

    /// <summary>The journal format this version writes and resumes (in the first line, <c>"periodicSweepJournal":N</c>).</summary>
    public const int Format = 2;

    private readonly FileStream _stream;
    private byte[] _line = new byte[1024];
    private long _lastDiskSync = System.Diagnostics.Stopwatch.GetTimestamp();

    private SweepJournal(string path, FileStream stream, List<SweepRow> done)
    {
        Path = path;
        _stream = stream;
        Done = done;
    }

    /// <summary>Where the journal lives.</summary>
    public string Path { get; }

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
        if (File.Exists(path))
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
                throw new UsageException($"{Printable.Quote(path)} is the journal of another sweep or shard; delete it, or give another --out.");
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
        else
        {
            File.WriteAllText(path, identity + "\n", new UTF8Encoding(false));
        }
        var stream = new FileStream(path, FileMode.Append, FileAccess.Write, FileShare.Read, 1 << 16);
        return new SweepJournal(path, stream, done);
    }

    /// <summary>Appends finished rows and hands them to the operating system (and to the disk at most every <see cref="DiskSyncInterval"/>).</summary>
    public void Append(IEnumerable<SweepRow> rows)
    {
        foreach (var row in rows)
        {
            var length = 0;
            var error = row.Error is null ? 0 : Encoding.UTF8.GetMaxByteCount(row.Error.Length) + 1;
            var most = 12 + 17 * row.Values.Length + error + 2;
            if (_line.Length < most)
            {
                _line = new byte[Math.Max(most, 2 * _line.Length)];
            }
            var line = _line.AsSpan();
            row.Design.TryFormat(line, out var written, default, CultureInfo.InvariantCulture);
            length += written;
            foreach (var value in row.Values)
            {
                line[length++] = (byte)',';
                if (value is { } x)
                {
                    BitConverter.DoubleToUInt64Bits(x).TryFormat(line[length..], out written, "x16", CultureInfo.InvariantCulture);
                    length += written;
                }
            }
            line[length++] = (byte)',';
            if (row.Error is not null)
            {
                line[length++] = (byte)'!';
                length += Encoding.UTF8.GetBytes(row.Error, line[length..]);
            }
            line[length++] = (byte)'\n';
            _stream.Write(line[..length]);
        }
        // Every batch reaches the operating system at once, so a killed sweep (SIGKILL, a scheduler's preemption) loses
        // no finished row. Forcing it onto the disk costs a few milliseconds per call on shared storage, so it happens at
        // most once per DiskSyncInterval: a machine crash loses at most that much work, which the resumed run recomputes
        // (a torn last line is dropped; see Open).
        var now = System.Diagnostics.Stopwatch.GetTimestamp();
        var synced = System.Diagnostics.Stopwatch.GetElapsedTime(_lastDiskSync, now) >= DiskSyncInterval;
        _stream.Flush(flushToDisk: synced);
        if (synced)
        {
            _lastDiskSync = now;
        }
    }

    /// <summary>Removes the journal once the output it served is written.</summary>
    public void Complete()
    {
        _stream.Dispose();
        File.Delete(Path);
    }

    public void Dispose() => _stream.Dispose();

    /// <summary>A row line as <see cref="Append"/> writes it, or null when it is not one (damaged).</summary>
    private static SweepRow? TryParse(string line, int columns)
    {
        var rest = line.AsSpan();
        var comma = rest.IndexOf(',');
        if (comma < 0 || !int.TryParse(rest[..comma], NumberStyles.None, CultureInfo.InvariantCulture, out var design))
        {
            return null;
        }
        rest = rest[(comma + 1)..];
        var values = new double?[columns];
        for (var j = 0; j < columns; j++)
        {
            comma = rest.IndexOf(',');
            if (comma < 0)
            {
                return null;
            }
            var cell = rest[..comma];
            if (cell.Length == 16 && ulong.TryParse(cell, NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture, out var bits))
            {
                values[j] = BitConverter.UInt64BitsToDouble(bits);
            }
            else if (cell.Length != 0)
            {
                return null;
            }
            rest = rest[(comma + 1)..];
        }
        // The error: nothing, or "!" and the message (one line; it may hold commas).
        return rest.Length == 0 ? new SweepRow(design, values, null)
            : rest[0] == '!' ? new SweepRow(design, values, rest[1..].ToString())
            : null;
    }
}
