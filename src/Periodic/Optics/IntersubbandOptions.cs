// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Stacks;

namespace Periodic.Optics;

/// <summary>
/// Settings of <see cref="IntersubbandSpectrum.Compute(Stacks.LayerStack, IntersubbandOptions?)"/>, validated when created.
/// Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class IntersubbandOptions
{
    /// <summary>Default margin of each lead in a quasi-bound state's normalisation domain, nm.</summary>
    public const double DefaultDomainMarginNanometres = 20;

    /// <summary>Default largest relative change of |z| when the margin is doubled.</summary>
    public const double DefaultDomainTolerance = 0.01;

    /// <summary>The default absolute tolerance of the levels, eV.</summary>
    public const double DefaultLevelToleranceElectronVolts = 1e-16;

    private IntersubbandOptions(double? referenceMass, bool includeQuasiBound, double? quasiBoundUpper, double domainMargin, double domainTolerance,
        BoundStateOptions boundStates, ResonanceSearchOptions resonances)
    {
        ReferenceMassElectronMasses = referenceMass;
        IncludeQuasiBound = includeQuasiBound;
        QuasiBoundUpperElectronVolts = quasiBoundUpper;
        DomainMarginNanometres = domainMargin;
        DomainTolerance = domainTolerance;
        BoundStates = boundStates;
        Resonances = resonances;
    }

    /// <summary>The defaults: the well's mass as reference, bound states only, 20 nm domain margin, 1 % domain tolerance.</summary>
    public static IntersubbandOptions Default { get; } = Create();

    /// <summary>
    /// The mass m* in f = 2m*ω|z|²/ħ, in m0; null (default) takes the band-edge mass of the layer with the lowest
    /// potential (the well material; the first such layer when several share it).
    /// </summary>
    public double? ReferenceMassElectronMasses { get; }

    /// <summary>
    /// Also take quasi-bound final states (default false): the stack's transmission resonances above both lead band edges, and,
    /// where the two edges differ (under bias, or leads of different materials), the states between them that leak into the
    /// lower lead only.
    /// </summary>
    public bool IncludeQuasiBound { get; }

    /// <summary>
    /// Upper end of the resonance search, eV; null (default) searches up to the highest potential of the stack and its leads
    /// plus half the stack's depth (highest minus lowest potential).
    /// </summary>
    public double? QuasiBoundUpperElectronVolts { get; }

    /// <summary>
    /// A quasi-bound state is normalised on the stack plus this margin of each lead, nm (default 20). Its dipoles are
    /// recomputed with twice the margin, and the relative change is reported as their domain convergence.
    /// </summary>
    public double DomainMarginNanometres { get; }

    /// <summary>
    /// Largest relative change of |z| between the margin and twice the margin for which a transition to a quasi-bound state
    /// counts as resolved (default 0.01). Broad continuum peaks, whose weight lies mostly in the leads, fail it.
    /// </summary>
    public double DomainTolerance { get; }

    /// <summary>
    /// Settings of the bound-state search; the default refines each level to <see cref="DefaultLevelToleranceElectronVolts"/>
    /// (or 4e-16 relative), because a dipole between two levels δ apart moves by about (level error/δ)·z: the levels of a
    /// miniband of many wells lie 1e-7 eV apart, where the search's usual 1e-12 eV would cost 1e-5 of the dipoles.
    /// </summary>
    public BoundStateOptions BoundStates { get; }

    /// <summary>Settings of the resonance search (quasi-bound states).</summary>
    public ResonanceSearchOptions Resonances { get; }

    /// <summary>Creates options; every parameter left out takes its default.</summary>
    /// <param name="referenceMassElectronMasses">Positive and finite, m0; null for the well's mass.</param>
    /// <param name="includeQuasiBound">Also take quasi-bound final states.</param>
    /// <param name="quasiBoundUpperElectronVolts">Finite, eV; null for the default search range.</param>
    /// <param name="domainMarginNanometres">In (0, 10000] nm.</param>
    /// <param name="domainTolerance">In (0, 1).</param>
    /// <param name="boundStates">Bound-state search; null for levels refined to <see cref="DefaultLevelToleranceElectronVolts"/>.</param>
    /// <param name="resonances">Resonance search; null for <see cref="ResonanceSearchOptions.Default"/>.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static IntersubbandOptions Create(double? referenceMassElectronMasses = null, bool includeQuasiBound = false, double? quasiBoundUpperElectronVolts = null,
        double domainMarginNanometres = DefaultDomainMarginNanometres, double domainTolerance = DefaultDomainTolerance,
        BoundStateOptions? boundStates = null, ResonanceSearchOptions? resonances = null)
    {
        if (referenceMassElectronMasses is { } m && !(m > 0 && double.IsFinite(m)))
        {
            throw new ArgumentOutOfRangeException(nameof(referenceMassElectronMasses), m,
                $"referenceMassElectronMasses must be a positive finite mass in m0 (or null for the well's mass); got {Preconditions.Format(m)}.");
        }
        if (quasiBoundUpperElectronVolts is { } u && !double.IsFinite(u))
        {
            throw new ArgumentOutOfRangeException(nameof(quasiBoundUpperElectronVolts), u,
                $"quasiBoundUpperElectronVolts must be a finite energy in eV (or null); got {Preconditions.Format(u)}.");
        }
        if (!(domainMarginNanometres > 0 && domainMarginNanometres <= 1e4))
        {
            throw new ArgumentOutOfRangeException(nameof(domainMarginNanometres), domainMarginNanometres,
                $"domainMarginNanometres must lie in (0, 10000] nm; got {Preconditions.Format(domainMarginNanometres)}.");
        }
        if (!(domainTolerance > 0 && domainTolerance < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(domainTolerance), domainTolerance,
                $"domainTolerance must lie in (0, 1); got {Preconditions.Format(domainTolerance)}.");
        }
        return new IntersubbandOptions(referenceMassElectronMasses, includeQuasiBound, quasiBoundUpperElectronVolts, domainMarginNanometres, domainTolerance,
            boundStates ?? DefaultBoundStates, resonances ?? ResonanceSearchOptions.Default);
    }

    private static BoundStateOptions DefaultBoundStates => BoundStateOptions.Create(absoluteToleranceElectronVolts: DefaultLevelToleranceElectronVolts);

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"reference mass {(ReferenceMassElectronMasses is { } m ? $"{m:G4} m0" : "of the well")}, quasi-bound {(IncludeQuasiBound ? "included" : "excluded")}, margin {DomainMarginNanometres:G4} nm, domain tolerance {DomainTolerance:G3}");
}
