// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Units;

namespace Periodic.Cli.Physics;

/// <summary>
/// Per-energy quantities the tool reports, computed from the core's dispersion function
/// D(E) = Tr M(E) and its exact derivative D′(E). Kept to the three one-line consequences of the
/// Bloch condition cos(kd) = D/2 until the library's derived-quantities layer lands, then replaced by it.
/// </summary>
/// <remarks>
/// Differentiating cos(kd) = D(E)/2 gives dE/dk = −2d·sin(kd)/D′(E); the 1D density of states with
/// both spins and ±k is g(E) = (2/π)|dk/dE| = |D′|/(π·d·|sin kd|) per eV per nm; at a band edge
/// (D = ±2) the curvature gives m*/m₀ = −(ħ²/2m₀)·D′·(D/2)/d² (e.g. Ashcroft and Mermin, Solid State
/// Physics, ch. 8 and problem 8.1 for the Kronig–Penney form; the algebra is the chain rule).
/// </remarks>
internal static class CoreDerived
{
    public readonly record struct PointValues(double Energy, double Dos, double Wavevector, double Decay, double Slope);

    public static PointValues At(BandStructure bands, double energyElectronVolts)
    {
        var value = bands.Transfer.Dispersion(energyElectronVolts);
        var k = value.Wavevector;
        var d = bands.PeriodNanometres;
        if (!k.IsPropagating)
        {
            return new PointValues(energyElectronVolts, 0.0, k.RealPerNanometre, k.ImaginaryPerNanometre, 0.0);
        }
        var sin = Math.Sin(k.PhasePerPeriod);
        var derivative = value.TraceDerivativePerElectronVolt;
        // At a band edge sin(kd) = 0: the DOS has its 1/sqrt van Hove divergence and the slope is zero.
        var dos = sin == 0 ? double.PositiveInfinity : Math.Abs(derivative) / (Math.PI * d * Math.Abs(sin));
        var slope = derivative == 0 ? double.PositiveInfinity : -2 * d * sin / derivative;
        return new PointValues(energyElectronVolts, dos, k.RealPerNanometre, 0.0, slope);
    }

    /// <summary>Band-edge effective mass in m₀ (positive at a bottom, negative at a top); NaN where the gap is closed.</summary>
    public static double EdgeMass(BandStructure bands, double edgeElectronVolts)
    {
        var value = bands.Transfer.Dispersion(edgeElectronVolts);
        var d = bands.PeriodNanometres;
        var derivative = value.TraceDerivativePerElectronVolt;
        if (derivative == 0 || !double.IsFinite(derivative))
        {
            return double.NaN;
        }
        var sign = value.ScaledTrace >= 0 ? 1.0 : -1.0;
        return -PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * derivative * sign / (d * d);
    }
}
