// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// A doped finite stack between two leads at zero bias: the rigid stack (the band-edge profile of the undoped structure), the
/// doping and permittivity of every element of every part, the permittivity of the two leads, and the temperature. The leads
/// are undoped: they hold no carriers of their own, so the electrons of the stack's donors stay in and near the stack.
/// Validated at construction; immutable.
/// </summary>
/// <remarks>
/// The self-consistent model (<see cref="SpaceChargeSolver.SolveStack(DopedStack, SpaceChargeOptions?, IProgress{SpaceChargeProgress}?, CancellationToken)"/>)
/// takes parabolic uniform layers and delta barriers. The carriers are electrons of the single band and, where the stack is
/// given valence bands (<see cref="ValenceBands"/>), holes of each; without a valence band the stack must hold more donors than
/// acceptors and acceptors cannot have a level.
/// </remarks>
public sealed class DopedStack
{
    private DopedStack(LayerStack stack, LayerDoping[][] doping, Temperature temperature, double left, double right, double net, StackValenceBand[] valenceBands)
    {
        ValenceBands = new ReadOnlyCollection<StackValenceBand>(valenceBands);
        Stack = stack;
        PartDoping = new ReadOnlyCollection<IReadOnlyList<LayerDoping>>([.. doping.Select(d => (IReadOnlyList<LayerDoping>)new ReadOnlyCollection<LayerDoping>(d))]);
        Temperature = temperature;
        LeftLeadRelativePermittivity = left;
        RightLeadRelativePermittivity = right;
        NetDonorsPerSquareNanometre = net;
    }

    /// <summary>The rigid stack: band-edge potentials without space charge.</summary>
    public LayerStack Stack { get; }

    /// <summary>Per part of <see cref="Stack"/>: the doping of each element of its cell (a repeated cell: every period alike) or of its single element.</summary>
    public IReadOnlyList<IReadOnlyList<LayerDoping>> PartDoping { get; }

    /// <summary>The temperature.</summary>
    public Temperature Temperature { get; }

    /// <summary>The static relative permittivity of the left lead.</summary>
    public double LeftLeadRelativePermittivity { get; }

    /// <summary>The static relative permittivity of the right lead.</summary>
    public double RightLeadRelativePermittivity { get; }

    /// <summary>Net ionised donors of the whole stack per unit area, ∫(N_D − N_A)dz + sheets, nm⁻² (full ionisation).</summary>
    public double NetDonorsPerSquareNanometre { get; }

    /// <summary>The valence bands whose holes are carriers (empty: electrons only).</summary>
    public IReadOnlyList<StackValenceBand> ValenceBands { get; }

    /// <summary>Creates a doped stack whose carriers are electrons only.</summary>
    /// <param name="stack">A stack of parabolic uniform layers and delta barriers.</param>
    /// <param name="partDoping">One list per part of <paramref name="stack"/>: one entry per element of a repeated cell, or one for a single element; delta barriers undoped.</param>
    /// <param name="temperature">T in [1, 1000] K.</param>
    /// <param name="leftLeadRelativePermittivity">ε_r of the left lead, in [1, 1e4].</param>
    /// <param name="rightLeadRelativePermittivity">ε_r of the right lead, in [1, 1e4].</param>
    /// <exception cref="ArgumentNullException">An argument or an entry is null.</exception>
    /// <exception cref="ArgumentException">A count differs, an element is of another kind or non-parabolic, a delta barrier is doped,
    /// or the stack holds no more donors than acceptors (the message names the parameter and the value).</exception>
    /// <exception cref="ArgumentOutOfRangeException">The temperature or a permittivity lies outside its range.</exception>
    public static DopedStack Create(LayerStack stack, IReadOnlyList<IReadOnlyList<LayerDoping>> partDoping, Temperature temperature,
        double leftLeadRelativePermittivity, double rightLeadRelativePermittivity) =>
        Create(stack, partDoping, temperature, leftLeadRelativePermittivity, rightLeadRelativePermittivity, []);

