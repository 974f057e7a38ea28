// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Properties;

/// <summary>A carrier density per unit length of the 1D crystal (spin included), with its error estimate.</summary>
public readonly record struct LinearCarrierDensity
{
    internal LinearCarrierDensity(double fermiLevel, double temperature, double density, double error, int evaluations)
    {
        FermiLevelElectronVolts = fermiLevel;
        TemperatureKelvin = temperature;
        DensityPerNanometre = density;
        ErrorEstimatePerNanometre = error;
        EnergyEvaluations = evaluations;
    }

    /// <summary>The Fermi level μ, eV.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>The density, carriers per nm.</summary>
    public double DensityPerNanometre { get; }

    /// <summary>The density, carriers per cm.</summary>
    public double DensityPerCentimetre => DensityPerNanometre * 1e7;

    /// <summary>Estimated quadrature error (difference of the 20- and 10-point rules, plus the omitted tail), per nm.</summary>
    public double ErrorEstimatePerNanometre { get; }

    /// <summary>How many energies E_n(k) the quadrature evaluated.</summary>
    public int EnergyEvaluations { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"n = {DensityPerNanometre:G10} /nm (+/- {ErrorEstimatePerNanometre:G2}) at mu = {FermiLevelElectronVolts:G10} eV, T = {TemperatureKelvin:G6} K");
}

/// <summary>A carrier density per unit volume of the superlattice (spin included), with its error estimate.</summary>
public readonly record struct VolumeCarrierDensity
{
    internal VolumeCarrierDensity(double fermiLevel, double temperature, double density, double error, int evaluations)
    {
        FermiLevelElectronVolts = fermiLevel;
        TemperatureKelvin = temperature;
        DensityPerCubicNanometre = density;
        ErrorEstimatePerCubicNanometre = error;
        EnergyEvaluations = evaluations;
    }

    /// <summary>The Fermi level μ, eV.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>The density, carriers per nm³.</summary>
    public double DensityPerCubicNanometre { get; }

    /// <summary>The density, carriers per cm³ (1 nm⁻³ = 1e21 cm⁻³).</summary>
    public double DensityPerCubicCentimetre => DensityPerCubicNanometre * 1e21;

    /// <summary>Estimated quadrature error (difference of the 20- and 10-point rules, plus the omitted tail), per nm³.</summary>
    public double ErrorEstimatePerCubicNanometre { get; }

    /// <summary>How many energies E_n(k) the quadrature evaluated.</summary>
    public int EnergyEvaluations { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"n = {DensityPerCubicCentimetre:G10} /cm3 (+/- {ErrorEstimatePerCubicNanometre * 1e21:G2}) at mu = {FermiLevelElectronVolts:G10} eV, T = {TemperatureKelvin:G6} K");
}

/// <summary>The Fermi level that reproduces a requested carrier density, with how the search ended.</summary>
public readonly record struct FermiLevelSolution
{
    internal FermiLevelSolution(double fermiLevel, double temperature, double tolerance, int iterations, bool converged, double residual)
    {
        FermiLevelElectronVolts = fermiLevel;
        TemperatureKelvin = temperature;
        ToleranceElectronVolts = tolerance;
        Iterations = iterations;
        Converged = converged;
        RelativeDensityResidual = residual;
    }

    /// <summary>The Fermi level μ, eV.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>The absolute tolerance requested on μ, eV.</summary>
    public double ToleranceElectronVolts { get; }

    /// <summary>Brent iterations used.</summary>
    public int Iterations { get; }

    /// <summary>True when the bracket shrank below the tolerance.</summary>
    public bool Converged { get; }

    /// <summary>|n(μ) − n_target| / n_target at the level returned.</summary>
    public double RelativeDensityResidual { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"mu = {FermiLevelElectronVolts:G12} eV at T = {TemperatureKelvin:G6} K ({(Converged ? "converged" : "not converged")} in {Iterations} iterations to {ToleranceElectronVolts:G2} eV, density residual {RelativeDensityResidual:G2})");
}
