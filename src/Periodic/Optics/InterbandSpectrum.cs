// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Materials;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// Interband transitions of a structure built from materials: the electron, heavy-hole and light-hole levels of the same
/// stack (each in its single-band model), the transition energies e_n–hh_m and e_n–lh_m with the band gap at the
/// recipe's temperature, the envelope overlaps |⟨e_n|h_m⟩|², the absorption edge and the emission wavelength.
/// Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Model: single-band envelope functions for each carrier (no heavy/light-hole mixing, no strain), Varshni band gaps
/// and the band offsets of the materials table (see <see cref="BuiltStructure"/>). The overlap is the envelope factor of
/// the transition strength; the Bloch (Kane) factor, which makes e–lh weaker than e–hh for light along the growth axis, is
/// not included. Excitons are not modelled: their binding energy, typically 5–10 meV in GaAs wells (common practice), lowers
/// the measured edge and emission line by that much, which is this model's error on top of the parameter uncertainty
/// (<see cref="ExcitonErrorElectronVolts"/>).</para>
/// <para>Emission: the edge transition (lowest energy with |⟨e|h⟩|² ≥ <see cref="AllowedOverlapSquared"/>), i.e.
/// recombination from the lowest electron and hole levels at low injection; no Stokes shift, no band filling.</para>
/// </remarks>
public sealed class InterbandSpectrum
{
    /// <summary>A transition counts as allowed for the edge when |⟨e|h⟩|² is at least this (0.01).</summary>
    public const double AllowedOverlapSquared = 0.01;

    /// <summary>The model's error from the missing exciton binding, eV (10 meV: the upper end of the 5–10 meV typical of GaAs wells).</summary>
    public const double ExcitonErrorElectronVolts = 0.010;

    private InterbandSpectrum(StructureRecipe recipe, BoundStateSpectrum electrons, BoundStateSpectrum? heavy, BoundStateSpectrum? light,
        InterbandTransition[] transitions, double[] electronAbsolute, double[] heavyAbsolute, double[] lightAbsolute)
    {
        Recipe = recipe;
        Electrons = electrons;
        HeavyHoles = heavy;
        LightHoles = light;
        Transitions = new ReadOnlyCollection<InterbandTransition>(transitions);
        ElectronLevelsElectronVolts = new ReadOnlyCollection<double>(electronAbsolute);
        HeavyHoleLevelsElectronVolts = new ReadOnlyCollection<double>(heavyAbsolute);
        LightHoleLevelsElectronVolts = new ReadOnlyCollection<double>(lightAbsolute);
        var edge = transitions.Where(t => t.OverlapSquared >= AllowedOverlapSquared).OrderBy(t => t.EnergyElectronVolts).ToArray();
        Edge = edge.Length > 0 ? edge[0] : null;
    }

    /// <summary>The recipe (temperature, layers).</summary>
    public StructureRecipe Recipe { get; }

    /// <summary>The electron levels (energies relative to the lowest conduction-band edge).</summary>
    public BoundStateSpectrum Electrons { get; }

    /// <summary>The heavy-hole levels (hole energies counted down from the highest valence-band edge); null when the materials lack heavy-hole masses.</summary>
    public BoundStateSpectrum? HeavyHoles { get; }

    /// <summary>The light-hole levels; null when the materials lack light-hole masses.</summary>
    public BoundStateSpectrum? LightHoles { get; }

    /// <summary>Electron levels on the absolute scale of the materials table (valence-band-offset scale), eV.</summary>
    public IReadOnlyList<double> ElectronLevelsElectronVolts { get; }

    /// <summary>Heavy-hole levels on the absolute scale, eV (the valence-band energy of each level).</summary>
    public IReadOnlyList<double> HeavyHoleLevelsElectronVolts { get; }

    /// <summary>Light-hole levels on the absolute scale, eV.</summary>
    public IReadOnlyList<double> LightHoleLevelsElectronVolts { get; }

    /// <summary>Every e_n–hh_m and e_n–lh_m transition, by energy.</summary>
    public IReadOnlyList<InterbandTransition> Transitions { get; }

    /// <summary>
    /// The absorption edge: the lowest-energy transition with |⟨e|h⟩|² ≥ <see cref="AllowedOverlapSquared"/>; its wavelength is
    /// also the emission wavelength of the model. Null when there is none.
    /// </summary>
    public InterbandTransition? Edge { get; }

