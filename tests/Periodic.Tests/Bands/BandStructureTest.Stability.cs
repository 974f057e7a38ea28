// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    /// <summary>
    /// The κb → ∞ limit of the Kronig–Penney relation divided by cosh κb: the single-well level condition
    /// cos(kw a) + ½(ξ − 1/ξ) sin(kw a) = 0 with BenDaniel–Duke ξ = (κ/mb)/(kw/mw) [derived from
    /// Kronig &amp; Penney 1931; equivalent to the finite-square-well condition of Griffiths §2.6 for equal masses].
    /// </summary>
    private static double WellLevelCondition(double a, double v0, double mw, double mb, double e)
    {
        var kw = Math.Sqrt(mw * e / ClosedForms.C);
        var kappa = Math.Sqrt(mb * (v0 - e) / ClosedForms.C);
        var xi = (kappa / mb) / (kw / mw);
        return Math.Cos(kw * a) + 0.5 * (xi - 1 / xi) * Math.Sin(kw * a);
    }

    [Fact]
    public void Compute_BarrierWithKappaW700_BandsAreTheWellLevels()
    {
        // κb = 700 at the lowest level: band widths ~e^−700 relative, far below double resolution, so each
        // band is a degenerate pair at the isolated-well level (tanh κb = 1 to 1e-600).
        const double a = 6.0, v0 = 0.8, mw = 0.067, mb = 0.1;
        var b = 700 / Math.Sqrt(mb * v0 / ClosedForms.C);
        var cell = KronigPenney(a, b, v0, mw, mb);
        var levels = ClosedForms.ScanRoots(e => WellLevelCondition(a, v0, mw, mb, e), 1e-6, v0 * (1 - 1e-6), 100_000);
        Assert.True(levels.Count >= 3);
        var bands = BandStructure.Compute(cell, 3);
        var worst = 0.0;
        for (var n = 1; n <= 3; n++)
        {
            var band = bands.GetBand(n);
            Assert.True(double.IsFinite(band.BottomElectronVolts) && double.IsFinite(band.TopElectronVolts) && double.IsFinite(band.BottomErrorElectronVolts));
            Assert.Equal(levels[n - 1], band.BottomElectronVolts, EdgeTolerance(levels[n - 1]));
            Assert.Equal(levels[n - 1], band.TopElectronVolts, EdgeTolerance(levels[n - 1]));
            Assert.False(bands.Gaps[n - 1].IsClosed);
            worst = Math.Max(worst, Math.Max(Math.Abs(band.BottomElectronVolts - levels[n - 1]), Math.Abs(band.TopElectronVolts - levels[n - 1])) / levels[n - 1]);
        }
        Assert.Equal(3, bands.BandIndexAt(levels[2]) == 0 ? 3 : bands.BandIndexAt(levels[2])); // a zero-width band may round to either side
        output.WriteLine($"kappa*b = 700: band edges vs isolated-well levels, worst relative error {worst:E2}");
    }

    [Fact]
    public void Compute_BandOfWidth1e10_MatchesClosedForm()
    {
        // Thick barrier (b = 39 nm, κb ≈ 22): band 1 is about 1e-10 of its energy wide. Its edges are the roots
        // of the Kronig–Penney closed form F = ±1 bracketed around the isolated-well level (MathNet Brent).
        const double a = 5.0, b = 39.0, v0 = 0.3, m = 0.067;
        double F(double e) => ClosedForms.KronigPenneyHalfTrace(a, b, v0, m, m, e);
        var level = ClosedForms.ScanRoots(e => WellLevelCondition(a, v0, m, m, e), 1e-6, v0 * (1 - 1e-6), 10_000)[0];
        var centre = ClosedForms.BrentRoot(F, level * (1 - 1e-6), level * (1 + 1e-6));
        var bottom = ClosedForms.BrentRoot(e => F(e) - 1, centre * (1 - 1e-7), centre);
        var top = ClosedForms.BrentRoot(e => F(e) + 1, centre, centre * (1 + 1e-7));
        var relativeWidth = (top - bottom) / centre;
        Assert.InRange(relativeWidth, 1e-11, 1e-9); // the construction really is that narrow

        var band = BandStructure.Compute(KronigPenney(a, b, v0, m, m), 2).GetBand(1);
        Assert.Equal(bottom, band.BottomElectronVolts, EdgeTolerance(bottom));
        Assert.Equal(top, band.TopElectronVolts, EdgeTolerance(top));
        // Each edge to a few ε·E (F′ ∝ e^κb cancels the e^κb growth of the rounding of F), so the width
        // (1e-11 eV) to ~1e-5 relative.
        Assert.Equal(top - bottom, band.WidthElectronVolts, 1e-4 * (top - bottom));
        output.WriteLine($"band of relative width {relativeWidth:E2}: edge errors {Math.Abs(band.BottomElectronVolts / bottom - 1):E2}, {Math.Abs(band.TopElectronVolts / top - 1):E2} relative; width error {Math.Abs(band.WidthElectronVolts / (top - bottom) - 1):E2} relative");
    }

    [Fact]
    public void Compute_TenThousandLayers_FoldedBandsWithClosedGaps()
    {
        // 5000 repeats of a two-layer cell: ½Tr M^N = T_N(½Tr M) [derived], so the big cell's edges lie where
        // the small cell's Bloch phase is lπ/N: band n of the big cell is [E_small(k = (n−1)π/(Nd)),
        // E_small(k = nπ/(Nd))], and every gap between them is closed (T_N touches ±1 with zero slope).
        const int repeats = 5000;
        var well = Layer.Create(Length.FromNanometres(2.0), default, EffectiveMass.FromElectronMasses(0.067));
        var barrier = Layer.Create(Length.FromNanometres(1.0), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092));
        var smallCell = UnitCell.Create(well, barrier);
        var small = BandStructure.Compute(smallCell, 2);
        var bigCell = UnitCell.Create(Enumerable.Range(0, 2 * repeats).Select(i => i % 2 == 0 ? (CellElement)well : barrier));
        var big = BandStructure.Compute(bigCell, 3);
        var d = smallCell.Period.Nanometres;
        var worst = 0.0;
        for (var n = 1; n <= 3; n++)
        {
            var expectedBottom = small.EnergyAt(1, (n - 1) * Math.PI / (repeats * d));
            var expectedTop = small.EnergyAt(1, n * Math.PI / (repeats * d));
            var band = big.GetBand(n);
            Assert.Equal(expectedBottom, band.BottomElectronVolts, EdgeTolerance(expectedBottom));
            Assert.Equal(expectedTop, band.TopElectronVolts, EdgeTolerance(expectedTop));
            Assert.True(big.Gaps[n - 1].IsClosed, $"{big.Gaps[n - 1]} of the folded cell must be closed");
            worst = Math.Max(worst, Math.Max(Math.Abs(band.BottomElectronVolts / expectedBottom - 1), Math.Abs(band.TopElectronVolts / expectedTop - 1)));
        }
        output.WriteLine($"10,000 layers: folded band edges vs small-cell E(k), worst relative error {worst:E2}; big-cell band 1 bottom = small-cell bottom");
    }

    [Fact]
    public void Dispersion_TenThousandLayers_SmallCellEdgesAreBigCellEdges()
    {
        // N = 5000 is even, so T_N(±1) = 1: every edge of the small cell is a zone-centre edge (D = +2) of the
        // big cell [derived]. Locate the big cell's edge next to the small band-1 top independently (MathNet
        // Brent on D_big − 2, bracketed between the folded point ψ = (N − ½)π/N, where D_big = 0, and the gap).
        const int repeats = 5000;
        var well = Layer.Create(Length.FromNanometres(2.0), default, EffectiveMass.FromElectronMasses(0.067));
        var barrier = Layer.Create(Length.FromNanometres(1.0), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092));
        var smallCell = UnitCell.Create(well, barrier);
        var small = BandStructure.Compute(smallCell, 2);
        var big = CellTransfer.Create(UnitCell.Create(Enumerable.Range(0, 2 * repeats).Select(i => i % 2 == 0 ? (CellElement)well : barrier)));
        var d = smallCell.Period.Nanometres;
        var worst = 0.0;
        foreach (var (bandIndex, atTop) in new[] { (1, true), (2, false), (2, true) })
        {
            var band = small.GetBand(bandIndex);
            var edge = atTop ? band.TopElectronVolts : band.BottomElectronVolts;
            var kEdge = (atTop ? band.TopZonePoint : band.BottomZonePoint) == ZonePoint.Boundary ? Math.PI / d : 0.0;
            // Half a folded step inside the band: the small-cell phase differs from the edge's by π/(2N).
            var kInside = kEdge == 0 ? Math.PI / (2 * repeats * d) : (repeats - 0.5) * Math.PI / (repeats * d);
            var inside = small.EnergyAt(bandIndex, kInside);
            var outside = edge + 1e-6 * (atTop ? 1 : -1) * Math.Abs(edge);
            var root = ClosedForms.BrentRoot(e => big.Dispersion(e).Trace - 2, Math.Min(inside, outside), Math.Max(inside, outside));
            var error = Math.Abs(root - edge);
            worst = Math.Max(worst, error / edge);
            Assert.True(error <= EdgeTolerance(edge), $"small band {bandIndex} {(atTop ? "top" : "bottom")} {edge:R} eV, big-cell edge {root:R} eV");
            Assert.Equal(0.0, 0.5 * big.Dispersion(inside).Trace, 1e-6); // T_N = cos((N − ½)π) = 0 at the half step
        }
        output.WriteLine($"10,000 layers: small-cell edges found as big-cell edges, worst relative error {worst:E2}");
    }

    [Fact]
    public void Compute_RepeatedThickBarrierCell_FailsLoudlyInsteadOfReturningWrongBands()
    {
        // Known limitation (docs/core.md, "Resolution limits"): inside a band D = Tr M is O(1) while the
        // partial products grow like e^(Σκw), here about e^27, so D carries ~1e-5 of rounding. The finder
        // must then refuse (its own oscillation-count check fails) rather than return bands that are wrong.
        // Found by a random sweep: three copies of a cell with one κw ≈ 9 barrier. The tripled cell's bands
        // are the single cell's bands folded (½Tr M³ = T₃(½Tr M) [derived]), so when this limitation is
        // lifted the test should become: band 1 bottom equal to the single cell's, folded gaps closed.
        var elements = new[]
        {
            new ElementSpec(true, 0, 0, 0, 0.048), new ElementSpec(true, 0, 0, 0, -0.056),
            new ElementSpec(false, 1.96, -0.19, 1.41, 0), new ElementSpec(false, 1.93, 0.379, 1.5, 0),
            new ElementSpec(false, 0.31, 0.227, 0.75, 0), new ElementSpec(false, 1.63, -0.26, 0.22, 0),
        };
        var single = BandStructure.Compute(new CellSpec(elements, []).Build(), 2);
        Assert.True(single.CountChecks > 0);
        var tripledCell = new CellSpec(elements.Concat(elements).Concat(elements).ToArray(), []).Build();
        try
        {
            var tripled = BandStructure.Compute(tripledCell, 6);
            // If it does return, the result must be right.
            Assert.Equal(single.GetBand(1).BottomElectronVolts, tripled.GetBand(1).BottomElectronVolts, EdgeTolerance(single.GetBand(1).BottomElectronVolts));
            Assert.True(tripled.Gaps[0].IsClosed && tripled.Gaps[1].IsClosed);
        }
        catch (BandSearchException)
        {
            // The documented, loud failure.
        }
    }
}

