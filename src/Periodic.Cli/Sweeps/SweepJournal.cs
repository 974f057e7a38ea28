// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The finished rows of a sweep that is still running, beside its output (<c>OUT.journal</c>), so that a killed
/// sweep restarted with the same command redoes none of them. The first line says which sweep and shard the journal
/// belongs to (and its format, <see cref="Format"/>); then one line per design (in the order they finish): <c>DESIGN,V1,…,VN,E</c> where each value is
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
        // Unbuffered: the lines come a chunk of designs at a time, already gathered in one buffer.
        var stream = new FileStream(path, FileMode.Append, FileAccess.Write, FileShare.Read, 0);
        return new SweepJournal(path, stream, done, resumed);
    }

    /// <summary>
    /// One finished design's journal line (UTF-8, ended by a line break) appended at <paramref name="length"/> in
    /// <paramref name="buffer"/>, which grows when it must. Formatting needs no journal: the sweep's workers do it.
    /// </summary>
    public static void AppendLine(int design, ReadOnlySpan<double?> values, string? error, ref byte[] buffer, ref int length)
    {
        var most = 12 + 17 * values.Length + (error is null ? 0 : Encoding.UTF8.GetMaxByteCount(error.Length) + 1) + 2;
        if (buffer.Length - length < most)
        {
            Array.Resize(ref buffer, Math.Max(2 * buffer.Length, length + most));
        }
        var line = buffer.AsSpan(length);
        design.TryFormat(line, out var k, default, CultureInfo.InvariantCulture);
        foreach (var value in values)
        {
            line[k++] = (byte)',';
            if (value is { } x)
            {
                WriteHexadecimal(BitConverter.DoubleToUInt64Bits(x), line.Slice(k, 16));
                k += 16;
            }
        }
        line[k++] = (byte)',';
        if (error is not null)
        {
            line[k++] = (byte)'!';
            k += Encoding.UTF8.GetBytes(error, line[k..]);
        }
        line[k++] = (byte)'\n';
        length += k;
    }

    /// <summary>The 16 lower-case hexadecimal digits of <paramref name="bits"/>, most significant first (as the "x16" format writes them).</summary>
    private static void WriteHexadecimal(ulong bits, Span<byte> digits)
    {
        // A byte at a time, from a table of the 256 two-digit forms.
        var pairs = HexadecimalPairs;
        for (var i = 14; i >= 0; i -= 2)
        {
            var b = (int)(bits & 0xFF) * 2;
            digits[i] = pairs[b];
            digits[i + 1] = pairs[b + 1];
            bits >>= 8;
        }
    }

    private static ReadOnlySpan<byte> HexadecimalPairs =>
        "000102030405060708090a0b0c0d0e0f101112131415161718191a1b1c1d1e1f202122232425262728292a2b2c2d2e2f303132333435363738393a3b3c3d3e3f404142434445464748494a4b4c4d4e4f505152535455565758595a5b5c5d5e5f606162636465666768696a6b6c6d6e6f707172737475767778797a7b7c7d7e7f808182838485868788898a8b8c8d8e8f909192939495969798999a9b9c9d9e9fa0a1a2a3a4a5a6a7a8a9aaabacadaeafb0b1b2b3b4b5b6b7b8b9babbbcbdbebfc0c1c2c3c4c5c6c7c8c9cacbcccdcecfd0d1d2d3d4d5d6d7d8d9dadbdcdddedfe0e1e2e3e4e5e6e7e8e9eaebecedeeeff0f1f2f3f4f5f6f7f8f9fafbfcfdfeff"u8;

    /// <summary>Appends journal lines that <see cref="AppendLine"/> formatted.</summary>
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

    /// <summary>A row line as <see cref="AppendLine"/> writes it, or null when it is not one (damaged).</summary>
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
