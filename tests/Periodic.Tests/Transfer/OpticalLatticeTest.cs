// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

/// <summary>The optical lattice s·E_R·sin²(πx/d), s = 1 … 40 (a ⁸⁷Rb-like scenario of our own: d = 532 nm, mass in m₀ units).</summary>
public sealed class OpticalLatticeTest
{
    // An atom of 86.909 u expressed in electron masses (1 u = 1822.888 m0, CODATA 2018) — a demo scenario.
    private static readonly EffectiveMass AtomMass = EffectiveMass.FromElectronMasses(86.909 * 1822.888);
    private static readonly Length Period = Length.FromNanometres(532);
    private static readonly double Recoil = FourierSegment.RecoilEnergy(Period, AtomMass).ElectronVolts;

    private static RefinedBandStructure Bands(double s, int count) =>
        RefinedBandStructure.Compute(UnitCell.Create(FourierSegment.OpticalLattice(Period, s, AtomMass)), count, RefinementOptions.Create(1e-12));

    [Theory]
    [InlineData(1.0)]
    [InlineData(5.0)]
    [InlineData(10.0)]
    [InlineData(20.0)]
    [InlineData(40.0)]
    public void Edges_MatchMathieuMapping(double s)
    {
        // E/E_R = a_r(s/4) + s/2 (docs/references.md, derived: s·E_R·sin²(πx/d) = s·E_R/2 − (s·E_R/2)·cos(2πx/d) is the
        // cosine lattice of q = s/4 shifted by d/2, which leaves the spectrum unchanged, plus the constant s/2).
        // Independent tridiagonal reference; 1e-10 relative as for the cosine.
        var result = Bands(s, 3);
        var reference = MathieuReference.BandEdges(3, s / 4);
        for (var n = 1; n <= 3; n++)
        {
            var band = result.Structure.GetBand(n);
            double expectedBottom = (reference[2 * n - 2] + s / 2) * Recoil, expectedTop = (reference[2 * n - 1] + s / 2) * Recoil;
            Assert.True(Math.Abs(band.BottomElectronVolts - expectedBottom) <= 1e-10 * Math.Max(Recoil, expectedBottom), $"s = {s}, band {n} bottom");
            Assert.True(Math.Abs(band.TopElectronVolts - expectedTop) <= 1e-10 * Math.Max(Recoil, expectedTop), $"s = {s}, band {n} top");
        }
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(3.0)]
    [InlineData(10.0)]
    [InlineData(20.0)]
    [InlineData(30.0)]
    [InlineData(40.0)]
    public void PlaneWaveAndTransfer_AgreeOnEveryEdge(double s)
    {
        // Acceptance: two independent methods agree to 1e-9 relative on every edge returned (4 bands).
        var transfer = Bands(s, 4).Structure;
        var solver = PlaneWaveSolver.Create(FourierSegment.OpticalLattice(Period, s, AtomMass));
        var centre = solver.EnergiesAt(0, 4);
        var boundary = solver.EnergiesAt(Math.PI / Period.Nanometres, 4);
        for (var n = 1; n <= 4; n++)
        {
            var band = transfer.GetBand(n);
            double bottom = Math.Min(centre.EnergiesElectronVolts[n - 1], boundary.EnergiesElectronVolts[n - 1]);
            double top = Math.Max(centre.EnergiesElectronVolts[n - 1], boundary.EnergiesElectronVolts[n - 1]);
            Assert.True(Math.Abs(band.BottomElectronVolts - bottom) <= 1e-9 * Math.Max(Recoil, bottom), $"s = {s}, band {n} bottom {band.BottomElectronVolts:R} vs {bottom:R}");
            Assert.True(Math.Abs(band.TopElectronVolts - top) <= 1e-9 * Math.Max(Recoil, top), $"s = {s}, band {n} top {band.TopElectronVolts:R} vs {top:R}");
        }
    }

    [Fact]
    public void LowestBandWidth_FollowsZwergerTrend()
    {
        // W. Zwerger, J. Opt. B 5, S9 (2003) [read in secondary texts]: J/E_R ≈ (4/√π) s^{3/4} e^{−2√s} for deep
        // lattices, and the lowest band width is 4J in the tight-binding limit. Asymptotic only (about 8 %
        // high at s = 40): test the trend — the ratio exact/asymptotic rises towards 1 with depth and
        // lies within 20 % of 1 at s = 40 (margin over the quoted 8 %); the width falls monotonically.
        double previousRatio = 0, previousWidth = double.PositiveInfinity;
        foreach (var s in new[] { 10.0, 15.0, 20.0, 30.0, 40.0 })
        {
            var width = Bands(s, 1).Structure.GetBand(1).WidthElectronVolts / Recoil;
            var zwerger = 4 * (4 / Math.Sqrt(Math.PI)) * Math.Pow(s, 0.75) * Math.Exp(-2 * Math.Sqrt(s));
            var ratio = width / zwerger;
            Assert.True(width < previousWidth, $"s = {s}: width {width:G6} not below {previousWidth:G6}");
            Assert.True(ratio > previousRatio, $"s = {s}: ratio {ratio:G6} not above {previousRatio:G6}");
            previousRatio = ratio;
            previousWidth = width;
        }
        Assert.InRange(previousRatio, 0.8, 1.0);
    }
}
