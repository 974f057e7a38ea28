// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Tests.Units;

public sealed class LengthTest
{
    private const double DoubleEpsilon = 2.220446049250313e-16;

    [Fact]
    public void Angstroms_TenPerNanometre()
    {
        // 1 Å = 0.1 nm = 1e-10 m (SI definition of the ångström). Tolerance: one rounding of ×0.1.
        Assert.Equal(1.0, Length.FromAngstroms(10).Nanometres, DoubleEpsilon);
        Assert.Equal(56.5325, Length.FromNanometres(5.65325).Angstroms, 56.5325 * DoubleEpsilon);
        Assert.Equal(0.565325, Length.FromAngstroms(5.65325).Nanometres, 0.565325 * DoubleEpsilon);
    }

    [Fact]
    public void Metres_AreNanometresTimes1e9()
    {
        Assert.Equal(2.5e-9, Length.FromNanometres(2.5).Metres, 2.5e-9 * DoubleEpsilon);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void FromNanometres_NonFinite_NamesTheParameter(double value)
    {
        Assert.Equal("nanometres", Assert.Throws<ArgumentOutOfRangeException>(() => Length.FromNanometres(value)).ParamName);
        Assert.Equal("angstroms", Assert.Throws<ArgumentOutOfRangeException>(() => Length.FromAngstroms(value)).ParamName);
    }
}
