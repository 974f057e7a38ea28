// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// A zero-width barrier (positive strength) or well (negative strength) V(x) = S·δ(x − x₀),
/// treated exactly: ψ is continuous and ψ′/m jumps by (2m₀/ħ²)·S·ψ.
/// </summary>
public sealed class DeltaBarrier : CellElement
{
    private DeltaBarrier(double strengthElectronVoltNanometres) => StrengthElectronVoltNanometres = strengthElectronVoltNanometres;

    /// <summary>Strength S in eV·nm (the integral of the potential across the barrier); negative for a well.</summary>
    public double StrengthElectronVoltNanometres { get; }

    /// <summary>Always zero.</summary>
    public override Length Width => default;

    /// <summary>Creates a delta barrier (S &gt; 0) or well (S &lt; 0) of strength S in eV·nm.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="strengthElectronVoltNanometres"/> is NaN or infinite.</exception>
    public static DeltaBarrier Create(double strengthElectronVoltNanometres) =>
        new(Preconditions.CheckFinite(strengthElectronVoltNanometres));

    /// <inheritdoc />
    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"Delta {StrengthElectronVoltNanometres:G6} eV nm");
}
