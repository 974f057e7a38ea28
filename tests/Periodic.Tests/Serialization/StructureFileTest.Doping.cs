// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Serialization;

namespace Periodic.Tests.Serialization;

/// <summary>The doping fields of a layer: donors, acceptors, sheetDonors, permittivity, and the file's temperature.</summary>
public sealed partial class StructureFileTest
{
    [Fact]
    public void Parse_ExplicitDopedCell_ReadsDensitiesInTheirUnits()
    {
        var structure = StructureFile.Parse("""
            {"name": "doped", "temperature": "77 K", "cell": [
              {"width": 4, "potential": 0.25, "mass": 0.092, "permittivity": 12.2, "donors": "2e18 cm^-3", "acceptors": 1e17},
              {"delta": 0.01},
              {"width": 8, "potential": 0, "mass": 0.067, "permittivity": 12.9, "sheetDonors": "0.01 nm^-2"}]}
            """, "doped.json");
        var doping = Assert.IsType<Periodic.SpaceCharge.DopedCell>(structure.Doping);
        Assert.Equal(77, doping.Temperature.Kelvin);
        Assert.Equal(2e18, doping.Doping[0].DonorsPerCubicCentimetre);
        Assert.Equal(1e17, doping.Doping[0].AcceptorsPerCubicCentimetre);
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
    [InlineData("""{"width": 4, "potential": 0, "mass": 0.067, "permittivity": 12, "donors": 1e17, "acceptors": 2e17}""", "cell")]
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
}
