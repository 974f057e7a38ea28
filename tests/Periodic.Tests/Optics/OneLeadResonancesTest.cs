// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using MathNet.Numerics.RootFinding;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Optics;

/// <summary>Quasi-bound states between the two lead edges: open into one lead only.</summary>
public class OneLeadResonancesTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double Mass = 0.067, Closed = 0.5, Well = 8, Height = 0.3;

    private static Layer L(double width, double potential) =>
        Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(Mass));

    private static Lead Lead(double potential) => Periodic.Stacks.Lead.Create(Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(Mass));

    /// <summary>
    /// A well of width 8 nm (V = 0) against a closed lead 0.5 eV high on the left, then a barrier 0.3 eV high towards an open lead of
    /// the well's material (V = 0) on the right; one mass throughout.
    /// </summary>
    private static LayerStack Leaky(double barrier) => LayerStack.Create(Lead(Closed), Lead(0), L(Well, 0), L(barrier, Height));

    private static LayerStack Mirrored(double barrier) => LayerStack.Create(Lead(0), Lead(Closed), L(barrier, Height), L(Well, 0));

    private static List<OneLeadResonance> Find(LayerStack stack, double bias = 0) =>
        OneLeadResonances.Find(stack, bias, 100_000, double.PositiveInfinity, ResonanceSearchOptions.Default);

    /// <summary>
    /// The ground level of the closed asymmetric well (the barrier made infinitely thick): k w = π − atan(k/κ_L) − atan(k/κ_b)
    /// for one mass (the finite-well matching of Griffiths §2.6 with different walls on the two sides), solved by MathNet's Brent.
    /// </summary>
    private static double ClosedWellLevel() => Brent.FindRoot(e =>
    {
        var k = Math.Sqrt(Mass * e / C);
        return k * Well - (Math.PI - Math.Atan(k / Math.Sqrt(Mass * (Closed - e) / C)) - Math.Atan(k / Math.Sqrt(Mass * (Height - e) / C)));
    }, 1e-6, Height - 1e-6, 1e-14);

    private static OneLeadResonance Nearest(List<OneLeadResonance> found, double energy) =>
        found.MinBy(r => Math.Abs(r.EnergyElectronVolts - energy));

    [Theory]
    [InlineData(6.0)]
    [InlineData(10.0)]
    public void Find_WellBehindBarrier_WidthApproachesTunnellingRate(double barrier)
    {
        // Γ of a level behind a barrier of transmission T ≪ 1: the decay rate is T times the rate at which the standing wave
        // A sin(kx + δ) hits the barrier, (ħk/m)(A/2)², with A²(w + 1/κ_L + 1/κ_b)/2 = 1 (the exact normalisation of the
        // one-mass well with its two exponential tails [derived]); so Γ = ħ²kT/(2m w_eff) = C k T/(m w_eff) (Gamow's attempt-
        // frequency picture, e.g. Landau and Lifshitz, Quantum Mechanics, §50 — from memory). T is the rectangular barrier's
        // exact 1/T = 1 + V² sinh²(κb)/(4E(V − E)) (Griffiths, Introduction to Quantum Mechanics, problem 2.33), the level that
        // of the closed well. The estimate misses terms of relative order T (the level's shift and the barrier's reflection
        // phase through the leak): the tolerance is T itself (T ≈ 8e-4 at 6 nm, 4e-6 at 10 nm).
        var e = ClosedWellLevel();
        var k = Math.Sqrt(Mass * e / C);
        var kappaLeft = Math.Sqrt(Mass * (Closed - e) / C);
        var kappa = Math.Sqrt(Mass * (Height - e) / C);
        var sinh = Math.Sinh(kappa * barrier);
        var t = 1 / (1 + Height * Height * sinh * sinh / (4 * e * (Height - e)));
        var estimate = C * k * t / (Mass * (Well + 1 / kappaLeft + 1 / kappa));

        var level = Nearest(Find(Leaky(barrier)), e);
        Assert.Equal(1, level.WidthElectronVolts / estimate, t);
        // The level sits within a few widths of the closed well's (its shift is of the order of Γ).
        Assert.True(Math.Abs(level.EnergyElectronVolts - e) < 10 * estimate, $"E = {level.EnergyElectronVolts}, closed well {e}, Γ {estimate}");
    }

    [Theory]
    [InlineData(4.0)]
    [InlineData(8.0)]
    public void Find_WellBehindBarrier_MatchesComplexPole(double barrier)
    {
        // The pole E_p = E_r − iΓ/2 of the outgoing solution (decaying into the closed lead, e^{ikx} only in the open lead), found
        // independently: complex transfer matrices of the one-mass layers (System.Numerics.Complex) and Newton's method. The
        // reflection phase's slope peak gives the same pole to first order in Γ over the energy on which Γ and the background
        // phase vary (here the level's ≈ 0.05 eV; Γ/E ≈ 4e-3 at 4 nm, 2e-5 at 8 nm): Γ within Γ/E relative, E_r within Γ²/E
        // (plus 1e-12 eV for the peak search).
        var level = Nearest(Find(Leaky(barrier)), ClosedWellLevel());
        var gamma = level.WidthElectronVolts;
        var pole = Pole([(Well, 0), (barrier, Height)], new Complex(level.EnergyElectronVolts, -0.5 * gamma));
        var scale = gamma / level.EnergyElectronVolts;
        Assert.True(pole.Imaginary < 0);
        Assert.Equal(1, -2 * pole.Imaginary / gamma, scale);
        Assert.Equal(pole.Real, level.EnergyElectronVolts, gamma * scale + 1e-12);
    }

    [Fact]
    public void Find_MirroredStack_SameLevels()
    {
        // Mirror symmetry x → L − x [derived]: the stack with its closed lead on the right has the same levels and widths. The two
        // computations run on the two orientations (the closed-right one on its mirror image, with its energy shift), so they agree
        // to the peak search's error bounds and to 1e-9 of Γ (the delay's rounding near its flat top).
        var left = Nearest(Find(Leaky(8)), ClosedWellLevel());
        var right = Nearest(Find(Mirrored(8)), ClosedWellLevel());
        Assert.Equal(left.EnergyElectronVolts, right.EnergyElectronVolts, left.ErrorElectronVolts + right.ErrorElectronVolts + 1e-12);
        Assert.Equal(1, right.WidthElectronVolts / left.WidthElectronVolts, 1e-9);
    }

    [Fact]
    public void Find_UnderBias_MirrorImageUnderOppositeBias()
    {
        // Under a bias eU (right lead lowered by eU, field across the layers) the mirror image of the stack under −eU has the potential
        // V(L − x) + eU [derived from the bias convention], so its levels are the original's plus eU and its widths the same. The two
        // run through the biased (Airy) layers in the two orientations; tolerances as for the mirror test.
        const double bias = 0.01;
        var original = Nearest(Find(Leaky(8), bias), ClosedWellLevel());
        var mirror = Nearest(Find(Mirrored(8), -bias), ClosedWellLevel());
        Assert.Equal(original.EnergyElectronVolts + bias, mirror.EnergyElectronVolts, original.ErrorElectronVolts + mirror.ErrorElectronVolts + 1e-12);
        Assert.Equal(1, mirror.WidthElectronVolts / original.WidthElectronVolts, 1e-9);
    }

    [Fact]
    public void Find_BiasToZero_IsContinuous()
    {
        // A bias of 1e-7 eV moves the level by at most 1e-7 eV (Hellmann–Feynman: |∂V/∂(eU)| ≤ 1 everywhere [derived]) and Γ by
        // about 2b·(dκ/dE)·1e-7 ≈ 2e-6 relative (T ∝ e^{−2κb}): the biased (Airy) path agrees with the flat one within 1e-7 eV + the
        // error bounds and 1e-4 in Γ.
        var flat = Nearest(Find(Leaky(8)), ClosedWellLevel());
        foreach (var bias in new[] { 1e-7, -1e-7 })
        {
            var biased = Nearest(Find(Leaky(8), bias), ClosedWellLevel());
            Assert.Equal(flat.EnergyElectronVolts, biased.EnergyElectronVolts, 1e-7 + flat.ErrorElectronVolts + biased.ErrorElectronVolts);
            Assert.Equal(1, biased.WidthElectronVolts / flat.WidthElectronVolts, 1e-4);
        }
    }

    /// <summary>
    /// The complex energy where the solution e^{κ_L x} of the closed lead (x &lt; 0), carried through <paramref name="layers"/>, leaves
    /// as e^{ik_R x} only (no incoming wave) into the open lead at V = 0: Newton's method with a central-difference derivative.
    /// </summary>
    private static Complex Pole((double Width, double Potential)[] layers, Complex guess)
    {
        Complex F(Complex e)
        {
            var kappa = Complex.Sqrt(Mass * (Closed - e) / C);
            Complex u = 1, d = kappa; // ψ and ψ′ (one mass: ψ′ is continuous)
            foreach (var (width, potential) in layers)
            {
                var k = Complex.Sqrt(Mass * (e - potential) / C);
                if (k == Complex.Zero)
                {
                    u += width * d;
                    continue;
                }
                var (c, s) = (Complex.Cos(k * width), Complex.Sin(k * width));
                (u, d) = (c * u + s / k * d, -k * s * u + c * d);
            }
            return d - Complex.ImaginaryOne * Complex.Sqrt(Mass * e / C) * u;
        }
        var x = guess;
        for (var iteration = 0; iteration < 50; iteration++)
        {
            var h = 1e-6 * Math.Max(guess.Magnitude * 1e-3, -guess.Imaginary);
            var derivative = (F(x + h) - F(x - h)) / (2 * h);
            var step = F(x) / derivative;
            x -= step;
            if (step.Magnitude < 1e-16 * x.Magnitude)
            {
                break;
            }
        }
        return x;
    }
}
