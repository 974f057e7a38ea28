// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using System.Text.Json;
using Parquet;
using Parquet.Schema;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The rows of a sweep in design order, written as CSV or Parquet (chosen by the file's extension) and read back
/// by <c>merge</c>. Doubles keep every bit: CSV uses the shortest round-trip form, Parquet stores IEEE doubles.
/// </summary>
/// <remarks>
/// CSV: a header row <c>design,FIELD (UNIT),…,error</c>, one row per design, an empty cell where a value does not
/// exist (a failed design, a band too narrow for a finite mass). Parquet: columns <c>design</c> (int32), one optional
/// double column per value, <c>error</c> (optional string); the key-value metadata holds <c>periodic.units</c>
/// (a JSON object column → unit), <c>periodic.fingerprint</c> (a hash of the sweep and structure files),
/// <c>periodic.designs</c> (designs in the whole sweep) and, in a shard's file, <c>periodic.shard</c>. A table merged
/// from CSV parts has no <c>periodic.fingerprint</c> (CSV carries none).
/// </remarks>
internal sealed class SweepTable
{
    public SweepTable(IReadOnlyList<(string Name, string Unit)> columns, string fingerprint, int totalDesigns, string? shard, IReadOnlyList<SweepRow> rows)
    {
        Columns = columns;
        Fingerprint = fingerprint;
        TotalDesigns = totalDesigns;
        Shard = shard;
        Rows = rows;
    }

    public IReadOnlyList<(string Name, string Unit)> Columns { get; }

    public string Fingerprint { get; }

    public int TotalDesigns { get; }

    public string? Shard { get; }

    public IReadOnlyList<SweepRow> Rows { get; }

    /// <summary>The format an output path asks for.</summary>
    public static bool IsParquet(string path, string option)
    {
        var extension = Path.GetExtension(path).ToLowerInvariant();
        return extension switch
        {
            ".parquet" => true,
            ".csv" => false,
            _ => throw new UsageException($"{option} {Printable.Quote(path)}: the file must end in .csv or .parquet (that chooses the format)."),
        };
    }

    /// <summary>Writes the table to <paramref name="path"/> through the tool's safe output rules.</summary>
    /// <param name="path">A .csv or .parquet path.</param>
    /// <param name="maxDegreeOfParallelism">Threads that format CSV rows (-1: all cores); the bytes are the same for any number.</param>
    public void Write(string path, int maxDegreeOfParallelism = -1)
    {
        var parquet = IsParquet(path, OutputFile.Option);
        OutputFile.WriteAtomically(path, stream =>
        {
            if (parquet)
            {
                WriteParquet(stream).GetAwaiter().GetResult();
            }
            else
            {
                WriteCsv(stream, maxDegreeOfParallelism);
            }
        });
    }

    /// <summary>Rows formatted by one task, then written in order.</summary>
    private const int RowsPerChunk = 1024;

    private void WriteCsv(Stream stream, int maxDegreeOfParallelism)
    {
        WriteCsvHeader(stream, Columns);
        // Formatting doubles in shortest round-trip form is most of the work: chunks of rows are formatted to UTF-8 on all
        // the threads at once, a window of chunks at a time (bounded memory), and written in design order.
        var threads = maxDegreeOfParallelism > 0 ? maxDegreeOfParallelism : Environment.ProcessorCount;
        var window = new byte[]?[Math.Max(1, 4 * threads)];
        var lengths = new int[window.Length];
        var chunks = (Rows.Count + RowsPerChunk - 1) / RowsPerChunk;
        var options = new ParallelOptions { MaxDegreeOfParallelism = threads };
        for (var first = 0; first < chunks; first += window.Length)
        {
            var count = Math.Min(window.Length, chunks - first);
            Parallel.For(0, count, options, c => lengths[c] = FormatRows((first + c) * RowsPerChunk, Math.Min(Rows.Count, (first + c + 1) * RowsPerChunk), ref window[c]));
            for (var c = 0; c < count; c++)
            {
                stream.Write(window[c]!, 0, lengths[c]);
            }
        }
    }

    /// <summary>The CSV header row: <c>design,FIELD (UNIT),…,error</c>.</summary>
    public static void WriteCsvHeader(Stream stream, IReadOnlyList<(string Name, string Unit)> columns)
    {
        var header = new StringBuilder("design");
        foreach (var (name, unit) in columns)
        {
            header.Append(',').Append(Csv.Escape($"{name} ({unit})"));
        }
        header.Append(",error\n");
        stream.Write(new UTF8Encoding(false).GetBytes(header.ToString()));
    }

    /// <summary>Rows <paramref name="start"/> to <paramref name="end"/> (exclusive) as CSV lines in <paramref name="buffer"/>; returns the byte count.</summary>
    private int FormatRows(int start, int end, ref byte[]? buffer)
    {
        buffer ??= new byte[1 << 16];
        var length = 0;
        for (var i = start; i < end; i++)
        {
            var row = Rows[i];
            AppendCsvRow(row.Design, row.Values, row.Error, ref buffer, ref length);
        }
        return length;
    }

    /// <summary>
    /// One design's CSV line (UTF-8, ended by a line break) appended at <paramref name="length"/> in <paramref name="buffer"/>,
    /// which grows when it must: the design, each value in shortest round-trip form (empty where none), the error.
    /// </summary>
    public static void AppendCsvRow(int design, ReadOnlySpan<double?> values, string? error, ref byte[] buffer, ref int length)
    {
        var escaped = error is null ? null : Csv.Escape(error);
        // design, then each value (shortest round-trip form, the same bytes as "R") after its comma, the error, the line break
        var most = 11 + (ShortestDecimal.MaxBytes + 1) * values.Length + 1 + (escaped is null ? 0 : Encoding.UTF8.GetMaxByteCount(escaped.Length)) + 1;
        if (buffer.Length - length < most)
        {
            Array.Resize(ref buffer, Math.Max(2 * buffer.Length, length + most));
        }
        var line = buffer.AsSpan(length);
        design.TryFormat(line, out var written, default, CultureInfo.InvariantCulture);
        var k = written;
        foreach (var value in values)
        {
            line[k++] = (byte)',';
            if (value is { } x)
            {
                k += ShortestDecimal.Format(x, line[k..]);
            }
        }
        line[k++] = (byte)',';
        if (escaped is not null)
        {
            k += Encoding.UTF8.GetBytes(escaped, line[k..]);
        }
        line[k++] = (byte)'\n';
        length += k;
    }

    /// <summary>The table as Parquet (one row group) into <paramref name="stream"/>.</summary>
    public async Task WriteParquet(Stream stream)
    {
        var designField = new DataField<int>("design");
        var valueFields = Columns.Select(c => new DataField<double?>(c.Name)).ToArray();
        var errorField = new DataField<string>("error", true);
        var schema = new ParquetSchema([designField, .. valueFields, errorField]);
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = Metadata();
        using var group = writer.CreateRowGroup();
        await group.WriteAsync(designField, new ReadOnlyMemory<int>(Rows.Select(r => r.Design).ToArray()));
        var column = new double?[Rows.Count];
        for (var j = 0; j < valueFields.Length; j++)
        {
            for (var i = 0; i < Rows.Count; i++)
            {
                column[i] = Rows[i].Values[j];
            }
            await group.WriteAsync(valueFields[j], new ReadOnlyMemory<double?>(column));
        }
        await group.WriteAsync(errorField, Rows.Select(r => r.Error).ToArray());
    }

    private Dictionary<string, string> Metadata()
    {
        var units = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (name, unit) in Columns)
        {
            units[name] = unit;
        }
        var metadata = new Dictionary<string, string>(StringComparer.Ordinal)
        {
            ["periodic.units"] = JsonSerializer.Serialize(units),
        };
        // A table merged from CSV parts has no fingerprint (CSV carries none): the key is left out rather than written empty.
        if (Fingerprint.Length > 0)
        {
            metadata["periodic.fingerprint"] = Fingerprint;
        }
        metadata["periodic.designs"] = TotalDesigns.ToString(CultureInfo.InvariantCulture);
        if (Shard is not null)
        {
            metadata["periodic.shard"] = Shard;
        }
        return metadata;
    }

    /// <summary>Reads a table that <see cref="Write"/> wrote (for <c>merge</c>); errors name the file.</summary>
    public static SweepTable Read(string path)
    {
        if (!File.Exists(path))
        {
            throw new UsageException($"merge: {Printable.Quote(path)} does not exist.");
        }
        OutputFile.RegisterInput(path);
        try
        {
            return IsParquet(path, "merge") ? ReadParquet(path).GetAwaiter().GetResult() : ReadCsv(path);
        }
        catch (Exception e) when (e is FormatException or IOException or InvalidDataException or JsonException or KeyNotFoundException or InvalidCastException)
        {
            throw new UsageException($"merge: {Printable.Quote(path)} is not a sweep table written by periodic sweep: {e.Message}");
        }
    }

    private static SweepTable ReadCsv(string path)
    {
        using var reader = new StreamReader(path, Encoding.UTF8);
        var header = Csv.Split(reader.ReadLine() ?? throw new FormatException("the file is empty"));
        if (header.Count < 2 || header[0] != "design" || header[^1] != "error")
        {
            throw new FormatException("the header must start with design and end with error");
        }
        var columns = header.Skip(1).Take(header.Count - 2).Select(ParseHeader).ToList();
        var rows = new List<SweepRow>();
        var lineNumber = 1;
        while (reader.ReadLine() is { } line)
        {
            lineNumber++;
            var cells = Csv.Split(line);
            if (cells.Count != header.Count)
            {
                throw new FormatException(string.Create(CultureInfo.InvariantCulture, $"line {lineNumber} has {cells.Count} cells; the header has {header.Count}"));
            }
            var values = new double?[columns.Count];
            for (var j = 0; j < values.Length; j++)
            {
                values[j] = cells[j + 1].Length == 0 ? null : double.Parse(cells[j + 1], NumberStyles.Float, CultureInfo.InvariantCulture);
            }
            rows.Add(new SweepRow(int.Parse(cells[0], NumberStyles.None, CultureInfo.InvariantCulture), values, cells[^1].Length == 0 ? null : cells[^1]));
        }
        return new SweepTable(columns, "", -1, null, rows);
    }

    private static (string, string) ParseHeader(string cell)
    {
        var open = cell.LastIndexOf(" (", StringComparison.Ordinal);
        if (open < 0 || !cell.EndsWith(')'))
        {
            throw new FormatException($"header cell {Printable.Quote(cell)} has no unit in parentheses");
        }
        return (cell[..open], cell[(open + 2)..^1]);
    }

    private static async Task<SweepTable> ReadParquet(string path)
    {
        await using var stream = File.OpenRead(path);
        await using var reader = await ParquetReader.CreateAsync(stream);
        var metadata = reader.CustomMetadata;
        var units = JsonSerializer.Deserialize<Dictionary<string, string>>(metadata["periodic.units"])!;
        var fields = reader.Schema.DataFields;
        var valueFields = fields.Skip(1).Take(fields.Length - 2).ToArray();
        var rows = new List<SweepRow>();
        for (var g = 0; g < reader.RowGroupCount; g++)
        {
            using var group = reader.OpenRowGroupReader(g);
            var count = (int)group.RowCount;
            var designs = new int[count];
            await group.ReadAsync(fields[0], designs.AsMemory());
            var values = new double?[valueFields.Length][];
            for (var j = 0; j < valueFields.Length; j++)
            {
                values[j] = new double?[count];
                await group.ReadAsync(valueFields[j], values[j].AsMemory());
            }
            var errors = new string?[count];
            await group.ReadAsync(fields[^1], errors.AsMemory());
            for (var i = 0; i < count; i++)
            {
                rows.Add(new SweepRow(designs[i], values.Select(column => column[i]).ToArray(), errors[i]));
            }
        }
        var columns = valueFields.Select(f => (f.Name, units[f.Name])).ToList();
        return new SweepTable(columns, metadata.TryGetValue("periodic.fingerprint", out var fingerprint) ? fingerprint : "", int.Parse(metadata["periodic.designs"], CultureInfo.InvariantCulture),
            metadata.TryGetValue("periodic.shard", out var shard) ? shard : null, rows);
    }
}

/// <summary>RFC 4180 quoting: a cell with a comma, quote or line break is quoted, quotes doubled.</summary>
internal static class Csv
{
    public static string Escape(string cell) =>
        cell.AsSpan().IndexOfAny(",\"\r\n") >= 0 ? "\"" + cell.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : cell;

    public static List<string> Split(string line)
    {
        var cells = new List<string>();
        var cell = new StringBuilder();
        var quoted = false;
        for (var i = 0; i < line.Length; i++)
        {
            var c = line[i];
            if (quoted)
            {
                if (c == '"' && i + 1 < line.Length && line[i + 1] == '"')
                {
                    cell.Append('"');
                    i++;
                }
                else if (c == '"')
                {
                    quoted = false;
                }
                else
                {
                    cell.Append(c);
                }
            }
            else if (c == '"')
            {
                quoted = true;
            }
            else if (c == ',')
            {
                cells.Add(cell.ToString());
                cell.Clear();
            }
            else
            {
                cell.Append(c);
            }
        }
        cells.Add(cell.ToString());
        return cells;
    }
}
