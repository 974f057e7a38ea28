// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Materials;
using Periodic.Properties;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Conventions;

/// <summary>
/// Inputs at the edges of the model: exact band edges, energies at a layer potential (s = 0), zone
/// centre and boundary, κw ~ 700 barriers, 1e-6 nm layers, masses 1e-3 and 10 m0, the ends of the
/// temperature range, the non-parabolic energy floor, and values that overflow the unit types.
/// </summary>
public sealed class EdgeInputsTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private static void Finite(double value, string what) => Assert.True(double.IsFinite(value), $"{what} = {value}");

    [Fact]
    public void ExactBandEdges_GiveFiniteResultsAndTheDocumentedLimits()
    {
        var bands = Fixtures.Bands;
        var p = Fixtures.Properties;
        var d = bands.PeriodNanometres;
        foreach (var band in bands.Bands)
        {
            foreach (var (edge, isTop) in new[] { (band.BottomElectronVolts, false), (band.TopElectronVolts, true) })
            {
                var value = bands.Transfer.Dispersion(edge);
                Finite(value.Trace, "D at edge");
                // |D| = 2 at an edge (Bloch condition cos kd = ±1); 1e-9: the edge is converged to ~1e-15 eV and |dD/dE| < 1e6 /eV here.
                Assert.Equal(2, Math.Abs(value.Trace), 1e-9);
                var k = bands.WavevectorAt(edge);
                Finite(k.RealPerNanometre, "k at edge");
                Finite(k.ImaginaryPerNanometre, "Im k at edge");
                var dos = p.DensityOfStatesPerElectronVoltNanometre(edge);
                Assert.False(double.IsNaN(dos));
                Assert.True(dos >= 0); // +∞ allowed at an open edge (documented Van Hove divergence)
                // N(E) is 2(n−1)/d at the bottom of band n and 2n/d at its top (two spins × one state per
                // period per band; Ashcroft and Mermin ch. 8). Tolerance 1e-6 relative: N uses arccos(D/2),
                // whose slope diverges at |D| = 2 (an edge error of δ gives ~√δ).
                var expected = 2.0 * (isTop ? band.Index : band.Index - 1) / d;
                Assert.Equal(expected, p.IntegratedDensityOfStatesPerNanometre(edge), Math.Max(1e-6 * expected, 1e-9));
                try
                {
                    var v = p.GroupVelocityAtEnergy(edge);
                    Finite(v.MetresPerSecond, "v at edge");
                }
                catch (ArgumentOutOfRangeException ex)
                {
                    // Documented: an energy exactly at an edge may be counted as in the neighbouring gap.
                    Assert.Equal("energyElectronVolts", ex.ParamName);
                }
            }
        }
    }

    [Fact]
    public void EnergyAtLayerPotentials_MatchesKronigPenneyLimits()
    {
        // s = 0 in one layer: c = 1, S = w. Kronig–Penney (Proc. R. Soc. A 130, 499 (1931)) with
        // BenDaniel–Duke matching (Phys. Rev. 152, 683 (1966)), limits taken by hand [derived]:
        // at E = V0 (κ → 0): D/2 = cos(q a) − ½ (q mb b / mw) sin(q a), q = √(mw E / C);
        // at E = 0 (q → 0):  D/2 = cosh(κ b) + ½ (κ mw a / mb) sinh(κ b), κ = √(mb V0 / C).
        double a = 5, b = 2, v0 = 0.3, mw = 0.067, mb = 0.092;
        var transfer = Fixtures.Transfer;
        var q = Math.Sqrt(mw * v0 / C);
        var atTop = Math.Cos(q * a) - 0.5 * (q * mb * b / mw) * Math.Sin(q * a);
        var kappa = Math.Sqrt(mb * v0 / C);
        var atBottom = Math.Cosh(kappa * b) + 0.5 * (kappa * mw * a / mb) * Math.Sinh(kappa * b);
        // 1e-13 relative to the largest term: a handful of roundings in each form.
        Assert.Equal(atTop, transfer.Dispersion(v0).Trace / 2, 1e-13 * (1 + Math.Abs(q * mb * b / mw)));
        Assert.Equal(atBottom, transfer.Dispersion(0).Trace / 2, 1e-13 * Math.Cosh(kappa * b) * (1 + kappa * mw * a / mb));
        foreach (var e in new[] { 0.0, v0 })
        {
            var m = transfer.Evaluate(e);
            Finite(m.Matrix.M11 + m.Matrix.M12 + m.Matrix.M21 + m.Matrix.M22, "M at s = 0");
            Finite(m.EnergyDerivative.M11 + m.EnergyDerivative.M12 + m.EnergyDerivative.M21 + m.EnergyDerivative.M22, "dM/dE at s = 0");
            // det M = 1 (Wronskian; common practice, no single source); entries are O(10) here, so 1e-12.
            Assert.Equal(1, m.Matrix.Determinant, 1e-12);
            Finite(Fixtures.Transmission.Evaluate(Math.Max(e, 0.3) + 1e-3).LogTransmission, "ln T near s = 0");
        }
        // Transmission exactly at a stack layer's potential (the well at 0.5 eV is crossed at s = 0).
        var stack = LayerStack.Create(Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067)),
            Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067)),
            Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.5), EffectiveMass.FromElectronMasses(0.067)));
        var r = StackTransmission.Create(stack).Evaluate(0.5);
        Finite(r.LogTransmission, "ln T at s = 0");
        // Rectangular barrier at E = V0 (equal masses): T = 1/(1 + m w² V0/(4C)) (limit of the standard
        // result T⁻¹ = 1 + V0² sin²(kw)/(4E(E − V0)); Griffiths, Introduction to Quantum Mechanics, 2nd ed., Problem 2.33).
        // 1e-12: a few roundings.
        Assert.Equal(1 / (1 + 0.067 * 9 * 0.5 / (4 * C)), r.Transmission, 1e-12);
    }

    [Fact]
    public void ZoneCentreAndBoundary_GiveTheEdgesAndZeroVelocity()
    {
        var bands = Fixtures.Bands;
        var kMax = Math.PI / bands.PeriodNanometres;
        foreach (var band in bands.Bands)
        {
            double atCentre = band.BottomZonePoint == ZonePoint.Center ? band.BottomElectronVolts : band.TopElectronVolts;
            double atBoundary = band.BottomZonePoint == ZonePoint.Center ? band.TopElectronVolts : band.BottomElectronVolts;
            // E_n(0) and E_n(±π/d) are the band edges (Bloch's theorem: D = ±2 there); 1e-12 eV covers the
            // edge tolerance (BandSearchOptions default 1e-15 eV absolute, 1e-14 relative).
            Assert.Equal(atCentre, bands.EnergyAt(band.Index, 0), 1e-12);
            Assert.Equal(atBoundary, bands.EnergyAt(band.Index, kMax), 1e-12);
            Assert.Equal(atBoundary, bands.EnergyAt(band.Index, -kMax), 1e-12);
            foreach (var k in new[] { 0.0, kMax, -kMax })
            {
                // The gaps of this cell are all open: v = 0 exactly at a zone point (GroupVelocityAt docs).
                Assert.Equal(0.0, Fixtures.Properties.GroupVelocityAt(band.Index, k).MetresPerSecond);
                Assert.False(double.IsNaN(Fixtures.Properties.CurvatureMassElectronMasses(band.Index, k)));
            }
        }
    }

    [Fact]
    public void HugeBarrier_KappaW700_GivesTheExactLogTransmission()
    {
        // One barrier V0 = 1 eV, equal masses 0.067 m0, E = 0.5 eV, width with κw = 700.
        // Exact: T⁻¹ = 1 + V0² sinh²(κw)/(4E(V0 − E)) (Griffiths, Introduction to Quantum Mechanics,
        // 2nd ed., eq. 2.169 and Problem 2.33); for κw = 700, ln T = −2κw + ln 4 − ln(V0²/(4E(V0 − E))) up
        // to e^(−1400) (sinh² = e^(2κw)/4 (1 − e^(−2κw))²).
        double v0 = 1, m = 0.067, e = 0.5;
        var kappa = Math.Sqrt(m * (v0 - e) / C);
        var w = 700 / kappa;
        var lead = Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(m));
        var barrier = Layer.Create(Length.FromNanometres(w), Energy.FromElectronVolts(v0), EffectiveMass.FromElectronMasses(m));
        var result = StackTransmission.Create(LayerStack.Create(lead, lead, barrier)).Evaluate(e);
        var expected = -1400 + Math.Log(4) - Math.Log(v0 * v0 / (4 * e * (v0 - e)));
        // 1e-10 relative: κw is formed from w = 700/κ and κ again (two roundings of ~700) plus the log.
        Assert.Equal(expected, result.LogTransmission, 1e-10 * 1400);
        Assert.Equal(0.0, result.Transmission, 0); // below 1e-308? e^-1400 underflows: documented as 0
        Finite(result.TransmissionPhase, "phase");
        Assert.InRange(result.Reflection, 1 - 1e-15, 1 + 1e-15);
        // The same barrier in a cell: the transfer matrix stays finite in scaled form; the raw trace may be
        // +∞ only beyond the double range (documented), never NaN.
        var transfer = CellTransfer.Create(UnitCell.Create(Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(m)), barrier));
        var dv = transfer.Dispersion(e);
        Finite(dv.ScaledTrace, "scaled D");
        Finite(dv.LogAbsTrace, "ln |D|");
        Assert.Equal(700, dv.LogScale, 5); // the scale carries e^(κw); 5: the well adds O(1) and ln of the prefactors
        var traces = new double[1];
        transfer.Traces([e], traces);
        Assert.False(double.IsNaN(traces[0]));
        Finite(transfer.Dispersion(e).Wavevector.ImaginaryPerNanometre, "Im k");
        // Im k = arccosh(|D|/2)/d ≈ ln|D|/d for |D| ≫ 2 (Bloch condition); 1e-9 relative.
        Assert.Equal(dv.LogAbsTrace / transfer.PeriodNanometres, dv.Wavevector.ImaginaryPerNanometre, 1e-9 * dv.LogAbsTrace / transfer.PeriodNanometres);
    }

    [Fact]
    public void TinyLayer_1e6Nanometres_IsNearlyFree()
    {
        // A 1e-6 nm, 0.3 eV barrier is a delta of strength 3e-7 eV·nm: the bands are the folded free
        // parabola E = C k²/m (common practice, no single source) up to shifts of order P/d ~ 1e-7 eV.
        double m = 0.067, a = 5, w = 1e-6;
        var cell = UnitCell.Create(Layer.Create(Length.FromNanometres(a), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(m)),
            Layer.Create(Length.FromNanometres(w), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(m)));
        var bands = BandStructure.Compute(cell, 3);
        var d = a + w;
        for (var n = 1; n <= 3; n++)
        {
            var band = bands.GetBand(n);
            var free = C * Math.Pow(n * Math.PI / d, 2) / m; // top of band n at |k| = nπ/d in the extended zone
            Assert.Equal(free, band.TopElectronVolts, 1e-6); // 1e-6 eV: about ten times the delta shift P/d
            Finite(band.GapAboveElectronVolts, "gap");
            Assert.True(band.GapAboveElectronVolts < 1e-6, band.ToString()); // gap ≈ 2|V_G| = 2P/d = 1.2e-7 eV
        }
        var p = BandProperties.Create(bands);
        Finite(p.BottomMass(1).ElectronMasses, "mass");
        Assert.Equal(m, p.BottomMass(1).ElectronMasses, 1e-4); // free mass up to O(P/(C/(m d²))) ~ 1e-6 relative; 1e-4 slack
    }

    [Theory]
    [InlineData(1e-3)]
    [InlineData(10.0)]
    public void ExtremeMasses_GiveFiniteBandsMatchingKronigPenney(double mass)
    {
        double a = 5, b = 2, v0 = 0.3;
        var bands = BandStructure.Compute(UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0), EffectiveMass.FromElectronMasses(mass)), 4);
        var p = BandProperties.Create(bands);
        foreach (var band in bands.Bands)
        {
            foreach (var edge in new[] { band.BottomElectronVolts, band.TopElectronVolts })
            {
                Finite(edge, "edge");
                // |cos kd| = 1 at an edge from the published Kronig–Penney relation (TestHelpers/ClosedForms);
                // tolerance 1e-9 of its rounding scale plus the edge error times a slope bound.
                var half = ClosedForms.KronigPenneyHalfTrace(a, b, v0, mass, mass, edge, out var scale);
                Assert.Equal(1, Math.Abs(half), 1e-9 * Math.Max(1, scale));
            }
            Assert.False(double.IsNaN(p.BottomMass(band.Index).ElectronMasses));
            Assert.False(double.IsNaN(p.TopMass(band.Index).ElectronMasses));
            Finite(p.GroupVelocityAt(band.Index, 0.3 * Math.PI / (a + b)).MetresPerSecond, "v");
            Finite(p.IntegratedDensityOfStatesPerNanometre(band.CenterElectronVolts), "N");
        }
    }

    [Fact]
    public void Temperatures_AtTheEndsOfTheRange()
    {
        // Varshni: Eg(T) = Eg(0) − αT²/(T + β) (Y. P. Varshni, Physica 34, 149 (1967)) is exactly Eg(0) at 0 K;
        // GaAs Eg(0) = 1.519 eV (Vurgaftman, Meyer and Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), Table III).
        Assert.Equal(1.519, Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(Material.MinimumTemperatureKelvin)), 1e-12);
        foreach (var material in Material.Binaries)
        {
            foreach (var t in new[] { Material.MinimumTemperatureKelvin, Material.MaximumTemperatureKelvin })
            {
                var gap = material.BandGapElectronVolts(Temperature.FromKelvin(t));
                Assert.True(gap > 0 && double.IsFinite(gap), $"{material.Name} at {t} K: {gap}");
                Finite(material.KaneNonParabolicityPerElectronVolt(Temperature.FromKelvin(t)), "alpha");
                Finite(material.ConductionBandEdgeElectronVolts(Temperature.FromKelvin(t)), "Ec");
            }
            // Eg falls with T (α, β > 0 in the Varshni law).
            Assert.True(material.BandGapElectronVolts(Temperature.FromKelvin(1000)) < material.BandGapElectronVolts(Temperature.FromKelvin(0)), material.Name);
        }
        foreach (var t in new[] { 0.0, 1000.0 })
        {
            var built = StructureRecipe.Create(Temperature.FromKelvin(t)).Add(Material.GaAs, Length.FromNanometres(5)).Add(TernaryAlloy.AlGaAs.At(0.3), Length.FromNanometres(2)).WithNonParabolicity(true).Build();
            var bands = BandStructure.Compute(built.Cell, 2);
            Finite(bands.Bands[0].BottomElectronVolts, "E1");
            Finite(built.ToAbsoluteElectronVolts(bands.Bands[0].BottomElectronVolts), "absolute E1");
        }
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(4.0)]
    [InlineData(10.0)]
    [InlineData(100.0)]
    public void NonParabolicFloor_OneUlpAbove_IsFinite(double alpha)
    {
        // Every energy above LowestValidEnergyElectronVolts is valid, so the next double must give a
        // finite transfer matrix (α = 10 /eV once gave m(E) = 0 there, hence NaN).
        var layer = Layer.Create(Length.FromNanometres(5), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067), alpha);
        var transfer = CellTransfer.Create(UnitCell.Create(layer, Fixtures.Barrier));
        var e = Math.BitIncrement(transfer.LowestValidEnergyElectronVolts);
        var dv = transfer.Dispersion(e);
        Finite(dv.ScaledTrace, "scaled D");
        Finite(dv.ScaledTraceDerivativePerElectronVolt, "scaled dD/dE");
        Assert.True(transfer.CountBandEdgesBelow(e) >= 0);
        // The bound is V − 1/α up to a few ulps (m(E) = m(1 + α(E − V)) vanishes there).
        Assert.Equal(-1 / alpha, transfer.LowestValidEnergyElectronVolts, 1e-14);
        var stack = StackTransmission.Create(LayerStack.Create(Lead.Like(Fixtures.Barrier), Lead.Like(Fixtures.Barrier), layer));
        Assert.True(stack.LowestValidEnergyElectronVolts >= transfer.LowestValidEnergyElectronVolts);
        Assert.False(double.IsNaN(stack.Evaluate(Math.BitIncrement(stack.LowestValidEnergyElectronVolts)).LogTransmission));
    }

    [Fact]
    public void OverflowingUnits_AreRejectedWhereTheyEnterAStructure()
    {
        var huge = 1e300 * Length.FromNanometres(1e300); // Length arithmetic overflows to +∞
        Assert.Equal("width", Assert.Throws<ArgumentOutOfRangeException>(() => Layer.Create(huge, Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.1))).ParamName);
        var inf = Energy.FromElectronVolts(1e308) + Energy.FromElectronVolts(1e308);
        Assert.Equal("potential", Assert.Throws<ArgumentOutOfRangeException>(() => Layer.Create(Length.FromNanometres(1), inf, EffectiveMass.FromElectronMasses(0.1))).ParamName);
        Assert.Equal("width", Assert.Throws<ArgumentOutOfRangeException>(() => Fixtures.Well.WithWidth(huge)).ParamName);
        var ex = Assert.Throws<ArgumentOutOfRangeException>(() => Energy.FromJoules(1e300));
        Assert.Equal("joules", ex.ParamName);
        Assert.Contains("1E+300", ex.Message, StringComparison.Ordinal);
        Finite(Energy.FromJoules(1e-18).ElectronVolts, "1e-18 J");
    }

    [Fact]
    public void EnergiesFarOutside_StayFinite()
    {
        // Very high and very low (but finite) energies: results stay finite or ±∞ where documented, never NaN.
        foreach (var e in new[] { -1e6, -1e3, 1e3, 1e6 })
        {
            var dv = Fixtures.Transfer.Dispersion(e);
            Finite(dv.ScaledTrace, "scaled D");
            Assert.False(double.IsNaN(dv.Trace));
            Finite(Fixtures.Bands.WavevectorAt(e).RealPerNanometre, "Re k");
            Finite(Fixtures.Bands.WavevectorAt(e).ImaginaryPerNanometre, "Im k");
            Assert.True(Fixtures.Transfer.CountBandEdgesBelow(e) >= 0);
            Assert.False(double.IsNaN(Fixtures.Transmission.Evaluate(Math.Max(e, 0.31)).LogTransmission));
            Finite(Fixtures.Bound.GetWavefunction(0).ValueAt(e), "psi far out");
        }
        // A free-particle band count: at 1 keV the oscillation count is 2·floor(d√(mE/C)/π) ± 1 (edges below E
        // of the folded parabola; common practice). Bounds only: gaps shift edges by ≲ V0.
        var count = Fixtures.Transfer.CountBandEdgesBelow(1e3);
        var estimate = 2 * 7 * Math.Sqrt(0.067 * 1e3 / C) / Math.PI;
        Assert.InRange(count, estimate * 0.95, estimate * 1.05);
    }
}
