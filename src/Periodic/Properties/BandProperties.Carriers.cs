// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Numerics;
using Periodic.Units;

namespace Periodic.Properties;

public sealed partial class BandProperties
{
    /// <summary>Bands whose bottom lies more than this many k_BT above max(μ, lowest band bottom) are left out (occupation below e^−40 ≈ 4e-18).</summary>
    private const double OccupationCutoff = 40;

    private static readonly double[] FermiBreakpoints = [-40, -24, -12, -6, -2, 0, 2, 6, 12, 24, 40];

    /// <summary>Breakpoints above each band bottom, in k_BT: a non-degenerate band's carriers sit within a few k_BT of it.</summary>
    private static readonly double[] BottomBreakpoints = [0.25, 1, 4, 12, 40];

    /// <summary>
    /// The carrier density per unit length of the 1D crystal (spin included) for Fermi level
    /// <paramref name="fermiLevel"/> and temperature <paramref name="temperature"/>:
    /// n = ∫ g(E) f(E) dE with the Fermi–Dirac occupation f = 1/(1 + e^((E − μ)/k_BT)).
    /// </summary>
    /// <remarks>
    /// <para>Method: the integral is taken over the Bloch phase instead of the energy,
    /// n = (2/πd) Σ_n ∫₀^π f(E_n(θ/d)) dθ, a substitution that removes the 1/√ Van Hove edges of g(E)
    /// and leaves a smooth integrand. Each band's [0, π] is split at the phases of μ + j·k_BT
    /// (j = 0, ±2, ±6, ±12, ±24, ±40), at the phases of E_bottom + j·k_BT (j = ¼, 1, 4, 12, 40, where a
    /// non-degenerate band holds its carriers) and at multiples of π/4, and every panel is integrated by 20-point
    /// Gauss–Legendre (Press et al., Numerical Recipes, §4.6); the 10-point rule on the same panels gives the
    /// error estimate (conservative: it bounds the 10-point error). At T = 0 the occupation is the step
    /// function and the result equals <see cref="IntegratedDensityOfStatesPerNanometre"/> at μ.</para>
    /// <para>Bands with bottom above max(μ, E₁) + 40 k_BT are omitted; a bound on their share is included in the error estimate.</para>
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">The Fermi level is not finite or needs bands that were not computed; the temperature is negative or not finite.</exception>
    public LinearCarrierDensity LinearCarrierDensity(Energy fermiLevel, Temperature temperature)
    {
        var (fermiLevelElectronVolts, temperatureKelvin) = (fermiLevel.ElectronVolts, temperature.Kelvin);
        var kT = CheckCarrierArguments(fermiLevelElectronVolts, temperatureKelvin);
        var (value, error, evaluations) = Occupied(fermiLevelElectronVolts, kT, superlattice: false);
        var factor = 2 / (Math.PI * _d);
        return new LinearCarrierDensity(fermiLevelElectronVolts, temperatureKelvin, factor * value, factor * error, evaluations);
    }

