// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Tests.Units;

public sealed class EffectiveMassTest
{
    [Fact]
    public void Kilograms_AreMultiplesOfTheCodataElectronMass()
    {
        // CODATA 2018: m_e = 9.109 383 7015e-31 kg. GaAs m* = 0.067 m0 (Vurgaftman et al. 2001, from memory).
        Assert.Equal(9.1093837015e-31, EffectiveMass.FreeElectron.Kilograms);
        Assert.Equal(0.067 * 9.1093837015e-31, EffectiveMass.FromElectronMasses(0.067).Kilograms, 1e-46);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-0.067)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void FromElectronMasses_NotPositiveFinite_NamesTheParameter(double value)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => EffectiveMass.FromElectronMasses(value));
        Assert.Equal("electronMasses", error.ParamName);
        Assert.Contains("positive and finite", error.Message, StringComparison.Ordinal);
    }
}
