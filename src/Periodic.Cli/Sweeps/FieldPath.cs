// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// Paths to the numeric fields of a structure document (<c>cell[1].width</c>, <c>stack.periods</c>,
/// <c>temperature</c>, <c>cell[1].composition</c>, …) and how a design writes a value into a copy of it.
/// </summary>
internal static partial class FieldPath
{
    /// <summary>Every path a sweep may vary in <paramref name="structure"/>, in document order.</summary>
    public static List<string> NumericFields(JsonObject structure)
    {
        var fields = new List<string>();
        Collect(structure, "", fields);
        return fields;
    }

    /// <summary>Writes <paramref name="value"/> at <paramref name="path"/> (which <see cref="NumericFields"/> listed).</summary>
    public static void Set(JsonObject structure, string path, double value)
    {
        var (parent, key, index) = Locate(structure, path);
        if (key == "composition")
        {
            var material = (JsonObject)parent!;
            material["material"] = WithComposition((string)material["material"]!, value);
            return;
        }
        JsonNode number = JsonValue.Create(value);
        if (index is { } i)
        {
            ((JsonArray)parent!)[i] = number;
        }
        else
        {
            ((JsonObject)parent!)[key] = number;
        }
    }

    private static void Collect(JsonNode? node, string path, List<string> fields)
    {
        switch (node)
        {
            case JsonObject obj:
                foreach (var (name, child) in obj)
                {
                    if (name is "$schema" or "name" or "description" or "label" or "carrier" or "substrate" or "nonParabolic")
                    {
                        continue;
                    }
                    var childPath = path.Length == 0 ? name : path + "." + name;
                    if (name == "material" && child is JsonValue m && m.TryGetValue<string>(out var formula) && AlloyFormula().IsMatch(formula))
                    {
                        fields.Add(path + ".composition");
                        continue;
                    }
                    Collect(child, childPath, fields);
                }
                break;
            case JsonArray array:
                for (var i = 0; i < array.Count; i++)
                {
                    Collect(array[i], string.Create(CultureInfo.InvariantCulture, $"{path}[{i}]"), fields);
                }
                break;
            case JsonValue value when value.TryGetValue<double>(out _) || (value.TryGetValue<string>(out var text) && Quantity().IsMatch(text)):
                fields.Add(path);
                break;
        }
    }

    private static (JsonNode? Parent, string Key, int? Index) Locate(JsonObject root, string path)
    {
        JsonNode? current = root;
        JsonNode? parent = null;
        var key = "";
        int? index = null;
        foreach (Match part in Segment().Matches(path))
        {
            parent = current;
            if (part.Groups["name"].Success)
            {
                key = part.Groups["name"].Value;
                index = null;
                current = key == "composition" ? null : current?[key];
            }
            else
            {
                index = int.Parse(part.Groups["index"].Value, CultureInfo.InvariantCulture);
                current = current?[index.Value];
            }
        }
        return (parent, key, index);
    }

    /// <summary>A two-metal ternary such as Al0.3Ga0.7As with x replaced: the first fraction x, the second 1 − x.</summary>
    private static string WithComposition(string formula, double x)
    {
        var match = AlloyFormula().Match(formula);
        var first = x.ToString("R", CultureInfo.InvariantCulture);
        var second = (1 - x).ToString("R", CultureInfo.InvariantCulture);
        return match.Groups["a"].Value + first + match.Groups["b"].Value + second + match.Groups["rest"].Value;
    }

    [GeneratedRegex(@"^(?<a>[A-Z][a-z]?)(?<x>\d*\.?\d+)(?<b>[A-Z][a-z]?)(?<y>\d*\.?\d+)(?<rest>[A-Z][a-z]?)$", RegexOptions.CultureInvariant)]
    private static partial Regex AlloyFormula();

    [GeneratedRegex(@"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*\S", RegexOptions.CultureInvariant)]
    private static partial Regex Quantity();

    [GeneratedRegex(@"(?<name>[A-Za-z$][A-Za-z0-9]*)|\[(?<index>\d+)\]", RegexOptions.CultureInvariant)]
    private static partial Regex Segment();
}

/// <summary>The unit a bare number has in each structure-file field, for column headers and Parquet metadata.</summary>
internal static class FieldUnits
{
    /// <summary>The unit of the field a path ends in ("1" for counts and fractions).</summary>
    public static string Of(string path)
    {
        var last = path[(path.LastIndexOf('.') + 1)..];
        var bracket = last.IndexOf('[', StringComparison.Ordinal);
        if (bracket >= 0)
        {
            last = last[..bracket];
        }
        return last switch
        {
            "width" or "period" or "positions" => "nm",
            "potential" or "potentials" or "bias" or "constant" or "cosine" or "sine" or "donorIonisationEnergy" => "eV",
            "donors" or "acceptors" => "cm^-3",
            "sheetDonors" => "cm^-2",
            "mass" or "masses" => "m0",
            "temperature" => "K",
            "delta" => "eV nm",
            "nonParabolicity" => "1/eV",
            _ => "1",
        };
    }
}
