// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Transfer;

namespace Periodic.Tests.Transfer;

public sealed class UniformLayerPropagatorTest
{
    [Theory]
    [InlineData(3e-7)]
    [InlineData(-3e-7)]
    [InlineData(9e-5)]
    [InlineData(-9e-5)]
    [InlineData(2e-3)]
    [InlineData(-2e-3)]
    [InlineData(0.4)]
    [InlineData(-0.4)]
    public void EvaluateShortStep_SmallArgument_MatchesCosineAndSine(double s)
    {
        // c = cos(√s·w) and S = sin(√s·w)/√s (cosh, sinh(κw)/κ for s < 0) with w = 1; ∂c/∂s = −w·S/2 and
        // ∂S/∂s = (w·c − S)/(2s) by differentiating them (elementary calculus, no single source). The short-step form
        // cuts the Taylor series by |z|; its omitted terms are below 1e-22 relative, so it must agree with the closed
        // forms to rounding: 4 ulps of values of order one for c and S. For ∂S/∂s the closed form (w·c − S)/(2s)
        // cancels catastrophically at small s (it loses log10(1/|s|) digits), so it is compared with the full-length
        // series of Evaluate instead (same Horner scheme, more terms): 4 ulps of its leading 1/6 (times w³ = 1).
        UniformLayerPropagator.EvaluateShortStep(s, 1.0, out var c, out var sinc, out var dcds, out var dSds, out var logScale);
        var root = Math.Sqrt(Math.Abs(s));
        var expectedC = s > 0 ? Math.Cos(root) : Math.Cosh(root);
        var expectedS = s > 0 ? Math.Sin(root) / root : Math.Sinh(root) / root;
        const double ulp = 2.220446049250313e-16;
        Assert.Equal(0.0, logScale);
        Assert.Equal(expectedC, c, 4 * ulp);
        Assert.Equal(expectedS, sinc, 4 * ulp);
        Assert.Equal(-0.5 * sinc, dcds, 4 * ulp);
        UniformLayerPropagator.Evaluate(s, 1.0, out _, out _, out _, out var fullSeries, out _);
        Assert.Equal(fullSeries, dSds, 4 * ulp / 6);
    }
}
