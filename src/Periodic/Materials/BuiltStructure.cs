// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Materials;

/// <summary>
/// The result of building a <see cref="StructureRecipe"/>: the engine's <see cref="UnitCell"/>, every
/// layer's effective parameters, the energy reference, and the warnings where the model is stretched.
/// Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para><b>Energy reference.</b> For electrons, energy 0 of the cell is the lowest Γ conduction-band
/// edge in the structure, and an engine energy E is the absolute energy <see cref="ReferenceElectronVolts"/> + E
/// on the valence-band-offset scale of the table. For holes, 0 is the highest valence-band edge and
/// hole energies count downwards: absolute electron energy = <see cref="ReferenceElectronVolts"/> − E.</para>
/// <para><b>Model.</b> Single-band envelope functions with BenDaniel–Duke matching, Γ valley only, no strain,
/// no electric field; holes (if chosen) in a single parabolic band each. Results are as good as the
/// parameters, several of which are recalled from memory: confirm design-critical numbers against
/// measurement.</para>
/// </remarks>
public sealed class BuiltStructure
{
    private readonly BuiltLayer[] _layers;

    private BuiltStructure(StructureRecipe recipe, UnitCell cell, BuiltLayer[] layers, double reference, ModelWarning[] warnings)
    {
        Recipe = recipe;
        Cell = cell;
        _layers = layers;
        Layers = new ReadOnlyCollection<BuiltLayer>(layers);
        ReferenceElectronVolts = reference;
        Warnings = new ReadOnlyCollection<ModelWarning>(warnings);
    }

    /// <summary>The recipe this was built from.</summary>
    public StructureRecipe Recipe { get; }

    /// <summary>The unit cell to hand to the engine (e.g. to <c>BandStructure.Compute</c>).</summary>
    public UnitCell Cell { get; }

    /// <summary>Every layer with the numbers used, in cell order.</summary>
    public IReadOnlyList<BuiltLayer> Layers { get; }

    /// <summary>
    /// Absolute energy (valence-band-offset scale, eV) of the cell's zero: the lowest conduction-band edge
    /// for electrons, the highest valence-band edge for holes.
    /// </summary>
    public double ReferenceElectronVolts { get; }

    /// <summary>The carrier described.</summary>
    public Carrier Carrier => Recipe.Carrier;

    /// <summary>The lattice temperature of the recipe.</summary>
    public Temperature Temperature => Recipe.Temperature;

    /// <summary>Warnings found while building (thin layers, lattice mismatch, indirect layers, single-band holes). Empty when none.</summary>
    public IReadOnlyList<ModelWarning> Warnings { get; }

    /// <summary>
    /// Converts an engine energy E (relative to the reference) to the absolute scale of the table, eV:
    /// reference + E for electrons, reference − E for holes.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public double ToAbsoluteElectronVolts(double energyElectronVolts)
    {
        Preconditions.CheckFinite(energyElectronVolts);
        return Carrier == Carrier.Electron ? ReferenceElectronVolts + energyElectronVolts : ReferenceElectronVolts - energyElectronVolts;
    }

