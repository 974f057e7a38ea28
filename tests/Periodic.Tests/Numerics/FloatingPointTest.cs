// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

public sealed class FloatingPointTest
{
    [Fact]
    public void MachineEpsilon_IsTwoToTheMinusFiftyTwo()
    {
        // IEEE 754-2008 binary64 has 52 fraction bits: the spacing of doubles in [1, 2) is 2⁻⁵² exactly.
        Assert.True(Math.ScaleB(1.0, -52) == FloatingPoint.MachineEpsilon);
        Assert.True(Math.BitIncrement(1.0) - 1.0 == FloatingPoint.MachineEpsilon);
        // Not double.Epsilon, the smallest subnormal 2⁻¹⁰⁷⁴ (same standard).
        Assert.NotEqual(double.Epsilon, FloatingPoint.MachineEpsilon);
    }
}
