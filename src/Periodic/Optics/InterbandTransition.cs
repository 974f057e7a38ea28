// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Materials;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>One interband transition e_n → h_m of an <see cref="InterbandSpectrum"/>: energy, envelope overlap, wavelength.</summary>
public readonly struct InterbandTransition
{
    internal InterbandTransition(int electron, Carrier hole, int holeLevel, double energy, double overlap)
    {
        ElectronLevel = electron;
        Hole = hole;
        HoleLevel = holeLevel;
        EnergyElectronVolts = energy;
        Overlap = overlap;
    }

    /// <summary>The electron level, counted from 1.</summary>
    public int ElectronLevel { get; }

    /// <summary>The hole band: <see cref="Carrier.HeavyHole"/> or <see cref="Carrier.LightHole"/>.</summary>
    public Carrier Hole { get; }

    /// <summary>The hole level, counted from 1 (from the top of the valence band down).</summary>
    public int HoleLevel { get; }

    /// <summary>Photon energy E(e_n) − E(h_m) on the absolute scale, eV: the band gap at the temperature plus both confinement energies.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The envelope overlap ⟨e_n|h_m⟩ (signed; real envelopes, positive in the left lead).</summary>
    public double Overlap { get; }

    /// <summary>|⟨e_n|h_m⟩|², the envelope factor of the transition's strength (in [0, 1]).</summary>
    public double OverlapSquared => Overlap * Overlap;

    /// <summary>Vacuum wavelength of the transition, nm.</summary>
    public double WavelengthNanometres => PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / EnergyElectronVolts;

    /// <summary>Vacuum wavelength of the transition, µm.</summary>
    public double WavelengthMicrometres => WavelengthNanometres / 1000;

    /// <summary>The label used in tables: e1-hh1, e2-lh1, …</summary>
    public string Label => string.Create(CultureInfo.InvariantCulture, $"e{ElectronLevel}-{(Hole == Carrier.HeavyHole ? "hh" : "lh")}{HoleLevel}");

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{Label}: {EnergyElectronVolts:G8} eV ({WavelengthNanometres:G6} nm), |<e|h>|² = {OverlapSquared:G6}");
}
