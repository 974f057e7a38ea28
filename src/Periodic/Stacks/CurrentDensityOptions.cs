// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>
/// Tolerances and budget of the Tsu–Esaki current integration (<see cref="StackTransmission.CurrentDensity"/>),
/// validated when created. Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class CurrentDensityOptions
{
    /// <summary>Default target relative error of the current density.</summary>
    public const double DefaultRelativeTolerance = 1e-6;

    /// <summary>Default budget of transmission evaluations for the quadrature.</summary>
    public const int DefaultMaxEvaluations = 200_000;

    private CurrentDensityOptions(double relativeTolerance, int maxEvaluations, bool useResonanceBreakpoints, ResonanceSearchOptions resonanceSearch)
    {
        RelativeTolerance = relativeTolerance;
        MaxEvaluations = maxEvaluations;
        UseResonanceBreakpoints = useResonanceBreakpoints;
        ResonanceSearch = resonanceSearch;
    }

    /// <summary>The defaults: relative tolerance 1e-6, 200,000 transmission evaluations at most, resonance breakpoints on.</summary>
    public static CurrentDensityOptions Default { get; } = Create();

    /// <summary>Target relative error of the current density (the estimate must fall below it times |J|).</summary>
    public double RelativeTolerance { get; }

    /// <summary>Budget of transmission evaluations for the quadrature (the resonance search has its own, <see cref="ResonanceSearch"/>).</summary>
    public int MaxEvaluations { get; }

    /// <summary>
    /// Whether the transmission peaks (<see cref="StackTransmission.FindResonances"/>) are located first and used as
    /// breakpoints of the quadrature. On by default: a peak far narrower than the energy window could otherwise be
    /// missed by every quadrature node.
    /// </summary>
    public bool UseResonanceBreakpoints { get; }

    /// <summary>Options of the resonance search used for the breakpoints.</summary>
    public ResonanceSearchOptions ResonanceSearch { get; }

    /// <summary>Creates options; every parameter left out takes its default.</summary>
    /// <param name="relativeTolerance">Between 1e-12 and 0.1.</param>
    /// <param name="maxEvaluations">At least 15 (one Gauss–Kronrod rule).</param>
    /// <param name="useResonanceBreakpoints">Whether transmission peaks become quadrature breakpoints (default on).</param>
    /// <param name="resonanceSearch">Options of that search; null: <see cref="ResonanceSearchOptions.Default"/>.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static CurrentDensityOptions Create(double relativeTolerance = DefaultRelativeTolerance, int maxEvaluations = DefaultMaxEvaluations,
        bool useResonanceBreakpoints = true, ResonanceSearchOptions? resonanceSearch = null) =>
        new(Preconditions.CheckRange(relativeTolerance, 1e-12, 0.1),
            Preconditions.CheckRange(maxEvaluations, 15, int.MaxValue),
            useResonanceBreakpoints,
            resonanceSearch ?? ResonanceSearchOptions.Default);

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"relative {RelativeTolerance:G3}, max {MaxEvaluations} evaluations, resonance breakpoints {(UseResonanceBreakpoints ? "on" : "off")}");
}
