// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Structures;

public sealed class FunctionSegmentTest
{
    private static readonly Length Width = Length.FromNanometres(4);
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);

    [Fact]
    public void Create_SamplesRangeOfTheFunction()
    {
        // V = 0.3·sin(πx/4) on [0, 4] has range [0, 0.3]; the 1,024-interval scan includes both ends and the
        // middle exactly (x = 2 is a scan point), so the range is exact to rounding.
        var segment = FunctionSegment.Create(Width, x => 0.3 * Math.Sin(Math.PI * x / 4), Mass);
        Assert.Equal(FunctionSegment.DefaultStepCount, segment.StepCount);
        Assert.Equal(0.3, segment.MaximumPotential.ElectronVolts, 1e-15);
        Assert.Equal(0.0, segment.MinimumPotential.ElectronVolts, 1e-15);
        Assert.False(segment.HasPositionDependentMass);
        Assert.Equal(0.067, segment.MinimumMass.ElectronMasses);
    }

    [Fact]
    public void Create_BadInput_NamesTheParameter()
    {
        Assert.Equal("width", Assert.Throws<ArgumentOutOfRangeException>(() => FunctionSegment.Create(Length.FromNanometres(-1), _ => 0, Mass)).ParamName);
        Assert.Equal("potentialElectronVolts", Assert.Throws<ArgumentNullException>(() => FunctionSegment.Create(Width, null!, Mass)).ParamName);
        Assert.Equal("massElectronMasses", Assert.Throws<ArgumentNullException>(() => FunctionSegment.Create(Width, _ => 0, (Func<double, double>)null!)).ParamName);
        Assert.Equal("stepCount", Assert.Throws<ArgumentOutOfRangeException>(() => FunctionSegment.Create(Width, _ => 0, Mass, 0)).ParamName);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => FunctionSegment.Create(Width, _ => 0, default(EffectiveMass))).ParamName);
        var nan = Assert.Throws<ArgumentOutOfRangeException>(() => FunctionSegment.Create(Width, x => x > 3 ? double.NaN : 0, Mass));
        Assert.Equal("potentialElectronVolts", nan.ParamName);
        Assert.Contains("x = ", nan.Message, StringComparison.Ordinal);
        Assert.Equal("massElectronMasses", Assert.Throws<ArgumentOutOfRangeException>(() => FunctionSegment.Create(Width, _ => 0, x => 0.067 - x)).ParamName);
    }

    [Fact]
    public void WithStepCount_ResamplesTheFunction()
    {
        var calls = 0;
        var segment = FunctionSegment.Create(Width, x => { calls++; return 0.1 * x; }, Mass, 10);
        var before = calls;
        var refined = segment.WithStepCount(20);
        Assert.Equal(20, refined.StepCount);
        Assert.Equal(2 * 20 + 1025, calls - before); // two Gauss nodes per step plus the range scan
    }
}
