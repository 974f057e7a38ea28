// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Serialization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class BandsCommandTest
{
    [Fact]
    public void Bands_Json_MatchesLibrary()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("bands", file, "--count", "5", "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var expected = BandStructure.Compute(StructureFile.Load(file).Cell, 5);
        var bands = json.GetProperty("bands");
        Assert.Equal(5, bands.GetArrayLength());
        for (var i = 0; i < 5; i++)
        {
            var band = bands[i];
            // JSON numbers are written shortest-round-trip, so the doubles must come back bit for bit.
            Assert.Equal(i + 1, band.GetProperty("index").GetInt32());
            Assert.Equal(expected.Bands[i].BottomElectronVolts, band.GetProperty("bottom").GetDouble());
            Assert.Equal(expected.Bands[i].TopElectronVolts, band.GetProperty("top").GetDouble());
            Assert.Equal(expected.Bands[i].WidthElectronVolts, band.GetProperty("width").GetDouble());
            var properties = Periodic.Properties.BandProperties.Create(expected);
            Assert.Equal(properties.BottomMass(i + 1).ElectronMasses, band.GetProperty("massAtBottom").GetDouble());
            Assert.Equal(properties.TopMass(i + 1).ElectronMasses, band.GetProperty("massAtTop").GetDouble());
            Assert.True(band.GetProperty("massAtBottom").GetDouble() > 0, "a band bottom is a minimum: positive mass");
            Assert.True(band.GetProperty("massAtTop").GetDouble() < 0, "a band top is a maximum: negative mass");
            var gap = json.GetProperty("gaps")[i];
            Assert.Equal(expected.Gaps[i].LowerElectronVolts, gap.GetProperty("bottom").GetDouble());
            Assert.Equal(expected.Gaps[i].UpperElectronVolts, gap.GetProperty("top").GetDouble());
        }
        Assert.Equal("eV", json.GetProperty("units").GetProperty("energy").GetString());
        Assert.Equal("m0", json.GetProperty("units").GetProperty("mass").GetString());
    }

    [Fact]
    public void Bands_UniformMedium_MassAtBottomIsTheLayerMass()
    {
        // A uniform medium described as a periodic one: band 1 starts at k = 0 with the free-carrier
        // dispersion E = V + (hbar^2/2m) k^2, so its band-edge mass is the layer mass (textbook
        // free-electron result, e.g. Kittel, Introduction to Solid State Physics, ch. 6).
        var file = ToolRunner.TempFile("""{"name": "uniform", "cell": [{"width": 4, "potential": 0.1, "mass": 0.067}]}""");
        var run = ToolRunner.Invoke("bands", file, "--count", "1", "--json");
        Assert.Equal(0, run.ExitCode);
        var mass = run.Json().GetProperty("bands")[0].GetProperty("massAtBottom").GetDouble();
        // The edge is found to ~1e-15 eV and D'(E) is smooth there: 1e-9 relative leaves ample margin.
        Assert.Equal(0.067, mass, 0.067 * 1e-9);
    }

    [Fact]
    public void Bands_KronigPenneyMass_MatchesCurvatureOfLibraryDispersion()
    {
        // Independent route to the same mass: the curvature of E(k) from the library's E(k) search,
        // m*/m0 = (hbar^2/2m0) * 2 / E''(0), by a central difference. The difference has O(h^2)
        // truncation error; with h = 1e-3 pi/d it is ~1e-6 relative, so 1e-4 is a safe tolerance.
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("bands", file, "--count", "1", "--json");
        var mass = run.Json().GetProperty("bands")[0].GetProperty("massAtBottom").GetDouble();
        var bands = BandStructure.Compute(StructureFile.Load(file).Cell, 1);
        var h = 1e-3 * Math.PI / bands.PeriodNanometres;
        var second = 2 * (bands.EnergyAt(1, h) - bands.EnergyAt(1, 0)) / (h * h);
        var expected = 2 * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 / second;
        Assert.Equal(expected, mass, Math.Abs(expected) * 1e-4);
    }

    [Fact]
    public void Bands_Table_IsAlignedWithUnitsInHeaders()
    {
        var run = ToolRunner.Invoke("bands", ToolRunner.Example("superlattice.json"), "--count", "3");
        Assert.Equal(0, run.ExitCode);
        var lines = run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var header = Array.FindIndex(lines, l => l.Contains("bottom (eV)", StringComparison.Ordinal));
        Assert.True(header >= 0, run.Stdout);
        Assert.Contains("(m0)", lines[header], StringComparison.Ordinal);
        Assert.Equal(3, lines.Length - header - 2);
        Assert.All(lines[(header + 1)..], l => Assert.Equal(lines[header].Length, l.Length));
    }

    [Fact]
    public void Bands_Csv_HasHeaderAndOneRowPerBand()
    {
        var file = ToolRunner.Example("delta-comb.json");
        var run = ToolRunner.Invoke("bands", file, "--count", "4", "--csv");
        Assert.Equal(0, run.ExitCode);
        var rows = run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(5, rows.Length);
        Assert.StartsWith("band,bottom (eV),top (eV)", rows[0], StringComparison.Ordinal);
        var expected = BandStructure.Compute(StructureFile.Load(file).Cell, 4);
        // The CSV carries F6 (1e-6 eV) rounding: compare to half a unit of the last digit.
        Assert.Equal(expected.Bands[3].BottomElectronVolts, double.Parse(rows[4].Split(',')[1], CultureInfo.InvariantCulture), 5e-7);
    }

    [Fact]
    public void NoArguments_PrintsTheBuiltInExampleTable()
    {
        var run = ToolRunner.Invoke();
        Assert.Equal(0, run.ExitCode);
        var example = ToolRunner.Invoke("example");
        var bands = BandStructure.Compute(StructureFile.Parse(example.Stdout, "example").Cell, 4);
        var lines = run.Stdout.Split('\n');
        foreach (var band in bands.Bands)
        {
            var row = Array.Find(lines, l => l.TrimStart().StartsWith(band.Index.ToString(CultureInfo.InvariantCulture) + " ", StringComparison.Ordinal));
            Assert.NotNull(row);
            Assert.Contains(band.BottomElectronVolts.ToString("F6", CultureInfo.InvariantCulture), row, StringComparison.Ordinal);
        }
        Assert.Equal(string.Empty, run.Stderr);
    }

    [Fact]
    public void Help_NamesTheToolAndEveryCommand()
    {
        var run = ToolRunner.Invoke("--help");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("periodic [command] [options]", run.Stdout, StringComparison.Ordinal);
        foreach (var command in new[] { "bands", "dispersion", "dos", "transmission", "plot", "example" })
        {
            Assert.Contains("  " + command + " ", run.Stdout, StringComparison.Ordinal);
        }
    }
}

