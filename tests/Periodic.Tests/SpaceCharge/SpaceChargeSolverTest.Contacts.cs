// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Tests.SpaceCharge;

/// <summary>Finite stacks between thick n-doped contact layers: the domain's one Fermi level is the contacts' bulk Fermi level.</summary>
public sealed partial class SpaceChargeSolverTest
{
    private const double ContactMass = 0.067;

    private static readonly Lead ContactLead = Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(ContactMass));

    /// <summary>
    /// A GaAs-like n⁺ contact (<paramref name="leftDonors"/> cm⁻³, <paramref name="contact"/> nm), a 10 nm undoped barrier 0.25 eV
    /// high of mass <paramref name="barrierMass"/>, and a second n⁺ contact (<paramref name="rightDonors"/>), between undoped
    /// leads of the contact material, at 77 K.
    /// </summary>
    private static DopedStack ContactStack(double leftDonors, double rightDonors, double contact, double barrierMass) => DopedStack.Create(
        LayerStack.Create(ContactLead, ContactLead, L(contact, 0, ContactMass), L(10, 0.25, barrierMass), L(contact, 0, ContactMass)),
        [[LayerDoping.Create(leftDonors, 0, 12.9)], [LayerDoping.Undoped(12.2)], [LayerDoping.Create(rightDonors, 0, 12.9)]],
        Temperature.FromKelvin(77), 12.9, 12.9);

    /// <summary>
    /// The bulk η = (μ − E_c)/k_BT of a three-dimensional electron gas of full-ionised donors, n = N_c F_{1/2}(η) = N_D (J. S.
    /// Blakemore, Semiconductor Statistics, 1962, ch. 3 [from memory]; S. M. Sze, Physics of Semiconductor Devices, ch. 1),
    /// solved here by MathNet's Brent root finder on the test's own F_{1/2} quadrature.
    /// </summary>
    private static double BulkEta(double donors, double kT) =>
        MathNet.Numerics.RootFinding.Brent.FindRoot(eta => BulkElectronDensity(ContactMass, kT, eta) / donors - 1, -30, 30, 1e-13);

    /// <summary>At the middle of a contact: η = (μ − E_c − U)/k_BT, n (cm⁻³), and |dU/dz| (eV/nm) over the grid interval there.</summary>
    private static (double Eta, double Density, double Field) ContactMiddle(SelfConsistentStack result, double middle)
    {
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        var i = Index(x, middle);
        return ((result.FermiLevelElectronVolts - Interpolate(x, u, middle)) / (KB * result.TemperatureKelvin),
            Interpolate(x, result.ElectronDensityPerCubicCentimetre, middle), Math.Abs((u[i + 1] - u[i]) / (x[i + 1] - x[i])));
    }

    /// <summary>The largest |dU/dz| over the domain, eV/nm: the scale the contacts' flat middles are measured against.</summary>
    private static double PeakField(SelfConsistentStack result)
    {
        var x = result.PositionsNanometres;
        var u = result.HartreeElectronVolts;
        return Enumerable.Range(0, x.Count - 1).Max(i => Math.Abs((u[i + 1] - u[i]) / (x[i + 1] - x[i])));
    }

    [Fact]
    public void SolveStack_ThickDopedContacts_FermiLevelIsTheContactsBulkFermiLevel()
    {
        // Two 80 nm n⁺ contacts (1e18 cm⁻³) around a 10 nm barrier at 77 K (degenerate: η ≈ 8). The domain's Fermi level is
        // fixed by its neutrality alone; a contact many screening lengths thick has a flat, neutral middle (common practice, no
        // single source), where the electrons must be the bulk gas of its doping: μ − E_c − U = η k_BT with N_c F_{1/2}(η) = N_D.
        // The barrier has the contacts' mass, so that nothing but the contacts' width separates their middles from the bulk
        // (a heavier barrier adds the in-plane-mass average of the closed domain's states, measured in the next test).
        var result = SpaceChargeSolver.SolveStack(ContactStack(1e18, 1e18, 80, ContactMass),
            SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.2, leadBufferNanometres: 10));
        output.WriteLine(result.ToString());
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
        var bulk = BulkEta(1e18, KB * 77);
        var peak = PeakField(result);
        foreach (var middle in new[] { 40.0, 130 })
        {
            var (eta, density, field) = ContactMiddle(result, middle);
            output.WriteLine($"contact middle {middle} nm: eta {eta:R} (bulk {bulk:R}, diff {eta - bulk:E3}); n {density:E7} cm-3 (N_D 1e18); |dU/dz| {field:E3} eV/nm (peak {peak:E3})");
            // Measured: η within 3.6e-5 of the bulk value, n = N_D to 1.6e-5, |dU/dz| 1.7e-6 eV/nm against a peak of 3.2e-3 (5e-4 of it): the
            // tails of the ends' disturbance (Friedel oscillations, decaying over ħv_F/2πk_BT ≈ 8 nm, 40 nm from each end). The
            // tolerances leave a factor 4 to 6 (a contact of 50 nm misses them: η off by 1e-2). The grid does not enter: 0.1 nm gives
            // the same to 1e-8 in η.
            Assert.Equal(bulk, eta, 2e-4);
            Assert.Equal(1e18, density, 1e-4 * 1e18);
            Assert.True(field < 2e-3 * peak, $"|dU/dz| = {field} eV/nm at the contact's middle, peak {peak}");
        }
    }

    [Fact]
    public void SolveStack_ContactsOfDifferentDoping_OneFermiLevelAndTheBuiltInPotential()
    {
        // Contacts of 1e18 and 2e17 cm⁻³ (120 nm each, the lighter doping screens over a longer length) around a barrier of a
        // heavier mass (0.092, AlGaAs-like). In equilibrium one Fermi level runs through the whole structure and each contact's
        // band edge sits its own bulk η k_BT below it, so the built-in potential between the contacts is (η_L − η_R)k_BT (the
        // contact potential of a junction; S. M. Sze, Physics of Semiconductor Devices, ch. 2 [from memory]).
        var result = SpaceChargeSolver.SolveStack(ContactStack(1e18, 2e17, 120, 0.092),
            SpaceChargeOptions.Create(maxGridSpacingNanometres: 0.2, leadBufferNanometres: 10));
        output.WriteLine(result.ToString());
        var kT = KB * 77;
        double bulkLeft = BulkEta(1e18, kT), bulkRight = BulkEta(2e17, kT);
        var (left, densityLeft, fieldLeft) = ContactMiddle(result, 60);
        var (right, densityRight, fieldRight) = ContactMiddle(result, 190);
        var x = result.PositionsNanometres;
        var builtIn = Interpolate(x, result.HartreeElectronVolts, 190) - Interpolate(x, result.HartreeElectronVolts, 60);
        output.WriteLine($"left eta {left:R} (bulk {bulkLeft:R}), n {densityLeft:E7}, |dU/dz| {fieldLeft:E3}; right eta {right:R} (bulk {bulkRight:R}), n {densityRight:E7}, |dU/dz| {fieldRight:E3}; built-in {builtIn:R} eV vs {(bulkLeft - bulkRight) * kT:R} eV");
        // Measured: η within 1.1e-3 (left) and 7e-6 (right) of the bulk values. The left offset is the in-plane mass of the
        // closed domain's states, 1/m∥ = ⟨ψ|1/m|ψ⟩: every state spreads over the whole domain and so averages in a share of the
        // barrier's mass, a 1/width effect (an 80 nm contact: 2.4e-3; 160 nm: 1.2e-3; a barrier of the contacts' mass: 3e-7 at
        // 160 nm). Hence 5e-3 in η, here 33 µeV.
        Assert.Equal(bulkLeft, left, 5e-3);
        Assert.Equal(bulkRight, right, 5e-3);
        Assert.Equal((bulkLeft - bulkRight) * kT, builtIn, 1e-2 * kT);
        // Measured: n = N_D to 3e-6 (left) and 2.2e-4 (right, its longer screening length leaves more of the ends' tails); the
        // built-in potential to 7.5e-6 eV (1.1e-3 k_BT, the left offset); |dU/dz| 1.4e-8 and 6.4e-7 eV/nm, at most 2e-4 of the peak
        // field (3.2e-3 eV/nm, the barrier's), hence 1e-3 of it.
        Assert.Equal(1e18, densityLeft, 1e-3 * 1e18);
        Assert.Equal(2e17, densityRight, 1e-3 * 2e17);
        var peak = PeakField(result);
        output.WriteLine($"peak |dU/dz| {peak:E3} eV/nm");
        Assert.True(fieldLeft < 1e-3 * peak && fieldRight < 1e-3 * peak, $"|dU/dz| {fieldLeft}, {fieldRight} eV/nm, peak {peak}");
        Assert.True(result.NeutralityError <= 1e-10, $"neutrality error {result.NeutralityError}");
    }
}