    /// <summary>
    /// The carrier density per unit volume of the superlattice (spin included) with free in-plane motion
    /// of mass <paramref name="inPlaneMass"/>, for Fermi level <paramref name="fermiLevel"/> and
    /// temperature <paramref name="temperature"/>.
    /// </summary>
    /// <remarks>
    /// Method: the in-plane Fermi–Dirac integral of each (n, k_z) subband is done in closed form,
    /// n₂ = (m∥/πħ²)·k_BT·ln(1 + e^((μ − E)/k_BT)) (the two-dimensional electron gas; e.g. J. H. Davies, The
    /// Physics of Low-Dimensional Semiconductors, 1998, ch. 3 [from memory]), and the remaining k_z integral,
    /// n = (m∥/(2π²·(ħ²/2m₀)·d)) Σ_n ∫₀^π k_BT ln(1 + e^((μ − E_n(θ/d))/k_BT)) dθ, by the panelled Gauss–Legendre
    /// rule described at <see cref="LinearCarrierDensity(Energy, Temperature)"/>. At T = 0 the integrand is (μ − E)₊.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">As <see cref="LinearCarrierDensity(Energy, Temperature)"/>, or the mass is the default mass.</exception>
    public VolumeCarrierDensity SuperlatticeCarrierDensity(Energy fermiLevel, Temperature temperature, EffectiveMass inPlaneMass)
    {
        var (fermiLevelElectronVolts, temperatureKelvin) = (fermiLevel.ElectronVolts, temperature.Kelvin);
        var factor = SuperlatticeFactor(inPlaneMass) * 2 / (Math.PI * _d); // m∥/(2π² C d)
        var kT = CheckCarrierArguments(fermiLevelElectronVolts, temperatureKelvin);
        var (value, error, evaluations) = Occupied(fermiLevelElectronVolts, kT, superlattice: true);
        return new VolumeCarrierDensity(fermiLevelElectronVolts, temperatureKelvin, factor * value, factor * error, evaluations);
    }

    /// <summary>
    /// The Fermi level (eV) at which the 1D carrier density equals <paramref name="densityPerNanometre"/>,
    /// by Brent's method on the monotone n(μ) (R. P. Brent, Algorithms for Minimization without Derivatives,
    /// 1973, ch. 4), to the options' absolute tolerance.
    /// </summary>
    /// <param name="densityPerNanometre">The target density, 1/nm; positive and finite.</param>
    /// <param name="temperature">The temperature.</param>
    /// <param name="options">The tolerance (<see cref="FermiLevelOptions.Default"/>, 1e-12 eV, when null).</param>
    /// <remarks>At T = 0 a density that fills whole bands exactly is reached anywhere in the gap above them; the
    /// level returned then lies somewhere in that gap.</remarks>
    /// <exception cref="ArgumentOutOfRangeException">The density is not positive and finite, or needs bands that were not computed.</exception>
    public FermiLevelSolution FermiLevelForLinearDensity(double densityPerNanometre, Temperature temperature, FermiLevelOptions? options = null)
    {
        Preconditions.CheckPositiveFinite(densityPerNanometre);
        var temperatureKelvin = temperature.Kelvin;
        var kT = CheckTemperature(temperatureKelvin);
        var absoluteToleranceElectronVolts = (options ?? FermiLevelOptions.Default).AbsoluteToleranceElectronVolts;
        var factor = 2 / (Math.PI * _d);
        return SolveFermiLevel(densityPerNanometre / factor, kT, temperatureKelvin, absoluteToleranceElectronVolts, false, nameof(densityPerNanometre));
    }

    /// <summary>
    /// The Fermi level (eV) at which the superlattice carrier density equals
    /// <paramref name="densityPerCubicNanometre"/> (in-plane mass <paramref name="inPlaneMass"/>), by Brent's method
    /// to the options' absolute tolerance.
    /// </summary>
    /// <param name="densityPerCubicNanometre">The target density, 1/nm³; positive and finite.</param>
    /// <param name="temperature">The temperature.</param>
    /// <param name="inPlaneMass">The in-plane mass (not the default mass).</param>
    /// <param name="options">The tolerance (<see cref="FermiLevelOptions.Default"/>, 1e-12 eV, when null).</param>
    /// <exception cref="ArgumentOutOfRangeException">The density is not positive and finite, or needs bands that were not computed; the mass is out of range.</exception>
    public FermiLevelSolution FermiLevelForSuperlatticeDensity(double densityPerCubicNanometre, Temperature temperature, EffectiveMass inPlaneMass,
        FermiLevelOptions? options = null)
    {
        Preconditions.CheckPositiveFinite(densityPerCubicNanometre);
        var temperatureKelvin = temperature.Kelvin;
        var kT = CheckTemperature(temperatureKelvin);
        var factor = SuperlatticeFactor(inPlaneMass) * 2 / (Math.PI * _d);
        var absoluteToleranceElectronVolts = (options ?? FermiLevelOptions.Default).AbsoluteToleranceElectronVolts;
        return SolveFermiLevel(densityPerCubicNanometre / factor, kT, temperatureKelvin, absoluteToleranceElectronVolts, true, nameof(densityPerCubicNanometre));
    }