    /// <summary>
    /// Computes the interband transitions of <paramref name="recipe"/> stacked <see cref="StructureRecipe.Periods"/> times between
    /// leads of the given materials, at the recipe's temperature.
    /// </summary>
    /// <exception cref="ArgumentNullException">An argument is null.</exception>
    /// <exception cref="ArgumentException">The recipe is empty or uses the Kane mass with holes, a lead material lacks a needed mass, or
    /// the stack binds no electron or no hole (the message says which).</exception>
    public static InterbandSpectrum Compute(StructureRecipe recipe, Material leftLeadMaterial, Material rightLeadMaterial, BoundStateOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        ArgumentNullException.ThrowIfNull(leftLeadMaterial);
        ArgumentNullException.ThrowIfNull(rightLeadMaterial);
        options ??= BoundStateOptions.Default;
        var electronRecipe = recipe.WithNonParabolicity(false).WithCarrier(Carrier.Electron);
        var builtE = electronRecipe.Build();
        var stackE = StackOf(builtE, leftLeadMaterial, rightLeadMaterial);
        var electrons = BoundStateSpectrum.Find(stackE, options);
        if (electrons.Levels.Count == 0)
        {
            throw new ArgumentException("recipe binds no electron level between its leads: interband transitions need at least one.", nameof(recipe));
        }
        var holes = new List<(Carrier Carrier, BuiltStructure Built, LayerStack Stack, BoundStateSpectrum Spectrum)>();
        foreach (var carrier in new[] { Carrier.HeavyHole, Carrier.LightHole })
        {
            var holeRecipe = electronRecipe.WithCarrier(carrier);
            if (holeRecipe.Layers.Any(l => (carrier == Carrier.HeavyHole ? l.Material.HeavyHoleMassElectronMasses : l.Material.LightHoleMassElectronMasses) is null)
                || (carrier == Carrier.HeavyHole ? leftLeadMaterial.HeavyHoleMassElectronMasses ?? rightLeadMaterial.HeavyHoleMassElectronMasses
                    : leftLeadMaterial.LightHoleMassElectronMasses ?? rightLeadMaterial.LightHoleMassElectronMasses) is null)
            {
                continue;
            }
            var built = holeRecipe.Build();
            var stack = StackOf(built, leftLeadMaterial, rightLeadMaterial);
            var spectrum = BoundStateSpectrum.Find(stack, options);
            holes.Add((carrier, built, stack, spectrum));
        }
        if (holes.Sum(h => h.Spectrum.Levels.Count) == 0)
        {
            throw new ArgumentException("recipe binds no heavy- or light-hole level between its leads (or its materials have no hole masses): interband transitions need one.",
                nameof(recipe));
        }

        var electronStates = States(electrons);
        var electronAbsolute = electrons.Levels.Select(l => builtE.ToAbsoluteElectronVolts(l.EnergyElectronVolts)).ToArray();
        var transitions = new List<InterbandTransition>();
        double[] heavyAbsolute = [], lightAbsolute = [];
        BoundStateSpectrum? heavy = null, light = null;
        foreach (var (carrier, built, _, spectrum) in holes)
        {
            var absolute = spectrum.Levels.Select(l => built.ToAbsoluteElectronVolts(l.EnergyElectronVolts)).ToArray();
            if (carrier == Carrier.HeavyHole)
            {
                heavy = spectrum;
                heavyAbsolute = absolute;
            }
            else
            {
                light = spectrum;
                lightAbsolute = absolute;
            }
            var holeStates = States(spectrum);
            for (var n = 0; n < electronStates.Length; n++)
            {
                for (var m = 0; m < holeStates.Length; m++)
                {
                    // Electron and hole states obey different equations on the same layers: the kernel's quadrature of the pair.
                    var (overlap, _, _) = KernelState.Pair(electronStates[n], holeStates[m], 0);
                    transitions.Add(new InterbandTransition(n + 1, carrier, m + 1, electronAbsolute[n] - absolute[m], overlap));
                }
            }
        }
        transitions.Sort((a, b) => a.EnergyElectronVolts.CompareTo(b.EnergyElectronVolts));
        return new InterbandSpectrum(recipe, electrons, heavy, light, [.. transitions], electronAbsolute, heavyAbsolute, lightAbsolute);
    }

    /// <summary>
    /// <paramref name="built"/> stacked <see cref="StructureRecipe.Periods"/> times between leads of the given materials: each
    /// lead takes the band edge and band-edge mass of its material for the structure's carrier (parabolic).
    /// </summary>
    private static LayerStack StackOf(BuiltStructure built, Material leftLeadMaterial, Material rightLeadMaterial) =>
        LayerStack.Periodic(LeadOf(built, leftLeadMaterial), built.Cell, built.Recipe.Periods, LeadOf(built, rightLeadMaterial));

    private static Lead LeadOf(BuiltStructure built, Material material)
    {
        // A lead uses only the layer's band edge and band-edge mass; the width is any positive value.
        var layer = built.LayerOf(material, Length.FromNanometres(1));
        return Lead.Create(layer.Potential, layer.Mass);
    }

    private static KernelState[] States(BoundStateSpectrum spectrum)
    {
        var states = new KernelState[spectrum.Levels.Count];
        for (var i = 0; i < states.Length; i++)
        {
            states[i] = KernelState.Of(spectrum.GetWavefunction(i));
        }
        return states;
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"Interband spectrum at {Recipe.Temperature.Kelvin:G6} K: {Electrons.Levels.Count} electron, {HeavyHoles?.Levels.Count ?? 0} heavy-hole, {LightHoles?.Levels.Count ?? 0} light-hole level(s)");
        if (Edge is { } edge)
        {
            text.AppendLine().Append(CultureInfo.InvariantCulture, $"  edge {edge} (excitons not modelled: ± {ExcitonErrorElectronVolts * 1000:G3} meV)");
        }
        foreach (var transition in Transitions)
        {
            text.AppendLine().Append("  ").Append(transition);
        }
        return text.ToString();
    }
}
