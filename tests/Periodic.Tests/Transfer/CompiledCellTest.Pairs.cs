// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics;
using MathNet.Numerics.Integration;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

/// <summary>The kernel's integrals of pairs of states over one element, against independent quadrature of closed-form solutions.</summary>
public sealed partial class CompiledCellTest
{
    /// <summary>A real solution of ψ″ = (m/C)(V − E)ψ in a uniform layer: A cos(ky) + B sin(ky) (cosh/sinh under a barrier).</summary>
    private static (Func<double, double> Psi, Func<double, double> Derivative) Uniform(double e, double v, double mass, double a, double b)
    {
        var s = mass * (e - v) / C;
        if (s > 0)
        {
            var k = Math.Sqrt(s);
            return (y => a * Math.Cos(k * y) + b * Math.Sin(k * y), y => -a * k * Math.Sin(k * y) + b * k * Math.Cos(k * y));
        }
        var kappa = Math.Sqrt(-s);
        return (y => a * Math.Cosh(kappa * y) + b * Math.Sinh(kappa * y), y => a * kappa * Math.Sinh(kappa * y) + b * kappa * Math.Cosh(kappa * y));
    }

    /// <summary>
    /// A real solution in a layer with V(y) = V0 + F·y: A·Ai(ζ) + B·Bi(ζ), ζ = (m/C)^(1/3)F^(−2/3)(V(y) − E)·… written as
    /// ζ = β(y − y_t), β = (mF/C)^(1/3), the Airy equation ψ″ = β³(y − y_t)ψ (Abramowitz and Stegun §10.4; MathNet's Airy functions).
    /// </summary>
    private static (Func<double, double> Psi, Func<double, double> Derivative) Airy(double e, double v0, double slope, double mass, double a, double b)
    {
        var beta = Math.Cbrt(mass * slope / C);
        var turning = (e - v0) / slope;
        return (y => a * SpecialFunctions.AiryAi(beta * (y - turning)) + b * SpecialFunctions.AiryBi(beta * (y - turning)),
            y => beta * (a * SpecialFunctions.AiryAiPrime(beta * (y - turning)) + b * SpecialFunctions.AiryBiPrime(beta * (y - turning))));
    }

    private static ElementEnds Ends((Func<double, double> Psi, Func<double, double> Derivative) f, double width, double mass) =>
        new(f.Psi(0), f.Derivative(0) / mass, f.Psi(width), f.Derivative(width) / mass);

    /// <summary>∫ψ_aψ_b, ∫yψ_aψ_b and ∫ψ_aψ_b′ by MathNet's 256-point Gauss–Legendre rule on [0, w] (an independent quadrature).</summary>
    private static (double Overlap, double Moment, double Momentum) Reference(
        (Func<double, double> Psi, Func<double, double> Derivative) a, (Func<double, double> Psi, Func<double, double> Derivative) b, double width) =>
        (GaussLegendreRule.Integrate(y => a.Psi(y) * b.Psi(y), 0, width, 256),
         GaussLegendreRule.Integrate(y => y * a.Psi(y) * b.Psi(y), 0, width, 256),
         GaussLegendreRule.Integrate(y => a.Psi(y) * b.Derivative(y), 0, width, 256));

    public static TheoryData<double, double, double, double> UniformCases => new()
    {
        // Layer width, potential, and the two energies: well states far apart, a barrier, one above and one below the
        // potential, and two energies 1e-6 eV apart (the quadrature branch).
        { 8.0, 0.0, 0.05, 0.2 },
        { 6.0, 0.3, 0.05, 0.12 },
        { 5.0, 0.1, 0.04, 0.19 },
        { 8.0, 0.0, 0.1, 0.100001 },
        { 4.0, 0.3, 0.1, 0.100001 },
    };

