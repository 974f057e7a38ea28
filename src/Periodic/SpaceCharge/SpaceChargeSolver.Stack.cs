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
    /// <para>States: the electrons occupy the states of the closed domain, with hard walls (ψ = 0) at its outer ends, every state
    /// below μ + 40 k_BT found with the oscillation-count proof of <see cref="BoundStateSpectrum"/> on the sampled potential
    /// (Magnus steps of the kernel), each holding (m∥/πħ²)·k_BT·ln(1 + e^((μ − E)/k_BT)) electrons per area. The continuum
    /// above the leads' band edges is thus that of a closed box: measure its effect by widening the buffers (it vanishes where μ
    /// lies many k_BT below the leads' band edges). The iteration and every formula are those of the periodic solver
    /// (predictor–corrector, A. Trellakis et al., J. Appl. Phys. 81, 7880 (1997)).</para>
    /// <para>Result: <see cref="SelfConsistentStack.Stack"/>, buffers included, between flat leads at the potential the buffers
    /// reach at their outer ends. Not modelled: bias (one Fermi level), holes, exchange and correlation, doped leads.</para>
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
        var elements = new List<CellElement>();
        var dopings = new List<LayerDoping>();
        if (buffer > 0)
        {
            elements.Add(Layer.Create(Length.FromNanometres(buffer), rigid.LeftLead.Potential, rigid.LeftLead.Mass));
            dopings.Add(LayerDoping.Undoped(stack.LeftLeadRelativePermittivity));
        }
        for (var p = 0; p < rigid.Parts.Count; p++)
        {
            var part = rigid.Parts[p];
            var partElements = part.Cell is { } cell ? cell.Elements : [part.Element!];
            for (var r = 0; r < part.Repetitions; r++)
            {
                elements.AddRange(partElements);
                dopings.AddRange(stack.PartDoping[p]);
            }
        }
        if (buffer > 0)
        {
            elements.Add(Layer.Create(Length.FromNanometres(buffer), rigid.RightLead.Potential, rigid.RightLead.Mass));
            dopings.Add(LayerDoping.Undoped(stack.RightLeadRelativePermittivity));
        }
        var length = elements.Sum(e => e.Width.Nanometres);
        if (!(length > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(options), buffer,
                "the domain has no width: a stack of deltas alone needs lead buffers (leadBufferNanometres > 0).");
        }
        var grid = new SpaceChargeGrid(elements, dopings, periodic: false, options.MaxGridSpacingNanometres, length);
        var core = new SchrodingerPoisson(grid, stack.Temperature, options);
        var lowest = elements.OfType<Layer>().Min(l => l.Potential.ElectronVolts);
        var ceiling = lowest + 45 * core.KT;
        List<StackPart>? parts = null;
        double ComputeStates()
        {
            parts = BuildParts(elements, grid, core.Hartree);
            var box = new StackProfile(LayerStack.Create(rigid.LeftLead, parts, rigid.RightLead), long.MaxValue, nameof(stack), hardWalls: true);
            var floor = lowest + core.Hartree.Min();
            ceiling = Math.Max(ceiling, floor + 45 * core.KT);
            while (true)
            {
                // The oscillation count bounds the work before any state is searched.
                var count = box.CountBelow(ceiling, out _);
                if (count > MaxOccupiedStates)
                {
                    throw new SpaceChargeException(0, double.NaN, string.Create(CultureInfo.InvariantCulture,
                        $"{count} states of the stack's domain lie below {ceiling:G6} eV (the states summed reach {OccupationCutoff} kT above the Fermi level); at most {MaxOccupiedStates} are summed: the stack, its buffers, the doping or the temperature is beyond what the sum over states is bounded to"));
                }
                var spectrum = BoundStateSpectrum.FindInBox(box, ceiling, BoundStateOptions.Create(maxLevels: MaxOccupiedStates));
                core.ClearStates();
                for (var k = 0; k < spectrum.Levels.Count; k++)
                {
                    cancellationToken.ThrowIfCancellationRequested();
                    var row = core.BeginState();
                    spectrum.GetWavefunction(k).Evaluate(core.Positions, row);
                    for (var i = 0; i < row.Length; i++)
                    {
                        row[i] *= row[i];
                    }
                    core.EndState(spectrum.Levels[k].EnergyElectronVolts, 1);
                }
                if (core.StateCount == 0)
                {
                    ceiling += 45 * core.KT;
                    continue;
                }
                var mu = core.FermiLevel();
                if (mu + OccupationCutoff * core.KT <= ceiling)
                {
                    // Next iteration: a ceiling just high enough (the potential moves little once the loop converges).
                    ceiling = mu + 45 * core.KT;
                    return mu;
                }
                ceiling = mu + 45 * core.KT;
            }
        }
        return core.Iterate(ComputeStates, (iterations, residual, mu) =>
        {
            var hartree = core.Hartree;
            var left = Lead.Create(Energy.FromElectronVolts(rigid.LeftLead.Potential.ElectronVolts + hartree[0]), rigid.LeftLead.Mass);
            var right = Lead.Create(Energy.FromElectronVolts(rigid.RightLead.Potential.ElectronVolts + hartree[^1]), rigid.RightLead.Mass);
            var solved = LayerStack.Create(left, parts!, right);
            return new SelfConsistentStack(stack, solved, options, grid.Positions, hartree, core.Density, mu, core.NeutralityError(), iterations, residual,
                core.StateCount, buffer);
        }, progress, cancellationToken);
    }

    /// <summary>The domain's elements with U added: each layer as sampled segments of at most <see cref="MaxIntervalsPerSegment"/> grid intervals, deltas kept.</summary>
    private static List<StackPart> BuildParts(List<CellElement> elements, SpaceChargeGrid grid, double[] hartree)
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
                parts.Add(StackPart.Single(Sampled(layer, grid, from, to, hartree)));
            }
        }
        return parts;
    }
}
