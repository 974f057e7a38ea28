// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Conventions;

/// <summary>The conventions applied to smooth segments: bad parameters named, a NaN potential never leaks.</summary>
public sealed class SmoothSegmentsTest
{
    [Fact]
    public void OpticalLattice_RejectsNonFiniteDepth()
    {
        foreach (var bad in new[] { double.NaN, double.PositiveInfinity, double.NegativeInfinity })
        {
            var ex = Assert.ThrowsAny<ArgumentException>(() => FourierSegment.OpticalLattice(Length.FromNanometres(400), bad, EffectiveMass.FromElectronMasses(1)));
            Assert.Equal("depthInRecoilEnergies", ex.ParamName);
        }
        var ex2 = Assert.ThrowsAny<ArgumentException>(() => FourierSegment.Create(Length.FromNanometres(5), Energy.FromElectronVolts(0), [0.1, double.NaN], [0.0, 0.0], EffectiveMass.FromElectronMasses(0.067)));
        Assert.Equal("cosineElectronVolts", ex2.ParamName);
    }

    [Fact]
    public void FunctionSegment_NaNPotential_IsRejectedAtConstruction()
    {
        // The callback is sampled when the segment is built; a NaN there is reported with the position.
        var ex = Assert.Throws<ArgumentOutOfRangeException>(() =>
            FunctionSegment.Create(Length.FromNanometres(5), x => x > 2.5 ? double.NaN : 0.1, EffectiveMass.FromElectronMasses(0.067)));
        Assert.Equal("potentialElectronVolts", ex.ParamName);
        Assert.Contains("NaN", ex.Message, StringComparison.Ordinal);
        var ex2 = Assert.ThrowsAny<ArgumentException>(() =>
            FunctionSegment.Create(Length.FromNanometres(5), _ => 0.1, x => x < 1 ? -0.067 : 0.067));
        Assert.Equal("massElectronMasses", ex2.ParamName);
    }
}
