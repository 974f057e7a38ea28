// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Structures;

public sealed class SampledSegmentTest
{
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);

    [Fact]
    public void PotentialAt_InterpolatesLinearly()
    {
        // Piecewise-linear interpolation by definition (1e-15 eV: rounding).
        var segment = SampledSegment.Create([1.0, 2.0, 4.0], [0.0, 0.2, -0.2], Mass);
        Assert.Equal(3.0, segment.Width.Nanometres, 1e-15);
        Assert.Equal(0.1, segment.PotentialAt(1.5), 1e-15);
        Assert.Equal(0.0, segment.PotentialAt(3.0), 1e-15);
        Assert.Equal(-0.2, segment.PotentialAt(4.0), 1e-15);
        Assert.Equal(-0.2, segment.MinimumPotential.ElectronVolts);
        Assert.Equal(0.2, segment.MaximumPotential.ElectronVolts);
        Assert.Equal(2, segment.InterpolationOrder);
        Assert.Equal(2, segment.StepCount);
        Assert.Equal(6, segment.WithStepsPerInterval(3).StepCount);
    }

    [Fact]
    public void Create_BadInput_NamesTheParameter()
    {
        Assert.Equal("positionsNanometres", Assert.Throws<ArgumentException>(() => SampledSegment.Create([1.0], [0.0], Mass)).ParamName);
        Assert.Equal("potentialsElectronVolts", Assert.Throws<ArgumentException>(() => SampledSegment.Create([1.0, 2.0], [0.0], Mass)).ParamName);
        Assert.Equal("positionsNanometres", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 1.0], [0.0, 0.0], Mass)).ParamName);
        Assert.Equal("positionsNanometres", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, double.NaN], [0.0, 0.0], Mass)).ParamName);
        Assert.Equal("potentialsElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 2.0], [0.0, double.NaN], Mass)).ParamName);
        Assert.Equal("massesElectronMasses", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 2.0], [0.0, 0.0], [0.067, -1.0])).ParamName);
        Assert.Equal("massesElectronMasses", Assert.Throws<ArgumentException>(() => SampledSegment.Create([1.0, 2.0], [0.0, 0.0], [0.067])).ParamName);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 2.0], [0.0, 0.0], default(EffectiveMass))).ParamName);
        Assert.Equal("stepsPerInterval", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 2.0], [0.0, 0.0], Mass).WithStepsPerInterval(0)).ParamName);
        Assert.Equal("positionNanometres", Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 2.0], [0.0, 0.0], Mass).PotentialAt(0.5)).ParamName);
        var message = Assert.Throws<ArgumentOutOfRangeException>(() => SampledSegment.Create([1.0, 3.0, 2.0], [0.0, 0.0, 0.0], Mass)).Message;
        Assert.Contains("positionsNanometres[2]", message, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_SampledMass_ReportsMinimum()
    {
        var segment = SampledSegment.Create([0.0, 1.0, 2.0], [0.0, 0.1, 0.0], [0.067, 0.09, 0.067]);
        Assert.True(segment.HasPositionDependentMass);
        Assert.Equal(0.067, segment.MinimumMass.ElectronMasses);
        Assert.Contains("piecewise linear", segment.ToString(), StringComparison.Ordinal);
    }
}
