// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Optics;
using Periodic.Units;

namespace Periodic.Tests.Optics;

public class AbsorptionSpectrumTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private static IntersubbandSpectrum Well() => IntersubbandSpectrum.Compute(IntersubbandSpectrumTest.Well(8, 0.3, 0.067));

    [Fact]
    public void Compute_SheetDensityAtLowTemperature_FermiLevelFromTwoDimensionalDensityOfStates()
    {
        // One occupied subband: n = (m kT/πħ²) ln(1 + e^{(E_F − E_1)/kT}) with m/(πħ²) = m/(2π C) per eV per nm²
        // (/work/shared/REFERENCES.md, "Space charge" [derived]), solved for E_F in closed form here.
        var spectrum = Well();
        var absorption = AbsorptionSpectrum.Compute(spectrum, 1e11, AbsorptionOptions.Create(temperatureKelvin: 10));
        var kt = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * 10;
        var dos = spectrum.Levels[0].MeanMassElectronMasses / (2 * Math.PI * C); // per eV per nm²
        var expected = spectrum.Levels[0].EnergyElectronVolts + kt * Math.Log(Math.Exp(1e11 * 1e-14 / (dos * kt)) - 1);
        // The second level lies ≈ 0.1 eV higher, e^{-0.1/kT} ≈ 1e-50: its share is nothing; Brent's tolerance 1e-15 eV.
        Assert.Equal(expected, absorption.FermiLevelElectronVolts, 1e-12);
        Assert.Equal(1e11, absorption.SheetDensityPerSquareCentimetre, 1e11 * 1e-10);
    }

    [Fact]
    public void Compute_IntegratedAbsorption_EqualsLorentzOscillatorSum()
    {
        // Integrated absorption of N oscillators of strength f: ∫α dω = π e² N f / (2 n c ε₀ m) (classical Lorentz oscillator,
        // e.g. M. Fox, Optical Properties of Solids, ch. 2 — from memory), here for the 1 → 2 line: N = Δn/L, m = m*.
        var spectrum = Well();
        var options = AbsorptionOptions.Create(temperatureKelvin: 10, shape: LineShape.Gaussian, linewidthElectronVolts: 0.004);
        var absorption = AbsorptionSpectrum.Compute(spectrum, 5e11, options);
        var line = absorption.Lines.Single(l => l.From == 1 && l.To == 2);
        var e0 = line.EnergyElectronVolts;
        // Only the 1 → 2 line within ±10 FWHM (the 1 → 3 line is parity forbidden, 2 → 3 is empty at 10 K).
        var integral = GaussLegendreRule.Integrate(e => absorption.AbsorptionPerCentimetre(e), e0 - 0.04, e0 + 0.04, 256) * 100; // (1/m)·eV
        var f = spectrum.Transition(1, 2).OscillatorStrength;
        const double e = PhysicalConstants.ElementaryChargeCoulombs;
        var n = line.DensityDifferencePerSquareCentimetre * 1e4 / (absorption.ThicknessNanometres * 1e-9);
        var expected = Math.PI * e * e * n * f / (2 * options.RefractiveIndex * PhysicalConstants.SpeedOfLightMetresPerSecond
            * PhysicalConstants.VacuumPermittivityFaradsPerMetre * spectrum.ReferenceMassElectronMasses * PhysicalConstants.ElectronMassKilograms); // ∫α dω, 1/(m s)
        var expectedPerEv = expected * PhysicalConstants.ReducedPlanckElectronVoltSeconds;
        // The Gaussian beyond ±10 FWHM is below 1e-100; the 256-point rule is exact to rounding: 1e-9.
        Assert.Equal(1, integral / expectedPerEv, 1e-9);
    }

    [Fact]
    public void DepolarisationLength_MatchesNestedQuadrature()
    {
        // S = ∫(∫_{−∞}^z ψ1ψ2)² dz (Ando, Fowler, Stern 1982) recomputed by MathNet's Gauss–Legendre on the public wavefunctions.
        var spectrum = Well();
        var psi1 = spectrum.Levels[0];
        var psi2 = spectrum.Levels[1];
        // The integrands have kinks at the interfaces (0 and 8 nm), so every rule is split there.
        double Piecewise(Func<double, double> g, double a, double b)
        {
            double sum = 0;
            var cuts = new[] { a, Math.Clamp(0, a, b), Math.Clamp(8, a, b), b };
            for (var k = 0; k < 3; k++)
            {
                if (cuts[k + 1] > cuts[k])
                {
                    sum += GaussLegendreRule.Integrate(g, cuts[k], cuts[k + 1], 64);
                }
            }
            return sum;
        }
        double F(double z) => Piecewise(x => psi1.WavefunctionAt(x) * psi2.WavefunctionAt(x), -40, z);
        var expected = Piecewise(z => F(z) * F(z), -40, 48);
        // Both states decay by e^{-κ·40 nm} < 1e-10 at the ends; 64-point rules on smooth pieces: 1e-7 relative.
        Assert.Equal(1, AbsorptionSpectrum.DepolarisationLength(spectrum, 0, 1) / expected, 1e-7);
    }

    [Fact]
    public void Compute_Depolarisation_ShiftsLineUp()
    {
        // The depolarisation shift is a blue shift growing with the density (Allen, Tsui, Vinter 1976).
        var spectrum = Well();
        double Shift(double density) => AbsorptionSpectrum.Compute(spectrum, density, AbsorptionOptions.Create(temperatureKelvin: 10, depolarisation: true)).Lines[0].DepolarisationShiftElectronVolts;
        var low = Shift(1e11);
        var high = Shift(1e12);
        Assert.True(low > 0 && high > low);
        // For small α_dep, Ẽ − E ≈ E α/2 ∝ n: a tenfold density gives close to a tenfold shift (less by the square root).
        Assert.InRange(high / low, 8, 10);
    }

    [Fact]
    public void Compute_BadInput_NamesTheOption()
    {
        var spectrum = Well();
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => AbsorptionOptions.Create(linewidthElectronVolts: -0.001));
        Assert.Equal("linewidthElectronVolts", e.ParamName);
        e = Assert.Throws<ArgumentOutOfRangeException>(() => AbsorptionOptions.Create(temperatureKelvin: 5000));
        Assert.Equal("temperatureKelvin", e.ParamName);
        e = Assert.Throws<ArgumentOutOfRangeException>(() => AbsorptionSpectrum.Compute(spectrum, -1e11));
        Assert.Equal("sheetDensityPerSquareCentimetre", e.ParamName);
        e = Assert.Throws<ArgumentOutOfRangeException>(() => AbsorptionSpectrum.ComputeAtFermiLevel(spectrum, double.NaN));
        Assert.Equal("fermiLevelElectronVolts", e.ParamName);
    }

    [Fact]
    public void PassAbsorption_RepeatsCompound()
    {
        // Beer–Lambert: the fraction absorbed by N copies is 1 − (1 − A₁)^N (common practice, no single source).
        var spectrum = Well();
        var one = AbsorptionSpectrum.Compute(spectrum, 1e12);
        var fifty = AbsorptionSpectrum.Compute(spectrum, 1e12, AbsorptionOptions.Create(passRepeats: 50));
        var e0 = one.Lines[0].EnergyElectronVolts;
        // Rounding of 1 − A₁ and the power: 1e-14.
        Assert.Equal(1 - Math.Pow(1 - one.PassAbsorption(e0), 50), fifty.PassAbsorption(e0), 1e-14);
        // Small absorbances, far from the line: A = x − x²/2 + O(x³) with x = αL ≈ 7e-6, so x²/6 ≈ 1e-11 relative is left.
        var tail = one.PassAbsorption(5 * e0);
        var x = one.AbsorptionPerCentimetre(5 * e0) * one.ThicknessNanometres * 1e-7;
        Assert.Equal(x - x * x / 2, tail, tail * 1e-10);
    }
}