    [Theory]
    [MemberData(nameof(UniformCases))]
    public void PairIntegrals_UniformLayer_MatchesIndependentQuadrature(double width, double v, double ea, double eb)
    {
        const double mass = 0.067;
        var cell = new CompiledCell([Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(v), EffectiveMass.FromElectronMasses(mass))], "elements");
        var a = Uniform(ea, v, mass, 0.7, -0.4);
        var b = Uniform(eb, v, mass, -0.3, 0.9);
        var pair = cell.PairIntegrals(0, ea, Ends(a, width, mass), eb, Ends(b, width, mass));
        var (overlap, moment, momentum) = Reference(a, b, width);
        // The closed form loses at most (scale/ΔE)² ≈ 1e6 ulps (PairClosedFormMinSeparation), the quadrature only rounding:
        // 1e-9 of the integrals' scale (∫|ψ_aψ_b| ≲ w, ∫y|ψ_aψ_b| ≲ w², ∫|ψ_aψ_b′| ≲ k·w) covers both.
        var scale = Math.Max(1, Math.Cosh(Math.Sqrt(Math.Max(0, mass * (v - Math.Min(ea, eb)) / C)) * width));
        Assert.Equal(overlap, pair.Overlap, 1e-9 * width * scale * scale);
        Assert.Equal(moment, pair.LocalMoment, 1e-9 * width * width * scale * scale);
        Assert.Equal(momentum, pair.Momentum, 1e-9 * width * scale * scale);
    }

    public static TheoryData<double, double, double, int> SampleCases => new()
    {
        // Width, potential, energy, panels: an oscillating layer (kw ≈ 5.4, one panel; kw ≈ 27, three panels), a barrier
        // (κw ≈ 3), a thin barrier below κw = 1 (the general branch), and a nearly flat state (kw ≈ 0.3).
        { 8.0, 0.0, 0.26, 1 },
        { 40.0, 0.0, 0.26, 3 },
        { 10.0, 0.26, 0.2, 1 },
        { 1.0, 0.26, 0.2, 1 },
        { 3.0, 0.0, 0.001, 1 },
    };

    [Theory]
    [MemberData(nameof(SampleCases))]
    public void SampleNodes_UniformLayer_MatchesTheSolutionAtEveryNode(double width, double v, double e, int panels)
    {
        const double mass = 0.067;
        var cell = new CompiledCell([Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(v), EffectiveMass.FromElectronMasses(mass))], "elements");
        var f = Uniform(e, v, mass, 0.7, -0.4);
        var rule = Periodic.Numerics.GaussLegendre.Twenty;
        var psi = new double[panels * rule.Order];
        var w = new double[psi.Length];
        cell.SampleNodes(0, e, Ends(f, width, mass), panels, psi, w);
        var h = width / panels;
        for (var q = 0; q < psi.Length; q++)
        {
            var y = (q / rule.Order + 0.5 + 0.5 * rule.Nodes[q % rule.Order]) * h;
            // The closed-form solution (Math.Cos/Sin/Cosh/Sinh) against the kernel's angle-addition and exponential forms: both
            // a few roundings of the same function; 1e-13 of the layer's largest |ψ| and |ψ′/m| covers them.
            var scale = Math.Max(1, Math.Cosh(Math.Sqrt(Math.Max(0, mass * (v - e) / C)) * width));
            Assert.Equal(f.Psi(y), psi[q], 1e-13 * scale);
            Assert.Equal(f.Derivative(y) / mass, w[q], 1e-13 * scale * Math.Sqrt(Math.Abs(mass * (e - v) / C)) / mass);
        }
    }

    public static TheoryData<double, double, double, double, double> LinearCases => new()
    {
        // Width, potential at the left end, slope (eV/nm), and the two energies; the last pair 1e-6 eV apart.
        { 10.0, 0.0, 0.01, 0.05, 0.2 },
        { 6.0, 0.3, 0.02, 0.05, 0.11 },
        { 10.0, 0.0, 0.01, 0.08, 0.080001 },
    };

    [Theory]
    [MemberData(nameof(LinearCases))]
    public void PairIntegrals_LinearLayer_MatchesAiryQuadrature(double width, double v0, double slope, double ea, double eb)
    {
        const double mass = 0.067;
        // A layer under the field F = −slope: the kernel's biased compilation lowers V by F·x.
        var cell = new CompiledCell([Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(v0), EffectiveMass.FromElectronMasses(mass))], -slope, "elements");
        var a = Airy(ea, v0, slope, mass, 0.6, 0.2);
        var b = Airy(eb, v0, slope, mass, -0.4, 0.3);
        var pair = cell.PairIntegrals(0, ea, Ends(a, width, mass), eb, Ends(b, width, mass));
        var (overlap, moment, momentum) = Reference(a, b, width);
        // MathNet's Airy functions carry ≈ 1e-13 relative (measured in LinearLayerPropagatorTest); the kernel's linear-layer
        // propagation the same: 1e-9 of the integrals' scale leaves room for both and the closed form's division by ΔE.
        var scale = Math.Max(1, GaussLegendreRule.Integrate(y => Math.Abs(a.Psi(y) * b.Psi(y)), 0, width, 256) / width);
        Assert.Equal(overlap, pair.Overlap, 1e-9 * width * scale);
        Assert.Equal(moment, pair.LocalMoment, 1e-9 * width * width * scale);
        Assert.Equal(momentum, pair.Momentum, 1e-9 * width * scale * 10);
    }

    [Fact]
    public void StepForward_LinearLayer_CountsTheZerosOfTheAirySolution()
    {
        // Sturm counting under a field: the zeros of Ai(β(y − y_t)) in (0, w] are those of Ai at a_n (MathNet's AiryAi, found by
        // bracketing here), so the count is an outside value.
        const double width = 40, v0 = 0.0, slope = 0.01, mass = 0.067, e = 0.3;
        var cell = new CompiledCell([Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(v0), EffectiveMass.FromElectronMasses(mass))], -slope, "elements");
        var f = Airy(e, v0, slope, mass, 1, 0);
        double u = f.Psi(0), w = f.Derivative(0) / mass, log = 0;
        var zeros = cell.StepForward(0, e, ref u, ref w, ref log);
        var expected = 0;
        const int samples = 200_000;
        for (var j = 0; j < samples; j++)
        {
            var y0 = width * j / samples;
            var y1 = width * (j + 1) / samples;
            if (Math.Sign(f.Psi(y0)) != Math.Sign(f.Psi(y1)))
            {
                expected++;
            }
        }
        Assert.True(expected >= 3, $"a test with {expected} zeros proves little");
        Assert.Equal(expected, zeros);
        // And the end state itself (relative 1e-10: Airy values of this size carry ≈ 1e-13).
        Assert.Equal(f.Psi(width), u * Math.Exp(log), 1e-10 * Math.Max(1, Math.Abs(f.Psi(width))));
    }

    [Fact]
    public void StepBackward_LinearLayer_InvertsStepForward()
    {
        // det M = 1 for the BenDaniel–Duke transfer matrix (a Wronskian: common practice, no single source), so the backward
        // step is the adjugate; a round trip returns the state to rounding of the layer's growth.
        var cell = new CompiledCell([Layer.Create(Length.FromNanometres(7), Energy.FromElectronVolts(0.2), EffectiveMass.FromElectronMasses(0.08))], -0.015, "elements");
        double u = 0.3, w = -1.2, log = 0;
        cell.StepForward(0, 0.1, ref u, ref w, ref log);
        cell.StepBackward(0, 0.1, ref u, ref w, ref log);
        Assert.Equal(0.3, u * Math.Exp(log), 1e-10);
        Assert.Equal(-1.2, w * Math.Exp(log), 1e-10);
    }
}
