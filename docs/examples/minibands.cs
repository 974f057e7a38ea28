// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// Minibands of a superlattice, E(k) and the complex k in a gap.   Run: dotnet run docs/examples/minibands.cs
#:project ../../src/Periodic/Periodic.csproj

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

// Demo scenario: a miniband filter with 5 nm wells (0.067 m0) and 2 nm barriers 0.25 eV high (0.092 m0).
var cell = UnitCell.KronigPenney(
    wellWidth: Length.FromNanometres(5), barrierWidth: Length.FromNanometres(2),
    barrierHeight: Energy.FromElectronVolts(0.25),
    wellMass: EffectiveMass.FromElectronMasses(0.067), barrierMass: EffectiveMass.FromElectronMasses(0.092));

var bands = BandStructure.Compute(cell, count: 3);
Console.WriteLine(bands);
Console.WriteLine($"largest edge error bound: {bands.MaxEdgeErrorElectronVolts:E2} eV, {bands.CountChecks} oscillation-count checks passed");

// E(k) across band 1, from the zone centre to the boundary pi/d.
var zone = cell.ZoneBoundaryPerNanometre;
foreach (var fraction in new[] { 0.0, 0.25, 0.5, 0.75, 1.0 })
{
    Console.WriteLine($"band 1 at k = {fraction:F2} pi/d: E = {bands.EnergyAt(1, fraction * zone):F6} eV");
}

// Inside the first gap the Bloch wave decays: k = Re k + i Im k.
var gap = bands.Gaps[0];
var middle = 0.5 * (gap.LowerElectronVolts + gap.UpperElectronVolts);
var k = bands.WavevectorAt(middle);
Console.WriteLine($"mid-gap ({middle:F4} eV): {k}, decay length {k.DecayLengthNanometres:F2} nm");
