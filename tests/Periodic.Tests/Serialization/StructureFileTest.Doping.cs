// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Serialization;
using Periodic.SpaceCharge;

namespace Periodic.Tests.Serialization;

/// <summary>The doping fields of a layer: donors, acceptors, sheetDonors, permittivity, and the file's temperature.</summary>
public sealed partial class StructureFileTest
{
    [Fact]
    public void Parse_ExplicitDopedCell_ReadsDensitiesInTheirUnits()
    {
        var structure = StructureFile.Parse("""
            {"name": "doped", "temperature": "77 K", "cell": [
              {"width": 4, "potential": 0.25, "mass": 0.092, "permittivity": 12.2, "donors": "2e18 cm^-3"},
              {"delta": 0.01},
              {"width": 8, "potential": 0, "mass": 0.067, "permittivity": 12.9, "sheetDonors": "0.01 nm^-2"}]}
            """, "doped.json");
        var doping = Assert.IsType<Periodic.SpaceCharge.DopedCell>(structure.Doping);
        Assert.Equal(77, doping.Temperature.Kelvin);
        Assert.Equal(2e18, doping.Doping[0].DonorsPerCubicCentimetre);
        Assert.Equal(12.2, doping.Doping[0].RelativePermittivity);
        Assert.False(doping.Doping[1].IsDoped);
        Assert.Equal(1e12, doping.Doping[2].SheetDonorsPerSquareCentimetre, 1e-3); // 1 nm⁻² = 1e14 cm⁻² (definition of the units)
        Assert.Same(structure.Cell, doping.Cell); // the rigid cell: the solver applies the space charge
    }

    [Fact]
    public void Parse_MaterialDopedCell_TakesPermittivityFromTheMaterial()
    {
        var structure = StructureFile.Parse("""
            {"name": "m", "temperature": "300 K", "cell": [
              {"material": "Al0.3Ga0.7As", "width": 5, "donors": "1e18 cm^-3"},
              {"material": "GaAs", "width": 8},
              {"material": "GaAs", "width": 2, "permittivity": 13.1}]}
            """, "m.json");
        var doping = structure.Doping!;
        Assert.Equal(Material.GaAs.StaticRelativePermittivity, doping.Doping[1].RelativePermittivity);
        Assert.Equal(13.1, doping.Doping[2].RelativePermittivity); // a number overrides the material's value
        // Alloys interpolate linearly between the endpoint binaries (Vegard-like interpolation; common practice, no single source).
        var expected = 0.3 * Material.AlAs.StaticRelativePermittivity!.Value + 0.7 * Material.GaAs.StaticRelativePermittivity!.Value;
        Assert.Equal(expected, doping.Doping[0].RelativePermittivity, 1e-12);
    }

