// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// The real solution at a resonance energy above both lead band edges that is most concentrated in the stack,
/// normalised on the stack plus a margin of each lead.
/// </summary>
/// <remarks>
/// Method: at energy E the real solutions form a two-dimensional space. Of all of them this takes the one that
/// maximises ∫_stack ψ² / (a_L² + a_R²), a_L and a_R being its oscillation amplitudes in the two leads
/// (a² = ψ² + (mψ′/(m k))² at the interface): a 2 × 2 generalised symmetric eigenproblem. At a narrow resonance
/// this is the quasi-bound state of the Breit–Wigner picture (e.g. L. D. Landau, E. M. Lifshitz, Quantum
/// Mechanics, §134); for a broad peak the weight in the leads dominates and the dipoles depend on the margin,
/// which the caller checks by doubling it.
/// </remarks>
internal sealed class QuasiBoundState
{
    private readonly StackProfile _profile;
    private readonly double[] _u;
    private readonly double[] _w;
    private readonly double[] _log;

    private QuasiBoundState(StackProfile profile, double energy, double margin, double[] u, double[] w, double[] log, double[] samples, LayerIntegrals grid)
    {
        _profile = profile;
        EnergyElectronVolts = energy;
        MarginNanometres = margin;
        _u = u;
        _w = w;
        _log = log;
        Samples = samples;
        Grid = grid;
    }

    internal double EnergyElectronVolts { get; }

    internal double MarginNanometres { get; }

    /// <summary>The grid of the extended stack (positions shifted by the margin relative to the original stack).</summary>
    internal LayerIntegrals Grid { get; }

    /// <summary>ψ on <see cref="Grid"/>, normalised on the domain.</summary>
    internal double[] Samples { get; }

    internal double DomainStartNanometres => -MarginNanometres;

    internal double DomainEndNanometres => _profile.Boundaries[^1] - MarginNanometres;

