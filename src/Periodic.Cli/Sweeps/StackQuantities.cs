// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Cli.Physics;
using Periodic.Design;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Structures;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The finite-stack quantities a sweep row or a design target can hold: bound levels (counted from 1, as
/// <c>periodic levels</c> does), transmission resonances (from 1, lowest first) and bound-to-bound transitions
/// (E_J − E_I, as <c>periodic transitions</c> gives them), with their exact derivatives with respect to a cell layer's
/// width, potential or mass (<see cref="StackSensitivities"/>).
/// </summary>
/// <remarks>
/// The stack is the structure file's <c>stack</c>, or one period of the cell between leads of its first layer when the
/// file has none (what <c>periodic transitions</c> uses by default). Resonances are searched between the higher lead band
/// edge and the highest layer potential of the stack (the barrier tops: above them peaks are broad and many); at the
/// file's bias if it gives one (their sensitivities are computed at zero bias only, so they are absent then).
/// </remarks>
internal sealed class StackQuantities
{
    private readonly StructureDefinition _structure;
    private readonly BoundStateSpectrum? _levels;
    private readonly StackTransmission? _transmission;
    private readonly IReadOnlyList<Resonance> _resonances;

    private StackQuantities(StructureDefinition structure, BoundStateSpectrum? levels, StackTransmission? transmission, IReadOnlyList<Resonance> resonances)
    {
        _structure = structure;
        _levels = levels;
        _transmission = transmission;
        _resonances = resonances;
    }

    /// <summary>The stack a structure file describes for these quantities.</summary>
    public static LayerStack StackOf(StructureDefinition structure) =>
        StackOptions.Choose(structure, structure.Stack is null ? 1 : null, null, null).Stack;

    /// <summary>Solves what is asked: the bound levels when <paramref name="levels"/>, the resonances when <paramref name="resonances"/>.</summary>
    public static StackQuantities Solve(StructureDefinition structure, bool levels, bool resonances)
    {
        var stack = StackOf(structure);
        var spectrum = levels ? BoundStateSpectrum.Find(stack) : null;
        StackTransmission? transmission = null;
        IReadOnlyList<Resonance> peaks = [];
        if (resonances)
        {
            var edge = Math.Max(stack.LeftLead.Potential.ElectronVolts, stack.RightLead.Potential.ElectronVolts);
            var top = stack.Parts.SelectMany(p => p.Cell?.Elements ?? [p.Element!]).OfType<Layer>().Select(l => l.Potential.ElectronVolts).DefaultIfEmpty(edge).Max();
            transmission = StackTransmission.Create(stack, structure.StackBias);
            if (top > edge)
            {
                var found = transmission.FindResonances(edge, top);
                if (!found.RefinementComplete)
                {
                    throw new InvalidOperationException("the resonance search did not resolve every peak within its evaluation budget.");
                }
                peaks = found.Resonances;
            }
        }
        return new StackQuantities(structure, spectrum, transmission, peaks);
    }

    /// <summary>Energy of bound level <paramref name="n"/> (from 1), eV, or null if the stack has fewer.</summary>
    public double? Level(int n) => n <= _levels!.Levels.Count ? _levels.Levels[n - 1].EnergyElectronVolts : null;

    /// <summary>Energy of resonance <paramref name="n"/> (from 1), eV, or null if fewer were found.</summary>
    public double? Resonance(int n) => n <= _resonances.Count ? _resonances[n - 1].EnergyElectronVolts : null;

    /// <summary>E_to − E_from of two bound levels, eV, or null if either does not exist.</summary>
    public double? Transition(int from, int to) => Level(to) - Level(from);

    /// <summary>d(level n)/d(quantity of cell element <paramref name="element"/>), or null where none exists.</summary>
    public double? LevelDerivative(int n, int element, LayerQuantity quantity) =>
        n <= _levels!.Levels.Count ? StackSensitivities.OfLevel(_levels, n - 1, LayerOf(element), quantity) : null;

    /// <summary>d(resonance n)/d(quantity of cell element <paramref name="element"/>), or null where none exists (also under a bias).</summary>
    public double? ResonanceDerivative(int n, int element, LayerQuantity quantity) =>
        n <= _resonances.Count && _transmission!.Bias.ElectronVolts == 0
            ? StackSensitivities.OfResonance(_transmission, _resonances[n - 1], LayerOf(element), quantity)
            : null;

    /// <summary>d(E_to − E_from)/d(quantity of cell element <paramref name="element"/>), or null where none exists.</summary>
    public double? TransitionDerivative(int from, int to, int element, LayerQuantity quantity) =>
        LevelDerivative(to, element, quantity) - LevelDerivative(from, element, quantity);

    private Layer LayerOf(int element) => _structure.Cell.Elements[element] as Layer
        ?? throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"cell element {element} is not a uniform layer."));
}
