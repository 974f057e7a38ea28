// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// Transmission of a finite superlattice between leads, against the minibands of the infinite crystal.
// Run: dotnet run docs/examples/transmission.cs
#:project ../../src/Periodic/Periodic.csproj

using Periodic.Bands;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

// Demo scenario: a 12-period miniband filter, 5 nm wells (0.067 m0) and 2 nm barriers 0.25 eV high (0.092 m0),
// contacted by leads of well material.
var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25),
    EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));
var bands = BandStructure.Compute(cell, count: 2);
var lead = Lead.Like((Layer)cell.Elements[0]);
var stack = StackTransmission.Create(LayerStack.Periodic(lead, cell, periods: 12, lead));

Console.WriteLine($"{stack.Stack.Thickness.Nanometres} nm stack; band 1 of the infinite crystal: {bands.Bands[0]}");
Console.WriteLine("  E (eV)    log10 T    where");
for (var e = 0.02; e <= 0.30001; e += 0.02)
{
    var r = stack.Evaluate(e);
    var where = bands.BandIndexAt(e) is var n and > 0 ? $"band {n}" : "gap";
    Console.WriteLine($"  {e,6:F3}   {r.Log10Transmission,8:F3}    {where}");
}