    /// <summary>Builds the state at <paramref name="energy"/> for <paramref name="stack"/>, its grid fine enough for energies down to <paramref name="lowest"/>.</summary>
    internal static QuasiBoundState Create(LayerStack stack, double energy, double margin, double lowest, long maxElements)
    {
        var leftLayer = Layer.Create(Length.FromNanometres(margin), stack.LeftLead.Potential, stack.LeftLead.Mass);
        var rightLayer = Layer.Create(Length.FromNanometres(margin), stack.RightLead.Potential, stack.RightLead.Mass);
        var parts = new List<StackPart> { StackPart.Single(leftLayer) };
        parts.AddRange(stack.Parts);
        parts.Add(StackPart.Single(rightLayer));
        var extended = LayerStack.Create(stack.LeftLead, parts, stack.RightLead);
        var profile = new StackProfile(extended, maxElements + 2, nameof(stack));
        var n = profile.Count;
        var grid = LayerIntegrals.Create(profile, Math.Min(lowest, energy), energy);

        // Two independent real solutions from the left end of the domain.
        var states = new double[2][][];
        for (var basis = 0; basis < 2; basis++)
        {
            double u0 = basis == 0 ? 1 : 0, w0 = basis == 0 ? 0 : 1, log = 0;
            var us = new double[n + 1];
            var ws = new double[n + 1];
            var logs = new double[n + 1];
            us[0] = u0; ws[0] = w0; logs[0] = log;
            for (var i = 0; i < n; i++)
            {
                profile.Kernel.StepForward(i, energy, ref u0, ref w0, ref log);
                us[i + 1] = u0; ws[i + 1] = w0; logs[i + 1] = log;
            }
            states[basis] = [us, ws, logs];
        }
        // Bring both to one scale per boundary so that they can be combined.
        var common = new double[n + 1];
        for (var i = 0; i <= n; i++)
        {
            common[i] = Math.Max(states[0][2][i], states[1][2][i]);
        }
        var phi = new double[2][];
        for (var basis = 0; basis < 2; basis++)
        {
            phi[basis] = new double[grid.Count];
            Sample(profile, grid, energy, states[basis][0], states[basis][1], Rescale(states[basis][2], common), common, phi[basis]);
        }

        // Gram matrix over the original stack (elements 1 … n − 2) and the lead amplitudes at its two interfaces.
        double a00 = 0, a01 = 0, a11 = 0;
        for (var q = grid.LayerStart[1]; q < grid.LayerStart[n - 1]; q++)
        {
            a00 += grid.Weights[q] * phi[0][q] * phi[0][q];
            a01 += grid.Weights[q] * phi[0][q] * phi[1][q];
            a11 += grid.Weights[q] * phi[1][q] * phi[1][q];
        }
        double b00 = 0, b01 = 0, b11 = 0;
        foreach (var (boundary, lead) in new[] { (1, stack.LeftLead), (n - 1, stack.RightLead) })
        {
            var k = lead.WavenumberPerNanometre(energy);
            var r = lead.MassElectronMasses / k;
            var f0 = Math.Exp(states[0][2][boundary] - common[boundary]);
            var f1 = Math.Exp(states[1][2][boundary] - common[boundary]);
            double u0 = states[0][0][boundary] * f0, w0 = states[0][1][boundary] * f0 * r;
            double u1 = states[1][0][boundary] * f1, w1 = states[1][1][boundary] * f1 * r;
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
        var u = new double[n + 1];
        var w2 = new double[n + 1];
        for (var i = 0; i <= n; i++)
        {
            var f0 = Math.Exp(states[0][2][i] - common[i]);
            var f1 = Math.Exp(states[1][2][i] - common[i]);
            u[i] = c0 * states[0][0][i] * f0 + c1 * states[1][0][i] * f1;
            w2[i] = c0 * states[0][1][i] * f0 + c1 * states[1][1][i] * f1;
        }
        var samples = new double[grid.Count];
        for (var q = 0; q < samples.Length; q++)
        {
            samples[q] = c0 * phi[0][q] + c1 * phi[1][q];
        }
        double norm = 0;
        for (var q = 0; q < samples.Length; q++)
        {
            norm += grid.Weights[q] * samples[q] * samples[q];
        }
        var scale = 1 / Math.Sqrt(norm);
        for (var q = 0; q < samples.Length; q++)
        {
            samples[q] *= scale;
        }
        var logScale = Math.Log(scale);
        for (var i = 0; i <= n; i++)
        {
            common[i] += logScale;
        }
        return new QuasiBoundState(profile, energy, margin, u, w2, common, samples, grid);
    }

    private static double[] Rescale(double[] log, double[] common)
    {
        var factors = new double[log.Length];
        for (var i = 0; i < log.Length; i++)
        {
            factors[i] = Math.Exp(log[i] - common[i]);
        }
        return factors;
    }

    /// <summary>ψ on the grid from the states (u, w)·factor·e^log at the left end of each element.</summary>
    private static void Sample(StackProfile profile, LayerIntegrals grid, double energy, double[] u, double[] w, double[] factor, double[] log, double[] destination)
    {
        for (var j = 0; j < profile.Count; j++)
        {
            if (grid.LayerStart[j] == grid.LayerStart[j + 1])
            {
                continue;
            }
            profile.Kernel.LayerCoefficients(j, energy, out var mass, out var s);
            for (var q = grid.LayerStart[j]; q < grid.LayerStart[j + 1]; q++)
            {
                UniformLayerPropagator.Evaluate(s, grid.Positions[q] - profile.Boundaries[j], out var c, out var sinc, out _, out _, out var logScale);
                destination[q] = (c * u[j] + mass * sinc * w[j]) * factor[j] * Math.Exp(log[j] + logScale);
            }
        }
    }

    /// <summary>ψ at a position of the original stack's frame, nm^(−1/2); zero outside the domain.</summary>
    internal double ValueAt(double positionNanometres)
    {
        var x = positionNanometres + MarginNanometres;
        var boundaries = _profile.Boundaries;
        var n = _profile.Count;
        if (x < 0 || x > boundaries[n])
        {
            return 0;
        }
        // The last layer of positive width that starts at or before x (a linear scan: this serves plots, not the integrals).
        var i = n - 1;
        while (i > 0 && (boundaries[i] > x || _profile.IsDelta(i)))
        {
            i--;
        }
        _profile.Kernel.LayerCoefficients(i, EnergyElectronVolts, out var mass, out var s);
        UniformLayerPropagator.Evaluate(s, x - boundaries[i], out var c, out var sinc, out _, out _, out var logScale);
        return (c * _u[i] + mass * sinc * _w[i]) * Math.Exp(_log[i] + logScale);
    }
}
