// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Numerics;

/// <summary>
/// Gauss–Legendre nodes and weights on [−1, 1], computed once by Newton's method on the Legendre
/// recurrence (W. H. Press et al., Numerical Recipes, 3rd ed., §4.6, "gauleg"). An n-point rule is
/// exact for polynomials of degree 2n − 1.
/// </summary>
internal sealed class GaussLegendre
{
    private GaussLegendre(int order)
    {
        Nodes = new double[order];
        Weights = new double[order];
        for (var i = 0; i < (order + 1) / 2; i++)
        {
            var x = Math.Cos(Math.PI * (i + 0.75) / (order + 0.5));
            double derivative = 0;
            for (var iteration = 0; iteration < 100; iteration++)
            {
                double p0 = 1, p1 = 0;
                for (var j = 1; j <= order; j++)
                {
                    var p2 = p1;
                    p1 = p0;
                    p0 = ((2 * j - 1) * x * p1 - (j - 1) * p2) / j;
                }
                derivative = order * (x * p0 - p1) / (x * x - 1);
                var step = p0 / derivative;
                x -= step;
                if (Math.Abs(step) <= 1e-16)
                {
                    break;
                }
            }
            Nodes[i] = -x;
            Nodes[order - 1 - i] = x;
            Weights[i] = 2 / ((1 - x * x) * derivative * derivative);
            Weights[order - 1 - i] = Weights[i];
        }
    }

    /// <summary>
    /// Distance of the nodes of the 2-point rule on [0, 1] from the middle, √3/6 (the nodes 1/2 ∓ √3/6 are the
    /// zeros of the shifted P₂; Abramowitz and Stegun, Table 25.4): the nodes of the Magnus steps.
    /// </summary>
    internal const double TwoPointOffsetOnUnitInterval = 0.28867513459481288225;

    /// <summary>The 4-point rule (exact for degree 7: the square of a cubic Hermite piece and its first moment).</summary>
    internal static GaussLegendre Four { get; } = new(4);

    /// <summary>The 8-point rule (exact for degree 15: the fourth power of a cubic Hermite piece times a linear weight).</summary>
    internal static GaussLegendre Eight { get; } = new(8);

    /// <summary>The 10-point rule (the error estimate's companion).</summary>
    internal static GaussLegendre Ten { get; } = new(10);

    /// <summary>The 20-point rule (the value returned).</summary>
    internal static GaussLegendre Twenty { get; } = new(20);

    /// <summary>An n-point rule built on demand (1 ≤ n ≤ 512), for callers whose node count is an option.</summary>
    internal static GaussLegendre OfOrder(int order) => order switch
    {
        4 => Four,
        8 => Eight,
        10 => Ten,
        20 => Twenty,
        >= 1 and <= 512 => new GaussLegendre(order),
        _ => throw new ArgumentOutOfRangeException(nameof(order), order, "order must be between 1 and 512."),
    };

    internal double[] Nodes { get; }

    internal double[] Weights { get; }

    /// <summary>Number of nodes n (exact for polynomials of degree 2n − 1).</summary>
    internal int Order => Nodes.Length;

    /// <summary>The rule on [<paramref name="lower"/>, <paramref name="upper"/>]: Σ wᵢ f(xᵢ) with nodes and weights mapped affinely.</summary>
    internal double Integrate<TFunction>(ref TFunction function, double lower, double upper)
        where TFunction : struct, IRealFunction
    {
        var middle = 0.5 * (lower + upper);
        var half = 0.5 * (upper - lower);
        double sum = 0;
        for (var i = 0; i < Nodes.Length; i++)
        {
            sum += Weights[i] * function.Evaluate(middle + half * Nodes[i]);
        }
        return sum * half;
    }
}
