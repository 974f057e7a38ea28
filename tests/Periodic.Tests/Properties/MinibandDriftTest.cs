// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Properties;

public sealed class MinibandDriftTest(ITestOutputHelper output)
{
    // CODATA 2018: h and e exact; ħ = h/2π in eV s.
    private const double HbarEvS = 6.62607015e-34 / (2 * Math.PI) / 1.602176634e-19;

    [Fact]
    public void VelocityAt_CosineBand_ReproducesEsakiTsu()
    {
        // L. Esaki and R. Tsu, IBM J. Res. Dev. 14, 61 (1970): E = (Δ/2)(1 − cos kd), carriers starting at the band bottom,
        // v = (Δd/2ħ)·ω_Bτ/(1 + (ω_Bτ)²), ω_B = eFd/ħ; peak at ω_Bτ = 1 with v = Δd/4ħ (derived).
        const double width = 0.02, d = 6.0, tau = 1e-13;
        var drift = MinibandDrift.FromCosineSeries([width / 2, -width / 2], Length.FromNanometres(d), tau);
        var worst = 0.0;
        foreach (var field in new[] { 1e4, 3e5, 1.0973e6, 4e6, 5e7 })
        {
            var x = field * d * 1e-9 / HbarEvS * tau;
            var expected = width * d * 1e-9 / (2 * HbarEvS) * x / (1 + x * x);
            worst = Math.Max(worst, Math.Abs(drift.VelocityAt(field) - expected) / expected);
        }
        var criticalField = HbarEvS / (d * 1e-9 * tau);
        var peak = width * d * 1e-9 / (4 * HbarEvS);
        output.WriteLine($"worst relative difference {worst:E2}; peak {drift.PeakVelocityMetresPerSecond:R} m/s at {drift.PeakFieldVoltsPerMetre:R} V/m (closed form {peak:R} at {criticalField:R})");
        // 1e-10: the acceptance bound; the sum has one term, so only rounding separates the two.
        Assert.True(worst < 1e-10, $"worst {worst:E3}");
        // 1e-10 for the peak velocity (flat at its maximum); the peak field to 1e-6 (a maximum is located to √ε).
        Assert.Equal(peak, drift.PeakVelocityMetresPerSecond, peak * 1e-10);
        Assert.Equal(criticalField, drift.PeakFieldVoltsPerMetre, criticalField * 1e-6);
        Assert.Equal(criticalField, drift.CriticalFieldVoltsPerMetre, criticalField * 1e-14);
    }

    [Fact]
    public void VelocityAt_CosineBandThermal_ScalesByBesselRatio()
    {
        // Boltzmann occupation of a cosine band: ⟨cos kd⟩ = I₁(Δ/2kT)/I₀(Δ/2kT) (A. A. Ignatov and Yu. A. Romanov, Phys. Status
        // Solidi B 73, 327 (1976), from memory; derived from f₀ ∝ e^{(Δ/2kT) cos kd}); Bessel functions from MathNet.
        const double width = 0.02, d = 6.0, tau = 1e-13, temperature = 150;
        var kT = temperature * 1.380649e-23 / 1.602176634e-19;
        var cold = MinibandDrift.FromCosineSeries([width / 2, -width / 2], Length.FromNanometres(d), tau);
        var warm = MinibandDrift.FromCosineSeries([width / 2, -width / 2], Length.FromNanometres(d), tau, Temperature.FromKelvin(temperature));
        var ratio = SpecialFunctions.BesselI1(width / (2 * kT)) / SpecialFunctions.BesselI0(width / (2 * kT));
        var relative = Math.Abs(warm.VelocityAt(1e6) / cold.VelocityAt(1e6) - ratio) / ratio;
        output.WriteLine($"ratio {warm.VelocityAt(1e6) / cold.VelocityAt(1e6):R}, I1/I0 = {ratio:R}, relative difference {relative:E2}");
        // 1e-12: the trapezoid rule on a periodic analytic integrand converges geometrically; MathNet's Bessel functions ~1e-15.
        Assert.True(relative < 1e-12, $"relative {relative:E3}");
    }

