// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Units;

/// <summary>
/// An effective mass in units of the free-electron mass m₀ (CODATA 2018). Always positive and
/// finite once created; <c>default</c> is not a valid mass and is rejected where a mass is used.
/// </summary>
public readonly record struct EffectiveMass : IComparable<EffectiveMass>
{
    private EffectiveMass(double electronMasses) => ElectronMasses = electronMasses;

    /// <summary>The free-electron mass, 1 m₀.</summary>
    public static EffectiveMass FreeElectron { get; } = new(1.0);

    /// <summary>The mass in units of the free-electron mass m₀.</summary>
    public double ElectronMasses { get; }

    /// <summary>The mass in kilograms.</summary>
    public double Kilograms => ElectronMasses * PhysicalConstants.ElectronMassKilograms;

    /// <summary>Creates a mass from a multiple of the free-electron mass.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="electronMasses"/> is not positive and finite.</exception>
    public static EffectiveMass FromElectronMasses(double electronMasses) => new(Preconditions.CheckPositiveFinite(electronMasses));

    /// <inheritdoc />
    public int CompareTo(EffectiveMass other) => ElectronMasses.CompareTo(other.ElectronMasses);

    /// <inheritdoc />
    public override string ToString() => ElectronMasses.ToString("G6", CultureInfo.InvariantCulture) + " m0";
}
