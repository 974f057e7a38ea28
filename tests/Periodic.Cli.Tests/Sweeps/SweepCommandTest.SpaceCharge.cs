// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Text.Json.Nodes;
using Periodic.Bands;
using Periodic.Serialization;
using Periodic.SpaceCharge;

namespace Periodic.Cli.Tests.Sweeps;

/// <summary>Sweeps and designs of doped structures: self-consistent by default, as every command; rigid with --no-space-charge.</summary>
public sealed partial class SweepCommandTest
{
    private static string DopedExample => ToolRunner.Example("doped-superlattice.json");

    /// <summary>The example with the donor density of its doped layer (cell[1]) set to <paramref name="donors"/> cm⁻³.</summary>
    private static StructureDefinition DopedWith(double donors)
    {
        var document = JsonNode.Parse(File.ReadAllText(DopedExample))!.AsObject();
        document["cell"]![1]!["donors"] = donors;
        return StructureFile.Parse(System.Text.Encoding.UTF8.GetBytes(document.ToJsonString()), "t");
    }

    [Fact]
    public void Sweep_DopedCell_RowsAreTheSelfConsistentBandsAndRigidWithNoSpaceCharge()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, 
            $$"""{"structure": {{JsonValue.Create(DopedExample).ToJsonString()}}, "parameters": [{"field": "cell[1].donors", "values": [1e17, 5e18]}], "outputs": {"bands": 1""" + "}}");
        var selfConsistent = Path.Combine(folder, "sc.csv");
        var rigid = Path.Combine(folder, "rigid.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", selfConsistent);
        Assert.True(run.ExitCode == 0, run.Stderr);
        run = ToolRunner.Invoke("sweep", spec, "--out", rigid, "--no-space-charge");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal("cell[1].donors (cm^-3)", File.ReadLines(selfConsistent).First().Split(',')[1]);
        var sc = Rows(selfConsistent);
        var rb = Rows(rigid);
        for (var d = 0; d < 2; d++)
        {
            var structure = DopedWith(d == 0 ? 1e17 : 5e18);
            // Same input, same deterministic solution as the library's: bit for bit through the round-trip CSV.
            var solved = BandSolver.Compute(SpaceChargeSolver.Solve(structure.Doping!).Cell, 1).Structure;
            Assert.Equal(solved.GetBand(1).BottomElectronVolts, Number(sc[d][2]));
            Assert.Equal(BandSolver.Compute(structure.Cell, 1).Structure.GetBand(1).BottomElectronVolts, Number(rb[d][2]));
            Assert.Equal("", sc[d][^1]);
        }
        // The ionised donors in the barriers and the electrons in the wells raise the wells' bottom against the barriers'
        // middle (band bending of modulation doping; common practice, no single source), more for more donors; the rigid
        // bands do not move.
        Assert.True(Number(sc[1][2]) > Number(sc[0][2]) + 0.01);
        Assert.Equal(rb[0][2], rb[1][2]);
    }

    [Fact]
    public void Sweep_DopedWithSensitivities_ExitsTwoNamingTheWayOut()
    {
        var folder = Folder();
        var spec = Path.Combine(folder, "sweep.json");
        File.WriteAllText(spec, 
            $$"""{"structure": {{JsonValue.Create(DopedExample).ToJsonString()}}, "parameters": [{"field": "cell[3].width", "values": [7, 8]}], "outputs": {"bands": 1, "sensitivities": true""" + "}}");
        var output = Path.Combine(folder, "o.csv");
        var run = ToolRunner.Invoke("sweep", spec, "--out", output);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-space-charge", run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(output));
        run = ToolRunner.Invoke("sweep", spec, "--out", output, "--no-space-charge");
        Assert.True(run.ExitCode == 0, run.Stderr);
    }

    [Fact]
    public void Design_DopedStructure_ExitsTwoUnlessTheRigidBandsAreAskedFor()
    {
        var file = ToolRunner.TempFile(
            $$"""{"structure": {{JsonValue.Create(DopedExample).ToJsonString()}}, "adjust": [{"field": "cell[3].width", "from": 6, "to": 10}], "targets": [{"quantity": "band1.bottom", "value": 0.045}]""" + "}", "design.json");
        var run = ToolRunner.Invoke("design", file);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-space-charge", run.Stderr, StringComparison.Ordinal);
        run = ToolRunner.Invoke("design", file, "--no-space-charge", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
    }
}
