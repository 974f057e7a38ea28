// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Materials;

/// <summary>Why a result may be outside the model's range of validity.</summary>
public enum ModelWarningKind
{
    /// <summary>A layer is thinner than <see cref="ModelLimits.MinimumMonolayers"/> monolayers (a/2): the envelope-function picture is doubtful.</summary>
    ThinLayer,

    /// <summary>A layer's lattice mismatch to the substrate exceeds <see cref="ModelLimits.MaximumLatticeMismatch"/>: strain shifts the bands and is not modelled.</summary>
    LatticeMismatch,

    /// <summary>A layer's lowest conduction minimum is not Γ (X or L lie lower): only Γ states are modelled.</summary>
    IndirectGap,

    /// <summary>An energy lies so far above a layer's band edge that the mass model (parabolic or two-band Kane) is stretched.</summary>
    EnergyFarAboveBandEdge,

    /// <summary>Holes are described by a single parabolic band each (no heavy/light-hole mixing): a rough estimate.</summary>
    SingleBandHoles,

    /// <summary>
    /// Broken-gap (type III) alignment: one layer's conduction-band edge lies below another layer's valence-band
    /// edge (e.g. InAs/GaSb). Electron and hole states then mix, which a single-band model cannot describe.
    /// </summary>
    BrokenGap,
}

/// <summary>One warning about the model's validity, with the number that triggered it and the limit it broke.</summary>
public sealed class ModelWarning
{
    internal ModelWarning(ModelWarningKind kind, int layerIndex, double value, double limit, string message)
    {
        Kind = kind;
        LayerIndex = layerIndex;
        Value = value;
        Limit = limit;
        Message = message;
    }

    /// <summary>What kind of limit was broken.</summary>
    public ModelWarningKind Kind { get; }

    /// <summary>The layer concerned (0-based, in the expanded layer list), or −1 if the warning is about the whole structure.</summary>
    public int LayerIndex { get; }

    /// <summary>
    /// The value that broke the limit, in the unit of the limit: monolayers (ThinLayer), relative mismatch
    /// (LatticeMismatch), 0 (IndirectGap), the overlap in eV (BrokenGap), (E − edge)/Eg (EnergyFarAboveBandEdge), 0 (SingleBandHoles).
    /// </summary>
    public double Value { get; }

    /// <summary>The limit that was broken, in the same unit as <see cref="Value"/>.</summary>
    public double Limit { get; }

    /// <summary>A sentence saying what happened and what it means.</summary>
    public string Message { get; }

    /// <inheritdoc />
    public override string ToString() => LayerIndex < 0
        ? $"{Kind}: {Message}"
        : string.Create(CultureInfo.InvariantCulture, $"{Kind} (layer {LayerIndex}): {Message}");
}
