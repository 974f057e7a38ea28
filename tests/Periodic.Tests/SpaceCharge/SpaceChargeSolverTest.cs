// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.SpaceCharge;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.SpaceCharge;

public sealed partial class SpaceChargeSolverTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double KB = PhysicalConstants.BoltzmannElectronVoltsPerKelvin;

    /// <summary>e/ε₀ in eV·nm from the CODATA 2018 e and ε₀ (docs/references.md).</summary>
    private const double ChargeOverPermittivity = PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.VacuumPermittivityFaradsPerMetre * 1e9;

    private static Layer L(double width, double potential, double mass) =>
        Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    /// <summary>A GaAs-like 8 nm well between 8 nm Al₀.₃Ga₀.₇As-like barriers whose middles carry a donor sheet: modulation doping.</summary>
    private static DopedCell ModulationDoped(double sheet = 2e12, double temperature = 77) => DopedCell.Create(
        UnitCell.Create(L(4, 0.25, 0.092), L(8, 0, 0.067), L(4, 0.25, 0.092)),
        [LayerDoping.Create(0, 0, 12.2), LayerDoping.Create(0, 0, 12.9), LayerDoping.Create(0, 0, 12.2, sheet)],
        Temperature.FromKelvin(temperature));

    [Fact]
    public void Solve_ModulationDoped_IsNeutralAndConverged()
    {
        var result = SpaceChargeSolver.Solve(ModulationDoped());
        output.WriteLine(result.ToString());
        // Neutrality per period to 1e-10 relative (the required accuracy); the Fermi level is solved on the quadrature's own states.
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        Assert.True(result.ResidualElectronVolts <= SpaceChargeOptions.DefaultToleranceElectronVolts);
        // Electrons in the well raise their own potential energy there and the positive sheet lowers it (the sign of
        // Poisson's equation, d²U/dz² ∝ N_D − n; common practice, no single source): U(well middle) > U(sheet).
        var u = result.HartreeElectronVolts;
        var x = result.PositionsNanometres;
        double wellMiddle = Interpolate(x, u, 8), sheet = Interpolate(x, u, 14);
        Assert.True(wellMiddle > sheet, $"U(well) = {wellMiddle}, U(sheet) = {sheet}");
        // Total electrons from the reported density equal the sheet: trapezoid rule on the grid (O(h²) ≈ 1e-3 relative at 0.1 nm).
        var electrons = Trapezoid(x, result.ElectronDensityPerCubicCentimetre) * 1e-21; // /nm² per period
        Assert.Equal(2e12 * 1e-14, electrons, 2e-3 * 2e12 * 1e-14);
    }

    [Fact]
    public void Solve_GaussLaw_FluxChangeEqualsEnclosedCharge()
    {
        // Gauss's law (J. D. Jackson, Classical Electrodynamics, 3rd ed., §1.3): ε_r ε₀ E(b) − ε_r ε₀ E(a) = ∫_a^b ρ dz; in
        // the energy form ε_r dU/dz |_a^b = (e/ε₀) ∫_a^b (N_D − N_A − n) dz + sheets. The fluxes come from the reported
        // potential's slope in the intervals either side of [a, b]; the charge from the reported density by the trapezoid
        // rule and the input doping. Both are second-order approximations at the grid spacing h = 0.05 nm, so the
        // tolerance is 1 % of the flux jump, set by h²·|U'''| (about 1e-3 of it here) with a margin.
        var doped = ModulationDoped();
        var result = SpaceChargeSolver.Solve(doped, SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.05));
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        var n = result.ElectronDensityPerCubicCentimetre;
        // From the middle of the left barrier (2 nm) across the well to the middle of the right barrier, just past the sheet (14.2 nm).
        int a = Index(x, 2), b = Index(x, 14.2);
        double fluxA = 12.2 * (u[a + 1] - u[a]) / (x[a + 1] - x[a]), fluxB = 12.2 * (u[b + 1] - u[b]) / (x[b + 1] - x[b]);
        double charge = 2e12 * 1e-14; // the sheet at 14 nm lies inside
        double za = 0.5 * (x[a] + x[a + 1]), zb = 0.5 * (x[b] + x[b + 1]);
        var electrons = TrapezoidBetween(x, n, za, zb) * 1e-21;
        var expected = ChargeOverPermittivity * (charge - electrons);
        output.WriteLine($"flux jump {fluxB - fluxA} eV, enclosed (e/eps0) Q = {expected} eV");
        Assert.Equal(expected, fluxB - fluxA, 1e-2 * Math.Abs(expected));
        // Over the whole period the enclosed charge is zero and the flux returns to itself (periodic boundary condition).
    }

    [Fact]
    public void Solve_VanishingDoping_ReproducesRigidBands()
    {
        // 1e6 cm⁻³ gives a Hartree potential of order (e/ε₀)·N·d²/ε ≈ 1e-14 eV: the bands must be the rigid ones. The rigid
        // cell's edges come from the exact closed-form engine; the self-consistent cell's through sampled segments. 1e-9 eV is
        // the required agreement; the Magnus steps are exact for a constant potential, so only rounding separates them.
        var rigid = UnitCell.Create(L(3, 0.3, 0.09), L(6, 0, 0.067));
        var doped = DopedCell.Create(rigid, [LayerDoping.Create(1e6, 0, 12), LayerDoping.Create(1e6, 0, 13)], Temperature.FromKelvin(300));
        var result = SpaceChargeSolver.Solve(doped);
        var exact = BandStructure.Compute(rigid, 3);
        var self = BandStructure.Compute(result.Cell, 3);
        for (var band = 1; band <= 3; band++)
        {
            Assert.Equal(exact.GetBand(band).BottomElectronVolts, self.GetBand(band).BottomElectronVolts, 1e-9);
            Assert.Equal(exact.GetBand(band).TopElectronVolts, self.GetBand(band).TopElectronVolts, 1e-9);
        }
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9);
    }

    [Fact]
    public void Solve_UniformDopingOfOneMaterial_FlatPotentialAndBulkDensity()
    {
        // Two layers of one material with the same doping: a bulk crystal cut into a 10 nm cell. Charge neutrality
        // everywhere gives a flat potential and n = N_D (common practice, no single source), and the Fermi level is that of a
        // 3D parabolic band, n = N_c·F_{1/2}(η), N_c = 2(m k_BT/2πħ²)^{3/2}, η = (μ − E_c)/k_BT (J. S. Blakemore,
        // Semiconductor Statistics, 1962, ch. 3 [from memory]); F_{1/2} is integrated here independently by MathNet's
        // Gauss–Legendre rule. In the non-degenerate limit η → ln(N_D/N_c) (Boltzmann statistics; S. M. Sze, Physics of
        // Semiconductor Devices, 2nd ed., ch. 1 [from memory]).
        const double mass = 0.067, temperature = 300, donors = 1e15;
        var cell = UnitCell.Create(L(4, 0, mass), L(6, 0, mass));
        var doped = DopedCell.Create(cell, [LayerDoping.Create(donors, 0, 12.9), LayerDoping.Create(donors, 0, 12.9)], Temperature.FromKelvin(temperature));
        var result = SpaceChargeSolver.Solve(doped);
        output.WriteLine(result.ToString());
        // Flat: the density of the folded free-electron bands is uniform up to the k quadrature (24 nodes per band, error
        // far below 1e-9 relative for these Gaussian-like integrands), so U stays below 1e-9 eV.
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9, $"max |U| = {result.HartreeElectronVolts.Max(Math.Abs)}");
        foreach (var n in result.ElectronDensityPerCubicCentimetre)
        {
            Assert.Equal(donors, n, 1e-6 * donors); // n = N_D to 1e-6 relative: the k quadrature's error, with margin
        }
        var kT = KB * temperature;
        var nc = EffectiveDensityOfStates(mass, kT);
        var eta = result.FermiLevelElectronVolts / kT;
        var bulk = BulkElectronDensity(mass, kT, eta);
        output.WriteLine($"eta = {eta}, N_c = {nc:E6} cm-3, N_c F(eta) = {bulk:E10}");
        // The states' quadrature against the 3D integral: 1e-6 relative covers the k quadrature and the 40 kT cutoff (e^-40).
        Assert.Equal(donors, bulk, 1e-6 * donors);
        // Boltzmann: η = ln(N_D/N_c) up to the degeneracy correction N_D/(2^{3/2} N_c) ≈ 1e-3 here (Joyce–Dixon first term, from memory).
        Assert.Equal(Math.Log(donors / nc), eta, 2e-3);
    }

    [Fact]
    public void Solve_IncompleteIonisation_BulkElectronsEqualIonisedDonors()
    {
        // One material, uniform donors 6 meV below the band edge, at 30 K where about half of them keep their electron. In
        // the bulk, n = N_D⁺ with N_D⁺ = N_D/(1 + 2e^((μ − E_c + E_b)/k_BT)) (donor statistics with degeneracy 2; S. M. Sze,
        // Physics of Semiconductor Devices, 2nd ed., ch. 1 [from memory]) and n = N_c F_{1/2}(η) (J. S. Blakemore [from
        // memory]); both sides are evaluated here at the Fermi level the solver reports, with MathNet's quadrature for F_{1/2}.
        const double mass = 0.067, temperature = 30, donors = 1e15, binding = 0.006;
        var cell = UnitCell.Create(L(4, 0, mass), L(6, 0, mass));
        var doping = LayerDoping.Create(donors, 0, 12.9).WithDonorIonisationEnergy(Energy.FromElectronVolts(binding));
        var doped = DopedCell.Create(cell, [doping, doping], Temperature.FromKelvin(temperature));
        var result = SpaceChargeSolver.Solve(doped, SpaceChargeOptions.Create(wavevectorNodes: 48));
        output.WriteLine(result.ToString());
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9); // neutral everywhere: flat
        Assert.True(result.NeutralityError <= 1e-10);
        var kT = KB * temperature;
        var eta = result.FermiLevelElectronVolts / kT;
        var ionised = donors / (1 + 2 * Math.Exp(eta + binding / kT));
        var bulk = BulkElectronDensity(mass, kT, eta);
        output.WriteLine($"eta = {eta}, ionised fraction {ionised / donors}, n = {result.ElectronDensityPerCubicCentimetre[0]:E10}, N_c F = {bulk:E10}");
        Assert.InRange(ionised / donors, 0.2, 0.9); // the statistics matter here: a solver that ignored them would give 1
        // 1e-6 relative: the k quadrature of the folded bands at 30 K (48 nodes per band) and the 40 k_BT cutoff.
        Assert.Equal(ionised, result.ElectronDensityPerCubicCentimetre[0], 1e-6 * donors);
        Assert.Equal(ionised, bulk, 1e-6 * donors);
    }

    [Fact]
    public void Solve_DeltaDopedAgainstFiniteDifferenceReference_AgreeAsGridsRefine()
    {
        // An independent finite-difference Schrödinger–Poisson solver (TestHelpers/FiniteDifferenceSchrodingerPoisson: dense
        // Hermitian Bloch matrices by MathNet, midpoint k rule, dense Newton) on the same modulation-doped cell. Both are
        // second order in h; each pair of grids is extrapolated (Richardson) to h → 0 and the limits compared. Compared:
        // gauge-free quantities, the Hartree drop U(well middle) − U(sheet) and the Fermi level above the lowest state at k = 0.
        var doped = ModulationDoped();
        var layers = new List<FiniteDifferenceSchrodingerPoisson.LayerSpec>
        {
            new(4, 0.25, 0.092, 12.2, 0, 0), new(8, 0, 0.067, 12.9, 0, 0), new(4, 0.25, 0.092, 12.2, 0, 2e12),
        };
        double[] grids = [0.2, 0.1];
        var library = new (double Drop, double Fermi)[2];
        var reference = new (double Drop, double Fermi)[2];
        for (var g = 0; g < grids.Length; g++)
        {
            var result = SpaceChargeSolver.Solve(doped, SpaceChargeOptions.Create(maxGridSpacingNanometres: grids[g], wavevectorNodes: 16));
            var bottom = BandStructure.Compute(result.Cell, 1).EnergyAt(1, 0);
            library[g] = (Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, 8) - Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, 14),
                result.FermiLevelElectronVolts - bottom);
            var fd = new FiniteDifferenceSchrodingerPoisson(layers, grids[g], 77, phases: 16, bands: result.OccupiedBands + 1);
            fd.Solve();
            var h = grids[g];
            reference[g] = (fd.Hartree[(int)Math.Round(8 / h)] - fd.Hartree[(int)Math.Round(14 / h)], fd.FermiLevel - fd.LowestEnergy);
            output.WriteLine($"h = {h} nm: library drop {library[g].Drop:R} eV, mu - E1 {library[g].Fermi:R} eV; reference drop {reference[g].Drop:R}, mu - E1 {reference[g].Fermi:R}");
        }
        static double Richardson(double coarse, double fine) => (4 * fine - coarse) / 3;
        double libraryDrop = Richardson(library[0].Drop, library[1].Drop), referenceDrop = Richardson(reference[0].Drop, reference[1].Drop);
        double libraryFermi = Richardson(library[0].Fermi, library[1].Fermi), referenceFermi = Richardson(reference[0].Fermi, reference[1].Fermi);
        output.WriteLine($"extrapolated: drop {libraryDrop:R} vs {referenceDrop:R}; mu - E1 {libraryFermi:R} vs {referenceFermi:R}");
        // The raw differences shrink with h (both second order: the difference of two O(h²) schemes).
        Assert.True(Math.Abs(library[1].Fermi - reference[1].Fermi) < Math.Abs(library[0].Fermi - reference[0].Fermi));
        // Extrapolated limits agree to 2e-5 eV: the O(h⁴) remainder of each extrapolation from h = 0.2 and 0.1 nm (the raw
        // O(h²) differences are ~1e-5 eV at 0.2 nm, so the remainder is a few µeV) and the two k quadratures (16 Gauss and
        // 16 midpoint nodes, both far more accurate for these smooth integrands).
        Assert.Equal(referenceDrop, libraryDrop, 2e-5);
        Assert.Equal(referenceFermi, libraryFermi, 2e-5);
    }

    [Fact]
    public void Solve_RotatedCell_SameFermiLevelAboveTheBands()
    {
        // The infinite crystal does not know where a cell starts (common practice, no single source): rotating the cell
        // moves the Hartree potential with it and leaves μ − E₁ unchanged. The grids differ (each starts at its own origin),
        // so agreement is to the O(h²) grid error, a few µeV at 0.1 nm (see the finite-difference comparison), hence 2e-5 eV.
        var doped = ModulationDoped();
        var rotated = DopedCell.Create(doped.Cell.Rotate(1), [doped.Doping[1], doped.Doping[2], doped.Doping[0]], doped.Temperature);
        var a = SpaceChargeSolver.Solve(doped);
        var b = SpaceChargeSolver.Solve(rotated);
        var ea = BandSolver.Compute(a.Cell, 1);
        var eb = BandSolver.Compute(b.Cell, 1);
        Assert.Equal(a.FermiLevelElectronVolts - ea.Structure.GetBand(1).BottomElectronVolts,
            b.FermiLevelElectronVolts - eb.Structure.GetBand(1).BottomElectronVolts, 2e-5);
        // The self-consistent cell is a cell of smooth (sampled) segments: the band solver refines it and reports its error.
        Assert.Equal(BandSolverMethod.Refined, ea.Method);
        Assert.True(ea.Converged && ea.MaxDiscretisationErrorElectronVolts < 1e-6, ea.ToString());
    }

    [Fact]
    public void Solve_BudgetTooSmall_ThrowsSpaceChargeException()
    {
        var error = Assert.Throws<SpaceChargeException>(() => SpaceChargeSolver.Solve(ModulationDoped(), SpaceChargeOptions.Create(toleranceElectronVolts: 1e-13, maxIterations: 1)));
        Assert.Equal(1, error.Iterations);
        Assert.True(error.ResidualElectronVolts > 1e-13);
    }

    [Fact]
    public void Solve_Cancelled_Throws()
    {
        using var source = new CancellationTokenSource();
        source.Cancel();
        Assert.Throws<OperationCanceledException>(() => SpaceChargeSolver.Solve(ModulationDoped(), cancellationToken: source.Token));
    }

    [Fact]
    public void Solve_ReportsProgressEveryIteration()
    {
        var reports = new List<SpaceChargeProgress>();
        var result = SpaceChargeSolver.Solve(ModulationDoped(), progress: new SynchronousProgress(reports));
        Assert.Equal(result.Iterations, reports.Count);
        Assert.Equal(result.ResidualElectronVolts, reports[^1].ResidualElectronVolts);
    }

    [Fact]
    public void Solve_AveragedDensity_MatchesSuperlatticeCarrierDensityOfTheConvergedCell()
    {
        // Internal consistency with the library's independent carrier integral (adaptive panels in the Bloch phase,
        // BandProperties.SuperlatticeCarrierDensity) for one material, where the in-plane mass is the layer mass: the
        // cell average of n(z) equals it at the reported Fermi level. 1e-8 relative covers both quadratures.
        var cell = UnitCell.Create(L(5, 0, 0.067), L(5, 0.2, 0.067));
        var doped = DopedCell.Create(cell, [LayerDoping.Create(0, 0, 12.9), LayerDoping.Create(5e17, 0, 12.9)], Temperature.FromKelvin(300));
        var result = SpaceChargeSolver.Solve(doped);
        var bands = BandStructure.ComputeBelow(result.Cell, Energy.FromElectronVolts(result.FermiLevelElectronVolts + 45 * KB * 300));
        var average = BandProperties.Create(bands).SuperlatticeCarrierDensity(Energy.FromElectronVolts(result.FermiLevelElectronVolts), Temperature.FromKelvin(300),
            EffectiveMass.FromElectronMasses(0.067)).DensityPerCubicCentimetre;
        var expected = 5e17 * 5 / 10; // neutrality: the doping averaged over the period
        Assert.Equal(expected, average, 1e-8 * expected);
    }

    [Theory]
    [InlineData(-1.0, 0.0, 12.0, 0.0, "donorsPerCubicCentimetre")]
    [InlineData(0.0, -1.0, 12.0, 0.0, "acceptorsPerCubicCentimetre")]
    [InlineData(0.0, 0.0, 0.0, 0.0, "relativePermittivity")]
    [InlineData(0.0, 0.0, -3.0, 0.0, "relativePermittivity")]
    [InlineData(0.0, 0.0, 12.0, -1e11, "sheetDonorsPerSquareCentimetre")]
    [InlineData(double.NaN, 0.0, 12.0, 0.0, "donorsPerCubicCentimetre")]
    public void LayerDopingCreate_BadValue_NamesParameter(double donors, double acceptors, double permittivity, double sheet, string name)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => LayerDoping.Create(donors, acceptors, permittivity, sheet));
        Assert.Equal(name, error.ParamName);
    }

    [Fact]
    public void DopedCellCreate_MoreAcceptorsThanDonors_IsRefused()
    {
        var cell = UnitCell.Create(L(4, 0, 0.067));
        var error = Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, [LayerDoping.Create(1e17, 2e17, 12.9)], Temperature.FromKelvin(300)));
        Assert.Equal("doping", error.ParamName);
        Assert.Contains("holes are not modelled", error.Message);
    }

    [Fact]
    public void DopedCellCreate_WrongCountOrTemperature_IsRefused()
    {
        var cell = UnitCell.Create(L(4, 0, 0.067), L(4, 0.2, 0.09));
        Assert.Equal("doping", Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, [LayerDoping.Create(1e17, 0, 12.9)], Temperature.FromKelvin(300))).ParamName);
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() =>
            DopedCell.Create(cell, [LayerDoping.Create(1e17, 0, 12.9), LayerDoping.Undoped(12)], Temperature.FromKelvin(0))).ParamName);
    }

    [Theory]
    [InlineData(0.0, 100, 0.1, 24, "toleranceElectronVolts")]
    [InlineData(1e-9, 0, 0.1, 24, "maxIterations")]
    [InlineData(1e-9, 100, 0.0, 24, "maxGridSpacingNanometres")]
    [InlineData(1e-9, 100, 0.1, 1, "wavevectorNodes")]
    public void OptionsCreate_BadValue_NamesParameter(double tolerance, int iterations, double spacing, int nodes, string name)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => SpaceChargeOptions.Create(tolerance, iterations, spacing, nodes));
        Assert.Equal(name, error.ParamName);
    }

    /// <summary>N_c = 2(m k_BT/2πħ²)^{3/2} of a parabolic band, cm⁻³ (ħ²/m₀ = 2C).</summary>
    private static double EffectiveDensityOfStates(double mass, double kT) => 2 * Math.Pow(mass * kT / (4 * Math.PI * C), 1.5) * 1e21;

    /// <summary>
    /// n = N_c F_{1/2}(η) of a three-dimensional parabolic band, cm⁻³ (J. S. Blakemore, Semiconductor Statistics, 1962, ch. 3
    /// [from memory]); F_{1/2} with t = v² (removes the √t end point, so the rule converges fast): (2/√π)∫₀^√60 2v²/(1 + e^(v² − η)) dv
    /// by MathNet's Gauss–Legendre rule.
    /// </summary>
    private static double BulkElectronDensity(double mass, double kT, double eta) => EffectiveDensityOfStates(mass, kT)
        * 2 / Math.Sqrt(Math.PI) * GaussLegendreRule.Integrate(v => 2 * v * v / (1 + Math.Exp(v * v - eta)), 0, Math.Sqrt(60), 256);

    private sealed class SynchronousProgress(List<SpaceChargeProgress> reports) : IProgress<SpaceChargeProgress>
    {
        public void Report(SpaceChargeProgress value) => reports.Add(value);
    }

    private static int Index(IReadOnlyList<double> x, double position)
    {
        var i = 0;
        while (i + 1 < x.Count && x[i + 1] <= position + 1e-12)
        {
            i++;
        }
        return i;
    }

    private static double Interpolate(IReadOnlyList<double> x, IReadOnlyList<double> y, double position)
    {
        var i = Math.Min(Index(x, position), x.Count - 2);
        var t = (position - x[i]) / (x[i + 1] - x[i]);
        return y[i] + t * (y[i + 1] - y[i]);
    }

    private static double Trapezoid(IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        double sum = 0;
        for (var i = 0; i + 1 < x.Count; i++)
        {
            sum += 0.5 * (x[i + 1] - x[i]) * (y[i] + y[i + 1]);
        }
        return sum;
    }

    private static double TrapezoidBetween(IReadOnlyList<double> x, IReadOnlyList<double> y, double a, double b)
    {
        double sum = 0;
        for (var i = 0; i + 1 < x.Count; i++)
        {
            double lo = Math.Max(a, x[i]), hi = Math.Min(b, x[i + 1]);
            if (hi > lo)
            {
                sum += (hi - lo) * 0.5 * (Interpolate(x, y, lo) + Interpolate(x, y, hi));
            }
        }
        return sum;
    }
}
