// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using Periodic.Cli.Output;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// A sweep file: a structure (a path relative to the sweep file, or the structure inline), the parameters that vary
/// (each a numeric field of the structure file, given as a list of values or a range), how designs are drawn
/// (a full grid, or a seeded quasi-random set), and what to compute for each design.
/// </summary>
/// <remarks>
/// <code>
/// {
///   "structure": "../structures/superlattice.json",
///   "parameters": [
///     {"field": "cell[0].width", "from": 3, "to": 8, "count": 11},
///     {"field": "cell[1].potential", "values": [0.2, 0.25, 0.3]}
///   ],
///   "design": "grid",                                   // or {"quasiRandom": 256, "seed": 1}
///   "outputs": {"bands": 3}
/// }
/// </code>
/// Values are bare numbers in the unit the structure file gives that field when no unit is written (nm, eV, m0,
/// K, …; see <see cref="FieldUnits"/>).
/// </remarks>
internal sealed class SweepSpec
{
    /// <summary>Most designs one sweep file may hold: 10⁶ rows of a few dozen doubles stay under a few hundred MB.</summary>
    public const int MaximumDesigns = 1_000_000;

    /// <summary>Most bands a sweep may ask for (each band adds six columns).</summary>
    public const int MaximumBands = 50;

    private SweepSpec(string source, JsonObject structure, string structureSource, IReadOnlyList<SweepParameter> parameters,
        DesignPlan plan, int bands, string fingerprint)
    {
        Source = source;
        Structure = structure;
        StructureSource = structureSource;
        Parameters = parameters;
        Plan = plan;
        Bands = bands;
        Fingerprint = fingerprint;
    }

    /// <summary>The sweep file's path as given.</summary>
    public string Source { get; }

    /// <summary>The structure document every design starts from.</summary>
    public JsonObject Structure { get; }

    /// <summary>Where the structure came from (its path, or "inline").</summary>
    public string StructureSource { get; }

    /// <summary>The varied fields, in column order.</summary>
    public IReadOnlyList<SweepParameter> Parameters { get; }

    /// <summary>How the designs are drawn.</summary>
    public DesignPlan Plan { get; }

    /// <summary>Number of bands whose edges, widths, masses and gaps each design reports.</summary>
    public int Bands { get; }

    /// <summary>A hash of everything that decides the rows (the sweep file and the structure's content).</summary>
    public string Fingerprint { get; }

    /// <summary>The number of designs the plan yields.</summary>
    public int DesignCount => Plan.Count;

