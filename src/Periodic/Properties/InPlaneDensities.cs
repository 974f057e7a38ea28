// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using MathNet.Numerics.Integration;
using MathNet.Numerics.RootFinding;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Properties;

/// <summary>
/// The three-dimensional density of states and carrier density of a superlattice with the exact in-plane motion of
/// per-layer masses, each reported beside the single-in-plane-mass approximation
/// (<see cref="BandProperties.SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre"/>,
/// <see cref="BandProperties.SuperlatticeCarrierDensity"/>) and its relative error.
/// </summary>
/// <remarks>
/// <para>Method: with u = k∥², the states of volume V are 2·V/(2π)³ d³k, so g₃(E) = (1/4π) ∫₀^∞ g₁(E; u) du and
/// n₃(μ, T) = (1/4π) ∫₀^∞ n₁(μ, T; u) du, where g₁ and n₁ are the one-dimensional density of states and carrier density
/// (spin included, per nm) of the cell seen at k∥ = √u (<see cref="InPlaneMotion"/>), computed by the exact engine. For a
/// single in-plane mass m the integrand is g₁(E − ħ²u/2m; 0) and the formula reduces to the single-mass one
/// (m/(4π·ħ²/2m₀))·N(E). Every band edge rises with u at a rate between ħ²/2m_max and ħ²/2m_min (Hellmann–Feynman), so
/// the values of u at which an edge crosses E are bracketed and found by Brent's method (R. P. Brent, 1973, ch. 4); the
/// integral is split there, each piece mapped by u = a + (b − a)(1 − cos t)/2, which removes the inverse-square-root
/// (Van Hove) and square-root end behaviour, and integrated by Gauss–Legendre rules of 20 and 40 points on t ∈ [0, π]
/// (the difference is the reported error).</para>
/// <para>Scope: parabolic layers, delta barriers and Fourier segments; temperatures as for
/// <see cref="BandProperties.SuperlatticeCarrierDensity"/>. The single-band envelope-function model, uncertain band
/// parameters and no band mixing: a design guide, to be checked against measurement.</para>
/// </remarks>
public static class InPlaneDensities
{
    private const int CoarseOrder = 20;
    private const int FineOrder = 40;
    private const double OccupationCutoff = 40; // occupation below e^−40 is dropped, as in BandProperties

    /// <summary>
    /// The density of states per unit volume (spin included) at <paramref name="energyElectronVolts"/>, exact and with one
    /// in-plane mass.
    /// </summary>
    /// <param name="cell">The cell (parabolic layers, delta barriers, Fourier segments).</param>
    /// <param name="energyElectronVolts">The total energy, eV.</param>
    /// <param name="singleInPlaneMass">The mass of the approximation; null: the in-plane mass of band 1 at its bottom (<see cref="InPlaneDispersion.MassAtBottom"/>).</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite or more than 10,000 bands lie below it.</exception>
    /// <exception cref="ArgumentException">The cell holds a non-parabolic layer or an element not covered by <see cref="InPlaneMotion"/>.</exception>
    public static InPlaneDensityOfStates DensityOfStates(UnitCell cell, double energyElectronVolts, EffectiveMass? singleInPlaneMass = null)
    {
        var setup = Setup(cell, energyElectronVolts, nameof(energyElectronVolts), singleInPlaneMass);
        var e = energyElectronVolts;
        var approximate = BandProperties.Create(setup.Bands).SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre(e, setup.Mass);
        double exact = 0, error = 0;
        var evaluations = 0;
        foreach (var band in setup.Bands.Bands)
        {
            if (!(band.BottomElectronVolts < e))
            {
                continue;
            }
            var n = band.Index;
            var lower = band.TopElectronVolts >= e ? 0.0 : Crossing(cell, n, top: true, e, band.TopElectronVolts, setup, ref evaluations);
            var upper = Crossing(cell, n, top: false, e, band.BottomElectronVolts, setup, ref evaluations);
            var (value, estimate) = Mapped(lower, upper, u =>
            {
                evaluations++;
                var shifted = BandStructure.Compute(InPlaneMotion.CellAt(cell, Math.Sqrt(u)), n);
                return shifted.GetBand(n).Contains(e) ? BandProperties.Create(shifted).DensityOfStatesPerElectronVoltNanometre(e) : 0.0;
            });
            exact += value;
            error += estimate;
        }
        var factor = 1 / (4 * Math.PI);
        return new InPlaneDensityOfStates(e, factor * exact, factor * error, approximate, setup.Mass.ElectronMasses, evaluations);
    }

