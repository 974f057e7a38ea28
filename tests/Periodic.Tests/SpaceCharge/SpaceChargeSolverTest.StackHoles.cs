// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.SpaceCharge;

/// <summary>Holes of valence bands as carriers of a finite doped stack.</summary>
public sealed partial class SpaceChargeSolverTest
{
    private static readonly Lead HeavyHoleBarrierLead = Lead.Create(Energy.FromElectronVolts(0.15), EffectiveMass.FromElectronMasses(0.55));

    private static readonly Lead LightHoleBarrierLead = Lead.Create(Energy.FromElectronVolts(0.15), EffectiveMass.FromElectronMasses(0.1));

    /// <summary>
    /// A p-type modulation-doped single well between barrier leads (a scenario of our own): a 6 nm barrier, a 4 nm barrier with
    /// acceptors (6 … 10 nm), a 2 nm spacer, an 8 nm GaAs-like well (12 … 20 nm) and a 10 nm barrier; heavy and light holes.
    /// </summary>
    private static DopedStack PModulationDopedWell(double acceptors = 5e18)
    {
        double[] widths = [6, 4, 2, 8, 10];
        bool[] well = [false, false, false, true, false];
        LayerStack Build(Lead lead, double barrier, double barrierMass, double wellMass) => LayerStack.Create(lead, lead,
            [.. widths.Select((w, i) => (StackPart)(well[i] ? L(w, 0, wellMass) : L(w, barrier, barrierMass)))]);
        return DopedStack.Create(Build(BarrierLead, 0.25, 0.092, 0.067),
            [.. widths.Select((_, i) => (IReadOnlyList<LayerDoping>)[LayerDoping.Create(0, i == 1 ? acceptors : 0, well[i] ? 12.9 : 12.2)])],
            Temperature.FromKelvin(77), 12.2, 12.2,
            [StackValenceBand.Create(Build(HeavyHoleBarrierLead, 0.15, 0.55, 0.5), Energy.FromElectronVolts(-1.52), "heavy holes"),
             StackValenceBand.Create(Build(LightHoleBarrierLead, 0.15, 0.1, 0.08), Energy.FromElectronVolts(-1.52), "light holes")]);
    }

