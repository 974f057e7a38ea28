// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Serialization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class CarriersCommandTest
{
    private static readonly double HbarSquaredOverTwoMe =
        Math.Pow(6.62607015e-34 / (2 * Math.PI), 2) / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18; // CODATA 2018, eV nm²

    // A "superlattice" without a potential: free electrons of mass 0.067 folded into a 10 nm zone.
    private const string FreeElectrons = """{ "name": "free electrons", "cell": [ { "width": 10, "potential": 0, "mass": 0.067 } ] }""";

    [Fact]
    public void Carriers_FreeElectronsAtZeroKelvin_MatchFermiSphere()
    {
        // Free-electron gas (Kittel, Introduction to Solid State Physics, ch. 6): n = k_F³/(3π²), k_F = √(2mE_F)/ħ.
        const double fermi = 0.05;
        var kF = Math.Sqrt(0.067 * fermi / HbarSquaredOverTwoMe);
        var expected = kF * kF * kF / (3 * Math.PI * Math.PI);
        var file = ToolRunner.TempFile(FreeElectrons);
        var run = ToolRunner.Invoke("carriers", file, "--fermi-level", "0.05", "--temperature", "0", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        // 1e-9 relative: the Gauss–Legendre panels integrate the folded parabola's (μ − E)₊ to rounding; the bound is the acceptance one.
        Assert.Equal(expected, json.GetProperty("density").GetDouble(), 1e-9 * expected);
        Assert.Equal(json.GetProperty("density").GetDouble() * 1e21, json.GetProperty("densityPerCm3").GetDouble(), 1e-3);
        // The exact in-plane integral: one mass everywhere, so it equals the one-mass value (separation of variables); 1e-9 relative
        // as for the exact density of states (mapped Gauss–Legendre rules, rounding-level crossings; measured 7e-16).
        var exact = json.GetProperty("exact");
        Assert.Equal(expected, exact.GetProperty("density").GetDouble(), 1e-9 * expected);
        Assert.InRange(exact.GetProperty("singleMassRelativeError").GetDouble(), -1e-9, 1e-9);

        // The other direction: the Fermi level for that density (given in 1/cm3) is E_F again.
        var back = ToolRunner.Invoke("carriers", file, "--density", (expected * 1e21).ToString("R", CultureInfo.InvariantCulture), "--temperature", "0", "--json");
        Assert.True(back.ExitCode == 0, back.Stderr);
        // 1e-9 relative: the Fermi level is solved to 1e-12 eV (BandProperties' default tolerance).
        Assert.Equal(fermi, back.Json().GetProperty("fermiLevel").GetDouble(), 1e-9 * fermi);
        var exactBack = back.Json().GetProperty("exact");
        Assert.True(exactBack.GetProperty("converged").GetBoolean());
        // The exact Fermi level for the density: n ∝ E_F^{3/2}, so a 1e-9 density residual moves E_F by less than 1e-9 relative.
        Assert.Equal(fermi, exactBack.GetProperty("fermiLevel").GetDouble(), 1e-9 * fermi);
    }

    [Fact]
    public void Carriers_JsonAtTemperature_EqualsLibraryBitForBit_AndCsvEqualsJson()
    {
        var file = ToolRunner.Example("superlattice.json");
        var json = ToolRunner.Invoke("carriers", file, "--fermi-level", "0.06", "--temperature", "77", "--json").Json();
        var bands = BandStructure.ComputeBelow(StructureFile.Load(file).Cell, Energy.FromElectronVolts(0.06 + 40 * 8.617333262e-5 * 77));
        var expected = BandProperties.Create(bands).SuperlatticeCarrierDensity(Energy.FromElectronVolts(0.06), Temperature.FromKelvin(77), EffectiveMass.FromElectronMasses(0.067));
        Assert.Equal(expected.DensityPerCubicNanometre, json.GetProperty("density").GetDouble());
        var csv = ToolRunner.Invoke("carriers", file, "--fermi-level", "0.06", "--temperature", "77", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        // The one-mass columns first, the exact ones appended.
        Assert.Equal("Fermi level (eV),T (K),density (1/cm3),error (1/cm3),in-plane mass (m0),exact Fermi level (eV),exact density (1/cm3),exact error (1/cm3),1-mass rel. error", csv[0]);
        Assert.Equal(json.GetProperty("densityPerCm3").GetDouble(), double.Parse(csv[1].Split(',')[2], CultureInfo.InvariantCulture));
    }

    [Theory]
    [InlineData(new[] { "--temperature", "77" }, "give exactly one of --fermi-level E (eV) and --density N (1/cm3).")]
    [InlineData(new[] { "--density", "-1", "--temperature", "77" }, "--density must be a positive density in 1/cm3; got -1.")]
    [InlineData(new[] { "--density", "1e17", "--temperature", "-3" }, "--temperature must be between 0 and 1000 K; got -3.")]
    [InlineData(new[] { "--density", "1e17", "--temperature", "77", "--in-plane-mass", "0" }, "--in-plane-mass must be a positive mass in m0 (at most 1e7); got 0.")]
    [InlineData(new[] { "--density", "1e17" }, "give --temperature K")]
    public void Carriers_BadInput_ExitsTwoNamingIt(string[] options, string message)
    {
        var file = ToolRunner.TempFile(FreeElectrons);
        var target = Path.Combine(Path.GetDirectoryName(file)!, "n.json");
        var run = ToolRunner.Invoke([.. new[] { "carriers", file, "--json", "--out", target }, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Dos_Volume_FreeElectronsFollowSquareRootLaw()
    {
        // Free-electron 3D density of states, spin included (Kittel ch. 6): g(E) = (1/2π²)(2m/ħ²)^{3/2} √E; its integral n(E) = k³/(3π²).
        var file = ToolRunner.TempFile(FreeElectrons);
        var run = ToolRunner.Invoke("dos", file, "--energies", "0.01,0.04,0.2", "--volume", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        foreach (var point in run.Json().GetProperty("points").EnumerateArray())
        {
            var e = point.GetProperty("energy").GetDouble();
            var k = Math.Sqrt(0.067 * e / HbarSquaredOverTwoMe);
            var g = Math.Pow(0.067 / HbarSquaredOverTwoMe, 1.5) * Math.Sqrt(e) / (2 * Math.PI * Math.PI);
            // 1e-9 relative: closed-form band counting of the folded parabola, rounding only.
            Assert.Equal(g, point.GetProperty("dos3d").GetDouble(), 1e-9 * g);
            Assert.Equal(k * k * k / (3 * Math.PI * Math.PI), point.GetProperty("integrated3d").GetDouble(), 1e-9 * k * k * k);
            // 1D integrated density: 2 states (spin) per 2π/L of k below E, i.e. N = 2k/π per nm [derived].
            Assert.Equal(2 * k / Math.PI, point.GetProperty("integrated").GetDouble(), 1e-9 * k);
        }
    }

    [Fact]
    public void Bloch_Json_EqualsLibraryBitForBit()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("bloch", file, "--band", "2", "--zone-fraction", "0.5", "--points", "9", "--periods", "2", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var bands = BandStructure.Compute(StructureFile.Load(file).Cell, 2);
        var bloch = BlochFunction.Create(bands, 2, 0.5 * Math.PI / bands.PeriodNanometres);
        var x = json.GetProperty("positions").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        Assert.Equal(14.0, x[^1]);
        double[] re = new double[9], im = new double[9], ure = new double[9], uim = new double[9];
        bloch.Evaluate(x, re, im);
        bloch.EvaluatePeriodicPart(x, ure, uim);
        Assert.Equal(bloch.EnergyElectronVolts, json.GetProperty("energy").GetDouble());
        Assert.Equal(re, json.GetProperty("psiReal").EnumerateArray().Select(v => v.GetDouble()).ToArray());
        Assert.Equal(im, json.GetProperty("psiImaginary").EnumerateArray().Select(v => v.GetDouble()).ToArray());
        Assert.Equal(ure, json.GetProperty("uReal").EnumerateArray().Select(v => v.GetDouble()).ToArray());
        // u is cell-periodic (Bloch's theorem): u(x + d) = u(x); 1e-12: rounding of e^{-ikx} at x = d.
        Assert.Equal(ure[0], ure[4], 1e-12);
        Assert.Equal(uim[0], uim[4], 1e-12);
        var csv = ToolRunner.Invoke("bloch", file, "--band", "2", "--zone-fraction", "0.5", "--points", "9", "--periods", "2", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(re[3], double.Parse(csv[4].Split(',')[1], CultureInfo.InvariantCulture));
    }

    [Theory]
    [InlineData(new[] { "--zone-fraction", "2" }, "--zone-fraction must be between -1 and 1; got 2.")]
    [InlineData(new[] { "--k", "5" }, "--k must lie in the first zone")]
    [InlineData(new[] { "--k", "0.1", "--zone-fraction", "0.1" }, "give either --k or --zone-fraction, not both.")]
    [InlineData(new[] { "--band", "0" }, "--band must be between 1 and 1000; got 0.")]
    [InlineData(new[] { "--points", "1" }, "--points must be between 2 and 1000000; got 1.")]
    public void Bloch_BadInput_ExitsTwoNamingIt(string[] options, string message)
    {
        var run = ToolRunner.Invoke([.. new[] { "bloch", ToolRunner.Example("superlattice.json") }, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Dos_VolumeExact_FreeElectronsFollowSquareRootLaw()
    {
        // Free electrons (Kittel ch. 6): g(E) = (1/2π²)(2m/ħ²)^{3/2} √E, n(E) = k³/(3π²). One mass everywhere, so the exact in-plane
        // integral must give the same as one in-plane mass (separation of variables): relative error of the single mass ≈ 0.
        var file = ToolRunner.TempFile(FreeElectrons);
        var run = ToolRunner.Invoke("dos", file, "--energies", "0.01,0.04,0.2", "--volume", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.True(run.Json().GetProperty("exactInPlane").GetBoolean());
        foreach (var point in run.Json().GetProperty("points").EnumerateArray())
        {
            var e = point.GetProperty("energy").GetDouble();
            var k = Math.Sqrt(0.067 * e / HbarSquaredOverTwoMe);
            var g = Math.Pow(0.067 / HbarSquaredOverTwoMe, 1.5) * Math.Sqrt(e) / (2 * Math.PI * Math.PI);
            var n = k * k * k / (3 * Math.PI * Math.PI);
            // 1e-9 relative: the mapped Gauss–Legendre rules integrate the folded parabola's square-root ends exactly up to rounding
            // and the band-edge crossings found by Brent's method to 1e-15; the reported error estimate must cover the deviation too.
            var dos = point.GetProperty("dos3dExact").GetDouble();
            Assert.Equal(g, dos, 1e-9 * g);
            // The reported error covers the quadrature only (fine minus coarse rule); the band edges' rounding, amplified near the
            // square-root ends, adds about 1e-13 relative (measured 1e-13 to 3e-13 here), hence the 1e-12 g beside it.
            Assert.True(Math.Abs(dos - g) <= point.GetProperty("dos3dExactError").GetDouble() + 1e-12 * g, "the error estimate and rounding bound the true error");
            Assert.Equal(n, point.GetProperty("integrated3dExact").GetDouble(), 1e-9 * n);
            Assert.InRange(point.GetProperty("dos3dSingleMassRelativeError").GetDouble(), -1e-9, 1e-9);
            Assert.InRange(point.GetProperty("integrated3dSingleMassRelativeError").GetDouble(), -1e-9, 1e-9);
        }
    }

    [Fact]
    public void Dos_VolumeExact_JsonEqualsLibraryBitForBit()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("dos", file, "--energies", "0.05,0.1", "--volume", "--in-plane-mass", "0.07", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var cell = StructureFile.Load(file).Cell;
        var mass = EffectiveMass.FromElectronMasses(0.07);
        foreach (var point in run.Json().GetProperty("points").EnumerateArray())
        {
            var e = point.GetProperty("energy").GetDouble();
            var g = InPlaneDensities.DensityOfStates(cell, e, mass);
            var n = InPlaneDensities.CarrierDensity(cell, Periodic.Units.Energy.FromElectronVolts(e), Periodic.Units.Temperature.FromKelvin(0), mass);
            Assert.Equal(g.ExactPerElectronVoltCubicNanometre, point.GetProperty("dos3dExact").GetDouble());
            Assert.Equal(g.ErrorEstimatePerElectronVoltCubicNanometre, point.GetProperty("dos3dExactError").GetDouble());
            Assert.Equal(g.RelativeErrorOfSingleMass, point.GetProperty("dos3dSingleMassRelativeError").GetDouble());
            Assert.Equal(n.ExactPerCubicNanometre, point.GetProperty("integrated3dExact").GetDouble());
            Assert.Equal(n.RelativeErrorOfSingleMass, point.GetProperty("integrated3dSingleMassRelativeError").GetDouble());
        }
        var csv = ToolRunner.Invoke("dos", file, "--energies", "0.05,0.1", "--volume", "--in-plane-mass", "0.07", "--csv").Stdout;
        Assert.Contains("dos3d exact (1/(eV nm3)),dos3d exact error (1/(eV nm3)),dos3d 1-mass rel. error", csv, StringComparison.Ordinal);
    }

    [Fact]
    public void Dos_VolumeBounds_RefusedBeforeWork()
    {
        var file = ToolRunner.Example("superlattice.json");
        var target = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "g.json");
        var run = ToolRunner.Invoke("dos", file, "--from", "0", "--to", "0.2", "--points", "2001", "--volume", "--json", "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("the number of energies with --volume must be between 1 and 2000; got 2001.", run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Dos_VolumeNonParabolic_GivesSingleMassAndSaysWhyNotExact()
    {
        var run = ToolRunner.Invoke("dos", ToolRunner.Example("nonparabolic.json"), "--energies", "0.05", "--volume", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.False(json.GetProperty("exactInPlane").GetBoolean());
        Assert.Contains("non-parabolic", json.GetProperty("exactInPlaneUnavailable").GetString(), StringComparison.Ordinal);
        Assert.False(json.GetProperty("points")[0].TryGetProperty("dos3dExact", out _));
        Assert.Contains("exact 3D values not computed", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Carriers_Exact_JsonEqualsLibraryBitForBit()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("carriers", file, "--fermi-level", "0.06", "--temperature", "77", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var exact = run.Json().GetProperty("exact");
        var expected = InPlaneDensities.CarrierDensity(StructureFile.Load(file).Cell, Periodic.Units.Energy.FromElectronVolts(0.06), Periodic.Units.Temperature.FromKelvin(77), EffectiveMass.FromElectronMasses(0.067));
        Assert.Equal(expected.ExactPerCubicNanometre, exact.GetProperty("density").GetDouble());
        Assert.Equal(expected.ErrorEstimatePerCubicNanometre, exact.GetProperty("errorEstimate").GetDouble());
        Assert.Equal(expected.RelativeErrorOfSingleMass, exact.GetProperty("singleMassRelativeError").GetDouble());
        // Heavier barriers add in-plane states: the well-mass approximation undercounts (the exact in-plane mass lies above 0.067;
        // common practice, no single source), so its relative error is negative.
        Assert.True(expected.RelativeErrorOfSingleMass < 0);
    }
}
