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
        field.Length == 0
            ? string.Create(CultureInfo.InvariantCulture, $"{sourceName}:{line}:{column}: {problem}")
            : string.Create(CultureInfo.InvariantCulture, $"{sourceName}:{line}:{column}: {field}: {problem}");
}
