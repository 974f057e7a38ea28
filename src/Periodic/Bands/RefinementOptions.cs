// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Bands;

/// <summary>
/// Tolerance and budget of the step-halving refinement of <see cref="RefinedBandStructure.Compute"/>, validated when
/// created. Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class RefinementOptions
{
    /// <summary>Default relative tolerance of each band edge.</summary>
    public const double DefaultRelativeTolerance = 1e-11;

    /// <summary>Default largest number of step halvings.</summary>
    public const int DefaultMaxRefinements = 12;

    private RefinementOptions(double relativeTolerance, int maxRefinements)
    {
        RelativeTolerance = relativeTolerance;
        MaxRefinements = maxRefinements;
    }

    /// <summary>The defaults: 1e-11 relative, at most 12 step halvings.</summary>
    public static RefinementOptions Default { get; } = Create();

    /// <summary>Relative tolerance of each band edge (see <see cref="RefinedBandStructure"/> for the energy scale it is relative to).</summary>
    public double RelativeTolerance { get; }

    /// <summary>Largest number of step halvings.</summary>
    public int MaxRefinements { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="relativeTolerance">In [1e-14, 1e-2].</param>
    /// <param name="maxRefinements">Step halvings allowed, 1 to 30.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static RefinementOptions Create(double relativeTolerance = DefaultRelativeTolerance, int maxRefinements = DefaultMaxRefinements)
    {
        Preconditions.CheckRange(relativeTolerance, 1e-14, 1e-2);
        Preconditions.CheckRange(maxRefinements, 1, 30);
        return new RefinementOptions(relativeTolerance, maxRefinements);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"relative {RelativeTolerance:G3}, at most {MaxRefinements} halvings");
}
