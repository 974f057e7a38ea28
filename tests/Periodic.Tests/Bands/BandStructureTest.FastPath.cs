// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    [Theory]
    [InlineData(1.0)]
    [InlineData(1e6)] // a heavy particle (cold-atom scale, bands near 1e-7 eV): the inversion must keep its relative accuracy
    public void EnergiesAt_LongSpan_SatisfiesClosedFormWithinReportedError(double lambda)
    {
        // Masses × λ and potentials / λ scale every energy by 1/λ [derived from the Schrödinger equation].
        double a = 5.0, b = 2.0, v0 = 0.25 / lambda, mw = 0.067 * lambda, mb = 0.092 * lambda;
        var bands = BandStructure.Compute(KronigPenney(a, b, v0, mw, mb), 4);
        var points = BandStructure.FastPathMinimumPoints + 37; // long enough for the fast path, odd tail
        var k = new double[points];
        for (var i = 0; i < points; i++)
        {
            k[i] = Math.PI / bands.PeriodNanometres * i / (points - 1);
        }
        var energies = new double[points];
        for (var n = 1; n <= 4; n++)
        {
            bands.EnergiesAt(n, k, energies);
            var dispersion = bands.DispersionOf(n);
            var band = bands.GetBand(n);
            for (var i = 1; i < points - 1; i += 7)
            {
                // Independent check: Kronig & Penney (1931) with BenDaniel–Duke masses gives cos kd = D(E)/2 in
                // closed form; the energy error is |D/2 − cos kd| / |dD/2/dE| (first order; the derivative by a
                // central difference of the closed form).
                var e = energies[i];
                var residual = ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e) - Math.Cos(k[i] * bands.PeriodNanometres);
                var h = 1e-6 * band.WidthElectronVolts;
                var slope = (ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e + h) - ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e - h)) / (2 * h);
                var error = Math.Abs(residual / slope);
                // Tolerance: the reported series error plus the root search's own tolerance and the closed form's
                // rounding (≈ 1e-15 of |D| / |dD/dE|, relative 1e-13 of the band's magnitude covers both).
                var allowed = dispersion.ErrorEstimateElectronVolts + dispersion.ToleranceElectronVolts + 1e-13 * Math.Abs(band.TopElectronVolts);
                Assert.True(error <= allowed, $"band {n}, k[{i}]: closed-form error {error:E3} eV > allowed {allowed:E3} eV");
            }
            // The series' error estimate is a relative 1e-12 of the band or better (the root search's accuracy).
            Assert.True(dispersion.ErrorEstimateElectronVolts <= 1e-12 * Math.Abs(band.TopElectronVolts), dispersion.ToString());
            // The zone centre and boundary give the band edges exactly (the series interpolates its end nodes).
            var atCentre = band.BottomZonePoint == ZonePoint.Center ? band.BottomElectronVolts : band.TopElectronVolts;
            Assert.Equal(atCentre, energies[0], 4 * DoubleEpsilon * Math.Abs(atCentre) + dispersion.ErrorEstimateElectronVolts);
        }
    }

    [Fact]
    public void EnergiesAt_ShortAndLongSpans_AgreeWithinReportedError()
    {
        var bands = BandStructure.Compute(KronigPenney(5.0, 2.0, 0.25, 0.067, 0.092), 3);
        var k = Enumerable.Range(0, 600).Select(i => Math.PI / bands.PeriodNanometres * i / 599.0).ToArray();
        var fast = new double[k.Length];
        bands.EnergiesAt(3, k, fast);
        var tolerance = bands.DispersionOf(3).ErrorEstimateElectronVolts + bands.DispersionOf(3).ToleranceElectronVolts;
        for (var i = 0; i < k.Length; i += 13)
        {
            // Per-point root search vs the inversion: they differ by at most the inversion's reported error plus the search tolerance.
            Assert.Equal(bands.EnergyAt(3, k[i]), fast[i], tolerance);
        }
        Assert.Same(bands.DispersionOf(3), bands.DispersionOf(3)); // built once, kept
    }
}
