// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Serialization;
using Periodic.Structures;

namespace Periodic.Cli.Tests.Serialization;

public sealed class StructureFileStackPartsTest
{
    private const string Cell = """[{"width": 5, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.25, "mass": 0.092}]""";

    [Fact]
    public void Parse_StackParts_SequenceOfLayersRepeatsAndDeltas()
    {
        var s = StructureFile.Parse($$$"""
            {"name": "a", "cell": {{{Cell}}}, "stack": {"parts": [
                {"width": "3 nm", "potential": 0.3, "mass": 0.09, "label": "cap"},
                {"repeat": 4},
                {"delta": "0.1 eV nm"},
                {"width": 8, "potential": 0, "mass": 0.067, "label": "defect"},
                {"repeat": 2}],
              "leads": {"potential": 0, "mass": 0.067} }
            }
            """, "t.json");
        var stack = s.Stack!;
        Assert.Equal(5, stack.Parts.Count);
        Assert.False(stack.Parts[0].IsRepeatedCell);
        Assert.Equal(4, stack.Parts[1].Repetitions);
        Assert.Same(s.Cell, stack.Parts[1].Cell);
        Assert.IsType<DeltaBarrier>(stack.Parts[2].Element);
        Assert.Equal(3 + 4 * 7 + 8 + 2 * 7, stack.Thickness.Nanometres, 1e-12);
    }

    [Fact]
    public void Parse_MaterialLeadsAndParts_TakeTheMaterialsBandEdgeAndMass()
    {
        var s = StructureFile.Parse("""
            {"name": "m", "temperature": "77 K", "cell": [{"material": "GaAs", "width": "6 nm"}, {"material": "Al0.3Ga0.7As", "width": "5 nm"}],
             "stack": {"parts": [{"material": "Al0.3Ga0.7As", "width": "10 nm"}, {"repeat": 3}], "leftLead": {"material": "GaAs"}, "rightLead": {"material": "Al0.3Ga0.7As"}}}
            """, "t.json");
        var built = s.Materials!;
        var barrier = StructureRecipe.ParseMaterial("Al0.3Ga0.7As");
        // The lead and the spacer are the barrier material on the cell's energy reference, as the cell's own barrier layer.
        Assert.Equal(built.Layers[1].PotentialElectronVolts, s.Stack!.RightLead.Potential.ElectronVolts, 1e-15);
        Assert.Equal(built.LayerOf(barrier, Units.Length.FromNanometres(1)).Mass.ElectronMasses, s.Stack.RightLead.Mass.ElectronMasses);
        Assert.Equal(0.0, s.Stack.LeftLead.Potential.ElectronVolts, 1e-15);
        var spacer = (Layer)s.Stack.Parts[0].Element!;
        Assert.Equal(built.Layers[1].PotentialElectronVolts, spacer.Potential.ElectronVolts, 1e-15);
    }

    [Theory]
    [InlineData("""{"periods": 2, "parts": [{"repeat": 1}]}""", "stack.periods: give either periods or parts, not both")]
    [InlineData("""{"parts": []}""", "stack.parts: must be an array of 1 to 10000 parts")]
    [InlineData("""{"parts": [{"repeat": 0}]}""", "stack.parts[0].repeat: must be a whole number of periods of the cell from 1 to 1000000.")]
    [InlineData("""{"parts": [{"repeat": 2.5}]}""", "stack.parts[0].repeat: must be a whole number")]
    [InlineData("""{"parts": [{"width": -1, "potential": 0, "mass": 0.067}]}""", "stack.parts[0].width: must be positive; got -1 nm.")]
    [InlineData("""{"parts": [{"material": "GaAs", "width": 1}]}""", "stack.parts[0].material: applies only to a cell of material layers")]
    [InlineData("""{"periods": 1, "leads": {"material": "GaAs"}}""", "stack.leads.material: applies only to a cell of material layers")]
    [InlineData("""{"parts": [{"repeat": 1, "extra": 1}]}""", "stack.parts[0].extra: unknown field")]
    public void Parse_BadStackParts_NameTheField(string stack, string message)
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse($$$"""{"name": "a", "cell": {{{Cell}}}, "stack": {{{stack}}} }""", "t.json"));
        Assert.Contains(message, error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_BadLeadMaterial_NamesTheField()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse("""
            {"name": "m", "temperature": "77 K", "cell": [{"material": "GaAs", "width": "6 nm"}], "stack": {"periods": 2, "leads": {"material": "Unobtainium"}}}
            """, "t.json"));
        Assert.Contains("stack.leads.material", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Levels_DefectExample_HasALevelInTheMinigap()
    {
        // A defect in a superlattice binds a state inside a minigap (common practice, no single source): the example's wide well does.
        var file = ToolRunner.Example("defect-superlattice.json");
        var structure = StructureFile.Load(file);
        var bands = Periodic.Bands.BandStructure.Compute(structure.Cell, 2);
        var run = ToolRunner.Invoke("levels", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var energies = run.Json().GetProperty("levels").EnumerateArray().Select(l => l.GetProperty("energy").GetDouble()).ToArray();
        Assert.Contains(energies, e => e > bands.Bands[0].TopElectronVolts && e < bands.Bands[1].BottomElectronVolts);
        var table = ToolRunner.Invoke("levels", file);
        Assert.Contains("1 layer", table.Stdout.Replace("layer 5 nm", "1 layer", StringComparison.Ordinal), StringComparison.Ordinal);
    }

    [Fact]
    public void Current_FermiLevelBelowLead_Warns()
    {
        var file = ToolRunner.Example("double-barrier-diode.json");
        var run = ToolRunner.Invoke("current", file, "--bias", "0.1", "--temperature", "77", "--fermi-level", "-0.05", "--json");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("--fermi-level -0.05 eV lies 0.05 eV below the left lead's band edge", run.Stderr, StringComparison.Ordinal);
        Assert.Contains(run.Json().GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("below the left lead", StringComparison.Ordinal));
        var fine = ToolRunner.Invoke("current", file, "--bias", "0.1", "--temperature", "77", "--fermi-level", "0.02");
        Assert.DoesNotContain("below the", fine.Stderr, StringComparison.Ordinal);
    }
}
