// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Serialization;

/// <summary>
/// A structure file could not be read: malformed JSON, a missing or unknown field, a value of the
/// wrong kind, an unknown unit or a value outside what the model allows. The message has the form
/// <c>file:line:column: field: problem</c>, and each part is also available as a property.
/// </summary>
public sealed class StructureFileException : FormatException
{
    /// <summary>Creates an exception with a bare message (no position).</summary>
    public StructureFileException()
        : this("the structure file could not be read.")
    {
    }

    /// <summary>Creates an exception with a bare message (no position).</summary>
    public StructureFileException(string message)
        : base(message)
    {
        SourceName = string.Empty;
        Field = string.Empty;
        Problem = message;
    }

    /// <summary>Creates an exception with a bare message and the error that caused it.</summary>
    public StructureFileException(string message, Exception innerException)
        : base(message, innerException)
    {
        SourceName = string.Empty;
        Field = string.Empty;
        Problem = message;
    }

    internal StructureFileException(string sourceName, int line, int column, string field, string problem, Exception? innerException = null)
        : base(Compose(sourceName, line, column, field, problem), innerException)
    {
        SourceName = sourceName;
        LineNumber = line;
        Column = column;
        Field = field;
        Problem = problem;
    }

    /// <summary>The file name (or the source name given to <see cref="StructureFile.Parse(string, string)"/>).</summary>
    public string SourceName { get; }

    /// <summary>1-based line of the offending value; 0 when unknown.</summary>
    public int LineNumber { get; }

    /// <summary>1-based column (in characters) of the offending value; 0 when unknown.</summary>
    public int Column { get; }

    /// <summary>The JSON path of the offending field, e.g. <c>cell[1].width</c>; empty for a syntax error.</summary>
    public string Field { get; }

    /// <summary>What is wrong, without the position prefix.</summary>
    public string Problem { get; }

    private static string Compose(string sourceName, int line, int column, string field, string problem) =>
        Escape(field.Length == 0
            ? string.Create(CultureInfo.InvariantCulture, $"{sourceName}:{line}:{column}: {problem}")
            : string.Create(CultureInfo.InvariantCulture, $"{sourceName}:{line}:{column}: {field}: {problem}"));

    /// <summary>
    /// One printable line: control characters (including line breaks quoted from the file), line and paragraph separators and
    /// bidirectional controls become \uXXXX, so a message can neither span lines nor drive a terminal.
    /// </summary>
    private static string Escape(string text)
    {
        var builder = new System.Text.StringBuilder(text.Length);
        foreach (var c in text)
        {
            if (char.IsControl(c) || c is '\u2028' or '\u2029' || (c >= '\u202A' && c <= '\u202E') || (c >= '\u2066' && c <= '\u2069'))
            {
                builder.Append(CultureInfo.InvariantCulture, $"\\u{(int)c:X4}");
            }
            else
            {
                builder.Append(c);
            }
        }
        return builder.ToString();
    }
}
