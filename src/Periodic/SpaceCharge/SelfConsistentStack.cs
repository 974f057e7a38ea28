// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Stacks;

namespace Periodic.SpaceCharge;

/// <summary>
/// A converged self-consistent solution of a <see cref="DopedStack"/> at zero bias (from
/// <see cref="SpaceChargeSolver.SolveStack(DopedStack, SpaceChargeOptions?, IProgress{SpaceChargeProgress}?, CancellationToken)"/>):
/// the stack with the Hartree potential added, as sampled smooth segments, ready for transmission, resonances and bound states;
/// the Fermi level on the same energy scale; the Hartree potential and the electron and hole densities on the grid; and how far the
/// iteration got. Immutable; a host keeps and reuses it.
/// </summary>
/// <remarks>
/// <see cref="Stack"/> begins with a buffer of left-lead material <see cref="BufferNanometres"/> wide and ends with one of the
/// right lead's (where the leads' bands bend), so its positions run from 0 at the outer end of the left buffer; its leads are
/// flat at the potential the buffers reach at their outer ends (zero field there). <see cref="SelfConsistentSolution.PositionsNanometres"/> are measured
/// from the rigid stack's left interface, so the buffers lie at negative positions and beyond the stack's thickness.
/// </remarks>
public sealed class SelfConsistentStack : SelfConsistentSolution
{
    internal SelfConsistentStack(DopedStack input, LayerStack stack, SpaceChargeOptions options, double[] positions, double[] hartree, double[] density,
        double[] holeDensity, double fermiLevel, double neutralityError, int iterations, double residual, int states, double buffer,
        IReadOnlyList<LayerStack> valenceStacks)
        : base(options, [.. positions.Select(x => x - buffer)], [.. hartree], [.. density.Select(n => n * 1e21)], [.. holeDensity.Select(p => p * 1e21)], fermiLevel,
            neutralityError, iterations, residual, input.Temperature.Kelvin)
    {
        Input = input;
        Stack = stack;
        OccupiedStates = states;
        ValenceStacks = new System.Collections.ObjectModel.ReadOnlyCollection<LayerStack>([.. valenceStacks]);
        BufferNanometres = buffer;
    }

    /// <summary>The doped stack that was solved.</summary>
    public DopedStack Input { get; }

    /// <summary>The self-consistent stack: lead buffers and every layer as <see cref="Structures.SampledSegment"/>s of band edge plus Hartree energy, delta barriers as given, between flat leads.</summary>
    public LayerStack Stack { get; }

    /// <summary>
    /// Per valence band of <see cref="DopedStack.ValenceBands"/>: the self-consistent hole stack (buffers included, hole energies
    /// counted downwards, so with −U added), between flat leads; empty for electrons alone.
    /// </summary>
    public IReadOnlyList<LayerStack> ValenceStacks { get; }

    /// <summary>The width of lead material kept inside the computed domain on each side, nm (<see cref="SpaceChargeOptions.LeadBufferNanometres"/>).</summary>
    public double BufferNanometres { get; }

    /// <summary>States of the closed domain in the carrier sum, electrons and holes (every state within 40 k_BT beyond μ of each carrier that takes part).</summary>
    public int OccupiedStates { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Self-consistent stack: converged in {Iterations} iteration(s) (residual {ResidualElectronVolts:G3} eV), mu = {FermiLevelElectronVolts:G10} eV, neutrality error {NeutralityError:G3}, {OccupiedStates} state(s), buffers {BufferNanometres:G4} nm, {PositionsNanometres.Count} grid points");
}
