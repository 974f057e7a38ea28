// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Units;

/// <summary>An energy, stored in electronvolts. <c>default</c> is zero energy.</summary>
public readonly record struct Energy : IComparable<Energy>
{
    private Energy(double electronVolts) => ElectronVolts = electronVolts;

    /// <summary>The energy in electronvolts.</summary>
    public double ElectronVolts { get; }

    /// <summary>The energy in millielectronvolts.</summary>
    public double MillielectronVolts => ElectronVolts * 1e3;

    /// <summary>The energy in joules (1 eV = e J, CODATA 2018 exact).</summary>
    public double Joules => ElectronVolts * PhysicalConstants.ElementaryChargeCoulombs;

    /// <summary>Creates an energy from electronvolts.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="electronVolts"/> is NaN or infinite.</exception>
    public static Energy FromElectronVolts(double electronVolts) => new(Preconditions.CheckFinite(electronVolts));

    /// <summary>Creates an energy from millielectronvolts.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="millielectronVolts"/> is NaN or infinite.</exception>
    public static Energy FromMillielectronVolts(double millielectronVolts) => new(Preconditions.CheckFinite(millielectronVolts) * 1e-3);

    /// <summary>Creates an energy from joules.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="joules"/> is NaN or infinite, or so large that the energy in eV overflows.</exception>
    public static Energy FromJoules(double joules)
    {
        var electronVolts = Preconditions.CheckFinite(joules) / PhysicalConstants.ElementaryChargeCoulombs;
        if (!double.IsFinite(electronVolts))
        {
            throw new ArgumentOutOfRangeException(nameof(joules), joules,
                $"joules must be at most {Preconditions.Format(double.MaxValue * PhysicalConstants.ElementaryChargeCoulombs)} in magnitude (the energy in eV must be finite); got {Preconditions.Format(joules)}.");
        }
        return new(electronVolts);
    }

    /// <summary>Sum of two energies.</summary>
    public static Energy operator +(Energy left, Energy right) => new(left.ElectronVolts + right.ElectronVolts);

    /// <summary>Difference of two energies.</summary>
    public static Energy operator -(Energy left, Energy right) => new(left.ElectronVolts - right.ElectronVolts);

    /// <inheritdoc />
    public int CompareTo(Energy other) => ElectronVolts.CompareTo(other.ElectronVolts);

    /// <inheritdoc />
    public override string ToString() => ElectronVolts.ToString("G6", CultureInfo.InvariantCulture) + " eV";
}
