// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using Periodic.Materials;
using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Serialization;

/// <summary>
/// Reads structure files: UTF-8 JSON documents that describe one unit cell, as published in
/// <c>docs/structure.schema.json</c>. The same reader serves the command-line tool, scripts and notebooks.
/// </summary>
/// <remarks>
/// <para>The form is <c>{"name": "...", "cell": [{"width": 5.0, "potential": 0.0, "mass": 0.067}, {"delta": "0.1 eV nm"}]}</c>.
/// Bare numbers are in nm, eV, m₀, eV·nm and 1/eV; a string may carry a unit instead ("2 nm", "20 Å",
/// "250 meV", "0.067 m0", "0.1 eV nm", "0.6 /eV"). Comments and trailing commas are accepted; unknown
/// or duplicate fields are errors (they are usually typing mistakes).</para>
/// <para>Every error is a <see cref="StructureFileException"/> naming the file, line, column and field.</para>
/// </remarks>
public static partial class StructureFile
{
    /// <summary>Most parts in a file's <c>stack.parts</c> (a part may itself repeat the cell a million times).</summary>
    private const int MaxStackParts = 10_000;

    private static readonly Dictionary<string, double> LengthUnits = new(StringComparer.Ordinal)
    {
        ["nm"] = 1.0, ["Å"] = 0.1, ["A"] = 0.1, ["angstrom"] = 0.1, ["pm"] = 1e-3, ["um"] = 1e3, ["µm"] = 1e3,
    };

    private static readonly Dictionary<string, double> EnergyUnits = new(StringComparer.Ordinal)
    {
        ["eV"] = 1.0, ["meV"] = 1e-3,
    };

    private static readonly Dictionary<string, double> MassUnits = new(StringComparer.Ordinal)
    {
        ["m0"] = 1.0, ["me"] = 1.0,
    };

    // Units are compared after removing blanks and the multiplication signs " ", "·", "⋅", "*".
    private static readonly Dictionary<string, double> StrengthUnits = new(StringComparer.Ordinal)
    {
        ["eVnm"] = 1.0, ["meVnm"] = 1e-3, ["eVÅ"] = 0.1, ["eVA"] = 0.1, ["meVÅ"] = 1e-4, ["meVA"] = 1e-4,
    };

    private static readonly Dictionary<string, double> TemperatureUnits = new(StringComparer.Ordinal)
    {
        ["K"] = 1.0,
    };

    private static readonly Dictionary<string, double> VolumeDensityUnits = new(StringComparer.Ordinal)
    {
        ["cm^-3"] = 1.0, ["cm-3"] = 1.0, ["/cm3"] = 1.0, ["/cm^3"] = 1.0, ["m^-3"] = 1e-6, ["/m3"] = 1e-6, ["nm^-3"] = 1e21, ["/nm3"] = 1e21,
    };

    private static readonly Dictionary<string, double> SheetDensityUnits = new(StringComparer.Ordinal)
    {
        ["cm^-2"] = 1.0, ["cm-2"] = 1.0, ["/cm2"] = 1.0, ["/cm^2"] = 1.0, ["m^-2"] = 1e-4, ["/m2"] = 1e-4, ["nm^-2"] = 1e14, ["/nm2"] = 1e14,
    };

    private static readonly Dictionary<string, double> NoUnits = new(StringComparer.Ordinal);

    private static readonly string[] DopingFields = ["donors", "acceptors", "sheetDonors", "permittivity", "donorIonisationEnergy", "acceptorIonisationEnergy"];

    private static readonly Dictionary<string, double> InverseEnergyUnits = new(StringComparer.Ordinal)
    {
        ["/eV"] = 1.0, ["1/eV"] = 1.0, ["eV^-1"] = 1.0, ["/meV"] = 1e3, ["1/meV"] = 1e3,
    };

