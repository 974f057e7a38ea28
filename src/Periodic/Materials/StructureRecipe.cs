// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;
using Periodic.Units;

namespace Periodic.Materials;

/// <summary>
/// A heterostructure described the way a device engineer says it — materials, thicknesses, repetitions,
/// temperature — from which <see cref="Build"/> makes the engine's <see cref="Structures.UnitCell"/>.
/// Immutable: every <c>Add…</c> and <c>With…</c> returns a new recipe.
/// </summary>
/// <remarks>
/// The recipe describes one period of a periodic structure (a superlattice). <see cref="Periods"/> is
/// recorded for building a finite stack of that many periods.
/// </remarks>
public sealed class StructureRecipe
{
    private static readonly Regex LayerPattern = new(
        @"^\s*(?<width>[0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?)\s*(?<unit>nm|A|Å|ML)\s+(?<material>\S+)\s*$",
        RegexOptions.CultureInvariant, TimeSpan.FromSeconds(1));

    private static readonly Regex AlloyPattern = new(
        @"^(?<a>Al|In|Ga)(?<x>[0-9]*\.?[0-9]+)(?<b>Ga|Al)(?<y>[0-9]*\.?[0-9]+)?As$",
        RegexOptions.CultureInvariant | RegexOptions.IgnoreCase, TimeSpan.FromSeconds(1));

    private static readonly Regex TemperaturePattern = new(
        @"\s+at\s+(?<t>[0-9]*\.?[0-9]+)\s*K\s*$", RegexOptions.CultureInvariant, TimeSpan.FromSeconds(1));

    private readonly RecipeLayer[] _layers;

    private StructureRecipe(RecipeLayer[] layers, double temperature, Carrier carrier, bool nonParabolic, Material? substrate, int periods, ModelLimits limits)
    {
        _layers = layers;
        Layers = new ReadOnlyCollection<RecipeLayer>(layers);
        Temperature = Temperature.FromKelvin(temperature);
        Carrier = carrier;
        IsNonParabolic = nonParabolic;
        Substrate = substrate;
        Periods = periods;
        Limits = limits;
    }

    /// <summary>The layers of one period in growth order, repetitions expanded.</summary>
    public IReadOnlyList<RecipeLayer> Layers { get; }

    /// <summary>Lattice temperature (sets every gap by the Varshni law).</summary>
    public Temperature Temperature { get; }

    /// <summary>The carrier described (electrons by default; holes in a single-band approximation).</summary>
    public Carrier Carrier { get; }

    /// <summary>Whether the electron mass is the two-band Kane form m(E) = m_edge(1 + (E − E_c)/Eg) (false: parabolic, the default).</summary>
    public bool IsNonParabolic { get; }

    /// <summary>The substrate for the lattice-mismatch check; null means the material of the first layer.</summary>
    public Material? Substrate { get; }

    /// <summary>Number of periods of a finite stack built from this recipe (1 by default; the unit cell is always one period).</summary>
    public int Periods { get; }

    /// <summary>Thresholds for the validity warnings.</summary>
    public ModelLimits Limits { get; }

    /// <summary>An empty recipe at temperature T (0–1000 K): electrons, parabolic mass, default limits.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="temperature"/> is above 1000 K.</exception>
    public static StructureRecipe Create(Temperature temperature) => Create(temperature.Kelvin, nameof(temperature));

    private static StructureRecipe Create(double temperatureKelvin, string paramName)
    {
        Material.CheckTemperature(temperatureKelvin, paramName);
        return new StructureRecipe([], temperatureKelvin, Carrier.Electron, false, null, 1, ModelLimits.Default);
    }

