// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>
/// Tolerances and budget of the Tsu–Esaki current integration (<see cref="StackTransmission.CurrentDensity"/>).
/// Defaults live in <see cref="Default"/>.
/// </summary>
public sealed record CurrentDensityOptions
{
    /// <summary>The defaults: relative tolerance 1e-6, 200,000 transmission evaluations at most, resonance breakpoints on.</summary>
    public static CurrentDensityOptions Default { get; } = new();

    /// <summary>Target relative error of the current density (the estimate must fall below it times |J|); between 1e-12 and 0.1.</summary>
    public double RelativeTolerance { get; init; } = 1e-6;

    /// <summary>Budget of transmission evaluations for the quadrature (the resonance search has its own, <see cref="ResonanceSearch"/>).</summary>
    public int MaxEvaluations { get; init; } = 200_000;

    /// <summary>
    /// Whether the transmission peaks (<see cref="StackTransmission.FindResonances"/>) are located first and used as
    /// breakpoints of the quadrature. On by default: a peak far narrower than the energy window could otherwise be
    /// missed by every quadrature node.
    /// </summary>
    public bool UseResonanceBreakpoints { get; init; } = true;

    /// <summary>Options of the resonance search used for the breakpoints.</summary>
    public ResonanceSearchOptions ResonanceSearch { get; init; } = ResonanceSearchOptions.Default;

    internal void Validate(string paramName)
    {
        if (!(RelativeTolerance >= 1e-12 && RelativeTolerance <= 0.1))
        {
            throw new ArgumentOutOfRangeException(paramName, RelativeTolerance,
                $"{paramName}.RelativeTolerance must be between 1E-12 and 0.1; got {Preconditions.Format(RelativeTolerance)}.");
        }
        if (MaxEvaluations < 15)
        {
            throw new ArgumentOutOfRangeException(paramName, MaxEvaluations,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.MaxEvaluations must be at least 15 (one Gauss-Kronrod rule); got {MaxEvaluations}."));
        }
        if (ResonanceSearch is null)
        {
            throw new ArgumentNullException(paramName, $"{paramName}.ResonanceSearch is null.");
        }
        ResonanceSearch.Validate(paramName);
    }
}
