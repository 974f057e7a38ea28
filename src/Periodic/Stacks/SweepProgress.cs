// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>Progress of a long energy sweep: how many of the points are done.</summary>
/// <param name="Completed">Points finished so far.</param>
/// <param name="Total">Points in the sweep.</param>
/// <exception cref="ArgumentOutOfRangeException">Total is negative, or Completed is outside 0 to Total.</exception>
public readonly record struct SweepProgress(int Completed, int Total)
{
    /// <summary>Points finished so far, 0 to <see cref="Total"/>.</summary>
    public int Completed { get; } = Completed >= 0 && (Total < 0 || Completed <= Total) ? Completed
        : throw new ArgumentOutOfRangeException(nameof(Completed), Completed,
            string.Create(CultureInfo.InvariantCulture, $"Completed must be between 0 and Total = {Total}; got {Completed}."));

    /// <summary>Points in the sweep, zero or more.</summary>
    public int Total { get; } = Total >= 0 ? Total
        : throw new ArgumentOutOfRangeException(nameof(Total), Total,
            string.Create(CultureInfo.InvariantCulture, $"Total must be zero or positive; got {Total}."));

    /// <summary>The finished fraction in [0, 1].</summary>
    public double Fraction => Total == 0 ? 1.0 : (double)Completed / Total;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Completed}/{Total} ({Fraction:P0})");
}
