// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Serialization;

namespace Periodic.Cli.Tests.Commands;

public sealed partial class DesignCommandTest
{
    private static string Structure(double well, double barrier) => string.Create(CultureInfo.InvariantCulture,
        $$"""{"name": "d", "cell": [{"width": {{well:R}}, "potential": 0, "mass": 0.067}, {"width": {{barrier:R}}, "potential": 0.25, "mass": 0.092}]}""");

    private static BandStructure Bands(double well, double barrier) => BandStructure.Compute(StructureFile.Parse(Structure(well, barrier), "t").Cell, 2);

    private static string DesignFile(double startWell, double startBarrier, string targets, string extra = "")
    {
        var json = $$"""{"structure": {{Structure(startWell, startBarrier)}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 9}, {"field": "cell[1].width", "from": 1, "to": 4}], "targets": [{{targets}}]{{extra}} """ + "}";
        return ToolRunner.TempFile(json, "design.json");
    }

    [Theory]
    [InlineData(5.0, 2.0)]
    [InlineData(8.5, 1.2)]
    [InlineData(3.5, 3.8)]
    public void Design_RecoversAKnownDesignFromItsOwnTargets(double startWell, double startBarrier)
    {
        // The targets are the band edges of a known design (6.2 nm / 2.5 nm); from perturbed starts the optimiser must
        // come back to it: two edges fix two widths (the map is locally one-to-one, its Jacobian non-singular).
        var known = Bands(6.2, 2.5);
        var targets = string.Create(CultureInfo.InvariantCulture,
            $$"""{"quantity": "band1.bottom", "value": {{known.Bands[0].BottomElectronVolts:R}}}, {"quantity": "band2.top", "value": {{known.Bands[1].TopElectronVolts:R}}}""");
        var run = ToolRunner.Invoke("design", DesignFile(startWell, startBarrier, targets), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var adjusted = json.GetProperty("adjusted");
        // Edges move ~10 meV per nm, and the optimiser stops at residuals of ~1e-9 eV: 1e-6 nm leaves a wide margin.
        Assert.Equal(6.2, adjusted[0].GetProperty("reached").GetDouble(), 1e-6);
        Assert.Equal(2.5, adjusted[1].GetProperty("reached").GetDouble(), 1e-6);
    }

    [Fact]
    public void Design_ToleranceTable_IsTheBandStructureSolvedAgainOneMonolayerAway()
    {
        var known = Bands(6.0, 2.0);
        var targets = string.Create(CultureInfo.InvariantCulture, $$"""{"quantity": "band1.width", "value": {{known.Bands[0].WidthElectronVolts:R}}}""");
        var file = ToolRunner.TempFile($$"""{"structure": {{Structure(6.0, 2.0)}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 9}], "targets": [{{targets}}], "monolayer": 0.3}""", "design.json");
        var run = ToolRunner.Invoke("design", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var reachedWell = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        var reachedWidth = json.GetProperty("targets")[0].GetProperty("reached").GetDouble();
        var barrierRow = json.GetProperty("tolerances")[1];
        Assert.Equal("cell[1].width", barrierRow.GetProperty("field").GetString());
        var plus = barrierRow.GetProperty("shifts")[0].GetProperty("plus").GetDouble();
        // The same structure with the barrier 0.3 nm thicker, solved by the library: the shift must match to rounding.
        var expected = Bands(reachedWell, 2.3).Bands[0].WidthElectronVolts - reachedWidth;
        Assert.Equal(expected, plus, 1e-15);
        // First order is close to the re-solved shift but not equal: the miniband width is not linear in the barrier.
        var first = barrierRow.GetProperty("shifts")[0].GetProperty("firstOrder").GetDouble();
        Assert.InRange(first / plus, 0.5, 2.0);
    }

    [Fact]
    public void Design_UnknownTarget_ListsTheAllowedOnes()
    {
        var run = ToolRunner.Invoke("design", DesignFile(5, 2, """{"quantity": "band1.middle", "value": 0.1}"""));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("targets[0].quantity", run.Stderr);
        Assert.Contains("bandN.bottom, bandN.top, bandN.width, gapN.width", run.Stderr);
    }

    [Fact]
    public void Design_StartOutsideTheBounds_IsRefused()
    {
        var run = ToolRunner.Invoke("design", DesignFile(9.5, 2, """{"quantity": "band1.bottom", "value": 0.1}"""));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("adjust[0]", run.Stderr);
        Assert.Contains("value 9.5", run.Stderr);
    }
}
