// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    private const double DoubleEpsilon = 2.220446049250313e-16;

    /// <summary>The accuracy target: edges to 1e-12 relative, or 1e-15 eV absolute near zero.</summary>
    private static double EdgeTolerance(double energy) => Math.Max(1e-12 * Math.Abs(energy), 1e-15);

    private static UnitCell KronigPenney(double a, double b, double v0, double mw, double mb) =>
        UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0),
            EffectiveMass.FromElectronMasses(mw), EffectiveMass.FromElectronMasses(mb));

    /// <summary>Edges e0 … e_2N of a band structure: bottoms and tops of bands 1 … N and the bottom of band N + 1.</summary>
    private static double[] Edges(BandStructure bands)
    {
        var edges = new List<double>();
        foreach (var band in bands.Bands)
        {
            edges.Add(band.BottomElectronVolts);
            edges.Add(band.TopElectronVolts);
        }
        var last = bands.Bands[^1];
        edges.Add(last.TopElectronVolts + last.GapAboveElectronVolts);
        return edges.ToArray();
    }

    /// <summary>Kronig–Penney cells as in CellTransferTest (generic: no gap closes exactly).</summary>
    public static TheoryData<double, double, double, double, double> KronigPenneyCells => new()
    {
        { 5.0, 2.0, 0.25, 0.067, 0.092 },
        { 1.0, 0.5, 2.0, 1.0, 0.3 },
        { 0.3, 3.0, 0.1, 0.2, 0.8 },
        { 4.0, 8.0, 0.4, 0.067, 0.09 },
    };

    [Theory]
    [MemberData(nameof(KronigPenneyCells))]
    public void Compute_KronigPenney_EdgesAreRootsOfClosedForm(double a, double b, double v0, double mw, double mb)
    {
        const int bandCount = 8;
        var bands = BandStructure.Compute(KronigPenney(a, b, v0, mw, mb), bandCount);
        var edges = Edges(bands);

        // Independent edges: every root of cos kd = ±1 of the closed form (Kronig & Penney 1931 with
        // BenDaniel–Duke masses), bracketed by a fine uniform scan and refined by MathNet's Brent.
        var upper = edges[^1] * 1.05;
        var roots = ClosedForms.ScanRoots(e => ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e) - 1, 1e-9 * v0, upper, 200_000)
            .Concat(ClosedForms.ScanRoots(e => ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e) + 1, 1e-9 * v0, upper, 200_000))
            .Order()
            .ToArray();
        Assert.True(roots.Length >= edges.Length, $"the closed form has {roots.Length} edges below {upper:R} eV, the band finder {edges.Length}");

        var worst = 0.0;
        for (var i = 0; i < edges.Length; i++)
        {
            var error = Math.Abs(edges[i] - roots[i]);
            worst = Math.Max(worst, error / Math.Abs(roots[i]));
            Assert.True(error <= EdgeTolerance(roots[i]), $"edge {i}: {edges[i]:R} eV, closed form {roots[i]:R} eV, relative error {error / roots[i]:E2}");
            // The finder's own error bound must cover the true error (it reports what it reached).
            var reported = i == edges.Length - 1 ? double.PositiveInfinity
                : i % 2 == 0 ? bands.Bands[i / 2].BottomErrorElectronVolts : bands.Bands[i / 2].TopErrorElectronVolts;
            Assert.True(error <= reported + 4 * DoubleEpsilon * Math.Abs(roots[i]), $"edge {i}: error {error:E2} eV exceeds the reported bound {reported:E2} eV");
        }
        Assert.True(bands.MaxEdgeErrorElectronVolts <= 1e-12 * edges[^1]);
        output.WriteLine($"KP edges vs closed-form roots (a={a}, b={b}, V0={v0}, mw={mw}, mb={mb}): {edges.Length} edges, worst relative error {worst:E2}, reported max bound {bands.MaxEdgeErrorElectronVolts:E2} eV");
    }

    [Fact]
    public void Compute_KronigPenneyClosedGap_DegenerateEdgeAtDerivedEnergy()
    {
        // Derived from the Kronig–Penney relation for E > V0: cos kd = cos α cos β − g sin α sin β with
        // α = kw a, β = kb b, g = ½(ξ + 1/ξ) ≥ 1. Where α = lπ and β = nπ at the same energy, cos kd = ±1 and,
        // to second order, ±cos kd = 1 − ½(δα² + δβ² + 2g δα δβ) ≤ 1 on both sides (δα, δβ grow together):
        // the gap closes there, a degenerate edge. With a = b = 1 nm, mw = 0.5, mb = 0.25, l = 2, n = 1:
        // E* = C(2π)²/mw = 8π²C and V0 = E* − Cπ²/mb = 4π²C.
        const double c = ClosedForms.C;
        var eStar = 8 * Math.PI * Math.PI * c;
        var v0 = 4 * Math.PI * Math.PI * c;
        var bands = BandStructure.Compute(KronigPenney(1, 1, v0, 0.5, 0.25), 8);
        var gap = bands.Gaps.MinBy(g => Math.Abs(g.LowerElectronVolts - eStar));
        Assert.True(gap.IsClosed, $"{gap} should be closed at {eStar:R} eV");
        Assert.Equal(eStar, gap.LowerElectronVolts, EdgeTolerance(eStar));
        Assert.Equal(eStar, gap.UpperElectronVolts, EdgeTolerance(eStar));
        Assert.Equal(ZonePoint.Boundary, gap.ZonePoint); // cos kd = cos(2π)cos(π) = −1
        output.WriteLine($"KP closed gap {gap.Index}: edges {gap.LowerElectronVolts:R}, {gap.UpperElectronVolts:R} vs derived {eStar:R} (relative {Math.Abs(gap.LowerElectronVolts - eStar) / eStar:E2}, {Math.Abs(gap.UpperElectronVolts - eStar) / eStar:E2})");

        // Every other gap of this cell is open (checked against the closed form at the gap middle: |cos kd| > 1).
        foreach (var other in bands.Gaps.Where(g => g.Index != gap.Index))
        {
            Assert.False(other.IsClosed, other.ToString());
            var middle = 0.5 * (other.LowerElectronVolts + other.UpperElectronVolts);
            Assert.True(Math.Abs(ClosedForms.KronigPenneyHalfTrace(1, 1, v0, 0.5, 0.25, middle)) > 1, other.ToString());
        }
    }

    [Fact]
    public void Compute_KronigPenneyNarrowGap_IsReportedOpenWithItsWidth()
    {
        // The closed-gap construction with equal masses (a = b = 1 nm, m = 1, l = 2, n = 1, V0 = 3π²C,
        // g = ½(ξ + 1/ξ) = 1.25 at E* = 4π²C), then V0 raised by 3e-7 relative: kb b = π moves off kw a = 2π and
        // a zone-boundary gap of about 1e-7 eV (7e-8 relative) opens between E_α (kw a = 2π) and E_β
        // (kb b = π) [derived from the quadratic form above: indefinite for g > 1].
        const double c = ClosedForms.C;
        var v0 = 3 * Math.PI * Math.PI * c * (1 + 3e-7);
        double F(double e) => ClosedForms.KronigPenneyHalfTrace(1, 1, v0, 1, 1, e);
        var eAlpha = 4 * Math.PI * Math.PI * c;
        var eBeta = v0 + Math.PI * Math.PI * c;
        var inside = Enumerable.Range(1, 63).Select(i => eAlpha + (eBeta - eAlpha) * i / 64).MinBy(e => F(e) + 1);
        Assert.True(F(inside) + 1 < 0, "the perturbation must open the gap");
        // Reference edges from det(M + I) = D + 2 in product form (ClosedForms.KronigPenneyDeterminant), which
        // keeps its digits near M = −I; the published trace form F + 1 loses them there (|dF/dE| ~ 1e-6 /eV at
        // these edges, so one ulp of F moves an edge by ~1e-10 eV): it only confirms the width to 1 %.
        var lower = ClosedForms.BrentRoot(e => ClosedForms.KronigPenneyDeterminant(1, 1, v0, 1, e, 1), eAlpha, inside);
        var upper = ClosedForms.BrentRoot(e => ClosedForms.KronigPenneyDeterminant(1, 1, v0, 1, e, 1), inside, eBeta);
        var lowerTrace = ClosedForms.BrentRoot(e => F(e) + 1, eAlpha, inside);
        var upperTrace = ClosedForms.BrentRoot(e => F(e) + 1, inside, eBeta);
        Assert.Equal(upper - lower, upperTrace - lowerTrace, 0.01 * (upper - lower));

        var bands = BandStructure.Compute(KronigPenney(1, 1, v0, 1, 1), 8);
        var gap = bands.Gaps.MinBy(g => Math.Abs(g.LowerElectronVolts - eAlpha));
        Assert.False(gap.IsClosed, $"{gap}: a gap of {upper - lower:E3} eV must not be reported closed");
        Assert.Equal(lower, gap.LowerElectronVolts, EdgeTolerance(lower));
        Assert.Equal(upper, gap.UpperElectronVolts, EdgeTolerance(upper));
        // Each edge to ~ε·E, so the 1e-7 eV width to better than 1e-6 relative.
        Assert.Equal(upper - lower, gap.WidthElectronVolts, 1e-6 * (upper - lower));
        // The reported error bounds must cover the true errors.
        var topError = bands.GetBand(gap.Index).TopErrorElectronVolts;
        var bottomError = bands.GetBand(gap.Index + 1).BottomErrorElectronVolts;
        Assert.True(Math.Abs(gap.LowerElectronVolts - lower) <= topError + 4 * DoubleEpsilon * lower);
        Assert.True(Math.Abs(gap.UpperElectronVolts - upper) <= bottomError + 4 * DoubleEpsilon * upper);
        output.WriteLine($"KP narrow gap ({upper - lower:E3} eV): edge errors {Math.Abs(gap.LowerElectronVolts / lower - 1):E2}, {Math.Abs(gap.UpperElectronVolts / upper - 1):E2} relative, width error {Math.Abs(gap.WidthElectronVolts / (upper - lower) - 1):E2}, reported bounds {topError:E2}, {bottomError:E2} eV");
    }
}
