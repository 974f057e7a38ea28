// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Structures;

public sealed class LayerTest
{
    private static readonly Energy Barrier = Energy.FromElectronVolts(0.3);
    private static readonly EffectiveMass GaAsMass = EffectiveMass.FromElectronMasses(0.067);

    [Theory]
    [InlineData(0.0)]
    [InlineData(-1.0)]
    public void Create_WidthNotPositive_NamesWidth(double nanometres)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => Layer.Create(Length.FromNanometres(nanometres), Barrier, GaAsMass));
        Assert.Equal("width", error.ParamName);
        Assert.Contains("positive", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_WidthNonFinite_IsRejectedWhereTheLengthIsMade()
    {
        // A non-finite width cannot even be expressed as a Length.
        Assert.Equal("nanometres", Assert.Throws<ArgumentOutOfRangeException>(() => Length.FromNanometres(double.PositiveInfinity)).ParamName);
    }

    [Fact]
    public void Create_DefaultMass_NamesMass()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => Layer.Create(Length.FromNanometres(1), Barrier, default));
        Assert.Equal("mass", error.ParamName);
    }

    [Fact]
    public void Create_PotentialNonFinite_IsRejectedWhereTheEnergyIsMade()
    {
        Assert.Equal("electronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => Energy.FromElectronVolts(double.NaN)).ParamName);
    }

    [Theory]
    [InlineData(-0.1)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Create_NonParabolicityInvalid_NamesIt(double alpha)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => Layer.Create(Length.FromNanometres(1), Barrier, GaAsMass, alpha));
        Assert.Equal("nonParabolicityPerElectronVolt", error.ParamName);
    }

    [Fact]
    public void With_CopiesChangeOneFieldAndValidate()
    {
        var layer = Layer.Create(Length.FromNanometres(2), Barrier, GaAsMass);
        var wider = layer.WithWidth(Length.FromNanometres(3));
        Assert.Equal(3.0, wider.Width.Nanometres);
        Assert.Equal(layer.Potential, wider.Potential);
        Assert.Equal(2.0, layer.Width.Nanometres); // the original is unchanged
        Assert.Equal("width", Assert.Throws<ArgumentOutOfRangeException>(() => layer.WithWidth(default)).ParamName);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => layer.WithMass(default)).ParamName);
    }
}
