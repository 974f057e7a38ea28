// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Units;

/// <summary>
/// An absolute (thermodynamic) temperature. Never negative and always finite once created; <c>default</c> is
/// 0 K, which the methods that need k_BT &gt; 0 refuse with the range they accept.
/// </summary>
public readonly record struct Temperature : IComparable<Temperature>
{
    private Temperature(double kelvin) => Kelvin = kelvin;

    /// <summary>The temperature in kelvin.</summary>
    public double Kelvin { get; }

    /// <summary>The thermal energy k_B·T (Boltzmann constant exact since the 2019 SI, CODATA 2018).</summary>
    public Energy ThermalEnergy => Energy.FromElectronVolts(Kelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin);

    /// <summary>Creates a temperature from kelvin.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="kelvin"/> is negative or not finite.</exception>
    public static Temperature FromKelvin(double kelvin) => new(Preconditions.CheckNonNegativeFinite(kelvin));

    /// <inheritdoc />
    public int CompareTo(Temperature other) => Kelvin.CompareTo(other.Kelvin);

    /// <inheritdoc />
    public override string ToString() => Kelvin.ToString("G6", CultureInfo.InvariantCulture) + " K";
}
