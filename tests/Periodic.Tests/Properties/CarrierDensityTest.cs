// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Properties;

/// <summary>Carrier densities and Fermi levels of <see cref="BandProperties"/>.</summary>
public sealed partial class CarrierDensityTest(ITestOutputHelper output)
{
    private const double C = Cells.C;
    private const double KB = PhysicalConstants.BoltzmannElectronVoltsPerKelvin;

    /// <summary>
    /// Σ_{r≥1} (−1)^{r+1} e^{rη} / r^{j+1}: the Fermi–Dirac integral F_j(η) (normalised by Γ(j+1)) for η &lt; 0
    /// (J. S. Blakemore, Solid-State Electron. 25, 1067 (1982), series form; from memory).
    /// </summary>
    private static double FermiDiracSeries(double j, double eta)
    {
        var sum = 0.0;
        for (var r = 1; r <= 200; r++)
        {
            sum += (r % 2 == 1 ? 1 : -1) * Math.Exp(r * eta) / Math.Pow(r, j + 1);
        }
        return sum;
    }

    [Fact]
    public void LinearCarrierDensity_ZeroTemperatureEqualsIntegratedDensity()
    {
        // T → 0: f becomes the step θ(μ − E), so n = N(μ) (Ashcroft and Mermin ch. 2).
        var structure = BandStructure.Compute(Cells.WellBarrier(), 4);
        var props = BandProperties.Create(structure);
        var worst = 0.0;
        var coldWorst = 0.0;
        for (var n = 1; n <= 3; n++)
        {
            var band = structure.GetBand(n);
            foreach (var fraction in new[] { 0.1, 0.5, 0.9 })
            {
                var mu = band.BottomElectronVolts + fraction * band.WidthElectronVolts;
                var expected = props.IntegratedDensityOfStatesPerNanometre(mu);
                var atZero = props.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(0));
                var cold = props.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(1e-3));
                worst = Math.Max(worst, Cells.RelativeError(atZero.DensityPerNanometre, expected));
                // At 1 mK: N(μ) plus the Sommerfeld term (π²/6)(kT)²g′(μ) (Ashcroft and Mermin eq. 2.70, equation number from memory), which is
                // up to 1e-10 relative here; the O(T⁴) remainder is ~1e-20.
                var kT = KB * 1e-3;
                var slope = Cells.FirstDerivative(props.DensityOfStatesPerElectronVoltNanometre, mu, 1e-3 * band.WidthElectronVolts);
                var sommerfeld = expected + Math.PI * Math.PI / 6 * kT * kT * slope;
                coldWorst = Math.Max(coldWorst, Cells.RelativeError(cold.DensityPerNanometre, sommerfeld));
            }
        }
        output.WriteLine($"n(T=0) vs IDOS: worst relative {worst:E2}; n(1 mK) vs IDOS + Sommerfeld {coldWorst:E2}");
        // Quadrature on panels a few kT wide: rounding level; 1e-12 allows for E(k) found to 1e-14.
        Assert.True(coldWorst <= 1e-12, $"cold {coldWorst:E3}");
        // Panels end at the Fermi phase, so the step is integrated without error; rounding of E(k): 1e-12.
        Assert.True(worst <= 1e-12, $"worst {worst:E3}");
    }

    [Fact]
    public void LinearCarrierDensity_LowTemperatureFollowsSommerfeld()
    {
        // Sommerfeld expansion n(T) − n(0) = (π²/6)(k_BT)² g′(μ) + O(T⁴) (Ashcroft and Mermin eq. 2.70, equation number from memory).
        var structure = BandStructure.Compute(Cells.WellBarrier(), 3);
        var props = BandProperties.Create(structure);
        var band = structure.GetBand(1);
        var mu = band.BottomElectronVolts + 0.4 * band.WidthElectronVolts;
        const double t = 5;
        var kT = KB * t;
        var slope = Cells.FirstDerivative(props.DensityOfStatesPerElectronVoltNanometre, mu, 1e-3 * band.WidthElectronVolts);
        var expected = Math.PI * Math.PI / 6 * kT * kT * slope;
        var actual = props.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t)).DensityPerNanometre - props.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(0)).DensityPerNanometre;
        output.WriteLine($"Sommerfeld shift: relative difference {Cells.RelativeError(actual, expected):E2}");
        // The next term, (7π⁴/360)(kT)⁴g‴, is ≈ 1.15 (kT)² g‴/g′ ≈ 1.15·(kT)²·3.75/x² ≈ 2e-3 of the first for the
        // 1/√x edge law at x = 21 meV from the bottom and kT = 0.43 meV; tolerance 1e-2.
        Assert.True(Cells.RelativeError(actual, expected) <= 1e-2);
    }

    [Theory]
    [InlineData(-3.0, 300)]
    [InlineData(-1.0, 77)]
    [InlineData(-30.0, 0.5)]
    public void LinearCarrierDensity_FreeParticleMatchesFermiDiracIntegral(double eta, double t)
    {
        // 1D free gas: n = √(m k_BT/(π ħ²/2m₀)) · F_{−1/2}(η), from n = (2/π)∫dK f(ħ²K²/2m) (derived;
        // F_j as in Blakemore 1982).
        const double m = 0.067;
        var kT = KB * t;
        var props = BandProperties.Create(BandStructure.ComputeBelow(Cells.Free(5.0, m), Energy.FromElectronVolts(60 * kT)));
        var expected = Math.Sqrt(m * kT / (Math.PI * C)) * FermiDiracSeries(-0.5, eta);
        var actual = props.LinearCarrierDensity(Energy.FromElectronVolts(eta * kT), Temperature.FromKelvin(t));
        output.WriteLine($"1D free gas eta={eta}: relative error {Cells.RelativeError(actual.DensityPerNanometre, expected):E2}, estimate {actual.ErrorEstimatePerNanometre / expected:E2}");
        // 20-point panels on a smooth integrand: ~1e-13; tolerance 1e-10 covers the series (200 terms, e^{−200}).
        Assert.True(Cells.RelativeError(actual.DensityPerNanometre, expected) <= 1e-10);
        // The stated error estimate must be honest (cover the true error) and useful (not vastly larger than 1e-9).
        Assert.True(actual.ErrorEstimatePerNanometre >= Math.Abs(actual.DensityPerNanometre - expected) * 0.1 || Math.Abs(actual.DensityPerNanometre - expected) <= 1e-14 * expected);
        Assert.True(actual.ErrorEstimatePerNanometre <= 1e-9 * expected, $"estimate {actual.ErrorEstimatePerNanometre / expected:E2}");
    }

    [Theory]
    [InlineData(-2.0, 300)]
    [InlineData(-0.5, 150)]
    public void SuperlatticeCarrierDensity_FreeParticleMatchesThreeDimensionalGas(double eta, double t)
    {
        // 3D free gas: n = 2(m k_BT/2πħ²)^{3/2} F_{1/2}(η) (S. M. Sze, Physics of Semiconductor Devices, ch. 1, N_C form;
        // F_j as in Blakemore 1982). With ħ²/m₀ = 2C: m k_BT/(2πħ²) = m k_BT/(4πC) per nm².
        const double m = 0.067;
        var kT = KB * t;
        var props = BandProperties.Create(BandStructure.ComputeBelow(Cells.Free(5.0, m), Energy.FromElectronVolts(60 * kT)));
        var expected = 2 * Math.Pow(m * kT / (4 * Math.PI * C), 1.5) * FermiDiracSeries(0.5, eta);
        var actual = props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(eta * kT), Temperature.FromKelvin(t), EffectiveMass.FromElectronMasses(m));
        output.WriteLine($"3D free gas eta={eta}: relative error {Cells.RelativeError(actual.DensityPerCubicNanometre, expected):E2}");
        Assert.True(Cells.RelativeError(actual.DensityPerCubicNanometre, expected) <= 1e-10);
        Assert.Equal(actual.DensityPerCubicNanometre * 1e21, actual.DensityPerCubicCentimetre, actual.DensityPerCubicCentimetre * 1e-15);
    }

    [Fact]
    public void SuperlatticeCarrierDensity_ZeroTemperatureFreeGasIsKFCubedOverThreePiSquared()
    {
        // Degenerate 3D gas: n = k_F³/(3π²), k_F = √(mμ/C) (Ashcroft and Mermin eq. 2.21, equation number from memory).
        const double m = 0.067;
        var props = BandProperties.Create(BandStructure.Compute(Cells.Free(5.0, m), 6));
        foreach (var mu in new[] { 0.01, 0.1, 0.5 })
        {
            var kF = Math.Sqrt(m * mu / C);
            var expected = kF * kF * kF / (3 * Math.PI * Math.PI);
            // Panels end at k_F, so the kink of (μ − E)₊ costs nothing; smooth parabola pieces are exact: 1e-12.
            Assert.True(Cells.RelativeError(props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(0), EffectiveMass.FromElectronMasses(m)).DensityPerCubicNanometre, expected) <= 1e-12);
        }
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(4.2)]
    [InlineData(300.0)]
    public void FermiLevel_InvertsCarrierDensity(double t)
    {
        // Round trip μ → n(μ) → μ: n is monotone in μ, Brent to 1e-12 eV; the density from the found level must
        // match to the slope times 1e-12 eV (relative ≲ 1e-9 here).
        var structure = BandStructure.Compute(Cells.WellBarrier(), 6);
        var props = BandProperties.Create(structure);
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var mu = structure.GetBand(2).CenterElectronVolts;
        var linear = props.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t));
        var solution = props.FermiLevelForLinearDensity(linear.DensityPerNanometre, Temperature.FromKelvin(t));
        Assert.True(solution.Converged);
        Assert.True(Math.Abs(solution.FermiLevelElectronVolts - mu) <= 1e-9, solution.ToString());
        Assert.True(solution.RelativeDensityResidual <= 1e-9);
        var volume = props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t), mass);
        var solved = props.FermiLevelForSuperlatticeDensity(volume.DensityPerCubicNanometre, Temperature.FromKelvin(t), mass);
        Assert.True(Math.Abs(solved.FermiLevelElectronVolts - mu) <= 1e-9, solved.ToString());
    }

    [Fact]
    public void FermiLevel_NondegenerateSuperlatticeFollowsBoltzmannShift()
    {
        // Non-degenerate limit: n ∝ e^{μ/k_BT}, so halving n lowers μ by k_BT ln 2 (Sze ch. 1), up to the
        // degeneracy correction of F_{1/2} (≈ e^{η}/2^{3/2} relative, below 1e-6 for η < −12).
        var structure = BandStructure.Compute(Cells.WellBarrier(), 6);
        var props = BandProperties.Create(structure);
        var mass = EffectiveMass.FromElectronMasses(0.067);
        const double t = 300;
        var mu = structure.GetBand(1).BottomElectronVolts - 14 * KB * t;
        var n = props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t), mass).DensityPerCubicNanometre;
        var half = props.FermiLevelForSuperlatticeDensity(n / 2, Temperature.FromKelvin(t), mass);
        Assert.Equal(mu - KB * t * Math.Log(2), half.FermiLevelElectronVolts, 1e-6 * KB * t);
    }

    [Fact]
    public void Arguments_AreCheckedAndNamed()
    {
        var props = BandProperties.Create(BandStructure.Compute(Cells.WellBarrier(), 2));
        var mass = EffectiveMass.FromElectronMasses(0.067);
        Assert.Equal("kelvin", Assert.Throws<ArgumentOutOfRangeException>(() => props.LinearCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(-1))).ParamName);
        Assert.Equal("electronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => props.LinearCarrierDensity(Energy.FromElectronVolts(double.NaN), Temperature.FromKelvin(1))).ParamName);
        // μ + 40 kT beyond the computed bands is refused, not silently truncated.
        Assert.Equal("fermiLevel", Assert.Throws<ArgumentOutOfRangeException>(() => props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(props.UpperEnergyLimitElectronVolts), Temperature.FromKelvin(300), mass)).ParamName);
        Assert.Equal("densityPerNanometre", Assert.Throws<ArgumentOutOfRangeException>(() => props.FermiLevelForLinearDensity(0, Temperature.FromKelvin(300))).ParamName);
        Assert.Equal("densityPerCubicNanometre", Assert.Throws<ArgumentOutOfRangeException>(() => props.FermiLevelForSuperlatticeDensity(1e9, Temperature.FromKelvin(300), mass)).ParamName);
        Assert.Equal("inPlaneMass", Assert.Throws<ArgumentOutOfRangeException>(() => props.SuperlatticeCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(300), default)).ParamName);
        Assert.Equal("absoluteToleranceElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => props.FermiLevelForLinearDensity(0.1, Temperature.FromKelvin(300), FermiLevelOptions.Create(0))).ParamName);
    }
}
