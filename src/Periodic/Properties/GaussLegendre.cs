// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Properties;

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

    /// <summary>The 10-point rule (the error estimate's companion).</summary>
    internal static GaussLegendre Ten { get; } = new(10);

    /// <summary>The 20-point rule (the value returned).</summary>
    internal static GaussLegendre Twenty { get; } = new(20);

    internal double[] Nodes { get; }

    internal double[] Weights { get; }
}