    /// <summary>
    /// Reads a recipe written as layers separated by '/', each "thickness unit material", optionally
    /// followed by "at T K": for example <c>"5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K"</c>. Units: nm, A (Å), ML
    /// (monolayers of that material). Materials: the built-in binaries and AlxGa1-xAs, InxGa1-xAs,
    /// InxAl1-xAs (the second fraction may be omitted; if given it must equal 1 − x).
    /// </summary>
    /// <param name="text">The recipe text.</param>
    /// <param name="temperature">Temperature when the text has no "at T K"; must not be given when it has.</param>
    /// <exception cref="ArgumentException">The text cannot be read (the message quotes the part that failed), or the temperature is missing or given twice.</exception>
    public static StructureRecipe Parse(string text, Temperature? temperature = null)
    {
        ArgumentNullException.ThrowIfNull(text);
        var body = text;
        var match = TemperaturePattern.Match(text);
        double kelvin;
        if (match.Success)
        {
            if (temperature is { } given)
            {
                throw new ArgumentException(
                    $"temperature was given ({Preconditions.Format(given.Kelvin)} K) but text \"{text}\" also sets a temperature; give it once.",
                    nameof(temperature));
            }
            kelvin = double.Parse(match.Groups["t"].Value, CultureInfo.InvariantCulture);
            body = text[..match.Index];
        }
        else
        {
            kelvin = temperature?.Kelvin ?? throw new ArgumentException(
                $"text \"{text}\" has no temperature (\"at 77 K\") and temperature was not given.", nameof(text));
        }
        var recipe = Create(kelvin, nameof(temperature));
        var parts = body.Split('/');
        foreach (var part in parts)
        {
            var layer = LayerPattern.Match(part);
            if (!layer.Success)
            {
                throw new ArgumentException(
                    $"text: cannot read layer \"{part.Trim()}\"; write each layer as \"thickness unit material\" with unit nm, A or ML, e.g. \"5 nm GaAs\".",
                    nameof(text));
            }
            var material = ParseMaterial(layer.Groups["material"].Value);
            var value = double.Parse(layer.Groups["width"].Value, CultureInfo.InvariantCulture);
            if (!(value > 0) || !double.IsFinite(value))
            {
                throw new ArgumentException($"text: layer \"{part.Trim()}\" must have a positive thickness.", nameof(text));
            }
            var nanometres = layer.Groups["unit"].Value switch
            {
                "nm" => value,
                "ML" => value * material.MonolayerNanometres,
                _ => value * 0.1,
            };
            recipe = recipe.Add(material, Length.FromNanometres(nanometres));
        }
        return recipe;
    }

    /// <summary>
    /// A material by name: a built-in binary ("GaAs") or a ternary with composition ("Al0.3Ga0.7As",
    /// "In0.53GaAs", "In0.52Al0.48As").
    /// </summary>
    /// <exception cref="ArgumentException">The name is not a known binary or ternary.</exception>
    public static Material ParseMaterial(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        foreach (var binary in Material.Binaries)
        {
            if (string.Equals(binary.Name, name, StringComparison.OrdinalIgnoreCase))
            {
                return binary;
            }
        }
        var match = AlloyPattern.Match(name);
        if (match.Success)
        {
            var a = match.Groups["a"].Value.ToUpperInvariant();
            var b = match.Groups["b"].Value.ToUpperInvariant();
            var alloy = (a, b) switch
            {
                ("AL", "GA") => TernaryAlloy.AlGaAs,
                ("IN", "GA") => TernaryAlloy.InGaAs,
                ("IN", "AL") => TernaryAlloy.InAlAs,
                _ => null,
            };
            var x = double.Parse(match.Groups["x"].Value, CultureInfo.InvariantCulture);
            if (alloy is not null && x >= 0 && x <= 1)
            {
                if (match.Groups["y"].Success)
                {
                    var y = double.Parse(match.Groups["y"].Value, CultureInfo.InvariantCulture);
                    if (Math.Abs(x + y - 1) > 1e-9)
                    {
                        throw new ArgumentException(
                            $"name \"{name}\": the fractions {Preconditions.Format(x)} and {Preconditions.Format(y)} must add up to 1.", nameof(name));
                    }
                }
                return alloy.At(x);
            }
        }
        throw new ArgumentException(
            $"name \"{name}\" is not a known material; use GaAs, AlAs, InAs, InP, GaSb, AlSb or AlxGa1-xAs, InxGa1-xAs, InxAl1-xAs with 0 <= x <= 1 (e.g. Al0.3Ga0.7As).",
            nameof(name));
    }

    /// <summary>A copy with one more layer at the end.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="material"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="width"/> is not positive.</exception>
    public StructureRecipe Add(Material material, Length width) => Add(RecipeLayer.Create(material, width));

    /// <summary>A copy with one more layer at the end.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="layer"/> is null.</exception>
    public StructureRecipe Add(RecipeLayer layer)
    {
        ArgumentNullException.ThrowIfNull(layer);
        return With(layers: [.. _layers, layer]);
    }

