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
/// takes parabolic uniform layers and delta barriers; the carriers are electrons of the single band, so the stack must hold
/// more donors than acceptors and acceptors cannot have a level (holes are not modelled in finite stacks; periodic cells model
/// them, <see cref="DopedCell.ValenceBands"/>).
/// </remarks>
public sealed class DopedStack
{
    private DopedStack(LayerStack stack, LayerDoping[][] doping, Temperature temperature, double left, double right, double net)
    {
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

    /// <summary>Creates a doped stack.</summary>
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
        double leftLeadRelativePermittivity, double rightLeadRelativePermittivity)
    {
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
                if (doping.AcceptorIonisationEnergyElectronVolts is not null)
                {
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"partDoping[{p}][{i}] gives an acceptor level; the finite-stack model has no valence band (holes are modelled in periodic cells only), so its acceptors are fully ionised: give none."), nameof(partDoping));
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
        if (!(net > 0))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"partDoping must hold more donors than acceptors in the stack (electrons are the only mobile carriers of a finite stack: holes are modelled in periodic cells only); net donors = {net * 1e14:R} /cm2."), nameof(partDoping));
        }
        return new DopedStack(stack, copy, temperature, leftLeadRelativePermittivity, rightLeadRelativePermittivity, net);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Doped stack: {Stack.Parts.Count} part(s), {Stack.Thickness.Nanometres:G6} nm, net donors {NetDonorsPerSquareNanometre * 1e14:G6} /cm2, T = {Temperature}");
}
