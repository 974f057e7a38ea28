// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;

namespace Periodic.Cli.Output;

/// <summary>Text from files and arguments made safe to print: control characters never reach the terminal raw.</summary>
internal static class Printable
{
    /// <summary>
    /// <paramref name="text"/> in double quotes with control characters (C0, DEL, C1), lone surrogates and the
    /// quote and backslash escaped as in JSON (<c>\n</c>, <c>\u001b</c>, …), so an escape sequence in a name cannot
    /// drive the terminal and the printed value shows what was given.
    /// </summary>
    public static string Quote(string text) => "\"" + Escape(text) + "\"";

    /// <summary>As <see cref="Quote"/>, without the quotes.</summary>
    public static string Escape(string text)
    {
        StringBuilder? builder = null;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            var pairedSurrogate = char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]);
            var safe = !char.IsControl(c) && c != '"' && c != '\\' && (!char.IsSurrogate(c) || pairedSurrogate
                || (char.IsLowSurrogate(c) && i > 0 && char.IsHighSurrogate(text[i - 1])));
            if (safe)
            {
                builder?.Append(c);
                continue;
            }
            builder ??= new StringBuilder(text, 0, i, text.Length + 16);
            builder.Append(c switch
            {
                '"' => "\\\"",
                '\\' => "\\\\",
                '\n' => "\\n",
                '\r' => "\\r",
                '\t' => "\\t",
                _ => "\\u" + ((int)c).ToString("x4", CultureInfo.InvariantCulture),
            });
        }
        return builder?.ToString() ?? text;
    }
}
