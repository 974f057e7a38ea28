// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Numerics;

/// <summary>One panel of an adaptive quadrature: its bounds, the Kronrod value and |Kronrod − Gauss| as its error.</summary>
internal readonly record struct QuadratureInterval(double Lower, double Upper, double Value, double Error);

/// <summary>
/// The 7/15-point Gauss–Kronrod pair and globally adaptive integration with it (R. Piessens, E. de Doncker-Kapenga,
/// C. W. Überhuber and D. K. Kahaner, QUADPACK, Springer 1983, routines qk15 and qag): the 15-point Kronrod extension
/// reuses the 7 Gauss nodes, is exact for polynomials of degree 22, and the difference of the two rules estimates the error.
/// </summary>
internal static class GaussKronrod
{
    /// <summary>Function evaluations of one <see cref="Rule"/>.</summary>
    internal const int PointsPerRule = 15;

    // Kronrod 15-point abscissae (positive half, last = 0) and weights; Gauss 7-point weights at the odd-indexed abscissae (QUADPACK qk15).
    private static readonly double[] Xk =
    [
        0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
        0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
        0.207784955007898467600689403773245, 0.0,
    ];

    private static readonly double[] Wk =
    [
        0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
        0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
        0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
    ];

    private static readonly double[] Wg =
    [
        0.129484966168869693270611432679082, 0.279705391489276667901467771423780, 0.381830050505118944950369775488975,
        0.417959183673469387755102040816327,
    ];

    /// <summary>The Kronrod abscissae on [−1, 1], positive half, descending, the last one the centre (for tests).</summary>
    internal static ReadOnlySpan<double> KronrodNodes => Xk;

    /// <summary>The 15-point Kronrod weights matching <see cref="KronrodNodes"/>.</summary>
    internal static ReadOnlySpan<double> KronrodWeights => Wk;

    /// <summary>The 7-point Gauss weights at the odd-indexed Kronrod nodes and the centre.</summary>
    internal static ReadOnlySpan<double> GaussWeights => Wg;

    /// <summary>One Gauss–Kronrod 7/15 rule on [a, b]: the Kronrod value and |Kronrod − Gauss| as its error.</summary>
    internal static QuadratureInterval Rule<TFunction>(ref TFunction function, double a, double b)
        where TFunction : struct, IRealFunction
    {
        var center = 0.5 * (a + b);
        var half = 0.5 * (b - a);
        var fc = function.Evaluate(center);
        var kronrod = Wk[7] * fc;
        var gauss = Wg[3] * fc;
        for (var j = 0; j < 7; j++)
        {
            var f1 = function.Evaluate(center - half * Xk[j]);
            var f2 = function.Evaluate(center + half * Xk[j]);
            kronrod += Wk[j] * (f1 + f2);
            if (j % 2 == 1)
            {
                gauss += Wg[j / 2] * (f1 + f2);
            }
        }
        return new QuadratureInterval(a, b, kronrod * half, Math.Abs((kronrod - gauss) * half));
    }

    /// <summary>Σ of the values of <paramref name="intervals"/>; <paramref name="error"/> receives Σ of their errors.</summary>
    internal static double Sum(List<QuadratureInterval> intervals, out double error)
    {
        double total = 0;
        error = 0;
        foreach (var interval in intervals)
        {
            total += interval.Value;
            error += interval.Error;
        }
        return total;
    }

    /// <summary>
    /// Globally adaptive refinement (QUADPACK qag): the interval with the largest error estimate is halved until the summed
    /// error is at most <paramref name="relativeTolerance"/> × |Σ value| (or zero), or another split would exceed
    /// <paramref name="maxEvaluations"/>. Intervals that double precision cannot split keep their error in the sum.
    /// </summary>
    /// <returns>True when the tolerance was met.</returns>
    internal static bool Refine<TFunction>(ref TFunction function, List<QuadratureInterval> intervals, double relativeTolerance,
        int maxEvaluations, ref int evaluations, CancellationToken cancellationToken)
        where TFunction : struct, IRealFunction
    {
        var queue = new PriorityQueue<int, double>();
        for (var i = 0; i < intervals.Count; i++)
        {
            queue.Enqueue(i, -intervals[i].Error);
        }
        while (true)
        {
            var total = Sum(intervals, out var error);
            if (error <= relativeTolerance * Math.Abs(total) || error == 0)
            {
                return true;
            }
            if (evaluations + 2 * PointsPerRule > maxEvaluations || queue.Count == 0)
            {
                return false;
            }
            cancellationToken.ThrowIfCancellationRequested();
            var index = queue.Dequeue();
            var worst = intervals[index];
            var middle = 0.5 * (worst.Lower + worst.Upper);
            if (!(middle > worst.Lower && middle < worst.Upper))
            {
                continue; // cannot be split further in double precision; its error stays in the estimate
            }
            var left = Rule(ref function, worst.Lower, middle);
            var right = Rule(ref function, middle, worst.Upper);
            evaluations += 2 * PointsPerRule;
            intervals[index] = left;
            intervals.Add(right);
            queue.Enqueue(index, -left.Error);
            queue.Enqueue(intervals.Count - 1, -right.Error);
        }
    }

    /// <summary>∫ₐᵇ f by <see cref="Refine"/> from one rule on [a, b]; <paramref name="error"/> receives the summed error estimate.</summary>
    internal static double Integrate<TFunction>(ref TFunction function, double a, double b, double relativeTolerance, int maxEvaluations,
        out double error, out bool converged)
        where TFunction : struct, IRealFunction
    {
        var intervals = new List<QuadratureInterval> { Rule(ref function, a, b) };
        var evaluations = PointsPerRule;
        converged = Refine(ref function, intervals, relativeTolerance, maxEvaluations, ref evaluations, CancellationToken.None);
        return Sum(intervals, out error);
    }
}