    [Fact]
    public void Parse_DonorIonisationEnergy_InItsUnits()
    {
        var structure = StructureFile.Parse("""
            {"name": "i", "temperature": 30, "cell": [
              {"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12.9, "donors": 1e16, "donorIonisationEnergy": "6 meV"},
              {"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12.9}]}
            """, "i.json");
        Assert.Equal(0.006, structure.Doping!.Doping[0].DonorIonisationEnergyElectronVolts!.Value, 1e-15); // 1 meV = 1e-3 eV
        Assert.Null(structure.Doping.Doping[1].DonorIonisationEnergyElectronVolts);
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "i", "temperature": 30, "cell": [{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12.9, "donors": 1e16, "donorIonisationEnergy": -0.001}]}""", "i.json"));
        Assert.Equal("cell[0].donorIonisationEnergy", error.Field);
    }

    [Fact]
    public void Parse_UndopedFile_HasNoDoping()
    {
        Assert.Null(StructureFile.Parse("""{"name": "u", "cell": [{"width": 4, "potential": 0, "mass": 0.067}]}""", "u.json").Doping);
    }

    [Theory]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": -1}""", "cell[0].donors")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": "1e22 cm^-3"}""", "cell[0].donors")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 0, "donors": 1e17}""", "cell[0].permittivity")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": -2, "donors": 1e17}""", "cell[0].permittivity")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "donors": 1e17}""", "cell[0].permittivity")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "sheetDonors": "1e16 cm^-2"}""", "cell[0].sheetDonors")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": "1e17 furlongs"}""", "cell[0].donors")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": 1e17, "acceptors": 2e17}""", "cell[0].acceptors")]
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": 1e17, "acceptorIonisationEnergy": 0.02}""", "cell[0].acceptorIonisationEnergy")]
    public void Parse_BadDoping_NamesTheFieldWithItsPlace(string layer, string field)
    {
        var json = "{\"name\": \"bad\", \"temperature\": 300,\n \"cell\": [" + layer + "]}";
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(json, "bad.json"));
        Assert.Equal(field, error.Field);
        Assert.Equal(2, error.LineNumber);
    }

    [Fact]
    public void Parse_DopedWithoutTemperature_IsRefused()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "t", "cell": [{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": 1e17}]}""", "t.json"));
        Assert.Equal("temperature", error.Field);
    }

    [Fact]
    public void Parse_TemperatureWithoutDopingOrMaterials_IsRefused()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "t", "temperature": 300, "cell": [{"width": 4, "potential": 0, "mass": 0.067}]}""", "t.json"));
        Assert.Equal("temperature", error.Field);
    }

    [Fact]
    public void Parse_MaterialAcceptors_ModelHeavyAndLightHoles()
    {
        var structure = StructureFile.Parse("""
            {"name": "p", "temperature": "77 K", "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4, "acceptors": "5e18 cm^-3", "acceptorIonisationEnergy": "26 meV"},
              {"material": "GaAs", "width": 8}]}
            """, "p.json");
        var doping = structure.Doping!;
        Assert.Equal(5e18, doping.Doping[0].AcceptorsPerCubicCentimetre);
        Assert.Equal(0.026, doping.Doping[0].AcceptorIonisationEnergyElectronVolts!.Value, 1e-15); // 1 meV = 1e-3 eV
        Assert.Equal(["heavy holes", "light holes"], doping.ValenceBands.Select(b => b.Name));
        // The hole cells are the recipe built for each hole carrier; the edge is the highest valence-band edge below the lowest
        // conduction-band edge, i.e. minus the GaAs gap at 77 K here (both edges belong to GaAs): Varshni's law with GaAs's
        // parameters (Vurgaftman et al. 2001 [from memory]: 1.519 eV, 0.5405 meV/K, 204 K).
        var gap = 1.519 - 0.5405e-3 * 77 * 77 / (77 + 204);
        Assert.All(doping.ValenceBands, b => Assert.Equal(-gap, b.EdgeElectronVolts, 1e-12));
        var heavy = StructureRecipe.Create(Periodic.Units.Temperature.FromKelvin(77)).WithCarrier(Carrier.HeavyHole)
            .Add(RecipeLayer.Create(StructureRecipe.ParseMaterial("Al0.3Ga0.7As"), Periodic.Units.Length.FromNanometres(4)))
            .Add(RecipeLayer.Create(Material.GaAs, Periodic.Units.Length.FromNanometres(8))).Build();
        for (var i = 0; i < 2; i++)
        {
            var (expected, actual) = ((Periodic.Structures.Layer)heavy.Cell.Elements[i], (Periodic.Structures.Layer)doping.ValenceBands[0].Cell.Elements[i]);
            Assert.Equal(expected.Potential.ElectronVolts, actual.Potential.ElectronVolts);
            Assert.Equal(expected.Mass.ElectronMasses, actual.Mass.ElectronMasses);
        }
    }

    [Fact]
    public void Parse_DopedHoleCarrierFile_IsRefused()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "h", "temperature": 300, "carrier": "heavyHole", "cell": [{"material": "GaAs", "width": 4, "acceptors": 1e17}]}""", "h.json"));
        Assert.Equal("carrier", error.Field);
    }

    [Fact]
    public void Parse_PTypeCellWithStackOfMaterials_StackHasHeavyAndLightHoles()
    {
        var structure = StructureFile.Parse("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4, "acceptors": "5e18 cm^-3"},
              {"material": "GaAs", "width": 8}],
             "stack": {"periods": 3, "leads": {"material": "Al0.3Ga0.7As"}}}
            """, "p.json");
        Assert.NotNull(structure.Doping);
        Assert.Null(structure.StackSpaceChargeRefusal);
        var stack = Assert.IsType<Periodic.SpaceCharge.DopedStack>(structure.StackDoping);
        Assert.Equal(["heavy holes", "light holes"], stack.ValenceBands.Select(b => b.Name));
        // The hole stack is the cell's hole cell repeated, between leads of the barrier's valence band, on the same scale as the
        // cell's valence bands (the structure built for heavy holes; common practice, no single source).
        var cellBand = structure.Doping!.ValenceBands[0];
        var stackBand = stack.ValenceBands[0];
        Assert.Equal(cellBand.EdgeElectronVolts, stackBand.EdgeElectronVolts);
        Assert.Same(cellBand.Cell.Elements[0].GetType(), stackBand.Stack.Parts[0].Cell!.Elements[0].GetType());
        var barrier = (Periodic.Structures.Layer)cellBand.Cell.Elements[0];
        Assert.Equal(barrier.Potential.ElectronVolts, stackBand.Stack.LeftLead.Potential.ElectronVolts);
        Assert.Equal(barrier.Mass.ElectronMasses, stackBand.Stack.LeftLead.Mass.ElectronMasses);
        Assert.Equal(3, stackBand.Stack.Parts[0].Repetitions);
    }

    [Fact]
    public void Parse_PTypeCellWithStackLeadOfPotential_StackSpaceChargeIsRefused()
    {
        // A lead given by potential and mass has no valence band to take the holes from.
        var structure = StructureFile.Parse("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4, "acceptors": "5e18 cm^-3"},
              {"material": "GaAs", "width": 8}],
             "stack": {"periods": 3, "leads": {"potential": 0.25, "mass": 0.092}}}
            """, "p.json");
        Assert.NotNull(structure.Doping);
        Assert.Null(structure.StackDoping);
        Assert.Contains("every layer and lead is of a material with a hole mass", structure.StackSpaceChargeRefusal);
    }

    [Fact]
    public void Parse_UndopedCellWithAcceptorsInTheStackLayers_StackHasHeavyAndLightHoles()
    {
        // Doping only in the stack's own layers (a p-type contact) must give the stack its holes as a doped cell does: the
        // acceptors' holes are carriers of the valence band (common practice, no single source).
        var structure = StructureFile.Parse("""
            {"name": "p", "temperature": 77, "cell": [
              {"material": "Al0.3Ga0.7As", "width": 4},
              {"material": "GaAs", "width": 8}],
             "stack": {"leads": {"material": "GaAs"}, "parts": [
               {"material": "GaAs", "width": 20, "acceptors": "1e18 cm^-3"},
               {"material": "Al0.3Ga0.7As", "width": 4},
               {"material": "GaAs", "width": 8}]}}
            """, "p.json");
        Assert.Null(structure.Doping);
        Assert.Null(structure.StackSpaceChargeRefusal);
        var stack = Assert.IsType<Periodic.SpaceCharge.DopedStack>(structure.StackDoping);
        Assert.Equal(["heavy holes", "light holes"], stack.ValenceBands.Select(b => b.Name));
    }

    [Fact]
    public void Parse_PermittivityAsAString_SaysToWriteItAsABareNumber()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "e", "temperature": 300, "cell": [{"width": 4, "potential": 0, "mass": 0.067, "permittivity": "12.9", "donors": 1e17}]}""", "e.json"));
        Assert.Equal("cell[0].permittivity", error.Field);
        Assert.Contains("write 12.9 as a bare number, not as a string", error.Message);
    }

    [Fact]
    public void Parse_MisspeltLeadFieldInACellOfMaterials_ListsMaterialAmongTheAllowed()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "l", "temperature": 300, "cell": [{"material": "GaAs", "width": 4}], "stack": {"periods": 2, "leads": {"materal": "GaAs"}}}""", "l.json"));
        Assert.Contains("allowed here: material, potential, mass", error.Message);
    }

    [Fact]
    public void Parse_DopedWithTemperatureOutOfRange_NamesTheRangeInKelvin()
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse(
            """{"name": "t", "temperature": 0.5, "cell": [{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": 1e17}]}""", "t.json"));
        Assert.Equal("temperature", error.Field);
        Assert.Contains($"must be between {DopedCell.MinTemperatureKelvin} K and {DopedCell.MaxTemperatureKelvin} K", error.Message);
        Assert.Contains("got 0.5 K", error.Message);
    }
}
