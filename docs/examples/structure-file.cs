// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// Read a structure file (the same JSON the periodic tool reads) and tabulate k(E) across a band and gap.
// Run: dotnet run docs/examples/structure-file.cs
#:project ../../src/Periodic/Periodic.csproj

using Periodic.Bands;
using Periodic.Serialization;

var here = AppContext.GetData("EntryPointFileDirectoryPath") as string ?? Path.Combine("docs", "examples");
var structure = StructureFile.Load(Path.Combine(here, "structures", "delta-comb.json"));
Console.WriteLine(structure);

var bands = BandStructure.Compute(structure.Cell, count: 2);
Console.WriteLine(bands);

Console.WriteLine("  E (eV)     Re k (1/nm)   Im k (1/nm)   band");
var top = bands.Bands[1].TopElectronVolts;
for (var i = 0; i <= 10; i++)
{
    var e = top * i / 10.0;
    var k = bands.WavevectorAt(e);
    Console.WriteLine($"  {e,8:F4}   {k.RealPerNanometre,11:F6}   {k.ImaginaryPerNanometre,11:F6}   {bands.BandIndexAt(e)}");
}

// Errors name the file, line, column and field:
try
{
    StructureFile.Parse("{\"name\": \"x\", \"cell\": [{\"width\": \"2 parsecs\", \"potential\": 0, \"mass\": 1}]}", "inline.json");
}
catch (StructureFileException e)
{
    Console.WriteLine($"as expected: {e.Message}");
}
