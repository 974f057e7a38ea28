// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>Tolerances and limits of the bound-state search (<see cref="BoundStateSpectrum.Find"/>). Defaults live in <see cref="Default"/>.</summary>
public sealed record BoundStateOptions
{
    /// <summary>The defaults: 1e-12 eV absolute, 4e-16 relative, at most 10,000 levels and 10,000,000 written-out elements.</summary>
    public static BoundStateOptions Default { get; } = new();

    /// <summary>Absolute tolerance of each level energy, eV.</summary>
    public double AbsoluteToleranceElectronVolts { get; init; } = 1e-12;

    /// <summary>Relative tolerance of each level energy.</summary>
    public double RelativeTolerance { get; init; } = 4e-16;

    /// <summary>Most levels returned (the lowest ones); the total count is always reported.</summary>
    public int MaxLevels { get; init; } = 10_000;

    /// <summary>Largest stack, in elements with every repeated cell written out, that the search accepts.</summary>
    public long MaxElements { get; init; } = 10_000_000;

    internal void Validate(string paramName)
    {
        if (!(AbsoluteToleranceElectronVolts > 0) || !double.IsFinite(AbsoluteToleranceElectronVolts))
        {
            throw new ArgumentOutOfRangeException(paramName, AbsoluteToleranceElectronVolts,
                $"{paramName}.AbsoluteToleranceElectronVolts must be positive and finite; got {Preconditions.Format(AbsoluteToleranceElectronVolts)}.");
        }
        if (!(RelativeTolerance >= 0 && RelativeTolerance < 1))
        {
            throw new ArgumentOutOfRangeException(paramName, RelativeTolerance,
                $"{paramName}.RelativeTolerance must lie in [0, 1); got {Preconditions.Format(RelativeTolerance)}.");
        }
        if (MaxLevels < 1)
        {
            throw new ArgumentOutOfRangeException(paramName, MaxLevels,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.MaxLevels must be at least 1; got {MaxLevels}."));
        }
        if (MaxElements < 1)
        {
            throw new ArgumentOutOfRangeException(paramName, MaxElements,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.MaxElements must be at least 1; got {MaxElements}."));
        }
    }
}
