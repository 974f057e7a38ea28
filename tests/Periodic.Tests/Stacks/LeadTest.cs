// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Stacks;

public sealed class LeadTest
{
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);

    [Fact]
    public void WavenumberAndDecay_FollowParabolicDispersion()
    {
        // k = √(2m(E − V))/ħ = √(m (E − V) / C) in 1/nm with C = ħ²/2m₀ (CODATA 2018: 0.03809982116 eV nm², docs/references.md).
        const double c = 0.03809982116;
        var lead = Lead.Create(Energy.FromElectronVolts(0.1), Mass);
        Assert.Equal(Math.Sqrt(0.067 * 0.2 / c), lead.WavenumberPerNanometre(0.3), 1e-9);
        Assert.Equal(0.0, lead.WavenumberPerNanometre(0.05));
        Assert.Equal(Math.Sqrt(0.067 * 0.05 / c), lead.DecayConstantPerNanometre(0.05), 1e-9);
    }

    [Fact]
    public void Like_CopiesPotentialAndMassOfTheLayer()
    {
        var layer = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.09));
        var lead = Lead.Like(layer);
        Assert.Equal(0.25, lead.PotentialElectronVolts);
        Assert.Equal(0.09, lead.MassElectronMasses);
        Assert.Equal("Lead V = 0.25 eV, m = 0.09 m0", lead.ToString());
        Assert.Equal("layer", Assert.Throws<ArgumentNullException>(() => Lead.Like(null!)).ParamName);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => Lead.Create(default, default)).ParamName);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void Wavenumbers_NonFiniteEnergy_NameTheParameter(double energy)
    {
        var lead = Lead.Create(Periodic.Units.Energy.FromElectronVolts(0.1), Periodic.Units.EffectiveMass.FromElectronMasses(0.067));
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => lead.WavenumberPerNanometre(energy)).ParamName);
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => lead.DecayConstantPerNanometre(energy)).ParamName);
    }
}
