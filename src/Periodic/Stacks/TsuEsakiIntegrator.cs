// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics;
using Periodic.Numerics;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// The Tsu–Esaki current density J = (e m_L k_B T/(2π²ħ³)) ∫ T(E) ln[(1 + e^((μ−E)/k_BT))/(1 + e^((μ−eU−E)/k_BT))] dE
/// (R. Tsu and L. Esaki, Appl. Phys. Lett. 22, 562 (1973)) by globally adaptive Gauss–Kronrod quadrature
/// (7/15 points; R. Piessens et al., QUADPACK, Springer 1983) with breakpoints at the Fermi levels and at the
/// transmission peaks and their half widths.
/// </summary>
/// <remarks>
/// Written here rather than MathNet's recursive <c>GaussKronrodRule.Integrate</c> because the integral needs what that
/// does not offer: a global error budget split where the error is largest (sharp resonances), a cap on transmission
/// evaluations with an honest "not converged" result, breakpoints, a growing upper limit with a tail bound, and
/// cancellation between rules.
/// </remarks>
internal static class TsuEsakiIntegrator
{
    /// <summary>Width of one extension of the upper limit, in k_BT; the tail beyond is bounded by k_BT·e^(−this).</summary>
    private const double TailStepThermalEnergies = 40.0;

    /// <summary>Beyond μ + 700 k_BT the supply function underflows relative to anything representable.</summary>
    private const double MaxTailThermalEnergies = 700.0;

    /// <summary>The integrand T(E)·supply(E) at fixed μ, eU and k_BT.</summary>
    private readonly struct CurrentIntegrand(StackTransmission transmission, double mu, double bias, double kT) : IRealFunction
    {
        public double Evaluate(double x) => Integrand(transmission, x, mu, bias, kT);
    }

    internal static CurrentDensityResult Compute(StackTransmission transmission, double mu, double temperature, CurrentDensityOptions options,
        CancellationToken cancellationToken)
    {
        var bias = transmission.Bias.ElectronVolts;
        var kT = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * temperature;
        var lower = Math.Max(transmission.Stack.LeftLead.PotentialElectronVolts, transmission.RightLead.PotentialElectronVolts);
        var muMax = Math.Max(mu, mu - bias);
        var upper = Math.Max(lower, muMax) + TailStepThermalEnergies * kT;
        if (bias == 0)
        {
            // The supply function vanishes identically: no net current, exactly.
            return new CurrentDensityResult(0, 0, 0, mu, temperature, lower, upper, 0, 0, true);
        }
        var prefactor = PhysicalConstants.ElementaryChargeCoulombs * PhysicalConstants.ElementaryChargeCoulombs
            * PhysicalConstants.ElectronMassKilograms * transmission.Stack.LeftLead.MassElectronMasses
            * PhysicalConstants.BoltzmannJoulesPerKelvin * temperature
            / (2 * Math.PI * Math.PI * Math.Pow(PhysicalConstants.ReducedPlanckJouleSeconds, 3)); // A/m² per eV of the integral

        var evaluations = 0;
        var resonances = 0;
        var intervals = new List<QuadratureInterval>();
        var windowLower = lower;
        double tailBound;
        var converged = true;
        while (true)
        {
            // Resonance breakpoints only where the supply function matters: the first window reaches 40 k_BT above the
            // higher Fermi level, beyond which the integrand is below e^(−40) of its scale and plain bisection suffices
            // (this also bounds the cost of the peak search by that window).
            AddWindow(transmission, windowLower, upper, mu, bias, kT, options, searchResonances: windowLower == lower, intervals, ref evaluations, ref resonances, cancellationToken);
            var integrand = new CurrentIntegrand(transmission, mu, bias, kT);
            converged = GaussKronrod.Refine(ref integrand, intervals, options.RelativeTolerance, options.MaxEvaluations, ref evaluations, cancellationToken);
            var total = GaussKronrod.Sum(intervals, out _);
            // |S(E)| ≤ e^((μ_max − E)/k_BT) and T ≤ 1, so the tail beyond the upper limit is at most k_BT·e^((μ_max − upper)/k_BT).
            tailBound = kT * Math.Exp((muMax - upper) / kT);
            if (tailBound <= 0.1 * options.RelativeTolerance * Math.Abs(total) || upper - muMax >= MaxTailThermalEnergies * kT
                || evaluations + GaussKronrod.PointsPerRule > options.MaxEvaluations)
            {
                break;
            }
            var next = upper + TailStepThermalEnergies * kT;
            if (!(next > upper))
            {
                break; // 40 k_BT is below the resolution of the energies: the tail bound stands in the error
            }
            windowLower = upper;
            upper = next;
        }
        var integral = GaussKronrod.Sum(intervals, out var error);
        error += tailBound;
        converged &= error <= options.RelativeTolerance * Math.Abs(integral) || error == 0;
        return new CurrentDensityResult(prefactor * integral, prefactor * error, bias, mu, temperature, lower, upper, evaluations, resonances, converged);
    }

