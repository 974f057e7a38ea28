// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

// A uniform medium written as a periodic structure must reproduce the free-carrier results exactly:
// E = V + C k^2 / m with C = hbar^2/2m0, folded into the first zone. The 1D density of states with
// spin is g(E) = (1/pi) sqrt(m / (C (E - V))) per eV per nm (J. H. Davies, The Physics of
// Low-Dimensional Semiconductors, CUP 1998, sec. 1.7 / eq. 1.105, from memory), and below V the wave
// decays with kappa = sqrt(m (V - E) / C) (elementary quantum mechanics).
public sealed class DosCommandTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double V = 0.1;
    private const double M = 0.067;
    private const double D = 4.0;

    private static string UniformFile() => ToolRunner.TempFile(
        string.Create(CultureInfo.InvariantCulture, $$"""{"name": "uniform", "cell": [{"width": {{D}}, "potential": {{V}}, "mass": {{M}}}]}"""));

    [Fact]
    public void Dos_UniformMedium_MatchesFreeCarrierFormulas()
    {
        var energies = new[] { 0.103, 0.115, 0.14, 0.19, 0.26, 0.33, 0.47 };
        var run = ToolRunner.Invoke("dos", UniformFile(), "--energies", string.Join(",", energies.Select(e => e.ToString("R", CultureInfo.InvariantCulture))), "--json");
        Assert.Equal(0, run.ExitCode);
        var points = run.Json().GetProperty("points");
        Assert.Equal(energies.Length, points.GetArrayLength());
        for (var i = 0; i < energies.Length; i++)
        {
            var p = points[i];
            var k = Math.Sqrt(M * (energies[i] - V) / C);
            var phase = (k * D) % (2 * Math.PI);
            phase = phase > Math.PI ? 2 * Math.PI - phase : phase;
            // Away from the folding points (|sin kd| > 0.05) the acos/sin route loses at most
            // ~1e-15/0.05 relative; 1e-9 is a generous bound that still catches any formula slip.
            Assert.True(Math.Abs(Math.Sin(phase)) > 0.05, "test energies avoid zone points");
            Assert.Equal(energies[i], p.GetProperty("energy").GetDouble());
            Assert.Equal(Math.Sqrt(M / (C * (energies[i] - V))) / Math.PI, p.GetProperty("dos").GetDouble(), 1e-9 * p.GetProperty("dos").GetDouble());
            Assert.Equal(phase / D, p.GetProperty("wavevector").GetDouble(), 1e-9 * phase / D);
            Assert.Equal(0.0, p.GetProperty("decay").GetDouble());
            Assert.Equal(2 * C * k / M, Math.Abs(p.GetProperty("slope").GetDouble()), 1e-9 * 2 * C * k / M);
        }
    }

    [Fact]
    public void Dos_BelowThePotential_IsZeroAndDecays()
    {
        var run = ToolRunner.Invoke("dos", UniformFile(), "--from", "0", "--to", "0.09", "--points", "4", "--json");
        Assert.Equal(0, run.ExitCode);
        var points = run.Json().GetProperty("points");
        Assert.Equal(4, points.GetArrayLength());
        foreach (var p in points.EnumerateArray())
        {
            var e = p.GetProperty("energy").GetDouble();
            var kappa = Math.Sqrt(M * (V - e) / C);
            Assert.Equal(0.0, p.GetProperty("dos").GetDouble());
            Assert.Equal(0.0, p.GetProperty("slope").GetDouble());
            // kappa d >= 1.4 here, where arcosh is well conditioned: 1e-10 relative.
            Assert.Equal(kappa, p.GetProperty("decay").GetDouble(), 1e-10 * kappa);
        }
        Assert.Equal("1/(eV nm)", run.Json().GetProperty("units").GetProperty("dos").GetString());
    }

    [Fact]
    public void Dos_Json_MatchesLibrary()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("dos", file, "--from", "0.02", "--to", "0.6", "--points", "30", "--json");
        Assert.Equal(0, run.ExitCode);
        var properties = Periodic.Properties.BandProperties.Create(
            Periodic.Bands.BandStructure.ComputeBelow(Periodic.Serialization.StructureFile.Load(file).Cell, Energy.FromElectronVolts(0.6)));
        foreach (var p in run.Json().GetProperty("points").EnumerateArray())
        {
            var e = p.GetProperty("energy").GetDouble();
            var k = properties.Structure.WavevectorAt(e);
            // Shortest round-trip JSON: the tool's numbers are the library's, bit for bit.
            Assert.Equal(properties.DensityOfStatesPerElectronVoltNanometre(e), p.GetProperty("dos").GetDouble());
            Assert.Equal(k.RealPerNanometre, p.GetProperty("wavevector").GetDouble());
            Assert.Equal(k.ImaginaryPerNanometre, p.GetProperty("decay").GetDouble());
            Assert.Equal(k.IsPropagating ? properties.GroupVelocityAtEnergy(e).SlopeElectronVoltNanometres : 0.0, p.GetProperty("slope").GetDouble());
        }
    }

    [Fact]
    public void Dos_Grid_IncludesBothEnds()
    {
        var run = ToolRunner.Invoke("dos", ToolRunner.Example("superlattice.json"), "--from", "0.01", "--to", "0.5", "--points", "50", "--csv");
        Assert.Equal(0, run.ExitCode);
        var rows = run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(51, rows.Length);
        Assert.StartsWith("energy (eV),dos (1/(eV nm))", rows[0], StringComparison.Ordinal);
        // Full round-trip precision: the grid ends are written exactly as given.
        Assert.StartsWith("0.01,", rows[1], StringComparison.Ordinal);
        Assert.StartsWith("0.5,", rows[50], StringComparison.Ordinal);
    }
}
