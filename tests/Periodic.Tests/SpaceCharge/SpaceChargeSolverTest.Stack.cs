// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.SpaceCharge;

/// <summary>Finite doped stacks between leads at zero bias.</summary>
public sealed partial class SpaceChargeSolverTest
{
    private static readonly Lead BarrierLead = Lead.Create(Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.092));

    /// <summary>
    /// A modulation-doped single well between barrier leads: a 10 nm barrier with a donor sheet at its middle (5 nm), an 8 nm
    /// GaAs-like well (10 … 18 nm), a 10 nm undoped barrier.
    /// </summary>
    private static DopedStack ModulationDopedWell(double sheet = 1e12, double temperature = 77) => DopedStack.Create(
        LayerStack.Create(BarrierLead, BarrierLead, L(10, 0.25, 0.092), L(8, 0, 0.067), L(10, 0.25, 0.092)),
        [[LayerDoping.Create(0, 0, 12.2, sheet)], [LayerDoping.Undoped(12.9)], [LayerDoping.Undoped(12.2)]],
        Temperature.FromKelvin(temperature), 12.2, 12.2);

    /// <summary>The Hartree drop U(well middle) − U(sheet) and μ − E₁ (E₁ the lowest level of the self-consistent stack): gauge-free.</summary>
    private static (double Drop, double Fermi) Observables(SelfConsistentStack result)
    {
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        var lowest = BoundStateSpectrum.Find(result.Stack).Levels[0].EnergyElectronVolts;
        return (Interpolate(x, u, 14) - Interpolate(x, u, 5), result.FermiLevelElectronVolts - lowest);
    }

    [Fact]
    public void SolveStack_ModulationDopedWell_NeutralConvergedAndGauss()
    {
        var result = SpaceChargeSolver.SolveStack(ModulationDopedWell(), SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.05, leadBufferNanometres: 10));
        output.WriteLine(result.ToString());
        // Neutrality of the whole domain (stack and lead buffers) to 1e-10 relative, the required accuracy.
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        Assert.True(result.ResidualElectronVolts <= SpaceChargeOptions.DefaultToleranceElectronVolts);
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        var n = result.ElectronDensityPerCubicCentimetre;
        Assert.Equal(-10, x[0], 1e-12);
        Assert.Equal(38, x[^1], 1e-9);
        Assert.Equal(0, u[0]); // the gauge: U = 0 at the outer end of the left buffer
        // All electrons from the reported density equal the sheet: trapezoid rule, O(h²) ≈ 1e-3 relative at 0.05 nm.
        Assert.Equal(1e12 * 1e-14, Trapezoid(x, n) * 1e-21, 2e-3 * 1e12 * 1e-14);
        // Gauss's law (J. D. Jackson, Classical Electrodynamics, 3rd ed., §1.3) in the energy form ε_r dU/dz |_a^b =
        // (e/ε₀)(∫(N_D − n)dz + sheets) from the left barrier (2 nm, before the sheet) to the barrier before the well (8 nm: the
        // sheet's whole charge, less the few electrons there) and across the well into the right barrier (26 nm: nearly neutral);
        // both sides are second-order approximations at h = 0.05 nm, hence 1 % (as for the periodic cell).
        double Flux(int i) => 12.2 * (u[i + 1] - u[i]) / (x[i + 1] - x[i]);
        var a = Index(x, 2);
        var fluxA = Flux(a);
        var inside = 0.0;
        foreach (var end in new[] { 8.0, 26 })
        {
            var b = Index(x, end);
            double za = 0.5 * (x[a] + x[a + 1]), zb = 0.5 * (x[b] + x[b + 1]);
            var expected = ChargeOverPermittivity * (1e12 * 1e-14 - TrapezoidBetween(x, n, za, zb) * 1e-21);
            output.WriteLine($"[2, {end}] nm: flux jump {Flux(b) - fluxA} eV, enclosed (e/eps0) Q = {expected} eV");
            Assert.Equal(expected, Flux(b) - fluxA, 1e-2 * Math.Abs(expected));
            inside = Math.Max(inside, Math.Abs(Flux(b)));
        }
        // No field through the domain's ends (the boundary condition): the end intervals' flux, set only by the charge of the
        // end node's half volume, where n is below 1e-6 of its peak, is below 1e-6 of the flux inside.
        Assert.True(Math.Abs(12.2 * (u[1] - u[0]) / (x[1] - x[0])) < 1e-6 * inside);
        Assert.True(Math.Abs(12.2 * (u[^1] - u[^2]) / (x[^1] - x[^2])) < 1e-6 * inside);
        // Electrons sit in the well and the sheet is positive (d²U/dz² ∝ N_D − n; common practice, no single source).
        Assert.True(Interpolate(x, u, 14) > Interpolate(x, u, 5));
        Assert.True(Interpolate(x, n, 14) > 100 * Interpolate(x, n, 5));
    }

    [Fact]
    public void SolveStack_VanishingDoping_ReproducesRigidLevels()
    {
        // 1e6 cm⁻³ in both wells of a double well gives U of order (e/ε₀)N·L²/ε ≈ 1e-11 eV across the 75 nm domain: the levels
        // must be the rigid stack's. The rigid levels come from the closed-form layers, the self-consistent ones from sampled
        // segments and the lead buffers; Magnus steps are exact for a constant potential, so 1e-9 eV (the required agreement)
        // leaves only U itself and rounding.
        var rigid = LayerStack.Create(Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09)),
            Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09)), L(6, 0, 0.067), L(3, 0.3, 0.09), L(6, 0, 0.067));
        var doped = DopedStack.Create(rigid, [[LayerDoping.Create(1e6, 0, 12.9)], [LayerDoping.Undoped(12.2)], [LayerDoping.Create(1e6, 0, 12.9)]],
            Temperature.FromKelvin(77), 12.2, 12.2);
        var result = SpaceChargeSolver.SolveStack(doped);
        output.WriteLine(result.ToString());
        var exact = BoundStateSpectrum.Find(rigid);
        var self = BoundStateSpectrum.Find(result.Stack);
        Assert.Equal(exact.TotalCount, self.TotalCount);
        for (var k = 0; k < exact.Levels.Count; k++)
        {
            Assert.Equal(exact.Levels[k].EnergyElectronVolts, self.Levels[k].EnergyElectronVolts, 1e-9);
        }
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9);
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
    }

    [Fact]
    public void SolveStack_AgainstFiniteDifferenceReference_AgreeAsGridsRefine()
    {
        // An independent finite-difference Schrödinger–Poisson solver of the same closed domain (TestHelpers/
        // FiniteDifferenceSchrodingerPoisson, closed: three-point operator, dense symmetric eigenproblem by MathNet, ψ = 0 at the
        // ends, no-flux Poisson by dense Newton). Both are second order in h; each pair of grids is extrapolated (Richardson) to
        // h → 0 and the limits compared, as for the periodic cell. E₁ of the library is its self-consistent stack's lowest level
        // between open leads, of the reference its lowest box state: they differ by the level's leak through 20 nm of barrier and
        // buffer, e^(−2κ·20 nm) ≈ 1e-13 relative.
        var doped = ModulationDopedWell();
        var layers = new List<FiniteDifferenceSchrodingerPoisson.LayerSpec>
        {
            new(10, 0.25, 0.092, 12.2, 0, 0), new(10, 0.25, 0.092, 12.2, 0, 1e12), new(8, 0, 0.067, 12.9, 0, 0), new(10, 0.25, 0.092, 12.2, 0, 0),
            new(10, 0.25, 0.092, 12.2, 0, 0),
        };
        double[] grids = [0.2, 0.1];
        var library = new (double Drop, double Fermi)[2];
        var reference = new (double Drop, double Fermi)[2];
        for (var g = 0; g < grids.Length; g++)
        {
            var h = grids[g];
            var result = SpaceChargeSolver.SolveStack(doped, SpaceChargeOptions.Create(maxGridSpacingNanometres: h, leadBufferNanometres: 10));
            library[g] = Observables(result);
            var fd = new FiniteDifferenceSchrodingerPoisson(layers, h, 77, phases: 1, bands: result.OccupiedStates + 5, closed: true);
            fd.Solve();
            reference[g] = (fd.Hartree[(int)Math.Round(24 / h)] - fd.Hartree[(int)Math.Round(15 / h)], fd.FermiLevel - fd.LowestEnergy);
            output.WriteLine($"h = {h} nm: library drop {library[g].Drop:R} eV, mu - E1 {library[g].Fermi:R} eV; reference drop {reference[g].Drop:R}, mu - E1 {reference[g].Fermi:R}");
        }
        static double Richardson(double coarse, double fine) => (4 * fine - coarse) / 3;
        double libraryDrop = Richardson(library[0].Drop, library[1].Drop), referenceDrop = Richardson(reference[0].Drop, reference[1].Drop);
        double libraryFermi = Richardson(library[0].Fermi, library[1].Fermi), referenceFermi = Richardson(reference[0].Fermi, reference[1].Fermi);
        output.WriteLine($"extrapolated: drop {libraryDrop:R} vs {referenceDrop:R} (diff {libraryDrop - referenceDrop:E2}); mu - E1 {libraryFermi:R} vs {referenceFermi:R} (diff {libraryFermi - referenceFermi:E2})");
        // The raw differences shrink with h (the difference of two O(h²) schemes).
        Assert.True(Math.Abs(library[1].Fermi - reference[1].Fermi) < Math.Abs(library[0].Fermi - reference[0].Fermi));
        // Extrapolated limits agree to 2e-5 eV: the O(h⁴) remainder of each extrapolation from 0.2 and 0.1 nm.
        Assert.Equal(referenceDrop, libraryDrop, 2e-5);
        Assert.Equal(referenceFermi, libraryFermi, 2e-5);
    }

    [Fact]
    public void SolveStack_LeadBuffer_HoldsTheLeadsBulkDensityAndBarelyMovesTheWell()
    {
        // The closed box stands for the open leads. Here the left lead's edge lies only about 10 k_BT above μ (the sheet's field
        // lifts the well by ~0.11 eV), so the left buffer's continuum states hold electrons: far from the wall (ψ = 0 within a
        // thermal length ħ/√(2mk_BT) ≈ 8 nm) and from the well, the density must be the lead's three-dimensional
        // non-degenerate density at the self-consistent μ, n = N_c F_{1/2}((μ − V − U)/k_BT) (Blakemore), to 3 % (the box
        // states' energy spacing, ~1e-3 k_BT, and the well's tail). Each further 20 nm of buffer then adds 20 nm of that density,
        // to 5 %: an undoped lead at this μ has no bounded equilibrium, and the box is what makes the problem finite. Its
        // effect on the well, measured here, stays below 5e-6 eV per doubling of the buffer (the grid's O(h²) error is ~1e-5 eV).
        const double mass = 0.092, lead = 0.25;
        var kT = KB * 77;
        var results = new[] { 20.0, 40 }.Select(b => SpaceChargeSolver.SolveStack(ModulationDopedWell(), SpaceChargeOptions.Create(leadBufferNanometres: b))).ToArray();
        var wide = results[1];
        double BufferElectrons(SelfConsistentStack r) => TrapezoidBetween(r.PositionsNanometres, r.ElectronDensityPerCubicCentimetre, -r.BufferNanometres, 0) * 1e-7; // cm⁻²
        var x = wide.PositionsNanometres;
        var expected = BulkElectronDensity(mass, kT, (wide.FermiLevelElectronVolts - lead - Interpolate(x, wide.HartreeElectronVolts, -20)) / kT);
        var density = Interpolate(x, wide.ElectronDensityPerCubicCentimetre, -20);
        var added = BufferElectrons(wide) - BufferElectrons(results[0]);
        output.WriteLine($"n(-20 nm) = {density:E4} cm-3, bulk {expected:E4}; buffer electrons {BufferElectrons(results[0]):E4} -> {BufferElectrons(wide):E4} cm-2 (added {added:E4}, bulk x 20 nm {expected * 20e-7:E4})");
        Assert.Equal(expected, density, 0.03 * expected);
        Assert.Equal(expected * 20e-7, added, 0.05 * expected * 20e-7);
        var (drop20, fermi20) = Observables(results[0]);
        var (drop40, fermi40) = Observables(wide);
        output.WriteLine($"buffer 20 nm: drop {drop20:R} eV, mu - E1 {fermi20:R} eV; 40 nm: drop {drop40:R} eV, mu - E1 {fermi40:R} eV");
        Assert.Equal(drop20, drop40, 5e-6);
        Assert.Equal(fermi20, fermi40, 5e-6);
    }

    [Fact]
    public void SolveStack_RepeatedCell_MiddlePeriodApproachesTheSuperlattice()
    {
        // A stack of many periods of a modulation-doped cell between leads of its barrier: far from the ends each period sees
        // the infinite superlattice's potential (common practice, no single source: screening confines the ends' disturbance
        // to a few periods). The middle period's Hartree drop (well middle minus sheet) matches the periodic solver's to 1 %
        // with 9 periods; the grids are identical (both 0.1 nm, nodes at the interfaces), so the rest is the ends' influence.
        var cell = ModulationDoped(sheet: 2e12, temperature: 77);
        var periodic = SpaceChargeSolver.Solve(cell);
        double periodicDrop = Interpolate(periodic.PositionsNanometres, periodic.HartreeElectronVolts, 8)
            - Interpolate(periodic.PositionsNanometres, periodic.HartreeElectronVolts, 14);
        const int periods = 9;
        var stack = DopedStack.Create(LayerStack.Periodic(BarrierLead, cell.Cell, periods, BarrierLead), [cell.Doping], cell.Temperature, 12.2, 12.2);
        var result = SpaceChargeSolver.SolveStack(stack);
        var start = (periods / 2) * cell.Cell.Period.Nanometres;
        double drop = Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, start + 8)
            - Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, start + 14);
        output.WriteLine($"periodic drop {periodicDrop:R} eV, middle period of {periods}: {drop:R} eV; {result}");
        Assert.Equal(periodicDrop, drop, 1e-2 * Math.Abs(periodicDrop));
        Assert.True(result.NeutralityError <= 1e-10);
    }

    [Fact]
    public void SolveStack_BudgetTooSmall_ThrowsSpaceChargeException()
    {
        var error = Assert.Throws<SpaceChargeException>(() => SpaceChargeSolver.SolveStack(ModulationDopedWell(), SpaceChargeOptions.Create(maxIterations: 1)));
        Assert.Equal(1, error.Iterations);
        Assert.Contains("not reached", error.Message);
    }

    [Fact]
    public void SolveStack_Cancelled_Throws()
    {
        using var source = new CancellationTokenSource();
        source.Cancel();
        Assert.ThrowsAny<OperationCanceledException>(() => SpaceChargeSolver.SolveStack(ModulationDopedWell(), cancellationToken: source.Token));
    }

    [Fact]
    public void SolveStack_ReportsProgressEveryIteration()
    {
        var reports = new List<SpaceChargeProgress>();
        var result = SpaceChargeSolver.SolveStack(ModulationDopedWell(), progress: new SynchronousProgress(reports));
        Assert.Equal(result.Iterations, reports.Count);
        Assert.Equal(result.ResidualElectronVolts, reports[^1].ResidualElectronVolts);
    }
}
