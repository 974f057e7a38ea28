// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// A doped unit cell of an infinite superlattice: the rigid cell (the band-edge profile of the undoped structure), the
/// doping and permittivity of each element, and the temperature. Validated at construction; immutable.
/// </summary>
/// <remarks>
/// The self-consistent model (<see cref="SpaceChargeSolver"/>) takes parabolic uniform layers and delta barriers; the
/// carriers are electrons of the cell's single band, so the cell must hold more donors than acceptors (holes are not
/// modelled: a cell with N_A ≥ N_D has no electrons to neutralise it and is refused).
/// </remarks>
public sealed class DopedCell
{
    /// <summary>The lowest temperature accepted, K: below it k_BT is too small for the Fermi–Dirac quadrature over k.</summary>
    public const double MinTemperatureKelvin = 1;

    /// <summary>The highest temperature accepted, K.</summary>
    public const double MaxTemperatureKelvin = 1000;

    private DopedCell(UnitCell cell, LayerDoping[] doping, Temperature temperature, double netSheet)
    {
        Cell = cell;
        Doping = new ReadOnlyCollection<LayerDoping>(doping);
        Temperature = temperature;
        NetDonorsPerSquareNanometre = netSheet;
    }

    /// <summary>The rigid cell: the band-edge potential without space charge.</summary>
    public UnitCell Cell { get; }

    /// <summary>The doping of each element, in cell order.</summary>
    public IReadOnlyList<LayerDoping> Doping { get; }

    /// <summary>The temperature.</summary>
    public Temperature Temperature { get; }

    /// <summary>Net ionised donors per period and unit area, ∫(N_D − N_A)dz + sheets, nm⁻²: the electrons each period holds.</summary>
    public double NetDonorsPerSquareNanometre { get; }

    /// <summary>True when any element carries dopants.</summary>
    public bool IsDoped => Doping.Any(d => d.IsDoped);

    /// <summary>Creates a doped cell.</summary>
    /// <param name="cell">A cell of parabolic uniform layers and delta barriers.</param>
    /// <param name="doping">One entry per element of <paramref name="cell"/>; delta barriers must be undoped.</param>
    /// <param name="temperature">T in [1, 1000] K.</param>
    /// <exception cref="ArgumentNullException">An argument or an entry is null.</exception>
    /// <exception cref="ArgumentException">The counts differ, an element is of another kind or non-parabolic, a delta barrier is
    /// doped, or the cell holds no more donors than acceptors (the message names the parameter and the value).</exception>
    /// <exception cref="ArgumentOutOfRangeException">The temperature lies outside its range.</exception>
    public static DopedCell Create(UnitCell cell, IReadOnlyList<LayerDoping> doping, Temperature temperature)
    {
        ArgumentNullException.ThrowIfNull(cell);
        ArgumentNullException.ThrowIfNull(doping);
        Preconditions.CheckRange(temperature.Kelvin, MinTemperatureKelvin, MaxTemperatureKelvin, nameof(temperature));
        var elements = cell.Elements;
        if (doping.Count != elements.Count)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"doping must hold one entry per cell element ({elements.Count}); got {doping.Count}."), nameof(doping));
        }
        var copy = new LayerDoping[doping.Count];
        double net = 0;
        for (var i = 0; i < copy.Length; i++)
        {
            copy[i] = doping[i] ?? throw new ArgumentNullException(nameof(doping), string.Create(CultureInfo.InvariantCulture, $"doping[{i}] is null."));
            switch (elements[i])
            {
                case Layer layer when layer.NonParabolicityPerElectronVolt == 0:
                    net += copy[i].NetVolumePerCubicNanometre * layer.Width.Nanometres + copy[i].SheetPerSquareNanometre;
                    break;
                case Layer layer:
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"cell element {i} is a non-parabolic layer (alpha = {layer.NonParabolicityPerElectronVolt:R} /eV); the space-charge model takes parabolic layers only."), nameof(cell));
                case DeltaBarrier when copy[i].IsDoped:
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"doping[{i}] belongs to a delta barrier, which has no width and cannot be doped; got {copy[i]}."), nameof(doping));
                case DeltaBarrier:
                    break;
                default:
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"cell element {i} is a {elements[i].GetType().Name}; the space-charge model takes uniform layers and delta barriers only."), nameof(cell));
            }
        }
        if (!(net > 0))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"doping must hold more donors than acceptors per period (electrons are the only mobile carriers; holes are not modelled); net donors per period = {net * 1e14:R} /cm2."), nameof(doping));
        }
        return new DopedCell(cell, copy, temperature, net);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Doped cell: {Cell.Elements.Count} element(s), period {Cell.Period.Nanometres:G6} nm, net donors {NetDonorsPerSquareNanometre * 1e14:G6} /cm2 per period, T = {Temperature}");
}