    [Fact]
    public void SolveStack_PModulationDopedWell_NeutralConvergedAndGauss()
    {
        var result = SpaceChargeSolver.SolveStack(PModulationDopedWell(), SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.05, leadBufferNanometres: 10));
        output.WriteLine(result.ToString());
        // Neutrality of the whole domain to 1e-10 relative, the required accuracy.
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        Assert.True(result.ResidualElectronVolts <= SpaceChargeOptions.DefaultToleranceElectronVolts);
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        var p = result.HoleDensityPerCubicCentimetre;
        var n = result.ElectronDensityPerCubicCentimetre;
        // Every acceptor is ionised (full ionisation): the holes equal N_A times 4 nm, by the trapezoid rule (O(h²) ≈ 1e-3
        // relative at 0.05 nm, as for electrons).
        var sheet = 5e18 * 4e-7;
        Assert.Equal(sheet, Trapezoid(x, p) * 1e-7, 2e-3 * sheet);
        // Gauss's law (J. D. Jackson, Classical Electrodynamics, 3rd ed., §1.3) in the energy form ε_r dU/dz |_a^b =
        // (e/ε₀)∫_a^b (p − n − N_A) dz across the acceptor layer (3 … 11 nm, the whole layer and few holes) and across it and the
        // well (3 … 24 nm, nearly neutral); both sides second order at h = 0.05 nm, hence 1 % (as for electrons).
        double Flux(int i) => 12.2 * (u[i + 1] - u[i]) / (x[i + 1] - x[i]);
        var a = Index(x, 3);
        foreach (var end in new[] { 11.0, 24 })
        {
            var b = Index(x, end);
            double za = 0.5 * (x[a] + x[a + 1]), zb = 0.5 * (x[b] + x[b + 1]);
            var enclosed = (TrapezoidBetween(x, p, za, zb) - TrapezoidBetween(x, n, za, zb)) * 1e-21 - 5e18 * 1e-21 * 4;
            var expected = ChargeOverPermittivity * enclosed;
            output.WriteLine($"[3, {end}] nm: flux jump {Flux(b) - Flux(a)} eV, enclosed (e/eps0) Q = {expected} eV");
            Assert.Equal(expected, Flux(b) - Flux(a), 1e-2 * Math.Abs(expected) + 1e-6);
        }
        // Holes gather in the well, which lowers the electron potential energy there below the acceptor layer's (common
        // practice, no single source: d²U/dz² ∝ ρ).
        Assert.True(Interpolate(x, u, 16) < Interpolate(x, u, 8), $"U(well) = {Interpolate(x, u, 16)}, U(acceptors) = {Interpolate(x, u, 8)}");
        Assert.True(TrapezoidBetween(x, p, 12, 20) * 1e-7 > 0.5 * sheet);
        Assert.Equal(2, result.ValenceStacks.Count);
    }

    [Theory]
    [InlineData(0)] // full ionisation
    [InlineData(0.026)] // an acceptor level 26 meV above the valence-band edge: incompletely ionised at 77 K
    public void SolveStack_PTypeRepeatedCell_MiddlePeriodApproachesTheSuperlattice(double acceptorLevel)
    {
        // As for n-type: far from the ends each period of many sees the infinite superlattice's potential (common practice, no
        // single source). The middle period's Hartree drop (well middle minus barrier middle) of 5 periods matches the periodic
        // solver's to 1 % (the tolerance of the electron case); the grids are identical (0.1 nm, nodes at the interfaces). 12 k
        // nodes per band and 10 nm lead buffers keep the test quick: neither moves the drop by more than 1e-5 relative.
        var cell = PModulationDoped();
        if (acceptorLevel > 0)
        {
            // The periodic solver's incomplete ionisation is checked against the charge balance solved independently
            // (Solve_AcceptorLevel_MatchesChargeBalanceSolvedIndependently); here the stack must follow it.
            cell = DopedCell.Create(cell.Cell, [.. cell.Doping.Select(d => d.AcceptorsPerCubicNanometre > 0 ? d.WithAcceptorIonisationEnergy(Energy.FromElectronVolts(acceptorLevel)) : d)],
                cell.Temperature, cell.ValenceBands);
        }
        var periodic = SpaceChargeSolver.Solve(cell, SpaceChargeOptions.Create(wavevectorNodes: 12));
        double periodicDrop = Interpolate(periodic.PositionsNanometres, periodic.HartreeElectronVolts, 8)
            - Interpolate(periodic.PositionsNanometres, periodic.HartreeElectronVolts, 0);
        const int periods = 5;
        var leads = new[] { HeavyHoleBarrierLead, LightHoleBarrierLead };
        var stack = DopedStack.Create(LayerStack.Periodic(BarrierLead, cell.Cell, periods, BarrierLead), [cell.Doping], cell.Temperature, 12.2, 12.2,
            [.. cell.ValenceBands.Select((b, i) => StackValenceBand.Create(LayerStack.Periodic(leads[i], b.Cell, periods, leads[i]), Energy.FromElectronVolts(b.EdgeElectronVolts), b.Name))]);
        var result = SpaceChargeSolver.SolveStack(stack, SpaceChargeOptions.Create(leadBufferNanometres: 10));
        var start = (periods / 2) * cell.Cell.Period.Nanometres;
        double drop = Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, start + 8)
            - Interpolate(result.PositionsNanometres, result.HartreeElectronVolts, start);
        output.WriteLine($"periodic drop {periodicDrop:R} eV, middle period of {periods}: {drop:R} eV; {result}");
        Assert.True(periodicDrop < 0); // holes in the well: the electron potential energy is lowest there
        Assert.Equal(periodicDrop, drop, 1e-2 * Math.Abs(periodicDrop));
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
    }

    [Fact]
    public void SolveStack_VanishingAcceptors_ReproducesRigidLevelsOfBothCarriers()
    {
        // 1e6 cm⁻³ of acceptors (and the intrinsic carriers of a 1.5 eV gap at 300 K, about 1e6 cm⁻³) give a Hartree potential
        // of order 1e-11 eV across the domain: the electron and hole levels must be the rigid stacks' to 1e-9 eV (the required
        // agreement; Magnus steps are exact for a constant potential, so only U and rounding remain).
        var electronLead = Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09));
        var holeLead = Lead.Create(Energy.FromElectronVolts(0.15), EffectiveMass.FromElectronMasses(0.55));
        var rigid = LayerStack.Create(electronLead, electronLead, L(6, 0, 0.067), L(3, 0.3, 0.09), L(6, 0, 0.067));
        var holes = LayerStack.Create(holeLead, holeLead, L(6, 0, 0.5), L(3, 0.15, 0.55), L(6, 0, 0.5));
        var doped = DopedStack.Create(rigid, [[LayerDoping.Create(0, 1e6, 12.9)], [LayerDoping.Undoped(12.2)], [LayerDoping.Create(0, 1e6, 12.9)]],
            Temperature.FromKelvin(300), 12.2, 12.2, [StackValenceBand.Create(holes, Energy.FromElectronVolts(-1.5), "heavy holes")]);
        var result = SpaceChargeSolver.SolveStack(doped);
        output.WriteLine(result.ToString());
        Assert.True(result.HartreeElectronVolts.Max(Math.Abs) < 1e-9);
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        foreach (var (exactStack, selfStack) in new[] { (rigid, result.Stack), (holes, result.ValenceStacks[0]) })
        {
            var exact = BoundStateSpectrum.Find(exactStack);
            var self = BoundStateSpectrum.Find(selfStack);
            Assert.Equal(exact.TotalCount, self.TotalCount);
            for (var k = 0; k < exact.Levels.Count; k++)
            {
                Assert.Equal(exact.Levels[k].EnergyElectronVolts, self.Levels[k].EnergyElectronVolts, 1e-9);
            }
        }
    }

    [Fact]
    public void SolveStack_NTypeWithValenceBands_BitForBitElectronsAlone()
    {
        // In the n-type modulation-doped well at 77 K the valence band lies about 1.5 eV (230 k_BT) below μ: its holes hold no
        // state (below e^-40) and the solution must be exactly the electrons' alone, bit for bit (the same states in the same order).
        var alone = SpaceChargeSolver.SolveStack(ModulationDopedWell());
        var input = ModulationDopedWell();
        var holeLead = Lead.Create(Energy.FromElectronVolts(0.15), EffectiveMass.FromElectronMasses(0.55));
        var holes = LayerStack.Create(holeLead, holeLead, L(10, 0.15, 0.55), L(8, 0, 0.5), L(10, 0.15, 0.55));
        var withHoles = SpaceChargeSolver.SolveStack(DopedStack.Create(input.Stack, input.PartDoping, input.Temperature, 12.2, 12.2,
            [StackValenceBand.Create(holes, Energy.FromElectronVolts(-1.52), "heavy holes")]));
        Assert.Equal(alone.FermiLevelElectronVolts, withHoles.FermiLevelElectronVolts);
        Assert.Equal(alone.Iterations, withHoles.Iterations);
        Assert.Equal(alone.NeutralityError, withHoles.NeutralityError);
        Assert.Equal(alone.OccupiedStates, withHoles.OccupiedStates);
        Assert.Equal(alone.HartreeElectronVolts, withHoles.HartreeElectronVolts);
        Assert.Equal(alone.ElectronDensityPerCubicCentimetre, withHoles.ElectronDensityPerCubicCentimetre);
        Assert.All(withHoles.HoleDensityPerCubicCentimetre, p => Assert.Equal(0, p));
    }
}
