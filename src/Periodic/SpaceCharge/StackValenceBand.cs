// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// One valence band of a doped finite stack, whose holes are carriers of the self-consistent model: a hole stack of the same
/// parts and leads (hole energies counted downwards: each layer's and lead's potential is how far its valence-band edge lies
/// below the stack's zero, its mass the band's hole mass along the growth axis) and where that zero lies on the electron
/// stack's energy scale. The finite-stack counterpart of <see cref="ValenceBand"/>. Immutable.
/// </summary>
/// <remarks>
/// A single parabolic band per valence band (heavy holes, light holes: one each): no heavy/light-hole mixing, no split-off
/// band, no strain. For a stack built from materials, the hole stack is the stack built for heavy (or light) holes and
/// <see cref="EdgeElectronVolts"/> the highest valence-band edge minus the lowest conduction-band edge of the cell.
/// </remarks>
public sealed class StackValenceBand
{
    private StackValenceBand(LayerStack stack, double edge, string name)
    {
        Stack = stack;
        EdgeElectronVolts = edge;
        Name = name;
    }

    /// <summary>The hole stack: parts matching the electron stack's, uniform parabolic layers, hole energies counted downwards.</summary>
    public LayerStack Stack { get; }

    /// <summary>The hole stack's energy zero on the electron stack's energy scale, eV: a hole state of hole energy E lies at electron energy <see cref="EdgeElectronVolts"/> − E.</summary>
    public double EdgeElectronVolts { get; }

    /// <summary>A name for messages and output (e.g. "heavy holes").</summary>
    public string Name { get; }

    /// <summary>Creates a valence band of a stack.</summary>
    /// <param name="holeStack">The hole stack (its parts are checked against the electron stack by <see cref="DopedStack"/>).</param>
    /// <param name="edge">The hole stack's zero on the electron energy scale; finite.</param>
    /// <param name="name">A non-empty name.</param>
    /// <exception cref="ArgumentNullException"><paramref name="holeStack"/> or <paramref name="name"/> is null.</exception>
    /// <exception cref="ArgumentException"><paramref name="name"/> is empty.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="edge"/> is not finite.</exception>
    public static StackValenceBand Create(LayerStack holeStack, Energy edge, string name)
    {
        ArgumentNullException.ThrowIfNull(holeStack);
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        return new StackValenceBand(holeStack, Preconditions.CheckFinite(edge.ElectronVolts, nameof(edge)), name);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{Name}: {Stack.Parts.Count} part(s), zero at {EdgeElectronVolts:G6} eV on the electron scale");
}
