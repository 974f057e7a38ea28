// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;

namespace Periodic.Optics;

/// <summary>Settings of <see cref="IntersubbandSpectrum.Compute(Stacks.LayerStack, IntersubbandOptions?)"/>. Defaults live in <see cref="Default"/>.</summary>
public sealed record IntersubbandOptions
{
    /// <summary>The defaults: the well's mass as reference, bound states only, 20 nm domain margin, 1 % domain tolerance.</summary>
    public static IntersubbandOptions Default { get; } = new();

    /// <summary>
    /// The mass m* in f = 2m*ω|z|²/ħ, in m0; null (default) takes the band-edge mass of the layer with the lowest
    /// potential (the well material; the first such layer when several share it).
    /// </summary>
    public double? ReferenceMassElectronMasses { get; init; }

    /// <summary>
    /// Also take quasi-bound final states (default false): the stack's transmission resonances above both lead band edges, and,
    /// where the two edges differ (under bias, or leads of different materials), the states between them that leak into the
    /// lower lead only.
    /// </summary>
    public bool IncludeQuasiBound { get; init; }

    /// <summary>
    /// Upper end of the resonance search, eV; null (default) searches up to the highest potential of the stack and its leads
    /// plus half the stack's depth (highest minus lowest potential).
    /// </summary>
    public double? QuasiBoundUpperElectronVolts { get; init; }

    /// <summary>
    /// A quasi-bound state is normalised on the stack plus this margin of each lead, nm (default 20). Its dipoles are
    /// recomputed with twice the margin, and the relative change is reported as their domain convergence.
    /// </summary>
    public double DomainMarginNanometres { get; init; } = 20;

    /// <summary>
    /// Largest relative change of |z| between the margin and twice the margin for which a transition to a quasi-bound state
    /// counts as resolved (default 0.01). Broad continuum peaks, whose weight lies mostly in the leads, fail it.
    /// </summary>
    public double DomainTolerance { get; init; } = 0.01;

    /// <summary>
    /// Settings of the bound-state search; the default refines each level to <see cref="DefaultLevelToleranceElectronVolts"/>
    /// (or 4e-16 relative), because a dipole between two levels δ apart moves by about (level error/δ)·z: the levels of a
    /// miniband of many wells lie 1e-7 eV apart, where the search's usual 1e-12 eV would cost 1e-5 of the dipoles.
    /// </summary>
    public BoundStateOptions BoundStates { get; init; } = BoundStateOptions.Create(absoluteToleranceElectronVolts: DefaultLevelToleranceElectronVolts);

    /// <summary>The default absolute tolerance of the levels, eV.</summary>
    public const double DefaultLevelToleranceElectronVolts = 1e-16;


    /// <summary>Settings of the resonance search (quasi-bound states).</summary>
    public ResonanceSearchOptions Resonances { get; init; } = ResonanceSearchOptions.Default;

    internal void Validate(string paramName)
    {
        if (ReferenceMassElectronMasses is { } m && !(m > 0 && double.IsFinite(m)))
        {
            throw new ArgumentOutOfRangeException(paramName, m,
                $"{paramName}.ReferenceMassElectronMasses must be a positive finite mass in m0 (or null for the well's mass); got {Preconditions.Format(m)}.");
        }
        if (QuasiBoundUpperElectronVolts is { } u && !double.IsFinite(u))
        {
            throw new ArgumentOutOfRangeException(paramName, u,
                $"{paramName}.QuasiBoundUpperElectronVolts must be a finite energy in eV (or null); got {Preconditions.Format(u)}.");
        }
        if (!(DomainMarginNanometres > 0 && DomainMarginNanometres <= 1e4))
        {
            throw new ArgumentOutOfRangeException(paramName, DomainMarginNanometres,
                $"{paramName}.DomainMarginNanometres must lie in (0, 10000] nm; got {Preconditions.Format(DomainMarginNanometres)}.");
        }
        if (!(DomainTolerance > 0 && DomainTolerance < 1))
        {
            throw new ArgumentOutOfRangeException(paramName, DomainTolerance,
                $"{paramName}.DomainTolerance must lie in (0, 1); got {Preconditions.Format(DomainTolerance)}.");
        }
        ArgumentNullException.ThrowIfNull(BoundStates, paramName + ".BoundStates");
        ArgumentNullException.ThrowIfNull(Resonances, paramName + ".Resonances");
    }
}
