// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Tests.TestHelpers;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Bands;

public sealed class SpectralBandStructureTest(ITestOutputHelper output)
{
    private static readonly Length Period = Length.FromNanometres(532);

    // 87Rb in units of m0: 86.909 180 53 u (AME2020, from memory) × 1822.888 486 209 m0/u (CODATA 2018, read).
    private static readonly EffectiveMass Rubidium = EffectiveMass.FromElectronMasses(86.90918053 * 1822.888486209);

    private static double Recoil => FourierSegment.RecoilEnergy(Period, Rubidium).ElectronVolts;

    private static UnitCell Cosine(double q) => UnitCell.Create(FourierSegment.Cosine(Period, Energy.FromElectronVolts(2 * q * Recoil), Rubidium));

    [Theory]
    [InlineData(0.01)]
    [InlineData(0.1)]
    [InlineData(0.5)]
    [InlineData(1.0)]
    [InlineData(3.0)]
    [InlineData(10.0)]
    [InlineData(30.0)]
    [InlineData(100.0)]
    public void Compute_CosineLattice_EdgesMatchMathieuTo1e12(double q)
    {
        // Mathieu characteristic values (Abramowitz and Stegun §20.2 recurrences, solved in 28-digit decimal by
        // MathieuReference; validated against Zhang and Jin's q = 25 table below): V0 cos(2πx/d) has band n =
        // [a_{n−1}, b_n]·E_R with q = V0/2E_R (REFERENCES.md). Goal of the spectral path: 1e-12 relative to
        // max(|E|, S), S = max(2V0, E_R), for the first 10 bands, reported converged, with the reported error
        // bounding the true one and at most 10 times the largest true error of the set (a pessimism of 1000,
        // as the Magnus path had, would fail).
        const int bands = 10;
        var result = SpectralBandStructure.Compute(Cosine(q), bands);
        var reference = MathieuReference.BandEdges(bands, q);
        var scale = Math.Max(4 * q, 1.0);
        double maxRelative = 0, maxTrue = 0, maxEstimate = 0;
        for (var i = 0; i < 2 * bands; i++)
        {
            var band = result.Bands.GetBand(i / 2 + 1);
            var edge = (i % 2 == 0 ? band.BottomElectronVolts : band.TopElectronVolts) / Recoil;
            var error = Math.Abs(edge - reference[i]);
            var estimate = result.EdgeErrorsElectronVolts[i] / Recoil;
            maxRelative = Math.Max(maxRelative, error / Math.Max(Math.Abs(reference[i]), scale));
            maxTrue = Math.Max(maxTrue, error);
            maxEstimate = Math.Max(maxEstimate, estimate);
            // The estimate must bound the error (slack: one ulp of the reference's rounding to double).
            Assert.True(error <= estimate + 2.3e-16 * Math.Abs(reference[i]), $"edge {i}: true {error:G3} E_R, estimated {estimate:G3} E_R");
        }
        output.WriteLine($"q = {q}: max relative edge error {maxRelative:G3}, max true {maxTrue:G3} E_R, max estimate {maxEstimate:G3} E_R (ratio {maxEstimate / maxTrue:G3}), basis {result.BasisSize}");
        Assert.True(result.Converged);
        Assert.True(maxRelative <= 1e-12, $"max relative error {maxRelative:G3}");
        Assert.True(maxEstimate <= 10 * Math.Max(maxTrue, 1e-16 * scale), $"estimate {maxEstimate:G3} vs true {maxTrue:G3} E_R");
    }
}
