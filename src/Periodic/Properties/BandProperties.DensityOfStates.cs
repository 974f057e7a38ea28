// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Properties;

public sealed partial class BandProperties
{
    /// <summary>
    /// The density of states of the one-dimensional crystal per unit length, spin included, in
    /// 1/(eV·nm): g(E) = (2/π)|dk/dE| = 2|D′(E)| / (π d √(4 − D²)) inside a band, 0 in a gap.
    /// </summary>
    /// <remarks>
    /// <para>Method: a length L holds L/(2π) states per unit k; both signs of k and both spins count, so
    /// g = 4·L/(2π)·|dk/dE| per length L (Ashcroft and Mermin, ch. 8); dk/dE follows exactly from the Bloch
    /// condition cos(kd) = D/2.</para>
    /// <para>Van Hove edges: g diverges as 1/√|E − E₀| at every open band edge (an integrable
    /// singularity; the integrated density stays finite and continuous). Exactly at such an edge, and
    /// within rounding of it where 4 − D² evaluates to ≤ 0, the value returned is +∞ — honest, never
    /// NaN; integrate with <see cref="IntegratedDensityOfStatesPerNanometre"/> rather than summing samples.
    /// At a closed gap the density is finite and continuous: (2/π)/|dE/dk| of the smooth crossing; within
    /// 1e-4 of the band width of it the local expansion of the crossing is used, good to about 1e-8.</para>
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite or outside the computed range (see <see cref="UpperEnergyLimitElectronVolts"/>).</exception>
    public double DensityOfStatesPerElectronVoltNanometre(double energyElectronVolts) =>
        DensityOfStates(energyElectronVolts, nameof(energyElectronVolts));