    /// <summary>Splits [a, b] at the Fermi levels and the transmission peaks (±Γ, ±4Γ, ±16Γ) and integrates each piece once.</summary>
    private static void AddWindow(StackTransmission transmission, double a, double b, double mu, double bias, double kT,
        CurrentDensityOptions options, bool searchResonances, List<QuadratureInterval> intervals, ref int evaluations, ref int resonances, CancellationToken cancellationToken)
    {
        var points = new List<double> { a, b, mu, mu - bias };
        if (options.UseResonanceBreakpoints && searchResonances)
        {
            foreach (var peak in transmission.FindResonances(a, b, options.ResonanceSearch, cancellationToken).Resonances)
            {
                resonances++;
                points.Add(peak.EnergyElectronVolts);
                if (peak.HasWidth)
                {
                    foreach (var factor in new[] { 1.0, 4.0, 16.0 })
                    {
                        points.Add(peak.EnergyElectronVolts - factor * peak.WidthElectronVolts);
                        points.Add(peak.EnergyElectronVolts + factor * peak.WidthElectronVolts);
                    }
                }
            }
        }
        points.RemoveAll(p => !(p >= a && p <= b));
        points.Sort();
        var minimumGap = 1e-14 * Math.Max(Math.Abs(a), Math.Abs(b)) + 1e-300;
        var previous = points[0];
        for (var i = 1; i < points.Count; i++)
        {
            if (points[i] - previous > minimumGap || (i == points.Count - 1 && points[i] > previous))
            {
                cancellationToken.ThrowIfCancellationRequested();
                var integrand = new CurrentIntegrand(transmission, mu, bias, kT);
                intervals.Add(GaussKronrod.Rule(ref integrand, previous, points[i]));
                evaluations += GaussKronrod.PointsPerRule;
                previous = points[i];
            }
        }
    }

    /// <summary>T(E) times the supply function ln[(1 + e^x)/(1 + e^(x − u))], x = (μ − E)/k_BT, u = eU/k_BT.</summary>
    internal static double Integrand(StackTransmission transmission, double e, double mu, double bias, double kT)
    {
        var supply = Supply((mu - e) / kT, bias / kT);
        return supply == 0 ? 0 : transmission.EvaluateCore(e).Transmission * supply;
    }

    /// <summary>
    /// ln[(1 + e^x)/(1 + e^(x − u))]. For |u| ≤ 1 as log1p(expm1(u)·σ(x − u)), σ the logistic function (the ratio
    /// is 1 + (e^u − 1)e^(x−u)/(1 + e^(x−u))), which keeps full relative accuracy as u → 0 where the difference of two
    /// softplus terms would lose log₂(1/|u|) bits (linear response); beyond, the difference, which has no cancellation.
    /// expm1 is <see cref="ElementaryFunctions.ExpM1"/> (neither .NET's nor MathNet's is accurate near 0); log1p and σ are
    /// MathNet.Numerics'.
    /// </summary>
    internal static double Supply(double x, double u) =>
        Math.Abs(u) > 1
            ? ElementaryFunctions.Softplus(x) - ElementaryFunctions.Softplus(x - u)
            : SpecialFunctions.Log1p(ElementaryFunctions.ExpM1(u) * SpecialFunctions.Logistic(x - u));
}
