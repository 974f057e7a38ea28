// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text.RegularExpressions;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed partial class DesignCommandTest
{
    /// <summary>A design file adjusting the width of the single well of <see cref="WellStructure"/> between 2 and 12 nm.</summary>
    private static string WellDesign(double startWidth, string target, string extra = "") => ToolRunner.TempFile(
        $$"""{"structure": {{WellStructure(startWidth, 0.0)}}, "adjust": [{"field": "cell[0].width", "from": 2, "to": 12}], "targets": [{{target}}]{{extra}}""" + "}", "design.json");

    private static double Transition12(double width)
    {
        var levels = WellLevels(width, 0).Levels;
        return levels[1].EnergyElectronVolts - levels[0].EnergyElectronVolts;
    }

    [Fact]
    public void Design_UnreachableTransition_IsReportedNotReachedWithTheClosestDesign()
    {
        // 2.5 um (0.496 eV) is more than the 0.3 eV well can give: narrowing the well raises E2 − E1 until level 2 nears
        // the barrier top and then leaves the well (the finite-well picture, e.g. Bastard, Wave Mechanics Applied to
        // Semiconductor Heterostructures, ch. 1). On its way the optimiser tries widths with one level only; those are bad
        // points, not a failure, and it must stop at the widest transition the well has, reported as not reached.
        var run = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "transition1-2", "value": "2.5 um"}"""), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.False(json.GetProperty("converged").GetBoolean());
        var target = json.GetProperty("targets")[0];
        Assert.False(target.GetProperty("withinTolerance").GetBoolean());
        var width = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        var reached = target.GetProperty("reached").GetDouble();
        // The reported value is the library's transition at the reported width, and no nearby width does better.
        Assert.Equal(Transition12(width), reached, 1e-12);
        Assert.True(Transition12(width + 0.02) < reached + 1e-9);
        Assert.True(Transition12(width - 0.02) < reached + 1e-9);
    }

    [Fact]
    public void Design_StartFarFromTheTarget_ReachesItAcrossDesignsWithoutTheLevel()
    {
        // From 11 nm, the first steps towards 8 um overshoot into narrow wells with one bound level; they are rejected and
        // shorter steps reach the target, the same width as from a near start.
        var run = ToolRunner.Invoke("design", WellDesign(11.0, """{"quantity": "transition1-2", "value": "8 um"}"""), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var width = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        Assert.Equal(PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / 8000, Transition12(width), 1e-9);
    }

    [Fact]
    public void Design_StartWithoutTheTargetLevel_IsRefusedNamingTargetAndStart()
    {
        // A 2.5 nm well 0.3 eV deep binds one level only: there is no 1→2 transition to start from.
        Assert.Single(WellLevels(2.5, 0).Levels);
        var run = ToolRunner.Invoke("design", WellDesign(2.5, """{"quantity": "transition1-2", "value": "8 um"}"""));
        Assert.Equal(2, run.ExitCode);
        Assert.Empty(run.Stdout);
        Assert.Contains("targets[0] transition1-2", run.Stderr);
        Assert.Contains("cell[0].width = 2.5 nm", run.Stderr);
        Assert.Contains("fewer than 2 bound levels", run.Stderr);
    }

    [Fact]
    public void Design_LayerThinnerThanAMonolayer_KeepsTheFitAndMarksItsThinnerSideNotApplicable()
    {
        // A 0.25 nm spacer with a 0.2934 nm monolayer: one monolayer thinner is no layer at all.
        const string Structure = """{"cell": [{"width": 6, "potential": 0, "mass": 0.067}, {"width": 0.25, "potential": 0.3, "mass": 0.092}, {"width": 2, "potential": 0, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.3, "mass": 0.092}}}""";
        var file = ToolRunner.TempFile($$"""{"structure": {{Structure}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 9}], "targets": [{"quantity": "level1", "value": "40 meV"}], "monolayer": 0.2934}""", "design.json");
        var run = ToolRunner.Invoke("design", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var spacer = json.GetProperty("tolerances")[1].GetProperty("shifts")[0];
        Assert.Equal(System.Text.Json.JsonValueKind.Null, spacer.GetProperty("minus").ValueKind);
        Assert.True(spacer.GetProperty("plus").GetDouble() > 0);
        var text = ToolRunner.Invoke("design", file);
        Assert.True(text.ExitCode == 0, text.Stderr);
        Assert.Contains("n/a¹", text.Stdout);
        Assert.Contains("¹ not applicable: cell[1].width (0.2500 nm) is not thicker than one monolayer (0.2934 nm)", text.Stdout);
    }

    [Fact]
    public void Design_NeighbourWithoutTheLevel_IsGoneInTheToleranceTable()
    {
        // Placed at 6.3 um the well is ~5.1 nm wide; 2 nm thinner it binds one level only (checked with the library), so
        // that side of the table has no transition: shown as gone, not a failure of the run.
        var run = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "transition1-2", "value": "6.3 um"}""", ", \"monolayer\": 2"), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var width = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        Assert.Single(WellLevels(width - 2, 0).Levels);
        var shift = json.GetProperty("tolerances")[0].GetProperty("shifts")[0];
        Assert.Equal(System.Text.Json.JsonValueKind.Null, shift.GetProperty("minus").ValueKind);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, shift.GetProperty("minusWavelength").ValueKind);
        // The thicker side in wavelength: hc/E' − hc/E of the re-solved energy shift, in um.
        var reached = json.GetProperty("targets")[0].GetProperty("reached").GetDouble();
        var hc = PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres;
        Assert.Equal(hc / (reached + shift.GetProperty("plus").GetDouble()) / 1000 - hc / reached / 1000, shift.GetProperty("plusWavelength").GetDouble(), 1e-12);
        var text = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "transition1-2", "value": "6.3 um"}""", ", \"monolayer\": 2"));
        Assert.Contains("gone²", text.Stdout);
        Assert.Contains("² gone: the design one monolayer away does not have this level or resonance.", text.Stdout);
    }

    [Fact]
    public void Design_Table_ShowsEachTargetInItsOwnUnitWithoutExponentsOrSignedZeros()
    {
        var run = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "transition1-2", "value": "2.5 um"}""", ", \"monolayer\": 0.2827"));
        Assert.True(run.ExitCode == 0, run.Stderr);
        var lines = run.Stdout.Split('\n');
        // Wanted, reached and residual in µm (the target's unit), the photon energy beside them; shifts as wavelengths in nm.
        Assert.Matches(@"^transition1-2\s+µm\s+2\.50000\s+\d\.\d{5}\s+\d\.\d{5}\s+NO\s+\d+\.\d{4} meV$", lines.Single(l => l.StartsWith("transition1-2", StringComparison.Ordinal)));
        Assert.Contains("transition1-2 + (nm)", run.Stdout);
        Assert.DoesNotMatch(@"-0\.0+(?!\d)", run.Stdout);
        Assert.DoesNotMatch(@"\dE[-+]\d", run.Stdout);
        // The reached width: the same four decimals as the start and bounds.
        Assert.Matches(@"cell\[0\]\.width\s+nm\s+7\.0000\s+\d\.\d{4}\s+2\.0000\s+12\.0000", run.Stdout);
        Assert.Contains("the closest the optimiser found", run.Stdout);
    }

    [Fact]
    public void Design_ToleranceTable_PrintsAShiftThatRoundsToZeroUnsigned()
    {
        // The infrared example's barriers are the stack's leads too: a monolayer more or less of them moves nothing, and
        // the rounding noise of that nothing must print as 0.000, never -0.000.
        var run = ToolRunner.Invoke("design", Path.Combine(ToolRunner.RepositoryRoot, "docs", "examples", "design", "infrared-transition.json"));
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("0.000 [0.000]", run.Stdout);
        Assert.DoesNotMatch(@"-0\.0+(?!\d)", run.Stdout);
    }

    [Fact]
    public void Design_EnergyTarget_ResidualIsInMeV()
    {
        var run = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "level1", "value": "500 meV"}"""));
        Assert.True(run.ExitCode == 0, run.Stderr);
        // A level cannot rise above the 0.3 eV barrier: hundreds of meV off, printed as such.
        var row = run.Stdout.Split('\n').Single(l => l.StartsWith("level1", StringComparison.Ordinal));
        var residual = double.Parse(Regex.Split(row.Trim(), @"\s+")[4], CultureInfo.InvariantCulture);
        Assert.InRange(residual, -500, -200);
        Assert.Contains("level1   meV  500.0000", run.Stdout);
    }

    [Fact]
    public void Design_WithoutMonolayer_FooterSaysHowToGetTheTable()
    {
        var run = ToolRunner.Invoke("design", WellDesign(7.0, """{"quantity": "transition1-2", "value": "8 um"}"""));
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.DoesNotContain("growth tolerance:", run.Stdout);
        Assert.DoesNotContain("these shifts", run.Stdout);
        Assert.Contains("give \"monolayer\"", run.Stdout);
    }

    [Fact]
    public void Design_InlineStructureWithoutName_IsAccepted()
    {
        var file = ToolRunner.TempFile("""{"structure": {"cell": [{"width": 6, "potential": 0, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.3, "mass": 0.067}}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 9}], "targets": [{"quantity": "level1", "value": "40 meV"}]}""", "design.json");
        var run = ToolRunner.Invoke("design", file);
        Assert.True(run.ExitCode == 0, run.Stderr);
    }

    [Fact]
    public void Design_InlineStructureError_NamesTheFieldNotAPositionInACopy()
    {
        var file = ToolRunner.TempFile("""{"structure": {"cell": [{"width": -6, "potential": 0, "mass": 0.067}]}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 9}], "targets": [{"quantity": "band1.bottom", "value": 0.01}]}""", "design.json");
        var run = ToolRunner.Invoke("design", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("structure cell[0].width: must be positive", run.Stderr);
        Assert.DoesNotContain("structure:1:", run.Stderr);
    }

    [Theory]
    [InlineData("level101")]
    [InlineData("resonance101")]
    [InlineData("transition1-101")]
    public void Design_StackTargetBeyondTheSweepBound_IsRefused(string quantity)
    {
        var run = ToolRunner.Invoke("design", WellDesign(7.0, $$"""{"quantity": "{{quantity}}", "value": 0.1}"""));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("targets[0].quantity", run.Stderr);
        Assert.Contains("N from 1 to 100", run.Stderr);
    }

    [Fact]
    public void Design_Help_SaysHowAScriptDetectsNotReached()
    {
        var run = ToolRunner.Invoke("design", "--help");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("\"converged\"", run.Stdout);
    }
}
