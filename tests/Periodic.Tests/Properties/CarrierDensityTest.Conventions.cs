// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Units;
using static Periodic.Tests.TestHelpers.Checks;

namespace Periodic.Tests.Properties;

/// <summary>Carrier densities and Fermi levels from 0 K to very high temperature: finite, monotonic, documented errors.</summary>
public sealed partial class CarrierDensityTest
{
    private static readonly BandProperties Many = BandProperties.Create(BandStructure.Compute(Fixtures.Cell, 60));

    [Fact]
    public void CarrierDensities_FromZeroToVeryHighTemperature()
    {
        var p = Many;
        var e1 = p.Structure.GetBand(1).BottomElectronVolts;
        var cases = 0;
        foreach (var t in new[] { 0.0, 1e-3, 4.2, 77, 300, 1000, 3000 })
        {
            var previous = -1.0;
            foreach (var mu in new[] { e1 - 0.3, e1 - 0.01, e1, e1 + 0.02, 0.2, 0.5 })
            {
                var n = p.LinearCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t));
                Finite(n.DensityPerNanometre, $"n({mu}, {t} K)");
                Finite(n.ErrorEstimatePerNanometre, "error");
                Assert.True(n.DensityPerNanometre >= 0);
                // n(μ) is non-decreasing (f rises with μ; common practice). Slack: the error estimates.
                Assert.True(n.DensityPerNanometre >= previous - 1e-12, $"n fell at mu = {mu}, T = {t}");
                previous = n.DensityPerNanometre;
                if (t == 0)
                {
                    // Documented: at T = 0 the occupation is a step and n = N(μ); the quadrature is exact up to rounding (1e-12 relative).
                    Assert.Equal(p.IntegratedDensityOfStatesPerNanometre(mu), n.DensityPerNanometre, 1e-12 * Math.Max(1, n.DensityPerNanometre));
                }
                var v = p.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(t), EffectiveMass.FromElectronMasses(0.067));
                Finite(v.DensityPerCubicNanometre, "n3D");
                Assert.True(v.DensityPerCubicNanometre >= 0);
                cases++;
            }
            // Round trip through the Fermi-level search (Brent): n(μ*) reproduces the target to the reported residual.
            var target = p.LinearCarrierDensity(Energy.FromElectronVolts(e1 + 0.02), Temperature.FromKelvin(t)).DensityPerNanometre;
            var solution = p.FermiLevelForLinearDensity(target, Temperature.FromKelvin(t));
            Finite(solution.FermiLevelElectronVolts, "mu*");
            Finite(solution.RelativeDensityResidual, "residual");
            Assert.True(solution.Converged, solution.ToString());
            var back = p.LinearCarrierDensity(Energy.FromElectronVolts(solution.FermiLevelElectronVolts), Temperature.FromKelvin(t)).DensityPerNanometre;
            // 1e-9 relative: the tolerance 1e-12 eV times dn/dμ / n, which is at most ~1e3 /eV near the band bottom.
            Assert.Equal(target, back, 1e-9 * target);
        }
        output.WriteLine($"carrier densities: {cases} (mu, T) cases");
    }

    [Fact]
    public void CarrierDensities_RejectBadInputNamingTheParameter()
    {
        var p = Fixtures.Properties;
        foreach (var bad in new[] { double.NaN, double.PositiveInfinity, -1.0 })
        {
            Assert.Equal("kelvin", Assert.ThrowsAny<ArgumentException>(() => p.LinearCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(bad))).ParamName);
            Assert.Equal("kelvin", Assert.ThrowsAny<ArgumentException>(() => p.SuperlatticeCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(bad), EffectiveMass.FromElectronMasses(0.067))).ParamName);
            Assert.Equal("densityPerNanometre", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForLinearDensity(bad, Temperature.FromKelvin(300))).ParamName);
            Assert.Equal("densityPerCubicNanometre", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForSuperlatticeDensity(bad, Temperature.FromKelvin(300), EffectiveMass.FromElectronMasses(0.067))).ParamName);
        }
        Assert.Equal("electronVolts", Assert.ThrowsAny<ArgumentException>(() => p.LinearCarrierDensity(Energy.FromElectronVolts(double.NaN), Temperature.FromKelvin(300))).ParamName);
        Assert.Equal("inPlaneMass", Assert.ThrowsAny<ArgumentException>(() => p.SuperlatticeCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(300), default)).ParamName);
        Assert.Equal("absoluteToleranceElectronVolts", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForLinearDensity(0.1, Temperature.FromKelvin(300), FermiLevelOptions.Create(0))).ParamName);
        // Very high T needs bands that were not computed: a documented ArgumentOutOfRangeException, not a wrong number.
        Assert.ThrowsAny<ArgumentOutOfRangeException>(() => p.LinearCarrierDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(1e5)));
        // A density above what the computed bands can hold.
        Assert.ThrowsAny<ArgumentOutOfRangeException>(() => p.FermiLevelForLinearDensity(1e6, Temperature.FromKelvin(300)));
    }
}
