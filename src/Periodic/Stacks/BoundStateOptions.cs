// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>
/// Tolerances and limits of the bound-state search (<see cref="BoundStateSpectrum.Find(LayerStack, BoundStateOptions?)"/>), validated when created.
/// Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class BoundStateOptions
{
    /// <summary>Default absolute tolerance of each level energy, eV.</summary>
    public const double DefaultAbsoluteToleranceElectronVolts = 1e-12;

    /// <summary>Default relative tolerance of each level energy (a few units of double rounding).</summary>
    public const double DefaultRelativeTolerance = 4e-16;

    /// <summary>Default largest number of levels returned.</summary>
    public const int DefaultMaxLevels = 10_000;

    /// <summary>Default largest stack, in written-out elements, that the search accepts.</summary>
    public const long DefaultMaxElements = 10_000_000;

    private BoundStateOptions(double absoluteToleranceElectronVolts, double relativeTolerance, int maxLevels, long maxElements)
    {
        AbsoluteToleranceElectronVolts = absoluteToleranceElectronVolts;
        RelativeTolerance = relativeTolerance;
        MaxLevels = maxLevels;
        MaxElements = maxElements;
    }

    /// <summary>The defaults: 1e-12 eV absolute, 4e-16 relative, at most 10,000 levels and 10,000,000 written-out elements.</summary>
    public static BoundStateOptions Default { get; } = Create();

    /// <summary>Absolute tolerance of each level energy, eV.</summary>
    public double AbsoluteToleranceElectronVolts { get; }

    /// <summary>Relative tolerance of each level energy.</summary>
    public double RelativeTolerance { get; }

    /// <summary>Most levels returned (the lowest ones); the total count is always reported.</summary>
    public int MaxLevels { get; }

    /// <summary>Largest stack, in elements with every repeated cell written out, that the search accepts.</summary>
    public long MaxElements { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="absoluteToleranceElectronVolts">In [1e-300, 1] eV.</param>
    /// <param name="relativeTolerance">In [0, 0.1].</param>
    /// <param name="maxLevels">At least 1.</param>
    /// <param name="maxElements">At least 1.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static BoundStateOptions Create(double absoluteToleranceElectronVolts = DefaultAbsoluteToleranceElectronVolts,
        double relativeTolerance = DefaultRelativeTolerance, int maxLevels = DefaultMaxLevels, long maxElements = DefaultMaxElements)
    {
        Preconditions.CheckRange(absoluteToleranceElectronVolts, 1e-300, 1.0);
        Preconditions.CheckRange(relativeTolerance, 0.0, 0.1);
        Preconditions.CheckRange(maxLevels, 1, int.MaxValue);
        if (maxElements < 1)
        {
            throw new ArgumentOutOfRangeException(nameof(maxElements), maxElements,
                string.Create(CultureInfo.InvariantCulture, $"maxElements must be at least 1; got {maxElements}."));
        }
        return new BoundStateOptions(absoluteToleranceElectronVolts, relativeTolerance, maxLevels, maxElements);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"absolute {AbsoluteToleranceElectronVolts:G3} eV, relative {RelativeTolerance:G3}, max {MaxLevels} levels, max {MaxElements} elements");
}
