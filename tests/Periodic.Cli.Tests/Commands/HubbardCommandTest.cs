// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class HubbardCommandTest
{
    private static string Lattice(string body) => ToolRunner.TempFile("{\"name\": \"test lattice\", \"opticalLattice\": {" + body + "}}");

    [Fact]
    public void Hubbard_Json_IsInElectronVoltsAndMatchesLibrary()
    {
        // eV in JSON whatever the display unit, doubles round-tripped bit for bit.
        var file = ToolRunner.Example("rubidium-lattice.json");
        var run = ToolRunner.Invoke("hubbard", file, "--scattering-length", "100 a0", "--unit", "kHz", "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var lattice = StructureFile.Load(file).OpticalLattice!;
        var expected = HubbardParameters.Compute(lattice, TransverseConfinement.CubicLattice, HubbardParameters.BohrRadii(100));
        Assert.Equal(lattice.RecoilEnergy.ElectronVolts, json.GetProperty("recoilEnergy").GetDouble());
        var band = json.GetProperty("bands")[0];
        Assert.Equal(1, band.GetProperty("index").GetInt32());
        var hopping = band.GetProperty("hopping");
        Assert.Equal(3, hopping.GetArrayLength());
        for (var n = 0; n < 3; n++)
        {
            Assert.Equal(expected.Wannier.HoppingElectronVolts[n], hopping[n].GetDouble());
        }
        Assert.Equal(expected.Wannier.OnSiteIntegralPerNanometre, band.GetProperty("wannierIntegral").GetDouble());
        Assert.Equal(expected.InteractionElectronVolts, band.GetProperty("interaction").GetDouble());
        Assert.Equal("eV", json.GetProperty("units").GetProperty("energy").GetString());
        Assert.Equal(29.34, json.GetProperty("criticalRatio").GetDouble());
    }

    [Fact]
    public void Hubbard_DepthScan_TableAndCsv()
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var csv = ToolRunner.Invoke("hubbard", file, "-a", "5.3 nm", "--geometry", "tubes", "--transverse-frequency", "25000", "--depths", "4:12:4", "--csv");
        Assert.Equal(0, csv.ExitCode);
        var lines = csv.Stdout.Trim().Split('\n');
        Assert.Equal(4, lines.Length); // header + s = 4, 8, 12
        Assert.StartsWith("s (E_R)", lines[0], StringComparison.Ordinal);
        var table = ToolRunner.Invoke("hubbard", file, "-a", "100", "--depths", "5,10");
        Assert.Equal(0, table.ExitCode);
        Assert.Contains("(U/J)c = 29.34", table.Stdout, StringComparison.Ordinal);
        Assert.Contains("harmonic trap", table.Stdout, StringComparison.Ordinal); // the model's limits are stated
        Assert.DoesNotContain("0.000000", table.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Hubbard_Plot_WritesPng()
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var png = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "w.png");
        var run = ToolRunner.Invoke("hubbard", file, "-a", "100", "--plot", png);
        Assert.Equal(0, run.ExitCode);
        var bytes = File.ReadAllBytes(png);
        Assert.True(bytes.Length > 1000 && bytes[1] == (byte)'P' && bytes[2] == (byte)'N' && bytes[3] == (byte)'G');
    }

    [Theory]
    [InlineData("\"wavelength\": 1064, \"depth\": 0, \"species\": \"87Rb\"", "opticalLattice.depth")]
    [InlineData("\"wavelength\": 1064, \"depth\": -3, \"species\": \"87Rb\"", "opticalLattice.depth")]
    [InlineData("\"wavelength\": 1064, \"depth\": 10, \"species\": \"Rb88\"", "known species are")]
    [InlineData("\"wavelength\": 1064, \"depth\": 10", "species")]
    [InlineData("\"wavelength\": 1064, \"depth\": 1000, \"species\": \"87Rb\"", "opticalLattice.depth: s = 1000 E_R is too deep")]
    [InlineData("\"wavelength\": 1064, \"depth\": 10, \"species\": \"87Rb\", \"secondWave\": {\"wavelength\": 752.3, \"depth\": 1}", "not commensurate")]
    public void Hubbard_BadFile_ExitsTwoNamingTheField(string body, string expected)
    {
        var run = ToolRunner.Invoke("hubbard", Lattice(body), "-a", "100");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(expected, run.Stderr, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Stdout);
    }

    [Theory]
    [InlineData("--scattering-length", "nan", "--scattering-length")]
    [InlineData("--scattering-length", "1e400", "--scattering-length")]
    [InlineData("--depths", "5:1:1", "--depths")]
    [InlineData("--depths", "0,5", "--depths")]
    [InlineData("--geometry", "tubes", "--transverse-frequency")]
    [InlineData("--unit", "furlongs", "--unit")]
    [InlineData("--sites", "0", "--sites must be above 0 and at most 50")]
    [InlineData("--depths", "10,200", "--depths: s = 200 E_R is too deep for hubbard (at most 190 E_R)")]
    public void Hubbard_BadOption_ExitsTwoNamingTheOption(string option, string value, string expected)
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var run = option == "--scattering-length"
            ? ToolRunner.Invoke("hubbard", file, option, value)
            : ToolRunner.Invoke("hubbard", file, "-a", "100", option, value);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(expected, run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Hubbard_DepthScanWithSeveralBands_ExitsTwoInsteadOfIgnoringBands()
    {
        // A scan describes the lowest band only; --bands 2 was silently dropped.
        var run = ToolRunner.Invoke("hubbard", ToolRunner.Example("rubidium-lattice.json"), "-a", "100", "--depths", "5,10", "--bands", "2");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--bands 2 cannot be combined with --depths", run.Stderr, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Stdout);
    }

    [Fact]
    public void Hubbard_ShallowLatticeOrStrongInteraction_IsNotedUnderTheTable()
    {
        // |J2/J1| tends to 1/4 as s -> 0 (free atom: E = q² E_R has the Fourier coefficients J_n = 2(-1)^(n+1)/(π²n²) E_R)
        // and falls below 0.05 near s = 5; the one-band model needs U much smaller than the gap (docs/cold-atoms.md, Limits).
        var file = ToolRunner.Example("rubidium-lattice.json");
        var shallow = ToolRunner.Invoke("hubbard", file, "-a", "100", "--depths", "1,10");
        Assert.Equal(0, shallow.ExitCode);
        Assert.Contains("|J2/J1| is above 0.05 (up to 0.2) at s = 1 E_R:", shallow.Stdout, StringComparison.Ordinal);
        Assert.DoesNotContain("gap above (up to", shallow.Stdout, StringComparison.Ordinal);
        var deep = ToolRunner.Invoke("hubbard", file, "-a", "100", "--depths", "10,20");
        Assert.DoesNotContain("Note:", deep.Stdout, StringComparison.Ordinal);
        var strong = ToolRunner.Invoke("hubbard", file, "-a", "3000", "--depths", "10");
        Assert.Contains("|U| is above 0.1 of the gap above", strong.Stdout, StringComparison.Ordinal);
        Assert.Contains("at s = 10 E_R:", strong.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Hubbard_BandNotIsolated_ExitsTwoNamingBands()
    {
        // λ₂ = 2λ with s₂ = 0: the two-site cell's bands 1 and 2 touch (folded band), so band 1 is not isolated.
        var file = Lattice("\"wavelength\": 1064, \"depth\": 6, \"species\": \"87Rb\", \"secondWave\": {\"wavelength\": \"2128 nm\", \"depth\": 0}");
        var run = ToolRunner.Invoke("hubbard", file, "-a", "100");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--bands", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("not isolated", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Hubbard_MissingScatteringLengthOrNotALattice_ExitsTwo()
    {
        var missing = ToolRunner.Invoke("hubbard", ToolRunner.Example("rubidium-lattice.json"));
        Assert.Equal(2, missing.ExitCode);
        Assert.Contains("--scattering-length", missing.Stderr, StringComparison.Ordinal);
        var layers = ToolRunner.Invoke("hubbard", ToolRunner.Example("superlattice.json"), "-a", "100");
        Assert.Equal(2, layers.ExitCode);
        Assert.Contains("opticalLattice", layers.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Bands_LatticeFile_TableInRecoilEnergiesJsonInElectronVolts()
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var table = ToolRunner.Invoke("bands", file);
        Assert.Equal(0, table.ExitCode);
        Assert.Contains("bottom (E_R)", table.Stdout, StringComparison.Ordinal);
        Assert.DoesNotContain("0.000000", table.Stdout, StringComparison.Ordinal);
        var json = ToolRunner.Invoke("bands", file, "--json").Json();
        Assert.True(json.GetProperty("accuracy").GetProperty("converged").GetBoolean());
        var lattice = StructureFile.Load(file).OpticalLattice!;
        var expected = Periodic.Bands.SpectralBandStructure.Compute(lattice.Cell, 4).Bands.GetBand(1);
        Assert.Equal(expected.BottomElectronVolts, json.GetProperty("bands")[0].GetProperty("bottom").GetDouble());
        var dispersion = ToolRunner.Invoke("dispersion", file, "-k", "3");
        Assert.Equal(0, dispersion.ExitCode);
        Assert.Contains("q/k_L", dispersion.Stdout, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("\"depth\": 1e9", "opticalLattice.depth")]
    [InlineData("\"depth\": 10, \"secondWave\": {\"wavelength\": 2128, \"depth\": 2e5}", "opticalLattice.secondWave.depth")]
    public void Bands_LatticeDeeperThanTheFileLimit_IsRefusedNamingTheField(string depths, string field)
    {
        // 10^5 E_R (StructureFileLimits.MaxLatticeDepthRecoilEnergies): at s = 1e9 E(k) took 47 s and the plane-wave basis
        // stopped growing before the edges settled (once a null-reference failure).
        var file = Lattice("\"wavelength\": 1064, \"species\": \"87Rb\", " + depths);
        var run = ToolRunner.Invoke("bands", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(field + ": must be at most 100000 E_R", run.Stderr, StringComparison.Ordinal);
        Assert.Empty(run.Stdout);
    }

    [Fact]
    public void Hubbard_RatioToCritical_OnlyForTheLowestBandWithRepulsiveU()
    {
        // The critical (U/J)c values are the superfluid-Mott point of repulsive bosons in the lowest band at unit filling
        // (Kühner, White, Monien, PRB 61, 12474 (2000) in 1D); band 2's J1 is negative (a band's minimum alternates between k = 0
        // and the zone edge from band to band, Kohn, Phys. Rev. 115, 809 (1959)), so a ratio to that value is meaningless
        // there, as for U < 0.
        var file = ToolRunner.Example("rubidium-lattice.json");
        var csv = ToolRunner.Invoke("hubbard", file, "-a", "100", "--bands", "2", "--csv");
        Assert.Equal(0, csv.ExitCode);
        var lines = csv.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var column = Array.IndexOf(lines[0].Split(','), "(U/J)/(U/J)c");
        Assert.True(column > 0, lines[0]);
        Assert.NotEqual("", lines[1].Split(',')[column]);
        Assert.Equal("", lines[2].Split(',')[column]);
        var attractive = ToolRunner.Invoke("hubbard", file, "-a", "-100", "--json");
        Assert.Equal(0, attractive.ExitCode);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, attractive.Json().GetProperty("bands")[0].GetProperty("ratioToCritical").ValueKind);
        var table = ToolRunner.Invoke("hubbard", file, "-a", "100", "--bands", "2");
        Assert.Contains("n/a", table.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Dos_LatticeFile_SaysTheColumnsCountTwoStatesPerOrbital()
    {
        // A filled band holds one Bloch state per cell and internal state (Bloch's theorem: N cells, N wavevectors), so the
        // integrated column in the first gap is 2/d with the two spin states it counts, and 1/d for atoms in one state.
        var file = ToolRunner.Example("rubidium-lattice.json");
        var lattice = StructureFile.Load(file).OpticalLattice!;
        var bands = Periodic.Bands.SpectralBandStructure.Compute(lattice.Cell, 2).Bands;
        var gapMiddle = 0.5 * (bands.GetBand(1).TopElectronVolts + bands.GetBand(2).BottomElectronVolts);
        var run = ToolRunner.Invoke("dos", file, "--energies", gapMiddle.ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("count two states per orbital", run.Stdout, StringComparison.Ordinal);
        var d = lattice.LatticePeriod.Nanometres;
        Assert.Contains((1 / d).ToString("G6", System.Globalization.CultureInfo.InvariantCulture) + " /nm, one atom per site", run.Stdout, StringComparison.Ordinal);
        Assert.Contains((2 / d).ToString("G8", System.Globalization.CultureInfo.InvariantCulture), run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Hubbard_DepthScanPlot_DrawsParametersAgainstDepth()
    {
        var file = ToolRunner.Example("rubidium-lattice.json");
        var target = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "scan.svg");
        var run = ToolRunner.Invoke("hubbard", file, "-a", "100", "--depths", "4:20:4", "--plot", target);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var svg = File.ReadAllText(target);
        Assert.Contains("lattice depth s (E_R)", svg, StringComparison.Ordinal);
        Assert.Contains("J, U, gap above (E_R, log scale)", svg, StringComparison.Ordinal);
        Assert.Contains("U/J (log scale)", svg, StringComparison.Ordinal);
        Assert.Contains("(U/J)c = 29.34", svg, StringComparison.Ordinal); // 3D cubic, unit filling (Capogrosso-Sansone et al. 2007)
    }
}
