// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed partial class DesignCommandTest
{
    /// <summary>One well (the cell) between barrier leads at 0.3 eV: its width and bottom are adjusted.</summary>
    private static string WellStructure(double width, double bottom) => string.Create(CultureInfo.InvariantCulture,
        $$"""{"name": "w", "cell": [{"width": {{width:R}}, "potential": {{bottom:R}}, "mass": 0.067}], "stack": {"periods": 1, "leads": {"potential": 0.3, "mass": 0.067""") + "}}}";

    private static BoundStateSpectrum WellLevels(double width, double bottom) => BoundStateSpectrum.Find(StructureFile.Parse(WellStructure(width, bottom), "t").Stack!);

    [Theory]
    [InlineData(5.0, 0.0)]
    [InlineData(8.0, 0.05)]
    [InlineData(6.8, -0.02)]
    public void Design_RecoversAKnownWellFromItsLevelAndTransition(double startWidth, double startBottom)
    {
        // The known design: a 6.2 nm well with its bottom at 0.02 eV. Its ground level and its 1→2 transition, computed by
        // the library, are the targets; from perturbed starts the optimiser must come back to it (two targets, two fields).
        var levels = WellLevels(6.2, 0.02).Levels;
        var level1 = levels[0].EnergyElectronVolts;
        var transition = levels[1].EnergyElectronVolts - level1;
        var file = ToolRunner.TempFile(string.Create(CultureInfo.InvariantCulture,
            $$"""{"structure": {{WellStructure(startWidth, startBottom)}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 10}, {"field": "cell[0].potential", "from": -0.05, "to": 0.1}], "targets": [{"quantity": "level1", "value": {{level1:R}}}, {"quantity": "transition1-2", "value": {{transition:R}}}]}"""), "design.json");
        var run = ToolRunner.Invoke("design", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var adjusted = json.GetProperty("adjusted");
        // Levels move ~10–50 meV per nm and ~1 eV per eV of the bottom; residuals of ~1e-10 eV pin the fields far inside 1e-6.
        Assert.Equal(6.2, adjusted[0].GetProperty("reached").GetDouble(), 1e-6);
        Assert.Equal(0.02, adjusted[1].GetProperty("reached").GetDouble(), 1e-6);
    }

    [Fact]
    public void Design_TransitionAtAWavelength_IsReached()
    {
        // "8.5 um" is a photon energy hc/λ (CODATA hc = 1239.84198… eV nm, docs/references.md): the reached 1→2 transition of
        // the stack the tool reports must be that energy, and the library's levels at the reached width must agree.
        var file = ToolRunner.TempFile(
            $$"""{"structure": {{WellStructure(6.0, 0.0)}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 10}], "targets": [{"quantity": "transition1-2", "value": "8.5 um"}]}""", "design.json");
        var run = ToolRunner.Invoke("design", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var wanted = PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / 8500;
        Assert.Equal(wanted, json.GetProperty("targets")[0].GetProperty("wanted").GetDouble(), 1e-15);
        var width = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        var levels = WellLevels(width, 0).Levels;
        // The default residual tolerance is 1e-6 eV; the optimiser goes far below it.
        Assert.Equal(wanted, levels[1].EnergyElectronVolts - levels[0].EnergyElectronVolts, 1e-9);
    }

    [Fact]
    public void Design_ResonanceTarget_IsReached()
    {
        // A double barrier whose first transmission peak is placed at 0.10 eV by its well width; the reached structure's
        // peak, found again by the library's resonance search, must sit there.
        static string Structure(double well) => string.Create(CultureInfo.InvariantCulture,
            $$"""{"name": "rtd", "cell": [{"width": 2, "potential": 0.3, "mass": 0.092}, {"width": {{well:R}}, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.3, "mass": 0.092}], "stack": {"periods": 1, "leads": {"potential": 0, "mass": 0.067""") + "}}}";
        var file = ToolRunner.TempFile(
            $$"""{"structure": {{Structure(5.0)}}, "adjust": [{"field": "cell[1].width", "from": 3, "to": 9}], "targets": [{"quantity": "resonance1", "value": "100 meV"}]}""", "design.json");
        var run = ToolRunner.Invoke("design", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.True(json.GetProperty("converged").GetBoolean());
        var well = json.GetProperty("adjusted")[0].GetProperty("reached").GetDouble();
        var peak = StackTransmission.Create(StructureFile.Parse(Structure(well), "t").Stack!).FindResonances(1e-9, 0.3).Resonances[0];
        // Peak energies are found to ~1e-12 eV; the residual tolerance is 1e-6 eV.
        Assert.Equal(0.1, peak.EnergyElectronVolts, 1e-6);
    }

    [Fact]
    public void Design_WavelengthForALevel_IsRefused()
    {
        var file = ToolRunner.TempFile(
            $$"""{"structure": {{WellStructure(6.0, 0.0)}}, "adjust": [{"field": "cell[0].width", "from": 3, "to": 10}], "targets": [{"quantity": "level1", "value": "8.5 um"}]}""", "design.json");
        var run = ToolRunner.Invoke("design", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("targets[0].value", run.Stderr);
        Assert.Contains("only a transition target", run.Stderr);
    }
}
