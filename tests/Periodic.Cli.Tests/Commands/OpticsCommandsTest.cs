// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class OpticsCommandsTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private static string FiniteWell(double width, double depth, double mass) => ToolRunner.TempFile(string.Create(CultureInfo.InvariantCulture,
        $$"""{"name": "well", "cell": [{"width": {{width}}, "potential": 0, "mass": {{mass}}}], "stack": {"periods": 1, "leads": {"potential": {{depth}}, "mass": {{mass}}""") + "}}}");

    [Fact]
    public void Transitions_DeepWell_JsonNearInfiniteWellValues()
    {
        // A 10 nm well 50 eV deep is close to the infinite well: E_n = n²π²C/(mL²) (any QM text), z_12 = 16L/(9π²) and
        // f_12 = 256/(27π²) (/work/shared/REFERENCES.md, "Optical transitions"). The finite depth (κL ≈ 94) lengthens the well by
        // about 2/κ: lengths by ≈ 2 %, energies (∝ 1/L²) by ≈ 4 %, so 3 % and 6 %.
        const double width = 10, mass = 0.067;
        var run = ToolRunner.Invoke("transitions", FiniteWell(width, 50, mass), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var first = run.Json().GetProperty("transitions")[0];
        Assert.Equal(1, first.GetProperty("from").GetInt32());
        Assert.Equal(2, first.GetProperty("to").GetInt32());
        var e1 = C * Math.PI * Math.PI / (mass * width * width);
        Assert.Equal(3 * e1, first.GetProperty("energy").GetDouble(), 0.06 * 3 * e1);
        Assert.Equal(16 * width / (9 * Math.PI * Math.PI), first.GetProperty("dipole").GetDouble(), 0.03 * 1.8);
        Assert.Equal(256 / (27 * Math.PI * Math.PI), first.GetProperty("oscillatorStrength").GetDouble(), 0.03);
        Assert.True(first.GetProperty("resolved").GetBoolean());
    }

    [Fact]
    public void Transitions_Csv_RoundTripsDoubles()
    {
        var run = ToolRunner.Invoke("transitions", FiniteWell(8, 0.3, 0.067), "--csv");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = ToolRunner.Invoke("transitions", FiniteWell(8, 0.3, 0.067), "--json").Json().GetProperty("transitions")[0];
        var row = run.Stdout.Split('\n')[1].Split(',');
        // Shortest round-trip formatting: the CSV energy parses back to the JSON value exactly.
        Assert.Equal(json.GetProperty("energy").GetDouble(), double.Parse(row[2], CultureInfo.InvariantCulture));
    }

    [Fact]
    public void Transitions_Interband_GivesEdgeInNanometresAndMicrometres()
    {
        var run = ToolRunner.Invoke("transitions", ToolRunner.Example("infrared-well.json"), "--carrier", "interband", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var edge = run.Json().GetProperty("edge");
        Assert.Equal("e1-hh1", edge.GetProperty("transition").GetString());
        // λ = hc/E (CODATA 2018 exact h, c, e).
        var energy = edge.GetProperty("energy").GetDouble();
        Assert.Equal(6.62607015e-34 * 299792458 / (energy * 1.602176634e-19) * 1e9, edge.GetProperty("wavelength").GetDouble(), 1e-9);
        Assert.Equal(edge.GetProperty("wavelength").GetDouble() / 1000, edge.GetProperty("wavelengthMicrometres").GetDouble(), 1e-12);
        Assert.Contains("Excitons are not modelled", run.Json().GetProperty("model").GetString());
    }

    [Fact]
    public void Absorption_BadInput_ExitsTwoNamingOption()
    {
        var file = FiniteWell(8, 0.3, 0.067);
        var run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--linewidth", "-0.002");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--linewidth", run.Stderr);
        run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--temperature", "5000");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--temperature", run.Stderr);
        run = ToolRunner.Invoke("absorption", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--density", run.Stderr);
    }

    [Fact]
    public void Absorption_BadGrid_NamesTheOptionAndValue()
    {
        var file = FiniteWell(8, 0.3, 0.067);
        var run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--energies", "0.1,-0.1");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--energies: item 2 is -0.1 eV", run.Stderr);
        run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--from", "-0.1", "--to", "0.2", "--points", "3");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--from is -0.1 eV", run.Stderr);
        run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--points", "11");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--from and --to missing", run.Stderr);
    }

    [Fact]
    public void Absorption_FermiLevelAboveContinuum_WarningSaysAbove()
    {
        // The well's continuum starts at its 0.3 eV leads; a Fermi level of 1 eV lies 0.7 eV above it, not "within 5 kT".
        var run = ToolRunner.Invoke("absorption", FiniteWell(8, 0.3, 0.067), "--fermi", "1");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("lies 0.7 eV above the continuum edge 0.3 eV", run.Stderr);
        Assert.DoesNotContain("within 5 kT", run.Stderr);
    }

    [Fact]
    public void Absorption_DopedFile_DefaultsToItsSelfConsistentFermiLevel()
    {
        // The modulation-doped well holds the electrons of its two 5e11 cm^-2 donor sheets: absorption needs no --density, takes the
        // solution's Fermi level (the one levels reports) and finds about 1e12 cm^-2 in the bound levels (neutrality; the rest of
        // the closed domain's electrons sit in box states above the leads' edges, which absorption does not count).
        var example = ToolRunner.Example("modulation-doped-well.json");
        var levels = ToolRunner.Invoke("levels", example, "--json");
        var run = ToolRunner.Invoke("absorption", example, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.Equal(levels.Json().GetProperty("selfConsistent").GetProperty("fermiLevel").GetDouble(), json.GetProperty("fermiLevel").GetDouble());
        Assert.Equal("self-consistent", json.GetProperty("fermiLevelSource").GetString());
        Assert.Equal(77, json.GetProperty("temperature").GetDouble());
        Assert.Equal(1e12, json.GetProperty("density").GetDouble(), 0.01e12);
        // An undoped file still needs one of them.
        run = ToolRunner.Invoke("absorption", FiniteWell(8, 0.3, 0.067));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--density", run.Stderr);
    }

    [Fact]
    public void Transitions_WellFirstWithoutStack_SaysTheLeadsAreTheWell()
    {
        // Without a stack both leads are the first layer: here the well, so nothing is bound, and the refusal says why and what to give.
        var file = ToolRunner.TempFile("""{"name": "well first", "cell": [{"width": 5, "potential": 0, "mass": 0.067}, {"width": 20, "potential": 0.3, "mass": 0.067}]}""");
        foreach (var command in new[] { "transitions", "absorption" })
        {
            var run = ToolRunner.Invoke(command, file, "--density", "1e11");
            if (command == "transitions")
            {
                run = ToolRunner.Invoke(command, file);
            }
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("no bound state", run.Stderr);
            Assert.Contains("The file has no \"stack\", so both leads are like the cell's first layer (V = 0 eV)", run.Stderr);
            Assert.Contains("--lead-potential", run.Stderr);
            Assert.Single(run.Stderr.Trim().Split('\n'));
        }
        Assert.Equal(0, ToolRunner.Invoke("transitions", file, "--lead-potential", "0.3").ExitCode);
    }

    [Fact]
    public void Absorption_Help_OffersOnlyTheCarriersItTakes()
    {
        var run = ToolRunner.Invoke("absorption", "--help");
        Assert.Equal(0, run.ExitCode);
        Assert.DoesNotContain("interband", run.Stdout);
        Assert.Contains("interband", ToolRunner.Invoke("transitions", "--help").Stdout);
    }

    [Theory]
    [InlineData("transitions")]
    [InlineData("absorption")]
    public void CliDoc_SynopsisListsEveryOptionOfTheCommand(string command)
    {
        // docs/cli.md's command table is where a user looks first: its row names every option that --help lists (the options
        // every command takes, --help, --verbose and --no-space-charge, are described below the table).
        var row = File.ReadLines(Path.Combine(ToolRunner.RepositoryRoot, "docs", "cli.md")).Single(l => l.StartsWith($"| `{command} FILE", StringComparison.Ordinal));
        // The first cell: up to the first column bar that is not an escaped "\|" inside the synopsis.
        var synopsis = System.Text.RegularExpressions.Regex.Split(row, @"(?<!\\)\|")[1];
        var help = ToolRunner.Invoke(command, "--help").Stdout;
        var options = System.Text.RegularExpressions.Regex.Matches(help, @"^\s+(?:-\w, )?(--[a-z-]+)", System.Text.RegularExpressions.RegexOptions.Multiline)
            .Select(m => m.Groups[1].Value).Except(["--help", "--verbose", "--no-space-charge"]).ToList();
        Assert.NotEmpty(options);
        Assert.All(options, option => Assert.Contains(option, synopsis, StringComparison.Ordinal));
    }

    [Fact]
    public void TransitionsAndAbsorption_StackWithParts_UseTheFileStackAsLevelsDoes()
    {
        // The defect superlattice's stack is a spacer, 5 periods, a defect well, a layer and 5 periods (stack.parts): the optics
        // take that stack, with the same thickness and the same bound levels as levels, not periods of the bare cell.
        var file = ToolRunner.Example("defect-superlattice.json");
        var levels = ToolRunner.Invoke("levels", file, "--json").Json();
        var transitions = ToolRunner.Invoke("transitions", file, "--json");
        Assert.True(transitions.ExitCode == 0, transitions.Stderr);
        var stack = transitions.Json().GetProperty("stack");
        Assert.Equal(levels.GetProperty("stack").GetProperty("thickness").GetDouble(), stack.GetProperty("thickness").GetDouble());
        var expected = levels.GetProperty("levels").EnumerateArray().Select(l => l.GetProperty("energy").GetDouble()).ToArray();
        var found = transitions.Json().GetProperty("levels").EnumerateArray().Select(l => l.GetProperty("energy").GetDouble()).ToArray();
        Assert.Equal(expected.Length, found.Length);
        Assert.All(expected.Zip(found), pair => Assert.Equal(pair.First, pair.Second, 1e-9));
        var absorption = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--json");
        Assert.True(absorption.ExitCode == 0, absorption.Stderr);
        Assert.Equal(stack.GetProperty("thickness").GetDouble(), absorption.Json().GetProperty("thickness").GetDouble());
        // --periods still asks for N periods of the cell.
        var periods = ToolRunner.Invoke("transitions", file, "--periods", "3", "--json").Json();
        Assert.NotEqual(stack.GetProperty("thickness").GetDouble(), periods.GetProperty("stack").GetProperty("thickness").GetDouble());
    }

    [Fact]
    public void Absorption_SelfConsistentStack_AveragesAlphaOverTheFileStack()
    {
        // The self-consistent stack carries 30 nm of each lead inside its domain; alpha is still averaged over the file's 30 nm
        // stack, as with --no-space-charge, and alpha L = -ln(1 - absorbed per pass) (docs/optics.md, Absorption) holds with it.
        var example = ToolRunner.Example("modulation-doped-well.json");
        foreach (var extra in new[] { "--json", "--no-space-charge" })
        {
            var run = ToolRunner.Invoke("absorption", example, "--density", "1e12", "--json", extra);
            Assert.True(run.ExitCode == 0, run.Stderr);
            var json = run.Json();
            var thickness = json.GetProperty("thickness").GetDouble();
            Assert.Equal(30, thickness);
            var peak = json.GetProperty("points").EnumerateArray().MaxBy(p => p.GetProperty("alpha").GetDouble());
            var alphaL = peak.GetProperty("alpha").GetDouble() * thickness * 1e-7;
            Assert.Equal(-Math.Log(1 - peak.GetProperty("passAbsorption").GetDouble()), alphaL, 1e-12 * alphaL);
        }
    }

    [Theory]
    [InlineData("interband")]
    [InlineData("heavy-hole")]
    public void Transitions_OtherCarrierOfStackWithParts_RefusedInsteadOfAnotherStructure(string carrier)
    {
        // Another band is built as periods of the bare cell; for a stack with parts (the defect superlattice) that would be another
        // structure than the file's, so it is refused unless --periods asks for the periods explicitly.
        var run = ToolRunner.Invoke("transitions", ToolRunner.Example("defect-superlattice.json"), "--carrier", carrier);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"--carrier {carrier} is computed for periods of the cell", run.Stderr);
        Assert.Contains("give --periods N", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
    }

    [Fact]
    public void Transitions_NoBoundState_ExitsTwo()
    {
        var file = ToolRunner.TempFile("""{"name": "barrier", "cell": [{"width": 5, "potential": 0.3, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0, "mass": 0.067}}}""");
        var run = ToolRunner.Invoke("transitions", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("no bound state", run.Stderr);
        Assert.Single(run.Stderr.Trim().Split('\n'));
    }

    [Fact]
    public void Absorption_PlotsAndJson_PeakAtTransition()
    {
        var directory = Path.GetDirectoryName(FiniteWell(8, 0.3, 0.067))!;
        var file = FiniteWell(8, 0.3, 0.067);
        var picture = Path.Combine(directory, "alpha.svg");
        var levels = Path.Combine(directory, "levels.png");
        var run = ToolRunner.Invoke("absorption", file, "--density", "3e11", "--temperature", "10", "--json", "--plot", picture, "--plot-levels", levels);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.True(File.Exists(picture) && File.Exists(levels));
        var json = run.Json();
        var line = json.GetProperty("lines")[0];
        var peak = json.GetProperty("points").EnumerateArray().MaxBy(p => p.GetProperty("alpha").GetDouble());
        // The default grid has 400 points over the line ± 6 FWHM: the sampled peak lies within one grid step of the line.
        Assert.Equal(line.GetProperty("energy").GetDouble(), peak.GetProperty("energy").GetDouble(), 0.001);
    }

    [Fact]
    public void Absorption_PictureInMissingDirectory_NamesPlotAndLeavesNoOutFile()
    {
        var file = FiniteWell(8, 0.3, 0.067);
        var directory = Path.GetDirectoryName(file)!;
        var table = Path.Combine(directory, "alpha.csv");
        var picture = Path.Combine(directory, "alpha.png");
        var missing = Path.Combine(directory, "missing", "levels.svg");
        var run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--csv", "--out", table, "--plot", picture, "--plot-levels", missing);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--plot-levels", run.Stderr);
        Assert.DoesNotContain("--out", run.Stderr);
        Assert.False(File.Exists(table));
        Assert.False(File.Exists(picture));
        run = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--plot", directory + "/");
        Assert.Equal(2, run.ExitCode);
        Assert.StartsWith("periodic: error: --plot ", run.Stderr);
    }

    [Fact]
    public void Transitions_Bias_ReportsItAndShiftsSymmetricStackByHalf()
    {
        // A symmetric stack under a small bias eU: each level moves by −eU/2 to first order (Hellmann–Feynman with V = −eU·x/L,
        // the state's mean of x/L being 1/2 by symmetry) [derived]; the transition energy moves only at second order.
        var file = ToolRunner.TempFile("""{"name": "well", "cell": [{"width": 10, "potential": 0.3, "mass": 0.067}, {"width": 8, "potential": 0, "mass": 0.067}, {"width": 10, "potential": 0.3, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.3, "mass": 0.067}}}""");
        var flat = ToolRunner.Invoke("transitions", file, "--json");
        var biased = ToolRunner.Invoke("transitions", file, "--json", "--bias", "1e-6");
        Assert.True(biased.ExitCode == 0, biased.Stderr);
        Assert.Equal(1e-6, biased.Json().GetProperty("bias").GetDouble());
        var e0 = flat.Json().GetProperty("levels")[0].GetProperty("energy").GetDouble();
        var e1 = biased.Json().GetProperty("levels")[0].GetProperty("energy").GetDouble();
        // Second order ≈ (eU)²/E ≈ 1e-11 eV, and the level tolerance 1e-12 eV: 1e-10.
        Assert.Equal(e0 - 0.5e-6, e1, 1e-10);
        Assert.Equal("bound-bound", biased.Json().GetProperty("transitions")[0].GetProperty("kind").GetString());
        Assert.Contains("no space charge", biased.Json().GetProperty("model").GetString());
    }

    [Fact]
    public void Transitions_Continuum_SaysWhichStatesAreQuasiBoundAndOnWhatDomain()
    {
        // A 10 nm well between 8 nm barriers 0.5 eV high, leads at 0.06 eV: level 1 bound, the next well levels quasi-bound.
        var file = ToolRunner.TempFile("""{"name": "leaky", "cell": [{"width": 8, "potential": 0.5, "mass": 0.067}, {"width": 10, "potential": 0, "mass": 0.067}, {"width": 8, "potential": 0.5, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.06, "mass": 0.067}}}""");
        var run = ToolRunner.Invoke("transitions", file, "--json", "--continuum", "--margin", "15");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var kinds = run.Json().GetProperty("transitions").EnumerateArray().Select(t => t.GetProperty("kind").GetString()).ToList();
        Assert.Contains("bound-quasi-bound", kinds);
        Assert.Contains("quasi-bound-quasi-bound", kinds);
        var quasi = run.Json().GetProperty("transitions").EnumerateArray().First(t => t.GetProperty("kind").GetString() == "bound-quasi-bound");
        // The domain is the 26 nm stack plus the 15 nm margin of each lead, in the stack's frame.
        Assert.Equal(-15, quasi.GetProperty("domainStart").GetDouble(), 1e-12);
        Assert.Equal(26 + 15, quasi.GetProperty("domainEnd").GetDouble(), 1e-12);
        var csv = ToolRunner.Invoke("transitions", file, "--csv", "--continuum");
        Assert.Contains("quasi-bound-quasi-bound", csv.Stdout);
        Assert.Contains("domain start (nm)", csv.Stdout.Split('\n')[0]);
    }

    private const string BoundToContinuumWell =
        """{"name": "bound-to-continuum well", "temperature": "77 K", "cell": [{"material": "Al0.25Ga0.75As", "width": "30 nm"}, {"material": "GaAs", "width": "4.5 nm"}, {"material": "Al0.25Ga0.75As", "width": "30 nm"}]}""";

    [Fact]
    public void Transitions_UnresolvedContinuumLevel_EmptyCsvCellsAndNoInfiniteWidth()
    {
        // A 4.5 nm GaAs well in Al0.25Ga0.75As binds one level; the next lies just above the barriers as a broad transmission peak
        // (T stays above half on one side: no FWHM, JSON null) whose dipole depends on the domain (unresolved, JSON null).
        var file = ToolRunner.TempFile(BoundToContinuumWell);
        var json = ToolRunner.Invoke("transitions", file, "--continuum", "--json").Json();
        var transition = json.GetProperty("transitions")[0];
        Assert.False(transition.GetProperty("resolved").GetBoolean());
        Assert.Equal(System.Text.Json.JsonValueKind.Null, transition.GetProperty("dipole").ValueKind);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, json.GetProperty("levels")[1].GetProperty("width").ValueKind);
        // CSV: a number that does not exist is an empty cell (docs/cli.md, Output), never "n/a".
        var csv = ToolRunner.Invoke("transitions", file, "--continuum", "--csv");
        Assert.True(csv.ExitCode == 0, csv.Stderr);
        var row = csv.Stdout.Split('\n')[1].Split(',');
        Assert.Equal("bound-quasi-bound", row[7]);
        Assert.Equal(["", "", ""], row[4..7]);
        Assert.DoesNotContain("n/a", csv.Stdout);
        // Table: the level without a width says so instead of printing "Infinity".
        var table = ToolRunner.Invoke("transitions", file, "--continuum");
        Assert.DoesNotContain("Infinity", table.Stdout);
        Assert.Contains("2: 0.277", table.Stdout);
        Assert.Contains("no width: T stays above half its peak on a side", table.Stdout);
    }

    [Fact]
    public void TransitionsAndAbsorption_LevelFarAboveWellEdge_WarnAsLevelsDoes()
    {
        // The quasi-bound level at 0.277 eV lies 0.18 Eg above the GaAs edge (Eg = 1.508 eV at 77 K), beyond the parabolic mass's
        // 0.1 Eg (docs/materials.md): every command that reports such a level warns, on stderr and in structure.warnings.
        var file = ToolRunner.TempFile(BoundToContinuumWell);
        var run = ToolRunner.Invoke("transitions", file, "--continuum", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("Eg above the band edge of GaAs", run.Stderr);
        Assert.Contains(run.Json().GetProperty("structure").GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("E = 0.277", StringComparison.Ordinal));
        var absorption = ToolRunner.Invoke("absorption", file, "--continuum", "--density", "1e11", "--json");
        Assert.True(absorption.ExitCode == 0, absorption.Stderr);
        Assert.Contains(absorption.Json().GetProperty("structure").GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("E = 0.277", StringComparison.Ordinal));
        // The bound level alone (0.082 eV, 0.05 Eg) draws no warning.
        Assert.DoesNotContain("Eg above", ToolRunner.Invoke("transitions", file).Stderr);
    }

    [Fact]
    public void Transitions_ContinuumUnderBias_GivesLevelBetweenLeadEdgesWithWidth()
    {
        // A 10 nm well between 15 nm barriers 0.4 eV high: under eU = 0.25 eV the right lead's edge is at 0.15 eV and the third
        // well level (≈ 0.30 eV flat, moved down by about eU/2 [derived: first-order Stark shift of a centred level]) lies between
        // the edges: a quasi-bound level with a width, reached from the bound levels below; absorption takes it with --continuum.
        var file = ToolRunner.TempFile("""{"name": "tilted", "cell": [{"width": 15, "potential": 0.4, "mass": 0.067}, {"width": 10, "potential": 0, "mass": 0.067}, {"width": 15, "potential": 0.4, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.4, "mass": 0.067}}}""");
        var run = ToolRunner.Invoke("transitions", file, "--json", "--continuum", "--bias", "0.25");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var level = run.Json().GetProperty("levels").EnumerateArray().First(l => l.GetProperty("kind").GetString() == "quasi-bound");
        Assert.InRange(level.GetProperty("energy").GetDouble(), 0.15, 0.4);
        Assert.InRange(level.GetProperty("width").GetDouble(), 1e-9, 0.01);
        var number = level.GetProperty("level").GetInt32();
        Assert.Contains(run.Json().GetProperty("transitions").EnumerateArray(),
            t => t.GetProperty("to").GetInt32() == number && t.GetProperty("kind").GetString() == "bound-quasi-bound");
        var flat = ToolRunner.Invoke("transitions", file, "--json", "--bias", "0.25");
        Assert.DoesNotContain(flat.Json().GetProperty("levels").EnumerateArray(), l => l.GetProperty("kind").GetString() == "quasi-bound");
        var absorption = ToolRunner.Invoke("absorption", file, "--density", "1e11", "--temperature", "10", "--bias", "0.25", "--continuum", "--json");
        Assert.True(absorption.ExitCode == 0, absorption.Stderr);
    }

    [Fact]
    public void Transitions_BiasWithInterband_ExitsTwoNamingBias()
    {
        var run = ToolRunner.Invoke("transitions", ToolRunner.Example("infrared-well.json"), "--carrier", "interband", "--bias", "0.1");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--bias", run.Stderr);
        run = ToolRunner.Invoke("absorption", FiniteWell(8, 0.3, 0.067), "--density", "1e11", "--bias", "nan");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--bias", run.Stderr);
    }
}
