// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// One intersubband transition from a lower level to a higher one, for light polarised along the growth axis:
/// energy, dipole ⟨from|z|to⟩, oscillator strengths in the length and momentum forms. A transition that could not be
/// resolved says why (<see cref="Status"/>) and refuses to return numbers.
/// </summary>
/// <remarks>
/// Conventions: f = 2m*ω|z|²/ħ with m* = <see cref="IntersubbandSpectrum.ReferenceMassElectronMasses"/> (length form);
/// the momentum form is f_p = 2|⟨from|p_z|to⟩|²/(m*ħω) with p_z = −iħ d/dz. With one mass everywhere the two are equal;
/// with a position-dependent mass the length form equals the momentum form of m*·v, where v = ½{p_z, 1/m(z)} is the
/// velocity of the BenDaniel–Duke Hamiltonian, while f_p weighs p_z itself, so the two differ by about the mass
/// contrast times the share of the states in the barriers.
/// </remarks>
public readonly struct IntersubbandTransition
{
    private readonly double _dipole;
    private readonly double _strength;
    private readonly double _momentumStrength;
    private readonly bool _hasMomentum;

    internal IntersubbandTransition(int from, int to, double energy, double dipole, double strength, double momentumStrength, bool hasMomentum,
        double domainChange, string? problem)
    {
        From = from;
        To = to;
        EnergyElectronVolts = energy;
        _dipole = dipole;
        _strength = strength;
        _momentumStrength = momentumStrength;
        _hasMomentum = hasMomentum;
        DomainChangeFraction = domainChange;
        Problem = problem;
    }

    /// <summary>Number of the lower level (counted from 1).</summary>
    public int From { get; }

    /// <summary>Number of the upper level (counted from 1).</summary>
    public int To { get; }

    /// <summary>Transition energy E_to − E_from, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>Vacuum wavelength of a photon of <see cref="EnergyElectronVolts"/>, µm.</summary>
    public double WavelengthMicrometres => EnergyElectronVolts > 0 ? PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / EnergyElectronVolts / 1000 : double.PositiveInfinity;

    /// <summary>True when the dipole and oscillator strengths are resolved; otherwise <see cref="Status"/> says why.</summary>
    public bool IsResolved => Problem is null;

    /// <summary>"resolved", or why not (levels not separable, a quasi-bound dipole that depends on its normalisation domain).</summary>
    public string Status => Problem ?? "resolved";

    internal string? Problem { get; }

    /// <summary>
    /// For a quasi-bound upper level: the relative change of |z| when the normalisation domain's margin is doubled (0 for bound levels).
    /// </summary>
    public double DomainChangeFraction { get; }

    /// <summary>The dipole matrix element ⟨from|z|to⟩, nm (signed: the wavefunctions are real and positive in the left lead).</summary>
    /// <exception cref="InvalidOperationException">The transition is not resolved (the message says why).</exception>
    public double DipoleNanometres => IsResolved ? _dipole : throw Unresolved();

    /// <summary>Oscillator strength, length form, f = 2m*ω|z|²/ħ (dimensionless).</summary>
    /// <exception cref="InvalidOperationException">The transition is not resolved.</exception>
    public double OscillatorStrength => IsResolved ? _strength : throw Unresolved();

    /// <summary>True when the momentum form is available (parabolic layers only: with energy-dependent masses the states are not orthogonal).</summary>
    public bool HasMomentumForm => IsResolved && _hasMomentum;

    /// <summary>Oscillator strength, momentum form, f_p = 2|⟨from|p_z|to⟩|²/(m*ħω).</summary>
    /// <exception cref="InvalidOperationException">The transition is not resolved, or the stack has non-parabolic layers.</exception>
    public double MomentumOscillatorStrength => HasMomentumForm ? _momentumStrength
        : throw (IsResolved ? new InvalidOperationException("the momentum form is not available for stacks with non-parabolic layers.") : Unresolved());

    private InvalidOperationException Unresolved() => new(string.Create(CultureInfo.InvariantCulture, $"transition {From} → {To} is not resolved: {Problem}"));

    /// <inheritdoc />
    public override string ToString() => IsResolved
        ? string.Create(CultureInfo.InvariantCulture,
            $"{From} → {To}: {EnergyElectronVolts * 1000:G8} meV ({WavelengthMicrometres:G6} µm), z = {_dipole:G8} nm, f = {_strength:G8}{(_hasMomentum ? string.Create(CultureInfo.InvariantCulture, $", f_p = {_momentumStrength:G8}") : "")}")
        : string.Create(CultureInfo.InvariantCulture, $"{From} → {To}: {EnergyElectronVolts * 1000:G8} meV, not resolved: {Problem}");
}
