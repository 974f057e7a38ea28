// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;

namespace Periodic.SpaceCharge;

/// <summary>
/// The periodic grid of one doped cell: nodes x₀ = 0 &lt; x₁ &lt; … &lt; x_N = d (x_N is x₀ of the next period), every
/// layer split into an even number (at least 4) of equal intervals no wider than the spacing asked for, so each
/// interface and each layer's middle (where its donor sheet sits) is a node. Holds the finite-volume data of
/// Poisson's equation: interval permittivities, node control volumes and the fixed charge of each control volume.
/// </summary>
internal sealed class SpaceChargeGrid
{
    internal SpaceChargeGrid(DopedCell doped, double maxSpacing)
    {
        var elements = doped.Cell.Elements;
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
        if (total > SpaceChargeOptions.MaxGridPoints)
        {
            throw new ArgumentOutOfRangeException("options", total, string.Create(CultureInfo.InvariantCulture,
                $"the cell of period {doped.Cell.Period.Nanometres:R} nm needs {total} grid points at a spacing of {maxSpacing:R} nm; at most {SpaceChargeOptions.MaxGridPoints} are allowed (time and memory per iteration grow with them): choose a larger MaxGridSpacingNanometres."));
        }
        var n = (int)total;
        Count = n;
        Positions = new double[n + 1];
        Widths = new double[n];
        Permittivity = new double[n];
        InverseMass = new double[n];
        NetDoping = new double[n];
        Volume = new double[n];
        FixedCharge = new double[n];
        PartialDonors = new double[n];
        PartialLevel = new double[n];
        SheetPartial = new double[n];
        SheetLevel = new double[n];
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
                var doping = doped.Doping[e];
                var partial = doping.DonorIonisationEnergyElectronVolts;
                for (var j = 0; j < m; j++)
                {
                    Positions[node + j] = x + layer.Width.Nanometres * j / m;
                    Widths[node + j] = h;
                    Permittivity[node + j] = doping.RelativePermittivity;
                    InverseMass[node + j] = 1 / layer.Mass.ElectronMasses;
                    NetDoping[node + j] = partial is null ? doping.NetVolumePerCubicNanometre : -doping.AcceptorsPerCubicNanometre;
                    if (partial is { } binding)
                    {
                        PartialDonors[node + j] = doping.DonorsPerCubicNanometre;
                        PartialLevel[node + j] = layer.Potential.ElectronVolts - binding;
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
                HasPartialIonisation |= partial is not null;
                node += m;
                x += layer.Width.Nanometres;
            }
            ElementEnd[e] = node;
        }
        Positions[n] = doped.Cell.Period.Nanometres;
        for (var i = 0; i < n; i++)
        {
            Widths[i] = Positions[i + 1] - Positions[i];
        }
        for (var i = 0; i < n; i++)
        {
            var before = i == 0 ? n - 1 : i - 1;
            Volume[i] = 0.5 * (Widths[before] + Widths[i]);
            FixedCharge[i] += 0.5 * (Widths[before] * NetDoping[before] + Widths[i] * NetDoping[i]);
        }
    }

    /// <summary>Nodes per period N (unknowns of the periodic problem).</summary>
    internal int Count { get; }

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

    /// <summary>Fixed (dopant) charge of the control volume of node i, elementary charges per nm².</summary>
    internal double[] FixedCharge { get; }

    /// <summary>Donors of interval i that ionise incompletely, nm⁻³ (zero where donors are fully ionised: they are in <see cref="FixedCharge"/>).</summary>
    internal double[] PartialDonors { get; }

    /// <summary>Rigid donor level of interval i (band edge minus ionisation energy), eV; the Hartree energy adds to it.</summary>
    internal double[] PartialLevel { get; }

    /// <summary>Sheet donors at node i that ionise incompletely, nm⁻².</summary>
    internal double[] SheetPartial { get; }

    /// <summary>Rigid donor level of the sheet at node i, eV.</summary>
    internal double[] SheetLevel { get; }

    /// <summary>True when some donors ionise incompletely.</summary>
    internal bool HasPartialIonisation { get; }

    /// <summary>First node of element e (its left interface).</summary>
    internal int[] ElementStart { get; }

    /// <summary>Node of element e's right interface (= start for a delta barrier).</summary>
    internal int[] ElementEnd { get; }
}
