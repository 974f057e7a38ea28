// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// Current–voltage curve of a double-barrier diode under bias: resonance position, peak transmission and the
// Tsu–Esaki current density. A design guide only: no space charge, no scattering, no self-consistent potential.
// Run: dotnet run docs/examples/diode-current.cs
#:project ../../src/Periodic/Periodic.csproj

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

// Demo scenario: 2.5 nm barriers 0.3 eV high around a 5 nm well (GaAs-like mass everywhere), 5 nm spacers on each
// side, contacts of well material with their Fermi level 40 meV above the band edge, at 77 K.
var mass = EffectiveMass.FromElectronMasses(0.067);
Layer Slab(double nm, double ev) => Layer.Create(Length.FromNanometres(nm), Energy.FromElectronVolts(ev), mass);
var contact = Lead.Create(default, mass);
var diode = LayerStack.Create(contact, contact, Slab(5, 0), Slab(2.5, 0.3), Slab(5, 0), Slab(2.5, 0.3), Slab(5, 0));
var fermiLevel = Energy.FromElectronVolts(0.04);
var temperature = Temperature.FromKelvin(77);

var level = StackTransmission.Create(diode).FindResonances(0.005, 0.25).Resonances[0];
Console.WriteLine($"{diode.Thickness.Nanometres} nm diode; resonance at zero bias: {level.EnergyElectronVolts:F4} eV, width {level.WidthElectronVolts * 1e3:F3} meV");
Console.WriteLine("  bias (V)   resonance (eV)   J (A/cm2)     error (A/cm2)");
for (var volts = 0.02; volts <= 0.30001; volts += 0.04)
{
    // An electron's potential energy drops by eU across the layers.
    var biased = StackTransmission.Create(diode, Energy.FromElectronVolts(volts));
    var peaks = biased.FindResonances(-volts + 1e-4, 0.25).Resonances;
    var peak = peaks.Count > 0 ? $"{peaks[0].EnergyElectronVolts,10:F4}" : "      none";
    var j = biased.CurrentDensity(fermiLevel, temperature);
    Console.WriteLine($"  {volts,7:F2}     {peak}     {j.AmperesPerSquareCentimetre,11:E3}   {j.ErrorEstimateAmperesPerSquareMetre * 1e-4,9:E1}{(j.IsConverged ? "" : "  (not converged)")}");
}
Console.WriteLine("The current peaks while the resonance sits between the contacts' band edge and Fermi level, then drops:");
Console.WriteLine("negative differential resistance. Compare with measured curves before relying on the numbers.");