    /// <summary>
    /// The carrier density per unit volume (spin included) for Fermi level <paramref name="fermiLevel"/> at
    /// <paramref name="temperature"/>, exact and with one in-plane mass.
    /// </summary>
    /// <param name="cell">The cell (parabolic layers, delta barriers, Fourier segments).</param>
    /// <param name="fermiLevel">μ.</param>
    /// <param name="temperature">T.</param>
    /// <param name="singleInPlaneMass">The mass of the approximation; null: the in-plane mass of band 1 at its bottom.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">More than 10,000 bands are occupied.</exception>
    /// <exception cref="ArgumentException">The cell holds a non-parabolic layer or an element not covered by <see cref="InPlaneMotion"/>.</exception>
    public static InPlaneCarrierDensity CarrierDensity(UnitCell cell, Energy fermiLevel, Temperature temperature, EffectiveMass? singleInPlaneMass = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        var temperatureKelvin = temperature.Kelvin;
        var kT = temperatureKelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;
        var mu = fermiLevel.ElectronVolts;
        var lowest = BandStructure.Compute(cell, 1).GetBand(1).BottomElectronVolts;
        var reach = Math.Max(mu, lowest) + OccupationCutoff * kT;
        var setup = Setup(cell, reach, nameof(fermiLevel), singleInPlaneMass);
        var approximate = BandProperties.Create(setup.Bands).SuperlatticeCarrierDensity(fermiLevel, temperature, setup.Mass).DensityPerCubicNanometre;
        var evaluations = 0;
        // Pieces in u: split where an edge crosses μ, up to where band 1 lies 40 kT above μ.
        var cuts = new List<double> { 0.0 };
        foreach (var band in setup.Bands.Bands)
        {
            if (band.TopElectronVolts < mu)
            {
                cuts.Add(Crossing(cell, band.Index, top: true, mu, band.TopElectronVolts, setup, ref evaluations));
            }
            if (band.BottomElectronVolts < mu)
            {
                cuts.Add(Crossing(cell, band.Index, top: false, mu, band.BottomElectronVolts, setup, ref evaluations));
            }
        }
        var end = Math.Max(0, (mu + OccupationCutoff * kT - lowest) * setup.MaxMass / PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2);
        cuts.Add(end);
        cuts.Sort();
        double exact = 0, error = 0;
        for (var i = 0; i + 1 < cuts.Count; i++)
        {
            if (!(cuts[i + 1] > cuts[i]))
            {
                continue;
            }
            var (value, estimate) = Mapped(cuts[i], cuts[i + 1], u =>
            {
                evaluations++;
                var shiftedCell = InPlaneMotion.CellAt(cell, Math.Sqrt(u));
                var bottom = BandStructure.Compute(shiftedCell, 1).GetBand(1).BottomElectronVolts;
                var limit = Math.Max(mu, bottom) + OccupationCutoff * kT;
                var shifted = BandStructure.ComputeBelow(shiftedCell, Energy.FromElectronVolts(limit));
                return BandProperties.Create(shifted).LinearCarrierDensity(fermiLevel, temperature).DensityPerNanometre;
            });
            exact += value;
            error += estimate;
        }
        var factor = 1 / (4 * Math.PI);
        return new InPlaneCarrierDensity(mu, temperatureKelvin, factor * exact, factor * error, approximate, setup.Mass.ElectronMasses, evaluations);
    }

