// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Units;

/// <summary>A length, stored in nanometres. <c>default</c> is zero length.</summary>
public readonly record struct Length : IComparable<Length>
{
    private Length(double nanometres) => Nanometres = nanometres;

    /// <summary>The length in nanometres.</summary>
    public double Nanometres { get; }

    /// <summary>The length in ångströms (1 Å = 0.1 nm).</summary>
    public double Angstroms => Nanometres * 10.0;

    /// <summary>The length in metres.</summary>
    public double Metres => Nanometres * PhysicalConstants.MetresPerNanometre;

    /// <summary>Creates a length from nanometres.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="nanometres"/> is NaN or infinite.</exception>
    public static Length FromNanometres(double nanometres) => new(Preconditions.CheckFinite(nanometres));

    /// <summary>Creates a length from ångströms.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="angstroms"/> is NaN or infinite.</exception>
    public static Length FromAngstroms(double angstroms) => new(Preconditions.CheckFinite(angstroms) * 0.1);

    /// <summary>Sum of two lengths.</summary>
    public static Length operator +(Length left, Length right) => new(left.Nanometres + right.Nanometres);

    /// <summary>Length scaled by a factor.</summary>
    public static Length operator *(double factor, Length length) => new(factor * length.Nanometres);

    /// <inheritdoc />
    public int CompareTo(Length other) => Nanometres.CompareTo(other.Nanometres);

    /// <inheritdoc />
    public override string ToString() => Nanometres.ToString("G6", CultureInfo.InvariantCulture) + " nm";
}