    // A Temperature is never negative or infinite once created, so only the fermi level needs checking here.
    private static double CheckTemperature(double temperatureKelvin) => temperatureKelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;

    private double CheckCarrierArguments(double fermiLevelElectronVolts, double temperatureKelvin)
    {
        var kT = CheckTemperature(temperatureKelvin);
        var reach = Math.Max(fermiLevelElectronVolts, _bottoms[0].Energy) + OccupationCutoff * kT;
        if (reach > _upperLimit)
        {
            throw new ArgumentOutOfRangeException("fermiLevel", fermiLevelElectronVolts, string.Create(CultureInfo.InvariantCulture,
                $"fermiLevel = {Format(fermiLevelElectronVolts)} eV at {Format(temperatureKelvin)} K occupies states up to {Format(reach)} eV (mu + 40 kT), above the {_bottoms.Length} computed band(s), which end at {Format(_upperLimit)} eV; compute bands up to at least that energy (BandStructure.ComputeBelow)."));
        }
        if (fermiLevelElectronVolts <= _transfer.LowestValidEnergyElectronVolts)
        {
            throw new ArgumentOutOfRangeException("fermiLevel", fermiLevelElectronVolts, string.Create(CultureInfo.InvariantCulture,
                $"fermiLevel must exceed {Format(_transfer.LowestValidEnergyElectronVolts)} eV, the lower end of the model's energy range; got {Format(fermiLevelElectronVolts)}."));
        }
        return kT;
    }

    /// <summary>Σ_n ∫₀^π w(E_n(θ)) dθ with w = f (1D) or k_BT ln(1 + e^((μ−E)/k_BT)) (superlattice); error estimate; evaluations.</summary>
    private (double Value, double Error, int Evaluations) Occupied(double mu, double kT, bool superlattice)
    {
        var reach = Math.Max(mu, _bottoms[0].Energy) + OccupationCutoff * kT;
        Span<double> cuts = stackalloc double[FermiBreakpoints.Length + BottomBreakpoints.Length + 5];
        double total = 0, error = 0;
        var evaluations = 0;
        for (var n = 1; n <= _bottoms.Length && _bottoms[n - 1].Energy < reach; n++)
        {
            var count = 0;
            for (var j = 0; j <= 4; j++)
            {
                cuts[count++] = j * Math.PI / 4;
            }
            foreach (var multiple in FermiBreakpoints)
            {
                if (kT == 0 && multiple != 0)
                {
                    continue;
                }
                var e = mu + multiple * kT;
                if (e > _bottoms[n - 1].Energy && e < _tops[n - 1].Energy)
                {
                    cuts[count++] = PhaseOf(n, e);
                }
            }
            if (kT > 0)
            {
                foreach (var multiple in BottomBreakpoints)
                {
                    var e = _bottoms[n - 1].Energy + multiple * kT;
                    if (e < _tops[n - 1].Energy)
                    {
                        cuts[count++] = PhaseOf(n, e);
                    }
                }
            }
            var used = cuts[..count];
            used.Sort();
            for (var i = 0; i + 1 < count; i++)
            {
                double a = used[i], b = used[i + 1];
                if (!(b > a))
                {
                    continue;
                }
                var fine = Panel(GaussLegendre.Twenty, n, a, b, mu, kT, superlattice);
                var coarse = Panel(GaussLegendre.Ten, n, a, b, mu, kT, superlattice);
                evaluations += 30;
                total += fine;
                error += Math.Abs(fine - coarse);
            }
        }
        // Omitted bands start above reach, where the occupation is below e^(−(reach − μ)/k_BT) (and k_BT times
        // that for the superlattice integrand); each holds at most π of phase. Twice one band's worth bounds
        // the rapidly shrinking sum over them. At T = 0 nothing above μ is occupied.
        if (kT > 0)
        {
            error += 2 * Math.PI * Math.Exp(-(reach - mu) / kT) * (superlattice ? kT : 1);
        }
        return (total, error, evaluations);
    }

