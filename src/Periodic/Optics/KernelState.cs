// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Transfer;

namespace Periodic.Optics;

/// <summary>
/// A real state on a compiled stack as the kernel's integrals of pairs of states take it: its energy, (ψ, ψ′/m) at every element
/// boundary (unscaled), and how it continues beyond the two ends: a decaying exponential into each lead (a bound state), or
/// nothing (a state normalised on a finite domain, whose domain ends are the sequence's ends).
/// </summary>
/// <remarks>
/// Every integral over the elements comes from <see cref="CompiledCell.PairIntegrals"/> (closed forms in the end values, or
/// quadrature of the closed-form states where two energies nearly coincide); the lead tails are closed forms here:
/// for ψ = ψ(0)e^{κx}, x &lt; 0, ∫ψ_aψ_b = P/K and ∫xψ_aψ_b = −P/K², P = ψ_a(0)ψ_b(0), K = κ_a + κ_b (and mirrored on the right).
/// </remarks>
internal sealed class KernelState
{
    private KernelState(CompiledCell kernel, double energy, double[] psi, double[] w, double leftDecay, double rightDecay)
    {
        Kernel = kernel;
        EnergyElectronVolts = energy;
        Psi = psi;
        DerivativeOverMass = w;
        LeftDecayPerNanometre = leftDecay;
        RightDecayPerNanometre = rightDecay;
    }

    internal CompiledCell Kernel { get; }

    internal double EnergyElectronVolts { get; }

    /// <summary>ψ at each element boundary (Count + 1 entries).</summary>
    internal double[] Psi { get; }

    /// <summary>ψ′/m at each element boundary.</summary>
    internal double[] DerivativeOverMass { get; }

    /// <summary>κ of the decaying tail into the left lead, 1/nm; 0: no tail (the state ends at the domain's end).</summary>
    internal double LeftDecayPerNanometre { get; }

    /// <summary>κ of the decaying tail into the right lead, 1/nm; 0: no tail.</summary>
    internal double RightDecayPerNanometre { get; }

    internal ElementEnds Ends(int i) => new(Psi[i], DerivativeOverMass[i], Psi[i + 1], DerivativeOverMass[i + 1]);

    /// <summary>A bound state on its own stack, with its tails.</summary>
    internal static KernelState Of(BoundWavefunction wave)
    {
        var profile = wave.Profile;
        var n = profile.Count;
        var psi = new double[n + 1];
        var w = new double[n + 1];
        wave.BoundaryStates(psi, w);
        var e = wave.EnergyElectronVolts;
        return new KernelState(profile.Kernel, e, psi, w, profile.LeftDecay(e), profile.RightDecay(e));
    }

    /// <summary>
    /// A bound state of <paramref name="wave"/>'s stack on <paramref name="domain"/>: the same stack with one margin layer of each
    /// lead added outside (its tails written into the margins exactly), truncated at the domain's ends.
    /// </summary>
    internal static KernelState OnDomain(BoundWavefunction wave, CompiledCell domain)
    {
        var inner = Of(wave);
        var n = inner.Psi.Length - 1;
        var psi = new double[n + 3];
        var w = new double[n + 3];
        Array.Copy(inner.Psi, 0, psi, 1, n + 1);
        Array.Copy(inner.DerivativeOverMass, 0, w, 1, n + 1);
        var stack = wave.Profile;
        var leftMargin = domain.Boundaries[1];
        var rightMargin = domain.Boundaries[n + 2] - domain.Boundaries[n + 1];
        psi[0] = psi[1] * Math.Exp(-inner.LeftDecayPerNanometre * leftMargin);
        w[0] = inner.LeftDecayPerNanometre / stack.Stack.LeftLead.MassElectronMasses * psi[0];
        psi[n + 2] = psi[n + 1] * Math.Exp(-inner.RightDecayPerNanometre * rightMargin);
        w[n + 2] = -inner.RightDecayPerNanometre / stack.RightLead.MassElectronMasses * psi[n + 2];
        return new KernelState(domain, inner.EnergyElectronVolts, psi, w, 0, 0);
    }

    /// <summary>A state on a finite domain (no tails), from its boundary values.</summary>
    internal static KernelState OnDomain(CompiledCell domain, double energy, double[] psi, double[] w) => new(domain, energy, psi, w, 0, 0);

    /// <summary>
    /// ∫ψ_aψ_b, ∫(x − origin)ψ_aψ_b and ∫ψ_aψ_b′ over the whole line (tails included) for two states on sequences with the same
    /// element boundaries; x from the start of the sequence. <paramref name="normScale"/>: the size of the two states' norms
    /// (1: normalised; 0: unknown), which lets the kernel take its closed form where a barrier's share is negligible.
    /// </summary>
    internal static (double Overlap, double Moment, double Momentum) Pair(KernelState a, KernelState b, double originNanometres, double normScale = 1)
    {
        var kernel = a.Kernel;
        var n = kernel.Count;
        double overlap = 0, moment = 0, momentum = 0;
        for (var i = 0; i < n; i++)
        {
            var pair = ReferenceEquals(a.Kernel, b.Kernel)
                ? kernel.PairIntegrals(i, a.EnergyElectronVolts, a.Ends(i), b.EnergyElectronVolts, b.Ends(i), normScale)
                : CompiledCell.PairQuadrature(a.Kernel, i, a.EnergyElectronVolts, a.Ends(i), b.Kernel, b.EnergyElectronVolts, b.Ends(i));
            overlap += pair.Overlap;
            moment += pair.LocalMoment + (kernel.Start(i) - originNanometres) * pair.Overlap;
            momentum += pair.Momentum;
        }
        if (a.LeftDecayPerNanometre > 0 && b.LeftDecayPerNanometre > 0)
        {
            var product = a.Psi[0] * b.Psi[0];
            var k = a.LeftDecayPerNanometre + b.LeftDecayPerNanometre;
            overlap += product / k;
            moment += -product / (k * k) - originNanometres * product / k;
            momentum += b.LeftDecayPerNanometre * product / k;
        }
        if (a.RightDecayPerNanometre > 0 && b.RightDecayPerNanometre > 0)
        {
            var product = a.Psi[n] * b.Psi[n];
            var k = a.RightDecayPerNanometre + b.RightDecayPerNanometre;
            overlap += product / k;
            moment += product / (k * k) + (kernel.Start(n) - originNanometres) * product / k;
            momentum -= b.RightDecayPerNanometre * product / k;
        }
        return (overlap, moment, momentum);
    }

    /// <summary>∫ψ² over each element (<paramref name="destination"/>, Count entries) and over the two tails.</summary>
    internal void ElementNorms(Span<double> destination, out double leftTail, out double rightTail)
    {
        for (var i = 0; i < Kernel.Count; i++)
        {
            destination[i] = Kernel.SquareIntegral(i, EnergyElectronVolts, Ends(i));
        }
        leftTail = LeftDecayPerNanometre > 0 ? Psi[0] * Psi[0] / (2 * LeftDecayPerNanometre) : 0;
        rightTail = RightDecayPerNanometre > 0 ? Psi[^1] * Psi[^1] / (2 * RightDecayPerNanometre) : 0;
    }
}
