// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// A design sweep: how the first miniband narrows as the barriers thicken.   Run: dotnet run docs/examples/barrier-sweep.cs
#:project ../../src/Periodic/Periodic.csproj

using Periodic.Bands;
using Periodic.Structures;

// Demo scenario: 6 nm wells (0.067 m0) and 0.23 eV barriers (0.092 m0); barrier width 1 to 8 nm.
Console.WriteLine("barrier (nm)   band 1 (eV)             width (meV)   gap 1 (meV)");
Span<double> widths = stackalloc double[2], potentials = stackalloc double[2], masses = stackalloc double[2];
potentials[0] = 0.0; potentials[1] = 0.23;
masses[0] = 0.067; masses[1] = 0.092;
widths[0] = 6.0;
for (var barrier = 1.0; barrier <= 8.0; barrier += 1.0)
{
    widths[1] = barrier;
    var bands = BandStructure.Compute(UnitCell.FromLayers(widths, potentials, masses), count: 1);
    var band = bands.Bands[0];
    Console.WriteLine($"{barrier,12:F1}   {band.BottomElectronVolts:F5} - {band.TopElectronVolts:F5}   {band.WidthElectronVolts * 1e3,11:F3}   {band.GapAboveElectronVolts * 1e3,11:F2}");
}