    /// <summary>A copy with the group <paramref name="layers"/> appended <paramref name="repetitions"/> times.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="repetitions"/> is outside 1 to 10,000.</exception>
    /// <exception cref="ArgumentException"><paramref name="layers"/> is empty or holds a null.</exception>
    public StructureRecipe AddRepeated(int repetitions, params RecipeLayer[] layers)
    {
        Preconditions.CheckRange(repetitions, 1, 10000);
        ArgumentNullException.ThrowIfNull(layers);
        if (layers.Length == 0 || Array.IndexOf(layers, null) >= 0)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"layers must hold at least one layer and no null; got {layers.Length} element(s)."),
                nameof(layers));
        }
        var list = new List<RecipeLayer>(_layers);
        for (var r = 0; r < repetitions; r++)
        {
            list.AddRange(layers);
        }
        return With(layers: [.. list]);
    }

    /// <summary>A copy at another temperature (0–1000 K).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="temperature"/> is above 1000 K.</exception>
    public StructureRecipe WithTemperature(Temperature temperature)
    {
        Material.CheckTemperature(temperature.Kelvin, nameof(temperature));
        return With(temperature: temperature.Kelvin);
    }

    /// <summary>A copy for another carrier. Holes use a single-band approximation (see <see cref="Materials.Carrier"/>).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="carrier"/> is not defined.</exception>
    /// <exception cref="ArgumentException">A hole carrier was chosen while the non-parabolic (electron-only) mass is on.</exception>
    public StructureRecipe WithCarrier(Carrier carrier)
    {
        if (!Enum.IsDefined(carrier))
        {
            throw new ArgumentOutOfRangeException(nameof(carrier), carrier,
                string.Create(CultureInfo.InvariantCulture, $"carrier must be Electron, HeavyHole or LightHole; got {(int)carrier}."));
        }
        if (carrier != Carrier.Electron && IsNonParabolic)
        {
            throw new ArgumentException(
                $"carrier {carrier} cannot be combined with the two-band Kane mass, which is defined for conduction electrons only; call WithNonParabolicity(false) first.",
                nameof(carrier));
        }
        return With(carrier: carrier);
    }

    /// <summary>A copy with the two-band Kane mass on or off (electrons only).</summary>
    /// <exception cref="ArgumentException">Turned on while the carrier is a hole.</exception>
    public StructureRecipe WithNonParabolicity(bool nonParabolic)
    {
        if (nonParabolic && Carrier != Carrier.Electron)
        {
            throw new ArgumentException(
                $"nonParabolic = true is available for Carrier.Electron only; the carrier is {Carrier}.", nameof(nonParabolic));
        }
        return With(nonParabolic: nonParabolic);
    }

    /// <summary>A copy with a substrate for the lattice-mismatch check (null: the first layer's material).</summary>
    public StructureRecipe WithSubstrate(Material? substrate) => new(_layers, Temperature.Kelvin, Carrier, IsNonParabolic, substrate, Periods, Limits);

    /// <summary>A copy recording another number of periods (1 to 100,000) for a finite stack.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="periods"/> is outside 1 to 100,000.</exception>
    public StructureRecipe WithPeriods(int periods) => With(periods: Preconditions.CheckRange(periods, 1, 100000));

    /// <summary>A copy with other warning thresholds.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="limits"/> is null.</exception>
    public StructureRecipe WithLimits(ModelLimits limits)
    {
        ArgumentNullException.ThrowIfNull(limits);
        return With(limits: limits);
    }

    /// <summary>
    /// Builds the unit cell: every layer's band edges at <see cref="Temperature"/>, potentials relative
    /// to the structure's reference (see <see cref="BuiltStructure.ReferenceElectronVolts"/>), masses, optional
    /// Kane non-parabolicity, and the validity warnings.
    /// </summary>
    /// <exception cref="InvalidOperationException">The recipe has no layers, or a hole carrier is chosen and a layer's material has no mass for it.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A material's gap is not positive at the recipe's temperature.</exception>
    public BuiltStructure Build() => BuiltStructure.Build(this);

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        for (var i = 0; i < _layers.Length; i++)
        {
            text.Append(i == 0 ? "" : " / ").Append(_layers[i]);
        }
        text.Append(CultureInfo.InvariantCulture, $" at {Temperature.Kelvin:G6} K, {Carrier}, {(IsNonParabolic ? "Kane" : "parabolic")}");
        if (Periods > 1)
        {
            text.Append(CultureInfo.InvariantCulture, $", {Periods} periods");
        }
        return text.ToString();
    }

    private StructureRecipe With(RecipeLayer[]? layers = null, double? temperature = null, Carrier? carrier = null,
        bool? nonParabolic = null, int? periods = null, ModelLimits? limits = null) =>
        new(layers ?? _layers, temperature ?? Temperature.Kelvin, carrier ?? Carrier, nonParabolic ?? IsNonParabolic, Substrate,
            periods ?? Periods, limits ?? Limits);
}
