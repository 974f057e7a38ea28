// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

public sealed class GaussKronrodTest
{
    [Fact]
    public void Nodes_MatchPublishedTable()
    {
        // R. Piessens et al., QUADPACK (Springer 1983), qk15: the largest Kronrod node 0.991455371120813 and the
        // 7-point Gauss nodes 0.949107912342759, 0.741531185599394, 0.405845151377397 (Abramowitz and Stegun, Table 25.4, n = 7).
        var nodes = GaussKronrod.KronrodNodes;
        Assert.Equal(0.991455371120813, nodes[0], 1e-15);
        Assert.Equal(0.949107912342759, nodes[1], 1e-15);
        Assert.Equal(0.741531185599394, nodes[3], 1e-15);
        Assert.Equal(0.405845151377397, nodes[5], 1e-15);
        // A&S Table 25.4, n = 7: the central Gauss weight 0.417959183673469 (= 512/1225).
        Assert.Equal(512.0 / 1225.0, GaussKronrod.GaussWeights[3], 1e-16);
    }

    [Fact]
    public void Weights_SumToTheIntervalLength()
    {
        // Both rules integrate 1 exactly on [−1, 1] (common practice, no single source): Σ w = 2.
        var kronrod = GaussKronrod.KronrodWeights;
        var gauss = GaussKronrod.GaussWeights;
        double k = kronrod[7], g = gauss[3];
        for (var j = 0; j < 7; j++)
        {
            k += 2 * kronrod[j];
        }
        for (var j = 0; j < 3; j++)
        {
            g += 2 * gauss[j];
        }
        Assert.Equal(2, k, 1e-15);
        Assert.Equal(2, g, 1e-15);
    }

    [Fact]
    public void Rule_IsExactForDegreeTwentyTwo()
    {
        // The 15-point Kronrod extension of the 7-point Gauss rule has degree 3n + 1 = 22 (Piessens et al., QUADPACK, §2.2):
        // ∫₋₁¹ x²² dx = 2/23. Tolerance: a few ulps.
        var power = new Power(22);
        var result = GaussKronrod.Rule(ref power, -1, 1);
        Assert.Equal(2.0 / 23.0, result.Value, 1e-15);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.5)]
    [InlineData(2.0)]
    public void Integrate_PowerTimesLog(double alpha)
    {
        // QUADPACK's test family (Piessens et al., ch. 6): ∫₀¹ x^α ln(1/x) dx = 1/(1 + α)². The tolerance requested,
        // 1e-10 relative, is what is checked (the integrand is singular in its derivatives at 0).
        var f = new PowerLog(alpha);
        var value = GaussKronrod.Integrate(ref f, 0, 1, 1e-10, 100_000, out var error, out var converged);
        Assert.True(converged);
        var exact = 1 / ((1 + alpha) * (1 + alpha));
        Assert.Equal(exact, value, 1e-10 * exact);
        Assert.True(error <= 1e-10 * Math.Abs(value));
    }

    [Fact]
    public void Integrate_NarrowLorentzian()
    {
        // ∫₋₁¹ dx/(1 + (x/γ)²) = 2γ·atan(1/γ) (elementary antiderivative); γ = 1e-3 puts the mass on 0.1% of the interval.
        var f = new Lorentzian(1e-3);
        var value = GaussKronrod.Integrate(ref f, -1, 1, 1e-12, 100_000, out _, out var converged);
        Assert.True(converged);
        var exact = 2e-3 * Math.Atan(1e3);
        Assert.Equal(exact, value, 1e-11 * exact);
    }

    private readonly struct Power(int exponent) : IRealFunction
    {
        public double Evaluate(double x) => Math.Pow(x, exponent);
    }

    private readonly struct PowerLog(double alpha) : IRealFunction
    {
        public double Evaluate(double x) => x <= 0 ? 0 : Math.Pow(x, alpha) * Math.Log(1 / x);
    }

    private readonly struct Lorentzian(double gamma) : IRealFunction
    {
        public double Evaluate(double x) => 1 / (1 + (x / gamma) * (x / gamma));
    }
}
