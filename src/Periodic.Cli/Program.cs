// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

// Placeholder until the command-line issue lands: prints the band table of a built-in example.
var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25),
    EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));
Console.WriteLine(BandStructure.Compute(cell, 4));
return 0;
