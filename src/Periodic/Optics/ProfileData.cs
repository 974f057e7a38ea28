// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;

namespace Periodic.Optics;

/// <summary>
/// Per-element numbers of a <see cref="StackProfile"/> read from its compiled kernel, with zero for a delta barrier
/// (which has no width, potential or mass of its own).
/// </summary>
internal static class ProfileData
{
    /// <summary>Width of element <paramref name="i"/>, nm (0 for a delta).</summary>
    internal static double Width(this StackProfile profile, int i) => profile.IsDelta(i) ? 0 : profile.Kernel.LayerData(i).Width;

    /// <summary>Potential of layer <paramref name="i"/>, eV (0 for a delta).</summary>
    internal static double Potential(this StackProfile profile, int i) => profile.IsDelta(i) ? 0 : profile.Kernel.LayerData(i).Potential;

    /// <summary>Band-edge mass of layer <paramref name="i"/>, m₀ (0 for a delta).</summary>
    internal static double Mass(this StackProfile profile, int i) => profile.IsDelta(i) ? 0 : profile.Kernel.LayerData(i).Mass;

    /// <summary>Mass slope dm/dE of layer <paramref name="i"/>, m₀/eV (0 for a delta).</summary>
    internal static double MassSlope(this StackProfile profile, int i) => profile.IsDelta(i) ? 0 : profile.Kernel.LayerData(i).MassSlope;
}
