// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;

namespace Periodic.SpaceCharge;

/// <summary>
/// The grid of one space-charge domain: nodes x₀ = 0 &lt; x₁ &lt; … &lt; x_N, every layer split into an even number (at least
/// 4) of equal intervals no wider than the spacing asked for, so each interface and each layer's middle (where its donor sheet
/// sits) is a node. Periodic (one cell: x_N is x₀ of the next period, N unknowns) or closed (a finite domain: N + 1 unknowns,
/// no flux through its two ends). Holds the finite-volume data of Poisson's equation: interval permittivities, node control
/// volumes, the couplings between neighbouring nodes and the fixed charge of each control volume.
/// </summary>
internal sealed class SpaceChargeGrid
{
    /// <param name="elements">The domain's elements.</param>
    /// <param name="dopings">One per element.</param>
    /// <param name="periodic">A cell (true) or a closed domain.</param>
    /// <param name="maxSpacing">Largest spacing, nm.</param>
    /// <param name="length">The domain's length, nm.</param>
    /// <param name="valenceEdges">Per element, the rigid valence-band edge on the electron energy scale, eV (where holes are
    /// modelled: the acceptor level of an incompletely ionised layer lies its ionisation energy above it); null otherwise.</param>
    internal SpaceChargeGrid(IReadOnlyList<CellElement> elements, IReadOnlyList<LayerDoping> dopings, bool periodic, double maxSpacing, double length,
        IReadOnlyList<double>? valenceEdges = null)
    {
        Periodic = periodic;
        var intervalsPerElement = new int[elements.Count];
        long total = 0;
        for (var e = 0; e < elements.Count; e++)
        {
            if (elements[e] is Layer layer)
            {
                var m = Math.Max(4, (int)Math.Ceiling(layer.Width.Nanometres / maxSpacing - 1e-9));
                intervalsPerElement[e] = m + (m & 1);
                total += intervalsPerElement[e];
            }
        }
        var points = periodic ? total : total + 1;
        if (points > SpaceChargeOptions.MaxGridPoints)
        {
            throw new ArgumentOutOfRangeException("options", points, string.Create(CultureInfo.InvariantCulture,
                $"the {(periodic ? "cell of period" : "domain of length")} {length:R} nm needs {points} grid points at a spacing of {maxSpacing:R} nm; at most {SpaceChargeOptions.MaxGridPoints} are allowed (time and memory per iteration grow with them): choose a larger MaxGridSpacingNanometres."));
        }
        var intervals = (int)total;
        Intervals = intervals;
        var n = periodic ? intervals : intervals + 1;
        Count = n;
        Positions = new double[intervals + 1];
        Widths = new double[intervals];
        Permittivity = new double[intervals];
        InverseMass = new double[intervals];
        NetDoping = new double[intervals];
        PartialDonors = new double[intervals];
        PartialLevel = new double[intervals];
        PartialAcceptors = new double[intervals];
        PartialAcceptorLevel = new double[intervals];
        Volume = new double[n];
        FixedCharge = new double[n];
        SheetPartial = new double[n];
        SheetLevel = new double[n];
        HalfBefore = new double[n];
        HalfAfter = new double[n];
        IntervalBefore = new int[n];
        IntervalAfter = new int[n];
        NodeBefore = new int[n];
        NodeAfter = new int[n];
        CouplingBefore = new double[n];
        CouplingAfter = new double[n];
        ElementStart = new int[elements.Count];
        ElementEnd = new int[elements.Count];
        var node = 0;
        var x = 0.0;
        for (var e = 0; e < elements.Count; e++)
        {
            ElementStart[e] = node;
            if (elements[e] is Layer layer)
            {
                var m = intervalsPerElement[e];
                var h = layer.Width.Nanometres / m;
                var doping = dopings[e];
                var partial = doping.DonorIonisationEnergyElectronVolts;
                var partialAcceptor = doping.AcceptorIonisationEnergyElectronVolts;
                if (partialAcceptor is not null && valenceEdges is null)
                {
                    throw new InvalidOperationException("an acceptor level needs the valence-band edge (validated by DopedCell)");
                }
                for (var j = 0; j < m; j++)
                {
                    Positions[node + j] = x + layer.Width.Nanometres * j / m;
                    Widths[node + j] = h;
                    Permittivity[node + j] = doping.RelativePermittivity;
                    InverseMass[node + j] = 1 / layer.Mass.ElectronMasses;
                    NetDoping[node + j] = partial is null && partialAcceptor is null ? doping.NetVolumePerCubicNanometre
                        : (partial is null ? doping.DonorsPerCubicNanometre : 0) - (partialAcceptor is null ? doping.AcceptorsPerCubicNanometre : 0);
                    if (partial is { } binding)
                    {
                        PartialDonors[node + j] = doping.DonorsPerCubicNanometre;
                        PartialLevel[node + j] = layer.Potential.ElectronVolts - binding;
                    }
                    if (partialAcceptor is { } acceptorBinding)
                    {
                        PartialAcceptors[node + j] = doping.AcceptorsPerCubicNanometre;
                        PartialAcceptorLevel[node + j] = valenceEdges![e] + acceptorBinding;
                    }
                }
                if (partial is { } sheetBinding)
                {
                    SheetPartial[node + m / 2] += doping.SheetPerSquareNanometre;
                    SheetLevel[node + m / 2] = layer.Potential.ElectronVolts - sheetBinding;
                    HasPartialIonisation = true;
                }
                else
                {
                    FixedCharge[node + m / 2] += doping.SheetPerSquareNanometre;
                }
                HasPartialIonisation |= partial is not null || partialAcceptor is not null;
                node += m;
                x += layer.Width.Nanometres;
            }
            ElementEnd[e] = node;
        }
        Positions[intervals] = length;
        for (var i = 0; i < intervals; i++)
        {
            Widths[i] = Positions[i + 1] - Positions[i];
        }
        for (var i = 0; i < n; i++)
        {
            // Periodic: node 0's left interval is the last one. Closed: the end nodes have only their inner half-interval.
            var hasBefore = periodic || i > 0;
            var hasAfter = periodic || i < intervals;
            IntervalBefore[i] = hasBefore ? (i == 0 ? intervals - 1 : i - 1) : 0;
            IntervalAfter[i] = hasAfter ? i : intervals - 1;
            NodeBefore[i] = hasBefore ? (i == 0 ? n - 1 : i - 1) : i;
            NodeAfter[i] = hasAfter ? (i == n - 1 ? 0 : i + 1) : i;
            HalfBefore[i] = hasBefore ? 0.5 * Widths[IntervalBefore[i]] : 0;
            HalfAfter[i] = hasAfter ? 0.5 * Widths[IntervalAfter[i]] : 0;
            CouplingBefore[i] = hasBefore ? Permittivity[IntervalBefore[i]] / Widths[IntervalBefore[i]] : 0;
            CouplingAfter[i] = hasAfter ? Permittivity[IntervalAfter[i]] / Widths[IntervalAfter[i]] : 0;
            Volume[i] = HalfBefore[i] + HalfAfter[i];
            FixedCharge[i] += HalfBefore[i] * NetDoping[IntervalBefore[i]] + HalfAfter[i] * NetDoping[IntervalAfter[i]];
        }
    }

