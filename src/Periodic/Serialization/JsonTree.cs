// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Text;
using System.Text.Json;

namespace Periodic.Serialization;

/// <summary>
/// A minimal JSON tree that remembers where every value and property name starts, so errors found
/// after parsing (a negative width, an unknown unit) can still name the line and column.
/// JsonDocument does not expose positions, hence this small reader over <see cref="Utf8JsonReader"/>.
/// </summary>
internal abstract class JsonTreeNode
{
    protected JsonTreeNode(long offset) => Offset = offset;

    /// <summary>Byte offset of the first byte of the value in the UTF-8 source.</summary>
    public long Offset { get; }

    public abstract string KindName { get; }
}

internal sealed class JsonTreeObject(long offset) : JsonTreeNode(offset)
{
    public List<JsonTreeProperty> Properties { get; } = [];

    public override string KindName => "an object";
}

internal sealed record JsonTreeProperty(string Name, long NameOffset, JsonTreeNode Value);

internal sealed class JsonTreeArray(long offset) : JsonTreeNode(offset)
{
    public List<JsonTreeNode> Items { get; } = [];

    public override string KindName => "an array";
}

internal sealed class JsonTreeString(long offset, string value) : JsonTreeNode(offset)
{
    public string Value { get; } = value;

    public override string KindName => "a string";
}

internal sealed class JsonTreeNumber(long offset, double value, string? text) : JsonTreeNode(offset)
{
    public double Value { get; } = value;

    /// <summary>The number as written, kept only when it is not a finite double (to quote it in the error); else null.</summary>
    public string? Text { get; } = text;

    public override string KindName => "a number";
}

internal sealed class JsonTreeLiteral(long offset, JsonTokenType token) : JsonTreeNode(offset)
{
    public JsonTokenType Token { get; } = token;

    public override string KindName => Token switch
    {
        JsonTokenType.True => "true",
        JsonTokenType.False => "false",
        _ => "null",
    };
}

/// <summary>Builds a <see cref="JsonTreeNode"/> tree; syntax errors surface as <see cref="JsonException"/>.</summary>
internal static class JsonTreeReader
{
    private const int MaxDepth = 64;

    /// <summary>Largest array read: twice the largest count any field accepts, so that field can still say its own bound.</summary>
    private const int MaxArrayItems = 2 * StructureFileLimits.MaxSamples;

    public static JsonTreeNode Read(ReadOnlySpan<byte> utf8)
    {
        var reader = new Utf8JsonReader(utf8, new JsonReaderOptions
        {
            CommentHandling = JsonCommentHandling.Skip,
            AllowTrailingCommas = true,
            MaxDepth = MaxDepth,
        });
        if (!reader.Read())
        {
            throw new JsonException("the file is empty; expected a JSON object.", null, 0, 0);
        }
        var root = ReadValue(ref reader);
        if (reader.Read())
        {
            // Utf8JsonReader normally reports trailing content itself; kept as a guard.
            throw new JsonException("unexpected content after the top-level value.");
        }
        return root;
    }

    private static JsonTreeNode ReadValue(ref Utf8JsonReader reader)
    {
        var offset = reader.TokenStartIndex;
        switch (reader.TokenType)
        {
            case JsonTokenType.StartObject:
                var obj = new JsonTreeObject(offset);
                while (reader.Read() && reader.TokenType != JsonTokenType.EndObject)
                {
                    var nameOffset = reader.TokenStartIndex;
                    var name = GetString(ref reader);
                    reader.Read();
                    obj.Properties.Add(new JsonTreeProperty(name, nameOffset, ReadValue(ref reader)));
                }
                return obj;
            case JsonTokenType.StartArray:
                var array = new JsonTreeArray(offset);
                while (reader.Read() && reader.TokenType != JsonTokenType.EndArray)
                {
                    if (array.Items.Count == MaxArrayItems)
                    {
                        throw new JsonTreeStringException(offset, string.Create(System.Globalization.CultureInfo.InvariantCulture,
                            $"an array of more than {MaxArrayItems} values; no field of a structure file takes more than {Serialization.StructureFileLimits.MaxSamples} (see docs/limits.md)."), null);
                    }
                    array.Items.Add(ReadValue(ref reader));
                }
                return array;
            case JsonTokenType.String:
                return new JsonTreeString(offset, GetString(ref reader));
            case JsonTokenType.Number:
                var value = reader.TryGetDouble(out var d) ? d : double.PositiveInfinity;
                var text = double.IsFinite(value) ? null : Encoding.UTF8.GetString(reader.HasValueSequence ? System.Buffers.BuffersExtensions.ToArray(reader.ValueSequence) : reader.ValueSpan);
                return new JsonTreeNumber(offset, value, text);
            default:
                return new JsonTreeLiteral(offset, reader.TokenType);
        }
    }

    /// <summary>The string token's value; an escape that is not a valid character (a lone surrogate such as \ud800) is located.</summary>
    private static string GetString(ref Utf8JsonReader reader)
    {
        try
        {
            return reader.GetString()!;
        }
        catch (InvalidOperationException e)
        {
            throw new JsonTreeStringException(reader.TokenStartIndex,
                "a string holds an escape that is not a valid character (a lone surrogate such as \\ud800 without its pair); write the character itself or a complete pair.", e);
        }
    }

    /// <summary>1-based line and column (in characters) of a byte offset.</summary>
    public static (int Line, int Column) Position(ReadOnlySpan<byte> utf8, long offset)
    {
        int line = 1, column = 1;
        var end = (int)Math.Min(offset, utf8.Length);
        for (var i = 0; i < end; i++)
        {
            var b = utf8[i];
            if (b == (byte)'\n')
            {
                line++;
                column = 1;
            }
            else if ((b & 0xC0) != 0x80)
            {
                column++; // count characters, not UTF-8 continuation bytes
            }
        }
        return (line, column);
    }
}

/// <summary>A string value that is not valid Unicode, with the byte offset where it starts.</summary>
internal sealed class JsonTreeStringException(long offset, string message, Exception? inner) : Exception(message, inner)
{
    public long Offset { get; } = offset;
}
