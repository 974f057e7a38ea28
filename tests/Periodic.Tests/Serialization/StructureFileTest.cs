// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Serialization;

// The structure-file reader of the library (Periodic.Serialization); unit conversions are checked against the SI definitions (1 Å = 0.1 nm, 1 meV = 1e-3 eV;
// BIPM SI Brochure, 9th ed., non-SI units table).
public sealed partial class StructureFileTest
{
    private static Layer LayerAt(StructureDefinition s, int i) => Assert.IsType<Layer>(s.Cell.Elements[i]);

    [Fact]
    public void Parse_BareNumbers_AreNanometresElectronVoltsElectronMasses()
    {
        var s = StructureFile.Parse("""{"name": "a", "cell": [{"width": 5.0, "potential": 0.25, "mass": 0.067}]}""", "t.json");
        Assert.Equal("a", s.Name);
        Assert.Equal(5.0, LayerAt(s, 0).Width.Nanometres);
        Assert.Equal(0.25, LayerAt(s, 0).Potential.ElectronVolts);
        Assert.Equal(0.067, LayerAt(s, 0).Mass.ElectronMasses);
    }

    [Fact]
    public void Parse_StringsWithUnits_AreConverted()
    {
        var s = StructureFile.Parse("""
            {"name": "u", "cell": [
              {"width": "20 Å", "potential": "250 meV", "mass": "0.067 m0", "nonParabolicity": "0.6 /eV"},
              {"delta": "100 meV nm"},
              {"width": "2 nm", "potential": "0.25 eV", "mass": 0.092}
            ]}
            """, "t.json");
        // 20 Å = 2 nm and 250 meV = 0.25 eV exactly in decimal; in binary each side rounds once (1 ulp).
        Assert.Equal(2.0, LayerAt(s, 0).Width.Nanometres, 1e-15);
        Assert.Equal(0.25, LayerAt(s, 0).Potential.ElectronVolts, 1e-16);
        Assert.Equal(0.6, LayerAt(s, 0).NonParabolicityPerElectronVolt);
        Assert.Equal(0.1, Assert.IsType<DeltaBarrier>(s.Cell.Elements[1]).StrengthElectronVoltNanometres, 1e-16);
        Assert.Equal(4.0, s.Cell.Period.Nanometres, 1e-15);
    }

    [Theory]
    [InlineData("""{"name": "x", "cell": [{"width": -1, "potential": 0, "mass": 0.067}]}""", 1, 34, "cell[0].width", "positive")]
    [InlineData("{\"name\": \"x\",\n \"cell\": [{\"width\": 1,\n \"potential\": \"3 V\", \"mass\": 0.067}]}", 3, 15, "cell[0].potential", "unknown unit")]
    [InlineData("{\"name\": \"x\",\n \"cell\": [{\"width\": 1, \"potental\": 0, \"mass\": 1}]}", 2, 24, "cell[0].potental", "unknown field")]
    [InlineData("{\"name\": \"x\",\n \"cell\": [{\"width\": 1, \"mass\": 1}]}", 2, 11, "cell[0].potential", "required")]
    [InlineData("{\"name\": \"x\", \"cell\": []}", 1, 23, "cell", "at least one")]
    [InlineData("{\"cell\": [{\"delta\": 0.1}]}", 1, 1, "name", "required")]
    [InlineData("{\"name\": \"x\", \"cell\": [{\"delta\": \"0.1 eV\"}]}", 1, 34, "cell[0].delta", "unknown unit")]
    [InlineData("{\"name\": \"x\", \"cell\": [{\"delta\": 0.1}]}", 1, 23, "cell", "positive width")]
    [InlineData("{\"name\": \"x\", \"cell\": [{\"width\": \"2\", \"potential\": 0, \"mass\": 1}]}", 1, 34, "cell[0].width", "needs a unit")]
    [InlineData("{\"name\": 3, \"cell\": []}", 1, 10, "name", "must be a string")]
    // Columns counted by hand in the JSON text: the position of the offending value or field name.
    public void Parse_BadValue_NamesLineColumnAndField(string json, int line, int column, string field, string problem)
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse(json, "bad.json"));
        Assert.Equal("bad.json", e.SourceName);
        Assert.Equal(line, e.LineNumber);
        Assert.Equal(column, e.Column);
        Assert.Equal(field, e.Field);
        Assert.Contains(problem, e.Problem, StringComparison.Ordinal);
        Assert.StartsWith($"bad.json:{line}:{column}: {field}: ", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_SyntaxError_NamesLineAndColumn()
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse("{\"name\": \"x\",\n \"cell\": [{\"width\": 1 \"potential\": 0}]}", "s.json"));
        Assert.Equal(2, e.LineNumber);
        Assert.Equal(23, e.Column); // the quote that follows "1" without a comma
        Assert.Contains("invalid JSON", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_DuplicateField_IsAnError()
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse("""{"name": "x", "name": "y", "cell": [{"delta": 1}]}""", "d.json"));
        Assert.Equal("name", e.Field);
        Assert.Contains("twice", e.Problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_CommentsTrailingCommasAndByteOrderMark_AreAccepted()
    {
        var bytes = System.Text.Encoding.UTF8.GetPreamble().Concat(System.Text.Encoding.UTF8.GetBytes(
            "// a comment\n{\"name\": \"c\", \"cell\": [{\"width\": 1, \"potential\": 0, \"mass\": 1,},],}")).ToArray();
        var s = StructureFile.Parse(bytes, "c.json");
        Assert.Single(s.Cell.Elements);
    }

    [Fact]
    public void Load_Examples_AllParse()
    {
        var files = Directory.GetFiles(Repository.ExampleStructures, "*.json");
        Assert.NotEmpty(files);
        foreach (var file in files)
        {
            Assert.False(string.IsNullOrWhiteSpace(StructureFile.Load(file).Name));
        }
    }
}

