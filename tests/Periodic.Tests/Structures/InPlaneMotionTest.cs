// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Structures;

public sealed class InPlaneMotionTest(ITestOutputHelper output)
{
    // ħ²/2m₀ in eV nm² from the CODATA 2018 constants (h and e exact, m_e to 3e-10), ħ = h/2π.
    private const double Hbar = 6.62607015e-34 / (2 * Math.PI);
    private const double C = Hbar * Hbar / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18;

    // A GaAs/AlGaAs-like two-layer cell with unequal masses (scenario of our own).
    private const double WellWidth = 5, BarrierWidth = 3, BarrierHeight = 0.3, WellMass = 0.067, BarrierMass = 0.092;

    private static UnitCell TwoLayer(double alphaWell = 0, double alphaBarrier = 0) => UnitCell.Create(
        Layer.Create(Length.FromNanometres(WellWidth), default, EffectiveMass.FromElectronMasses(WellMass), alphaWell),
        Layer.Create(Length.FromNanometres(BarrierWidth), Energy.FromElectronVolts(BarrierHeight), EffectiveMass.FromElectronMasses(BarrierMass), alphaBarrier));

    /// <summary>
    /// The Kronig–Penney dispersion function D(E) = 2cos(kd) with BenDaniel–Duke matching, written independently of the
    /// library (Kronig and Penney, Proc. R. Soc. A 130, 499 (1931); BenDaniel and Duke, Phys. Rev. 152, 683 (1966)):
    /// D = 2c_w c_b − S_w S_b (q_w² m_b/m_w + q_b² m_w/m_b), c = cos(q w), S = sin(q w)/q (hyperbolic for q² &lt; 0), with
    /// q² = 2m(E)(E − V)/ħ² − k∥² in each layer: the in-plane kinetic energy ħ²k∥²/2m(E) moved to the potential (Bastard,
    /// Wave Mechanics Applied to Semiconductor Heterostructures, ch. 3, from memory), m(E) = m(1 + α(E − V)).
    /// </summary>
    private static double Dispersion(double e, double kPar, double alphaWell = 0, double alphaBarrier = 0)
    {
        var mw = WellMass * (1 + alphaWell * e);
        var mb = BarrierMass * (1 + alphaBarrier * (e - BarrierHeight));
        var qw2 = mw * e / C - kPar * kPar;
        var qb2 = mb * (e - BarrierHeight) / C - kPar * kPar;
        var (cw, sw) = CosSinc(qw2, WellWidth);
        var (cb, sb) = CosSinc(qb2, BarrierWidth);
        return 2 * cw * cb - sw * sb * (qw2 * mb / mw + qb2 * mw / mb);
    }

    private static (double C, double S) CosSinc(double q2, double w)
    {
        if (q2 > 0)
        {
            var q = Math.Sqrt(q2);
            return (Math.Cos(q * w), Math.Sin(q * w) / q);
        }
        if (q2 < 0)
        {
            var q = Math.Sqrt(-q2);
            return (Math.Cosh(q * w), Math.Sinh(q * w) / q);
        }
        return (1, w);
    }

    /// <summary>Roots of D(E) = ±2 by a scan and bisection to the last bit: the edges bottom₁, top₁, bottom₂, top₂.</summary>
    private static double[] Edges(double kPar, double alphaWell = 0, double alphaBarrier = 0)
    {
        var edges = new List<double>();
        double step = 1e-4, e = -0.05;
        var target = 2.0; // band 1 bottom at D = +2, then alternately −2, −2, +2, …
        var previous = Dispersion(e, kPar, alphaWell, alphaBarrier);
        while (edges.Count < 4)
        {
            var next = e + step;
            var value = Dispersion(next, kPar, alphaWell, alphaBarrier);
            foreach (var level in new[] { 2.0, -2.0 })
            {
                if ((previous - level) * (value - level) <= 0 && edges.Count < 4 && level == ExpectedLevel(edges.Count))
                {
                    double lo = e, hi = next;
                    while (true)
                    {
                        var mid = 0.5 * (lo + hi);
                        if (mid <= lo || mid >= hi)
                        {
                            break;
                        }
                        if ((Dispersion(lo, kPar, alphaWell, alphaBarrier) - level) * (Dispersion(mid, kPar, alphaWell, alphaBarrier) - level) <= 0)
                        {
                            hi = mid;
                        }
                        else
                        {
                            lo = mid;
                        }
                    }
                    edges.Add(0.5 * (lo + hi));
                }
            }
            previous = value;
            e = next;
        }
        _ = target;
        return [.. edges];
    }

