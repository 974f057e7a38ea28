// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Bands;

/// <summary>The Chebyshev fast path for E(k), against the root search and against closed forms.</summary>
public sealed class BandDispersionTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    // The accuracy the fast path promises on dense k-grids (the benchmark target is 1e-12 eV).
    private const double Promised = 1e-12;

    private static UnitCell KronigPenney(double barrierNanometres = 2, double barrierElectronVolts = 0.3) =>
        UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(barrierNanometres),
            Energy.FromElectronVolts(barrierElectronVolts), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.088));

    private static double[] Zone(double period, int count)
    {
        var k = new double[count];
        for (var i = 0; i < count; i++)
        {
            k[i] = -Math.PI / period + 2 * Math.PI / period * i / (count - 1); // odd count: includes 0 and ±π/d
        }
        return k;
    }

    public static TheoryData<double, double> Cells => new()
    {
        { 2.0, 0.3 },   // open gaps: one short series per band
        { 0.3, 0.02 },  // thin weak barrier: nearly closed gaps, series split into pieces
    };

    [Theory]
    [MemberData(nameof(Cells))]
    public void EnergiesAt_FiveBands_AgreesWithRootSearch(double barrierNanometres, double barrierElectronVolts)
    {
        var bands = BandStructure.Compute(KronigPenney(barrierNanometres, barrierElectronVolts), 5);
        var k = Zone(bands.PeriodNanometres, 4001);
        var fast = new double[k.Length];
        var reference = new double[k.Length];
        for (var n = 1; n <= 5; n++)
        {
            var dispersion = BandDispersion.Create(bands, n);
            dispersion.EnergiesAt(k, fast);
            bands.EnergiesAt(n, k, reference);
            // The reference root search stops at 1e-14 relative (BandSearchOptions defaults), far below 1e-12 eV here.
            for (var i = 0; i < k.Length; i++)
            {
                Assert.True(Math.Abs(fast[i] - reference[i]) <= Promised, $"band {n}, k = {k[i]:R}: {fast[i]:R} vs {reference[i]:R}");
                // Scalar and batch differ only in the cos kd implementation (an ulp or so).
                Assert.True(Math.Abs(fast[i] - dispersion.EnergyAt(k[i])) <= Promised);
            }
            Assert.True(dispersion.ErrorEstimateElectronVolts <= dispersion.ToleranceElectronVolts);
        }
    }

    [Fact]
    public void EnergyAt_DiracComb_InvertsClosedForm()
    {
        // Dirac comb: cos kd = cos Kd + P sin(Kd)/(Kd), K = √(mE/C) (Kittel, Introduction to Solid State
        // Physics, ch. 7; Griffiths 2nd ed. eq. 5.65). P = 3π/2, d = 1 nm, m = m0.
        const double p = 3 * Math.PI / 2;
        var bands = BandStructure.Compute(UnitCell.DiracComb(Length.FromNanometres(1), p * 2 * C, EffectiveMass.FreeElectron), 4);
        for (var n = 1; n <= 4; n++)
        {
            var band = bands.GetBand(n);
            var dispersion = BandDispersion.Create(bands, n);
            for (var j = 1; j < 50; j++)
            {
                var e = band.BottomElectronVolts + band.WidthElectronVolts * j / 50.0;
                var kd = Math.Sqrt(e / C);
                var cosine = Math.Cos(kd) + p * Math.Sin(kd) / kd;
                var k = Math.Acos(Math.Clamp(cosine, -1, 1)); // d = 1 nm
                // Tolerance: E(k) has slope dE/dk ≤ 2C·kd·(band n) ~ 1 eV nm here, and the closed-form
                // cos kd carries ~1e-16 rounding, so the inverted energy is good to ~1e-13 eV; 1e-12 is the promise.
                Assert.Equal(e, dispersion.EnergyAt(k), Promised);
            }
        }
    }

    [Fact]
    public void EnergyAt_FreeParticleLimit_FoldedParabola()
    {
        // V → 0: E = C (k + 2πj/d)²/m folded into the first zone, gaps closed (common practice, no single
        // source; e.g. Ashcroft & Mermin ch. 9, "empty lattice"). Closed gaps put a square-root singularity
        // of E(cos kd) on the zone edge, which exercises the piece splitting and the root-search fallback.
        const double m = 0.067, d = 6.0;
        var cell = UnitCell.Create(Layer.Create(Length.FromNanometres(4), default, EffectiveMass.FromElectronMasses(m)),
            Layer.Create(Length.FromNanometres(2), default, EffectiveMass.FromElectronMasses(m)));
        var bands = BandStructure.Compute(cell, 2);
        var band1 = BandDispersion.Create(bands, 1);
        var band2 = BandDispersion.Create(bands, 2);
        foreach (var k in Zone(d, 1001))
        {
            var q = Math.Abs(k);
            // Band 1: |k|; band 2: 2π/d − |k|.
            var e1 = C * q * q / m;
            var e2 = C * (2 * Math.PI / d - q) * (2 * Math.PI / d - q) / m;
            // Tolerance: the promise, 1e-12 eV (energies ≤ 0.17 eV here, so double rounding is ~1e-17).
            Assert.Equal(e1, band1.EnergyAt(k), Promised);
            Assert.Equal(e2, band2.EnergyAt(k), Promised);
        }
        Assert.True(band1.PieceCount > 1 || band1.RootSearchFraction > 0);
    }

    [Fact]
    public void Create_LooseSearchOptions_ToleranceFollowsTheRootSearch()
    {
        // Nodes from a root search stopped at 1e-8 relative cannot support a 1e-13 eV series; the tolerance
        // is raised to 4 × that search tolerance instead of splitting without end.
        var options = BandSearchOptions.Create(relativeTolerance: 1e-8);
        var bands = BandStructure.Compute(KronigPenney(), 3, options);
        var k = Zone(bands.PeriodNanometres, 501);
        var fast = new double[k.Length];
        var reference = new double[k.Length];
        for (var n = 1; n <= 3; n++)
        {
            var dispersion = BandDispersion.Create(bands, n);
            var magnitude = Math.Max(Math.Abs(dispersion.Band.BottomElectronVolts), Math.Abs(dispersion.Band.TopElectronVolts));
            Assert.True(dispersion.ToleranceElectronVolts >= 4e-8 * magnitude);
            Assert.True(dispersion.PieceCount <= BandDispersion.MaxPieces);
            dispersion.EnergiesAt(k, fast);
            bands.EnergiesAt(n, k, reference);
            // Both sides carry the search error (≤ the tolerance); interpolating nodes with such errors adds at
            // most the Lebesgue constant of degree ≤ 64 Chebyshev points (< 4; Trefethen, ATAP ch. 15) times it.
            for (var i = 0; i < k.Length; i++)
            {
                Assert.True(Math.Abs(fast[i] - reference[i]) <= 6 * dispersion.ToleranceElectronVolts, $"band {n}, k = {k[i]:R}");
            }
        }
    }

    [Fact]
    public void EnergiesAt_InPlace_EqualsSeparateDestination()
    {
        var bands = BandStructure.Compute(KronigPenney(), 2);
        var dispersion = BandDispersion.Create(bands, 2);
        var k = Zone(bands.PeriodNanometres, 257);
        var separate = new double[k.Length];
        dispersion.EnergiesAt(k, separate);
        dispersion.EnergiesAt(k, k);
        Assert.Equal(separate, k);
    }

    [Fact]
    public void EnergiesAt_OutsideZone_ThrowsBeforeWritingAnything()
    {
        var bands = BandStructure.Compute(KronigPenney(), 1);
        var dispersion = BandDispersion.Create(bands, 1);
        var destination = new double[3];
        var outside = 1.01 * Math.PI / bands.PeriodNanometres;
        var exception = Assert.Throws<ArgumentOutOfRangeException>(() => dispersion.EnergiesAt([0.1, outside, 0.2], destination));
        Assert.Equal("wavevectorsPerNanometre", exception.ParamName);
        Assert.Contains("wavevectorsPerNanometre[1]", exception.Message);
        Assert.All(destination, value => Assert.Equal(0, value));
        Assert.Equal("wavevectorPerNanometre", Assert.Throws<ArgumentOutOfRangeException>(() => dispersion.EnergyAt(double.NaN)).ParamName);
        Assert.Equal("destinationElectronVolts", Assert.Throws<ArgumentException>(() => dispersion.EnergiesAt([0.1, 0.2], new double[1])).ParamName);
    }

    [Theory]
    [MemberData(nameof(Cells))]
    public void EnergiesAtBlochCosines_SolveTheDispersionRelation(double barrierNanometres, double barrierElectronVolts)
    {
        // Bloch's theorem for a cell of transfer matrix M: Tr M(E) = 2 cos kd (Kronig and Penney 1931; Ashcroft and Mermin
        // ch. 8, Problem 1). E_n at a Bloch cosine x must make D(E)/2 = x: |D/2 − x| ≤ |D′/2|·(the inversion's error
        // estimate) + 1e-13 for the rounding of D. The same energies as EnergiesAt within that estimate (the vector cosine
        // of EnergiesAt may differ from Math.Cos by an ulp).
        var bands = BandStructure.Compute(KronigPenney(barrierNanometres, barrierElectronVolts), 3);
        var transfer = CellTransfer.Create(bands.Cell);
        var k = Zone(bands.PeriodNanometres, 401);
        var cosines = k.Select(x => Math.Cos(x * bands.PeriodNanometres)).ToArray();
        for (var n = 1; n <= 3; n++)
        {
            var dispersion = bands.DispersionOf(n);
            var fromCosines = new double[k.Length];
            var fromWavevectors = new double[k.Length];
            dispersion.EnergiesAtBlochCosines(cosines, fromCosines);
            dispersion.EnergiesAt(k, fromWavevectors);
            for (var i = 0; i < k.Length; i++)
            {
                var value = transfer.Dispersion(fromCosines[i]);
                Assert.True(Math.Abs(value.Trace / 2 - cosines[i]) <= Math.Abs(value.TraceDerivativePerElectronVolt / 2) * dispersion.ErrorEstimateElectronVolts + 1e-13,
                    $"band {n}, x = {cosines[i]}: D/2 = {value.Trace / 2}");
                Assert.Equal(fromWavevectors[i], fromCosines[i], dispersion.ErrorEstimateElectronVolts);
            }
        }
    }

    [Fact]
    public void EnergiesAtBlochCosines_OutsideUnitInterval_ThrowsBeforeWritingAnything()
    {
        var dispersion = BandStructure.Compute(KronigPenney(), 1).DispersionOf(1);
        var destination = new double[3];
        var exception = Assert.Throws<ArgumentOutOfRangeException>(() => dispersion.EnergiesAtBlochCosines([0.5, 1.0000001, -0.5], destination));
        Assert.Equal("blochCosines", exception.ParamName);
        Assert.Contains("blochCosines[1]", exception.Message);
        Assert.All(destination, value => Assert.Equal(0, value));
        Assert.Throws<ArgumentOutOfRangeException>(() => dispersion.EnergiesAtBlochCosines([double.NaN], destination));
        Assert.Equal("destinationElectronVolts", Assert.Throws<ArgumentException>(() => dispersion.EnergiesAtBlochCosines([0.1, 0.2], new double[1])).ParamName);
    }

    [Fact]
    public void Create_BadArguments_NameTheParameter()
    {
        var bands = BandStructure.Compute(KronigPenney(), 2);
        Assert.Equal("bandIndex", Assert.Throws<ArgumentOutOfRangeException>(() => BandDispersion.Create(bands, 3)).ParamName);
        Assert.Equal("absoluteToleranceElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => BandDispersion.Create(bands, 1, BandDispersionOptions.Create(0))).ParamName);
        Assert.Equal("bands", Assert.Throws<ArgumentNullException>(() => BandDispersion.Create(null!, 1)).ParamName);
    }

    [Fact]
    public void ToString_IsReadable()
    {
        var text = BandDispersion.Create(BandStructure.Compute(KronigPenney(), 1), 1).ToString();
        Assert.StartsWith("BandDispersion band 1:", text);
        Assert.Contains("error estimate", text);
    }
}