public sealed class StructureFileMaterialsTest
{
    [Fact]
    public void Parse_MaterialLayers_AreBuiltByTheRecipe()
    {
        var s = StructureFile.Parse("""
            {"name": "m", "temperature": "77 K", "cell": [
              {"material": "GaAs", "width": "6 nm"}, {"material": "Al0.3Ga0.7As", "monolayers": 20}]}
            """, "m.json");
        var expected = Periodic.Materials.StructureRecipe.Create(Temperature.FromKelvin(77))
            .Add(Periodic.Materials.StructureRecipe.ParseMaterial("GaAs"), Periodic.Units.Length.FromNanometres(6))
            .Add(Periodic.Materials.RecipeLayer.FromMonolayers(Periodic.Materials.StructureRecipe.ParseMaterial("Al0.3Ga0.7As"), 20))
            .Build();
        Assert.NotNull(s.Materials);
        Assert.Equal(77.0, s.Materials!.Temperature.Kelvin);
        for (var i = 0; i < 2; i++)
        {
            var got = Assert.IsType<Layer>(s.Cell.Elements[i]);
            var want = Assert.IsType<Layer>(expected.Cell.Elements[i]);
            Assert.Equal(want.Width, got.Width);
            Assert.Equal(want.Potential, got.Potential);
            Assert.Equal(want.Mass, got.Mass);
        }
    }

    [Theory]
    [InlineData("""{"name": "m", "cell": [{"material": "GaAs", "width": 5}]}""", "temperature", "required")]
    [InlineData("""{"name": "m", "temperature": 300, "cell": [{"material": "Unobtainium", "width": 5}]}""", "cell[0].material", "not a known material")]
    [InlineData("""{"name": "m", "temperature": 300, "cell": [{"material": "GaAs", "width": 5}, {"width": 1, "potential": 0, "mass": 1}]}""", "cell[1].material", "required")]
    [InlineData("""{"name": "m", "temperature": 300, "cell": [{"width": 1, "potential": 0, "mass": 1}]}""", "temperature", "only")]
    [InlineData("""{"name": "m", "temperature": 300, "carrier": "positron", "cell": [{"material": "GaAs", "width": 5}]}""", "carrier", "electron")]
    public void Parse_BadMaterialCell_NamesTheField(string json, string field, string problem)
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse(json, "m.json"));
        Assert.Equal(field, e.Field);
        Assert.Contains(problem, e.Problem, StringComparison.Ordinal);
        Assert.True(e.LineNumber == 1 && e.Column > 1, e.Message);
    }
}

public sealed class StructureFileStackTest
{
    [Fact]
    public void Parse_Stack_BuildsPeriodsBetweenTheLeads()
    {
        var s = StructureFile.Parse("""
            {"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": 1.5, "potential": 0.3, "mass": 0.092}],
             "stack": {"periods": 12, "leftLead": {"potential": "-20 meV", "mass": 0.067}}}
            """, "s.json");
        Assert.NotNull(s.Stack);
        Assert.Equal(12, s.Stack!.Parts[0].Repetitions);
        Assert.Equal(-0.02, s.Stack.LeftLead.PotentialElectronVolts, 1e-17);
        // The right lead defaults to the first layer (0 eV, 0.067 m0).
        Assert.Equal(0.0, s.Stack.RightLead.PotentialElectronVolts);
        Assert.Equal(0.067, s.Stack.RightLead.MassElectronMasses);
        Assert.Equal(66.0, s.Stack.Thickness.Nanometres, 1e-12);
    }