    private sealed record Context(BandStructure Bands, EffectiveMass Mass, double MinMass, double MaxMass);

    private static Context Setup(UnitCell cell, double energy, string energyName, EffectiveMass? singleMass)
    {
        ArgumentNullException.ThrowIfNull(cell);
        if (!double.IsFinite(energy))
        {
            throw new ArgumentOutOfRangeException(energyName, energy, $"{energyName} must be finite; got {Preconditions.Format(energy)}.");
        }
        InPlaneMotion.CellAt(cell, 0); // refuses non-parabolic layers and uncovered elements
        double minMass = double.PositiveInfinity, maxMass = 0;
        foreach (var element in cell.Elements)
        {
            var m = element switch
            {
                Layer layer => layer.Mass.ElectronMasses,
                FourierSegment fourier => fourier.Mass.ElectronMasses,
                _ => double.NaN,
            };
            if (!double.IsNaN(m))
            {
                minMass = Math.Min(minMass, m);
                maxMass = Math.Max(maxMass, m);
            }
        }
        var bands = BandStructure.ComputeBelow(cell, Energy.FromElectronVolts(energy));
        if (singleMass is { } given && !(given.ElectronMasses > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(singleMass), given.ElectronMasses,
                "singleInPlaneMass must be a positive mass (EffectiveMass.FromElectronMasses); got the default (zero) mass.");
        }
        var mass = singleMass ?? EffectiveMass.FromElectronMasses(InPlaneDispersion.MassAtBottom(bands, 1).ElectronMasses);
        return new Context(bands, mass, minMass, maxMass);
    }

    /// <summary>The u = k∥² (1/nm²) at which the bottom or top of band n reaches <paramref name="energy"/>, from its value at u = 0.</summary>
    private static double Crossing(UnitCell cell, int n, bool top, double energy, double edgeAtZero, Context setup, ref int evaluations)
    {
        const double c = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
        var rise = energy - edgeAtZero;
        var lower = rise * setup.MinMass / c * (1 - 1e-9);
        var upper = rise * setup.MaxMass / c * (1 + 1e-9);
        var count = 0;
        double Edge(double u)
        {
            count++;
            var band = BandStructure.Compute(InPlaneMotion.CellAt(cell, Math.Sqrt(Math.Max(u, 0))), n).GetBand(n);
            return (top ? band.TopElectronVolts : band.BottomElectronVolts) - energy;
        }
        if (!Brent.TryFindRoot(Edge, Math.Max(lower, 0), upper, 1e-15 * upper, 200, out var root))
        {
            throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                $"the in-plane wavevector at which band {n}'s {(top ? "top" : "bottom")} reaches {energy:R} eV was not found in k∥² ∈ [{lower:R}, {upper:R}] /nm²."));
        }
        evaluations += count;
        return root;
    }

    /// <summary>∫_a^b f(u) du with u = a + (b − a)(1 − cos t)/2, by 40- and 20-point Gauss–Legendre rules on [0, π].</summary>
    private static (double Value, double Error) Mapped(double a, double b, Func<double, double> f)
    {
        if (!(b > a))
        {
            return (0, 0);
        }
        double Integrand(double t) => f(a + 0.5 * (b - a) * (1 - Math.Cos(t))) * 0.5 * (b - a) * Math.Sin(t);
        var fine = GaussLegendreRule.Integrate(Integrand, 0, Math.PI, FineOrder);
        var coarse = GaussLegendreRule.Integrate(Integrand, 0, Math.PI, CoarseOrder);
        return (fine, Math.Abs(fine - coarse));
    }
}

