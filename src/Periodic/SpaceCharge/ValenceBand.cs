// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// One valence band of a doped cell, whose holes are carriers of the self-consistent model: a hole cell of the same layers
/// (hole energies counted downwards: each layer's potential is how far its valence-band edge lies below the cell's zero,
/// its mass the band's hole mass along the growth axis) and where that zero lies on the electron cell's energy scale.
/// Immutable.
/// </summary>
/// <remarks>
/// A single parabolic band per valence band (heavy holes, light holes: one <see cref="ValenceBand"/> each): no
/// heavy/light-hole mixing, no split-off band, no strain; the in-plane mass of a hole state is taken like an electron's,
/// 1/⟨ψ|1/m|ψ⟩ of the band's own masses. For a structure built from materials, the hole cell is the structure built for
/// heavy (or light) holes and <see cref="EdgeElectronVolts"/> is the highest valence-band edge minus the lowest
/// conduction-band edge (minus the band gap for one material).
/// </remarks>
public sealed class ValenceBand
{
    private ValenceBand(UnitCell cell, double edge, string name)
    {
        Cell = cell;
        EdgeElectronVolts = edge;
        Name = name;
    }

    /// <summary>The hole cell: uniform parabolic layers matching the electron cell's element by element, hole energies counted downwards.</summary>
    public UnitCell Cell { get; }

    /// <summary>The hole cell's energy zero on the electron cell's energy scale, eV: a hole state of hole energy E lies at electron energy <see cref="EdgeElectronVolts"/> − E.</summary>
    public double EdgeElectronVolts { get; }

    /// <summary>A name for messages and output (e.g. "heavy holes").</summary>
    public string Name { get; }

    /// <summary>Creates a valence band.</summary>
    /// <param name="holeCell">The hole cell (its elements are checked against the electron cell by <see cref="DopedCell"/>).</param>
    /// <param name="edge">The hole cell's zero on the electron energy scale; finite.</param>
    /// <param name="name">A non-empty name.</param>
    /// <exception cref="ArgumentNullException"><paramref name="holeCell"/> or <paramref name="name"/> is null.</exception>
    /// <exception cref="ArgumentException"><paramref name="name"/> is empty.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="edge"/> is not finite.</exception>
    public static ValenceBand Create(UnitCell holeCell, Energy edge, string name)
    {
        ArgumentNullException.ThrowIfNull(holeCell);
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        return new ValenceBand(holeCell, Preconditions.CheckFinite(edge.ElectronVolts, nameof(edge)), name);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{Name}: {Cell.Elements.Count} element(s), zero at {EdgeElectronVolts:G6} eV on the electron scale");
}
