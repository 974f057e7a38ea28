// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;

namespace Periodic.Materials;

/// <summary>
/// One layer of a <see cref="BuiltStructure"/> with every effective number that went into the engine,
/// so that nothing in the built cell is hidden.
/// </summary>
public sealed class BuiltLayer
{
    internal BuiltLayer(int index, Material material, Layer layer, double gap, double valenceEdge, double mismatch)
    {
        Index = index;
        Material = material;
        Layer = layer;
        BandGapElectronVolts = gap;
        ValenceBandEdgeElectronVolts = valenceEdge;
        LatticeMismatch = mismatch;
    }

    /// <summary>Position in the cell (0-based), repetitions expanded.</summary>
    public int Index { get; }

    /// <summary>The material, with the parameters used.</summary>
    public Material Material { get; }

    /// <summary>The engine layer built (width, potential relative to the reference, mass, non-parabolicity).</summary>
    public Layer Layer { get; }

    /// <summary>Thickness, nm.</summary>
    public double WidthNanometres => Layer.Width.Nanometres;

    /// <summary>Thickness in monolayers (a/2) of the material; need not be whole.</summary>
    public double Monolayers => Layer.Width.Nanometres / Material.MonolayerNanometres;

    /// <summary>Γ gap at the structure's temperature, eV.</summary>
    public double BandGapElectronVolts { get; }

    /// <summary>Valence-band edge on the absolute scale of the table, eV.</summary>
    public double ValenceBandEdgeElectronVolts { get; }

    /// <summary>Conduction-band (Γ) edge on the absolute scale of the table, eV.</summary>
    public double ConductionBandEdgeElectronVolts => ValenceBandEdgeElectronVolts + BandGapElectronVolts;

    /// <summary>The carrier's potential energy in this layer relative to the structure's reference, eV (the engine's V).</summary>
    public double PotentialElectronVolts => Layer.Potential.ElectronVolts;

    /// <summary>The carrier's band-edge effective mass, m₀.</summary>
    public double MassElectronMasses => Layer.Mass.ElectronMasses;

    /// <summary>Non-parabolicity α in 1/eV (1/Eg for the two-band Kane mass, 0 when parabolic).</summary>
    public double NonParabolicityPerElectronVolt => Layer.NonParabolicityPerElectronVolt;

    /// <summary>Relative lattice mismatch (a − a_substrate)/a_substrate.</summary>
    public double LatticeMismatch { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"[{Index}] {WidthNanometres:G6} nm {Material.Name} ({Monolayers:F1} ML): Eg = {BandGapElectronVolts:F4} eV, Ec = {ConductionBandEdgeElectronVolts:F4} eV, Ev = {ValenceBandEdgeElectronVolts:F4} eV, V = {PotentialElectronVolts:F4} eV, m = {MassElectronMasses:G4} m0, alpha = {NonParabolicityPerElectronVolt:G4} /eV, da/a = {LatticeMismatch * 100:F3} %");
}
