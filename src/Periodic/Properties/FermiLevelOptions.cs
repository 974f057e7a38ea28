// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Properties;

/// <summary>
/// Tolerance of the Fermi-level searches (<see cref="BandProperties.FermiLevelForLinearDensity"/>,
/// <see cref="BandProperties.FermiLevelForSuperlatticeDensity"/>), validated when created. Every default is a constant
/// here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class FermiLevelOptions
{
    /// <summary>Default absolute tolerance of the Fermi level, eV.</summary>
    public const double DefaultAbsoluteToleranceElectronVolts = 1e-12;

    private FermiLevelOptions(double absoluteToleranceElectronVolts) => AbsoluteToleranceElectronVolts = absoluteToleranceElectronVolts;

    /// <summary>The defaults: 1e-12 eV absolute.</summary>
    public static FermiLevelOptions Default { get; } = Create();

    /// <summary>Absolute tolerance of the Fermi level that Brent's method brackets, eV.</summary>
    public double AbsoluteToleranceElectronVolts { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="absoluteToleranceElectronVolts">In [1e-15, 1] eV.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static FermiLevelOptions Create(double absoluteToleranceElectronVolts = DefaultAbsoluteToleranceElectronVolts)
    {
        Preconditions.CheckRange(absoluteToleranceElectronVolts, 1e-15, 1.0);
        return new FermiLevelOptions(absoluteToleranceElectronVolts);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"absolute {AbsoluteToleranceElectronVolts:G3} eV");
}