    /// <summary>Reads and validates the structure file at <paramref name="path"/>.</summary>
    /// <param name="path">Path of a UTF-8 JSON file.</param>
    /// <exception cref="ArgumentException"><paramref name="path"/> is null or empty.</exception>
    /// <exception cref="FileNotFoundException">The file does not exist.</exception>
    /// <exception cref="IOException">The file cannot be read.</exception>
    /// <exception cref="StructureFileException">The content is not a valid structure file, or the file is larger than
    /// <see cref="StructureFileLimits.MaxFileBytes"/> (checked while reading, so a device or an endless stream is never read whole).</exception>
    public static StructureDefinition Load(string path)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        if (Directory.Exists(path))
        {
            throw new StructureFileException(path, 1, 1, string.Empty, "is a directory, not a structure file.");
        }
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
        var buffer = new byte[(int)Math.Min(StructureFileLimits.MaxFileBytes + 1, stream.CanSeek && stream.Length > 0 ? stream.Length + 1 : 64 * 1024)];
        var length = 0;
        while (true)
        {
            if (length == buffer.Length)
            {
                if (length > StructureFileLimits.MaxFileBytes)
                {
                    throw TooLarge(path);
                }
                Array.Resize(ref buffer, (int)Math.Min(StructureFileLimits.MaxFileBytes + 1, 2L * buffer.Length));
            }
            var read = stream.Read(buffer, length, buffer.Length - length);
            if (read == 0)
            {
                break;
            }
            length += read;
        }
        if (length > StructureFileLimits.MaxFileBytes)
        {
            throw TooLarge(path);
        }
        return Parse(buffer.AsSpan(0, length), path);
    }

    private static StructureFileException TooLarge(string sourceName) =>
        new(sourceName, 1, 1, string.Empty, string.Create(CultureInfo.InvariantCulture,
            $"the file is larger than {StructureFileLimits.MaxFileBytes} bytes (16 MiB), the largest structure file read (its values are held in memory; see docs/limits.md)."));

    /// <summary>Parses a structure document held in a string.</summary>
    /// <param name="json">The JSON text.</param>
    /// <param name="sourceName">Name used in error messages (a file name, or e.g. "&lt;input&gt;").</param>
    /// <exception cref="ArgumentNullException">An argument is null.</exception>
    /// <exception cref="StructureFileException">The content is not a valid structure file.</exception>
    public static StructureDefinition Parse(string json, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(json);
        return Parse(Encoding.UTF8.GetBytes(json), sourceName);
    }

    /// <summary>Parses a structure document from UTF-8 bytes (a leading byte-order mark is skipped).</summary>
    /// <param name="utf8Json">The UTF-8 encoded JSON.</param>
    /// <param name="sourceName">Name used in error messages.</param>
    /// <exception cref="ArgumentNullException"><paramref name="sourceName"/> is null.</exception>
    /// <exception cref="StructureFileException">The content is not a valid structure file.</exception>
    public static StructureDefinition Parse(ReadOnlySpan<byte> utf8Json, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(sourceName);
        if (utf8Json.Length > StructureFileLimits.MaxFileBytes)
        {
            throw TooLarge(sourceName);
        }
        if (utf8Json.StartsWith("\uFEFF"u8))
        {
            utf8Json = utf8Json[3..];
        }
        if (!System.Text.Unicode.Utf8.IsValid(utf8Json)
            && System.Text.Unicode.Utf8.ToUtf16(utf8Json, new char[utf8Json.Length], out var valid, out _, replaceInvalidSequences: false) != System.Buffers.OperationStatus.Done)
        {
            var (badLine, badColumn) = JsonTreeReader.Position(utf8Json, valid);
            throw new StructureFileException(sourceName, badLine, badColumn, string.Empty,
                string.Create(CultureInfo.InvariantCulture, $"invalid UTF-8: byte 0x{utf8Json[valid]:X2} at offset {valid} does not start a valid character; save the file as UTF-8."));
        }
        JsonTreeNode root;
        try
        {
            root = JsonTreeReader.Read(utf8Json);
        }
        catch (JsonTreeStringException e)
        {
            var (line, column) = JsonTreeReader.Position(utf8Json, e.Offset);
            throw new StructureFileException(sourceName, line, column, string.Empty, e.Message, e);
        }
        catch (JsonException e)
        {
            var line = (int)(e.LineNumber ?? 0) + 1;
            var column = (int)(e.BytePositionInLine ?? 0) + 1;
            throw new StructureFileException(sourceName, line, column, string.Empty, "invalid JSON: " + StripPosition(e.Message), e);
        }
        var context = new Context(utf8Json.ToArray(), sourceName);
        return context.ReadDocument(root);
    }

    private static string StripPosition(string message)
    {
        // The reader appends "LineNumber: n | BytePositionInLine: m." which our prefix already says.
        var cut = message.IndexOf(" LineNumber:", StringComparison.Ordinal);
        return (cut >= 0 ? message[..cut] : message).Trim();
    }

    [GeneratedRegex(@"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$", RegexOptions.CultureInvariant)]
    private static partial Regex QuantityPattern();

    private sealed partial class Context(byte[] utf8, string sourceName)
    {
        public StructureDefinition ReadDocument(JsonTreeNode root)
        {
            var obj = ExpectObject(root, "(document)");
            var fields = Fields(obj, "", ["$schema", "name", "description", "cell", "temperature", "carrier", "nonParabolic", "substrate", "stack", "opticalLattice"]);
            var name = ReadString(Required(fields, obj, "", "name"), "name");
            if (name.Trim().Length == 0)
            {
                throw Error(fields["name"].Value, "name", "must not be empty.");
            }
            string? description = fields.TryGetValue("description", out var d) ? ReadString(d.Value, "description") : null;
            if (fields.TryGetValue("$schema", out var s))
            {
                ReadString(s.Value, "$schema");
            }
            if (fields.ContainsKey("opticalLattice"))
            {
                return ReadOpticalLatticeDocument(fields, name, description);
            }
            var cellNode = Required(fields, obj, "", "cell");
            if (cellNode is not JsonTreeArray array)
            {
                throw Error(cellNode, "cell", $"must be an array of layers and deltas; got {cellNode.KindName}.");
            }
            if (array.Items.Count == 0)
            {
                throw Error(array, "cell", "must hold at least one layer; got an empty array.");
            }
            if (array.Items.Count > StructureFileLimits.MaxElements)
            {
                throw Error(array, "cell", string.Create(CultureInfo.InvariantCulture,
                    $"holds {array.Items.Count} elements; at most {StructureFileLimits.MaxElements} are read (every energy evaluation walks them all; see docs/limits.md)."));
            }
            var labels = new string?[array.Items.Count];
            if (array.Items.Exists(item => item is JsonTreeObject o && o.Properties.Exists(p => p.Name == "material")))
            {
                return ReadMaterialsDocument(fields, array, name, description, labels);
            }
            foreach (var key in new[] { "carrier", "nonParabolic", "substrate" })
            {
                if (fields.TryGetValue(key, out var stray))
                {
                    throw ErrorAt(stray.NameOffset, key, "applies only to a cell of material layers ({\"material\": \"GaAs\", \"width\": ...}).");
                }
            }
            var elements = new CellElement[array.Items.Count];
            var doping = new FileDoping?[array.Items.Count];
            var hasWidth = false;
            for (var i = 0; i < elements.Length; i++)
            {
                var path = string.Create(CultureInfo.InvariantCulture, $"cell[{i}]");
                (elements[i], labels[i]) = ReadElement(array.Items[i], path, allowDoping: true);
                doping[i] = ReadDoping((JsonTreeObject)array.Items[i], path, null);
                hasWidth |= elements[i].Width.Nanometres > 0;
            }
            if (!hasWidth)
            {
                throw Error(array, "cell", "must hold at least one layer of positive width (deltas alone have no period).");
            }
            UnitCell cell;
            try
            {
                cell = UnitCell.Create(elements);
            }
            catch (ArgumentException e)
            {
                throw Error(array, "cell", e.Message, e);
            }
            var (stack, bias, stackFile) = ReadStack(fields, cell);
            DopedCell? doped = null;
            DopedStack? dopedStack = null;
            var cellDoped = doping.Any(d => d is not null);
            if (cellDoped || stackFile?.IsDoped == true)
            {
                if (!fields.TryGetValue("temperature", out var t))
                {
                    throw Error(array, "temperature", "is required for a doped cell or stack (it sets the carriers' Fermi–Dirac statistics), e.g. \"temperature\": \"300 K\".");
                }
                var kelvin = ReadQuantity(t.Value, "temperature", TemperatureUnits, "K", "K");
                if (!(kelvin >= DopedCell.MinTemperatureKelvin && kelvin <= DopedCell.MaxTemperatureKelvin))
                {
                    throw Error(t.Value, "temperature", string.Create(CultureInfo.InvariantCulture,
                        $"must be between {DopedCell.MinTemperatureKelvin} K and {DopedCell.MaxTemperatureKelvin} K in a doped structure (the carriers' Fermi–Dirac statistics); got {Format(kelvin)} K."));
                }
                // The cell's layers need their permittivities where the cell is doped or the stack repeats it.
                var entries = cellDoped || stack?.Parts.Any(p => p.IsRepeatedCell) == true ? BuildEntries(cell, doping, array, kelvin, t.Value) : [];
                doped = cellDoped ? Apply(array, "cell", () => DopedCell.Create(cell, entries, Temperature.FromKelvin(kelvin))) : null;
                dopedStack = BuildStackDoping(stack, stackFile, entries, kelvin, holes: false, out _);
            }
            else if (fields.TryGetValue("temperature", out var stray))
            {
                throw ErrorAt(stray.NameOffset, "temperature", "applies only to a cell of material layers or a doped cell (give \"donors\" in a layer).");
            }
            return new StructureDefinition(name, description, cell, labels, sourceName, null, stack, bias) { Doping = doped, StackDoping = dopedStack };
        }

        /// <summary>
        /// The optional finite stack: <c>"stack": {"periods": N, "leads": {...}, "bias": eU}</c> or separate leftLead/rightLead.
        /// A non-zero bias is checked against what a stack under bias allows (parabolic layers and deltas, at most
        /// <see cref="StackTransmission.MaxBiasedElements"/> elements) here, without computing anything, so the error
        /// names the field.
        /// </summary>
        private (LayerStack? Stack, Energy Bias, StackFile? File) ReadStack(Dictionary<string, JsonTreeProperty> fields, UnitCell cell, BuiltStructure? built = null)
        {
            if (!fields.TryGetValue("stack", out var property))
            {
                return (null, default, null);
            }
            var obj = ExpectObject(property.Value, "stack");
            var stackFields = Fields(obj, "stack", ["periods", "parts", "leads", "leftLead", "rightLead", "bias"]);
            List<StackPart>? parts = null;
            FileDoping?[] partDoping = [null];
            var periods = 0.0;
            if (stackFields.TryGetValue("parts", out var partsProperty))
            {
                (parts, partDoping) = ReadStackParts(partsProperty.Value, stackFields, cell, built);
            }
            else
            {
                var periodsNode = Required(stackFields, obj, "stack", "periods", " (or \"parts\")");
                if (periodsNode is not JsonTreeNumber { Value: var p } || p != Math.Floor(p) || p < 1 || p > 1_000_000)
                {
                    throw Error(periodsNode, "stack.periods", "must be a whole number of periods from 1 to 1000000.");
                }
                periods = p;
            }
            if (stackFields.TryGetValue("leads", out var both) && (stackFields.ContainsKey("leftLead") || stackFields.ContainsKey("rightLead")))
            {
                throw ErrorAt(both.NameOffset, "stack.leads", "give either leads (both sides) or leftLead/rightLead, not both.");
            }
            // A lead not given is the cell's first uniform layer; a cell without one (only smooth segments) must give its leads.
            Lead Fallback(string field)
            {
                var first = cell.Elements.OfType<Layer>().FirstOrDefault()
                    ?? throw ErrorAt(property.NameOffset, field, "is required: the cell has no uniform layer to take the lead's potential and mass from (give \"leads\": {\"potential\": ..., \"mass\": ...}).");
                return Lead.Create(first.Potential, first.Mass);
            }
            var (left, leftPermittivity) = both is not null ? ReadLead(both.Value, "stack.leads", built) : stackFields.TryGetValue("leftLead", out var l) ? ReadLead(l.Value, "stack.leftLead", built) : (Fallback("stack.leftLead"), null);
            var (right, rightPermittivity) = both is not null ? (left, leftPermittivity) : stackFields.TryGetValue("rightLead", out var r) ? ReadLead(r.Value, "stack.rightLead", built) : (Fallback("stack.rightLead"), null);
            var stack = parts is not null
                ? Apply(obj, "stack.parts", () => LayerStack.Create(left, parts, right))
                : Apply(obj, "stack", () => LayerStack.Periodic(left, cell, (int)periods, right));
            var bias = Energy.FromElectronVolts(0);
            if (stackFields.TryGetValue("bias", out var b))
            {
                bias = Energy.FromElectronVolts(ReadQuantity(b.Value, "stack.bias", EnergyUnits, "eV", "eV, meV"));
                if (bias.ElectronVolts != 0)
                {
                    Apply(b.Value, "stack.bias", () => { StackTransmission.CheckBias(stack, bias); return stack; });
                }
            }
            // Every part a repeated cell or a material layer and every lead a material (or the cell's first layer): the stack has a valence band.
            static bool OfMaterial(JsonTreeNode node) => node is JsonTreeObject o && o.Properties.Exists(p => p.Name is "material" or "repeat");
            var ofMaterials = built is not null
                && (partsProperty is null || partsProperty.Value is JsonTreeArray { Items: var items } && items.All(OfMaterial))
                && new[] { "leads", "leftLead", "rightLead" }.All(f => !stackFields.TryGetValue(f, out var lead) || OfMaterial(lead.Value));
            return (stack, bias, new StackFile(partDoping, leftPermittivity, rightPermittivity, obj, ofMaterials));
        }

        /// <summary>A lead and, for a lead of a material, that material's static relative permittivity.</summary>
        private (Lead Lead, double? Permittivity) ReadLead(JsonTreeNode node, string path, BuiltStructure? built)
        {
            var obj = ExpectObject(node, path);
            if (obj.Properties.Exists(p => p.Name == "material"))
            {
                return ReadMaterialLead(obj, path, built);
            }
            // A cell of material layers also takes a lead of a material (ReadMaterialLead): the message of a misspelt field lists it.
            var leadFields = Fields(obj, path, built is null ? ["potential", "mass"] : ["material", "potential", "mass"]);
            var potential = ReadQuantity(Required(leadFields, obj, path, "potential"), path + ".potential", EnergyUnits, "eV", "eV, meV");
            var massNode = Required(leadFields, obj, path, "mass");
            var mass = ReadQuantity(massNode, path + ".mass", MassUnits, "m0", "m0");
            if (mass <= 0)
            {
                throw Error(massNode, path + ".mass", $"must be positive; got {Format(mass)} m0.");
            }
            return (Apply(obj, path, () => Lead.Create(Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass))), null);
        }

        /// <summary>
        /// <c>"parts": [...]</c>: the stack as a sequence of single layers or deltas (as in <c>cell</c>; for a cell of material
        /// layers also <c>{"material": ..., "width": ...}</c>) and repeated cells <c>{"repeat": N}</c> (N periods of the file's cell),
        /// for spacers, cap and emitter layers and defects. Not together with <c>periods</c>.
        /// </summary>
        private (List<StackPart> Parts, FileDoping?[] Doping) ReadStackParts(JsonTreeNode node, Dictionary<string, JsonTreeProperty> stackFields, UnitCell cell, BuiltStructure? built)
        {
            if (stackFields.TryGetValue("periods", out var periods))
            {
                throw ErrorAt(periods.NameOffset, "stack.periods", "give either periods or parts, not both (the part {\"repeat\": N} repeats the cell N times).");
            }
            if (node is not JsonTreeArray array || array.Items.Count == 0 || array.Items.Count > MaxStackParts)
            {
                throw Error(node, "stack.parts", string.Create(CultureInfo.InvariantCulture,
                    $"must be an array of 1 to {MaxStackParts} parts: layers, deltas or {{\"repeat\": N}}; got {(node is JsonTreeArray a ? a.Items.Count + " parts" : node.KindName)}."));
            }
            var parts = new List<StackPart>(array.Items.Count);
            var doping = new FileDoping?[array.Items.Count];
            for (var i = 0; i < array.Items.Count; i++)
            {
                var path = string.Create(CultureInfo.InvariantCulture, $"stack.parts[{i}]");
                var obj = ExpectObject(array.Items[i], path);
                if (obj.Properties.Exists(p => p.Name == "repeat"))
                {
                    var f = Fields(obj, path, ["repeat", "label"]);
                    if (f["repeat"].Value is not JsonTreeNumber { Value: var n } || n != Math.Floor(n) || n < 1 || n > 1_000_000)
                    {
                        throw Error(f["repeat"].Value, path + ".repeat", "must be a whole number of periods of the cell from 1 to 1000000.");
                    }
                    parts.Add(StackPart.Repeat(cell, (int)n));
                }
                else if (obj.Properties.Exists(p => p.Name == "material"))
                {
                    if (built is null)
                    {
                        throw Error(obj, path + ".material", "applies only to a cell of material layers; give width, potential and mass instead.");
                    }
                    var f = Fields(obj, path, ["material", "width", "label", .. DopingFields]);
                    var material = ReadMaterial(f["material"].Value, path + ".material");
                    doping[i] = ReadDoping(obj, path, material) ?? new FileDoping(0, 0, 0, material.StaticRelativePermittivity, obj, path, Given: false);
                    var widthNode = Required(f, obj, path, "width");
                    var width = ReadQuantity(widthNode, path + ".width", LengthUnits, "nm", "nm, Å, pm, µm");
                    if (width <= 0)
                    {
                        throw Error(widthNode, path + ".width", $"must be positive; got {Format(width)} nm.");
                    }
                    // The material's layer on the cell's energy reference, as the cell's own material layers are built.
                    parts.Add(Apply(widthNode, path + ".width", () => StackPart.Single(built.LayerOf(material, Length.FromNanometres(width)))));
                }
                else
                {
                    var (element, _) = ReadElement(obj, path, allowDoping: true);
                    doping[i] = ReadDoping(obj, path, null);
                    if (doping[i] is not null && element is not Layer)
                    {
                        throw Error(obj, path, "only a uniform layer of a stack can carry donors, acceptors or a permittivity.");
                    }
                    parts.Add(Apply(obj, path, () => StackPart.Single(element)));
                }
            }
            return (parts, doping);
        }

        /// <summary><c>{"material": "Al0.3Ga0.7As"}</c>: a lead of a material's band edge and band-edge mass, for a cell of material layers.</summary>
        private (Lead Lead, double? Permittivity) ReadMaterialLead(JsonTreeObject obj, string path, BuiltStructure? built)
        {
            var fields = Fields(obj, path, ["material"]);
            if (built is null)
            {
                throw Error(fields["material"].Value, path + ".material", "applies only to a cell of material layers; give potential and mass instead.");
            }
            var material = ReadMaterial(fields["material"].Value, path + ".material");
            // A lead of the material's band edge and band-edge mass (leads are parabolic), as a layer of it would have.
            return (Apply(fields["material"].Value, path + ".material", () =>
            {
                var layer = built.LayerOf(material, Length.FromNanometres(1));
                return Lead.Create(layer.Potential, layer.Mass);
            }), material.StaticRelativePermittivity);
        }

        /// <summary>A cell of material layers, built by <see cref="StructureRecipe"/> (potentials and masses from the material table).</summary>
        private StructureDefinition ReadMaterialsDocument(Dictionary<string, JsonTreeProperty> fields, JsonTreeArray array, string name, string? description, string?[] labels)
        {
            if (!fields.TryGetValue("temperature", out var t))
            {
                throw Error(array, "temperature", "is required for a cell of material layers (e.g. \"temperature\": \"300 K\").");
            }
            var temperature = ReadQuantity(t.Value, "temperature", TemperatureUnits, "K", "K");
            StructureRecipe recipe;
            try
            {
                recipe = StructureRecipe.Create(Temperature.FromKelvin(temperature));
            }
            catch (ArgumentException e)
            {
                throw Error(t.Value, "temperature", Describe(e), e);
            }
            if (fields.TryGetValue("nonParabolic", out var np))
            {
                var on = np.Value is JsonTreeLiteral { Token: JsonTokenType.True or JsonTokenType.False } literal
                    ? literal.Token == JsonTokenType.True
                    : throw Error(np.Value, "nonParabolic", $"must be true or false; got {np.Value.KindName}.");
                recipe = Apply(np.Value, "nonParabolic", () => recipe.WithNonParabolicity(on));
            }
            if (fields.TryGetValue("carrier", out var c))
            {
                var text = ReadString(c.Value, "carrier");
                var carrier = text switch
                {
                    "electron" => Carrier.Electron,
                    "heavyHole" => Carrier.HeavyHole,
                    "lightHole" => Carrier.LightHole,
                    _ => throw Error(c.Value, "carrier", $"must be \"electron\", \"heavyHole\" or \"lightHole\"; got \"{text}\"."),
                };
                recipe = Apply(c.Value, "carrier", () => recipe.WithCarrier(carrier));
            }
            if (fields.TryGetValue("substrate", out var sub))
            {
                var substrate = ReadMaterial(sub.Value, "substrate");
                recipe = recipe.WithSubstrate(substrate);
            }
            var materialDoping = new FileDoping?[array.Items.Count];
            var anyDoping = false;
            for (var i = 0; i < array.Items.Count; i++)
            {
                var path = string.Create(CultureInfo.InvariantCulture, $"cell[{i}]");
                var obj = ExpectObject(array.Items[i], path);
                if (!obj.Properties.Exists(p => p.Name == "material"))
                {
                    throw Error(obj, path + ".material", "is required: a cell that uses materials must give every layer as {\"material\": ..., \"width\": ...} (deltas and explicit layers cannot be mixed in).");
                }
                var layerFields = Fields(obj, path, ["material", "width", "monolayers", "label", .. DopingFields]);
                labels[i] = layerFields.TryGetValue("label", out var l) ? ReadString(l.Value, path + ".label") : null;
                var material = ReadMaterial(layerFields["material"].Value, path + ".material");
                RecipeLayer layer;
                if (layerFields.TryGetValue("monolayers", out var ml))
                {
                    if (layerFields.ContainsKey("width"))
                    {
                        throw ErrorAt(ml.NameOffset, path + ".monolayers", "give either width or monolayers, not both.");
                    }
                    if (ml.Value is not JsonTreeNumber { Value: var count } || count != Math.Floor(count) || count < 1 || count > 100000)
                    {
                        throw Error(ml.Value, path + ".monolayers", "must be a whole number of monolayers from 1 to 100000.");
                    }
                    layer = Apply(ml.Value, path + ".monolayers", () => RecipeLayer.FromMonolayers(material, (int)count));
                }
                else
                {
                    var widthNode = Required(layerFields, obj, path, "width", " (or \"monolayers\")");
                    var width = ReadQuantity(widthNode, path + ".width", LengthUnits, "nm", "nm, Å, pm, µm");
                    if (width <= 0)
                    {
                        throw Error(widthNode, path + ".width", $"must be positive; got {Format(width)} nm.");
                    }
                    layer = Apply(widthNode, path + ".width", () => RecipeLayer.Create(material, Length.FromNanometres(width)));
                }
                recipe = recipe.Add(layer);
                materialDoping[i] = ReadDoping(obj, path, material);
                anyDoping |= materialDoping[i] is not null;
                materialDoping[i] ??= new FileDoping(0, 0, 0, material.StaticRelativePermittivity, obj, path);
            }
            var built = Apply(array, "cell", recipe.Build);
            var (stack, bias, stackFile) = ReadStack(fields, built.Cell, built);
            DopedCell? doped = null;
            DopedStack? dopedStack = null;
            string? stackRefusal = null;
            if (anyDoping || stackFile?.IsDoped == true)
            {
                var entries = BuildEntries(built.Cell, materialDoping, array, temperature, t.Value);
                // The holes of the valence bands, also where only the stack's own layers are doped (the cell's carrier must then
                // be electrons for them to be added; a file of another carrier keeps its stack rigid in holes, as before).
                var valence = anyDoping || recipe.Carrier == Carrier.Electron ? ValenceBands(recipe, built, fields, materialDoping) : [];
                doped = anyDoping ? Apply(array, "cell", () => DopedCell.Create(built.Cell, entries, Temperature.FromKelvin(temperature), valence)) : null;
                var stackValence = valence.Length > 0 ? StackValenceBands(recipe, built, fields, stackFile) : [];
                dopedStack = BuildStackDoping(stack, stackFile, entries, temperature, valence.Length > 0, out stackRefusal, stackValence);
            }
            return new StructureDefinition(name, description, built.Cell, labels, sourceName, built, stack, bias)
            {
                Doping = doped, StackDoping = dopedStack, StackSpaceChargeRefusal = stackRefusal,
            };
        }

        /// <summary>
        /// The valence bands of a doped cell of material layers whose holes are carriers: heavy holes, and light holes, each where
        /// every layer's material has that mass (single parabolic bands; the hole cell of the same recipe, its zero at the highest
        /// valence-band edge). A doped cell must be described for electrons; acceptors need at least one valence band.
        /// </summary>
        private ValenceBand[] ValenceBands(StructureRecipe recipe, BuiltStructure built, Dictionary<string, JsonTreeProperty> fields, FileDoping?[] doping)
        {
            if (recipe.Carrier != Carrier.Electron)
            {
                throw Error(fields["carrier"].Value, "carrier",
                    "must be \"electron\" (the default) in a doped cell: the space-charge model takes the conduction band as the cell and adds the holes of the valence band itself.");
            }
            var bands = new List<ValenceBand>();
            foreach (var (carrier, name) in new[] { (Carrier.HeavyHole, "heavy holes"), (Carrier.LightHole, "light holes") })
            {
                if (recipe.Layers.All(l => (carrier == Carrier.HeavyHole ? l.Material.HeavyHoleMass : l.Material.LightHoleMass) is not null))
                {
                    var holes = recipe.WithNonParabolicity(false).WithCarrier(carrier).Build();
                    bands.Add(ValenceBand.Create(holes.Cell, Energy.FromElectronVolts(holes.ReferenceElectronVolts - built.ReferenceElectronVolts), name));
                }
            }
            if (bands.Count == 0 && Array.Find(doping, d => d is not null && (d.Acceptors > 0 || d.AcceptorIonisation is not null)) is { } acceptor)
            {
                var material = recipe.Layers.First(l => l.Material.HeavyHoleMass is null).Material;
                throw Error(acceptor.Node, acceptor.Path + ".acceptors",
                    $"needs the holes of a valence band, but material {material.Name} has no heavy-hole mass (nor does every material have a light-hole mass): give the material one, or no acceptors.");
            }
            return [.. bands];
        }

        /// <summary>
        /// The valence bands of a stack of material layers and material leads whose holes are carriers: heavy holes and light
        /// holes, each where every material of the cell, the stack's layers and its leads has that mass (the hole stack read from
        /// the same fields with the structure built for that band). Empty without a stack or for a stack with a layer or lead given
        /// by potential and mass (no valence band to take from it).
        /// </summary>
        private StackValenceBand[] StackValenceBands(StructureRecipe recipe, BuiltStructure built, Dictionary<string, JsonTreeProperty> fields, StackFile? file)
        {
            if (file is not { OfMaterials: true })
            {
                return [];
            }
            var bands = new List<StackValenceBand>();
            foreach (var (carrier, name) in new[] { (Carrier.HeavyHole, "heavy holes"), (Carrier.LightHole, "light holes") })
            {
                if (!recipe.Layers.All(l => (carrier == Carrier.HeavyHole ? l.Material.HeavyHoleMass : l.Material.LightHoleMass) is not null))
                {
                    continue;
                }
                var holes = recipe.WithNonParabolicity(false).WithCarrier(carrier).Build();
                try
                {
                    var (holeStack, _, _) = ReadStack(fields, holes.Cell, holes);
                    bands.Add(StackValenceBand.Create(holeStack!, Energy.FromElectronVolts(holes.ReferenceElectronVolts - built.ReferenceElectronVolts), name));
                }
                catch (StructureFileException)
                {
                    // A material of the stack's layers or leads has no mass for this band: the stack's holes leave it out.
                }
            }
            return [.. bands];
        }

        private Material ReadMaterial(JsonTreeNode node, string path)
        {
            var text = ReadString(node, path);
            return Apply(node, path, () => StructureRecipe.ParseMaterial(text));
        }

        private T Apply<T>(JsonTreeNode node, string path, Func<T> action)
        {
            try
            {
                return action();
            }
            catch (ArgumentException e)
            {
                throw Error(node, path, Describe(e), e);
            }
        }

        private static string Describe(ArgumentException e)
        {
            var cut = e.Message.IndexOf(" (Parameter '", StringComparison.Ordinal);
            return cut >= 0 ? e.Message[..cut] : e.Message;
        }

        private (CellElement Element, string? Label) ReadElement(JsonTreeNode node, string path, bool allowDoping = false)
        {
            var obj = ExpectObject(node, path);
            if (obj.Properties.Exists(p => p.Name == "fourier"))
            {
                var f = Fields(obj, path, ["fourier", "label"]);
                return (ReadFourier(f["fourier"].Value, path + ".fourier"), f.TryGetValue("label", out var fl) ? ReadString(fl.Value, path + ".label") : null);
            }
            if (obj.Properties.Exists(p => p.Name == "profile"))
            {
                var f = Fields(obj, path, ["profile", "label"]);
                return (ReadProfile(f["profile"].Value, path + ".profile"), f.TryGetValue("label", out var pl) ? ReadString(pl.Value, path + ".label") : null);
            }
            var isDelta = obj.Properties.Exists(p => p.Name == "delta");
            var fields = isDelta
                ? Fields(obj, path, ["delta", "label"])
                : Fields(obj, path, allowDoping ? ["width", "potential", "mass", "nonParabolicity", "label", .. DopingFields] : ["width", "potential", "mass", "nonParabolicity", "label"]);
            var label = fields.TryGetValue("label", out var l) ? ReadString(l.Value, path + ".label") : null;
            if (isDelta)
            {
                var strength = ReadQuantity(fields["delta"].Value, path + ".delta", StrengthUnits, "eV nm", StrengthUnitsText);
                return (DeltaBarrier.Create(strength), label);
            }
            var widthNode = Required(fields, obj, path, "width", " (or \"delta\" for a delta barrier)");
            var width = ReadQuantity(widthNode, path + ".width", LengthUnits, "nm", "nm, Å, pm, µm");
            if (width <= 0)
            {
                throw Error(widthNode, path + ".width", $"must be positive; got {Format(width)} nm.");
            }
            var potential = ReadQuantity(Required(fields, obj, path, "potential"), path + ".potential", EnergyUnits, "eV", "eV, meV");
            var massNode = Required(fields, obj, path, "mass");
            var mass = ReadQuantity(massNode, path + ".mass", MassUnits, "m0", "m0");
            if (mass <= 0)
            {
                throw Error(massNode, path + ".mass", $"must be positive; got {Format(mass)} m0.");
            }
            var alpha = 0.0;
            if (fields.TryGetValue("nonParabolicity", out var a))
            {
                alpha = ReadQuantity(a.Value, path + ".nonParabolicity", InverseEnergyUnits, "/eV", "/eV, /meV");
                if (alpha < 0)
                {
                    throw Error(a.Value, path + ".nonParabolicity", $"must be zero or positive; got {Format(alpha)} /eV.");
                }
            }
            try
            {
                return (Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass), alpha), label);
            }
            catch (ArgumentException e)
            {
                throw Error(obj, path, e.Message, e);
            }
        }

        /// <summary>The doping fields of one layer as read (volume densities cm⁻³, sheet cm⁻², permittivity), with where they stand.</summary>
        private sealed record FileDoping(double Donors, double Acceptors, double Sheet, double? Permittivity, JsonTreeNode Node, string Path, double? Ionisation = null,
            bool Given = true, double? AcceptorIonisation = null)
        {
            /// <summary>The layer's <see cref="LayerDoping"/> with permittivity <paramref name="permittivity"/> and its dopant levels.</summary>
            public LayerDoping ToLayerDoping(double permittivity)
            {
                var layerDoping = LayerDoping.Create(Donors, Acceptors, permittivity, Sheet);
                layerDoping = Ionisation is { } e ? layerDoping.WithDonorIonisationEnergy(Energy.FromElectronVolts(e)) : layerDoping;
                return AcceptorIonisation is { } a ? layerDoping.WithAcceptorIonisationEnergy(Energy.FromElectronVolts(a)) : layerDoping;
            }
        }

        /// <summary>
        /// <c>"donors"</c>, <c>"acceptors"</c> (cm⁻³), <c>"sheetDonors"</c> (cm⁻², a donor sheet at the layer's middle) and
        /// <c>"permittivity"</c> (relative) of one layer, and the dopants' levels; null when the layer gives none of them. A material
        /// supplies the permittivity when the layer does not. Acceptors need the valence band that only a material supplies.
        /// </summary>
        private FileDoping? ReadDoping(JsonTreeObject obj, string path, Material? material)
        {
            var present = obj.Properties.Where(p => Array.IndexOf(DopingFields, p.Name) >= 0).ToDictionary(p => p.Name, StringComparer.Ordinal);
            if (present.Count == 0)
            {
                return null;
            }
            if (material is null)
            {
                foreach (var field in new[] { "acceptors", "acceptorIonisationEnergy" })
                {
                    if (present.TryGetValue(field, out var stray))
                    {
                        throw ErrorAt(stray.NameOffset, path + "." + field,
                            "applies only to a layer of a material ({\"material\": \"GaAs\", ...}): acceptors make holes, and a layer given by potential and mass describes the conduction band alone, without the valence band the holes live in.");
                    }
                }
            }
            double Density(string name, Dictionary<string, double> units, string unit, string allowed, double max)
            {
                if (!present.TryGetValue(name, out var property))
                {
                    return 0;
                }
                var value = ReadRawQuantity(property.Value, path + "." + name, units, unit, allowed);
                if (!(value >= 0 && value <= max))
                {
                    throw Error(property.Value, path + "." + name, $"must be between 0 and {Format(max)} {unit}; got {Format(value)} {unit}. See docs/limits.md.");
                }
                return value;
            }
            var donors = Density("donors", VolumeDensityUnits, "cm^-3", "cm^-3, m^-3, nm^-3", StructureFileLimits.MaxDopingPerCubicCentimetre);
            var acceptors = Density("acceptors", VolumeDensityUnits, "cm^-3", "cm^-3, m^-3, nm^-3", StructureFileLimits.MaxDopingPerCubicCentimetre);
            var sheet = Density("sheetDonors", SheetDensityUnits, "cm^-2", "cm^-2, m^-2, nm^-2", StructureFileLimits.MaxSheetDopingPerSquareCentimetre);
            double? permittivity = material?.StaticRelativePermittivity;
            if (present.TryGetValue("permittivity", out var eps))
            {
                var value = ReadRawQuantity(eps.Value, path + ".permittivity", NoUnits, "", "a bare number: it is relative, without unit");
                if (!(value >= StructureFileLimits.MinRelativePermittivity && value <= StructureFileLimits.MaxRelativePermittivity))
                {
                    throw Error(eps.Value, path + ".permittivity", $"must be a relative permittivity between {Format(StructureFileLimits.MinRelativePermittivity)} and {Format(StructureFileLimits.MaxRelativePermittivity)}; got {Format(value)}. See docs/limits.md.");
                }
                permittivity = value;
            }
            double? Level(string name, double max, string where)
            {
                if (!present.TryGetValue(name, out var level))
                {
                    return null;
                }
                var value = ReadRawQuantity(level.Value, path + "." + name, EnergyUnits, "eV", "eV, meV");
                if (!(value >= 0 && value <= max))
                {
                    throw Error(level.Value, path + "." + name, $"must be between 0 and {Format(max)} eV ({where}); got {Format(value)} eV. See docs/limits.md.");
                }
                return value;
            }
            var ionisation = Level("donorIonisationEnergy", LayerDoping.MaxDonorIonisationEnergyElectronVolts, "the donor level below the band edge");
            var acceptorIonisation = Level("acceptorIonisationEnergy", LayerDoping.MaxAcceptorIonisationEnergyElectronVolts, "the acceptor level above the valence-band edge");
            return new FileDoping(donors, acceptors, sheet, permittivity, obj, path, ionisation, AcceptorIonisation: acceptorIonisation);
        }

        /// <summary>The doping of each cell element of a file with doping: every layer needs a permittivity (its own or its material's).</summary>
        private LayerDoping[] BuildEntries(UnitCell cell, FileDoping?[] doping, JsonTreeArray array, double temperatureKelvin, JsonTreeNode temperatureNode)
        {
            var entries = new LayerDoping[doping.Length];
            for (var i = 0; i < doping.Length; i++)
            {
                if (cell.Elements[i] is not Layer)
                {
                    entries[i] = LayerDoping.Undoped(1); // a delta barrier: no width, no charge, no permittivity
                    continue;
                }
                var d = doping[i];
                var permittivity = d?.Permittivity;
                if (permittivity is null)
                {
                    throw Error(d?.Node ?? array.Items[i], string.Create(CultureInfo.InvariantCulture, $"cell[{i}].permittivity"),
                        "is required in every layer of a doped cell whose material does not supply it (a relative permittivity, e.g. 12.9).");
                }
                var entry = d!;
                entries[i] = Apply(entry.Node, entry.Path, () => entry.ToLayerDoping(permittivity.Value));
            }
            Apply(temperatureNode, "temperature", () => Preconditions.CheckRange(temperatureKelvin, DopedCell.MinTemperatureKelvin, DopedCell.MaxTemperatureKelvin, "temperature"));
            return entries;
        }

        /// <summary>
        /// The doped stack of a file with doping and a stack: repeated cells carry the cell's doping, single layers their own
        /// (each needs a permittivity, its own or its material's), deltas none; a lead of a material has that material's
        /// permittivity, a lead given by potential and mass the permittivity of the stack's layer beside it. Null without a stack.
        /// </summary>
        /// <remarks>
        /// With <paramref name="holes"/> (a cell of material layers), a stack the finite-stack model cannot take because its holes
        /// would matter (no more donors than acceptors, or an acceptor level) is not an error of the file: the cell's commands work,
        /// and <paramref name="refusal"/> says why the stack's space charge is not solved. With <paramref name="valence"/> (a stack of
        /// material layers and leads), the stack's holes are carriers and such a stack is solved.
        /// </remarks>
        private DopedStack? BuildStackDoping(LayerStack? stack, StackFile? file, LayerDoping[] cellEntries, double temperatureKelvin, bool holes, out string? refusal,
            StackValenceBand[]? valence = null)
        {
            refusal = null;
            if (stack is null || file is null)
            {
                return null;
            }
            var parts = stack.Parts;
            var doping = new IReadOnlyList<LayerDoping>[parts.Count];
            for (var p = 0; p < parts.Count; p++)
            {
                if (parts[p].IsRepeatedCell)
                {
                    doping[p] = cellEntries;
                    continue;
                }
                if (parts[p].Element is not Layer)
                {
                    doping[p] = [LayerDoping.Undoped(1)]; // a delta barrier: no width, no charge
                    continue;
                }
                var path = string.Create(CultureInfo.InvariantCulture, $"stack.parts[{p}]");
                var entry = file.Parts[p];
                if (entry?.Permittivity is not { } permittivity)
                {
                    throw Error(entry?.Node ?? file.Node, path + ".permittivity",
                        "is required in every single layer of a doped structure's stack whose material does not supply it (a relative permittivity, e.g. 12.9).");
                }
                doping[p] = [Apply(entry.Node, entry.Path, () => entry.ToLayerDoping(permittivity))];
            }
            // The permittivity of the first (last) layer of the stack written out, for a lead that gives none.
            double? Beside(bool first)
            {
                var order = first ? Enumerable.Range(0, parts.Count) : Enumerable.Range(0, parts.Count).Reverse();
                foreach (var p in order)
                {
                    var elements = parts[p].Cell is { } cell ? cell.Elements : [parts[p].Element!];
                    var indices = first ? Enumerable.Range(0, elements.Count) : Enumerable.Range(0, elements.Count).Reverse();
                    foreach (var i in indices)
                    {
                        if (elements[i] is Layer)
                        {
                            return doping[p][i].RelativePermittivity;
                        }
                    }
                }
                return null;
            }
            // A stack without dopants (e.g. single undoped layers only) is exactly its rigid self: nothing to solve.
            var hasDopants = false;
            for (var p = 0; p < parts.Count; p++)
            {
                hasDopants |= doping[p].Any(d => d.IsDoped);
            }
            if (!hasDopants)
            {
                return null;
            }
            var left = file.LeftPermittivity ?? Beside(first: true) ?? 1;
            var right = file.RightPermittivity ?? Beside(first: false) ?? 1;
            try
            {
                return DopedStack.Create(stack, doping, Temperature.FromKelvin(temperatureKelvin), left, right, valence ?? []);
            }
            catch (ArgumentException e) when (holes && e.ParamName == "partDoping")
            {
                refusal = $"the space charge of the finite stack of {sourceName} is not solved: {Describe(e).TrimEnd('.')}; holes of a finite stack are modelled where every layer and lead is of a material with a hole mass; add --no-space-charge for the rigid stack.";
                return null;
            }
            catch (ArgumentException e)
            {
                throw Error(file.Node, "stack", Describe(e), e);
            }
        }

        /// <summary>What a file's stack says about doping: each single layer's doping fields (null for a repeated cell or none given) and the leads' permittivities where a material supplies them.</summary>
        private sealed record StackFile(FileDoping?[] Parts, double? LeftPermittivity, double? RightPermittivity, JsonTreeNode Node, bool OfMaterials = false)
        {
            /// <summary>True when a single layer of the stack gives doping fields.</summary>
            public bool IsDoped => Parts.Any(p => p is { Given: true });
        }

        /// <summary><c>{"period": L, "constant": V0, "cosine": [a1, …], "sine": [b1, …], "mass": m}</c>: V0 + Σ a_n cos(2πnx/d) + b_n sin(2πnx/d).</summary>
        private FourierSegment ReadFourier(JsonTreeNode node, string path)
        {
            var obj = ExpectObject(node, path);
            var fields = Fields(obj, path, ["period", "constant", "cosine", "sine", "mass"]);
            var periodNode = Required(fields, obj, path, "period");
            var period = ReadQuantity(periodNode, path + ".period", LengthUnits, "nm", "nm, Å, pm, µm");
            if (period <= 0)
            {
                throw Error(periodNode, path + ".period", $"must be positive; got {Format(period)} nm.");
            }
            var constant = fields.TryGetValue("constant", out var c) ? ReadQuantity(c.Value, path + ".constant", EnergyUnits, "eV", "eV, meV") : 0.0;
            var cosine = fields.TryGetValue("cosine", out var co) ? ReadQuantities(co.Value, path + ".cosine", EnergyUnits, "eV", "eV, meV", StructureFileLimits.MaxHarmonics, "harmonics (each costs 32 Magnus steps in every energy evaluation)") : [];
            var sine = fields.TryGetValue("sine", out var si) ? ReadQuantities(si.Value, path + ".sine", EnergyUnits, "eV", "eV, meV", StructureFileLimits.MaxHarmonics, "harmonics (each costs 32 Magnus steps in every energy evaluation)") : [];
            var mass = ReadMass(fields, obj, path);
            return Apply(obj, path, () => FourierSegment.Create(Length.FromNanometres(period), Energy.FromElectronVolts(constant), cosine, sine, EffectiveMass.FromElectronMasses(mass)));
        }

        /// <summary><c>{"positions": [x0, …], "potentials": [V0, …], "mass": m | "masses": [m0, …]}</c>: piecewise-linear samples.</summary>
        private SampledSegment ReadProfile(JsonTreeNode node, string path)
        {
            var obj = ExpectObject(node, path);
            var fields = Fields(obj, path, ["positions", "potentials", "mass", "masses"]);
            const string why = "samples (each is a Magnus step in every energy evaluation, doubled by refinement)";
            var positions = ReadQuantities(Required(fields, obj, path, "positions"), path + ".positions", LengthUnits, "nm", "nm, Å, pm, µm", StructureFileLimits.MaxSamples, why);
            var potentials = ReadQuantities(Required(fields, obj, path, "potentials"), path + ".potentials", EnergyUnits, "eV", "eV, meV", StructureFileLimits.MaxSamples, why);
            // Only the spacing matters inside a cell: positions are taken from the first sample, so the
            // segment's coordinate runs from 0 to its width like every other element's.
            if (positions.Length > 0)
            {
                var origin = positions[0];
                for (var i = 0; i < positions.Length; i++)
                {
                    positions[i] -= origin;
                }
            }
            if (fields.TryGetValue("masses", out var ms))
            {
                if (fields.ContainsKey("mass"))
                {
                    throw ErrorAt(ms.NameOffset, path + ".masses", "give either mass or masses, not both.");
                }
                var masses = ReadQuantities(ms.Value, path + ".masses", MassUnits, "m0", "m0", StructureFileLimits.MaxSamples, why);
                return Apply(obj, path, () => SampledSegment.Create(positions, potentials, masses));
            }
            var mass = ReadMass(fields, obj, path);
            return Apply(obj, path, () => SampledSegment.Create(positions, potentials, EffectiveMass.FromElectronMasses(mass)));
        }

        private double ReadMass(Dictionary<string, JsonTreeProperty> fields, JsonTreeObject obj, string path)
        {
            var massNode = Required(fields, obj, path, "mass");
            var mass = ReadQuantity(massNode, path + ".mass", MassUnits, "m0", "m0");
            if (mass <= 0)
            {
                throw Error(massNode, path + ".mass", $"must be positive; got {Format(mass)} m0.");
            }
            return mass;
        }

        private double[] ReadQuantities(JsonTreeNode node, string path, Dictionary<string, double> units, string defaultUnit, string allowed, int maxCount, string what)
        {
            if (node is not JsonTreeArray array)
            {
                throw Error(node, path, $"must be an array of values ({defaultUnit}, or strings with units {allowed}); got {node.KindName}.");
            }
            if (array.Items.Count > maxCount)
            {
                throw Error(node, path, string.Create(CultureInfo.InvariantCulture,
                    $"holds {array.Items.Count} values; at most {maxCount} {what} are read (see docs/limits.md)."));
            }
            var values = new double[array.Items.Count];
            for (var i = 0; i < values.Length; i++)
            {
                values[i] = ReadQuantity(array.Items[i], string.Create(CultureInfo.InvariantCulture, $"{path}[{i}]"), units, defaultUnit, allowed);
            }
            return values;
        }

        private const string StrengthUnitsText = "eV nm, meV nm, eV Å";

        private double ReadQuantity(JsonTreeNode node, string path, Dictionary<string, double> units, string defaultUnit, string allowed)
        {
            var value = ReadRawQuantity(node, path, units, defaultUnit, allowed);
            CheckPhysical(node, path, units, value);
            return value;
        }

        /// <summary>
        /// The physical range of each kind of quantity (<see cref="StructureFileLimits"/>): a value outside it describes no
        /// material or atom the single-band model applies to, and would only fail later, deep in a calculation. Signs are
        /// left to the callers' own checks (a mass or width of zero or less keeps its "must be positive" message).
        /// </summary>
        private void CheckPhysical(JsonTreeNode node, string path, Dictionary<string, double> units, double value)
        {
            var magnitude = Math.Abs(value);
            string? problem = null;
            if (units == MassUnits && value > 0 && (value < StructureFileLimits.MinMassElectronMasses || value > StructureFileLimits.MaxMassElectronMasses))
            {
                problem = $"must be between {Format(StructureFileLimits.MinMassElectronMasses)} and {Format(StructureFileLimits.MaxMassElectronMasses)} m0 (from below the lightest semiconductor carriers to above the heaviest atoms in optical lattices); got {Format(value)} m0.";
            }
            else if (units == LengthUnits && (magnitude > StructureFileLimits.MaxWidthNanometres || (value > 0 && value < StructureFileLimits.MinWidthNanometres && !path.Contains(".positions[", StringComparison.Ordinal))))
            {
                problem = $"must be between {Format(StructureFileLimits.MinWidthNanometres)} and {Format(StructureFileLimits.MaxWidthNanometres)} nm in size (far below a monolayer to 1 mm); got {Format(value)} nm.";
            }
            else if (units == EnergyUnits && magnitude > StructureFileLimits.MaxPotentialElectronVolts)
            {
                problem = $"must be between -{Format(StructureFileLimits.MaxPotentialElectronVolts)} and {Format(StructureFileLimits.MaxPotentialElectronVolts)} eV (band offsets and lattice depths are a few eV at most); got {Format(value)} eV.";
            }
            else if (units == StrengthUnits && magnitude > StructureFileLimits.MaxDeltaStrengthElectronVoltNanometres)
            {
                problem = $"must be between -{Format(StructureFileLimits.MaxDeltaStrengthElectronVoltNanometres)} and {Format(StructureFileLimits.MaxDeltaStrengthElectronVoltNanometres)} eV nm; got {Format(value)} eV nm.";
            }
            else if (units == InverseEnergyUnits && value > StructureFileLimits.MaxNonParabolicityPerElectronVolt)
            {
                problem = $"must be at most {Format(StructureFileLimits.MaxNonParabolicityPerElectronVolt)} /eV (semiconductors have a few /eV); got {Format(value)} /eV.";
            }
            if (problem is not null)
            {
                throw Error(node, path, problem + " See docs/limits.md.");
            }
        }

        private double ReadRawQuantity(JsonTreeNode node, string path, Dictionary<string, double> units, string defaultUnit, string allowed)
        {
            switch (node)
            {
                case JsonTreeNumber number:
                    if (!double.IsFinite(number.Value))
                    {
                        throw Error(node, path, $"must be a finite number; got {number.Text ?? Format(number.Value)}.");
                    }
                    return number.Value;
                case JsonTreeString text:
                    var match = QuantityPattern().Match(text.Value);
                    if (!match.Success)
                    {
                        throw Error(node, path, $"must be a number or a string \"<number> <unit>\" (units: {allowed}); got \"{text.Value}\".");
                    }
                    var value = double.Parse(match.Groups[1].Value, NumberStyles.Float, CultureInfo.InvariantCulture);
                    var unit = match.Groups[2].Value;
                    if (unit.Length == 0)
                    {
                        throw Error(node, path, defaultUnit.Length == 0
                            ? $"has no unit: write {match.Groups[1].Value} as a bare number, not as a string."
                            : $"a value given as a string needs a unit ({allowed}); write {match.Groups[1].Value} as a bare number for {defaultUnit}.");
                    }
                    var key = units == StrengthUnits ? unit.Replace(" ", "").Replace("·", "").Replace("⋅", "").Replace("*", "") : unit;
                    if (!units.TryGetValue(key, out var factor))
                    {
                        throw Error(node, path, $"unknown unit \"{unit}\"; allowed: {allowed}.");
                    }
                    var result = value * factor;
                    if (!double.IsFinite(result))
                    {
                        throw Error(node, path, $"must be finite; got \"{text.Value}\".");
                    }
                    return result;
                default:
                    throw Error(node, path, $"must be a number ({defaultUnit}) or a string with a unit ({allowed}); got {node.KindName}.");
            }
        }

        private string ReadString(JsonTreeNode node, string path) =>
            node is JsonTreeString s ? s.Value : throw Error(node, path, $"must be a string; got {node.KindName}.");

        private JsonTreeObject ExpectObject(JsonTreeNode node, string path) =>
            node as JsonTreeObject ?? throw Error(node, path, $"must be an object; got {node.KindName}.");

        private Dictionary<string, JsonTreeProperty> Fields(JsonTreeObject obj, string path, string[] allowed)
        {
            var fields = new Dictionary<string, JsonTreeProperty>(StringComparer.Ordinal);
            foreach (var property in obj.Properties)
            {
                var where = path.Length == 0 ? property.Name : path + "." + property.Name;
                if (Array.IndexOf(allowed, property.Name) < 0)
                {
                    throw ErrorAt(property.NameOffset, where, $"unknown field; allowed here: {string.Join(", ", allowed)}.");
                }
                if (!fields.TryAdd(property.Name, property))
                {
                    throw ErrorAt(property.NameOffset, where, "appears twice.");
                }
            }
            return fields;
        }

        private JsonTreeNode Required(Dictionary<string, JsonTreeProperty> fields, JsonTreeObject obj, string path, string name, string hint = "")
        {
            if (fields.TryGetValue(name, out var property))
            {
                return property.Value;
            }
            var where = path.Length == 0 ? name : path + "." + name;
            throw Error(obj, where, $"is required{hint} but missing.");
        }

        private StructureFileException Error(JsonTreeNode node, string field, string problem, Exception? inner = null) =>
            ErrorAt(node.Offset, field, problem, inner);

        private StructureFileException ErrorAt(long offset, string field, string problem, Exception? inner = null)
        {
            var (line, column) = JsonTreeReader.Position(utf8, offset);
            return new StructureFileException(sourceName, line, column, field, problem, inner);
        }
    }

    private static string Format(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
