// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

public sealed partial class CellTransferTest
{
    [Fact]
    public void Dispersion_BarrierWithKappaW700_MatchesClosedFormInLogarithm()
    {
        // κb = 700 at E = 0 (the bound): D ≈ e^700 sits at the edge of the double range. The closed
        // form (Kronig–Penney) in logarithms: ln|2F| = κb + ln|cos(kw a)(1 + e^−2κb) + ½(ξ − 1/ξ) sin(kw a)(1 − e^−2κb)|.
        const double a = 3.0, v0 = 0.8, mw = 0.067, mb = 0.1;
        var kappa0 = Math.Sqrt(mb * v0 / ClosedForms.C);
        var b = 700 / kappa0;
        var transfer = CellTransfer.Create(UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0),
            EffectiveMass.FromElectronMasses(mw), EffectiveMass.FromElectronMasses(mb)));
        var worst = 0.0;
        for (var i = 1; i < 400; i++)
        {
            var e = v0 * i / 400.0;
            var kw = Math.Sqrt(mw * e / ClosedForms.C);
            var kappa = Math.Sqrt(mb * (v0 - e) / ClosedForms.C);
            var xi = (kappa / mb) / (kw / mw);
            var q = Math.Exp(-2 * kappa * b);
            var bracket = Math.Cos(kw * a) * (1 + q) + 0.5 * (xi - 1 / xi) * Math.Sin(kw * a) * (1 - q);
            var scale = Math.Abs(Math.Cos(kw * a)) + Math.Abs(0.5 * (xi - 1 / xi) * Math.Sin(kw * a));
            var expected = kappa * b + Math.Log(Math.Abs(bracket));
            var value = transfer.Dispersion(e);
            Assert.False(double.IsNaN(value.Trace) || double.IsNaN(value.TraceDerivativePerElectronVolt) || double.IsNaN(value.LogAbsTrace));
            Assert.True(double.IsFinite(value.LogAbsTrace) && double.IsFinite(value.ScaledTrace));
            // The phase κb = 700 carries a rounding of ~700 ε absolute into the logarithm; the bracket
            // loses relative accuracy ε·scale/|bracket| near its zeros (the well levels).
            var tolerance = 64 * DoubleEpsilon * (1 + kappa * b) + 64 * DoubleEpsilon * scale / Math.Abs(bracket);
            var error = Math.Abs(value.LogAbsTrace - expected);
            worst = Math.Max(worst, error);
            Assert.True(error <= tolerance, $"E = {e:R}: ln|D| = {value.LogAbsTrace:R}, closed form {expected:R}");
            Assert.Equal(Math.Sign(bracket), Math.Sign(value.ScaledTrace));
            var k = value.Wavevector;
            Assert.True(double.IsFinite(k.ImaginaryPerNanometre) && k.ImaginaryPerNanometre > 0);
        }
        output.WriteLine($"kappa*b = 700: worst absolute error of ln|D| vs closed form {worst:E2} over 399 energies");
    }

    [Fact]
    public void Dispersion_TenThousandLayers_IsChebyshevOfTheSmallCell()
    {
        // A cell made of N = 5000 repeats of a two-layer cell has M_big = M^N, and for unimodular M
        // ½Tr M^N = T_N(½Tr M), T_N the Chebyshev polynomial of the first kind [derived: Cayley–Hamilton,
        // M² = (Tr M) M − I, gives the Chebyshev recurrence; cf. Abelès 1950 / Yeh, Optical Waves in Layered
        // Media, ch. 6 for the U_N form].
        const int repeats = 5000;
        var well = Layer.Create(Length.FromNanometres(2.0), default, EffectiveMass.FromElectronMasses(0.067));
        var barrier = Layer.Create(Length.FromNanometres(1.0), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092));
        var small = CellTransfer.Create(UnitCell.Create(well, barrier));
        var big = CellTransfer.Create(UnitCell.Create(Enumerable.Range(0, 2 * repeats).Select(i => i % 2 == 0 ? (CellElement)well : barrier)));
        Assert.Equal(10_000, big.Cell.Elements.Count);
        var worstBand = 0.0;
        var worstGap = 0.0;
        for (var i = 0; i < 150; i++)
        {
            var e = 1.2 * (i + 0.5) / 150;
            var x = 0.5 * small.Dispersion(e).Trace;
            var value = big.Dispersion(e);
            Assert.True(double.IsFinite(value.LogScale) && !double.IsNaN(value.Trace) && double.IsFinite(value.ScaledTrace));
            if (Math.Abs(x) < 0.95)
            {
                // Inside a band: an error δx of the small trace is amplified by N/sin(kd) ≤ N/0.31, and the
                // big product accumulates N rounding steps: tolerance 64 ε N / √(1 − x²) absolute on T_N.
                var expected = ClosedForms.ChebyshevT(repeats, x);
                var error = Math.Abs(0.5 * value.Trace - expected);
                worstBand = Math.Max(worstBand, error);
                Assert.True(error <= 64 * DoubleEpsilon * repeats / Math.Sqrt(1 - x * x), $"E = {e:R}: ½D = {0.5 * value.Trace:R}, T_N = {expected:R}");
            }
            else if (Math.Abs(x) > 1.05)
            {
                // In a gap: ln|T_N| = N arcosh|x| + …; δ(ln) = N δx/√(x² − 1), same rounding argument.
                var expected = ClosedForms.LogAbsChebyshevTOutside(repeats, x);
                var error = Math.Abs(value.LogAbsTrace - Math.Log(2) - expected);
                worstGap = Math.Max(worstGap, error / expected);
                Assert.True(error <= 64 * DoubleEpsilon * repeats * (1 + Math.Abs(x)) / Math.Sqrt(x * x - 1), $"E = {e:R}: ln|½D| = {value.LogAbsTrace - Math.Log(2):R}, ln|T_N| = {expected:R}");
                Assert.Equal(x > 0 || repeats % 2 == 0 ? 1 : -1, Math.Sign(value.ScaledTrace));
            }
        }
        output.WriteLine($"10,000 layers vs Chebyshev T_N: worst absolute error of ½D in bands {worstBand:E2}, worst relative error of ln|D| in gaps {worstGap:E2}");
    }

    [Fact]
    public void CountBandEdgesBelow_TenThousandLayers_CountsTheFoldedBands()
    {
        // With cos(φ) = ½Tr M of the small cell and T_N(cos φ) = cos(Nφ): inside small band j, at phase
        // ψ ∈ (0, π) from its bottom, the big cell has passed 2N(j − 1) + 1 + 2⌊Nψ/π⌋ edges (every interior
        // zone point of the folded band is a closed gap: two coincident edges); in small gap j, 2Nj [derived].
        const int repeats = 5000;
        var well = Layer.Create(Length.FromNanometres(2.0), default, EffectiveMass.FromElectronMasses(0.067));
        var barrier = Layer.Create(Length.FromNanometres(1.0), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092));
        var small = CellTransfer.Create(UnitCell.Create(well, barrier));
        var big = CellTransfer.Create(UnitCell.Create(Enumerable.Range(0, 2 * repeats).Select(i => i % 2 == 0 ? (CellElement)well : barrier)));
        var checks = 0;
        for (var i = 0; i < 80; i++)
        {
            var e = 1.2 * (i + 0.5) / 80;
            var smallCount = small.CountBandEdgesBelow(e);
            var x = 0.5 * small.Dispersion(e).Trace;
            int expected;
            if (smallCount % 2 == 0)
            {
                expected = repeats * smallCount; // in small gap j = smallCount / 2
            }
            else
            {
                var j = (smallCount + 1) / 2;
                var phase = Math.Acos(Math.Clamp(x, -1, 1)); // k d of the small cell, 0 at D = 2
                var psi = j % 2 == 1 ? phase : Math.PI - phase; // odd bands start at k = 0
                var folded = repeats * psi / Math.PI;
                if (Math.Abs(folded - Math.Round(folded)) < 1e-3)
                {
                    continue; // within rounding of a folded zone point: either neighbouring count is right
                }
                expected = 2 * repeats * (j - 1) + 1 + 2 * (int)Math.Floor(folded);
            }
            Assert.True(expected == big.CountBandEdgesBelow(e), $"E = {e:R}: expected {expected}, counted {big.CountBandEdgesBelow(e)}");
            checks++;
        }
        Assert.True(checks > 60);
        output.WriteLine($"10,000 layers: oscillation count equals the folded-band count at {checks} energies");
    }
}
