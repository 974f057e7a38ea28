// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Transfer;

/// <summary>The exact transfer matrix of a layer with a linear potential (Airy form and sublayer series).</summary>
public sealed class LinearLayerPropagatorTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private delegate void Propagator(double e, double v0, double slope, double width, double mass,
        out double m11, out double m12, out double m21, out double m22, out double logScale);

    /// <summary>
    /// Independent reference: classical fourth-order Runge–Kutta for ψ″ = (m/C)(V₀ + slope·x − E)ψ on (ψ, ψ′/m)
    /// (e.g. W. H. Press et al., Numerical Recipes, 3rd ed., §17.1), both fundamental solutions.
    /// </summary>
    private static double[] RungeKutta(double e, double v0, double slope, double width, double mass, int steps)
    {
        var h = width / steps;
        double[] m = [1, 0, 0, 1]; // columns: start (1, 0) and (0, 1)
        for (var column = 0; column < 2; column++)
        {
            double u = column == 0 ? 1 : 0, w = column == 0 ? 0 : 1;
            for (var i = 0; i < steps; i++)
            {
                var x = i * h;
                double F(double xx) => (v0 + slope * xx - e) / C; // (ψ′/m)′ = ((V − E)/C) ψ
                var k1u = mass * w; var k1w = F(x) * u;
                var k2u = mass * (w + 0.5 * h * k1w); var k2w = F(x + 0.5 * h) * (u + 0.5 * h * k1u);
                var k3u = mass * (w + 0.5 * h * k2w); var k3w = F(x + 0.5 * h) * (u + 0.5 * h * k2u);
                var k4u = mass * (w + h * k3w); var k4w = F(x + h) * (u + h * k3u);
                u += h / 6 * (k1u + 2 * k2u + 2 * k3u + k4u);
                w += h / 6 * (k1w + 2 * k2w + 2 * k3w + k4w);
            }
            m[column] = u;       // m11 or m12
            m[2 + column] = w;   // m21 or m22
        }
        return m;
    }

    /// <summary>Largest entry difference, entries made dimensionless with the length w and mass m, relative to the largest entry.</summary>
    private static double Difference(double[] a, double[] b, double width, double mass)
    {
        double[] unit = [1, 1 / (mass * width), mass * width, 1];
        double diff = 0, size = 0;
        for (var i = 0; i < 4; i++)
        {
            diff = Math.Max(diff, Math.Abs(a[i] - b[i]) * unit[i]);
            size = Math.Max(size, Math.Abs(b[i]) * unit[i]);
        }
        return diff / size;
    }

    private static double[] Run(Propagator propagator, double e, double v0, double slope, double width, double mass)
    {
        propagator(e, v0, slope, width, mass, out var m11, out var m12, out var m21, out var m22, out var logScale);
        var scale = Math.Exp(logScale);
        return [m11 * scale, m12 * scale, m21 * scale, m22 * scale];
    }

    // (E, V₀, slope, width, mass): oscillating; barrier; turning point inside (rising and falling); deep tunnelling; both signs.
    public static TheoryData<double, double, double, double, double> Cases => new()
    {
        { 0.20, 0.00, -0.02, 10.0, 0.067 },
        { 0.05, 0.30, -0.02, 5.0, 0.067 },
        { 0.10, 0.20, -0.03, 8.0, 0.067 },
        { 0.10, 0.00, 0.03, 8.0, 0.067 },
        { 0.02, 0.80, -0.05, 6.0, 0.092 },
        { 0.40, 0.10, 0.05, 4.0, 0.15 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void EvaluateAiry_MatchesRungeKutta(double e, double v0, double slope, double width, double mass)
    {
        // Independent integration of the same ODE. Tolerance 1e-10 relative: RK4 with 40 000 steps has a global
        // error ~(k·h)⁴·k·w ≲ 1e-13 here (checked below against 20 000 steps), the Airy form ~1e-13.
        var reference = RungeKutta(e, v0, slope, width, mass, 40_000);
        var coarse = RungeKutta(e, v0, slope, width, mass, 20_000);
        var airy = Run(LinearLayerPropagator.EvaluateAiry, e, v0, slope, width, mass);
        var error = Difference(airy, reference, width, mass);
        output.WriteLine($"Airy vs RK4: {error:E3} (RK4 self-check {Difference(coarse, reference, width, mass):E3})");
        Assert.True(Difference(coarse, reference, width, mass) < 1e-11);
        Assert.True(error < 1e-10, $"{error}");
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void EvaluateSeries_MatchesRungeKutta(double e, double v0, double slope, double width, double mass)
    {
        // As above, for the sublayer power series.
        var reference = RungeKutta(e, v0, slope, width, mass, 40_000);
        var series = Run(LinearLayerPropagator.EvaluateSeries, e, v0, slope, width, mass);
        var error = Difference(series, reference, width, mass);
        output.WriteLine($"series vs RK4: {error:E3}");
        Assert.True(error < 1e-10, $"{error}");
    }

    [Fact]
    public void EvaluateSeries_ZeroSlope_IsFlatLayer()
    {
        // A flat layer: [[cos kw, m sin(kw)/k], [−k sin(kw)/m, cos kw]] and its cosh/sinh form in a barrier
        // (any QM text). Tolerance 1e-14 relative: a few tens of roundings in the sublayer products.
        var worst = 0.0;
        foreach (var (e, v) in new[] { (0.3, 0.0), (0.05, 0.3), (0.1, 0.1 - 1e-9) })
        {
            const double width = 7.0, mass = 0.067;
            var s = mass * (e - v) / C;
            double[] exact = s > 0
                ? [Math.Cos(Math.Sqrt(s) * width), mass * Math.Sin(Math.Sqrt(s) * width) / Math.Sqrt(s), -Math.Sqrt(s) * Math.Sin(Math.Sqrt(s) * width) / mass, Math.Cos(Math.Sqrt(s) * width)]
                : [Math.Cosh(Math.Sqrt(-s) * width), mass * Math.Sinh(Math.Sqrt(-s) * width) / Math.Sqrt(-s), Math.Sqrt(-s) * Math.Sinh(Math.Sqrt(-s) * width) / mass, Math.Cosh(Math.Sqrt(-s) * width)];
            worst = Math.Max(worst, Difference(Run(LinearLayerPropagator.EvaluateSeries, e, v, 0, width, mass), exact, width, mass));
        }
        output.WriteLine($"worst flat-layer difference {worst:E3}");
        Assert.True(worst < 1e-14, $"{worst}");
    }

    [Fact]
    public void Evaluate_AcrossTheSwitch_IsContinuous()
    {
        // Both forms are exact; where Evaluate switches between them (|z| = 40 at an end, span βw = 0.25, or 64
        // sublayers) they must agree. Measured over a grid of energies and fields straddling both switches: the worst relative
        // difference of the matrices is the jump a caller could see. Acceptance 1e-12 (the brief's target;
        // the Airy functions themselves are good to ~4e-14 at |z| = 40 against 40-digit values).
        var worst = 0.0;
        var airyChosen = 0;
        const double mass = 0.067, width = 6.0;
        foreach (var slope in new[] { -0.002, -0.005, -0.01, -0.03, 0.01, 0.05 })
        {
            var beta = Math.Cbrt(mass * Math.Abs(slope) / C);
            var eps0 = Math.Cbrt(C * slope * slope / mass);
            foreach (var end in new[] { 0.0, width })
            {
                foreach (var sign in new[] { -1.0, 1.0 })
                {
                    // Energies that put z at this end just inside and just outside |z| = 40.
                    foreach (var z in new[] { 39.9, 40.1 })
                    {
                        var e = 0.1 + slope * end - sign * z * eps0;
                        var airy = Run(LinearLayerPropagator.EvaluateAiry, e, 0.1, slope, width, mass);
                        var series = Run(LinearLayerPropagator.EvaluateSeries, e, 0.1, slope, width, mass);
                        if (beta * width >= LinearLayerPropagator.AiryMinSpan)
                        {
                            worst = Math.Max(worst, Difference(airy, series, width, mass));
                        }
                    }
                }
            }
        }
        // The span switch: fields giving βw just above and below 0.25, energies across the well.
        foreach (var span in new[] { 0.249, 0.251, 0.3 })
        {
            var slope = -C * Math.Pow(span / width, 3) / mass;
            var eps0 = Math.Cbrt(C * slope * slope / mass);
            foreach (var z in new[] { -30.0, -3.0, -0.5, 0.0, 0.7, 5.0, 30.0 })
            {
                var e = 0.1 - z * eps0;
                worst = Math.Max(worst, Difference(Run(LinearLayerPropagator.EvaluateAiry, e, 0.1, slope, width, mass),
                    Run(LinearLayerPropagator.EvaluateSeries, e, 0.1, slope, width, mass), width, mass));
            }
        }
        // The cost switch (series up to 64 sublayers): thick layers in strong fields, βw from 5 to 40, with the
        // arguments at both ends spread over [−40, 40].
        foreach (var span in new[] { 5.0, 9.5, 10.5, 20.0, 40.0 })
        {
            const double thick = 50.0;
            var slope = -C * Math.Pow(span / thick, 3) / mass;
            var eps0 = Math.Cbrt(C * slope * slope / mass);
            foreach (var z in new[] { -40.0 + span, -20.0, -5.0, 0.0, 3.0, 17.0, 40.0 })
            {
                var e = 0.1 - z * eps0;
                if (LinearLayerPropagator.Choose(e, 0.1, slope, thick, mass) == LinearLayerPropagator.Method.Airy)
                {
                    airyChosen++;
                }
                worst = Math.Max(worst, Difference(Run(LinearLayerPropagator.EvaluateAiry, e, 0.1, slope, thick, mass),
                    Run(LinearLayerPropagator.EvaluateSeries, e, 0.1, slope, thick, mass), thick, mass));
            }
        }
        output.WriteLine($"worst Airy/series difference at the switches {worst:E3}; Airy chosen at {airyChosen} of the thick-layer points");
        Assert.True(airyChosen > 5);
        Assert.True(worst < 1e-12, $"{worst}");
    }

    [Fact]
    public void Evaluate_Determinant_IsOne()
    {
        // Wronskian conservation: det M = 1 for any real potential (Abel's identity; any ODE text). Tolerance:
        // relative to the product of the largest entries (the determinant of a matrix with entries ~e^(κw) is a
        // difference of squares of that size), 1e-12. That bound says nothing once e^(−2·logScale) falls below it, so the
        // check counts only layers with logScale ≤ 5 (det of the mantissas ≥ 4.5e-5), and at least 100 of them must occur.
        var counted = 0;
        var gen =
            from e in Gen.Choose(0, 10_000).Select(i => -0.2 + 1.2 * i / 10_000.0)
            from v0 in Gen.Choose(0, 10_000).Select(i => -0.3 + 1.0 * i / 10_000.0)
            from slope in Gen.Choose(-10_000, 10_000).Select(i => 0.1 * i / 10_000.0)
            from width in Gen.Choose(1, 10_000).Select(i => 20.0 * i / 10_000.0)
            from mass in Gen.Choose(1, 10_000).Select(i => 0.02 + 0.5 * i / 10_000.0)
            select (e, v0, slope, width, mass);
        var worst = 0.0;
        Prop.ForAll(gen.ToArbitrary(), input =>
        {
            var (e, v0, slope, width, mass) = input;
            LinearLayerPropagator.Evaluate(e, v0, slope, width, mass, out var m11, out var m12, out var m21, out var m22, out var logScale);
            var det = m11 * m22 - m12 * m21;
            var size = Math.Max(Math.Abs(m11 * m22), Math.Abs(m12 * m21));
            var expected = Math.Exp(-2 * logScale); // the entries are mantissas of e^logScale·M
            var error = Math.Abs(det - expected) / size;
            if (logScale > 5)
            {
                return double.IsFinite(det);
            }
            counted++;
            worst = Math.Max(worst, error);
            return double.IsFinite(det) && error < 1e-12;
        }).Check(Config.QuickThrowOnFailure.WithReplay(0x5EED_B1A5UL, 0x2026_1203UL).WithMaxTest(300));
        output.WriteLine($"worst |det M - 1| relative {worst:E3} over {counted} layers with logScale <= 5");
        Assert.True(counted >= 100, $"{counted}");
    }
}
