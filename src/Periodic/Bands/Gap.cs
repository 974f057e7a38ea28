// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Bands;

/// <summary>A forbidden gap (minigap) between band <see cref="Index"/> and band Index + 1; energies in eV.</summary>
public readonly record struct Gap
{
    internal Gap(int index, double lower, double upper, bool isClosed)
    {
        Index = index;
        LowerElectronVolts = lower;
        UpperElectronVolts = upper;
        IsClosed = isClosed;
    }

    /// <summary>Gap number n: the gap above band n.</summary>
    public int Index { get; }

    /// <summary>Lower edge (top of band n), eV.</summary>
    public double LowerElectronVolts { get; }

    /// <summary>Upper edge (bottom of band n + 1), eV.</summary>
    public double UpperElectronVolts { get; }

    /// <summary>Gap width, eV; 0 when the gap is closed.</summary>
    public double WidthElectronVolts => UpperElectronVolts - LowerElectronVolts;

    /// <summary>
    /// True when the two edges coincide within the edge tolerance of the search (a degenerate edge,
    /// as in a free particle or at special Kronig–Penney widths).
    /// </summary>
    public bool IsClosed { get; }

    /// <summary>Zone point of both edges: the boundary for odd gaps, the centre for even gaps.</summary>
    public ZonePoint ZonePoint => Index % 2 == 1 ? ZonePoint.Boundary : ZonePoint.Center;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Gap {Index}: {LowerElectronVolts:F6} .. {UpperElectronVolts:F6} eV (width {WidthElectronVolts * 1e3:G6} meV{(IsClosed ? ", closed" : "")})");
}
