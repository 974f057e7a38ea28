// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;

namespace Periodic.Tests.Structures;

public sealed class DeltaBarrierTest
{
    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.NegativeInfinity)]
    public void Create_StrengthNonFinite_NamesIt(double strength)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => DeltaBarrier.Create(strength));
        Assert.Equal("strengthElectronVoltNanometres", error.ParamName);
        Assert.Contains("finite", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_WellsAndBarriers_HaveZeroWidth()
    {
        Assert.Equal(0.0, DeltaBarrier.Create(-0.2).Width.Nanometres);
        Assert.Equal(0.2, DeltaBarrier.Create(0.2).StrengthElectronVoltNanometres);
    }
}
