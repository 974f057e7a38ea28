// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Optics;

/// <summary>One line of an <see cref="AbsorptionSpectrum"/>: a resolved transition with the electrons that drive it.</summary>
public readonly struct AbsorptionLine
{
    internal AbsorptionLine(int from, int to, double bare, double shift, double densityDifference, double dipole, double integrated)
    {
        From = from;
        To = to;
        TransitionEnergyElectronVolts = bare;
        DepolarisationShiftElectronVolts = shift;
        DensityDifferencePerSquareCentimetre = densityDifference;
        DipoleNanometres = dipole;
        IntegratedAbsorbanceElectronVolts = integrated;
    }

    /// <summary>Lower level (counted from 1).</summary>
    public int From { get; }

    /// <summary>Upper level (counted from 1).</summary>
    public int To { get; }

    /// <summary>The bare transition energy E_to − E_from, eV.</summary>
    public double TransitionEnergyElectronVolts { get; }

    /// <summary>The depolarisation shift, eV (0 unless requested).</summary>
    public double DepolarisationShiftElectronVolts { get; }

    /// <summary>Where the line is centred: the bare energy plus the depolarisation shift, eV.</summary>
    public double EnergyElectronVolts => TransitionEnergyElectronVolts + DepolarisationShiftElectronVolts;

    /// <summary>n_from − n_to, electrons per cm² (sheet densities of the whole stack).</summary>
    public double DensityDifferencePerSquareCentimetre { get; }

    /// <summary>The dipole ⟨from|z|to⟩, nm.</summary>
    public double DipoleNanometres { get; }

    /// <summary>∫αL d(ħω) of this line over the stack thickness L, eV (ω taken at the line centre).</summary>
    public double IntegratedAbsorbanceElectronVolts { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{From} → {To}: {EnergyElectronVolts * 1000:G8} meV (shift {DepolarisationShiftElectronVolts * 1000:G4} meV), Δn = {DensityDifferencePerSquareCentimetre:G4} cm^-2, ∫αL = {IntegratedAbsorbanceElectronVolts:G4} eV");
}
