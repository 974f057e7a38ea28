// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.RootFinding;
using Periodic.Bands;
using Periodic.Materials;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Materials;

public sealed class BuiltStructureTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    [Fact]
    public void Build_AcceptanceRecipe_MinibandEdgesSatisfyKronigPenney()
    {
        // "5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K" → a cell whose miniband edges the engine computes.
        var built = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K").Build();
        Assert.Empty(built.Warnings);
        var well = built.Layers[0];
        var barrier = built.Layers[1];
        // Potentials: reference = lowest Ec (GaAs) = 0; barrier = Ec(AlGaAs) − Ec(GaAs) with the
        // Varshni gaps (Vurgaftman et al. 2001, from memory), derived here independently; 1e-12 eV.
        var alloy = TernaryAlloy.AlGaAs.At(0.3);
        var expectedBarrier = alloy.ValenceBandOffset.ElectronVolts + alloy.BandGapElectronVolts(Temperature.FromKelvin(77)) - (-0.80 + 1.519 - 0.5405e-3 * 77 * 77 / (77 + 204));
        Assert.Equal(0, well.PotentialElectronVolts);
        Assert.Equal(expectedBarrier, barrier.PotentialElectronVolts, 1e-12);
        Assert.Equal(-0.80 + 1.519 - 0.5405e-3 * 77 * 77 / (77 + 204), built.ReferenceElectronVolts, 1e-12);
        Assert.Equal(0.067, well.MassElectronMasses);
        Assert.Equal(0.7 * 0.067 + 0.3 * 0.15, barrier.MassElectronMasses, 1e-15);

        var bands = BandStructure.Compute(built.Cell, 3);
        Assert.True(bands.GetBand(1).BottomElectronVolts > 0 && bands.GetBand(1).TopElectronVolts < barrier.PotentialElectronVolts);
        foreach (var band in bands.Bands)
        {
            foreach (var edge in new[] { band.BottomElectronVolts, band.TopElectronVolts })
            {
                // Kronig–Penney with BenDaniel–Duke matching (Kronig & Penney 1931; BenDaniel & Duke 1966):
                // |cos kd| = 1 at every band edge. Tolerance 1e-9: edges are found to ~1e-14 relative and
                // |d(cos kd)/dE| is below ~1e3 /eV here, so the residual is < 1e-10.
                Assert.Equal(1.0, Math.Abs(KronigPenneyCos(edge, 5, well.MassElectronMasses, 2, barrier.PotentialElectronVolts, barrier.MassElectronMasses)), 1e-9);
            }
        }
        Assert.Empty(built.CheckEnergies(Edges(BandStructure.Compute(built.Cell, 1))));
    }

    [Fact]
    public void Build_Parabolic_EqualsEngineExactly()
    {
        // With non-parabolicity off the builder only chooses numbers; the engine result must be identical
        // (bitwise) to building the same layers by hand.
        var built = StructureRecipe.Parse("4 nm GaAs / 3 nm Al0.25Ga0.75As / 2 nm GaAs / 3 nm Al0.25Ga0.75As at 300 K").Build();
        var widths = built.Layers.Select(l => l.WidthNanometres).ToArray();
        var potentials = built.Layers.Select(l => l.PotentialElectronVolts).ToArray();
        var masses = built.Layers.Select(l => l.MassElectronMasses).ToArray();
        Assert.All(built.Layers, l => Assert.Equal(0, l.NonParabolicityPerElectronVolt));
        var a = BandStructure.Compute(built.Cell, 4);
        var b = BandStructure.Compute(UnitCell.FromLayers(widths, potentials, masses), 4);
        for (var n = 1; n <= 4; n++)
        {
            Assert.Equal(b.GetBand(n).BottomElectronVolts, a.GetBand(n).BottomElectronVolts);
            Assert.Equal(b.GetBand(n).TopElectronVolts, a.GetBand(n).TopElectronVolts);
        }
    }

    [Fact]
    public void Build_SingleWell_MatchesFiniteWellEquation()
    {
        // A 10 nm GaAs well between 40 nm Al0.3Ga0.7As barriers: tunnelling between wells ~e^(−2κb) ≈ e^−55,
        // so band 1 is the single-well level. Even-state condition of the finite well with BenDaniel–Duke
        // matching (Griffiths §2.6 with ψ'/m continuous): (k/m_w) sin(kL/2) = (κ/m_b) cos(kL/2).
        var built = StructureRecipe.Parse("10 nm GaAs / 40 nm Al0.3Ga0.7As at 4 K").Build();
        var v = built.Layers[1].PotentialElectronVolts;
        double mw = built.Layers[0].MassElectronMasses, mb = built.Layers[1].MassElectronMasses;
        var level = Brent.FindRoot(e => EvenWellCondition(e, 10, v, _ => mw, _ => mb), 1e-6, FirstQuarterWave(10, mw, v), 1e-14, 200);
        var band = BandStructure.Compute(built.Cell, 1).GetBand(1);
        // Tolerance 1e-10 eV: root accuracy 1e-14 and a band width ~1e-24 eV.
        Assert.Equal(level, band.BottomElectronVolts, 1e-10);
        Assert.Equal(level, band.TopElectronVolts, 1e-10);
    }

    [Fact]
    public void Build_KaneInWellOnly_LowersGroundLevel()
    {
        // Two-band Kane mass m(E) = m_edge(1 + (E − Ec)/Eg) (E. O. Kane 1957) in the well: heavier at higher
        // energy, so the ground level moves down. Isolated here by keeping the barrier parabolic; the level
        // must also solve the finite-well condition with m_w(E) (BenDaniel–Duke matching, Griffiths §2.6).
        var recipe = StructureRecipe.Parse("10 nm GaAs / 40 nm Al0.3Ga0.7As at 4 K");
        var parabolic = BandStructure.Compute(recipe.Build().Cell, 1).GetBand(1).BottomElectronVolts;
        var built = recipe.WithNonParabolicity(true).Build();
        var w = built.Layers[0];
        var b = built.Layers[1];
        var cell = UnitCell.Create(w.Layer, b.Layer.WithNonParabolicity(0));
        var level = BandStructure.Compute(cell, 1).GetBand(1).BottomElectronVolts;
        Assert.True(level < parabolic, $"Kane in the well {level} should lie below parabolic {parabolic}");
        double MassW(double e) => w.MassElectronMasses * (1 + e / w.BandGapElectronVolts);
        var expected = FirstRoot(e => EvenWellCondition(e, 10, b.PotentialElectronVolts, MassW, _ => b.MassElectronMasses), b.PotentialElectronVolts);
        Assert.Equal(expected, level, 1e-10); // tolerance as in the parabolic single-well test
    }

    [Fact]
    public void Build_Kane_SolvesTwoBandWellEquation()
    {
        // With the Kane mass in every layer the evanescent barrier mass also changes, m_b(E) = m_b(1 − (V − E)/Eg_b),
        // about 12 % lighter at the ground level here; through the 1/m in the BenDaniel–Duke condition this
        // pushes the ground level up by more than the heavier well mass pulls it down (a property of the
        // model, derived below), while the higher-lying odd level moves down. Both levels must solve the
        // finite-well conditions with m_w(E), m_b(E) (Griffiths §2.6 with ψ'/m continuous).
        var recipe = StructureRecipe.Parse("10 nm GaAs / 40 nm Al0.3Ga0.7As at 4 K");
        var parabolic = BandStructure.Compute(recipe.Build().Cell, 2);
        var built = recipe.WithNonParabolicity(true).Build();
        var kane = BandStructure.Compute(built.Cell, 2);
        var w = built.Layers[0];
        var b = built.Layers[1];
        Assert.Equal(1 / w.BandGapElectronVolts, w.NonParabolicityPerElectronVolt, 1e-15);
        double MassW(double e) => w.MassElectronMasses * (1 + e / w.BandGapElectronVolts);
        double MassB(double e) => b.MassElectronMasses * (1 + (e - b.PotentialElectronVolts) / b.BandGapElectronVolts);
        var even = FirstRoot(e => EvenWellCondition(e, 10, b.PotentialElectronVolts, MassW, MassB), b.PotentialElectronVolts);
        var odd = FirstRoot(e => OddWellCondition(e, 10, b.PotentialElectronVolts, MassW, MassB), b.PotentialElectronVolts);
        // Tolerance 1e-10 eV: root accuracy 1e-14 and miniband widths ~1e-20 eV through 40 nm barriers.
        Assert.Equal(even, kane.GetBand(1).BottomElectronVolts, 1e-10);
        Assert.Equal(odd, kane.GetBand(2).BottomElectronVolts, 1e-10);
        Assert.True(kane.GetBand(2).BottomElectronVolts < parabolic.GetBand(2).BottomElectronVolts);
    }

    [Fact]
    public void Kane_TraceDerivative_MatchesFiniteDifferences()
    {
        // The energy derivative dD/dE of the cell with m(E) = m(1 + α(E − V)) against a Richardson-extrapolated
        // central difference (error O(h⁴) ≈ 1e-12 relative for h = 1e-3 eV on D varying on a ~0.1 eV scale).
        // Tolerance 1e-7 relative to max(|D'|, 1): leaving out the dm/dE terms would change D' by ~α(E − V) ≈ 10 %.
        var built = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As / 3 nm In0.1Ga0.9As at 77 K").WithNonParabolicity(true)
            .WithLimits(ModelLimits.Default.WithMaximumLatticeMismatch(0.01)).Build();
        var transfer = CellTransfer.Create(built.Cell);
        double Trace(double e) => transfer.Dispersion(e).Trace;
        double Central(double e, double h) => (Trace(e + h) - Trace(e - h)) / (2 * h);
        foreach (var e in new[] { 0.01, 0.08, 0.2, 0.27, 0.45, 0.9 })
        {
            const double h = 1e-3;
            var fd = (4 * Central(e, h / 2) - Central(e, h)) / 3;
            var exact = transfer.Dispersion(e).TraceDerivativePerElectronVolt;
            Assert.True(Math.Abs(fd - exact) <= 1e-7 * Math.Max(1, Math.Abs(exact)), $"E = {e}: exact {exact}, finite difference {fd}");
        }
    }

    [Fact]
    public void Build_ThinIndirectAndMismatchedLayers_Warn()
    {
        // 0.5 nm GaAs = 1.77 ML (a/2 = 0.2827 nm); AlAs is indirect; GaAs/AlAs mismatch 0.14 % is inside the 0.2 % limit.
        var built = StructureRecipe.Parse("0.5 nm GaAs / 5 nm AlAs at 300 K").Build();
        var thin = Assert.Single(built.Warnings, w => w.Kind == ModelWarningKind.ThinLayer);
        Assert.Equal(0, thin.LayerIndex);
        Assert.Equal(0.5 / (0.565325 / 2), thin.Value, 1e-12);
        var indirect = Assert.Single(built.Warnings, w => w.Kind == ModelWarningKind.IndirectGap);
        Assert.Equal(1, indirect.LayerIndex);
        Assert.DoesNotContain(built.Warnings, w => w.Kind == ModelWarningKind.LatticeMismatch);
        Assert.Equal((5.6611 - 5.65325) / 5.65325, built.Layers[1].LatticeMismatch, 1e-12);

        // In0.2Ga0.8As on GaAs: Vegard mismatch 0.2·(6.0583 − 5.65325)/5.65325 ≈ 1.4 % (table lattice constants, from memory).
        var strained = StructureRecipe.Parse("8 nm In0.2Ga0.8As / 20 nm GaAs at 300 K").WithSubstrate(Material.GaAs).Build();
        var mismatch = Assert.Single(strained.Warnings);
        Assert.Equal(ModelWarningKind.LatticeMismatch, mismatch.Kind);
        Assert.Equal(0, mismatch.LayerIndex);
        Assert.Equal(0.2 * (6.0583 - 5.65325) / 5.65325, mismatch.Value, 1e-12);
        Assert.Contains("strain", mismatch.Message, StringComparison.Ordinal);
        Assert.Empty(StructureRecipe.Parse("8 nm In0.2Ga0.8As / 20 nm GaAs at 300 K").WithSubstrate(Material.GaAs)
            .WithLimits(ModelLimits.Default.WithMaximumLatticeMismatch(0.02)).Build().Warnings);
    }

    [Fact]
    public void Build_InAsGaSb_WarnsBrokenGap()
    {
        // InAs/GaSb is the textbook broken-gap pair (common practice, no single source): Ec(InAs) = −0.59 + 0.417
        // lies below Ev(GaSb) = −0.03 (Vurgaftman et al. 2001, from memory) by 0.143 eV.
        var built = StructureRecipe.Parse("5 nm InAs / 5 nm GaSb at 0 K").WithSubstrate(Material.GaSb).Build();
        var w = Assert.Single(built.Warnings, w => w.Kind == ModelWarningKind.BrokenGap);
        Assert.Equal(-0.03 - (-0.59 + 0.417), w.Value, 1e-12);
        Assert.DoesNotContain(StructureRecipe.Parse("5 nm GaAs / 5 nm AlAs at 0 K").Build().Warnings, w => w.Kind == ModelWarningKind.BrokenGap);
    }

    [Fact]
    public void CheckEnergies_FlagsEnergiesFarAboveEdge()
    {
        // Limits: (E − V)/Eg above 0.1 (parabolic) or 0.5 (Kane). GaAs Eg(77 K) ≈ 1.508 eV.
        var recipe = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K");
        var built = recipe.Build();
        Assert.Empty(built.CheckEnergies([0.05, 0.14]));
        var w = Assert.Single(built.CheckEnergies([0.05, 0.3]));
        Assert.Equal(ModelWarningKind.EnergyFarAboveBandEdge, w.Kind);
        Assert.Equal(0, w.LayerIndex);
        Assert.Equal(0.3 / built.Layers[0].BandGapElectronVolts, w.Value, 1e-12);
        Assert.Equal(0.1, w.Limit);
        var kane = recipe.WithNonParabolicity(true).Build();
        Assert.Empty(kane.CheckEnergies([0.3]));
        Assert.Single(kane.CheckEnergies([1.0]));
        Assert.Equal("energiesElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => built.CheckEnergies([double.NaN])).ParamName);
    }

    [Fact]
    public void CheckEnergies_HighMinibandsOfNarrowWellWarn()
    {
        // In a 2 nm GaAs / 2 nm AlAs superlattice the second miniband lies several hundred meV above the
        // GaAs edge, beyond 0.1 Eg: the parabolic model must say so.
        var built = StructureRecipe.Parse("2 nm GaAs / 2 nm AlGaAs at 300 K".Replace("AlGaAs", "Al0.4Ga0.6As", StringComparison.Ordinal)).Build();
        var bands = BandStructure.Compute(built.Cell, 2);
        Assert.Contains(built.CheckEnergies(Edges(bands)), w => w.Kind == ModelWarningKind.EnergyFarAboveBandEdge);
    }

    [Fact]
    public void Build_HeavyHoles_SingleBandLabelledAndReferencedToTopValenceEdge()
    {
        var built = StructureRecipe.Parse("5 nm GaAs / 5 nm Al0.3Ga0.7As at 77 K").WithCarrier(Carrier.HeavyHole).Build();
        Assert.Contains(built.Warnings, w => w.Kind == ModelWarningKind.SingleBandHoles);
        Assert.Contains("single-band", built.ToString(), StringComparison.Ordinal);
        // Hole potential = Ev(top) − Ev(layer); AlGaAs VBO linear (Vurgaftman et al. 2001, from memory): 0.3·(−1.33 + 0.80).
        Assert.Equal(0, built.Layers[0].PotentialElectronVolts);
        Assert.Equal(0.3 * (-0.80 + 1.33), built.Layers[1].PotentialElectronVolts, 1e-12);
        Assert.Equal(-0.80, built.ReferenceElectronVolts);
        Assert.Equal(Material.GaAs.HeavyHoleMassElectronMasses!.Value, built.Layers[0].MassElectronMasses);
        Assert.Equal(-0.80 - 0.01, built.ToAbsoluteElectronVolts(0.01), 1e-15);
        var band = BandStructure.Compute(built.Cell, 1).GetBand(1);
        Assert.InRange(band.BottomElectronVolts, 0, built.Layers[1].PotentialElectronVolts);

        var noHoles = StructureRecipe.Create(Temperature.FromKelvin(4)).Add(Material.Create("X", Energy.FromElectronVolts(1), 0, Temperature.FromKelvin(100), EffectiveMass.FromElectronMasses(0.05), Energy.FromElectronVolts(-0.5), Length.FromNanometres(0.565)), Length.FromNanometres(3))
            .WithCarrier(Carrier.LightHole);
        Assert.Contains("light-hole", Assert.Throws<InvalidOperationException>(() => noHoles.Build()).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void LayerOf_LeadsOfAPeriodicStack_FollowChebyshevTransmissionLaw()
    {
        // N identical cells between leads of one material: 1/T_N = 1 + (1/T_1 − 1)(sin NKd / sin Kd)²
        // (Abelès 1950; P. Yeh, Optical Waves in Layered Media, ch. 6; from memory, derived from
        // M^N = U_{N−1}M − U_{N−2}I). Kd from the engine's band structure of the same cell.
        var recipe = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K");
        var built = recipe.WithPeriods(10).Build();
        var gaas = Lead.Like(built.LayerOf(Material.GaAs, Length.FromNanometres(1)));
        var stack = LayerStack.Periodic(gaas, built.Cell, built.Recipe.Periods, gaas);
        Assert.Equal(70, stack.Thickness.Nanometres, 1e-12);
        Assert.Equal(0, stack.LeftLead.PotentialElectronVolts);
        Assert.Equal(0.067, stack.RightLead.MassElectronMasses);
        // LayerOf gives exactly the layer the recipe builds for the same material and width.
        Assert.Equal(built.Layers[1].Layer.Potential, built.LayerOf(TernaryAlloy.AlGaAs.At(0.3), Length.FromNanometres(2)).Potential);
        Assert.Equal(built.Layers[1].Layer.Mass, built.LayerOf(TernaryAlloy.AlGaAs.At(0.3), Length.FromNanometres(2)).Mass);
        var one = StackTransmission.Create(LayerStack.Periodic(gaas, built.Cell, 1, gaas));
        var ten = StackTransmission.Create(stack);
        var band = BandStructure.Compute(built.Cell, 1).GetBand(1);
        foreach (var f in new[] { 0.2, 0.45, 0.7 })
        {
            var e = band.BottomElectronVolts + f * band.WidthElectronVolts;
            var kd = built.Cell.Period.Nanometres * BandStructure.Compute(built.Cell, 1).WavevectorAt(e).RealPerNanometre;
            var t1 = one.Evaluate(e).Transmission;
            var ratio = Math.Sin(10 * kd) / Math.Sin(kd);
            var expected = 1 / (1 + (1 / t1 - 1) * ratio * ratio);
            // Tolerance 1e-9: both sides are exact formulas evaluated in double precision; ten periods amplify
            // rounding in T by at most ~1e3.
            Assert.Equal(expected, ten.Evaluate(e).Transmission, 1e-9);
        }
        Assert.Equal("material", Assert.Throws<ArgumentNullException>(() => built.LayerOf(null!, Length.FromNanometres(1))).ParamName);
    }

    [Fact]
    public void ToString_ListsEffectiveParameters()
    {
        var text = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K").Build().ToString();
        Assert.Contains("reference", text, StringComparison.Ordinal);
        Assert.Contains("[1] 2 nm Al0.3Ga0.7As", text, StringComparison.Ordinal);
        Assert.Contains("m = 0.0919 m0", text, StringComparison.Ordinal);
    }

    // cos kd of the two-layer Kronig–Penney cell with BenDaniel–Duke matching (project reference file, derived).
    private static double KronigPenneyCos(double e, double a, double mw, double b, double v, double mb)
    {
        var kw = Math.Sqrt(mw * e / C);
        if (e < v)
        {
            var kappa = Math.Sqrt(mb * (v - e) / C);
            var xi = (kappa / mb) / (kw / mw);
            return Math.Cos(kw * a) * Math.Cosh(kappa * b) + 0.5 * (xi - 1 / xi) * Math.Sin(kw * a) * Math.Sinh(kappa * b);
        }
        var kb = Math.Sqrt(mb * (e - v) / C);
        var eta = (kb / mb) / (kw / mw);
        return Math.Cos(kw * a) * Math.Cos(kb * b) - 0.5 * (eta + 1 / eta) * Math.Sin(kw * a) * Math.Sin(kb * b);
    }

    private static double EvenWellCondition(double e, double width, double v, Func<double, double> massW, Func<double, double> massB)
    {
        double mw = massW(e), mb = massB(e);
        var k = Math.Sqrt(mw * e / C);
        var kappa = Math.Sqrt(mb * (v - e) / C);
        return (k / mw) * Math.Sin(k * width / 2) - (kappa / mb) * Math.Cos(k * width / 2);
    }

    private static double OddWellCondition(double e, double width, double v, Func<double, double> massW, Func<double, double> massB)
    {
        double mw = massW(e), mb = massB(e);
        var k = Math.Sqrt(mw * e / C);
        var kappa = Math.Sqrt(mb * (v - e) / C);
        return (k / mw) * Math.Cos(k * width / 2) + (kappa / mb) * Math.Sin(k * width / 2);
    }

    // Lowest sign change of f on a 4000-point grid in (0, v), refined by MathNet's Brent to 1e-14 eV.
    private static double FirstRoot(Func<double, double> f, double v)
    {
        var step = v / 4000;
        for (var i = 1; i < 4000; i++)
        {
            if (Math.Sign(f(i * step)) != Math.Sign(f((i + 1) * step)))
            {
                return Brent.FindRoot(f, i * step, (i + 1) * step, 1e-14, 200);
            }
        }
        throw new InvalidOperationException("no bound state found");
    }

    // Upper bracket for the even ground state: the energy where kL/2 = π/2, or just below the barrier.
    private static double FirstQuarterWave(double width, double mass, double v) =>
        Math.Min(v * (1 - 1e-9), C * Math.Pow(Math.PI / width, 2) / mass);

    private static double[] Edges(BandStructure bands) =>
        [.. bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts })];
}
