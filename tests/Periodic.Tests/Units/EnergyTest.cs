// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Tests.Units;

public sealed class EnergyTest
{
    private const double DoubleEpsilon = 2.220446049250313e-16;

    [Fact]
    public void Joules_OneElectronVolt_IsTheElementaryCharge()
    {
        // 1 eV = 1.602 176 634e-19 J exactly (CODATA 2018 / SI 2019): one multiplication by 1, no rounding.
        Assert.Equal(1.602176634e-19, Energy.FromElectronVolts(1).Joules);
    }

    [Theory]
    [InlineData(1.602176634e-19, 1.0)]
    [InlineData(1e-21, 6.241509074460763e-3)] // 1/e = 6.241 509 074...e18 eV per J (CODATA 2018, from memory, to 10 digits)
    public void FromJoules_ConvertsWithTheExactCharge(double joules, double electronVolts)
    {
        // Tolerance: the 10-digit published 1/e (or two roundings of the division), relative 1e-9.
        Assert.Equal(electronVolts, Energy.FromJoules(joules).ElectronVolts, electronVolts * 1e-9);
    }

    [Fact]
    public void FromJoules_RoundTrip_IsWithinTwoUlps()
    {
        // One division and one multiplication round once each.
        foreach (var ev in new[] { 1e-6, 0.0123, 1.0, 3.14, 250.0 })
        {
            var back = Energy.FromJoules(Energy.FromElectronVolts(ev).Joules).ElectronVolts;
            Assert.Equal(ev, back, ev * 2 * DoubleEpsilon);
        }
    }

    [Fact]
    public void Millielectronvolts_AreAThousandth()
    {
        Assert.Equal(0.025, Energy.FromMillielectronVolts(25).ElectronVolts, 1e-17);
        Assert.Equal(25.0, Energy.FromElectronVolts(0.025).MillielectronVolts, 1e-14);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void FromElectronVolts_NonFinite_NamesTheParameter(double value)
    {
        Assert.Equal("electronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => Energy.FromElectronVolts(value)).ParamName);
        Assert.Equal("millielectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => Energy.FromMillielectronVolts(value)).ParamName);
        Assert.Equal("joules", Assert.Throws<ArgumentOutOfRangeException>(() => Energy.FromJoules(value)).ParamName);
    }

    [Fact]
    public void ToString_IsCultureInvariant()
    {
        var previous = Thread.CurrentThread.CurrentCulture;
        try
        {
            Thread.CurrentThread.CurrentCulture = System.Globalization.CultureInfo.InvariantCulture;
            Assert.Equal("0.25 eV", Energy.FromElectronVolts(0.25).ToString());
        }
        finally
        {
            Thread.CurrentThread.CurrentCulture = previous;
        }
    }
}
