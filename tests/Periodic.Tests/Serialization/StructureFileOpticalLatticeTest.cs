// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Serialization;

public sealed class StructureFileOpticalLatticeTest
{
    [Fact]
    public void Parse_OpticalLattice_BuildsTheLatticeCell()
    {
        var s = StructureFile.Parse("""
            {"name": "l", "opticalLattice": {"wavelength": "1.064 µm", "depth": "8 E_R", "mass": "40.9618252579 u",
              "secondWave": {"wavelength": "2128 nm", "depth": 0.5, "phase": "45 deg"}}}
            """, "l.json");
        var lattice = s.OpticalLattice!;
        Assert.Equal(1064, lattice.Wavelength.Nanometres, 1e-9);
        Assert.Equal(8, lattice.DepthInRecoilEnergies);
        Assert.Equal(40.9618252579, lattice.Species.MassAtomicMassUnits);
        Assert.Equal(Math.PI / 4, lattice.SecondWave!.PhaseRadians, 1e-15);
        Assert.Same(lattice.Cell, s.Cell);
        // Two periods of the first wave make the cell (λ₂ = 2λ).
        Assert.Equal(1064, s.Cell.Period.Nanometres, 1e-9);
        var expected = OpticalLattice.Create(Length.FromNanometres(1064), 8, AtomicSpecies.FromMass(40.9618252579))
            .WithSecondWave(Length.FromNanometres(2128), 0.5, Math.PI / 4);
        var a = (FourierSegment)s.Cell.Elements[0];
        var b = (FourierSegment)expected.Cell.Elements[0];
        Assert.Equal(b.CosineElectronVolts, a.CosineElectronVolts);
        Assert.Equal(b.SineElectronVolts, a.SineElectronVolts);
    }

    [Theory]
    [InlineData("\"cell\": [{\"width\": 1, \"potential\": 0, \"mass\": 1}], \"opticalLattice\": {\"wavelength\": 1064, \"depth\": 5, \"species\": \"87Rb\"}", "cell")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 1064, \"depth\": 5, \"species\": \"87Rb\", \"mass\": 87}", "opticalLattice.mass")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 0, \"depth\": 5, \"species\": \"87Rb\"}", "opticalLattice.wavelength")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 1064, \"depth\": \"5 eV\", \"species\": \"87Rb\"}", "opticalLattice.depth")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 1064, \"depth\": 5, \"species\": \"Xx\"}", "opticalLattice.species")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 1064, \"depth\": 5, \"species\": \"87Rb\", \"secondWave\": {\"wavelength\": 800, \"depth\": -1}}", "opticalLattice.secondWave.depth")]
    [InlineData("\"opticalLattice\": {\"wavelength\": 1064, \"depth\": 5, \"species\": \"87Rb\", \"colour\": \"green\"}", "colour")]
    public void Parse_BadOpticalLattice_NamesTheField(string body, string field)
    {
        var error = Assert.Throws<StructureFileException>(() => StructureFile.Parse("{\"name\": \"x\", " + body + "}", "x.json"));
        Assert.Contains(field, error.Message, StringComparison.Ordinal);
    }
}