    [Fact]
    public void VelocityAt_KronigPenneyBand_DeviatesFromCosineAsItsHarmonicsPredict()
    {
        // A wide, non-cosine band: the engine's v(F) minus the single-cosine Esaki–Tsu term of its t₁ must equal the
        // higher harmonics Σ_{j≥2} (−j d t_j/ħ)(jx/(1 + j²x²)) (derived from the Boltzmann equation), with t_j computed here
        // independently from the Kronig–Penney closed form (Kronig and Penney 1931; equal masses) by a 64-point cosine transform.
        const double a = 5, b = 1, v0 = 0.3, m = 0.067, d = a + b, tau = 2e-13;
        var cell = UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0), EffectiveMass.FromElectronMasses(m));
        var drift = MinibandDrift.Create(BandStructure.Compute(cell, 2), 1, tau);
        var t = CosineSeries(a, b, v0, m, 64);
        output.WriteLine($"t1 = {t[1]:R} eV, t2 = {t[2]:R} eV, t3 = {t[3]:R} eV");
        var worst = 0.0;
        foreach (var field in new[] { 2e5, 1e6, 5e6 })
        {
            var x = field * d * 1e-9 / HbarEvS * tau;
            var cosineOnly = -d * 1e-9 * t[1] / HbarEvS * x / (1 + x * x);
            double harmonics = 0;
            for (var j = 2; j < t.Length; j++)
            {
                harmonics += -j * d * 1e-9 * t[j] / HbarEvS * j * x / (1 + j * j * x * x);
            }
            var deviation = drift.VelocityAt(field) - cosineOnly;
            var relative = Math.Abs(deviation - harmonics) / Math.Abs(harmonics);
            output.WriteLine($"F = {field:G3} V/m: v = {drift.VelocityAt(field):R}, deviation from cosine {deviation:R}, harmonics {harmonics:R} (relative {relative:E2})");
            worst = Math.Max(worst, relative);
            Assert.True(Math.Abs(harmonics) > 1e-3 * Math.Abs(cosineOnly), "the band must be visibly non-cosine for this check to mean anything");
        }
        // 1e-6 relative of the deviation: the deviation is ~1e-2 of v, and the engine's and this test's t_j agree to ~1e-13 eV.
        Assert.True(worst < 1e-6, $"worst {worst:E3}");
    }

    /// <summary>t_j of band 1 of the equal-mass Kronig–Penney cell: E(θ_i) by bisection on cos θ = D(E)/2, then a DCT-I.</summary>
    private static double[] CosineSeries(double a, double b, double v0, double m, int samples)
    {
        var hbar = 6.62607015e-34 / (2 * Math.PI);
        var c = hbar * hbar / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18;
        double Half(double e)
        {
            var k = Math.Sqrt(m * e / c);
            var q2 = m * (v0 - e) / c;
            var kappa = Math.Sqrt(q2);
            return Math.Cos(k * a) * Math.Cosh(kappa * b) + (kappa * kappa - k * k) / (2 * k * kappa) * Math.Sin(k * a) * Math.Sinh(kappa * b);
        }
        // Band 1 lies below the first root of Half = −1 above E > 0; Half decreases through the band.
        var energies = new double[samples + 1];
        for (var i = 0; i <= samples; i++)
        {
            var target = Math.Cos(Math.PI * i / samples);
            double lo = 1e-9, hi = 1e-9;
            while (Half(hi) > -1)
            {
                hi += 1e-3;
            }
            for (var iteration = 0; iteration < 200; iteration++)
            {
                var mid = 0.5 * (lo + hi);
                if (Half(mid) > target)
                {
                    lo = mid;
                }
                else
                {
                    hi = mid;
                }
            }
            energies[i] = 0.5 * (lo + hi);
        }
        var t = new double[samples + 1];
        for (var j = 0; j <= samples; j++)
        {
            var sum = 0.5 * (energies[0] + energies[samples] * Math.Cos(j * Math.PI));
            for (var i = 1; i < samples; i++)
            {
                sum += energies[i] * Math.Cos(j * Math.PI * i / samples);
            }
            t[j] = 2.0 / samples * sum * (j == 0 || j == samples ? 0.5 : 1);
        }
        return t;
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(-1.0)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(1e12)]
    public void VelocityAt_BadField_ThrowsNamingIt(double field)
    {
        var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067));
        var drift = MinibandDrift.Create(BandStructure.Compute(cell, 2), 1, 1e-13);
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => drift.VelocityAt(field));
        Assert.Equal("fieldVoltsPerMetre", e.ParamName);
    }
}
