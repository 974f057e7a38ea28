// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// The real solution at a resonance energy above both lead band edges that is most concentrated in the stack,
/// normalised on the stack plus a margin of each lead (at zero bias or under one).
/// </summary>
/// <remarks>
/// Method: at energy E the real solutions form a two-dimensional space. Of all of them this takes the one that
/// maximises ∫_stack ψ² / (a_L² + a_R²), a_L and a_R being its oscillation amplitudes in the two leads
/// (a² = ψ² + (mψ′/(m k))² at the interface): a 2 × 2 generalised symmetric eigenproblem. At a narrow resonance
/// this is the quasi-bound state of the Breit–Wigner picture (e.g. L. D. Landau, E. M. Lifshitz, Quantum
/// Mechanics, §134); for a broad peak the weight in the leads dominates and the dipoles depend on the margin,
/// which the caller checks by doubling it. The two basis solutions are propagated through the kernel (under bias its
/// linear-potential layers); every integral is the kernel's (<see cref="CompiledCell.PairIntegrals"/>).
/// </remarks>
internal sealed class QuasiBoundState
{
    private QuasiBoundState(StackProfile domain, double energy, double margin, KernelState state)
    {
        Domain = domain;
        EnergyElectronVolts = energy;
        MarginNanometres = margin;
        State = state;
    }

    internal double EnergyElectronVolts { get; }

    internal double MarginNanometres { get; }

    /// <summary>The stack with one margin layer of each lead added outside (the field, under bias, acts on the stack only).</summary>
    internal StackProfile Domain { get; }

    /// <summary>The state on <see cref="Domain"/>, normalised on it.</summary>
    internal KernelState State { get; }

    internal double DomainStartNanometres => -MarginNanometres;

    internal double DomainEndNanometres => Domain.Boundaries[^1] - MarginNanometres;

    /// <summary>The domain of <paramref name="stack"/> with <paramref name="margin"/> nm of each lead, under <paramref name="bias"/> eV.</summary>
    internal static StackProfile DomainOf(LayerStack stack, double bias, double margin, long maxElements)
    {
        var leftLayer = Layer.Create(Length.FromNanometres(margin), stack.LeftLead.Potential, stack.LeftLead.Mass);
        var rightLayer = Layer.Create(Length.FromNanometres(margin), stack.RightLead.Potential, stack.RightLead.Mass);
        var parts = new List<StackPart> { StackPart.Single(leftLayer) };
        parts.AddRange(stack.Parts);
        parts.Add(StackPart.Single(rightLayer));
        var extended = LayerStack.Create(stack.LeftLead, parts, stack.RightLead);
        return new StackProfile(extended, maxElements + 2, nameof(stack), bias, 1);
    }

    /// <summary>Builds the state at <paramref name="energy"/> on <paramref name="domain"/> (from <see cref="DomainOf"/>).</summary>
    internal static QuasiBoundState Create(StackProfile domain, double energy, double margin)
    {
        var kernel = domain.Kernel;
        var n = kernel.Count;

        // Two independent real solutions from the left end of the domain, scaled by one factor each so the largest is order one.
        var basis = new KernelState[2];
        for (var b = 0; b < 2; b++)
        {
            double u = b == 0 ? 1 : 0, w = b == 0 ? 0 : 1, log = 0;
            var us = new double[n + 1];
            var ws = new double[n + 1];
            var logs = new double[n + 1];
            us[0] = u; ws[0] = w;
            for (var i = 0; i < n; i++)
            {
                kernel.StepForward(i, energy, ref u, ref w, ref log);
                us[i + 1] = u; ws[i + 1] = w; logs[i + 1] = log;
            }
            var top = logs.Max();
            for (var i = 0; i <= n; i++)
            {
                var f = Math.Exp(logs[i] - top);
                us[i] *= f;
                ws[i] *= f;
            }
            basis[b] = KernelState.OnDomain(kernel, energy, us, ws);
        }

        // Gram matrices over the stack (elements 1 … n − 2) and over the whole domain.
        double a00 = 0, a01 = 0, a11 = 0, d00 = 0, d01 = 0, d11 = 0;
        for (var i = 0; i < n; i++)
        {
            var p00 = kernel.SquareIntegral(i, energy, basis[0].Ends(i), fromLeft: true);
            var p11 = kernel.SquareIntegral(i, energy, basis[1].Ends(i), fromLeft: true);
            var p01 = kernel.PairIntegrals(i, energy, basis[0].Ends(i), energy, basis[1].Ends(i)).Overlap;
            d00 += p00; d01 += p01; d11 += p11;
            if (i >= 1 && i <= n - 2)
            {
                a00 += p00; a01 += p01; a11 += p11;
            }
        }
        // Lead amplitudes at the stack's two interfaces.
        double b00 = 0, b01 = 0, b11 = 0;
        foreach (var (boundary, lead) in new[] { (1, domain.Stack.LeftLead), (n - 1, domain.RightLead) })
        {
            var r = lead.MassElectronMasses / lead.WavenumberPerNanometre(energy);
            double u0 = basis[0].Psi[boundary], w0 = basis[0].DerivativeOverMass[boundary] * r;
            double u1 = basis[1].Psi[boundary], w1 = basis[1].DerivativeOverMass[boundary] * r;
            b00 += u0 * u0 + w0 * w0;
            b01 += u0 * u1 + w0 * w1;
            b11 += u1 * u1 + w1 * w1;
        }
        // Largest λ of det(A − λB) = 0.
        var qa = b00 * b11 - b01 * b01;
        var qb = -(a00 * b11 + a11 * b00 - 2 * a01 * b01);
        var qc = a00 * a11 - a01 * a01;
        var disc = Math.Sqrt(Math.Max(0, qb * qb - 4 * qa * qc));
        var lambda = (-qb + disc) / (2 * qa);
        double c0, c1;
        // (A − λB)c = 0: take the better-conditioned row.
        var r0 = Math.Abs(a00 - lambda * b00) + Math.Abs(a01 - lambda * b01);
        var r1 = Math.Abs(a01 - lambda * b01) + Math.Abs(a11 - lambda * b11);
        if (r0 >= r1)
        {
            c0 = -(a01 - lambda * b01);
            c1 = a00 - lambda * b00;
        }
        else
        {
            c0 = a11 - lambda * b11;
            c1 = -(a01 - lambda * b01);
        }
        var norm = c0 * c0 * d00 + 2 * c0 * c1 * d01 + c1 * c1 * d11;
        var scale = 1 / Math.Sqrt(norm);
        var psi = new double[n + 1];
        var dw = new double[n + 1];
        for (var i = 0; i <= n; i++)
        {
            psi[i] = scale * (c0 * basis[0].Psi[i] + c1 * basis[1].Psi[i]);
            dw[i] = scale * (c0 * basis[0].DerivativeOverMass[i] + c1 * basis[1].DerivativeOverMass[i]);
        }
        return new QuasiBoundState(domain, energy, margin, KernelState.OnDomain(kernel, energy, psi, dw));
    }

