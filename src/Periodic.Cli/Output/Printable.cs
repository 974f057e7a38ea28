// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;

namespace Periodic.Cli.Output;

/// <summary>Text from files and arguments made safe to print: control characters never reach the terminal raw.</summary>
internal static class Printable
{
    /// <summary>
    /// <paramref name="text"/> as it may be printed: control characters (C0, DEL, C1), line and paragraph separators,
    /// bidirectional controls and lone surrogates become \uXXXX escapes, so a name cannot move the cursor, recolour or
    /// clear the terminal, and the printed value shows what was given.
    /// </summary>
    public static string Escape(string text)
    {
        StringBuilder? builder = null;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            var pairedSurrogate = (char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]))
                || (char.IsLowSurrogate(c) && i > 0 && char.IsHighSurrogate(text[i - 1]));
            var unsafeChar = char.IsControl(c) || c is '\u2028' or '\u2029' || (c >= '\u202A' && c <= '\u202E') || (c >= '\u2066' && c <= '\u2069')
                || (char.IsSurrogate(c) && !pairedSurrogate);
            if (unsafeChar)
            {
                builder ??= new StringBuilder(text, 0, i, text.Length + 16);
                builder.Append(string.Create(CultureInfo.InvariantCulture, $"\\u{(int)c:X4}"));
            }
            else
            {
                builder?.Append(c);
            }
        }
        return builder?.ToString() ?? text;
    }

    /// <summary><paramref name="text"/> escaped as by <see cref="Escape"/>, in double quotes.</summary>
    public static string Quote(string text) => "\"" + Escape(text) + "\"";
}