    /// <summary>Creates a doped stack whose holes in <paramref name="valenceBands"/> are carriers beside its electrons.</summary>
    /// <param name="stack">A stack of parabolic uniform layers and delta barriers: the conduction band.</param>
    /// <param name="partDoping">One list per part of <paramref name="stack"/>: one entry per element of a repeated cell, or one for a single element; delta barriers undoped.</param>
    /// <param name="temperature">T in [1, 1000] K.</param>
    /// <param name="leftLeadRelativePermittivity">ε_r of the left lead, in [1, 1e4].</param>
    /// <param name="rightLeadRelativePermittivity">ε_r of the right lead, in [1, 1e4].</param>
    /// <param name="valenceBands">The valence bands (e.g. heavy and light holes), each with a hole stack whose parts match
    /// <paramref name="stack"/>'s (the same repetitions, parabolic uniform layers of the same widths, element by element; no delta
    /// barriers); the first one's edges place the acceptor levels. Empty: electrons only.</param>
    /// <exception cref="ArgumentNullException">An argument or an entry is null.</exception>
    /// <exception cref="ArgumentException">A count differs, an element is of another kind or non-parabolic, a delta barrier is doped,
    /// a hole stack does not match the stack, or (without valence bands) the stack holds no more donors than acceptors or gives an
    /// acceptor level (the message names the parameter and the value).</exception>
    /// <exception cref="ArgumentOutOfRangeException">The temperature or a permittivity lies outside its range.</exception>
    public static DopedStack Create(LayerStack stack, IReadOnlyList<IReadOnlyList<LayerDoping>> partDoping, Temperature temperature,
        double leftLeadRelativePermittivity, double rightLeadRelativePermittivity, IReadOnlyList<StackValenceBand> valenceBands)
    {
        ArgumentNullException.ThrowIfNull(valenceBands);
        ArgumentNullException.ThrowIfNull(stack);
        ArgumentNullException.ThrowIfNull(partDoping);
        Preconditions.CheckRange(temperature.Kelvin, DopedCell.MinTemperatureKelvin, DopedCell.MaxTemperatureKelvin, nameof(temperature));
        Preconditions.CheckRange(leftLeadRelativePermittivity, 1, LayerDoping.MaxRelativePermittivity);
        Preconditions.CheckRange(rightLeadRelativePermittivity, 1, LayerDoping.MaxRelativePermittivity);
        var parts = stack.Parts;
        if (partDoping.Count != parts.Count)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"partDoping must hold one list per stack part ({parts.Count}); got {partDoping.Count}."), nameof(partDoping));
        }
        var copy = new LayerDoping[parts.Count][];
        double net = 0;
        for (var p = 0; p < parts.Count; p++)
        {
            var elements = parts[p].Cell is { } cell ? cell.Elements : [parts[p].Element!];
            var given = partDoping[p] ?? throw new ArgumentNullException(nameof(partDoping), string.Create(CultureInfo.InvariantCulture, $"partDoping[{p}] is null."));
            if (given.Count != elements.Count)
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"partDoping[{p}] must hold one entry per element of stack part {p} ({elements.Count}); got {given.Count}."), nameof(partDoping));
            }
            copy[p] = new LayerDoping[given.Count];
            double perRepetition = 0;
            for (var i = 0; i < given.Count; i++)
            {
                var doping = copy[p][i] = given[i] ?? throw new ArgumentNullException(nameof(partDoping), string.Create(CultureInfo.InvariantCulture, $"partDoping[{p}][{i}] is null."));
                if (valenceBands.Count == 0 && doping.AcceptorIonisationEnergyElectronVolts is not null)
                {
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"partDoping[{p}][{i}] gives an acceptor level, which lies above the valence-band edge: the stack needs a valence band (valenceBands) for it."), nameof(partDoping));
                }
                switch (elements[i])
                {
                    case Layer layer when layer.NonParabolicityPerElectronVolt == 0:
                        perRepetition += doping.NetVolumePerCubicNanometre * layer.Width.Nanometres + doping.SheetPerSquareNanometre;
                        break;
                    case Layer layer:
                        throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                            $"stack part {p}, element {i} is a non-parabolic layer (alpha = {layer.NonParabolicityPerElectronVolt:R} /eV); the space-charge model takes parabolic layers only."), nameof(stack));
                    case DeltaBarrier when doping.IsDoped:
                        throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                            $"partDoping[{p}][{i}] belongs to a delta barrier, which has no width and cannot be doped; got {doping}."), nameof(partDoping));
                    case DeltaBarrier:
                        break;
                    default:
                        throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                            $"stack part {p}, element {i} is a {elements[i].GetType().Name}; the space-charge model takes uniform layers and delta barriers only."), nameof(stack));
                }
            }
            net += perRepetition * parts[p].Repetitions;
        }
        var bands = new StackValenceBand[valenceBands.Count];
        for (var b = 0; b < bands.Length; b++)
        {
            bands[b] = valenceBands[b] ?? throw new ArgumentNullException(nameof(valenceBands), string.Create(CultureInfo.InvariantCulture, $"valenceBands[{b}] is null."));
            CheckHoleStack(stack, bands[b], b);
        }
        if (bands.Length == 0 && !(net > 0))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"partDoping must hold more donors than acceptors in the stack (without valence bands electrons are the only mobile carriers: give valenceBands for a p-type or compensated stack); net donors = {net * 1e14:R} /cm2."), nameof(partDoping));
        }
        return new DopedStack(stack, copy, temperature, leftLeadRelativePermittivity, rightLeadRelativePermittivity, net, bands);
    }

    private static void CheckHoleStack(LayerStack stack, StackValenceBand band, int index)
    {
        var parts = stack.Parts;
        var holes = band.Stack.Parts;
        if (holes.Count != parts.Count)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"valenceBands[{index}] ({band.Name}) has {holes.Count} part(s); the hole stack must match the stack's {parts.Count} part by part."), "valenceBands");
        }
        for (var p = 0; p < parts.Count; p++)
        {
            if (holes[p].Repetitions != parts[p].Repetitions || holes[p].IsRepeatedCell != parts[p].IsRepeatedCell)
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"valenceBands[{index}] ({band.Name}) part {p} repeats {holes[p].Repetitions} time(s); stack part {p} repeats {parts[p].Repetitions} time(s), and both must be a repeated cell or a single element alike."), "valenceBands");
            }
            var elements = parts[p].Cell is { } cell ? cell.Elements : [parts[p].Element!];
            var holeElements = holes[p].Cell is { } holeCell ? holeCell.Elements : [holes[p].Element!];
            if (holeElements.Count != elements.Count)
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"valenceBands[{index}] ({band.Name}) part {p} has {holeElements.Count} element(s); stack part {p} has {elements.Count}."), "valenceBands");
            }
            for (var i = 0; i < elements.Count; i++)
            {
                if (!DopedCell.IsMatchingHoleLayer(elements[i], holeElements[i]))
                {
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"valenceBands[{index}] ({band.Name}) part {p}, element {i} must be a parabolic uniform layer of the width of stack part {p}, element {i} ({elements[i].Width.Nanometres:R} nm; holes are modelled in stacks of uniform layers only); got {holeElements[i].GetType().Name} of {holeElements[i].Width.Nanometres:R} nm."), "valenceBands");
                }
            }
        }
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Doped stack: {Stack.Parts.Count} part(s), {Stack.Thickness.Nanometres:G6} nm, net donors {NetDonorsPerSquareNanometre * 1e14:G6} /cm2, T = {Temperature}")
        + (ValenceBands.Count == 0 ? "" : ", holes: " + string.Join(", ", ValenceBands.Select(b => b.Name)));
}