    [Theory]
    [InlineData("""{"periods": 0}""", "stack.periods")]
    [InlineData("""{"periods": 2.5}""", "stack.periods")]
    [InlineData("""{"leads": {"potential": 0, "mass": 1}}""", "stack.periods")]
    [InlineData("""{"periods": 3, "leads": {"potential": 0, "mass": -1}}""", "stack.leads.mass")]
    [InlineData("""{"periods": 3, "leads": {"potential": 0, "mass": 1}, "leftLead": {"potential": 0, "mass": 1}}""", "stack.leads")]
    public void Parse_BadStack_NamesTheField(string stack, string field)
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}], "stack": """ + stack + "}", "s.json"));
        Assert.Equal(field, e.Field);
    }

    [Fact]
    public void Parse_StackBias_ReadsMilliElectronVoltsAndDefaultsToZero()
    {
        var biased = StructureFile.Parse("""
            {"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": 1.5, "potential": 0.3, "mass": 0.092}],
             "stack": {"periods": 3, "bias": "-120 meV"}}
            """, "s.json");
        Assert.Equal(-0.12, biased.StackBias.ElectronVolts, 1e-17); // 120 meV = 0.12 eV, one rounding
        var unbiased = StructureFile.Parse("""{"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}], "stack": {"periods": 3}}""", "s.json");
        Assert.Equal(0.0, unbiased.StackBias.ElectronVolts);
        Assert.Equal(0.0, StructureFile.Parse("""{"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}]}""", "s.json").StackBias.ElectronVolts);
    }

    [Theory]
    [InlineData("""{"periods": 3, "bias": "0.1 V"}""", "unknown unit")]
    [InlineData("""{"periods": 3, "bias": "0.1"}""", "needs a unit")]
    [InlineData("""{"periods": 3, "bias": true}""", "must be a number")]
    // 200000 elements written out under bias: more than StackTransmission.MaxBiasedElements (1e5).
    [InlineData("""{"periods": 100000, "bias": 0.1}""", "100000")]
    public void Parse_BadStackBias_NamesTheFieldAndTheRule(string stack, string problem)
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": 1.5, "potential": 0.3, "mass": 0.092}], "stack": """ + stack + "}", "s.json"));
        Assert.Equal("stack.bias", e.Field);
        Assert.Contains(problem, e.Problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_StackBias_ZeroIsAllowedOnAnyStack()
    {
        // A zero bias is the unbiased calculation: no element limit applies (1e6 periods, 2e6 elements).
        var s = StructureFile.Parse("""
            {"name": "s", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": 1.5, "potential": 0.3, "mass": 0.092}],
             "stack": {"periods": 1000000, "bias": "0 meV"}}
            """, "s.json");
        Assert.Equal(0.0, s.StackBias.ElectronVolts);
    }
}

public sealed class StructureFileSmoothTest
{
    [Fact]
    public void Parse_Fourier_IsTheLibrarySegment()
    {
        var s = StructureFile.Parse("""
            {"name": "f", "cell": [{"fourier": {"period": "40 Å", "constant": "10 meV", "cosine": [0.2, "50 meV"], "sine": [0, 0.01], "mass": 0.067}}]}
            """, "f.json");
        var segment = Assert.IsType<FourierSegment>(s.Cell.Elements[0]);
        Assert.Equal(4.0, segment.Width.Nanometres, 1e-15);
        Assert.Equal(0.01, segment.Constant.ElectronVolts, 1e-17);
        Assert.Equal(new[] { 0.2, 0.05 }, segment.CosineElectronVolts.ToArray(), new ToleranceComparer(1e-17));
        Assert.Equal(new[] { 0.0, 0.01 }, segment.SineElectronVolts.ToArray());
        // The potential at x = 0 is constant + sum of cosines (cos 0 = 1).
        Assert.Equal(0.01 + 0.2 + 0.05, segment.PotentialAt(0), 1e-15);
    }

    [Fact]
    public void Parse_Profile_StartsAtZeroAndInterpolatesLinearly()
    {
        var s = StructureFile.Parse("""
            {"name": "p", "cell": [{"profile": {"positions": [10, 11, 13], "potentials": [0.3, 0.1, "300 meV"], "mass": 0.067}}]}
            """, "p.json");
        var segment = Assert.IsType<SampledSegment>(s.Cell.Elements[0]);
        Assert.Equal(3.0, segment.Width.Nanometres);
        // Linear interpolation halfway between the samples at 1 and 3 nm (from the first sample).
        Assert.Equal(0.2, segment.PotentialAt(2.0), 1e-15);
    }

    [Theory]
    [InlineData("""{"fourier": {"period": 0, "mass": 1}}""", "cell[0].fourier.period")]
    [InlineData("""{"fourier": {"period": 4, "cosine": ["1 V"], "mass": 1}}""", "cell[0].fourier.cosine[0]")]
    [InlineData("""{"fourier": {"period": 4}}""", "cell[0].fourier.mass")]
    [InlineData("""{"profile": {"positions": [0, 1], "potentials": [0], "mass": 1}}""", "cell[0].profile")]
    [InlineData("""{"profile": {"positions": [0, 2, 1], "potentials": [0, 0, 0], "mass": 1}}""", "cell[0].profile")]
    [InlineData("""{"profile": {"positions": 3, "potentials": [0], "mass": 1}}""", "cell[0].profile.positions")]
    public void Parse_BadSmoothSegment_NamesTheField(string element, string field)
    {
        var e = Assert.Throws<StructureFileException>(() => StructureFile.Parse("""{"name": "s", "cell": [""" + element + "]}", "s.json"));
        Assert.Equal(field, e.Field);
    }

    private sealed class ToleranceComparer(double tolerance) : IEqualityComparer<double>
    {
        public bool Equals(double x, double y) => Math.Abs(x - y) <= tolerance;

        public int GetHashCode(double obj) => 0;
    }
}
