// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Properties;

public sealed class InPlaneDensitiesTest(ITestOutputHelper output)
{
    private static UnitCell Unequal() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(3),
        Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));

    private static UnitCell Equal() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(3),
        Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067));

    [Theory]
    [InlineData(0.08)]
    [InlineData(0.25)]
    public void DensityOfStates_EqualMasses_EqualsSingleMassFormula(double energy)
    {
        // One mass: g₃ = (m/(4π ħ²/2m₀))·N(E) (G. Bastard, Wave Mechanics Applied to Semiconductor Heterostructures,
        // ch. 1, from memory; derived from the separable dispersion). The exact route integrates g₁ over k∥² instead.
        var result = InPlaneDensities.DensityOfStates(Equal(), energy, EffectiveMass.FromElectronMasses(0.067));
        output.WriteLine($"{result}; relative difference {result.RelativeErrorOfSingleMass:E2}");
        // 1e-8 relative: the mapped 40-point Gauss–Legendre rule over k∥² (its estimate is reported beside it).
        Assert.True(Math.Abs(result.RelativeErrorOfSingleMass) < 1e-8, $"relative difference {result.RelativeErrorOfSingleMass:E3}");
    }

    [Fact]
    public void CarrierDensity_EqualMasses_EqualsSingleMassFormula()
    {
        // As above, for n(μ, T): the 2D Fermi–Dirac integral in closed form (J. H. Davies, The Physics of Low-Dimensional
        // Semiconductors, ch. 3, from memory) against the integral over k∥² of the 1D density.
        var result = InPlaneDensities.CarrierDensity(Equal(), Energy.FromElectronVolts(0.06), Temperature.FromKelvin(77), EffectiveMass.FromElectronMasses(0.067));
        output.WriteLine($"{result}; relative difference {result.RelativeErrorOfSingleMass:E2}");
        // 1e-7 relative: the quadrature in k∥² (pieces between edge crossings, 40-point rules).
        Assert.True(Math.Abs(result.RelativeErrorOfSingleMass) < 1e-7, $"relative difference {result.RelativeErrorOfSingleMass:E3}");
    }

    [Fact]
    public void DensityOfStates_UnequalMasses_IsDerivativeOfZeroTemperatureDensity()
    {
        // g(E) = dn(E, T = 0)/dE (definition of the density of states): two routes of the exact integral (g₁ against the
        // integrated N₁), compared by a central difference of step 1 meV (error ~ h²g''/6, below 1e-4 relative here).
        var cell = Unequal();
        const double e = 0.10, h = 1e-3;
        var g = InPlaneDensities.DensityOfStates(cell, e);
        var derivative = (InPlaneDensities.CarrierDensity(cell, Energy.FromElectronVolts(e + h), default).ExactPerCubicNanometre - InPlaneDensities.CarrierDensity(cell, Energy.FromElectronVolts(e - h), default).ExactPerCubicNanometre) / (2 * h);
        output.WriteLine($"{g}; dn/dE = {derivative:R}");
        Assert.True(Math.Abs(derivative - g.ExactPerElectronVoltCubicNanometre) / g.ExactPerElectronVoltCubicNanometre < 1e-4, $"g = {g.ExactPerElectronVoltCubicNanometre:R}, dn/dE = {derivative:R}");
    }

    [Fact]
    public void CarrierDensity_NegativeTemperature_ThrowsNamingIt()
    {
        // The temperature is typed: a negative one is refused where it is made.
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => InPlaneDensities.CarrierDensity(Unequal(), Energy.FromElectronVolts(0.1), Temperature.FromKelvin(-1)));
        Assert.Equal("kelvin", e.ParamName);
    }
}
