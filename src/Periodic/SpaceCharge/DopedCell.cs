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
/// The self-consistent model (<see cref="SpaceChargeSolver"/>) takes parabolic uniform layers and delta barriers. The
/// carriers are electrons of the cell's band and, where the cell is given valence bands (<see cref="ValenceBands"/>), holes
/// of each; without a valence band the cell must hold more donors than acceptors (a cell with N_A ≥ N_D has no electrons to
/// neutralise it and is refused) and acceptors cannot have a level.
/// </remarks>
public sealed class DopedCell
{
    /// <summary>The lowest temperature accepted, K: below it k_BT is too small for the Fermi–Dirac quadrature over k.</summary>
    public const double MinTemperatureKelvin = 1;

    /// <summary>The highest temperature accepted, K.</summary>
    public const double MaxTemperatureKelvin = 1000;

    private DopedCell(UnitCell cell, LayerDoping[] doping, Temperature temperature, double netSheet, ValenceBand[] valenceBands)
    {
        ValenceBands = new ReadOnlyCollection<ValenceBand>(valenceBands);
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

    /// <summary>Net donors per period and unit area, ∫(N_D − N_A)dz + sheets, nm⁻² (full ionisation): electrons minus holes of each period.</summary>
    public double NetDonorsPerSquareNanometre { get; }

    /// <summary>The valence bands whose holes are carriers (empty: electrons only).</summary>
    public IReadOnlyList<ValenceBand> ValenceBands { get; }

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
    public static DopedCell Create(UnitCell cell, IReadOnlyList<LayerDoping> doping, Temperature temperature) => Create(cell, doping, temperature, []);

    /// <summary>Creates a doped cell whose holes in <paramref name="valenceBands"/> are carriers beside its electrons.</summary>
    /// <param name="cell">A cell of parabolic uniform layers and delta barriers: the conduction band.</param>
    /// <param name="doping">One entry per element of <paramref name="cell"/>; delta barriers must be undoped.</param>
    /// <param name="temperature">T in [1, 1000] K.</param>
    /// <param name="valenceBands">The valence bands (e.g. heavy and light holes), each with a hole cell of parabolic uniform layers of the
    /// same widths as <paramref name="cell"/>'s, element by element, and no delta barriers; the first one's edges place the acceptor
    /// levels. Empty: electrons only, as <see cref="Create(UnitCell, IReadOnlyList{LayerDoping}, Temperature)"/>.</param>
    /// <exception cref="ArgumentNullException">An argument or an entry is null.</exception>
    /// <exception cref="ArgumentException">The counts differ, an element is of another kind or non-parabolic, a delta barrier is
    /// doped, a hole cell does not match the cell, or (without valence bands) the cell holds no more donors than acceptors or gives
    /// an acceptor level (the message names the parameter and the value).</exception>
    /// <exception cref="ArgumentOutOfRangeException">The temperature lies outside its range.</exception>
    public static DopedCell Create(UnitCell cell, IReadOnlyList<LayerDoping> doping, Temperature temperature, IReadOnlyList<ValenceBand> valenceBands)
    {
        ArgumentNullException.ThrowIfNull(valenceBands);
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
        var bands = new ValenceBand[valenceBands.Count];
        for (var b = 0; b < bands.Length; b++)
        {
            bands[b] = valenceBands[b] ?? throw new ArgumentNullException(nameof(valenceBands), string.Create(CultureInfo.InvariantCulture, $"valenceBands[{b}] is null."));
            CheckHoleCell(cell, bands[b], b);
        }
        if (bands.Length == 0 && Array.FindIndex(copy, d => d.AcceptorIonisationEnergyElectronVolts is not null) is var withLevel and >= 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"doping[{withLevel}] gives an acceptor level, which lies above the valence-band edge: the cell needs a valence band (valenceBands) for it."), nameof(doping));
        }
        if (bands.Length == 0 && !(net > 0))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"doping must hold more donors than acceptors per period (without valence bands electrons are the only mobile carriers and holes are not modelled: give valenceBands for a p-type or compensated cell); net donors per period = {net * 1e14:R} /cm2."), nameof(doping));
        }
        return new DopedCell(cell, copy, temperature, net, bands);
    }

    private static void CheckHoleCell(UnitCell cell, ValenceBand band, int index)
    {
        var holes = band.Cell.Elements;
        var elements = cell.Elements;
        if (holes.Count != elements.Count)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"valenceBands[{index}] ({band.Name}) has {holes.Count} element(s); the hole cell must match the cell's {elements.Count} element by element."), "valenceBands");
        }
        for (var i = 0; i < holes.Count; i++)
        {
            if (!IsMatchingHoleLayer(elements[i], holes[i]))
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"valenceBands[{index}] ({band.Name}) element {i} must be a parabolic uniform layer of the width of cell element {i} ({elements[i].Width.Nanometres:R} nm; holes are modelled in cells of uniform layers only); got {holes[i].GetType().Name} of {holes[i].Width.Nanometres:R} nm."), "valenceBands");
            }
        }
    }

    /// <summary>True when <paramref name="hole"/> can stand for <paramref name="element"/> in a valence band: both uniform layers, the hole one parabolic, of the same width (to 1e-12 relative).</summary>
    internal static bool IsMatchingHoleLayer(CellElement element, CellElement hole) =>
        element is Layer layer && hole is Layer holeLayer && holeLayer.NonParabolicityPerElectronVolt == 0
        && Math.Abs(holeLayer.Width.Nanometres - layer.Width.Nanometres) <= 1e-12 * layer.Width.Nanometres;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Doped cell: {Cell.Elements.Count} element(s), period {Cell.Period.Nanometres:G6} nm, net donors {NetDonorsPerSquareNanometre * 1e14:G6} /cm2 per period, T = {Temperature}")
        + (ValenceBands.Count == 0 ? ", electrons only" : ", holes: " + string.Join(", ", ValenceBands.Select(b => b.Name)));
}
