// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

public sealed class RootFindingTest
{
    // Test problems with published roots:
    // sin x − x/2 on [π/2, π]: G. E. Alefeld, F. A. Potra and Y. Shi, ACM TOMS 21, 327 (1995), problem 1, root 1.8954942670339809471.
    // x³ − 2x − 5 on [2, 3]: Wallis's equation (the classic example of Newton's method, e.g. Press et al., Numerical Recipes), root 2.0945514815423265915.
    // x² − 2 on [1, 2]: root √2 = 1.4142135623730950488 (its definition; the digits as in Abramowitz and Stegun, Table 1.1).
    public static TheoryData<int, double, double, double> Problems => new()
    {
        { 1, Math.PI / 2, Math.PI, 1.8954942670339809471 },
        { 2, 2, 3, 2.0945514815423265915 },
        { 3, 1, 2, 1.4142135623730950488 },
    };

    [Theory]
    [MemberData(nameof(Problems))]
    public void BrentAndSafeguardedNewton_FindPublishedRoot(int problem, double lower, double upper, double root)
    {
        var f = new Problem(problem);
        foreach (var result in new[] { RootFinding.Brent(ref f, lower, upper, 1e-15, 0, 100), RootFinding.SafeguardedNewton(ref f, lower, upper, 1e-15, 0, 100) })
        {
            Assert.Equal(RootStatus.Converged, result.Status);
            // Tolerance 1e-15 requested; the published roots carry 17+ digits: agreement to 4 ulps of the root.
            Assert.Equal(root, result.Root, 4 * FloatingPoint.MachineEpsilon * root);
            Assert.True(Math.Abs(result.Root - root) <= result.ErrorBound + 4 * FloatingPoint.MachineEpsilon * root);
        }
    }

    [Fact]
    public void Brent_ReportsAMissingBracket()
    {
        // sin x − x/2 is positive on [0.5, 1.5] (problem 1 of Alefeld et al. has its only positive root near 1.895).
        var f = new Problem(1);
        var result = RootFinding.Brent(ref f, 0.5, 1.5, 1e-15, 0, 100);
        Assert.Equal(RootStatus.NotBracketed, result.Status);
    }

    private readonly struct Problem(int number) : IDifferentiableFunction, IRealFunction
    {
        public double Evaluate(double x) => Evaluate(x, out _);

        public double Evaluate(double x, out double derivative)
        {
            switch (number)
            {
                case 1:
                    derivative = Math.Cos(x) - 0.5;
                    return Math.Sin(x) - 0.5 * x;
                case 2:
                    derivative = 3 * x * x - 2;
                    return x * x * x - 2 * x - 5;
                default:
                    derivative = 2 * x;
                    return x * x - 2;
            }
        }
    }
}
