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
        // Edges from 54 meV to 1 eV: the table chooses meV for every energy column (widths and gaps too).
        var header = Array.FindIndex(lines, l => l.Contains("bottom (meV)", StringComparison.Ordinal));
        Assert.Contains("width (meV)", lines[header], StringComparison.Ordinal);
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
        // The table's energy unit, from its header (eV or meV, chosen by the magnitudes).
        var scale = Array.Exists(lines, l => l.Contains("bottom (meV)", StringComparison.Ordinal)) ? 1e-3 : 1.0;
        Assert.True(scale == 1e-3 || Array.Exists(lines, l => l.Contains("bottom (eV)", StringComparison.Ordinal)), run.Stdout);
        foreach (var band in bands.Bands)
        {
            var row = Array.Find(lines, l => l.TrimStart().StartsWith(band.Index.ToString(CultureInfo.InvariantCulture) + " ", StringComparison.Ordinal));
            Assert.NotNull(row);
            // The table shows 7 significant digits of the largest edge: 1e-6 eV covers the rounding.
            var shown = double.Parse(row.Split(' ', StringSplitOptions.RemoveEmptyEntries)[1], CultureInfo.InvariantCulture);
            Assert.Equal(band.BottomElectronVolts, shown * scale, 1e-6);
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

    [Fact]
    public void Bands_Csv_EqualsJsonBitForBit()
    {
        var file = ToolRunner.Example("superlattice.json");
        var json = ToolRunner.Invoke("bands", file, "--count", "3", "--json").Json().GetProperty("bands");
        var rows = ToolRunner.Invoke("bands", file, "--count", "3", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("band,bottom (eV),top (eV),width (eV),m* bottom (m0),m* top (m0),gap above (eV),m∥ bottom (m0)", rows[0]);
        for (var n = 0; n < 3; n++)
        {
            var cells = rows[n + 1].Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray();
            Assert.Equal(json[n].GetProperty("bottom").GetDouble(), cells[1]);
            Assert.Equal(json[n].GetProperty("top").GetDouble(), cells[2]);
            Assert.Equal(json[n].GetProperty("width").GetDouble(), cells[3]);
            Assert.Equal(json[n].GetProperty("massAtBottom").GetDouble(), cells[4]);
            Assert.Equal(json[n].GetProperty("massAtTop").GetDouble(), cells[5]);
            Assert.Equal(json[n].GetProperty("inPlaneMassAtBottom").GetDouble(), cells[7]);
        }
    }

    [Fact]
    public void Bands_MaterialCell_ShowsLayerTableAndWarningsEverywhere()
    {
        var file = ToolRunner.Example("gaas-algaas.json");
        var table = ToolRunner.Invoke("bands", file);
        Assert.Equal(0, table.ExitCode);
        // The derived layer table: material, width, V, m*, non-parabolicity, band gap.
        Assert.Contains("Al0.3Ga0.7As", table.Stdout, StringComparison.Ordinal);
        Assert.Contains("Eg (eV)", table.Stdout, StringComparison.Ordinal);
        Assert.Contains("T = 77 K", table.Stdout, StringComparison.Ordinal);
        // The model's warnings on the band edges (single-band model poor far above the well's edge) reach stderr …
        Assert.Contains("parabolic mass is no longer reliable", table.Stderr, StringComparison.Ordinal);
        var json = ToolRunner.Invoke("bands", file, "--json").Json().GetProperty("structure");
        // … and the JSON, with the layers.
        Assert.Contains(json.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("parabolic mass is no longer reliable", StringComparison.Ordinal));
        var layers = json.GetProperty("layers").EnumerateArray().ToArray();
        Assert.Equal(2, layers.Length);
        Assert.Equal("GaAs", layers[0].GetProperty("material").GetString());
        // Vurgaftman et al. (2001): GaAs band gap at 77 K from Varshni, Eg = 1.519 − 0.5405e-3·77²/(77 + 204) eV.
        Assert.Equal(1.519 - 0.5405e-3 * 77 * 77 / (77 + 204), layers[0].GetProperty("bandGap").GetDouble(), 1e-12);
    }

    [Fact]
    public void Transmission_ManyEnergiesBeyondTheModelsLimit_WarnsOncePerLayer()
    {
        // A scan far above the well's edge: every point is beyond the single-band model's limit, but stderr says so once per
        // layer and kind, with the count, not once per point.
        var run = ToolRunner.Invoke("transmission", ToolRunner.Example("gaas-algaas.json"), "--periods", "3", "--from", "0.9", "--to", "1.2", "--points", "200");
        Assert.Equal(0, run.ExitCode);
        var lines = run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => l.Contains("no longer reliable", StringComparison.Ordinal)).ToArray();
        Assert.InRange(lines.Length, 1, 2); // at most one per layer of the two-layer cell
        Assert.Contains(lines, l => l.Contains("more results beyond it in the same layer", StringComparison.Ordinal));
        // The JSON holds the same grouped sentences, not one per point (10⁶ points once gave 870,000 strings).
        var json = ToolRunner.Invoke("transmission", ToolRunner.Example("gaas-algaas.json"), "--periods", "3", "--from", "0.9", "--to", "1.2", "--points", "200", "--json");
        Assert.Equal(0, json.ExitCode);
        var warnings = json.Json().GetProperty("structure").GetProperty("warnings").EnumerateArray()
            .Select(w => w.GetString()!).Where(w => w.Contains("no longer reliable", StringComparison.Ordinal)).ToArray();
        Assert.InRange(warnings.Length, 1, 2);
        Assert.Contains(warnings, w => w.Contains("more results beyond it in the same layer", StringComparison.Ordinal));
    }

    [Fact]
    public void EveryCommand_WritesNoParenthesisedPlurals()
    {
        var file = ToolRunner.Example("double-barrier-diode.json");
        foreach (var args in new[]
        {
            new[] { "bands", file }, ["transmission", file, "--from", "0.01", "--to", "0.3", "--points", "3"],
            ["current", file, "--bias", "0.1", "--temperature", "77", "--fermi-level", "0.02"], ["levels", file, "--lead-potential", "0.3"],
        })
        {
            var run = ToolRunner.Invoke(args);
            Assert.True(run.ExitCode == 0, run.Stderr);
            Assert.DoesNotContain("(s)", run.Stdout, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Bands_ColdAtomCell_TableInRecoilEnergiesIsReadable()
    {
        // ⁸⁷Rb (86.909 u, u/m_e = 1822.888 from CODATA 2018) in a 532 nm lattice (d = 266 nm), depth 5 E_R, as 64 sampled steps.
        var mass = 86.909180 * 1822.888486;
        var recoil = Math.Pow(6.62607015e-34 / (2 * Math.PI), 2) / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18 * Math.Pow(Math.PI / 266, 2) / mass;
        var layers = string.Join(",", Enumerable.Range(0, 64).Select(i =>
            string.Create(CultureInfo.InvariantCulture, $"{{\"width\": {266.0 / 64:R}, \"potential\": {5 * recoil * Math.Pow(Math.Sin(Math.PI * (i + 0.5) / 64), 2):R}, \"mass\": {mass:R}}}")));
        var file = ToolRunner.TempFile($"{{\"name\": \"rubidium lattice\", \"cell\": [{layers}]}}");
        var run = ToolRunner.Invoke("bands", file, "--count", "3");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("bottom (E_R)", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("recoil units", run.Stdout, StringComparison.Ordinal);
        var json = ToolRunner.Invoke("bands", file, "--count", "3", "--json").Json().GetProperty("bands");
        var lines = run.Stdout.Split('\n');
        for (var n = 0; n < 3; n++)
        {
            var row = Array.Find(lines, l => l.TrimStart().StartsWith((n + 1).ToString(CultureInfo.InvariantCulture) + " ", StringComparison.Ordinal))!;
            var shown = double.Parse(row.Split(' ', StringSplitOptions.RemoveEmptyEntries)[1], CultureInfo.InvariantCulture);
            var bottom = json[n].GetProperty("bottom").GetDouble();
            // Readable: the bottom in E_R to 7 significant digits of the column's largest value (a few E_R), not 0.000000.
            Assert.True(shown > 0.1, row);
            Assert.Equal(bottom / recoil, shown, 1e-5);
        }
    }

    [Theory]
    [InlineData("eV")]
    [InlineData("recoil")]
    [InlineData("kHz")]
    public void Bands_LatticeFileUnit_CsvIsJsonInThatUnitAtFullPrecision(string unit)
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var json = ToolRunner.Invoke("bands", file, "--json").Json();
        var csv = ToolRunner.Invoke("bands", file, "--unit", unit, "--csv");
        Assert.True(csv.ExitCode == 0, csv.Stderr);
        var lines = csv.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var symbol = unit == "recoil" ? "E_R" : unit;
        Assert.StartsWith($"band,bottom ({symbol}),top ({symbol}),width ({symbol})", lines[0], StringComparison.Ordinal);
        var lattice = StructureFile.Load(file).OpticalLattice!;
        // One unit in eV: E_R of the lattice, h x 1 kHz (E = h f), or 1.
        var divisor = unit switch { "recoil" => lattice.RecoilEnergy.ElectronVolts, "kHz" => Periodic.OpticalLattices.OpticalLattice.FromHertz(1e3).ElectronVolts, _ => 1.0 };
        for (var n = 0; n < 4; n++)
        {
            var bottom = json.GetProperty("bands")[n].GetProperty("bottom").GetDouble();
            // Shortest round-trip CSV: the quotient comes back bit for bit (with eV, the JSON value itself).
            Assert.Equal(bottom / divisor, double.Parse(lines[n + 1].Split(',')[1], CultureInfo.InvariantCulture));
        }
        var table = ToolRunner.Invoke("bands", file, "--unit", unit);
        Assert.Contains($"bottom ({symbol})", table.Stdout, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("superlattice.json", "eV", "--unit applies only to an optical-lattice file")]
    [InlineData("rubidium-lattice.json", "joule", "--unit \"joule\" is not known; use recoil (E_R, the default), kHz (E/h) or eV.")]
    public void Bands_BadUnit_ExitsTwoWithoutOutput(string example, string unit, string message)
    {
        var target = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "b.csv");
        var run = ToolRunner.Invoke("bands", ToolRunner.Example(example), "--unit", unit, "--csv", "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Bands_LatticeBeyondThePlaneWaveLimit_IsRefusedAtOnce()
    {
        // 199 bands are the plane-wave solver's limit (SpectralBandStructure.MaxBandCount); 200 would fall back to the
        // sampled-potential solver and run for many minutes. The 60 s limit of ToolRunner makes a hang fail here.
        var run = ToolRunner.Invoke("bands", ToolRunner.Example("rubidium-lattice.json"), "--count", "200");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("200 bands asked of an optical lattice", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("at most 199 bands", run.Stderr, StringComparison.Ordinal);
        Assert.Empty(run.Stdout);
    }

    [Fact]
    public void Bands_InPlaneMass_EqualsLibraryAndLiesBetweenLayerMasses()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("bands", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var bands = run.Json().GetProperty("bands");
        var expected = Periodic.Properties.InPlaneDispersion.MassesAtBottom(BandStructure.Compute(StructureFile.Load(file).Cell, 4), 4);
        for (var n = 0; n < 4; n++)
        {
            var m = bands[n].GetProperty("inPlaneMassAtBottom").GetDouble();
            Assert.Equal(expected[n].ElectronMasses, m); // bit for bit (shortest round-trip JSON)
            // Hellmann–Feynman: 1/m∥ = Σ P_layer/m_layer with Σ P = 1, so m∥ lies between the layer masses 0.067 and 0.092 [derived].
            Assert.InRange(m, 0.067, 0.092);
        }
        // Deeper bands leak more into the heavier barrier (its weight grows with energy): m∥ grows from band 1 to band 2 (common practice, no single source).
        Assert.True(bands[1].GetProperty("inPlaneMassAtBottom").GetDouble() > bands[0].GetProperty("inPlaneMassAtBottom").GetDouble());
        Assert.Contains("m∥ bottom (m0)", ToolRunner.Invoke("bands", file).Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Bands_InPlaneMassOfEqualMasses_IsThatMass()
    {
        // With one mass everywhere the in-plane motion separates: E = E_n(k_z) + ħ²k∥²/2m rigidly, so m∥ = m for every band
        // (separation of variables; any quantum-mechanics text). 1e-12 relative: Gauss–Legendre weights of a normalised state.
        var file = ToolRunner.TempFile("""{ "name": "equal masses", "cell": [ { "width": 5, "potential": 0, "mass": 0.08 }, { "width": 2, "potential": 0.3, "mass": 0.08 } ] }""");
        var run = ToolRunner.Invoke("bands", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        foreach (var band in run.Json().GetProperty("bands").EnumerateArray())
        {
            Assert.Equal(0.08, band.GetProperty("inPlaneMassAtBottom").GetDouble(), 1e-12 * 0.08);
        }
    }
}
