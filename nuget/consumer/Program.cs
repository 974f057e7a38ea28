// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using Periodic.Bands;
using Periodic.Serialization;

// Reads a structure, finds its bands and checks the result is sane; exit code 0 when it is.
var structure = StructureFile.Parse("""
    {"name": "consumer check", "cell": [
      {"width": "5 nm", "potential": 0, "mass": 0.067},
      {"width": "2 nm", "potential": "250 meV", "mass": 0.092}]}
    """, "consumer.json");
var bands = BandStructure.Compute(structure.Cell, 3);
Console.WriteLine(bands);
var ordered = bands.Bands.Zip(bands.Bands.Skip(1)).All(p => p.First.TopElectronVolts < p.Second.BottomElectronVolts);
if (!ordered || bands.Bands[0].BottomElectronVolts <= 0)
{
    Console.Error.WriteLine("consumer: unexpected band structure");
    return 1;
}
// The informational version is the package version (plus the commit): .ci/package-checks.sh compares it with the one it packed.
Console.WriteLine($"consumer: OK, library {typeof(BandStructure).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion}");
return 0;