public sealed class BandsSmoothTest
{
    [Fact]
    public void Bands_CosineLattice_AreMathieuCharacteristicValues()
    {
        // -C/m psi'' + V0 cos(2 pi x / d) psi = E psi becomes Mathieu's y'' + (a - 2q cos 2z) y = 0 with
        // z = pi x / d, a = E / eps, q = V0 / (2 eps), eps = (C/m)(pi/d)^2. Band edges are eps times the
        // characteristic values; for q = 1: a0 = -0.45513860, b1 = -0.11024882, a1 = 1.85910807,
        // b2 = 3.91702477 (Abramowitz and Stegun, Table 20.1; from memory).
        const double d = 4.0, m = 0.067;
        var eps = Periodic.Units.PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 / m * Math.Pow(Math.PI / d, 2);
        var v0 = 2 * eps;
        var file = ToolRunner.TempFile(System.FormattableString.Invariant(
            $$$"""{"name": "mathieu q=1", "cell": [{"fourier": {"period": {{{d}}}, "cosine": [{{{v0:R}}}], "mass": {{{m}}} } }]}"""));
        var run = ToolRunner.Invoke("bands", file, "--count", "2", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var bands = run.Json().GetProperty("bands");
        // Tolerance: the table's 8 decimals (half a unit: 5e-9 in a) plus the tool's step-halving refinement
        // of the smooth segment (1e-11 relative): 1e-8 * eps. (Without refinement, at the default 64 Magnus
        // steps, a0 is off by ~9e-7 relative: this test fails.)
        Assert.Equal(-0.45513860 * eps, bands[0].GetProperty("bottom").GetDouble(), 1e-8 * eps);
        Assert.Equal(-0.11024882 * eps, bands[0].GetProperty("top").GetDouble(), 1e-8 * eps);
        Assert.Equal(1.85910807 * eps, bands[1].GetProperty("bottom").GetDouble(), 1e-8 * eps);
        Assert.Equal(3.91702477 * eps, bands[1].GetProperty("top").GetDouble(), 1e-8 * eps);
        Assert.True(run.Json().GetProperty("accuracy").GetProperty("converged").GetBoolean());
    }
}
