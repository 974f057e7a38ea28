// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Units;

/// <summary>
/// The one table of physical constants used by the library: CODATA 2018 recommended values
/// (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021); NIST SP 961).
/// </summary>
/// <remarks>
/// ħ is computed from the exact Planck constant as h/(2π) rather than taken from the rounded
/// published ħ, which would shift ħ²/(2m₀) by about 1.2e-9 relative.
/// </remarks>
public static class PhysicalConstants
{
    /// <summary>Planck constant h, J·s (exact in the 2019 SI).</summary>
    public const double PlanckJouleSeconds = 6.62607015e-34;

    /// <summary>Reduced Planck constant ħ = h/(2π), J·s.</summary>
    public const double ReducedPlanckJouleSeconds = PlanckJouleSeconds / (2.0 * Math.PI);

    /// <summary>Elementary charge e, C (exact in the 2019 SI); also joules per electronvolt.</summary>
    public const double ElementaryChargeCoulombs = 1.602176634e-19;

    /// <summary>Electron rest mass m₀, kg (CODATA 2018, relative uncertainty 3.0e-10).</summary>
    public const double ElectronMassKilograms = 9.1093837015e-31;

    /// <summary>Boltzmann constant k_B, J/K (exact in the 2019 SI).</summary>
    public const double BoltzmannJoulesPerKelvin = 1.380649e-23;

    /// <summary>Boltzmann constant k_B in eV/K.</summary>
    public const double BoltzmannElectronVoltsPerKelvin = BoltzmannJoulesPerKelvin / ElementaryChargeCoulombs;

    /// <summary>Reduced Planck constant in eV·s.</summary>
    public const double ReducedPlanckElectronVoltSeconds = ReducedPlanckJouleSeconds / ElementaryChargeCoulombs;

    /// <summary>
    /// The kinetic-energy scale ħ²/(2m₀) in eV·nm² (≈ 0.0380998): for a particle of relative mass
    /// m, E = (ħ²/2m₀)·k²/m with k in 1/nm.
    /// </summary>
    public const double HbarSquaredOverTwoElectronMassEvNm2 =
        ReducedPlanckJouleSeconds * ReducedPlanckJouleSeconds
        / (2.0 * ElectronMassKilograms) / ElementaryChargeCoulombs * 1e18;

    /// <summary>The unified atomic mass unit u in electron masses, m_u/m₀ (CODATA 2018, relative uncertainty 2.9e-11).</summary>
    public const double AtomicMassUnitElectronMasses = 1822.888486209;

    /// <summary>The Bohr radius a₀ in nm (CODATA 2018, 0.052 917 721 090 3 nm).</summary>
    public const double BohrRadiusNanometres = 0.0529177210903;

    /// <summary>Metres per nanometre.</summary>
    public const double MetresPerNanometre = 1e-9;

    /// <summary>Speed of light in vacuum c, m/s (exact in the SI).</summary>
    public const double SpeedOfLightMetresPerSecond = 299_792_458.0;

    /// <summary>Vacuum electric permittivity ε₀, F/m (CODATA 2018, relative uncertainty 1.5e-10).</summary>
    public const double VacuumPermittivityFaradsPerMetre = 8.8541878128e-12;

    /// <summary>hc/e in eV·nm (≈ 1239.842): a photon of energy E eV has the vacuum wavelength (hc/e)/E nm.</summary>
    public const double PhotonEnergyWavelengthElectronVoltNanometres =
        PlanckJouleSeconds * SpeedOfLightMetresPerSecond / ElementaryChargeCoulombs / MetresPerNanometre;
}
