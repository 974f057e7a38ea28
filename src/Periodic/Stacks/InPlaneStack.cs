// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// A finite stack as a carrier with in-plane wavevector k∥ sees it: every layer and both leads with the potential
/// raised by ħ²k∥²/2m of their own mass (<see cref="InPlaneMotion"/>), so that the transmission at total energy E
/// conserves k∥ across every interface. Under bias the shift is a constant per layer, so the field stays uniform.
/// </summary>
/// <remarks>
/// With unequal masses the in-plane motion does not separate from the motion along the growth axis; this is the exact
/// treatment within the envelope-function model. Non-parabolic layers are refused: their in-plane energy depends on E,
/// which a stack evaluated over many energies cannot freeze (see <see cref="InPlaneMotion"/>).
/// </remarks>
public static class InPlaneStack
{
    /// <summary>The stack seen at in-plane wavevector <paramref name="inPlaneWavevectorPerNanometre"/> (1/nm).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">k∥ is not finite, negative or above <see cref="InPlaneMotion.MaxWavevectorPerNanometre"/>.</exception>
    /// <exception cref="ArgumentException">The stack holds a non-parabolic layer, a function or a sampled segment (the message names it).</exception>
    public static LayerStack At(LayerStack stack, double inPlaneWavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(stack);
        var k = InPlaneMotion.CheckWavevector(inPlaneWavevectorPerNanometre, nameof(inPlaneWavevectorPerNanometre));
        var parts = stack.PartSpan;
        var transformed = new StackPart[parts.Length];
        for (var i = 0; i < parts.Length; i++)
        {
            if (parts[i].Cell is { } cell)
            {
                UnitCell shifted;
                try
                {
                    shifted = InPlaneMotion.CellAt(cell, k);
                }
                catch (ArgumentException e) when (e is not ArgumentOutOfRangeException)
                {
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"stack part {i}: {Trim(e.Message)}"), nameof(stack), e);
                }
                transformed[i] = StackPart.Repeat(shifted, parts[i].Repetitions);
                continue;
            }
            var element = parts[i].Element!;
            if (element is Layer { NonParabolicityPerElectronVolt: > 0 })
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"stack part {i} is a non-parabolic layer: its in-plane energy depends on the energy itself, which a stack evaluated over many energies cannot take as fixed."),
                    nameof(stack));
            }
            transformed[i] = StackPart.Single(InPlaneMotion.ElementAt(element, k, 0.0, i, nameof(stack)));
        }
        return LayerStack.Create(LeadAt(stack.LeftLead, k), transformed, LeadAt(stack.RightLead, k));
    }

    private static Lead LeadAt(Lead lead, double k) => Lead.Create(
        Energy.FromElectronVolts(lead.PotentialElectronVolts + InPlaneMotion.KineticEnergy(k, lead.MassElectronMasses)),
        EffectiveMass.FromElectronMasses(lead.MassElectronMasses));

    private static string Trim(string message)
    {
        var cut = message.IndexOf(" (Parameter '", StringComparison.Ordinal);
        return cut >= 0 ? message[..cut] : message;
    }
}