    /// <summary>True for one cell of a superlattice (periodic), false for a closed finite domain.</summary>
    internal bool Periodic { get; }

    /// <summary>Unknowns: N for a periodic cell, N + 1 for a closed domain.</summary>
    internal int Count { get; }

    /// <summary>Intervals N.</summary>
    internal int Intervals { get; }

    /// <summary>x₀ … x_N, nm (N + 1 values).</summary>
    internal double[] Positions { get; }

    /// <summary>Width of interval i = [x_i, x_{i+1}], nm.</summary>
    internal double[] Widths { get; }

    /// <summary>Relative permittivity of interval i.</summary>
    internal double[] Permittivity { get; }

    /// <summary>1/m of interval i, 1/m₀.</summary>
    internal double[] InverseMass { get; }

    /// <summary>N_D − N_A of interval i, nm⁻³.</summary>
    internal double[] NetDoping { get; }

    /// <summary>Control volume of node i (half of each neighbouring interval), nm.</summary>
    internal double[] Volume { get; }

    /// <summary>Half the width of the interval before node i, nm (0 at a closed domain's left end).</summary>
    internal double[] HalfBefore { get; }

    /// <summary>Half the width of the interval after node i, nm (0 at a closed domain's right end).</summary>
    internal double[] HalfAfter { get; }

    /// <summary>The interval before node i (any valid index where <see cref="HalfBefore"/> is 0).</summary>
    internal int[] IntervalBefore { get; }

    /// <summary>The interval after node i (any valid index where <see cref="HalfAfter"/> is 0).</summary>
    internal int[] IntervalAfter { get; }

    /// <summary>The neighbouring node before node i (itself where there is none).</summary>
    internal int[] NodeBefore { get; }

    /// <summary>The neighbouring node after node i (itself where there is none).</summary>
    internal int[] NodeAfter { get; }

    /// <summary>ε_r/h of the interval before node i, 1/nm (0 where there is none: no flux through a closed end).</summary>
    internal double[] CouplingBefore { get; }

    /// <summary>ε_r/h of the interval after node i, 1/nm (0 where there is none).</summary>
    internal double[] CouplingAfter { get; }

    /// <summary>Fixed (dopant) charge of the control volume of node i, elementary charges per nm².</summary>
    internal double[] FixedCharge { get; }

    /// <summary>Donors of interval i that ionise incompletely, nm⁻³ (zero where donors are fully ionised: they are in <see cref="FixedCharge"/>).</summary>
    internal double[] PartialDonors { get; }

    /// <summary>Rigid donor level of interval i (band edge minus ionisation energy), eV; the Hartree energy adds to it.</summary>
    internal double[] PartialLevel { get; }

    /// <summary>Acceptors of interval i that ionise incompletely, nm⁻³ (zero where acceptors are fully ionised).</summary>
    internal double[] PartialAcceptors { get; }

    /// <summary>Rigid acceptor level of interval i (valence-band edge plus ionisation energy, electron scale), eV; the Hartree energy adds to it.</summary>
    internal double[] PartialAcceptorLevel { get; }

    /// <summary>1/m of each interval for another band of the same elements (a valence band's hole masses), 1/m₀.</summary>
    internal double[] InverseMassOf(IReadOnlyList<CellElement> elements)
    {
        var result = new double[Intervals];
        for (var e = 0; e < elements.Count; e++)
        {
            if (elements[e] is Layer layer)
            {
                for (var i = ElementStart[e]; i < ElementEnd[e]; i++)
                {
                    result[i] = 1 / layer.Mass.ElectronMasses;
                }
            }
        }
        return result;
    }

    /// <summary>Sheet donors at node i that ionise incompletely, nm⁻².</summary>
    internal double[] SheetPartial { get; }

    /// <summary>Rigid donor level of the sheet at node i, eV.</summary>
    internal double[] SheetLevel { get; }

    /// <summary>True when some donors or acceptors ionise incompletely.</summary>
    internal bool HasPartialIonisation { get; }

    /// <summary>First node of element e (its left interface).</summary>
    internal int[] ElementStart { get; }

    /// <summary>Node of element e's right interface (= start for a delta barrier).</summary>
    internal int[] ElementEnd { get; }
}
