// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;

namespace Periodic.Cli.Output;

/// <summary>
/// Rows of numbers rendered as an aligned text table (units in the headers) or as CSV. Building
/// the whole table before anything is written keeps output all-or-nothing.
/// </summary>
internal sealed class Table(params string[] headers)
{
    private readonly List<string[]> _rows = [];

    public string[] Headers { get; } = headers;

    public void Add(params string[] cells) => _rows.Add(cells);

    public static string Number(double value, string format = "G10") =>
        double.IsNaN(value) ? "n/a" : double.IsPositiveInfinity(value) ? "inf" : double.IsNegativeInfinity(value) ? "-inf" : value.ToString(format, CultureInfo.InvariantCulture);

    public static string Integer(int value) => value.ToString(CultureInfo.InvariantCulture);

    public string ToText()
    {
        var widths = new int[Headers.Length];
        for (var c = 0; c < Headers.Length; c++)
        {
            widths[c] = Headers[c].Length;
            foreach (var row in _rows)
            {
                widths[c] = Math.Max(widths[c], row[c].Length);
            }
        }
        var text = new StringBuilder();
        AppendLine(text, Headers, widths);
        text.Append(string.Join("  ", widths.Select(w => new string('-', w)))).Append('\n');
        foreach (var row in _rows)
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

    /// <summary>RFC 4180 CSV: a header row, then one row per entry; empty cells for "no value".</summary>
    public string ToCsv()
    {
        var text = new StringBuilder();
        text.Append(string.Join(",", Headers.Select(Quote))).Append('\n');
        foreach (var row in _rows)
        {
            text.Append(string.Join(",", row.Select(cell => cell is "n/a" ? "" : Quote(cell)))).Append('\n');
        }
        return text.ToString();
    }

    private static string Quote(string cell) =>
        cell.IndexOfAny([',', '"', '\n']) >= 0 ? "\"" + cell.Replace("\"", "\"\"") + "\"" : cell;
}
