// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;

namespace Periodic.Tests.Stacks;

public sealed class SweepProgressTest
{
    [Fact]
    public void Create_OutOfRange_NamesTheField()
    {
        Assert.Equal("Completed", Assert.Throws<ArgumentOutOfRangeException>(() => new SweepProgress(-5, 3)).ParamName);
        Assert.Equal("Completed", Assert.Throws<ArgumentOutOfRangeException>(() => new SweepProgress(4, 3)).ParamName);
        Assert.Equal("Total", Assert.Throws<ArgumentOutOfRangeException>(() => new SweepProgress(0, -1)).ParamName);
        Assert.Equal(0.5, new SweepProgress(1, 2).Fraction); // exact in binary
    }
}
