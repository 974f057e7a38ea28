// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.SpaceCharge;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.SpaceCharge;

/// <summary>Holes of a valence band as the second carrier of a periodic cell, and acceptors with a level.</summary>
public sealed partial class SpaceChargeSolverTest
{
    /// <summary>One material cut into a 10 nm cell of two layers: electrons of mass <paramref name="electronMass"/>, heavy holes of <paramref name="holeMass"/>, gap <paramref name="gap"/>.</summary>
    private static (UnitCell Electrons, ValenceBand Holes) Bulk(double electronMass, double holeMass, double gap) => (
        UnitCell.Create(L(4, 0, electronMass), L(6, 0, electronMass)),
        ValenceBand.Create(UnitCell.Create(L(4, 0, holeMass), L(6, 0, holeMass)), Energy.FromElectronVolts(-gap), "heavy holes"));

    [Fact]
    public void Solve_UniformAcceptorsOfOneMaterial_FlatPotentialAndHolesEqualAcceptors()
    {
        // A GaAs-like bulk (gap 1.42 eV, hole mass 0.5) with uniform acceptors: neutral everywhere, flat potential and
        // p = N_A (full ionisation; common practice, no single source). The Fermi level is that of a 3D parabolic band for the
        // holes, p = N_v F_{1/2}(η), η = (E_v − μ)/k_BT (J. S. Blakemore, Semiconductor Statistics, 1962, ch. 3 [from memory]),
        // with F_{1/2} integrated independently by MathNet; η → ln(N_A/N_v) with Boltzmann statistics (S. M. Sze, Physics of
        // Semiconductor Devices, 2nd ed., ch. 1 [from memory]).
        const double holeMass = 0.5, temperature = 300, acceptors = 1e15, gap = 1.42;
        var (cell, holes) = Bulk(0.067, holeMass, gap);
        var doping = LayerDoping.Create(0, acceptors, 12.9);
        var result = SpaceChargeSolver.Solve(DopedCell.Create(cell, [doping, doping], Temperature.FromKelvin(temperature), [holes]));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}"); // the required accuracy
        // Flat to 1e-9 eV: the folded free-hole bands' density is uniform up to the k quadrature (as for electrons).
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9, $"max |U| = {result.HartreeElectronVolts.Max(Math.Abs)}");
        foreach (var p in result.HoleDensityPerCubicCentimetre)
        {
            Assert.Equal(acceptors, p, 1e-6 * acceptors); // p = N_A to 1e-6 relative: the k quadrature's error, with margin
        }
        var kT = KB * temperature;
        var eta = (-gap - result.FermiLevelElectronVolts) / kT;
        var bulk = BulkElectronDensity(holeMass, kT, eta); // the same F_{1/2} formula serves a hole band on its own scale
        output.WriteLine($"eta_h = {eta}, N_v F = {bulk:E10}");
        Assert.Equal(acceptors, bulk, 1e-6 * acceptors); // the states' quadrature against the 3D integral (1e-6: k quadrature, cutoff)
        // Boltzmann: η = ln(N_A/N_v) up to the degeneracy correction N_A/(2^{3/2} N_v) ≈ 4e-5 here (Joyce–Dixon first term, from memory).
        Assert.Equal(Math.Log(acceptors / EffectiveDensityOfStates(holeMass, kT)), eta, 2e-4);
        // The electrons' band lies about 1.2 eV (47 k_BT) above μ: beyond the 42 k_BT the solver keeps, so it holds no state.
        Assert.All(result.ElectronDensityPerCubicCentimetre, n => Assert.Equal(0, n));
        Assert.Equal(0, result.OccupiedBands);
    }

    [Fact]
    public void Solve_NarrowGapAcceptors_MassActionLaw()
    {
        // A narrow-gap bulk (gap 0.35 eV, m_e 0.03, m_h 0.4: a scenario of our own) where the minority electrons are countable.
        // n = N_c F_{1/2}(μ/k_BT) and p = N_v F_{1/2}((E_v − μ)/k_BT) at the reported μ (Blakemore [from memory]), p − n = N_A
        // (neutrality), and the mass-action law n·p = N_c N_v e^(−E_g/k_BT) of Boltzmann statistics (Sze, ch. 1 [from memory]).
        const double electronMass = 0.03, holeMass = 0.4, temperature = 300, acceptors = 1e16, gap = 0.35;
        var (cell, holes) = Bulk(electronMass, holeMass, gap);
        var doping = LayerDoping.Create(0, acceptors, 15);
        var result = SpaceChargeSolver.Solve(DopedCell.Create(cell, [doping, doping], Temperature.FromKelvin(temperature), [holes]));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        var kT = KB * temperature;
        var mu = result.FermiLevelElectronVolts;
        double n = result.ElectronDensityPerCubicCentimetre[0], p = result.HoleDensityPerCubicCentimetre[0];
        double nBulk = BulkElectronDensity(electronMass, kT, mu / kT), pBulk = BulkElectronDensity(holeMass, kT, (-gap - mu) / kT);
        output.WriteLine($"mu = {mu}, n = {n:E10} (N_c F = {nBulk:E10}), p = {p:E10} (N_v F = {pBulk:E10})");
        Assert.InRange(n / acceptors, 1e-6, 1e-1); // the minority carriers are there to be counted
        // 1e-6 relative: k quadrature and cutoffs; the minority band set reaches 20 k_BT past its own lowest band (e^-20 ≈ 2e-9).
        Assert.Equal(nBulk, n, 1e-6 * nBulk);
        Assert.Equal(pBulk, p, 1e-6 * pBulk);
        Assert.Equal(acceptors, p - n, 1e-6 * acceptors);
        var massAction = EffectiveDensityOfStates(electronMass, kT) * EffectiveDensityOfStates(holeMass, kT) * Math.Exp(-gap / kT);
        // 2e-3: Boltzmann versus Fermi–Dirac for the holes, about p/(2^{3/2} N_v) ≈ 6e-4 here, with margin.
        Assert.Equal(massAction, n * p, 2e-3 * massAction);
    }

    [Theory]
    [InlineData(0.35, 300)]
    [InlineData(1.42, 300)]
    public void Solve_CompensatedOneMaterial_IsIntrinsic(double gap, double temperature)
    {
        // N_D = N_A: the dopants' charges cancel and the carriers are those of the pure crystal, n = p = n_i with
        // n_i = √(N_c N_v) e^(−E_g/2k_BT) and μ = E_i = (E_c + E_v)/2 + (3/4)k_BT ln(m_h/m_e) in Boltzmann statistics (S. M. Sze,
        // Physics of Semiconductor Devices, 2nd ed., ch. 1 [from memory]).
        const double electronMass = 0.067, holeMass = 0.5, doping = 1e17;
        var (cell, holes) = Bulk(electronMass, holeMass, gap);
        var layer = LayerDoping.Create(doping, doping, 12.9);
        var result = SpaceChargeSolver.Solve(DopedCell.Create(cell, [layer, layer], Temperature.FromKelvin(temperature), [holes]));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9);
        var kT = KB * temperature;
        var intrinsic = Math.Sqrt(EffectiveDensityOfStates(electronMass, kT) * EffectiveDensityOfStates(holeMass, kT)) * Math.Exp(-gap / (2 * kT));
        double n = result.ElectronDensityPerCubicCentimetre[0], p = result.HoleDensityPerCubicCentimetre[0];
        output.WriteLine($"n = {n:E10}, p = {p:E10}, n_i = {intrinsic:E10}, mu = {result.FermiLevelElectronVolts}");
        // Fermi–Dirac at the reported μ (Blakemore [from memory]) to 1e-6 relative: the k quadrature and the cutoffs.
        var nBulk = BulkElectronDensity(electronMass, kT, result.FermiLevelElectronVolts / kT);
        Assert.Equal(nBulk, n, 1e-6 * nBulk);
        Assert.Equal(n, p, 1e-9 * n); // neutral: the dopants cancel exactly on the grid
        // 3e-3: Fermi–Dirac versus Boltzmann, about n_i/(2^{3/2} N_c) ≈ 2e-3 for the 0.35 eV gap (n_i/N_c ≈ 5e-3), with margin.
        Assert.Equal(intrinsic, n, 3e-3 * intrinsic);
        Assert.Equal(-gap / 2 + 0.75 * kT * Math.Log(holeMass / electronMass), result.FermiLevelElectronVolts, 1e-3 * kT);
    }

    [Fact]
    public void Solve_AcceptorLevel_MatchesChargeBalanceSolvedIndependently()
    {
        // Acceptors 26 meV above the valence-band edge at 77 K, where about half keep their hole. The bulk charge balance
        // p = N_A⁻ with N_A⁻ = N_A/(1 + 4e^((E_A − μ)/k_BT)) (acceptor degeneracy 4; S. M. Sze, Physics of Semiconductor Devices,
        // 2nd ed., ch. 1 [from memory]) is solved here independently by MathNet's Brent root finder, once with p = N_v F_{1/2}
        // (Blakemore [from memory]) and once with the non-degenerate p = N_v e^((E_v − μ)/k_BT).
        const double holeMass = 0.5, temperature = 77, acceptors = 1e16, binding = 0.026, gap = 1.5;
        var (cell, holes) = Bulk(0.067, holeMass, gap);
        var doping = LayerDoping.Create(0, acceptors, 12.9).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(binding));
        var result = SpaceChargeSolver.Solve(DopedCell.Create(cell, [doping, doping], Temperature.FromKelvin(temperature), [holes]),
            SpaceChargeOptions.Create(wavevectorNodes: 48));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9); // neutral everywhere: flat
        var kT = KB * temperature;
        var nv = EffectiveDensityOfStates(holeMass, kT);
        double Ionised(double mu) => acceptors / (1 + LayerDoping.AcceptorDegeneracy * Math.Exp((-gap + binding - mu) / kT));
        var exact = MathNet.Numerics.RootFinding.Brent.FindRoot(mu => BulkElectronDensity(holeMass, kT, (-gap - mu) / kT) - Ionised(mu), -gap - 0.2, -gap + 0.5, 1e-14);
        var boltzmann = MathNet.Numerics.RootFinding.Brent.FindRoot(mu => nv * Math.Exp((-gap - mu) / kT) - Ionised(mu), -gap - 0.2, -gap + 0.5, 1e-14);
        var p = result.HoleDensityPerCubicCentimetre[0];
        output.WriteLine($"mu = {result.FermiLevelElectronVolts}, exact {exact}, Boltzmann {boltzmann}; p = {p:E10}, ionised fraction {Ionised(result.FermiLevelElectronVolts) / acceptors}");
        Assert.InRange(p / acceptors, 0.2, 0.9); // the statistics matter here: a solver that ignored them would give 1
        // 1e-6 k_BT and 1e-6 relative: the k quadrature of the folded bands (48 nodes per band) and the 40 k_BT cutoff.
        Assert.Equal(exact, result.FermiLevelElectronVolts, 1e-6 * kT);
        Assert.Equal(Ionised(exact), p, 1e-6 * acceptors);
        // Boltzmann: off by the degeneracy of p/N_v ≈ 5e-3 here, which moves μ by about p/(2^{3/2} N_v)·k_BT; 5e-3 k_BT with margin.
        Assert.Equal(boltzmann, result.FermiLevelElectronVolts, 5e-3 * kT);
    }

    /// <summary>A GaAs-like 8 nm well between 4 nm AlGaAs-like barriers that carry acceptors: a p-type modulation-doped cell.</summary>
    private static DopedCell PModulationDoped(double acceptors = 5e18) => DopedCell.Create(
        UnitCell.Create(L(4, 0.25, 0.092), L(8, 0, 0.067), L(4, 0.25, 0.092)),
        [LayerDoping.Create(0, acceptors, 12.2), LayerDoping.Create(0, 0, 12.9), LayerDoping.Create(0, acceptors, 12.2)],
        Temperature.FromKelvin(77),
        [ValenceBand.Create(UnitCell.Create(L(4, 0.15, 0.55), L(8, 0, 0.5), L(4, 0.15, 0.55)), Energy.FromElectronVolts(-1.52), "heavy holes"),
         ValenceBand.Create(UnitCell.Create(L(4, 0.15, 0.1), L(8, 0, 0.08), L(4, 0.15, 0.1)), Energy.FromElectronVolts(-1.52), "light holes")]);

    [Fact]
    public void Solve_PModulationDoped_ConvergesWithHolesInTheWell()
    {
        // 12 k nodes per band: neutrality and the hole count do not depend on the k quadrature, and the test stays quick.
        var result = SpaceChargeSolver.Solve(PModulationDoped(), SpaceChargeOptions.Create(wavevectorNodes: 12));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}"); // the required accuracy
        Assert.True(result.ResidualElectronVolts <= SpaceChargeOptions.DefaultToleranceElectronVolts);
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        // Holes gathered in the well lower the electron potential energy there, the ionised acceptors raise it in the barriers
        // (d²U/dz² ∝ ρ: U is convex where the charge is positive; common practice, no single source).
        Assert.True(Interpolate(x, u, 8) < Interpolate(x, u, 2), $"U(well) = {Interpolate(x, u, 8)}, U(barrier) = {Interpolate(x, u, 2)}");
        // Every acceptor is ionised: the holes per period equal N_A times the doped width (8 nm), by the trapezoid rule
        // (O(h²) ≈ 1e-3 relative at 0.1 nm, as for electrons).
        var sheet = 5e18 * 8e-7; // cm⁻²
        var holes = Trapezoid(x, result.HoleDensityPerCubicCentimetre) * 1e-7;
        Assert.Equal(sheet, holes, 2e-3 * sheet);
        // Most holes sit in the well.
        var inWell = TrapezoidBetween(x, result.HoleDensityPerCubicCentimetre, 4, 12) * 1e-7;
        Assert.True(inWell > 0.5 * holes, $"{inWell} of {holes} cm-2 in the well");
        Assert.Equal(2, result.ValenceCells.Count);
        Assert.All(result.OccupiedValenceBands, bands => Assert.True(bands >= 1));
    }

    [Fact]
    public void Solve_PModulationDoped_GaussLawWithHoles()
    {
        // Gauss's law (J. D. Jackson, Classical Electrodynamics, 3rd ed., §1.3) across the well: ε_r dU/dz |_a^b =
        // (e/ε₀) ∫_a^b (p − n − N_A) dz with the holes' charge. Both sides are second order in h = 0.05 nm; 1 % as for electrons.
        // 12 k nodes per band: Gauss's law holds for any k quadrature (the density is what it is), and the test stays quick.
        var result = SpaceChargeSolver.Solve(PModulationDoped(), SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.05, wavevectorNodes: 12));
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        int a = Index(x, 2), b = Index(x, 14);
        double fluxA = 12.2 * (u[a + 1] - u[a]) / (x[a + 1] - x[a]), fluxB = 12.2 * (u[b + 1] - u[b]) / (x[b + 1] - x[b]);
        double za = 0.5 * (x[a] + x[a + 1]), zb = 0.5 * (x[b] + x[b + 1]);
        var holes = TrapezoidBetween(x, result.HoleDensityPerCubicCentimetre, za, zb) * 1e-21;
        var electrons = TrapezoidBetween(x, result.ElectronDensityPerCubicCentimetre, za, zb) * 1e-21;
        var acceptors = 5e18 * 1e-21 * ((4 - za) + (zb - 12)); // the doped parts of the two barriers inside [za, zb]
        var expected = ChargeOverPermittivity * (holes - electrons - acceptors);
        output.WriteLine($"flux jump {fluxB - fluxA} eV, enclosed (e/eps0) Q = {expected} eV");
        Assert.Equal(expected, fluxB - fluxA, 1e-2 * Math.Abs(expected));
    }

    [Fact]
    public void Solve_VanishingAcceptors_ReproducesRigidBandsOfBothCarriers()
    {
        // 1e6 cm⁻³ of acceptors (and the intrinsic carriers of a 1.5 eV gap at 300 K, about 1e6 cm⁻³) give a Hartree potential
        // of order 1e-14 eV: the electron and hole bands must be the rigid ones to 1e-9 eV (the required agreement).
        var electrons = UnitCell.Create(L(3, 0.3, 0.09), L(6, 0, 0.067));
        var holeCell = UnitCell.Create(L(3, 0.15, 0.55), L(6, 0, 0.5));
        var doped = DopedCell.Create(electrons, [LayerDoping.Create(0, 1e6, 12), LayerDoping.Create(0, 1e6, 13)], Temperature.FromKelvin(300),
            [ValenceBand.Create(holeCell, Energy.FromElectronVolts(-1.5), "heavy holes")]);
        var result = SpaceChargeSolver.Solve(doped);
        output.WriteLine(result.ToString());
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9);
        foreach (var (rigid, self) in new[] { (electrons, result.Cell), (holeCell, result.ValenceCells[0]) })
        {
            var exact = BandStructure.Compute(rigid, 3);
            var solved = BandStructure.Compute(self, 3);
            for (var band = 1; band <= 3; band++)
            {
                Assert.Equal(exact.GetBand(band).BottomElectronVolts, solved.GetBand(band).BottomElectronVolts, 1e-9);
                Assert.Equal(exact.GetBand(band).TopElectronVolts, solved.GetBand(band).TopElectronVolts, 1e-9);
            }
        }
    }

    [Fact]
    public void Solve_NTypeWithAValenceBand_SameAsElectronsAlone()
    {
        // In the n-type modulation-doped cell at 77 K the valence band lies about 1.5 eV (230 k_BT) below μ: its holes are
        // negligible (below e^-40) and the solution must not change. 1e-12 eV: both runs reach the 1e-9 eV tolerance along the
        // same iterates, so only rounding may separate them.
        var alone = SpaceChargeSolver.Solve(ModulationDoped());
        var input = ModulationDoped();
        var withHoles = SpaceChargeSolver.Solve(DopedCell.Create(input.Cell, input.Doping, input.Temperature,
            [ValenceBand.Create(UnitCell.Create(L(4, 0.15, 0.55), L(8, 0, 0.5), L(4, 0.15, 0.55)), Energy.FromElectronVolts(-1.52), "heavy holes")]));
        Assert.Equal(alone.FermiLevelElectronVolts, withHoles.FermiLevelElectronVolts, 1e-12);
        Assert.Equal(alone.Iterations, withHoles.Iterations);
        Assert.All(withHoles.HoleDensityPerCubicCentimetre, p => Assert.Equal(0, p));
        Assert.Equal(0, withHoles.OccupiedValenceBands[0]);
    }

    [Fact]
    public void DopedCellCreate_AcceptorLevelWithoutValenceBand_IsRefused()
    {
        var cell = UnitCell.Create(L(4, 0, 0.067));
        var doping = LayerDoping.Create(2e17, 1e17, 12.9).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(0.026));
        var error = Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, [doping], Temperature.FromKelvin(300)));
        Assert.Equal("doping", error.ParamName);
        Assert.Contains("valence band", error.Message);
    }

    [Fact]
    public void DopedCellCreate_HoleCellNotMatchingTheCell_NamesValenceBands()
    {
        var cell = UnitCell.Create(L(4, 0, 0.067), L(4, 0.2, 0.09));
        var doping = new[] { LayerDoping.Create(0, 1e17, 12.9), LayerDoping.Undoped(12) };
        var wrongWidth = ValenceBand.Create(UnitCell.Create(L(4, 0, 0.5), L(5, 0.1, 0.55)), Energy.FromElectronVolts(-1.5), "heavy holes");
        var wrongCount = ValenceBand.Create(UnitCell.Create(L(8, 0, 0.5)), Energy.FromElectronVolts(-1.5), "heavy holes");
        Assert.Equal("valenceBands", Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, doping, Temperature.FromKelvin(300), [wrongWidth])).ParamName);
        Assert.Equal("valenceBands", Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, doping, Temperature.FromKelvin(300), [wrongCount])).ParamName);
        // Without a valence band the same p-type cell has no carrier to neutralise it.
        Assert.Equal("doping", Assert.Throws<ArgumentException>(() => DopedCell.Create(cell, doping, Temperature.FromKelvin(300))).ParamName);
    }

    [Fact]
    public void LayerDopingWithAcceptorIonisationEnergy_OutOfRange_NamesParameter()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => LayerDoping.Create(0, 1e17, 12.9).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(-0.01)));
        Assert.Equal("acceptorIonisationEnergy", error.ParamName);
        // The two levels are independent: setting one keeps the other.
        var both = LayerDoping.Create(1e17, 1e17, 12.9).WithDonorIonisationEnergy(Energy.FromElectronVolts(0.006)).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(0.026));
        Assert.Equal(0.006, both.DonorIonisationEnergyElectronVolts);
        Assert.Equal(0.026, both.AcceptorIonisationEnergyElectronVolts);
        Assert.Equal(0.026, both.WithDonorIonisationEnergy(Energy.FromElectronVolts(0.005)).AcceptorIonisationEnergyElectronVolts);
    }
}
