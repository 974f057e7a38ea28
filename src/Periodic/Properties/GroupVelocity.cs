// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Properties;

/// <summary>
/// The group velocity v = (1/ħ) dE/dk of one Bloch state, with the state it belongs to.
/// </summary>
public readonly record struct GroupVelocity
{
    /// <summary>Metres per second per eV·nm of slope: 1e-9 m/nm divided by ħ in eV·s.</summary>
    internal const double MetresPerSecondPerElectronVoltNanometre = PhysicalConstants.MetresPerNanometre / PhysicalConstants.ReducedPlanckElectronVoltSeconds;

    internal GroupVelocity(int bandIndex, double wavevector, double energy, double slope)
    {
        BandIndex = bandIndex;
        WavevectorPerNanometre = wavevector;
        EnergyElectronVolts = energy;
        SlopeElectronVoltNanometres = slope;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The Bloch wavevector k in 1/nm, in [−π/d, π/d].</summary>
    public double WavevectorPerNanometre { get; }

    /// <summary>The energy E_n(k), eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The slope dE/dk in eV·nm.</summary>
    public double SlopeElectronVoltNanometres { get; }

    /// <summary>The group velocity (1/ħ) dE/dk in m/s.</summary>
    public double MetresPerSecond => SlopeElectronVoltNanometres * MetresPerSecondPerElectronVoltNanometre;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"band {BandIndex}, k = {WavevectorPerNanometre:G8} /nm, E = {EnergyElectronVolts:G10} eV: dE/dk = {SlopeElectronVoltNanometres:G10} eV nm, v = {MetresPerSecond:G8} m/s");
}
