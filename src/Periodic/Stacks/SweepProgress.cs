// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>Progress of a long energy sweep: how many of the points are done.</summary>
/// <param name="Completed">Points finished so far.</param>
/// <param name="Total">Points in the sweep.</param>
public readonly record struct SweepProgress(int Completed, int Total)
{
    /// <summary>The finished fraction in [0, 1].</summary>
    public double Fraction => Total == 0 ? 1.0 : (double)Completed / Total;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Completed}/{Total} ({Fraction:P0})");
}