/// <summary>The density of states per unit volume with exact in-plane motion, beside the single-in-plane-mass value.</summary>
public readonly record struct InPlaneDensityOfStates
{
    internal InPlaneDensityOfStates(double energy, double exact, double error, double single, double mass, int searches)
    {
        EnergyElectronVolts = energy;
        ExactPerElectronVoltCubicNanometre = exact;
        ErrorEstimatePerElectronVoltCubicNanometre = error;
        SingleMassPerElectronVoltCubicNanometre = single;
        SingleMassElectronMasses = mass;
        BandSearches = searches;
    }

    /// <summary>The energy, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The exact density of states (spin included), 1/(eV·nm³).</summary>
    public double ExactPerElectronVoltCubicNanometre { get; }

    /// <summary>Estimated quadrature error of <see cref="ExactPerElectronVoltCubicNanometre"/>, 1/(eV·nm³).</summary>
    public double ErrorEstimatePerElectronVoltCubicNanometre { get; }

    /// <summary>The density of states with one in-plane mass <see cref="SingleMassElectronMasses"/>, 1/(eV·nm³).</summary>
    public double SingleMassPerElectronVoltCubicNanometre { get; }

    /// <summary>The in-plane mass of the approximation, m₀.</summary>
    public double SingleMassElectronMasses { get; }

    /// <summary>(single-mass − exact)/exact; 0 when both vanish, +∞ when only the exact value does.</summary>
    public double RelativeErrorOfSingleMass => RelativeDifference(SingleMassPerElectronVoltCubicNanometre, ExactPerElectronVoltCubicNanometre);

    /// <summary>Band searches spent (each on the cell at one k∥).</summary>
    public int BandSearches { get; }

    internal static double RelativeDifference(double single, double exact) =>
        exact == 0 ? (single == 0 ? 0 : double.PositiveInfinity) : (single - exact) / exact;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"g(E = {EnergyElectronVolts:G8} eV): exact {ExactPerElectronVoltCubicNanometre:G10} /(eV nm3) (± {ErrorEstimatePerElectronVoltCubicNanometre:G2}); one in-plane mass ({SingleMassElectronMasses:G6} m0): {SingleMassPerElectronVoltCubicNanometre:G10} ({RelativeErrorOfSingleMass:E2} relative)");
}

/// <summary>The carrier density per unit volume with exact in-plane motion, beside the single-in-plane-mass value.</summary>
public readonly record struct InPlaneCarrierDensity
{
    internal InPlaneCarrierDensity(double mu, double temperature, double exact, double error, double single, double mass, int searches)
    {
        FermiLevelElectronVolts = mu;
        TemperatureKelvin = temperature;
        ExactPerCubicNanometre = exact;
        ErrorEstimatePerCubicNanometre = error;
        SingleMassPerCubicNanometre = single;
        SingleMassElectronMasses = mass;
        BandSearches = searches;
    }

    /// <summary>The Fermi level μ, eV.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>The exact carrier density (spin included), 1/nm³ (× 1e21 for 1/cm³).</summary>
    public double ExactPerCubicNanometre { get; }

    /// <summary>Estimated quadrature error of <see cref="ExactPerCubicNanometre"/>, 1/nm³.</summary>
    public double ErrorEstimatePerCubicNanometre { get; }

    /// <summary>The carrier density with one in-plane mass <see cref="SingleMassElectronMasses"/>, 1/nm³.</summary>
    public double SingleMassPerCubicNanometre { get; }

    /// <summary>The in-plane mass of the approximation, m₀.</summary>
    public double SingleMassElectronMasses { get; }

    /// <summary>(single-mass − exact)/exact; 0 when both vanish, +∞ when only the exact value does.</summary>
    public double RelativeErrorOfSingleMass => InPlaneDensityOfStates.RelativeDifference(SingleMassPerCubicNanometre, ExactPerCubicNanometre);

    /// <summary>Band searches spent (each on the cell at one k∥).</summary>
    public int BandSearches { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"n(mu = {FermiLevelElectronVolts:G8} eV, T = {TemperatureKelvin:G6} K): exact {ExactPerCubicNanometre:G10} /nm3 (± {ErrorEstimatePerCubicNanometre:G2}); one in-plane mass ({SingleMassElectronMasses:G6} m0): {SingleMassPerCubicNanometre:G10} ({RelativeErrorOfSingleMass:E2} relative)");
}
