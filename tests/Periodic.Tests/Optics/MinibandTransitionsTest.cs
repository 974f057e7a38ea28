// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Bands;
using Periodic.Optics;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Optics;

public class MinibandTransitionsTest
{
    private static BandStructure Superlattice() => BandStructure.Compute(UnitCell.KronigPenney(
        Length.FromNanometres(6), Length.FromNanometres(3), Energy.FromElectronVolts(0.3),
        EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092)), 2);

    [Fact]
    public void Compute_MatchesBerryConnectionOfPublicBlochFunctions()
    {
        // Interband position matrix element of Bloch states X_12(k) = i⟨u_1k|∂_k u_2k⟩ over one cell (E. I. Blount, Solid State
        // Physics 13, 305 (1962) — from memory), evaluated here from the library's BlochFunction (another code path) by a central
        // difference in k; the phase gauge drops out because ⟨u_1k|u_2k⟩ = 0.
        var bands = Superlattice();
        var result = MinibandTransitions.Compute(bands, 1, 2, 5);
        var d = bands.PeriodNanometres;
        // Gauss–Legendre per layer (kinks at the interfaces 0, 6, 9 nm): 64 nodes per layer, exact for these entire functions.
        var nodes = new List<double>();
        var weights = new List<double>();
        foreach (var (a, b) in new[] { (0.0, 6.0), (6.0, 9.0) })
        {
            var rule = new MathNet.Numerics.Integration.GaussLegendreRule(a, b, 64);
            nodes.AddRange(rule.Abscissas);
            weights.AddRange(rule.Weights);
        }
        var x = nodes.ToArray();
        Complex[] Periodic(int band, double k)
        {
            var re = new double[x.Length];
            var im = new double[x.Length];
            BlochFunction.Create(bands, band, k).EvaluatePeriodicPart(x, re, im);
            return [.. re.Zip(im, (r, i) => new Complex(r, i))];
        }
        foreach (var i in new[] { 1, 2, 3 })
        {
            var k = result.WavevectorsPerNanometre[i];
            const double delta = 1e-4;
            var u1 = Periodic(1, k);
            var plus = Periodic(2, k + delta);
            var minus = Periodic(2, k - delta);
            var centre = Periodic(2, k);
            // Align the phases of u_2(k ± δ) with u_2(k) (the library may fix them differently at each k).
            Complex Phase(Complex[] u)
            {
                Complex s = 0;
                for (var q = 0; q < x.Length; q++)
                {
                    s += weights[q] * Complex.Conjugate(centre[q]) * u[q];
                }
                return s / s.Magnitude;
            }
            var pPlus = Phase(plus);
            var pMinus = Phase(minus);
            Complex berry = 0;
            for (var q = 0; q < x.Length; q++)
            {
                var derivative = (plus[q] / pPlus - minus[q] / pMinus) / (2 * delta);
                berry += weights[q] * Complex.Conjugate(u1[q]) * derivative;
            }
            // Central difference error O(δ²) ≈ 1e-8 relative; rounding of the difference ≈ 1e-16/δ = 1e-12: 1e-6.
            Assert.Equal(berry.Magnitude, result.DipolesNanometres[i], 1e-6 * berry.Magnitude);
        }
        Assert.True(result.OrthogonalityError < 1e-12);
    }

    [Fact]
    public void JointDensityOfStates_IntegratesToStatesPerLength()
    {
        // Every k in (0, π/d) (and its −k) contributes one transition: ∫g_J dE = (1/π)(π/d) = 1/d [derived].
        var bands = Superlattice();
        var result = MinibandTransitions.Compute(bands, 1, 2, 201);
        var energies = result.UpperEnergiesElectronVolts.Zip(result.LowerEnergiesElectronVolts, (b, a) => b - a).ToArray();
        var lo = energies.Min();
        var hi = energies.Max();
        const int steps = 200_000;
        double integral = 0;
        for (var s = 0; s < steps; s++)
        {
            integral += result.JointDensityOfStates(lo + (hi - lo) * (s + 0.5) / steps) * (hi - lo) / steps;
        }
        // The piecewise-constant g_J is integrated by the midpoint rule: error ≈ one step at each of the 200 breaks, 1e-3.
        Assert.Equal(1 / bands.PeriodNanometres, integral, 1e-3 / bands.PeriodNanometres);
        Assert.Equal(0, result.JointDensityOfStates(hi + 0.01));
    }
}
