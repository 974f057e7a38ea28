// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Bands;

/// <summary>
/// Tolerance of the Chebyshev inversion of one band (<see cref="BandDispersion.Create"/>), validated when created.
/// Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class BandDispersionOptions
{
    /// <summary>Default absolute tolerance on E(k), eV.</summary>
    public const double DefaultAbsoluteToleranceElectronVolts = 1e-13;

    private BandDispersionOptions(double absoluteToleranceElectronVolts) => AbsoluteToleranceElectronVolts = absoluteToleranceElectronVolts;

    /// <summary>The defaults: 1e-13 eV absolute.</summary>
    public static BandDispersionOptions Default { get; } = Create();

    /// <summary>
    /// Target accuracy of E(k), eV; <see cref="BandDispersion.ToleranceElectronVolts"/> raises it where rounding or the
    /// root search's own tolerance do not allow it.
    /// </summary>
    public double AbsoluteToleranceElectronVolts { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="absoluteToleranceElectronVolts">In [1e-15, 1e-3] eV.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static BandDispersionOptions Create(double absoluteToleranceElectronVolts = DefaultAbsoluteToleranceElectronVolts)
    {
        Preconditions.CheckRange(absoluteToleranceElectronVolts, 1e-15, 1e-3);
        return new BandDispersionOptions(absoluteToleranceElectronVolts);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"absolute {AbsoluteToleranceElectronVolts:G3} eV");
}
