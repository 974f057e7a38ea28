// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>
/// The Tsu–Esaki current density through a stack at one bias, Fermi level and temperature, with the error
/// estimate of its quadrature (<see cref="StackTransmission.CurrentDensity"/>). Positive when electrons flow
/// from the left lead to the right one (the sign of the bias eU).
/// </summary>
public sealed class CurrentDensityResult
{
    internal CurrentDensityResult(double amperesPerSquareMetre, double errorAmperesPerSquareMetre, double bias, double fermiLevel,
        double temperature, double lower, double upper, int evaluations, int resonanceCount, bool isConverged)
    {
        AmperesPerSquareMetre = amperesPerSquareMetre;
        ErrorEstimateAmperesPerSquareMetre = errorAmperesPerSquareMetre;
        BiasElectronVolts = bias;
        FermiLevelElectronVolts = fermiLevel;
        TemperatureKelvin = temperature;
        LowerLimitElectronVolts = lower;
        UpperLimitElectronVolts = upper;
        Evaluations = evaluations;
        ResonanceCount = resonanceCount;
        IsConverged = isConverged;
    }

    /// <summary>The current density J, A/m².</summary>
    public double AmperesPerSquareMetre { get; }

    /// <summary>The current density J, A/cm² (10⁻⁴ × <see cref="AmperesPerSquareMetre"/>).</summary>
    public double AmperesPerSquareCentimetre => AmperesPerSquareMetre * 1e-4;

    /// <summary>
    /// Estimated bound on the error of J from the quadrature, A/m²: the sum over subintervals of |Kronrod − Gauss|
    /// plus a bound on the truncated high-energy tail. The model's own uncertainty is not included.
    /// </summary>
    public double ErrorEstimateAmperesPerSquareMetre { get; }

    /// <summary>The bias eU across the stack, eV.</summary>
    public double BiasElectronVolts { get; }

    /// <summary>The Fermi level μ of the left lead, eV (the right lead's is μ − eU).</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>Lower end of the energy integral, eV: the higher of the two (shifted) lead band edges, below which T = 0.</summary>
    public double LowerLimitElectronVolts { get; }

    /// <summary>Upper end of the energy integral, eV, beyond which the supply function's tail is bounded in the error estimate.</summary>
    public double UpperLimitElectronVolts { get; }

    /// <summary>Transmission evaluations of the quadrature (not counting the resonance search).</summary>
    public int Evaluations { get; }

    /// <summary>Transmission peaks used as breakpoints.</summary>
    public int ResonanceCount { get; }

    /// <summary>True when the error estimate reached the requested relative tolerance within the evaluation budget.</summary>
    public bool IsConverged { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"J = {AmperesPerSquareMetre:G8} A/m2 (+/- {ErrorEstimateAmperesPerSquareMetre:G3}) at eU = {BiasElectronVolts:G6} eV, mu = {FermiLevelElectronVolts:G6} eV, T = {TemperatureKelvin:G6} K; {Evaluations} evaluations, {ResonanceCount} resonance(s){(IsConverged ? "" : ", NOT converged")}");
}
