// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;

namespace Periodic.Tests.Stacks;

/// <summary>The Tsu–Esaki supply function of <see cref="TsuEsakiIntegrator"/>.</summary>
public sealed class TsuEsakiIntegratorTest
{
    [Theory]
    [InlineData(0.0, 0.0625)]
    [InlineData(-2.0, 0.0625)]
    [InlineData(3.0, -0.0625)]
    [InlineData(0.5, 0.25)]
    [InlineData(-1.0, 0.9)]
    [InlineData(1.0, -0.5)]
    public void Supply_ModerateBias_MatchesTheDefinition(double x, double u)
    {
        // The supply function is ln[(1 + e^x)/(1 + e^(x − u))] (L. Esaki and R. Tsu, IBM J. Res. Dev. 14, 61 (1970);
        // docs/references.md). Written out in doubles here: the ratio carries about 3 roundings, and d(ln r) = dr/r, so
        // its logarithm is off by at most ~7e-16 absolute, below 3e-14 of these values (|ln r| ≥ 0.03). 1e-13 relative
        // allows that; an expm1 error such as MathNet 5.0's 1.3e-7 at u = 1/16 passes straight into the result and fails.
        var definition = Math.Log((1 + Math.Exp(x)) / (1 + Math.Exp(x - u)));
        var supply = TsuEsakiIntegrator.Supply(x, u);
        Assert.True(Math.Abs(supply / definition - 1) <= 1e-13, $"x = {x}, u = {u}: {supply:R} vs {definition:R}");
    }

    [Fact]
    public void Supply_TinyBias_IsLinearInTheBias()
    {
        // d/du ln[(1 + e^x)/(1 + e^(x − u))] at u = 0 is the logistic σ(x) = 1/(1 + e^(−x)) (differentiate the definition),
        // and the next term is O(u²): at u = 1e-12 the supply is u·σ(x) to 1e-12 relative. The tolerance, 1e-15 relative,
        // covers the roundings of expm1, σ and log1p; a difference of two ln(1 + e^x) would keep only ~4 digits here.
        const double u = 1e-12;
        foreach (var x in new[] { -3.0, 0.0, 0.7, 4.0 })
        {
            var expected = u / (1 + Math.Exp(-x));
            Assert.True(Math.Abs(TsuEsakiIntegrator.Supply(x, u) / expected - 1) <= 1e-12 + 1e-15, $"x = {x}");
        }
    }
}
