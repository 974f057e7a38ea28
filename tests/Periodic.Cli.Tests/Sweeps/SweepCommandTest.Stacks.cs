// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Design;
using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Tests.Sweeps;

public sealed partial class SweepCommandTest
{
    /// <summary>A well (cell[1]) between two barriers, in a stack between leads at the barrier height (bound levels and
    /// transitions) or at the well bottom (a double barrier with transmission resonances).</summary>
    private static string WellStack(double lead) => string.Create(CultureInfo.InvariantCulture,
        $$"""{"name": "w", "cell": [{"width": 2, "potential": 0.3, "mass": 0.092}, {"width": 6, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.3, "mass": 0.092}], "stack": {"periods": 1, "leads": {"potential": {{lead:R}}, "mass": 0.067""") + "}}}";

    private static string WithWell(string structure, double well) =>
        structure.Replace("\"width\": 6,", string.Create(CultureInfo.InvariantCulture, $"\"width\": {well:R},"), StringComparison.Ordinal);

    private static double Number(string cell) => double.Parse(cell, CultureInfo.InvariantCulture);

    [Fact]
    public void Sweep_LevelsAndTransitions_EqualTheLibrarysValuesAndExactDerivativesBitForBit()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": {{WellStack(0.3)}}, "parameters": [{"field": "cell[1].width", "values": [5, 7]}], "outputs": {"levels": 2, "transitions": ["1-2"], "sensitivities": true""" + "}}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var header = File.ReadLines(output).First().Split(',');
        Assert.Equal(["design", "cell[1].width (nm)", "level1 (eV)", "level2 (eV)", "transition1-2.energy (eV)", "transition1-2.wavelength (um)",
            "dLevel1/dcell[1].width (eV/nm)", "dLevel2/dcell[1].width (eV/nm)", "dTransition1-2/dcell[1].width (eV/nm)", "error"], header);
        var rows = Rows(output);
        for (var d = 0; d < 2; d++)
        {
            var structure = StructureFile.Parse(WithWell(WellStack(0.3), d == 0 ? 5 : 7), "t");
            var spectrum = BoundStateSpectrum.Find(structure.Stack!);
            var well = (Layer)structure.Cell.Elements[1];
            var (e1, e2) = (spectrum.Levels[0].EnergyElectronVolts, spectrum.Levels[1].EnergyElectronVolts);
            // Round-trip CSV: the library's doubles come back bit for bit.
            Assert.Equal(e1, Number(rows[d][2]));
            Assert.Equal(e2, Number(rows[d][3]));
            Assert.Equal(e2 - e1, Number(rows[d][4]));
            // λ = hc/E (CODATA hc, docs/references.md), in µm.
            Assert.Equal(PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / (e2 - e1) / 1000, Number(rows[d][5]));
            var d1 = StackSensitivities.OfLevel(spectrum, 0, well, LayerQuantity.Width)!.Value;
            var d2 = StackSensitivities.OfLevel(spectrum, 1, well, LayerQuantity.Width)!.Value;
            Assert.Equal(d1, Number(rows[d][6]));
            Assert.Equal(d2, Number(rows[d][7]));
            Assert.Equal(d2 - d1, Number(rows[d][8]));
            // A wider well lowers its levels (common practice, no single source): the sign is physics, not the code's say-so.
            Assert.True(d1 < 0 && d2 < 0);
            Assert.Equal("", rows[d][^1]);
        }
    }

    [Fact]
    public void Sweep_Resonances_EqualTheLibrarysPeaksAndFailedDesignsStayRows()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        // Well widths 5 nm and −1 nm: the second design makes an invalid layer and must stay a row with its error.
        File.WriteAllText(spec, $$"""{"structure": {{WellStack(0)}}, "parameters": [{"field": "cell[1].width", "values": [5, -1]}], "outputs": {"resonances": 1, "sensitivities": true""" + "}}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var rows = Rows(output);
        Assert.Equal(2, rows.Length);
        var structure = StructureFile.Parse(WithWell(WellStack(0), 5), "t");
        var transmission = StackTransmission.Create(structure.Stack!);
        var peak = transmission.FindResonances(0, 0.3).Resonances[0];
        Assert.Equal(peak.EnergyElectronVolts, Number(rows[0][2]));
        Assert.Equal(StackSensitivities.OfResonance(transmission, peak, (Layer)structure.Cell.Elements[1], LayerQuantity.Width)!.Value, Number(rows[0][3]));
        Assert.Equal("1", rows[1][0]);
        Assert.Equal("", rows[1][2]);
        Assert.Contains("width", File.ReadAllLines(output)[2], StringComparison.Ordinal);
    }

    [Fact]
    public void Sweep_HubbardOverTheLatticeDepth_EqualsTheLibrarysParameters()
    {
        var folder = Folder();
        var structure = ToolRunner.Example("rubidium-lattice.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{"field": "opticalLattice.depth", "values": [8, 16]}], "outputs": {"hubbard": {"scatteringLength": "100 a0" """ + "}}}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal("design,opticalLattice.depth (1),hubbard.tunnelling (eV),hubbard.interaction (eV),hubbard.ratio (1),error", File.ReadLines(output).First());
        var rows = Rows(output);
        var previous = double.PositiveInfinity;
        foreach (var (row, depth) in rows.Zip(new[] { 8.0, 16.0 }))
        {
            var lattice = StructureFile.Parse(File.ReadAllText(ToolRunner.Example("rubidium-lattice.json")).Replace("\"depth\": 12", string.Create(CultureInfo.InvariantCulture, $"\"depth\": {depth:R}"), StringComparison.Ordinal), "t").OpticalLattice!;
            var expected = HubbardParameters.Compute(lattice, TransverseConfinement.CubicLattice, HubbardParameters.BohrRadii(100));
            Assert.Equal(expected.TunnellingElectronVolts, Number(row[2]));
            Assert.Equal(expected.InteractionElectronVolts, Number(row[3]));
            // Deeper lattices tunnel less (Bloch, Dalibard and Zwerger, Rev. Mod. Phys. 80, 885 (2008) — docs/references.md).
            Assert.True(expected.TunnellingElectronVolts < previous);
            previous = expected.TunnellingElectronVolts;
        }
    }

    [Fact]
    public void Sweep_HubbardTooDeep_IsARowErrorNotANoiseValue()
    {
        // At s = 1000, J ≈ (4/√π)s^{3/4}e^{−2√s} E_R ≈ 1e-24 E_R (Bloch, Dalibard and Zwerger, Rev. Mod. Phys. 80, 885 (2008)),
        // far below the rounding of the band energies: the tunnelling column held rounding noise (a negative J).
        var folder = Folder();
        var structure = ToolRunner.Example("rubidium-lattice.json").Replace("\\", "/", StringComparison.Ordinal);
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": "{{structure}}", "parameters": [{"field": "opticalLattice.depth", "values": [10, 1000]}], "outputs": {"hubbard": {"scatteringLength": "100 a0" """ + "}}}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var rows = Rows(output);
        Assert.True(Number(rows[0][2]) > 0);
        Assert.Equal(string.Empty, rows[1][2]);
        Assert.Contains("too deep for outputs.hubbard (at most 190 E_R)", string.Join(",", rows[1]), StringComparison.Ordinal);
    }

    [Fact]
    public void Sweep_HubbardOfAStructureWithoutALattice_IsRefused()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": {{WellStack(0)}}, "parameters": [{"field": "cell[1].width", "values": [5]}], "outputs": {"hubbard": {"scatteringLength": 100""" + "}}}");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("outputs.hubbard", run.Stderr);
    }

    [Theory]
    [InlineData("\"2-1\"", "outputs.transitions[0]")]
    [InlineData("\"1-x\"", "outputs.transitions[0]")]
    [InlineData("\"1-101\"", "outputs.transitions[0]")]
    public void Sweep_BadTransition_IsRefusedNamingIt(string transition, string field)
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, $$"""{"structure": {{WellStack(0.3)}}, "parameters": [{"field": "cell[1].width", "values": [5]}], "outputs": {"transitions": [{{transition}}]""" + "}}");
        var run = ToolRunner.Invoke("sweep", spec, "--out", Path.Combine(folder, "o.csv"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(field, run.Stderr);
        Assert.Contains("I < J", run.Stderr);
    }
}
