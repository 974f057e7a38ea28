// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;

namespace Periodic.Tests.Bands;

/// <summary>Internals of the edge search that the band tests do not reach.</summary>
public sealed class BandEdgeFinderTest
{
    [Fact]
    public void IntervalStack_BeyondItsStackBuffer_KeepsLastInFirstOutOrder()
    {
        // The search keeps its pending intervals in a 64-entry stack buffer; deeper searches must spill to the
        // heap without losing or reordering entries (the defining property of a stack; common practice).
        var stack = new BandEdgeFinder.IntervalStack(stackalloc BandEdgeFinder.Interval[4]);
        for (var i = 0; i < 300; i++)
        {
            stack.Push(new BandEdgeFinder.Interval(i, i, i + 0.5, i + 1));
        }
        Assert.Equal(300, stack.Count);
        for (var i = 299; i >= 0; i--)
        {
            var item = stack.Pop();
            Assert.Equal(i, item.A);
            Assert.Equal(i + 1, item.CountB);
        }
        Assert.Equal(0, stack.Count);
    }
}
