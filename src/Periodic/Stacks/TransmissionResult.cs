// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;

namespace Periodic.Stacks;

/// <summary>Whether the leads carry propagating waves at an energy.</summary>
public enum LeadChannels
{
    /// <summary>Both leads propagate (energy above both band edges): T and R are computed.</summary>
    Open,

    /// <summary>The energy is at or below the left lead's band edge: no incident current; T = 0 and R = 1 by convention.</summary>
    LeftLeadClosed,

    /// <summary>The energy is at or below the right lead's band edge only: total reflection, T = 0, R = 1, r computed.</summary>
    RightLeadClosed,
}

/// <summary>
/// Transmission and reflection of a <see cref="LayerStack"/> at one energy, for a wave incident from
/// the left lead. Probabilities are current ratios, T = (k_R/m_R)/(k_L/m_L)·|t|², R = |r|².
/// </summary>
/// <remarks>
/// Phase convention: the incident wave is e^(ik_L·x) + r·e^(−ik_L·x) for x &lt; 0 and the transmitted
/// wave is t·e^(ik_R·(x − L)) for x &gt; L, L the stack thickness. <see cref="LogTransmission"/> stays
/// finite where <see cref="Transmission"/> underflows to zero (T below about 1e-308).
/// </remarks>
public readonly struct TransmissionResult
{
    internal TransmissionResult(double energy, LeadChannels channels, double logTransmission, Complex reflectionAmplitude,
        Complex transmissionMantissa, double transmissionLogScale)
    {
        EnergyElectronVolts = energy;
        Channels = channels;
        LogTransmission = logTransmission;
        ReflectionAmplitude = reflectionAmplitude;
        _transmissionMantissa = transmissionMantissa;
        _transmissionLogScale = transmissionLogScale;
    }

    private readonly Complex _transmissionMantissa;
    private readonly double _transmissionLogScale;

    /// <summary>The energy, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>Whether both leads propagate at this energy.</summary>
    public LeadChannels Channels { get; }

    /// <summary>True when both leads propagate (<see cref="Channels"/> is <see cref="LeadChannels.Open"/>).</summary>
    public bool IsOpen => Channels == LeadChannels.Open;

    /// <summary>Transmission probability T in [0, 1] up to rounding; zero when a lead is closed; underflows to zero below ~1e-308 (use <see cref="LogTransmission"/>).</summary>
    public double Transmission => Math.Exp(LogTransmission);

    /// <summary>ln T; −∞ exactly when a lead is closed, finite otherwise (down to about −1e300).</summary>
    public double LogTransmission { get; }

    /// <summary>log₁₀ T; −∞ exactly when a lead is closed.</summary>
    public double Log10Transmission => LogTransmission / Math.Log(10.0);

    /// <summary>Reflection probability R = |r|²; 1 when a lead is closed.</summary>
    public double Reflection => Channels == LeadChannels.LeftLeadClosed ? 1.0 : ReflectionAmplitude.Magnitude * ReflectionAmplitude.Magnitude;

    /// <summary>|T + R − 1|: the rounding error of the computation (zero when a lead is closed).</summary>
    public double UnitarityError => Math.Abs(Transmission + Reflection - 1.0);

    /// <summary>The reflection amplitude r (|r| ≤ 1); 1 by convention when the left lead is closed.</summary>
    public Complex ReflectionAmplitude { get; }

    /// <summary>The transmission amplitude t (ratio of wave amplitudes, not of currents); underflows to zero for tiny T; zero when a lead is closed.</summary>
    public Complex TransmissionAmplitude => Channels == LeadChannels.Open
        ? _transmissionMantissa * Math.Exp(_transmissionLogScale)
        : Complex.Zero;

    /// <summary>ln |t|, finite whenever both leads are open; −∞ when a lead is closed.</summary>
    public double LogAbsTransmissionAmplitude => Channels == LeadChannels.Open
        ? Math.Log(_transmissionMantissa.Magnitude) + _transmissionLogScale
        : double.NegativeInfinity;

    /// <summary>The phase arg t in (−π, π], accurate even where |t| underflows; zero when a lead is closed.</summary>
    public double TransmissionPhase => Channels == LeadChannels.Open ? _transmissionMantissa.Phase : 0.0;

    /// <inheritdoc />
    public override string ToString() => Channels switch
    {
        LeadChannels.Open => string.Create(CultureInfo.InvariantCulture,
            $"E = {EnergyElectronVolts:G10} eV: T = {Transmission:G10} (log10 T = {Log10Transmission:G8}), R = {Reflection:G10}"),
        LeadChannels.LeftLeadClosed => string.Create(CultureInfo.InvariantCulture,
            $"E = {EnergyElectronVolts:G10} eV: below the left lead's band edge, T = 0, R = 1 (no incident wave)"),
        _ => string.Create(CultureInfo.InvariantCulture,
            $"E = {EnergyElectronVolts:G10} eV: below the right lead's band edge, T = 0, R = 1 (total reflection)"),
    };
}
