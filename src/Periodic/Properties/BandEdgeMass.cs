// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;

namespace Periodic.Properties;

/// <summary>Which edge of a band.</summary>
public enum BandEdge
{
    /// <summary>The lowest energy of the band.</summary>
    Bottom = 0,

    /// <summary>The highest energy of the band.</summary>
    Top = 1,
}

/// <summary>
/// The effective mass at one band edge, in units of m₀: positive at a bottom, negative at a top
/// (for an open gap), from the exact D′(E) at the edge.
/// </summary>
public readonly record struct BandEdgeMass
{
    internal BandEdgeMass(int bandIndex, BandEdge edge, ZonePoint zonePoint, double energy, double mass, bool closed)
    {
        BandIndex = bandIndex;
        Edge = edge;
        ZonePoint = zonePoint;
        EnergyElectronVolts = energy;
        ElectronMasses = mass;
        IsClosedGap = closed;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>Bottom or top.</summary>
    public BandEdge Edge { get; }

    /// <summary>The zone point of the edge.</summary>
    public ZonePoint ZonePoint { get; }

    /// <summary>The edge energy, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>
    /// The effective mass m*/m₀ = ħ²/(m₀ d²E/dk²) at the edge. At a closed gap (<see cref="IsClosedGap"/>)
    /// it is the curvature mass of the smooth crossing of the two bands, shared by both, which may take
    /// either sign; +∞ if that crossing is straight.
    /// </summary>
    public double ElectronMasses { get; }

    /// <summary>True when the gap on this side of the edge is closed (D′ = 0 at the edge).</summary>
    public bool IsClosedGap { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"band {BandIndex} {(Edge == BandEdge.Bottom ? "bottom" : "top")} ({(ZonePoint == ZonePoint.Center ? "zone centre" : "zone boundary")}, {EnergyElectronVolts:G10} eV): m* = {ElectronMasses:G10} m0{(IsClosedGap ? " (closed gap: crossing curvature)" : "")}");
}
