// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using System.Text.Json;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The finished rows of a sweep that is still running, beside its output (<c>OUT.journal</c>), so that a killed
/// sweep restarted with the same command redoes none of them. One JSON line per design, doubles in shortest
/// round-trip form (read back bit for bit); a line cut short by the kill is dropped and its design recomputed.
/// The journal is deleted once the output file is written.
/// </summary>
internal sealed class SweepJournal : IDisposable
{
    /// <summary>Longest time finished rows stay in the operating system's cache before they are forced onto the disk.</summary>
    private static readonly TimeSpan DiskSyncInterval = TimeSpan.FromSeconds(2);

    private readonly FileStream _stream;
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
    public static SweepJournal Open(string outPath, string identity, int columns)
    {
        var path = outPath + ".journal";
        var done = new List<SweepRow>();
        if (File.Exists(path))
        {
            var lines = File.ReadAllLines(path, Encoding.UTF8);
            if (lines.Length == 0 || lines[0] != identity)
            {
                throw new UsageException($"{Printable.Quote(path)} is the journal of another sweep or shard; delete it, or give another --out.");
            }
            for (var i = 1; i < lines.Length; i++)
            {
                if (TryParse(lines[i], columns) is { } row)
                {
                    done.Add(row);
                }
                else if (i < lines.Length - 1)
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{Printable.Quote(path)} line {i + 1} is damaged; delete the journal to start the sweep again."));
                }
            }
            // Rewrite without a torn last line, so that appended rows start on a line of their own.
            File.WriteAllLines(path, lines.Take(1 + done.Count), new UTF8Encoding(false));
        }
        else
        {
            File.WriteAllText(path, identity + "\n", new UTF8Encoding(false));
        }
        var stream = new FileStream(path, FileMode.Append, FileAccess.Write, FileShare.Read);
        return new SweepJournal(path, stream, done);
    }

    /// <summary>Appends finished rows and flushes them to disk.</summary>
    public void Append(IEnumerable<SweepRow> rows)
    {
        using (var writer = new Utf8JsonWriter(_stream, new JsonWriterOptions { SkipValidation = true }))
        {
            foreach (var row in rows)
            {
                writer.WriteStartObject();
                writer.WriteNumber("d", row.Design);
                writer.WriteStartArray("v");
                foreach (var value in row.Values)
                {
                    if (value is { } x)
                    {
                        writer.WriteNumberValue(x);
                    }
                    else
                    {
                        writer.WriteNullValue();
                    }
                }
                writer.WriteEndArray();
                if (row.Error is not null)
                {
                    writer.WriteString("e", row.Error);
                }
                writer.WriteEndObject();
                writer.Flush();
                writer.Reset(); // one JSON document per line: no separator before the next
                _stream.WriteByte((byte)'\n');
            }
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

    private static SweepRow? TryParse(string line, int columns)
    {
        try
        {
            using var document = JsonDocument.Parse(line);
            var root = document.RootElement;
            var values = root.GetProperty("v");
            if (values.GetArrayLength() != columns)
            {
                return null;
            }
            var parsed = new double?[columns];
            var j = 0;
            foreach (var value in values.EnumerateArray())
            {
                parsed[j++] = value.ValueKind == JsonValueKind.Null ? null : value.GetDouble();
            }
            return new SweepRow(root.GetProperty("d").GetInt32(), parsed, root.TryGetProperty("e", out var e) ? e.GetString() : null);
        }
        catch (Exception e) when (e is JsonException or KeyNotFoundException or InvalidOperationException or FormatException)
        {
            return null;
        }
    }
}
