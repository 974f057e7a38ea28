// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    private static BandStructure DiracComb(double d, double p, double m, int count) =>
        BandStructure.Compute(UnitCell.DiracComb(Length.FromNanometres(d), ClosedForms.DiracCombStrengthForP(p, d, m), EffectiveMass.FromElectronMasses(m)), count);

    [Fact]
    public void DiracComb_ThreeHalvesPi_SecondBandStartsAtKdThreeHalvesPi()
    {
        // P = 3π/2 (Griffiths problem on eq. 5.65 [derived]): at Kd = 3π/2, cos Kd = 0 and
        // P sin(Kd)/(Kd) = (3π/2)(−1)/(3π/2) = −1, so cos kd = −1: the bottom of band 2 (a zone-boundary
        // edge) is exactly E = C(3π/2)²/(m d²). Here d = 1.3 nm, m = 0.2 m0.
        const double d = 1.3, m = 0.2;
        var bands = DiracComb(d, 3 * Math.PI / 2, m, 3);
        var expected = ClosedForms.C * Math.Pow(1.5 * Math.PI / d, 2) / m;
        var band2 = bands.GetBand(2);
        Assert.Equal(ZonePoint.Boundary, band2.BottomZonePoint);
        Assert.Equal(expected, band2.BottomElectronVolts, EdgeTolerance(expected));
        output.WriteLine($"Dirac comb P = 3pi/2, band 2 bottom: {band2.BottomElectronVolts:R} vs {expected:R} (relative {Math.Abs(band2.BottomElectronVolts / expected - 1):E2})");
    }

    [Theory]
    [InlineData(1.0, 3 * Math.PI / 2, 1.0)]
    [InlineData(2.0, 0.4, 0.2)]
    [InlineData(0.7, -2.5, 0.067)]
    [InlineData(1.0, 30.0, 1.0)]
    public void DiracComb_AllEdges_MatchClosedFormRoots(double d, double p, double m)
    {
        // Edges are the roots of cos Kd + P sin(Kd)/(Kd) = ±1 (Kittel ch. 7; Griffiths eq. 5.65), continued
        // to E < 0 (cosh/sinh) for delta wells (P < 0); for P > 0 every band top is at Kd = nπ exactly.
        const int count = 6;
        var bands = DiracComb(d, p, m, count);
        var edges = Edges(bands);
        var strength = ClosedForms.DiracCombStrengthForP(p, d, m);
        var lower = bands.GetBand(1).BottomElectronVolts;
        lower = lower > 0 ? 1e-9 * lower : 1.5 * lower;
        var upper = edges[^1] * 1.05;
        double F(double e) => ClosedForms.DiracCombHalfTrace(d, strength, m, e, out _);
        var roots = ClosedForms.ScanRoots(e => F(e) - 1, lower, upper, 200_000)
            .Concat(ClosedForms.ScanRoots(e => F(e) + 1, lower, upper, 200_000)).Order().ToArray();
        Assert.True(roots.Length >= edges.Length);
        var worst = 0.0;
        for (var i = 0; i < edges.Length; i++)
        {
            var error = Math.Abs(edges[i] - roots[i]);
            worst = Math.Max(worst, error / Math.Abs(roots[i]));
            Assert.True(error <= EdgeTolerance(roots[i]), $"edge {i}: {edges[i]:R} vs closed form {roots[i]:R}");
        }
        if (p > 0)
        {
            for (var n = 1; n <= count; n++)
            {
                var top = ClosedForms.C * Math.Pow(n * Math.PI / d, 2) / m; // Kd = nπ
                Assert.Equal(top, bands.GetBand(n).TopElectronVolts, EdgeTolerance(top));
                worst = Math.Max(worst, Math.Abs(bands.GetBand(n).TopElectronVolts / top - 1));
            }
        }
        output.WriteLine($"Dirac comb edges (d={d}, P={p:G4}, m={m}): {edges.Length} edges, worst relative error {worst:E2}");
    }
}
