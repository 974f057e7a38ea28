// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    private static UnitCell SimpleCell() =>
        UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067));

    [Theory]
    [InlineData(0)]
    [InlineData(-3)]
    [InlineData(10001)]
    public void Compute_CountOutOfRange_NamesCount(int count)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => BandStructure.Compute(SimpleCell(), count));
        Assert.Equal("count", error.ParamName);
        Assert.Contains("between 1 and 10000", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Compute_NullCell_NamesCell()
    {
        Assert.Equal("cell", Assert.Throws<ArgumentNullException>(() => BandStructure.Compute(null!, 2)).ParamName);
        Assert.Equal("cell", Assert.Throws<ArgumentNullException>(() => BandStructure.ComputeBelow(null!, Energy.FromElectronVolts(1))).ParamName);
    }

    [Fact]
    public void ComputeBelow_TooManyBands_NamesTheLimit()
    {
        // Far above the barrier the bands approach the free-particle edges C(nπ/d)²/m: with d = 7 nm and
        // m = 0.067 about (d/π)√(mE/C) ≈ 13,000 bands lie below 2e7 eV, more than the 10,000 allowed.
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => BandStructure.ComputeBelow(SimpleCell(), Energy.FromElectronVolts(2e7)));
        Assert.Equal("energyLimit", error.ParamName);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(4)]
    public void GetBand_IndexOutOfRange_NamesBandIndex(int index)
    {
        var bands = BandStructure.Compute(SimpleCell(), 3);
        Assert.Equal("bandIndex", Assert.Throws<ArgumentOutOfRangeException>(() => bands.GetBand(index)).ParamName);
        Assert.Equal("bandIndex", Assert.Throws<ArgumentOutOfRangeException>(() => bands.EnergyAt(index, 0.1)).ParamName);
    }

    [Theory]
    [InlineData(1.01)]
    [InlineData(-1.5)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void EnergyAt_WavevectorOutsideZone_NamesIt(double fractionOfZone)
    {
        var bands = BandStructure.Compute(SimpleCell(), 2);
        var k = fractionOfZone * Math.PI / bands.PeriodNanometres;
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => bands.EnergyAt(1, k));
        Assert.Equal("wavevectorPerNanometre", error.ParamName);
        Assert.Contains("first Brillouin zone", error.Message, StringComparison.Ordinal);
        var batch = Assert.Throws<ArgumentOutOfRangeException>(() => bands.EnergiesAt(1, [0.0, k], new double[2]));
        Assert.Equal("wavevectorsPerNanometre", batch.ParamName);
        Assert.Contains("wavevectorsPerNanometre[1]", batch.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void EnergyAt_ZoneBoundaryWithinRounding_IsAccepted()
    {
        // π/d computed by the caller may differ from ours by an ulp: accepted, not silently clamped beyond that.
        var bands = BandStructure.Compute(SimpleCell(), 2);
        var boundary = Math.PI / 7.0;
        Assert.Equal(bands.GetBand(1).TopElectronVolts, bands.EnergyAt(1, Math.BitIncrement(boundary)));
    }

    [Fact]
    public void EnergiesAt_ShortDestination_GivesBothLengths()
    {
        var bands = BandStructure.Compute(SimpleCell(), 2);
        var error = Assert.Throws<ArgumentException>(() => bands.EnergiesAt(1, [0.0, 0.1, 0.2], new double[1]));
        Assert.Equal("destinationElectronVolts", error.ParamName);
        Assert.Contains("length 1", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.NegativeInfinity)]
    public void EnergyQueries_NonFinite_NameTheEnergy(double e)
    {
        var bands = BandStructure.Compute(SimpleCell(), 2);
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => bands.WavevectorAt(e)).ParamName);
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => bands.BandIndexAt(e)).ParamName);
    }

    [Theory]
    [InlineData(1e-17, 1e-15, 300, "relativeTolerance")]
    [InlineData(0.1, 1e-15, 300, "relativeTolerance")]
    [InlineData(1e-14, 0.0, 300, "absoluteToleranceElectronVolts")]
    [InlineData(1e-14, 2.0, 300, "absoluteToleranceElectronVolts")]
    [InlineData(1e-14, 1e-15, 5, "maxIterations")]
    public void BandSearchOptions_OutOfRange_NamesTheParameter(double relative, double absolute, int iterations, string expected)
    {
        Assert.Equal(expected, Assert.Throws<ArgumentOutOfRangeException>(() => BandSearchOptions.Create(relative, absolute, iterations)).ParamName);
    }
}
