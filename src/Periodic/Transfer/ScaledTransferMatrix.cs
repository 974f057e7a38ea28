// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Transfer;

/// <summary>
/// The transfer matrix of a region at one energy together with its exact energy derivative, both
/// held as a mantissa times a common factor e^<see cref="LogScale"/>:
/// M = e^LogScale · <see cref="Mantissa"/>, dM/dE = e^LogScale · <see cref="EnergyDerivativeMantissa"/> (1/eV).
/// </summary>
/// <remarks>
/// Thick or high barriers make the entries of M grow like e^(κw); the scaled form keeps them
/// representable for any number of layers (κw up to at least 700 per layer, cells of 10,000
/// layers and more). Use <see cref="LogAbsTrace"/> rather than <see cref="Trace"/> when the value may
/// exceed the double range.
/// </remarks>
public readonly struct ScaledTransferMatrix
{
    internal ScaledTransferMatrix(double energyElectronVolts, TransferMatrix mantissa, TransferMatrix derivative, double logScale)
    {
        EnergyElectronVolts = energyElectronVolts;
        Mantissa = mantissa;
        EnergyDerivativeMantissa = derivative;
        LogScale = logScale;
    }

    /// <summary>The energy at which the matrix was evaluated, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The matrix divided by e^<see cref="LogScale"/>.</summary>
    public TransferMatrix Mantissa { get; }

    /// <summary>dM/dE (per eV) divided by e^<see cref="LogScale"/>; exact, not a finite difference.</summary>
    public TransferMatrix EnergyDerivativeMantissa { get; }

    /// <summary>Natural logarithm of the common scale factor (≥ 0).</summary>
    public double LogScale { get; }

    /// <summary>The unscaled matrix; entries overflow to ±∞ when they exceed the double range.</summary>
    public TransferMatrix Matrix => Math.Exp(LogScale) * Mantissa;

    /// <summary>The unscaled dM/dE per eV; entries overflow to ±∞ when they exceed the double range.</summary>
    public TransferMatrix EnergyDerivative => Math.Exp(LogScale) * EnergyDerivativeMantissa;

    /// <summary>The trace D = Tr M; ±∞ when |D| exceeds the double range (see <see cref="LogAbsTrace"/>).</summary>
    public double Trace => Mantissa.Trace * Math.Exp(LogScale);

    /// <summary>ln |Tr M|, finite for any representable mantissa; −∞ only when the trace is exactly zero.</summary>
    public double LogAbsTrace => Math.Log(Math.Abs(Mantissa.Trace)) + LogScale;

    /// <summary>ln det M, which is 0 (det M = 1) up to rounding for any lossless region.</summary>
    public double LogDeterminant => Math.Log(Math.Abs(Mantissa.Determinant)) + 2 * LogScale;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"M(E = {EnergyElectronVolts:G8} eV) = e^{LogScale:G6} x {Mantissa}");
}