    /// <summary>Reads and checks a sweep file; every error names the field and what is allowed.</summary>
    public static SweepSpec Load(string path)
    {
        if (Directory.Exists(path))
        {
            throw new UsageException($"sweep file {Printable.Quote(path)} is a directory; give a sweep file (JSON).");
        }
        if (!File.Exists(path))
        {
            throw new UsageException($"sweep file {Printable.Quote(path)} does not exist.");
        }
        const long MaximumBytes = 16 << 20;
        if (new FileInfo(path).Length > MaximumBytes)
        {
            throw new UsageException($"sweep file {Printable.Quote(path)} is larger than 16 MiB; a sweep file lists parameters, not data.");
        }
        OutputFile.RegisterInput(path);
        var bytes = File.ReadAllBytes(path);
        JsonObject root;
        try
        {
            root = JsonNode.Parse(bytes, documentOptions: new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true }) as JsonObject
                ?? throw Bad(path, "", "must be a JSON object with \"structure\", \"parameters\" and \"outputs\".");
        }
        catch (JsonException e)
        {
            throw new UsageException($"{Printable.Quote(path)}: invalid JSON: {e.Message}");
        }
        foreach (var (name, _) in root)
        {
            if (name is not ("$schema" or "structure" or "parameters" or "design" or "outputs" or "description"))
            {
                throw Bad(path, name, "is not a sweep field; allowed: structure, parameters, design, outputs, description.");
            }
        }
        var (structure, structureSource, structureBytes) = ReadStructure(path, root["structure"]);
        var parameters = ReadParameters(path, root["parameters"], structure);
        var plan = DesignPlan.Read(path, root["design"], parameters);
        var bands = ReadOutputs(path, root["outputs"]);
        var fingerprint = Convert.ToHexString(SHA256.HashData([.. bytes, 0, .. structureBytes]))[..16].ToLowerInvariant();
        return new SweepSpec(path, structure, structureSource, parameters, plan, bands, fingerprint);
    }

    private static (JsonObject Structure, string Source, byte[] Bytes) ReadStructure(string path, JsonNode? node)
    {
        switch (node)
        {
            case JsonObject inline:
                return ((JsonObject)inline.DeepClone(), "inline", Encoding.UTF8.GetBytes(inline.ToJsonString()));
            case JsonValue value when value.TryGetValue<string>(out var relative):
                var full = Path.Combine(Path.GetDirectoryName(Path.GetFullPath(path))!, relative);
                if (!File.Exists(full))
                {
                    throw Bad(path, "structure", $"names {Printable.Quote(relative)}, which does not exist (paths are relative to the sweep file).");
                }
                OutputFile.RegisterInput(full);
                var bytes = File.ReadAllBytes(full);
                try
                {
                    var parsed = JsonNode.Parse(bytes, documentOptions: new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
                    return (parsed as JsonObject ?? throw Bad(path, "structure", "must name a structure file holding a JSON object."), relative, bytes);
                }
                catch (JsonException e)
                {
                    throw Bad(path, "structure", $"{Printable.Quote(relative)} is not valid JSON: {e.Message}");
                }
            default:
                throw Bad(path, "structure", "is required: a structure file path (relative to the sweep file) or the structure object itself.");
        }
    }

    private static List<SweepParameter> ReadParameters(string path, JsonNode? node, JsonObject structure)
    {
        if (node is not JsonArray array || array.Count == 0)
        {
            throw Bad(path, "parameters", "must be a non-empty array of {\"field\": …, \"values\": [...]} or {\"field\": …, \"from\": a, \"to\": b, \"count\": n}.");
        }
        var allowed = FieldPath.NumericFields(structure);
        var parameters = new List<SweepParameter>();
        for (var i = 0; i < array.Count; i++)
        {
            var where = string.Create(CultureInfo.InvariantCulture, $"parameters[{i}]");
            if (array[i] is not JsonObject item)
            {
                throw Bad(path, where, "must be an object with \"field\" and either \"values\" or \"from\"/\"to\"/\"count\".");
            }
            foreach (var (name, _) in item)
            {
                if (name is not ("field" or "values" or "from" or "to" or "count"))
                {
                    throw Bad(path, $"{where}.{name}", "is not a parameter field; allowed: field, values, from, to, count.");
                }
            }
            var field = item["field"] is JsonValue f && f.TryGetValue<string>(out var text) ? text : throw Bad(path, $"{where}.field", "is required: the structure field to vary, e.g. \"cell[0].width\".");
            if (!allowed.Contains(field))
            {
                throw Bad(path, $"{where}.field", $"{Printable.Quote(field)} is not a numeric field of the structure; allowed: {string.Join(", ", allowed)}.");
            }
            if (parameters.Exists(p => p.Field == field))
            {
                throw Bad(path, $"{where}.field", $"{Printable.Quote(field)} is varied twice.");
            }
            double[]? values = null;
            (double From, double To)? range = null;
            int? count = null;
            if (item["values"] is { } list)
            {
                if (item["from"] is not null || item["to"] is not null || item["count"] is not null)
                {
                    throw Bad(path, where, "give either \"values\" or \"from\"/\"to\"/\"count\", not both.");
                }
                if (list is not JsonArray valueArray || valueArray.Count == 0)
                {
                    throw Bad(path, $"{where}.values", "must be a non-empty array of numbers.");
                }
                values = valueArray.Select((v, j) => Number(path, string.Create(CultureInfo.InvariantCulture, $"{where}.values[{j}]"), v)).ToArray();
            }
            else
            {
                var from = Number(path, $"{where}.from", item["from"]);
                var to = Number(path, $"{where}.to", item["to"]);
                if (!(to > from))
                {
                    throw Bad(path, $"{where}.to", string.Create(CultureInfo.InvariantCulture, $"must be above from ({from:R}); got {to:R}."));
                }
                range = (from, to);
                if (item["count"] is { } c)
                {
                    count = c is JsonValue cv && cv.TryGetValue<int>(out var n) && n >= 2 ? n
                        : throw Bad(path, $"{where}.count", $"must be a whole number of at least 2; got {c.ToJsonString()}.");
                }
            }
            parameters.Add(new SweepParameter(field, FieldUnits.Of(field), values, range, count));
        }
        return parameters;
    }

    private static int ReadOutputs(string path, JsonNode? node)
    {
        if (node is not JsonObject outputs)
        {
            throw Bad(path, "outputs", "is required: e.g. {\"bands\": 3} (edges, widths, edge masses and gaps of the lowest 3 bands).");
        }
        var bands = 0;
        foreach (var (name, value) in outputs)
        {
            if (name != "bands")
            {
                throw Bad(path, $"outputs.{name}", "is not an output; allowed: bands.");
            }
            bands = value is JsonValue v && v.TryGetValue<int>(out var n) && n is >= 1 and <= MaximumBands ? n
                : throw Bad(path, "outputs.bands", string.Create(CultureInfo.InvariantCulture, $"must be a whole number from 1 to {MaximumBands}; got {value?.ToJsonString() ?? "null"}."));
        }
        return bands > 0 ? bands : throw Bad(path, "outputs", "names no output; e.g. {\"bands\": 3}.");
    }

    internal static double Number(string path, string field, JsonNode? node) =>
        node is JsonValue v && v.TryGetValue<double>(out var x) && double.IsFinite(x) ? x + 0.0
            : throw Bad(path, field, $"must be a finite number (in the field's unit); got {node?.ToJsonString() ?? "nothing"}.");

    internal static UsageException Bad(string path, string field, string message) =>
        new(field.Length == 0 ? $"{Printable.Quote(path)}: {message}" : $"{Printable.Quote(path)}: {field} {message}");
}

/// <summary>One varied field: its path in the structure document, its unit, and its values or range.</summary>
internal sealed record SweepParameter(string Field, string Unit, double[]? Values, (double From, double To)? Range, int? Count);