    /// <summary>
    /// The state at <paramref name="energy"/>, between the two lead edges of <paramref name="domain"/>, that decays into the closed
    /// lead (the one whose edge lies above the energy): unique up to a factor, propagated from the domain's end in that lead
    /// (where it is the exact exponential) towards the open lead, and normalised on the domain.
    /// </summary>
    internal static QuasiBoundState CreateOpenToOneLead(StackProfile domain, double energy, double margin)
    {
        var kernel = domain.Kernel;
        var n = kernel.Count;
        var left = domain.Stack.LeftLead;
        var right = domain.RightLead;
        var us = new double[n + 1];
        var ws = new double[n + 1];
        var logs = new double[n + 1];
        double u = 1, log = 0;
        if (left.PotentialElectronVolts > right.PotentialElectronVolts)
        {
            var w = left.DecayConstantPerNanometre(energy) / left.MassElectronMasses;
            us[0] = u; ws[0] = w;
            for (var i = 0; i < n; i++)
            {
                kernel.StepForward(i, energy, ref u, ref w, ref log);
                us[i + 1] = u; ws[i + 1] = w; logs[i + 1] = log;
            }
        }
        else
        {
            var w = -right.DecayConstantPerNanometre(energy) / right.MassElectronMasses;
            us[n] = u; ws[n] = w;
            for (var i = n - 1; i >= 0; i--)
            {
                kernel.StepBackward(i, energy, ref u, ref w, ref log);
                us[i] = u; ws[i] = w; logs[i] = log;
            }
        }
        var top = logs.Max();
        for (var i = 0; i <= n; i++)
        {
            var f = Math.Exp(logs[i] - top);
            us[i] *= f;
            ws[i] *= f;
        }
        var raw = KernelState.OnDomain(kernel, energy, us, ws);
        double norm = 0;
        for (var i = 0; i < n; i++)
        {
            norm += kernel.SquareIntegral(i, energy, raw.Ends(i), fromLeft: true);
        }
        var scale = 1 / Math.Sqrt(norm);
        for (var i = 0; i <= n; i++)
        {
            us[i] *= scale;
            ws[i] *= scale;
        }
        return new QuasiBoundState(domain, energy, margin, KernelState.OnDomain(kernel, energy, us, ws));
    }

    /// <summary>ψ at a position of the original stack's frame, nm^(−1/2); zero outside the domain.</summary>
    internal double ValueAt(double positionNanometres)
    {
        var x = positionNanometres + MarginNanometres;
        var boundaries = Domain.Boundaries;
        var n = Domain.Count;
        if (x < 0 || x > boundaries[n])
        {
            return 0;
        }
        // The last layer of positive width that starts at or before x (a linear scan: this serves plots, not the integrals).
        var i = n - 1;
        while (i > 0 && (boundaries[i] > x || Domain.IsDelta(i)))
        {
            i--;
        }
        Domain.Kernel.StateInside(i, EnergyElectronVolts, State.Ends(i), x - boundaries[i], out var psi, out _);
        return psi;
    }
}
