// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Bands;

/// <summary>
/// One allowed band (miniband) of the infinite periodic structure: energies in eV, with the
/// zone point of each edge and the accuracy the edge search reached.
/// </summary>
public readonly record struct Band
{
    internal Band(int index, double bottom, double top, double bottomError, double topError, double gapAbove)
    {
        Index = index;
        BottomElectronVolts = bottom;
        TopElectronVolts = top;
        BottomErrorElectronVolts = bottomError;
        TopErrorElectronVolts = topError;
        GapAboveElectronVolts = gapAbove;
    }

    /// <summary>Band number, from 1 for the lowest band.</summary>
    public int Index { get; }

    /// <summary>Lowest energy of the band, eV.</summary>
    public double BottomElectronVolts { get; }

    /// <summary>Highest energy of the band, eV.</summary>
    public double TopElectronVolts { get; }

    /// <summary>Band width top − bottom, eV.</summary>
    public double WidthElectronVolts => TopElectronVolts - BottomElectronVolts;

    /// <summary>Energy midway between the edges, eV.</summary>
    public double CenterElectronVolts => 0.5 * (BottomElectronVolts + TopElectronVolts);

    /// <summary>Zone point of the bottom edge: the centre for odd bands, the boundary for even bands.</summary>
    public ZonePoint BottomZonePoint => Index % 2 == 1 ? ZonePoint.Center : ZonePoint.Boundary;

    /// <summary>Zone point of the top edge: the boundary for odd bands, the centre for even bands.</summary>
    public ZonePoint TopZonePoint => Index % 2 == 1 ? ZonePoint.Boundary : ZonePoint.Center;

    /// <summary>Bound on the error of <see cref="BottomElectronVolts"/> reached by the edge search, eV.</summary>
    public double BottomErrorElectronVolts { get; }

    /// <summary>Bound on the error of <see cref="TopElectronVolts"/> reached by the edge search, eV.</summary>
    public double TopErrorElectronVolts { get; }

    /// <summary>Width of the gap to band Index + 1, eV (0 for a closed gap). Known for every band returned: the search also locates the bottom of the next band.</summary>
    public double GapAboveElectronVolts { get; }

    /// <summary>True when <paramref name="energyElectronVolts"/> lies within the band (edges included).</summary>
    public bool Contains(double energyElectronVolts) =>
        energyElectronVolts >= BottomElectronVolts && energyElectronVolts <= TopElectronVolts;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Band {Index}: {BottomElectronVolts:F6} .. {TopElectronVolts:F6} eV (width {WidthElectronVolts * 1e3:G6} meV)");
}