    /// <summary>Bloch phase θ ∈ [0, π] of energy e inside band n (exact: θ = arccos(D/2)).</summary>
    private double PhaseOf(int n, double e) => Math.Acos(Math.Clamp(0.5 * _transfer.Dispersion(e).Trace, -1.0, 1.0));

    private double Panel(GaussLegendre rule, int n, double a, double b, double mu, double kT, bool superlattice)
    {
        double half = 0.5 * (b - a), middle = 0.5 * (a + b), sum = 0;
        for (var i = 0; i < rule.Nodes.Length; i++)
        {
            var theta = middle + half * rule.Nodes[i];
            var energy = _structure.EnergyAt(n, theta / _d);
            sum += rule.Weights[i] * Occupation(energy, mu, kT, superlattice);
        }
        return half * sum;
    }

    private static double Occupation(double energy, double mu, double kT, bool superlattice)
    {
        var excess = energy - mu;
        if (kT == 0)
        {
            return superlattice ? Math.Max(-excess, 0) : (excess < 0 ? 1 : excess > 0 ? 0 : 0.5);
        }
        var x = excess / kT;
        if (!superlattice)
        {
            return x > 0 ? Math.Exp(-x) / (1 + Math.Exp(-x)) : 1 / (1 + Math.Exp(x));
        }
        // k_BT·ln(1 + e^(−x)), also where e^(−x) is tiny (far above the Fermi level).
        return kT * Periodic.Numerics.ElementaryFunctions.Softplus(-x);
    }

    private FermiLevelSolution SolveFermiLevel(double target, double kT, double temperatureKelvin, double tolerance, bool superlattice, string paramName)
    {
        var bottom = _bottoms[0].Energy;
        var width = Math.Max(_tops[0].Energy - bottom, 1e-6);
        var highest = _upperLimit - OccupationCutoff * kT;
        var function = new DensityMinusTarget(this, target, kT, superlattice);
        if (highest <= bottom || function.Evaluate(highest) < 0)
        {
            throw new ArgumentOutOfRangeException(paramName, target, string.Create(CultureInfo.InvariantCulture,
                $"{paramName} is more than the {_bottoms.Length} computed band(s) can hold at {Format(temperatureKelvin)} K with mu + 40 kT below {Format(_upperLimit)} eV; compute more bands."));
        }
        var high = Math.Min(bottom + width, highest);
        while (function.Evaluate(high) < 0)
        {
            high = Math.Min(high + 2 * (high - bottom), highest);
        }
        var step = Math.Max(width, 4 * kT);
        var low = bottom - step;
        for (var attempt = 0; function.Evaluate(low) > 0; attempt++)
        {
            step *= 2;
            low = bottom - step;
            if (attempt > 200 || low <= _transfer.LowestValidEnergyElectronVolts)
            {
                throw new ArgumentOutOfRangeException(paramName, target, string.Create(CultureInfo.InvariantCulture,
                    $"{paramName} is too small to be reached above the model's lower energy bound {Format(_transfer.LowestValidEnergyElectronVolts)} eV."));
            }
        }
        var result = RootFinding.Brent(ref function, low, high, tolerance, 0, 500);
        var reached = function.Evaluate(result.Root) + target;
        return new FermiLevelSolution(result.Root, temperatureKelvin, tolerance, result.Iterations,
            result.Status == RootStatus.Converged, Math.Abs(reached - target) / target);
    }

    private readonly struct DensityMinusTarget(BandProperties owner, double target, double kT, bool superlattice) : IRealFunction
    {
        public double Evaluate(double x) => owner.Occupied(x, kT, superlattice).Value - target;
    }
}
