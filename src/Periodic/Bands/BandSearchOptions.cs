// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Bands;

/// <summary>
/// Tolerances of the band-edge and E(k) searches. Every default lives here; <see cref="Default"/>
/// reaches 1e-14 relative (or 1e-15 eV absolute near zero) on simple edges.
/// </summary>
/// <remarks>
/// When no options are passed, <see cref="BandStructure.Compute(Structures.UnitCell, int, BandSearchOptions?)"/> caps
/// the absolute tolerance at 1e-15 of the cell's natural energy scale (the larger of its potential spread
/// and ħ²(π/d)²/2m), so cells whose bands lie far below 1 eV — cold atoms in optical lattices, at ~1e-11 eV —
/// keep the same relative accuracy. <see cref="BandStructure.Options"/> shows the tolerances used.
/// </remarks>
public sealed class BandSearchOptions
{
    /// <summary>Default relative tolerance on an edge energy.</summary>
    public const double DefaultRelativeTolerance = 1e-14;

    /// <summary>Default absolute tolerance on an edge energy, eV.</summary>
    public const double DefaultAbsoluteToleranceElectronVolts = 1e-15;

    /// <summary>Default iteration budget of one root search.</summary>
    public const int DefaultMaxIterations = 300;

    private BandSearchOptions(double relative, double absolute, int maxIterations)
    {
        RelativeTolerance = relative;
        AbsoluteToleranceElectronVolts = absolute;
        MaxIterations = maxIterations;
    }

    /// <summary>The default options.</summary>
    public static BandSearchOptions Default { get; } = new(DefaultRelativeTolerance, DefaultAbsoluteToleranceElectronVolts, DefaultMaxIterations);

    /// <summary>Relative tolerance on an edge energy (stop when a step is below this times |E|).</summary>
    public double RelativeTolerance { get; }

    /// <summary>Absolute tolerance on an edge energy, eV (governs edges near E = 0).</summary>
    public double AbsoluteToleranceElectronVolts { get; }

    /// <summary>Iteration budget of one root search.</summary>
    public int MaxIterations { get; }

    /// <summary>Creates options.</summary>
    /// <param name="relativeTolerance">In [1e-16, 1e-2].</param>
    /// <param name="absoluteToleranceElectronVolts">In [1e-300, 1] eV; positive so that edges at E = 0 converge.</param>
    /// <param name="maxIterations">In [10, 100000].</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range.</exception>
    public static BandSearchOptions Create(double relativeTolerance = DefaultRelativeTolerance,
        double absoluteToleranceElectronVolts = DefaultAbsoluteToleranceElectronVolts, int maxIterations = DefaultMaxIterations) =>
        new(Preconditions.CheckRange(relativeTolerance, 1e-16, 1e-2),
            Preconditions.CheckRange(absoluteToleranceElectronVolts, 1e-300, 1.0),
            Preconditions.CheckRange(maxIterations, 10, 100000));

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"relative {RelativeTolerance:G3}, absolute {AbsoluteToleranceElectronVolts:G3} eV, max {MaxIterations} iterations");
}
