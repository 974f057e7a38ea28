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

    /// <summary>Most levels, resonances or transitions a sweep may ask for (each adds one or two columns, and more with sensitivities).</summary>
    public const int MaximumStackQuantities = 100;

    private SweepSpec(string source, JsonObject structure, string structureSource, IReadOnlyList<SweepParameter> parameters,
        DesignPlan plan, SweepOutputs outputs, string fingerprint)
    {
        var (bands, sensitivities) = (outputs.Bands, outputs.Sensitivities);
        Outputs = outputs;
        Sensitivities = sensitivities;
        SensitivityTargets = sensitivities ? parameters.Select(p => LayerField(p.Field)!.Value).ToArray() : [];
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

    /// <summary>Everything each design reports.</summary>
    public SweepOutputs Outputs { get; }

    /// <summary>Number of bands whose edges, widths, masses and gaps each design reports (0: none).</summary>
    public int Bands { get; }

    /// <summary>True when each band edge's exact derivatives with respect to the varied fields are reported.</summary>
    public bool Sensitivities { get; }

    /// <summary>For sensitivities: the cell element and layer quantity of each parameter, in parameter order.</summary>
    public IReadOnlyList<(int Element, Periodic.Design.LayerQuantity Quantity)> SensitivityTargets { get; }

    /// <summary>A hash of everything that decides the rows (the sweep file and the structure's content).</summary>
    public string Fingerprint { get; }

    /// <summary>The number of designs the plan yields.</summary>
    public int DesignCount => Plan.Count;

    /// <summary>Reads and checks a sweep file; every error names the field and what is allowed.</summary>
    public static SweepSpec Load(string path)
    {
        var (root, bytes) = ReadRoot(path, "sweep file", "\"structure\", \"parameters\" and \"outputs\"");
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
        var outputs = ReadOutputs(path, root["outputs"]);
        if (outputs.Hubbard is not null && structure["opticalLattice"] is null)
        {
            throw Bad(path, "outputs.hubbard", "needs an optical-lattice structure (a file with \"opticalLattice\", see docs/cold-atoms.md); this structure has none.");
        }
        if (outputs.Sensitivities)
        {
            for (var j = 0; j < parameters.Count; j++)
            {
                if (LayerField(parameters[j].Field) is null || !IsUniformLayer(structure, parameters[j].Field))
                {
                    throw Bad(path, "outputs.sensitivities", $"needs every parameter to be the width, potential or mass of a uniform layer (cell[I].width, .potential, .mass); parameters[{j}] varies {Printable.Quote(parameters[j].Field)}.");
                }
            }
        }
        var fingerprint = Convert.ToHexString(SHA256.HashData([.. bytes, 0, .. structureBytes]))[..16].ToLowerInvariant();
        return new SweepSpec(path, structure, structureSource, parameters, plan, outputs, fingerprint);
    }

    /// <summary>Reads a JSON file of the tool's own (sweep or design file) as an object, within a size bound.</summary>
    internal static (JsonObject Root, byte[] Bytes) ReadRoot(string path, string what, string fields)
    {
        if (Directory.Exists(path))
        {
            throw new UsageException($"{what} {Printable.Quote(path)} is a directory; give a {what} (JSON).");
        }
        if (!File.Exists(path))
        {
            throw new UsageException($"{what} {Printable.Quote(path)} does not exist.");
        }
        const long MaximumBytes = 16 << 20;
        if (new FileInfo(path).Length > MaximumBytes)
        {
            throw new UsageException($"{what} {Printable.Quote(path)} is larger than 16 MiB; it lists parameters, not data.");
        }
        OutputFile.RegisterInput(path);
        var bytes = File.ReadAllBytes(path);
        try
        {
            var root = JsonNode.Parse(bytes, documentOptions: new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true }) as JsonObject
                ?? throw Bad(path, "", $"must be a JSON object with {fields}.");
            return (root, bytes);
        }
        catch (JsonException e)
        {
            throw new UsageException($"{Printable.Quote(path)}: invalid JSON: {e.Message}");
        }
    }

    internal static (JsonObject Structure, string Source, byte[] Bytes) ReadStructure(string path, JsonNode? node)
    {
        switch (node)
        {
            case JsonObject inline:
                // An inline structure needs no name: it is named after the file that holds it.
                var structure = (JsonObject)inline.DeepClone();
                structure["name"] ??= $"inline structure of {Path.GetFileName(path)}";
                return (structure, "inline", Encoding.UTF8.GetBytes(inline.ToJsonString()));
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
                // A field the file format knows (it has a unit) that this structure leaves out: it is swept only once written in.
                var dot = field.LastIndexOf('.');
                var missing = FieldUnits.Of(field) != "1" && dot > 0
                    ? $" (the structure gives no {field[(dot + 1)..]} there: write one into it, e.g. \"{field[(dot + 1)..]}\": 0 in {field[..dot]}, to sweep it)"
                    : "";
                throw Bad(path, $"{where}.field", $"{Printable.Quote(field)} is not a numeric field of the structure{missing}; allowed: {string.Join(", ", allowed)}.");
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

    private const string OutputsAllowed = "bands, levels, resonances, transitions, hubbard, sensitivities";

    private static SweepOutputs ReadOutputs(string path, JsonNode? node)
    {
        if (node is not JsonObject outputs)
        {
            throw Bad(path, "outputs", "is required: e.g. {\"bands\": 3} (edges, widths, edge masses and gaps of the lowest 3 bands), {\"levels\": 2}, {\"transitions\": [\"1-2\"]}.");
        }
        int bands = 0, levels = 0, resonances = 0;
        var sensitivities = false;
        var transitions = new List<(int, int)>();
        HubbardOutput? hubbard = null;
        int Count(JsonNode? value, string name, int maximum) =>
            value is JsonValue v && v.TryGetValue<int>(out var n) && n >= 1 && n <= maximum ? n
                : throw Bad(path, $"outputs.{name}", string.Create(CultureInfo.InvariantCulture, $"must be a whole number from 1 to {maximum}; got {value?.ToJsonString() ?? "null"}."));
        foreach (var (name, value) in outputs)
        {
            switch (name)
            {
                case "bands":
                    bands = Count(value, name, MaximumBands);
                    break;
                case "levels":
                    levels = Count(value, name, MaximumStackQuantities);
                    break;
                case "resonances":
                    resonances = Count(value, name, MaximumStackQuantities);
                    break;
                case "transitions":
                    if (value is not JsonArray list || list.Count == 0 || list.Count > MaximumStackQuantities)
                    {
                        throw Bad(path, "outputs.transitions", string.Create(CultureInfo.InvariantCulture,
                            $"must be a list of 1 to {MaximumStackQuantities} bound-to-bound transitions \"I-J\" (levels counted from 1, I < J), e.g. [\"1-2\"]."));
                    }
                    for (var i = 0; i < list.Count; i++)
                    {
                        var item = list[i] is JsonValue t && t.TryGetValue<string>(out var text) ? System.Text.RegularExpressions.Regex.Match(text, @"^(\d{1,3})-(\d{1,3})$") : null;
                        int from = 0, to = 0;
                        if (item is not { Success: true } || !int.TryParse(item.Groups[1].Value, NumberStyles.None, CultureInfo.InvariantCulture, out from)
                            || !int.TryParse(item.Groups[2].Value, NumberStyles.None, CultureInfo.InvariantCulture, out to) || from < 1 || to <= from || to > MaximumStackQuantities)
                        {
                            throw Bad(path, string.Create(CultureInfo.InvariantCulture, $"outputs.transitions[{i}]"), string.Create(CultureInfo.InvariantCulture,
                                $"must be \"I-J\" with bound levels 1 ≤ I < J ≤ {MaximumStackQuantities}; got {list[i]?.ToJsonString() ?? "null"}."));
                        }
                        transitions.Add((from, to));
                    }
                    break;
                case "hubbard":
                    hubbard = HubbardOutput.Read(path, value);
                    break;
                case "sensitivities":
                    sensitivities = value is JsonValue b && b.TryGetValue<bool>(out var on) ? on
                        : throw Bad(path, "outputs.sensitivities", $"must be true or false; got {value?.ToJsonString() ?? "null"}.");
                    break;
                default:
                    throw Bad(path, $"outputs.{name}", $"is not an output; allowed: {OutputsAllowed}.");
            }
        }
        var result = new SweepOutputs(bands, sensitivities, levels, resonances, transitions, hubbard);
        return result.Any ? result : throw Bad(path, "outputs", $"names nothing to compute; give at least one of {OutputsAllowed.Replace(", sensitivities", "", StringComparison.Ordinal)} (e.g. {{\"bands\": 3}}).");
    }

    /// <summary>The cell element and layer quantity a path such as <c>cell[2].width</c> names, or null.</summary>
    internal static (int Element, Periodic.Design.LayerQuantity Quantity)? LayerField(string field)
    {
        var match = System.Text.RegularExpressions.Regex.Match(field, @"^cell\[(\d+)\]\.(width|potential|mass)$", System.Text.RegularExpressions.RegexOptions.CultureInvariant);
        if (!match.Success)
        {
            return null;
        }
        var quantity = match.Groups[2].Value switch
        {
            "width" => Periodic.Design.LayerQuantity.Width,
            "potential" => Periodic.Design.LayerQuantity.Potential,
            _ => Periodic.Design.LayerQuantity.Mass,
        };
        return (int.Parse(match.Groups[1].Value, CultureInfo.InvariantCulture), quantity);
    }

    // A layer of the structure file (numbers or a material), not a delta or smooth segment.
    internal static bool IsUniformLayer(JsonObject structure, string field)
    {
        var element = LayerField(field)!.Value.Element;
        return structure["cell"] is JsonArray cell && element < cell.Count && cell[element] is JsonObject layer
            && (layer["width"] is not null || layer["material"] is not null) && layer["delta"] is null;
    }

    internal static double Number(string path, string field, JsonNode? node) =>
        node is JsonValue v && v.TryGetValue<double>(out var x) && double.IsFinite(x) ? x + 0.0
            : throw Bad(path, field, $"must be a finite number (in the field's unit); got {node?.ToJsonString() ?? "nothing"}.");

    internal static UsageException Bad(string path, string field, string message) =>
        new(field.Length == 0 ? $"{Printable.Quote(path)}: {message}" : $"{Printable.Quote(path)}: {field} {message}");
}

/// <summary>What each design of a sweep reports.</summary>
internal sealed record SweepOutputs(int Bands, bool Sensitivities, int Levels, int Resonances, IReadOnlyList<(int From, int To)> Transitions, HubbardOutput? Hubbard)
{
    /// <summary>True when something is computed.</summary>
    public bool Any => Bands > 0 || Levels > 0 || Resonances > 0 || Transitions.Count > 0 || Hubbard is not null;

    /// <summary>True when the bound levels of the stack are needed.</summary>
    public bool NeedsLevels => Levels > 0 || Transitions.Count > 0;
}

/// <summary>The Bose–Hubbard parameters of an optical-lattice file's lowest band: the scattering length and the geometry (as <c>periodic hubbard</c>).</summary>
internal sealed record HubbardOutput(Periodic.Units.Length ScatteringLength, Periodic.OpticalLattices.TransverseConfinement Confinement)
{
    /// <summary>Reads <c>{"scatteringLength": "100 a0", "geometry": "cubic"}</c> (or "tubes" with "transverseFrequency" in Hz).</summary>
    public static HubbardOutput Read(string path, JsonNode? node)
    {
        if (node is not JsonObject obj)
        {
            throw SweepSpec.Bad(path, "outputs.hubbard", "must be an object: {\"scatteringLength\": \"100 a0\", \"geometry\": \"cubic\"} (or \"tubes\" with \"transverseFrequency\" in Hz).");
        }
        foreach (var (name, _) in obj)
        {
            if (name is not ("scatteringLength" or "geometry" or "transverseFrequency"))
            {
                throw SweepSpec.Bad(path, $"outputs.hubbard.{name}", "is not a hubbard field; allowed: scatteringLength, geometry, transverseFrequency.");
            }
        }
        var length = obj["scatteringLength"] switch
        {
            JsonValue v when v.TryGetValue<string>(out var text) => text,
            JsonValue v when v.TryGetValue<double>(out var number) => number.ToString("R", CultureInfo.InvariantCulture),
            _ => null,
        };
        var geometry = obj["geometry"] is JsonValue g && g.TryGetValue<string>(out var word) ? word : "cubic";
        var frequency = obj["transverseFrequency"] is { } f ? SweepSpec.Number(path, "outputs.hubbard.transverseFrequency", f) : (double?)null;
        try
        {
            return new HubbardOutput(Commands.HubbardCommand.ParseScatteringLength(length), Commands.HubbardCommand.ParseGeometry(geometry, frequency));
        }
        catch (UsageException e)
        {
            throw SweepSpec.Bad(path, "outputs.hubbard", "(the hubbard command's options as fields): " + e.Message);
        }
    }
}

/// <summary>One varied field: its path in the structure document, its unit, and its values or range.</summary>
internal sealed record SweepParameter(string Field, string Unit, double[]? Values, (double From, double To)? Range, int? Count);
