// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Materials;

/// <summary>
/// The thresholds at which the structure builder warns that the model is stretched. The defaults are
/// judgement (common practice, no single source) and live here only; change them with <c>With…</c>.
/// </summary>
public sealed class ModelLimits
{
    /// <summary>Default minimum layer thickness, in monolayers (a/2).</summary>
    public const double DefaultMinimumMonolayers = 3.0;

    /// <summary>
    /// Default largest |Δa/a| to the substrate treated as unstrained: 0.2 %, so that GaAs/AlAs
    /// (≈ 0.14 %, conventionally treated as lattice-matched) passes and InGaAs on GaAs with a few
    /// per cent In does not.
    /// </summary>
    public const double DefaultMaximumLatticeMismatch = 2e-3;

    /// <summary>
    /// Default largest (E − E_edge)/Eg for the parabolic model: the two-band Kane mass changes by this
    /// fraction over that energy, so 0.1 means a mass error of about 10 %.
    /// </summary>
    public const double DefaultMaximumParabolicEnergyFraction = 0.1;

    /// <summary>
    /// Default largest (E − E_edge)/Eg with the two-band Kane mass: beyond about half the gap the
    /// lowest-order form and the neglect of remote bands are no longer reliable.
    /// </summary>
    public const double DefaultMaximumKaneEnergyFraction = 0.5;

    private ModelLimits(double monolayers, double mismatch, double parabolic, double kane)
    {
        MinimumMonolayers = monolayers;
        MaximumLatticeMismatch = mismatch;
        MaximumParabolicEnergyFraction = parabolic;
        MaximumKaneEnergyFraction = kane;
    }

    /// <summary>The default limits.</summary>
    public static ModelLimits Default { get; } = new(DefaultMinimumMonolayers, DefaultMaximumLatticeMismatch,
        DefaultMaximumParabolicEnergyFraction, DefaultMaximumKaneEnergyFraction);

    /// <summary>Layers thinner than this many monolayers (a/2) draw a <see cref="ModelWarningKind.ThinLayer"/> warning.</summary>
    public double MinimumMonolayers { get; }

    /// <summary>Layers with |Δa/a| to the substrate above this draw a <see cref="ModelWarningKind.LatticeMismatch"/> warning.</summary>
    public double MaximumLatticeMismatch { get; }

    /// <summary>Energies with (E − edge)/Eg above this in some layer draw a warning when the mass is parabolic.</summary>
    public double MaximumParabolicEnergyFraction { get; }

    /// <summary>Energies with (E − edge)/Eg above this in some layer draw a warning when the two-band Kane mass is used.</summary>
    public double MaximumKaneEnergyFraction { get; }

    /// <summary>A copy with another minimum thickness in monolayers (≥ 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is negative or not finite.</exception>
    public ModelLimits WithMinimumMonolayers(double minimumMonolayers) =>
        new(Preconditions.CheckNonNegativeFinite(minimumMonolayers), MaximumLatticeMismatch, MaximumParabolicEnergyFraction, MaximumKaneEnergyFraction);

    /// <summary>A copy with another largest relative lattice mismatch (≥ 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is negative or not finite.</exception>
    public ModelLimits WithMaximumLatticeMismatch(double maximumLatticeMismatch) =>
        new(MinimumMonolayers, Preconditions.CheckNonNegativeFinite(maximumLatticeMismatch), MaximumParabolicEnergyFraction, MaximumKaneEnergyFraction);

    /// <summary>A copy with other largest energy fractions (E − edge)/Eg for the parabolic and the Kane mass (both positive).</summary>
    /// <exception cref="ArgumentOutOfRangeException">A value is not positive and finite.</exception>
    public ModelLimits WithMaximumEnergyFractions(double maximumParabolicEnergyFraction, double maximumKaneEnergyFraction) =>
        new(MinimumMonolayers, MaximumLatticeMismatch, Preconditions.CheckPositiveFinite(maximumParabolicEnergyFraction),
            Preconditions.CheckPositiveFinite(maximumKaneEnergyFraction));

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"ModelLimits: min {MinimumMonolayers:G4} ML, max mismatch {MaximumLatticeMismatch * 100:G4} %, max (E - edge)/Eg {MaximumParabolicEnergyFraction:G4} parabolic, {MaximumKaneEnergyFraction:G4} Kane");
}
