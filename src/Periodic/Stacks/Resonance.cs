// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// One transmission peak of a stack: its energy, height, full width at half maximum Γ and the
/// lifetime ħ/Γ of the quasi-bound state behind it.
/// </summary>
public readonly struct Resonance
{
    internal Resonance(double energy, double energyError, double logPeak, double lowerHalf, double upperHalf)
    {
        EnergyElectronVolts = energy;
        EnergyErrorElectronVolts = energyError;
        LogPeakTransmission = logPeak;
        HalfMaximumLowerElectronVolts = lowerHalf;
        HalfMaximumUpperElectronVolts = upperHalf;
    }

    /// <summary>Energy of the transmission maximum, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>Error bound of <see cref="EnergyElectronVolts"/>, eV (search tolerance and the difference-step estimate).</summary>
    public double EnergyErrorElectronVolts { get; }

    /// <summary>T at the peak (1 for a symmetric double barrier, up to rounding).</summary>
    public double PeakTransmission => Math.Exp(LogPeakTransmission);

    /// <summary>ln T at the peak; finite even for peaks far below 1e-300.</summary>
    public double LogPeakTransmission { get; }

    /// <summary>The energy below the peak where T falls to half its peak value, eV; −∞ if T stays above half down to the previous minimum.</summary>
    public double HalfMaximumLowerElectronVolts { get; }

    /// <summary>The energy above the peak where T falls to half its peak value, eV; +∞ if T stays above half up to the next minimum.</summary>
    public double HalfMaximumUpperElectronVolts { get; }

    /// <summary>
    /// True when both half-maximum points exist and are distinct, so the width is measured. False for a broad
    /// peak whose T never falls to half, and for a peak narrower than double precision resolves at its energy
    /// (both half-maximum points coincide): its width is then unknown, not zero.
    /// </summary>
    public bool HasWidth => double.IsFinite(HalfMaximumLowerElectronVolts) && double.IsFinite(HalfMaximumUpperElectronVolts)
        && HalfMaximumUpperElectronVolts > HalfMaximumLowerElectronVolts;

    /// <summary>The full width at half maximum Γ, eV; +∞ (unknown) when <see cref="HasWidth"/> is false.</summary>
    public double WidthElectronVolts => HasWidth ? HalfMaximumUpperElectronVolts - HalfMaximumLowerElectronVolts : double.PositiveInfinity;

    /// <summary>Lifetime τ = ħ/Γ of the quasi-bound state, s (the Breit–Wigner relation); 0 when the width is undefined.</summary>
    public double LifetimeSeconds => HasWidth ? PhysicalConstants.ReducedPlanckElectronVoltSeconds / WidthElectronVolts : 0.0;

    /// <inheritdoc />
    public override string ToString() => HasWidth
        ? string.Create(CultureInfo.InvariantCulture,
            $"Resonance at {EnergyElectronVolts:G12} eV (± {EnergyErrorElectronVolts:G2}), T = {PeakTransmission:G8}, FWHM = {WidthElectronVolts:G6} eV, lifetime = {LifetimeSeconds:G4} s")
        : string.Create(CultureInfo.InvariantCulture,
            $"Peak at {EnergyElectronVolts:G12} eV (± {EnergyErrorElectronVolts:G2}), T = {PeakTransmission:G8}, no half-maximum width (shallow peak)");
}
