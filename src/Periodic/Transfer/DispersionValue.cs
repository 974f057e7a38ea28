// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Transfer;

/// <summary>
/// The dispersion function D(E) = Tr M(E) of a unit cell at one energy, with its exact energy
/// derivative, in scaled form (D = <see cref="ScaledTrace"/>·e^<see cref="LogScale"/>). The Bloch
/// condition is cos(kd) = D/2: energies with |D| ≤ 2 lie in an allowed band.
/// </summary>
public readonly struct DispersionValue
{
    internal DispersionValue(double energyElectronVolts, double scaledTrace, double scaledDerivative, double logScale, double periodNanometres)
    {
        EnergyElectronVolts = energyElectronVolts;
        ScaledTrace = scaledTrace;
        ScaledTraceDerivativePerElectronVolt = scaledDerivative;
        LogScale = logScale;
        PeriodNanometres = periodNanometres;
    }

    /// <summary>The energy, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The period d of the cell, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>D divided by e^<see cref="LogScale"/>.</summary>
    public double ScaledTrace { get; }

    /// <summary>dD/dE (1/eV) divided by e^<see cref="LogScale"/>.</summary>
    public double ScaledTraceDerivativePerElectronVolt { get; }

    /// <summary>Natural logarithm of the common scale factor (≥ 0).</summary>
    public double LogScale { get; }

    /// <summary>D(E) = Tr M; ±∞ if |D| exceeds the double range (deep in a gap of a thick-barrier cell), never NaN.</summary>
    public double Trace => ScaledTrace * Math.Exp(LogScale);

    /// <summary>dD/dE in 1/eV, exact; ±∞ if beyond the double range, never NaN.</summary>
    public double TraceDerivativePerElectronVolt => ScaledTraceDerivativePerElectronVolt * Math.Exp(LogScale);

    /// <summary>ln|D|, finite whenever D ≠ 0.</summary>
    public double LogAbsTrace => Math.Log(Math.Abs(ScaledTrace)) + LogScale;

    /// <summary>True when |D| ≤ 2, i.e. the energy lies in an allowed band (edges included).</summary>
    public bool IsInBand => Math.Abs(ScaledTrace) * 0.5 <= Math.Exp(-LogScale);

    /// <summary>
    /// The complex Bloch wavevector k(E): real k in [0, π/d] inside a band; in a gap Re k = 0 or π/d
    /// (gap below a zone-centre or zone-boundary edge) and Im k &gt; 0 the decay constant, 1/nm.
    /// </summary>
    public BlochWavevector Wavevector
    {
        get
        {
            var d = PeriodNanometres;
            if (IsInBand)
            {
                var half = Math.Clamp(0.5 * Trace, -1.0, 1.0); // |D|/2 ≤ 1 here up to the last bit
                return new BlochWavevector(Math.Acos(half) / d, 0.0, d);
            }
            var real = ScaledTrace > 0 ? 0.0 : Math.PI / d;
            return new BlochWavevector(real, ArcoshOfHalfAbsTrace() / d, d);
        }
    }

    /// <summary>arcosh(|D|/2) without overflow: for |D| &gt; 2^60 it equals ln|D| to rounding.</summary>
    private double ArcoshOfHalfAbsTrace()
    {
        var logAbs = LogAbsTrace;
        if (logAbs > 41.6)
        {
            return logAbs; // arcosh(x/2) = ln(x) - x^-2 - ..., x > e^41.6 ≈ 1.2e18
        }
        var x = 0.5 * Math.Abs(Trace);
        return Math.Acosh(x);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"D({EnergyElectronVolts:G8} eV) = {Trace:G10}, dD/dE = {TraceDerivativePerElectronVolt:G6} /eV{(IsInBand ? " (band)" : " (gap)")}");
}
