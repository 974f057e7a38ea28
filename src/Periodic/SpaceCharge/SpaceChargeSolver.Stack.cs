// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.SpaceCharge;

public static partial class SpaceChargeSolver
{
    /// <summary>The most states of a finite stack's closed domain the carrier sum may hold: bounds the states per iteration.</summary>
    public const int MaxOccupiedStates = 2000;

    /// <summary>Grid intervals per sampled segment of the stack's states: keeps sampling a state inside a segment short.</summary>
    private const int MaxIntervalsPerSegment = 32;

    /// <summary>
    /// Solves a doped finite stack between its leads at zero bias self-consistently.
    /// </summary>
    /// <remarks>
    /// <para>Domain and boundary conditions. The computed domain is the stack with a buffer of each lead's material
    /// (<see cref="SpaceChargeOptions.LeadBufferNanometres"/> wide, undoped, of the lead's permittivity) on each side. Poisson's
    /// equation has no field through the domain's two outer ends (the leads far away are flat and neutral) and U = 0 at its left
    /// end (the gauge); with no flux through either end, Gauss's law makes the whole domain neutral, and that neutrality fixes
    /// the Fermi level μ: the leads are undoped and hold no carriers of their own, so every electron the stack's donors give
    /// stays in the domain.</para>
    /// <para>Doped contacts: give a device's contacts as the stack's outer parts, doped layers of the contact material. Where a
    /// contact is thick enough for its middle to be flat and neutral, the domain's Fermi level is the contact's bulk one,
    /// μ − (E_c + U) = η k_BT with N_c F_{1/2}(η) = N_D⁺: the leads' Fermi level at zero bias (docs/space-charge.md measures
    /// how thick: 80 nm at 10¹⁸ cm⁻³ and 77 K puts it within 2.4e-3 k_BT).</para>
    /// <para>States: the electrons occupy the states of the closed domain, with hard walls (ψ = 0) at its outer ends, every state
    /// below μ + 40 k_BT found with the oscillation-count proof of <see cref="BoundStateSpectrum"/> on the sampled potential
    /// (Magnus steps of the kernel), each holding (m∥/πħ²)·k_BT·ln(1 + e^((μ − E)/k_BT)) electrons per area. The continuum
    /// above the leads' band edges is thus that of a closed box: measure its effect by widening the buffers (it vanishes where μ
    /// lies many k_BT below the leads' band edges). The iteration and every formula are those of the periodic solver
    /// (predictor–corrector, A. Trellakis et al., J. Appl. Phys. 81, 7880 (1997)).</para>
    /// <para>Holes: a stack given valence bands (<see cref="DopedStack.ValenceBands"/>) has the holes of each as carriers too, in
    /// the closed-domain states of its hole stack with potential V_h − U (hole energies count downwards; the same kernel and
    /// hard walls), each state of electron energy E holding (m∥/πħ²)·k_BT·ln(1 + e^((E − μ)/k_BT)) holes per area at the same μ;
    /// Poisson's equation has +p, neutrality p − n + N_D⁺ − N_A⁻ = 0 fixes μ, and acceptors with a level ionise incompletely
    /// above the first valence band's edge. A carrier whose potential lies more than 40 k_BT beyond μ everywhere holds no
    /// state (an n-type stack with valence bands gives exactly the electrons' result).</para>
    /// <para>Result: <see cref="SelfConsistentStack.Stack"/>, buffers included, between flat leads at the potential the buffers
    /// reach at their outer ends. Not modelled: bias (one Fermi level), holes of a stack without valence bands, heavy/light-hole
    /// mixing, exchange and correlation, doped leads.</para>
    /// </remarks>
    /// <param name="stack">The doped stack.</param>
    /// <param name="options">Tolerances, grid and buffer width; null for <see cref="SpaceChargeOptions.Default"/>.</param>
    /// <param name="progress">Told after each outer iteration; may be null.</param>
    /// <param name="cancellationToken">Checked between iterations and between states.</param>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The domain needs more grid points than <see cref="SpaceChargeOptions.MaxGridPoints"/>.</exception>
    /// <exception cref="SpaceChargeException">The iteration did not reach the tolerance within the budget, diverged, or needs more
    /// than <see cref="MaxOccupiedStates"/> states.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static SelfConsistentStack SolveStack(DopedStack stack, SpaceChargeOptions? options = null, IProgress<SpaceChargeProgress>? progress = null,
        CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(stack);
        options ??= SpaceChargeOptions.Default;
        var rigid = stack.Stack;
        // Every layer takes at least four intervals: refuse a stack too long to grid before writing it out.
        if (rigid.ElementCount > SpaceChargeOptions.MaxGridPoints / 4)
        {
            throw new ArgumentOutOfRangeException(nameof(stack), rigid.ElementCount, string.Create(CultureInfo.InvariantCulture,
                $"stack has {rigid.ElementCount} elements written out; the space-charge grid takes at most {SpaceChargeOptions.MaxGridPoints} points (four or more per layer), so at most {SpaceChargeOptions.MaxGridPoints / 4} elements."));
        }
        var buffer = options.LeadBufferNanometres;
        var valence = stack.ValenceBands;
        var elements = new List<CellElement>();
        var dopings = new List<LayerDoping>();
        // Carrier 0: the electrons; then one per valence band, its hole stack written out alike (hole energies count downwards).
        var carriers = new BoxCarrier[1 + valence.Count];
        carriers[0] = new BoxCarrier(rigid.LeftLead, rigid.RightLead, elements, false, 0, "electron");
        for (var b = 0; b < valence.Count; b++)
        {
            carriers[b + 1] = new BoxCarrier(valence[b].Stack.LeftLead, valence[b].Stack.RightLead, [], true, valence[b].EdgeElectronVolts, valence[b].Name);
        }
        if (buffer > 0)
        {
            foreach (var carrier in carriers)
            {
                carrier.Elements.Add(Layer.Create(Length.FromNanometres(buffer), carrier.LeftLead.Potential, carrier.LeftLead.Mass));
            }
            dopings.Add(LayerDoping.Undoped(stack.LeftLeadRelativePermittivity));
        }
        for (var p = 0; p < rigid.Parts.Count; p++)
        {
            for (var c = 0; c < carriers.Length; c++)
            {
                var part = c == 0 ? rigid.Parts[p] : valence[c - 1].Stack.Parts[p];
                var partElements = part.Cell is { } cell ? cell.Elements : [part.Element!];
                for (var r = 0; r < part.Repetitions; r++)
                {
                    carriers[c].Elements.AddRange(partElements);
                }
            }
            for (var r = 0; r < rigid.Parts[p].Repetitions; r++)
            {
                dopings.AddRange(stack.PartDoping[p]);
            }
        }
        if (buffer > 0)
        {
            foreach (var carrier in carriers)
            {
                carrier.Elements.Add(Layer.Create(Length.FromNanometres(buffer), carrier.RightLead.Potential, carrier.RightLead.Mass));
            }
            dopings.Add(LayerDoping.Undoped(stack.RightLeadRelativePermittivity));
        }
        var length = elements.Sum(e => e.Width.Nanometres);
        if (!(length > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(options), buffer,
                "the domain has no width: a stack of deltas alone needs lead buffers (leadBufferNanometres > 0).");
        }
        // The first valence band's edge of each element, on the electron scale: where its acceptor level sits above.
        var edges = valence.Count == 0 ? null
            : carriers[1].Elements.Select(e => e is Layer hole ? valence[0].EdgeElectronVolts - hole.Potential.ElectronVolts : 0).ToArray();
        var grid = new SpaceChargeGrid(elements, dopings, periodic: false, options.MaxGridSpacingNanometres, length, edges);
        var core = new SchrodingerPoisson(grid, stack.Temperature, options);
        var net = stack.NetDonorsPerSquareNanometre;
        foreach (var carrier in carriers)
        {
            carrier.InverseMass = carrier.IsHole ? grid.InverseMassOf(carrier.Elements) : null;
            carrier.Lowest = carrier.Elements.OfType<Layer>().Min(l => l.Potential.ElectronVolts);
            carrier.Ceiling = carrier.Lowest + 45 * core.KT;
            // The first iteration starts from the carriers the net doping calls for (both when it is zero), as for a cell.
            carrier.Active = carriers.Length == 1 || net == 0 || (net > 0) != carrier.IsHole;
        }
        double ComputeStates() => ComputeBoxStates(core, grid, carriers, cancellationToken);
        return core.Iterate(ComputeStates, (iterations, residual, mu) =>
        {
            var hartree = core.Hartree;
            var left = Lead.Create(Energy.FromElectronVolts(rigid.LeftLead.Potential.ElectronVolts + hartree[0]), rigid.LeftLead.Mass);
            var right = Lead.Create(Energy.FromElectronVolts(rigid.RightLead.Potential.ElectronVolts + hartree[^1]), rigid.RightLead.Mass);
            var solved = LayerStack.Create(left, carriers[0].Parts!, right);
            var holeStacks = carriers.Skip(1).Select(c => LayerStack.Create(
                Lead.Create(Energy.FromElectronVolts(c.LeftLead.Potential.ElectronVolts - hartree[0]), c.LeftLead.Mass), c.Parts!,
                Lead.Create(Energy.FromElectronVolts(c.RightLead.Potential.ElectronVolts - hartree[^1]), c.RightLead.Mass))).ToArray();
            return new SelfConsistentStack(stack, solved, options, grid.Positions, hartree, core.Density, core.HoleDensity, mu, core.NeutralityError(), iterations, residual,
                core.StateCount, buffer, holeStacks);
        }, progress, cancellationToken);
    }

    /// <summary>One carrier of a finite stack: its elements written out (buffers included), its leads, and its states of the present iteration.</summary>
    private sealed class BoxCarrier(Lead leftLead, Lead rightLead, List<CellElement> elements, bool isHole, double edge, string name)
    {
        public Lead LeftLead { get; } = leftLead;

        public Lead RightLead { get; } = rightLead;

        public List<CellElement> Elements { get; } = elements;

        public bool IsHole { get; } = isHole;

        /// <summary>A hole stack's zero on the electron scale, eV.</summary>
        public double Edge { get; } = edge;

        public string Name { get; } = name;

        /// <summary>1/m per grid interval (null: the electrons' own, from the grid).</summary>
        public double[]? InverseMass { get; set; }

        /// <summary>The lowest rigid potential of the domain on the carrier's own scale, eV.</summary>
        public double Lowest { get; set; }

        /// <summary>The lowest potential of the domain with U on the carrier's own scale, eV: no state lies below it.</summary>
        public double Floor { get; set; }

        /// <summary>States below this energy on the carrier's own scale are summed, eV.</summary>
        public double Ceiling { get; set; }

        public bool Active { get; set; }

        public List<StackPart>? Parts { get; set; }

        public StackProfile? Box { get; set; }

        /// <summary>The lowest state found in the present iteration on the carrier's own scale, eV (+∞: none below the ceiling).</summary>
        public double LowestState { get; set; }

        /// <summary>μ on the carrier's own scale (electrons upwards, holes downwards), eV.</summary>
        public double Own(double mu) => IsHole ? Edge - mu : mu;
    }

    /// <summary>
    /// States of the closed domain for every carrier that takes part; returns the neutral Fermi level. Each carrier sums its states
    /// below a ceiling 45 k_BT beyond μ on its own scale (raised until μ + 40 k_BT lies below it). A carrier takes part while the
    /// floor of its potential lies less than 40 k_BT beyond μ, and is dropped once its lowest state lies more than 42 k_BT beyond
    /// (then its density, below e^−40 of its lowest state's, counts as zero), as in a periodic cell.
    /// </summary>
    private static double ComputeBoxStates(SchrodingerPoisson core, SpaceChargeGrid grid, BoxCarrier[] carriers, CancellationToken cancellationToken)
    {
        var cutoff = OccupationCutoff * core.KT;
        foreach (var carrier in carriers)
        {
            var sign = carrier.IsHole ? -1 : 1;
            carrier.Parts = BuildParts(carrier.Elements, grid, core.Hartree, sign);
            var holeStack = LayerStack.Create(carrier.LeftLead, carrier.Parts, carrier.RightLead);
            carrier.Box = new StackProfile(holeStack, long.MaxValue, "stack", hardWalls: true);
            carrier.Floor = carrier.Lowest + (carrier.IsHole ? -core.Hartree.Max() : core.Hartree.Min());
            carrier.Ceiling = Math.Max(carrier.Ceiling, carrier.Floor + 45 * core.KT);
        }
        if (!carriers.Any(c => c.Active))
        {
            Array.ForEach(carriers, c => c.Active = true);
        }
        for (var restart = 0; ; restart++)
        {
            core.ClearStates();
            foreach (var carrier in carriers)
            {
                carrier.LowestState = double.PositiveInfinity;
                if (carrier.Active)
                {
                    AddBoxStates(core, carrier, cancellationToken);
                }
            }
            if (core.StateCount == 0)
            {
                foreach (var carrier in carriers.Where(c => c.Active))
                {
                    carrier.Ceiling += 45 * core.KT;
                }
                continue;
            }
            var mu = core.FermiLevel();
            var changed = false;
            foreach (var carrier in carriers)
            {
                var own = carrier.Own(mu);
                if (!carrier.Active)
                {
                    if (carrier.Floor - own < cutoff)
                    {
                        carrier.Active = true;
                        carrier.Ceiling = Math.Max(carrier.Ceiling, own + 45 * core.KT);
                        changed = true;
                    }
                    continue;
                }
                if (carrier.LowestState - own > cutoff + 2 * core.KT && carriers.Count(c => c.Active) > 1 && restart < 2 * carriers.Length)
                {
                    carrier.Active = false;
                    changed = true;
                    continue;
                }
                changed |= own + cutoff > carrier.Ceiling;
                // Next search: a ceiling just high enough (the potential moves little once the loop converges).
                carrier.Ceiling = own + 45 * core.KT;
            }
            if (!changed)
            {
                return mu;
            }
        }
    }

    /// <summary>Adds every state of <paramref name="carrier"/>'s closed domain below its ceiling to the present set.</summary>
    private static void AddBoxStates(SchrodingerPoisson core, BoxCarrier carrier, CancellationToken cancellationToken)
    {
        var box = carrier.Box!;
        // The oscillation count bounds the work before any state is searched.
        var count = box.CountBelow(carrier.Ceiling, out _);
        if (count > MaxOccupiedStates)
        {
            throw new SpaceChargeException(0, double.NaN, string.Create(CultureInfo.InvariantCulture,
                $"{count} {(carrier.IsHole ? carrier.Name + " " : "")}states of the stack's domain lie below {carrier.Ceiling:G6} eV (the states summed reach {OccupationCutoff} kT beyond the Fermi level); at most {MaxOccupiedStates} are summed: the stack, its buffers, the doping or the temperature is beyond what the sum over states is bounded to"));
        }
        var spectrum = BoundStateSpectrum.FindInBox(box, carrier.Ceiling, BoundStateOptions.Create(maxLevels: MaxOccupiedStates));
        for (var k = 0; k < spectrum.Levels.Count; k++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var row = core.BeginState();
            spectrum.GetWavefunction(k).Evaluate(core.Positions, row);
            for (var i = 0; i < row.Length; i++)
            {
                row[i] *= row[i];
            }
            var energy = spectrum.Levels[k].EnergyElectronVolts;
            carrier.LowestState = Math.Min(carrier.LowestState, energy);
            core.EndState(carrier.IsHole ? carrier.Edge - energy : energy, 1, carrier.IsHole, carrier.InverseMass);
        }
    }

    /// <summary>The domain's elements with U added (a hole band's, <paramref name="sign"/> −1: with −U): each layer as sampled segments of at most <see cref="MaxIntervalsPerSegment"/> grid intervals, deltas kept.</summary>
    private static List<StackPart> BuildParts(List<CellElement> elements, SpaceChargeGrid grid, double[] hartree, double sign)
    {
        var parts = new List<StackPart>();
        for (var e = 0; e < elements.Count; e++)
        {
            if (elements[e] is not Layer layer)
            {
                parts.Add(StackPart.Single(elements[e]));
                continue;
            }
            int start = grid.ElementStart[e], end = grid.ElementEnd[e];
            var pieces = (end - start + MaxIntervalsPerSegment - 1) / MaxIntervalsPerSegment;
            for (var k = 0; k < pieces; k++)
            {
                var from = start + (end - start) * k / pieces;
                var to = start + (end - start) * (k + 1) / pieces;
                parts.Add(StackPart.Single(Sampled(layer, grid, from, to, hartree, null, sign)));
            }
        }
        return parts;
    }
}