    /// <summary>
    /// Effectively computes <c>destination[i] = g(energiesElectronVolts[i])</c> in 1/(eV·nm), as
    /// <see cref="DensityOfStatesPerElectronVoltNanometre"/>; does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or an energy is out of range.</exception>
    public void DensitiesOfStates(ReadOnlySpan<double> energiesElectronVolts, Span<double> destinationPerElectronVoltNanometre)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destinationPerElectronVoltNanometre.Length, nameof(energiesElectronVolts), nameof(destinationPerElectronVoltNanometre));
        CheckEnergies(energiesElectronVolts, nameof(energiesElectronVolts));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            destinationPerElectronVoltNanometre[i] = DensityOfStates(energiesElectronVolts[i], nameof(energiesElectronVolts), i);
        }
    }

    /// <summary>
    /// The integrated density of states N(E): the number of states (spin included) per unit length of
    /// the 1D crystal with energy below E, in 1/nm. Exact, without numerical integration.
    /// </summary>
    /// <remarks>
    /// Method: the states below E in band n fill |k| ≤ κ with κ = π/d for every full band; each band holds
    /// 2 (spin) × (2π/d)/(2π/L) = 2L/d states. In band n the partial extent is κ = k(E) for odd n (bottom at the
    /// zone centre) and π/d − k(E) for even n, with k(E) = arccos(D/2)/d; so
    /// N(E) = (2/π)[(n − 1)π/d + κ]. N is continuous, equals 2n/d at the top of band n and is
    /// constant across each gap.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite or outside the computed range.</exception>
    public double IntegratedDensityOfStatesPerNanometre(double energyElectronVolts) =>
        IntegratedDensity(energyElectronVolts, nameof(energyElectronVolts));

    /// <summary>
    /// Effectively computes <c>destination[i] = N(energiesElectronVolts[i])</c> in 1/nm, as
    /// <see cref="IntegratedDensityOfStatesPerNanometre"/>; does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or an energy is out of range.</exception>
    public void IntegratedDensitiesOfStates(ReadOnlySpan<double> energiesElectronVolts, Span<double> destinationPerNanometre)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destinationPerNanometre.Length, nameof(energiesElectronVolts), nameof(destinationPerNanometre));
        CheckEnergies(energiesElectronVolts, nameof(energiesElectronVolts));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            destinationPerNanometre[i] = IntegratedDensity(energiesElectronVolts[i], nameof(energiesElectronVolts), i);
        }
    }

    /// <summary>
    /// The density of states per unit volume of the superlattice, spin included, in 1/(eV·nm³), with free
    /// in-plane motion of mass <paramref name="inPlaneMass"/>: g₃(E) = m∥/(4π·ħ²/2m₀) · N(E).
    /// </summary>
    /// <remarks>
    /// Method: each (band n, k_z) contributes a two-dimensional subband of constant density
    /// m∥/(πħ²) per area (spin included), switched on at E_n(k_z); summing over k_z (L/2π per unit k_z) gives
    /// g₃(E) = (m∥/(πħ²))·Σ_n (1/2π)·|{k_z : E_n(k_z) &lt; E}| = (m∥/(4π·ħ²/2m₀))·N(E), proportional to the
    /// 1D integrated density (G. Bastard, Wave Mechanics Applied to Semiconductor Heterostructures, 1988, ch. 1 [from memory]).
    /// It is finite and continuous everywhere (no Van Hove divergence); for a vanishing potential it is the
    /// free-electron √E law. The in-plane mass is taken as constant.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">The energy is out of range, or the mass is the default (zero) mass.</exception>
    public double SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre(double energyElectronVolts, EffectiveMass inPlaneMass)
    {
        var factor = SuperlatticeFactor(inPlaneMass);
        return factor * IntegratedDensity(energyElectronVolts, nameof(energyElectronVolts));
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = g₃(energiesElectronVolts[i])</c> in 1/(eV·nm³), as
    /// <see cref="SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre"/>; does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, an energy is out of range, or the mass is the default mass.</exception>
    public void SuperlatticeDensitiesOfStates(ReadOnlySpan<double> energiesElectronVolts, EffectiveMass inPlaneMass, Span<double> destinationPerElectronVoltCubicNanometre)
    {
        var factor = SuperlatticeFactor(inPlaneMass);
        Preconditions.CheckDestination(energiesElectronVolts.Length, destinationPerElectronVoltCubicNanometre.Length, nameof(energiesElectronVolts), nameof(destinationPerElectronVoltCubicNanometre));
        CheckEnergies(energiesElectronVolts, nameof(energiesElectronVolts));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            destinationPerElectronVoltCubicNanometre[i] = factor * IntegratedDensity(energiesElectronVolts[i], nameof(energiesElectronVolts), i);
        }
    }

    private static string ElementName(string name, int index) => string.Create(CultureInfo.InvariantCulture, $"{name}[{index}]");

    private static double SuperlatticeFactor(EffectiveMass inPlaneMass)
    {
        if (!(inPlaneMass.ElectronMasses > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(inPlaneMass), inPlaneMass.ElectronMasses,
                "inPlaneMass must be positive and finite; got the default (zero) mass. Create it with EffectiveMass.FromElectronMasses.");
        }
        return inPlaneMass.ElectronMasses / (4 * Math.PI * C);
    }

    private double DensityOfStates(double energy, string paramName, int element = -1)
    {
        var (index, inBand) = Locate(energy, paramName, element);
        if (!inBand)
        {
            // Within rounding of an edge D may still say |D| ≤ 2: that is the edge itself (Van Hove: +∞).
            return _transfer.Dispersion(energy).IsInBand ? double.PositiveInfinity : 0.0;
        }
        if (NearClosedEdge(index, energy, ClosedGapWindowFromTrace, out var edge, out var offset))
        {
            return 2 / (Math.PI * (edge.CrossingSlope + 2 * edge.CrossingCurvature * offset / edge.CrossingSlope));
        }
        var value = _transfer.Dispersion(energy);
        var trace = value.Trace;
        var q = (2 - trace) * (2 + trace);
        if (!(q > 0))
        {
            return double.PositiveInfinity; // an exact open band edge: the 1/√ Van Hove divergence
        }
        var density = 2 * Math.Abs(value.TraceDerivativePerElectronVolt) / (Math.PI * _d * Math.Sqrt(q));
        return double.IsNaN(density) ? double.PositiveInfinity : density;
    }

    private double IntegratedDensity(double energy, string paramName, int element = -1)
    {
        var (index, inBand) = Locate(energy, paramName, element);
        if (!inBand)
        {
            return 2.0 * index / _d;
        }
        var half = Math.Clamp(0.5 * _transfer.Dispersion(energy).Trace, -1.0, 1.0); // |D|/2 ≤ 1 up to rounding at an edge
        var phase = Math.Acos(half);
        var partial = index % 2 == 1 ? phase : Math.PI - phase;
        return 2.0 / (Math.PI * _d) * ((index - 1) * Math.PI + partial);
    }
}
