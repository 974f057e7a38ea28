// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Text.Json;
using MathNet.Numerics.Integration;
using MathNet.Numerics.RootFinding;
using Periodic.Serialization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

/// <summary>A stack between thick n⁺ contact layers: the tool's one Fermi level is the contacts' bulk Fermi level.</summary>
public sealed class SpaceChargeContactsTest
{
    private static string Example => ToolRunner.Example("contact-doped-double-barrier.json");

    private static double Interpolate(JsonElement positions, JsonElement values, double x)
    {
        var i = 0;
        while (positions[i + 1].GetDouble() < x)
        {
            i++;
        }
        double x0 = positions[i].GetDouble(), x1 = positions[i + 1].GetDouble();
        return values[i].GetDouble() + (x - x0) / (x1 - x0) * (values[i + 1].GetDouble() - values[i].GetDouble());
    }

    [Fact]
    public void Levels_ThickDopedContacts_FermiLevelIsTheContactsBulkValue()
    {
        var run = ToolRunner.Invoke("levels", Example, "--json");
        Assert.Equal(0, run.ExitCode);
        var sc = run.Json().GetProperty("selfConsistent");
        Assert.True(sc.GetProperty("converged").GetBoolean());
        Assert.True(sc.GetProperty("neutralityError").GetDouble() <= 1e-10); // the required neutrality
        // The contacts' GaAs: band edge and mass from the file's leads (the same material), temperature from the file.
        var structure = StructureFile.Load(Example);
        var lead = structure.Stack!.LeftLead;
        var kT = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * 77;
        // The bulk η of the contacts' doping, n = N_c F_{1/2}(η) = N_D with N_c = 2(m k_BT/2πħ²)^{3/2} (J. S. Blakemore,
        // Semiconductor Statistics, 1962, ch. 3 [from memory]; S. M. Sze, Physics of Semiconductor Devices, ch. 1): F_{1/2} by
        // MathNet's Gauss–Legendre rule (t = v², to 60 k_BT above the edge), η by MathNet's Brent root finder.
        var nc = 2 * Math.Pow(lead.Mass.ElectronMasses * kT / (4 * Math.PI * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2), 1.5) * 1e21;
        double Density(double eta) => nc * 2 / Math.Sqrt(Math.PI) * GaussLegendreRule.Integrate(v => 2 * v * v / (1 + Math.Exp(v * v - eta)), 0, Math.Sqrt(60 + eta), 256);
        var bulk = Brent.FindRoot(eta => Density(eta) / 1e18 - 1, -30, 30, 1e-13);
        var hartree = sc.GetProperty("hartree");
        var mu = sc.GetProperty("fermiLevel").GetDouble();
        // The contacts' middles: 40 nm and 141 nm from the rigid stack's left interface (80 nm contacts, 21 nm between them).
        foreach (var middle in new[] { 40.0, 141 })
        {
            var eta = (mu - lead.Potential.ElectronVolts - Interpolate(hartree.GetProperty("positions"), hartree.GetProperty("values"), middle)) / kT;
            // Measured: 2.4e-3 below the bulk η (16 µeV) on both sides: the in-plane mass of the closed domain's states averages in
            // the barriers' share, and the ends' tails (see SpaceChargeSolverTest.Contacts). 5e-3 k_BT = 33 µeV.
            Assert.Equal(bulk, eta, 5e-3);
            // n = N_D in the flat middle: measured 4.9e-4 below it (the same tails), hence 2e-3.
            Assert.Equal(1e18, Interpolate(sc.GetProperty("electronDensity").GetProperty("positions"), sc.GetProperty("electronDensity").GetProperty("values"), middle), 2e-3 * 1e18);
        }
    }
}