    private static double ExpectedLevel(int edgeIndex) => edgeIndex switch { 0 => 2.0, 1 => -2.0, 2 => -2.0, _ => 2.0 };

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.6)]
    public void CellAt_UnequalMasses_MatchesKronigPenneyClosedForm(double kPar)
    {
        var bands = BandStructure.Compute(InPlaneMotion.CellAt(TwoLayer(), kPar), 2);
        var expected = Edges(kPar);
        var actual = new[] { bands.GetBand(1).BottomElectronVolts, bands.GetBand(1).TopElectronVolts, bands.GetBand(2).BottomElectronVolts, bands.GetBand(2).TopElectronVolts };
        var worst = 0.0;
        for (var i = 0; i < 4; i++)
        {
            worst = Math.Max(worst, Math.Abs(actual[i] - expected[i]) / Math.Abs(expected[i]));
        }
        output.WriteLine($"k∥ = {kPar}: edges {string.Join(", ", actual)}; worst relative difference {worst:E2}");
        // 1e-10 relative: the acceptance bound; both sides resolve simple roots of D ∓ 2 to ~1e-15.
        Assert.True(worst < 1e-10, $"worst relative difference {worst:E3}");
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.6)]
    public void EdgesAt_NonParabolic_MatchesClosedFormWithEnergyDependentMasses(double kPar)
    {
        // α = 0.6 /eV in the well and 0.4 /eV in the barrier (Kane-like values for GaAs/AlGaAs, scenario of our own).
        var edges = InPlaneDispersion.EdgesAt(TwoLayer(0.6, 0.4), 2, kPar);
        var expected = Edges(kPar, 0.6, 0.4);
        var actual = new[] { edges[0].BottomElectronVolts, edges[0].TopElectronVolts, edges[1].BottomElectronVolts, edges[1].TopElectronVolts };
        var worst = 0.0;
        for (var i = 0; i < 4; i++)
        {
            worst = Math.Max(worst, Math.Abs(actual[i] - expected[i]) / Math.Abs(expected[i]));
        }
        output.WriteLine($"non-parabolic, k∥ = {kPar}: worst relative difference {worst:E2}, iterations {edges[0].FixedPointIterations + edges[1].FixedPointIterations}");
        // 1e-10 relative, as for parabolic layers: the fixed point is iterated to the band search's accuracy.
        Assert.True(worst < 1e-10, $"worst relative difference {worst:E3}");
    }

    [Fact]
    public void CellAt_ZeroWavevector_ReproducesBandsBitwise()
    {
        // k∥ = 0 adds ħ²·0/2m = 0 to every potential: the bands must be the same doubles (common practice, no single source).
        var cell = TwoLayer();
        var flat = BandStructure.Compute(cell, 4);
        var shifted = BandStructure.Compute(InPlaneMotion.CellAt(cell, 0), 4);
        for (var n = 1; n <= 4; n++)
        {
            Assert.Equal(flat.GetBand(n).BottomElectronVolts, shifted.GetBand(n).BottomElectronVolts);
            Assert.Equal(flat.GetBand(n).TopElectronVolts, shifted.GetBand(n).TopElectronVolts);
            Assert.Equal(flat.EnergyAt(n, 0.1), shifted.EnergyAt(n, 0.1));
        }
    }

    [Theory]
    [InlineData(0.2)]
    [InlineData(0.7)]
    public void CellAt_EqualMasses_ShiftsRigidly(double kPar)
    {
        // One mass everywhere: the in-plane motion separates, E(k_z, k∥) = E(k_z) + ħ²k∥²/2m exactly (any text on
        // separable Hamiltonians; common practice, no single source).
        var cell = UnitCell.KronigPenney(Length.FromNanometres(4), Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067));
        var flat = BandStructure.Compute(cell, 3);
        var shifted = BandStructure.Compute(InPlaneMotion.CellAt(cell, kPar), 3);
        var shift = C * kPar * kPar / 0.067;
        var worst = 0.0;
        for (var n = 1; n <= 3; n++)
        {
            worst = Math.Max(worst, Math.Abs(shifted.GetBand(n).BottomElectronVolts - flat.GetBand(n).BottomElectronVolts - shift));
            worst = Math.Max(worst, Math.Abs(shifted.GetBand(n).TopElectronVolts - flat.GetBand(n).TopElectronVolts - shift));
        }
        output.WriteLine($"k∥ = {kPar}: shift {shift} eV, worst deviation {worst:E2} eV");
        // 1e-12 eV: the band search's edge accuracy (~1e-14 relative of energies below 1 eV) plus the rounding of the shift.
        Assert.True(worst < 1e-12, $"worst deviation {worst:E3} eV");
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(-0.1)]
    [InlineData(11.0)]
    public void CellAt_BadWavevector_ThrowsNamingIt(double kPar)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => InPlaneMotion.CellAt(TwoLayer(), kPar));
        Assert.Equal("inPlaneWavevectorPerNanometre", e.ParamName);
    }

    [Fact]
    public void CellAt_NonParabolicWithoutReference_ThrowsNamingCell()
    {
        var e = Assert.Throws<ArgumentException>(() => InPlaneMotion.CellAt(TwoLayer(0.5), 0.3));
        Assert.Equal("cell", e.ParamName);
        Assert.Contains("non-parabolic", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void CellAt_FunctionSegment_ThrowsNamingElement()
    {
        var cell = UnitCell.Create(FunctionSegment.Create(Length.FromNanometres(5), x => 0.1 * x, EffectiveMass.FromElectronMasses(0.067)));
        var e = Assert.Throws<ArgumentException>(() => InPlaneMotion.CellAt(cell, 0.3));
        Assert.Contains("element 0", e.Message, StringComparison.Ordinal);
    }
}