    /// <summary>
    /// Checks energies of the cell (relative to the reference, eV) against the mass model: for each energy,
    /// the largest (E − V)/Eg over the layers where E &gt; V; a warning when it exceeds
    /// <see cref="ModelLimits.MaximumParabolicEnergyFraction"/> (parabolic mass) or
    /// <see cref="ModelLimits.MaximumKaneEnergyFraction"/> (Kane mass). Empty when all are within range.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not finite.</exception>
    public IReadOnlyList<ModelWarning> CheckEnergies(ReadOnlySpan<double> energiesElectronVolts)
    {
        var warnings = new List<ModelWarning>();
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            var e = energiesElectronVolts[i];
            if (!double.IsFinite(e))
            {
                throw new ArgumentOutOfRangeException(nameof(energiesElectronVolts), e,
                    string.Create(CultureInfo.InvariantCulture, $"energiesElectronVolts[{i}] must be finite; got {Preconditions.Format(e)}."));
            }
            if (CheckEnergy(e) is { } warning)
            {
                warnings.Add(warning);
            }
        }
        return new ReadOnlyCollection<ModelWarning>([.. warnings]);
    }

    /// <summary>
    /// A layer of <paramref name="material"/> on this structure's energy reference, for its carrier and at its
    /// temperature: exactly the layer a recipe layer of that material and width becomes in <see cref="Cell"/>
    /// (with the Kane non-parabolicity when the recipe uses it). Use it to add caps, spacers or defects to the
    /// structure, or to describe a contact: <c>Lead.Like(built.LayerOf(Material.GaAs, width))</c> takes its band
    /// edge and band-edge mass.
    /// </summary>
    /// <remarks>
    /// The material is not checked for lattice mismatch or directness; build a recipe containing it to see those
    /// warnings.
    /// </remarks>
    /// <param name="material">The material.</param>
    /// <param name="width">Width of the layer; positive and finite.</param>
    /// <exception cref="ArgumentNullException"><paramref name="material"/> is null.</exception>
    /// <exception cref="ArgumentException">The material has no mass for the carrier (holes).</exception>
    /// <exception cref="ArgumentOutOfRangeException">The width is not positive and finite, or the material's gap is
    /// not positive at the structure's temperature.</exception>
    public Layer LayerOf(Material material, Length width)
    {
        ArgumentNullException.ThrowIfNull(material);
        var gap = material.BandGapElectronVolts(Temperature);
        var vbo = material.ValenceBandOffsetElectronVolts;
        double potential, mass;
        switch (Carrier)
        {
            case Carrier.Electron:
                potential = vbo + gap - ReferenceElectronVolts;
                mass = material.ElectronMassElectronMasses;
                break;
            default:
                potential = ReferenceElectronVolts - vbo;
                mass = (Carrier == Carrier.HeavyHole ? material.HeavyHoleMassElectronMasses : material.LightHoleMassElectronMasses)
                    ?? throw new ArgumentException($"material ({material.Name}) has no {(Carrier == Carrier.HeavyHole ? "heavy" : "light")}-hole mass.", nameof(material));
                break;
        }
        var alpha = Recipe.IsNonParabolic ? 1.0 / gap : 0.0;
        return Layer.Create(width, Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass), alpha);
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"BuiltStructure: {_layers.Length} layer(s), period {Cell.Period.Nanometres:G6} nm, {Temperature.Kelvin:G6} K, {DescribeCarrier()}, reference {ReferenceElectronVolts:F4} eV ({(Carrier == Carrier.Electron ? "lowest Ec" : "highest Ev")})");
        foreach (var layer in _layers)
        {
            text.AppendLine().Append("  ").Append(layer);
        }
        foreach (var warning in Warnings)
        {
            text.AppendLine().Append("  warning: ").Append(warning);
        }
        return text.ToString();
    }

    internal static BuiltStructure Build(StructureRecipe recipe)
    {
        var recipeLayers = recipe.Layers;
        if (recipeLayers.Count == 0)
        {
            throw new InvalidOperationException("The recipe has no layers; add at least one with Add before Build.");
        }
        var t = recipe.Temperature;
        var carrier = recipe.Carrier;
        var substrate = recipe.Substrate ?? recipeLayers[0].Material;
        var n = recipeLayers.Count;
        var gaps = new double[n];
        var valence = new double[n];
        var masses = new double[n];
        double reference = carrier == Carrier.Electron ? double.PositiveInfinity : double.NegativeInfinity;
        for (var i = 0; i < n; i++)
        {
            var material = recipeLayers[i].Material;
            gaps[i] = material.BandGapElectronVolts(t);
            valence[i] = material.ValenceBandOffsetElectronVolts;
            masses[i] = carrier switch
            {
                Carrier.Electron => material.ElectronMassElectronMasses,
                Carrier.HeavyHole => material.HeavyHoleMassElectronMasses ?? throw MissingMass(i, material, "heavy-hole", "WithHeavyHoleMass"),
                _ => material.LightHoleMassElectronMasses ?? throw MissingMass(i, material, "light-hole", "WithLightHoleMass"),
            };
            reference = carrier == Carrier.Electron
                ? Math.Min(reference, valence[i] + gaps[i])
                : Math.Max(reference, valence[i]);
        }
        var limits = recipe.Limits;
        var warnings = new List<ModelWarning>();
        if (carrier != Carrier.Electron)
        {
            warnings.Add(new ModelWarning(ModelWarningKind.SingleBandHoles, -1, 0, 0,
                $"{carrier} states use a single parabolic band (no heavy/light-hole mixing, no split-off band): subband positions at k = 0 are rough estimates, in-plane masses are not described."));
        }
        var layers = new BuiltLayer[n];
        var cellElements = new CellElement[n];
        for (var i = 0; i < n; i++)
        {
            var material = recipeLayers[i].Material;
            var potential = carrier == Carrier.Electron ? valence[i] + gaps[i] - reference : reference - valence[i];
            var alpha = recipe.IsNonParabolic ? 1.0 / gaps[i] : 0.0;
            var layer = Layer.Create(recipeLayers[i].Width, Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(masses[i]), alpha);
            var mismatch = material.LatticeMismatchTo(substrate);
            layers[i] = new BuiltLayer(i, material, layer, gaps[i], valence[i], mismatch);
            cellElements[i] = layer;
            var monolayers = layers[i].Monolayers;
            if (monolayers < limits.MinimumMonolayers)
            {
                warnings.Add(new ModelWarning(ModelWarningKind.ThinLayer, i, monolayers, limits.MinimumMonolayers, string.Create(CultureInfo.InvariantCulture,
                    $"{material.Name} is {monolayers:F2} monolayers thick (a/2 = {material.MonolayerNanometres:F4} nm), below {limits.MinimumMonolayers:G4}: the envelope-function model and the bulk parameters are doubtful at this thickness.")));
            }
            if (Math.Abs(mismatch) > limits.MaximumLatticeMismatch)
            {
                warnings.Add(new ModelWarning(ModelWarningKind.LatticeMismatch, i, Math.Abs(mismatch), limits.MaximumLatticeMismatch, string.Create(CultureInfo.InvariantCulture,
                    $"{material.Name} is mismatched by {mismatch * 100:F3} % to {substrate.Name}, beyond {limits.MaximumLatticeMismatch * 100:G4} %: strain shifts and splits the band edges, and strain is not modelled.")));
            }
            if (carrier == Carrier.Electron && !material.IsGammaValleyLowest)
            {
                warnings.Add(new ModelWarning(ModelWarningKind.IndirectGap, i, 0, 0,
                    $"{material.Name} has its lowest conduction minimum outside Gamma (X or L): only Gamma-valley states are modelled, so lower-lying X/L states in this layer are missing and its barrier height is an upper bound for electrons."));
            }
        }
        int lowestConduction = 0, highestValence = 0;
        for (var i = 1; i < n; i++)
        {
            lowestConduction = valence[i] + gaps[i] < valence[lowestConduction] + gaps[lowestConduction] ? i : lowestConduction;
            highestValence = valence[i] > valence[highestValence] ? i : highestValence;
        }
        var overlap = valence[highestValence] - (valence[lowestConduction] + gaps[lowestConduction]);
        if (overlap > 0)
        {
            warnings.Add(new ModelWarning(ModelWarningKind.BrokenGap, -1, overlap, 0, string.Create(CultureInfo.InvariantCulture,
                $"broken-gap alignment: the conduction-band edge of {recipeLayers[lowestConduction].Material.Name} (layer {lowestConduction}) lies {overlap * 1e3:F0} meV below the valence-band edge of {recipeLayers[highestValence].Material.Name} (layer {highestValence}); electron and hole states mix there, which this single-band model does not describe.")));
        }
        var cell = UnitCell.Create(cellElements);
        return new BuiltStructure(recipe, cell, layers, reference, [.. warnings]);
    }

    private ModelWarning? CheckEnergy(double e)
    {
        double worst = double.NegativeInfinity;
        var worstLayer = -1;
        foreach (var layer in _layers)
        {
            var fraction = (e - layer.PotentialElectronVolts) / layer.BandGapElectronVolts;
            if (fraction > worst)
            {
                worst = fraction;
                worstLayer = layer.Index;
            }
        }
        var kane = Recipe.IsNonParabolic;
        var limit = kane ? Recipe.Limits.MaximumKaneEnergyFraction : Recipe.Limits.MaximumParabolicEnergyFraction;
        if (!(worst > limit))
        {
            return null;
        }
        var name = _layers[worstLayer].Material.Name;
        return new ModelWarning(ModelWarningKind.EnergyFarAboveBandEdge, worstLayer, worst, limit, string.Create(CultureInfo.InvariantCulture,
            $"E = {e:G6} eV lies {worst:F3} Eg above the band edge of {name}, beyond {limit:G4} Eg: the {(kane ? "two-band Kane mass (lowest order)" : "parabolic mass")} is no longer reliable there{(kane ? "" : "; consider the Kane non-parabolicity")}."));
    }

    private string DescribeCarrier() => Carrier switch
    {
        Carrier.Electron => Recipe.IsNonParabolic ? "electrons (Gamma, two-band Kane mass)" : "electrons (Gamma, parabolic mass)",
        Carrier.HeavyHole => "heavy holes (single-band approximation)",
        _ => "light holes (single-band approximation)",
    };

    private static InvalidOperationException MissingMass(int index, Material material, string which, string method) =>
        new(string.Create(CultureInfo.InvariantCulture,
            $"Layer {index} ({material.Name}) has no {which} mass; give one with Material.{method} before building for holes."));
}
