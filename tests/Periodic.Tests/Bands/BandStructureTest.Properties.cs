// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck.Fluent;
using Periodic.Bands;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    private const int BandPropertyCells = 1000;

    [Fact]
    public void Compute_RandomCells_BandCountEqualsOscillationCount()
    {
        // The number of bands found below E equals the oscillation (Prüfer) count of edges below E
        // (Magnus & Winkler; Eastham): count the finder's edges below each probe energy, away from edges.
        var ran = RandomCells.Check(RandomCells.Cells(4, 3), BandPropertyCells, 20260201UL, spec =>
        {
            var cell = spec.Build();
            var bands = BandStructure.Compute(cell, 3);
            var edges = Edges(bands);
            foreach (var e in spec.EnergiesElectronVolts.Where(e => e < edges[^1]))
            {
                if (edges.Any(x => Math.Abs(x - e) <= 1e-9 * Math.Max(1, Math.Abs(e))))
                {
                    continue; // at an edge within rounding either neighbouring count is right
                }
                var below = edges.Count(x => x < e);
                Assert.True(below == bands.Transfer.CountBandEdgesBelow(e), $"{spec}: {below} edges found below {e:R} eV, oscillation count {bands.Transfer.CountBandEdgesBelow(e)}");
                var limited = BandStructure.ComputeBelow(cell, Energy.FromElectronVolts(e));
                Assert.Equal(Math.Max(1, (below + 1) / 2), limited.Bands.Count);
            }
        });
        output.WriteLine($"band count = oscillation count: {ran} random cells");
    }

    [Fact]
    public void EnergyAt_RandomCells_IsEvenInKAndSolvesTheBlochCondition()
    {
        // E(k) = E(−k) (time reversal), and D(E_n(k)) = 2 cos kd (Bloch; Kittel ch. 7): checked as
        // |D(E) − 2cos kd| ≤ |dD/dE|·(edge tolerance) + rounding of D.
        var gen = from spec in RandomCells.Cells(4, 2)
                  from j in Gen.Choose(-1000, 1000)
                  select new CellSpec(spec.Elements, spec.EnergiesElectronVolts.Append(j / 1000.0).ToArray());
        var worst = 0.0;
        var ran = RandomCells.Check(gen, BandPropertyCells, 20260202UL, spec =>
        {
            var bands = BandStructure.Compute(spec.Build(), 3);
            var k = spec.EnergiesElectronVolts[^1] * Math.PI / bands.PeriodNanometres;
            for (var n = 1; n <= 3; n++)
            {
                var e = bands.EnergyAt(n, k);
                Assert.Equal(e, bands.EnergyAt(n, -k));
                var band = bands.GetBand(n);
                Assert.InRange(e, band.BottomElectronVolts, band.TopElectronVolts);
                var value = bands.Transfer.Evaluate(e);
                var dispersion = bands.Transfer.Dispersion(e);
                var residual = Math.Abs(dispersion.Trace - 2 * Math.Cos(k * bands.PeriodNanometres));
                var allowed = Math.Abs(dispersion.TraceDerivativePerElectronVolt) * EdgeTolerance(e) * 4
                    + 64 * (spec.Elements.Length + 1) * DoubleEpsilon * Math.Max(value.Mantissa.MaxAbsEntry * Math.Exp(value.LogScale), 1);
                Assert.True(residual <= allowed, $"{spec}: D(E_{n}({k:R})) − 2cos kd = {residual:E2}, allowed {allowed:E2}");
                worst = Math.Max(worst, residual / allowed);
            }
        });
        output.WriteLine($"E(k) = E(-k) and D(E(k)) = 2cos kd: {ran} random cells x 3 bands, worst residual {worst:F3} of its bound");
    }

    [Fact]
    public void Compute_RandomCells_ScalingLawOnEdges()
    {
        // x → s x with V, E → V/s² and delta strengths → S/s leaves the equation invariant (dimensional
        // analysis): every edge scales exactly as 1/s². Tolerance: twice the edge tolerance (both searches)
        // plus the rounding of the scaled inputs.
        var gen = from spec in RandomCells.Cells(4, 1)
                  from s in Gen.Choose(25, 400)
                  select new CellSpec(spec.Elements, [s / 100.0]);
        var worst = 0.0;
        var ran = RandomCells.Check(gen, BandPropertyCells, 20260203UL, spec =>
        {
            var s = spec.EnergiesElectronVolts[0];
            var original = Edges(BandStructure.Compute(spec.Build(), 3));
            var scaled = Edges(BandStructure.Compute(new CellSpec(spec.Elements.Select(x => x.Scaled(s)).ToArray(), []).Build(), 3));
            for (var i = 0; i < original.Length; i++)
            {
                var expected = original[i] / (s * s);
                var spread = Math.Max(Math.Abs(spec.MinimumPotential), Math.Abs(spec.MaximumPotential)) / (s * s);
                var tolerance = 2 * EdgeTolerance(Math.Max(Math.Abs(expected), spread)) + 64 * DoubleEpsilon * spread;
                Assert.True(Math.Abs(scaled[i] - expected) <= tolerance, $"{spec} scaled by {s}: edge {i} {scaled[i]:R} vs {expected:R}");
                worst = Math.Max(worst, Math.Abs(scaled[i] - expected) / Math.Max(Math.Max(Math.Abs(expected), spread), 1e-3));
            }
        });
        output.WriteLine($"scaling law (edges): {ran} random cells, worst relative deviation {worst:E2} (floor 1 meV)");
    }

    [Fact]
    public void AllOutputs_RandomCells_AreFinite()
    {
        // No NaN ever leaks out of a public API (house rule).
        var ran = RandomCells.Check(RandomCells.Cells(5, 3), BandPropertyCells, 20260204UL, spec =>
        {
            var bands = BandStructure.Compute(spec.Build(), 3);
            foreach (var band in bands.Bands)
            {
                Assert.True(double.IsFinite(band.BottomElectronVolts) && double.IsFinite(band.TopElectronVolts)
                    && double.IsFinite(band.BottomErrorElectronVolts) && double.IsFinite(band.TopErrorElectronVolts)
                    && double.IsFinite(band.GapAboveElectronVolts), $"{spec}: {band}");
                Assert.True(band.WidthElectronVolts >= 0 && band.GapAboveElectronVolts >= 0, $"{spec}: {band}");
            }
            var ks = new[] { -bands.Cell.ZoneBoundaryPerNanometre, -0.3, 0.0, 0.1, bands.Cell.ZoneBoundaryPerNanometre }
                .Where(k => Math.Abs(k) <= bands.Cell.ZoneBoundaryPerNanometre).ToArray();
            var destination = new double[ks.Length + 1];
            bands.EnergiesAt(2, ks, destination);
            Assert.All(destination.Take(ks.Length), e => Assert.True(double.IsFinite(e)));
            foreach (var e in spec.EnergiesElectronVolts)
            {
                var k = bands.WavevectorAt(e);
                Assert.True(double.IsFinite(k.RealPerNanometre) && double.IsFinite(k.ImaginaryPerNanometre), spec.ToString());
                Assert.InRange(bands.BandIndexAt(e), 0, int.MaxValue);
            }
            Assert.True(double.IsFinite(bands.MaxEdgeErrorElectronVolts));
        });
        output.WriteLine($"no NaN (bands): {ran} random cells");
    }

    [Fact]
    public void Compute_RandomDoubledCells_FoldedGapsClosedAtQuarterZone()
    {
        // A cell made of two copies of a random cell has ½Tr M² = T₂(x) = 2x² − 1, x = ½Tr M [derived]: its edges
        // are the small cell's edges (x = ±1, T₂ = 1) and the points x = 0 (T₂ = −1) where the small cell's
        // Bloch phase is π/2, each a doubly degenerate edge. So band 2j − 1 and 2j of the doubled cell meet at
        // E_j(k = π/2d) of the small cell with a closed gap, and the other gaps are the small cell's.
        var worst = 0.0;
        var beyondTarget = 0;
        var ran = RandomCells.Check(RandomCells.Cells(3, 1), BandPropertyCells / 2, 20260205UL, spec =>
        {
            var small = BandStructure.Compute(spec.Build(), 2);
            var doubled = BandStructure.Compute(new CellSpec(spec.Elements.Concat(spec.Elements).ToArray(), []).Build(), 4);
            var d = small.PeriodNanometres;
            for (var j = 1; j <= 2; j++)
            {
                var quarter = small.EnergyAt(j, Math.PI / (2 * d));
                var gap = doubled.Gaps[2 * j - 2];
                Assert.True(gap.IsClosed, $"{spec}: {gap} should be closed at {quarter:R} eV");
                // E(k) at mid-band meets the edge tolerance; both searches contribute. Thick barriers (κw ≈ 8 per
                // layer here) make M lose digits to cancellation (≈ ε e^(2κw) in the doubled cell), so the closed
                // edge may be off by more: then the error bound the finder reports must cover it.
                var tolerance = 2 * EdgeTolerance(Math.Max(Math.Abs(quarter), Math.Abs(spec.MinimumPotential)));
                var reported = doubled.GetBand(2 * j - 1).TopErrorElectronVolts;
                var deviation = Math.Abs(gap.LowerElectronVolts - quarter);
                Assert.True(deviation <= Math.Max(tolerance, reported + tolerance), $"{spec}: closed gap at {gap.LowerElectronVolts:R}, expected {quarter:R}, reported error {reported:E2}");
                if (deviation > tolerance)
                {
                    beyondTarget++;
                }
                Assert.True(Math.Abs(doubled.GetBand(2 * j - 1).BottomElectronVolts - small.GetBand(j).BottomElectronVolts) <= tolerance, spec.ToString());
                Assert.True(Math.Abs(doubled.GetBand(2 * j).TopElectronVolts - small.GetBand(j).TopElectronVolts) <= tolerance, spec.ToString());
                worst = Math.Max(worst, Math.Abs(gap.LowerElectronVolts - quarter) / Math.Max(Math.Abs(quarter), 1e-3));
                if (!small.Gaps[j - 1].IsClosed && small.Gaps[j - 1].WidthElectronVolts > 1e-9)
                {
                    Assert.False(doubled.Gaps[2 * j - 1].IsClosed, $"{spec}: the small cell's gap {j} must stay open");
                }
            }
        });
        output.WriteLine($"doubled cells: {ran} random cells, folded gaps closed, worst relative deviation of the closed-gap energy {worst:E2}; {beyondTarget} closed gaps beyond 2e-12 relative (within their reported bounds)");
    }
}
