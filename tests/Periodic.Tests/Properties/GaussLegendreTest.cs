// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Properties;

namespace Periodic.Tests.Properties;

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
}
