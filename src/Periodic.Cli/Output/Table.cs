// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;

namespace Periodic.Cli.Output;

/// <summary>A column of a <see cref="Table"/>: its name, the unit of its CSV values and how the text table shows it.</summary>
/// <param name="Name">The quantity, e.g. <c>energy</c>.</param>
/// <param name="Unit">Unit of the CSV (and JSON) values, e.g. <c>eV</c>; null for a count, a flag or text.</param>
/// <param name="DisplayUnit">Unit of the text table; null: the same as <paramref name="Unit"/>.</param>
/// <param name="Divisor">One display unit in CSV units (the text table shows value / divisor).</param>
/// <param name="Format">A fixed .NET format for the text table (e.g. "G6"); null: digits chosen from the column's magnitudes.</param>
internal sealed record Column(string Name, string? Unit = null, string? DisplayUnit = null, double Divisor = 1.0, string? Format = null)
{
    /// <summary>An energy column: eV in CSV and JSON, <paramref name="unit"/> in the table.</summary>
    public static Column Energy(string name, EnergyUnit unit) => new(name, "eV", unit.Symbol, unit.ElectronVolts);

    public string CsvHeader => Unit is null ? Name : $"{Name} ({Unit})";

    public string TextHeader => (DisplayUnit ?? Unit) is { } unit ? $"{Name} ({unit})" : Name;
}

/// <summary>One cell: a number (double), a whole number or text.</summary>
internal readonly struct Cell
{
    private readonly double _number;
    private readonly long _integer;
    private readonly string? _text;
    private readonly byte _kind; // 0 number, 1 integer, 2 text

    private Cell(double number, long integer, string? text, byte kind) => (_number, _integer, _text, _kind) = (number, integer, text, kind);

    public static implicit operator Cell(double value) => new(value, 0, null, 0);

    public static implicit operator Cell(int value) => new(0, value, null, 1);

    public static implicit operator Cell(long value) => new(0, value, null, 1);

    public static implicit operator Cell(string value) => new(0, 0, value, 2);

    public static implicit operator Cell(bool value) => new(0, 0, value ? "true" : "false", 2);

    public bool IsNumber => _kind == 0;

    public double Number => _number;

    public void WriteCsv(CsvWriter csv)
    {
        switch (_kind)
        {
            case 0: csv.Number(_number); break;
            case 1: csv.Integer(_integer); break;
            default: csv.Text(_text!); break;
        }
    }

    public string Text(string? format, double divisor) => _kind switch
    {
        0 => Table.Number(_number / divisor, format!),
        1 => _integer.ToString(CultureInfo.InvariantCulture),
        _ => _text!,
    };
}

/// <summary>
/// Rows rendered as an aligned text table (units in the headers, digits chosen per column so that the largest
/// value shows 7 significant digits and the smallest non-zero one at least 3) or as CSV (full round-trip
/// precision, the units of the JSON output; an empty cell where a value is not finite).
/// </summary>
internal sealed class Table(params Column[] columns)
{
    /// <summary>A table of preformatted text cells whose headers are written as "name (unit)".</summary>
    public Table(params string[] headers)
        : this(headers.Select(FromHeader).ToArray())
    {
    }

    private static Column FromHeader(string header)
    {
        var open = header.LastIndexOf(" (", StringComparison.Ordinal);
        return open > 0 && header.EndsWith(')') ? new Column(header[..open], header[(open + 2)..^1]) : new Column(header);
    }

    /// <summary>A whole number as a text cell.</summary>
    public static string Integer(long value) => value.ToString(CultureInfo.InvariantCulture);

    private const int SignificantDigits = 7;
    private const int SmallestValueDigits = 3;
    private readonly List<Cell[]> _rows = [];

    public IReadOnlyList<Column> Columns { get; } = columns;

    public int Count => _rows.Count;

    public void Add(params Cell[] cells)
    {
        if (cells.Length != Columns.Count)
        {
            throw new InvalidOperationException($"a row of {cells.Length} cells in a table of {Columns.Count} columns");
        }
        _rows.Add(cells);
    }

    /// <summary>A value as the table shows it: "inf", "-inf" or "n/a" where it is not finite.</summary>
    public static string Number(double value, string format) =>
        double.IsNaN(value) ? "n/a" : double.IsPositiveInfinity(value) ? "inf" : double.IsNegativeInfinity(value) ? "-inf" : value.ToString(format, CultureInfo.InvariantCulture);

    /// <summary>
    /// The format for a column of values: fixed decimals so the largest magnitude shows
    /// <see cref="SignificantDigits"/> digits and the smallest non-zero one at least <see cref="SmallestValueDigits"/>;
    /// exponent notation when that would need more than 12 decimals or the values exceed 1e9.
    /// </summary>
    public static string ChooseFormat(IEnumerable<double> values)
    {
        double largest = 0, smallest = double.PositiveInfinity;
        foreach (var v in values)
        {
            if (double.IsFinite(v) && v != 0)
            {
                largest = Math.Max(largest, Math.Abs(v));
                smallest = Math.Min(smallest, Math.Abs(v));
            }
        }
        if (largest == 0)
        {
            return "F1";
        }
        var decimals = Math.Max(SignificantDigits - 1 - (int)Math.Floor(Math.Log10(largest)),
            SmallestValueDigits - 1 - (int)Math.Floor(Math.Log10(smallest)));
        return largest >= 1e9 || decimals > 12 ? "G" + SignificantDigits.ToString(CultureInfo.InvariantCulture) : "F" + Math.Max(0, decimals).ToString(CultureInfo.InvariantCulture);
    }

    public string ToText()
    {
        var formats = new string?[Columns.Count];
        for (var c = 0; c < Columns.Count; c++)
        {
            var column = Columns[c];
            formats[c] = column.Format ?? ChooseFormat(_rows.Where(r => r[c].IsNumber).Select(r => r[c].Number / column.Divisor));
        }
        var cells = _rows.Select(r => r.Select((cell, c) => cell.Text(formats[c], Columns[c].Divisor)).ToArray()).ToList();
        var headers = Columns.Select(c => c.TextHeader).ToArray();
        var widths = new int[Columns.Count];
        for (var c = 0; c < widths.Length; c++)
        {
            widths[c] = headers[c].Length;
            foreach (var row in cells)
            {
                widths[c] = Math.Max(widths[c], row[c].Length);
            }
        }
        var text = new StringBuilder();
        AppendLine(text, headers, widths);
        text.Append(string.Join("  ", widths.Select(w => new string('-', w)))).Append('\n');
        foreach (var row in cells)
        {
            AppendLine(text, row, widths);
        }
        return text.ToString();
    }

    private static void AppendLine(StringBuilder text, string[] cells, int[] widths)
    {
        for (var c = 0; c < cells.Length; c++)
        {
            if (c > 0)
            {
                text.Append("  ");
            }
            text.Append(cells[c].PadLeft(widths[c]));
        }
        text.Append('\n');
    }

    public void WriteCsv(Stream stream)
    {
        using var csv = new CsvWriter(stream);
        csv.Header(Columns.Select(c => c.CsvHeader));
        foreach (var row in _rows)
        {
            foreach (var cell in row)
            {
                cell.WriteCsv(csv);
            }
            csv.EndRow();
        }
    }

    public string ToCsv()
    {
        using var buffer = new MemoryStream();
        WriteCsv(buffer);
        return Encoding.UTF8.GetString(buffer.ToArray());
    }
}
