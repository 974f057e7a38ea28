// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

public sealed class GaussLegendreTest
{
    [Theory]
    [InlineData(10)]
    [InlineData(20)]
    public void Nodes_MatchMathNetRule(int order)
    {
        // Reference library: MathNet.Numerics GaussLegendreRule on [−1, 1] (tabulated/computed nodes and weights).
        var ours = order == 10 ? GaussLegendre.Ten : GaussLegendre.Twenty;
        var reference = new GaussLegendreRule(-1, 1, order);
        var expectedNodes = reference.Abscissas.OrderBy(x => x).ToArray();
        var expectedWeights = reference.Abscissas.Zip(reference.Weights).OrderBy(p => p.First).Select(p => p.Second).ToArray();
        for (var i = 0; i < order; i++)
        {
            // Newton to 1e-16 on the Legendre recurrence: agreement to a few ulps.
            Assert.Equal(expectedNodes[i], ours.Nodes[i], 1e-14);
            Assert.Equal(expectedWeights[i], ours.Weights[i], 1e-14);
        }
    }

    [Fact]
    public void Four_MatchesPublishedTable()
    {
        // Abramowitz and Stegun, Handbook of Mathematical Functions, Table 25.4 (n = 4), 15 digits as printed.
        double[] nodes = [-0.861136311594053, -0.339981043584856, 0.339981043584856, 0.861136311594053];
        double[] weights = [0.347854845137454, 0.652145154862546, 0.652145154862546, 0.347854845137454];
        for (var i = 0; i < 4; i++)
        {
            // The table is rounded to 15 decimals: agreement to 1e-15.
            Assert.Equal(nodes[i], GaussLegendre.Four.Nodes[i], 1e-15);
            Assert.Equal(weights[i], GaussLegendre.Four.Weights[i], 1e-15);
        }
    }

    [Fact]
    public void Eight_MatchesPublishedTable()
    {
        // Abramowitz and Stegun, Table 25.4 (n = 8), positive nodes with their weights.
        double[] nodes = [0.183434642495650, 0.525532409916329, 0.796666477413627, 0.960289856497536];
        double[] weights = [0.362683783378362, 0.313706645877887, 0.222381034453374, 0.101228536290376];
        for (var i = 0; i < 4; i++)
        {
            // Rounded to 15 decimals in the table.
            Assert.Equal(nodes[i], GaussLegendre.Eight.Nodes[4 + i], 1e-15);
            Assert.Equal(weights[i], GaussLegendre.Eight.Weights[4 + i], 1e-15);
            Assert.Equal(-nodes[i], GaussLegendre.Eight.Nodes[3 - i], 1e-15);
        }
    }

    [Fact]
    public void TwoPointOffset_IsHalfOfOneOverRootThree()
    {
        // The 2-point nodes are ±1/√3 on [−1, 1] (Abramowitz and Stegun, Table 25.4): on [0, 1] 1/2 ± √3/6.
        Assert.True(Math.Abs(0.5 / Math.Sqrt(3) - GaussLegendre.TwoPointOffsetOnUnitInterval) <= 1e-16);
    }

    [Theory]
    [InlineData(4)]
    [InlineData(8)]
    [InlineData(10)]
    public void Integrate_IsExactForDegreeTwoNMinusOne(int order)
    {
        // An n-point Gauss–Legendre rule integrates polynomials of degree 2n − 1 exactly (Abramowitz and Stegun, 25.4.29):
        // ∫₀² x^(2n−1) dx = 2^(2n)/(2n). Tolerance: a few ulps of the result.
        var rule = order == 4 ? GaussLegendre.Four : order == 8 ? GaussLegendre.Eight : GaussLegendre.Ten;
        var power = new Power(2 * order - 1);
        var expected = Math.Pow(2, 2 * order) / (2 * order);
        Assert.Equal(expected, rule.Integrate(ref power, 0, 2), 1e-13 * expected);
    }

    private readonly struct Power(int exponent) : IRealFunction
    {
        public double Evaluate(double x) => Math.Pow(x, exponent);
    }
}