public sealed class SupercellTest
{
    private static readonly EffectiveMass WellMass = EffectiveMass.FromElectronMasses(0.067);
    private static readonly EffectiveMass BarrierMass = EffectiveMass.FromElectronMasses(0.092);

    // Demo numbers of our own (GaAs-like well, 0.25 eV barrier), not a material model.
    private static UnitCell Copies(int copies, double barrierNanometres)
    {
        var elements = new List<CellElement>();
        for (var i = 0; i < copies; i++)
        {
            elements.Add(Layer.Create(Length.FromNanometres(6), default, WellMass));
            elements.Add(Layer.Create(Length.FromNanometres(barrierNanometres), Energy.FromElectronVolts(0.25), BarrierMass));
        }
        return UnitCell.Create(elements);
    }

    [Theory]
    [InlineData(4.0)]   // Σκw ≈ 8: resolved
    [InlineData(20.0)]  // Σκw ≈ 42: folded gaps far below double-precision resolution (docs/core.md)
    public void Compute_ThreeCopiesOfAPeriod_FoldsThePrimitiveBandsOrSaysWhatToDo(double barrierNanometres)
    {
        // Zone folding (common practice, e.g. Ashcroft & Mermin ch. 8): a cell of N identical periods has, for every band
        // of the short period, N bands spanning the same energies with N − 1 exactly closed gaps between them, so
        // the lowest and highest edge of each group of N are the primitive band's bottom and top.
        var primitive = BandStructure.Compute(Copies(1, barrierNanometres), 1);
        var supercell = Copies(3, barrierNanometres);
        try
        {
            var folded = BandStructure.Compute(supercell, 3);
            var bottom = folded.GetBand(1);
            var top = folded.GetBand(3);
            // Tolerance: the reported error bounds of both edges plus 1e-12 relative (the edge search's own
            // tolerance; the folded search reaches it where it resolves anything).
            Assert.Equal(primitive.GetBand(1).BottomElectronVolts, bottom.BottomElectronVolts,
                bottom.BottomErrorElectronVolts + 1e-12 * bottom.BottomElectronVolts);
            Assert.Equal(primitive.GetBand(1).TopElectronVolts, top.TopElectronVolts,
                top.TopErrorElectronVolts + 1e-12 * top.TopElectronVolts);
            Assert.True(folded.Gaps[0].IsClosed && folded.Gaps[1].IsClosed);
        }
        catch (BandSearchException failure)
        {
            // Where the search cannot resolve the folding it must say why and what to do instead.
            Assert.Contains("3 identical copies of a period of 2 elements", failure.Message);
            Assert.Contains("Compute the bands of the shorter period", failure.Message);
        }
    }

    [Fact]
    public void RepeatCount_RecognisesRepetitionsByValue()
    {
        Assert.Equal(3, Copies(3, 5).RepeatCount());
        Assert.Equal(1, Copies(1, 5).RepeatCount());
        // Not a repetition: one barrier differs by one part in 1e15 of its width.
        var elements = Copies(2, 5).Elements.ToList();
        elements[3] = Layer.Create(Length.FromNanometres(5 * (1 + 1e-15)), Energy.FromElectronVolts(0.25), BarrierMass);
        Assert.Equal(1, UnitCell.Create(elements).RepeatCount());
        // Deltas by strength.
        var comb = UnitCell.Create(DeltaBarrier.Create(0.1), Layer.Create(Length.FromNanometres(1), default, WellMass),
            DeltaBarrier.Create(0.1), Layer.Create(Length.FromNanometres(1), default, WellMass));
        Assert.Equal(2, comb.RepeatCount());
    }
}
