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

    /// <summary>The lowest potential of element <paramref name="i"/>, eV (a layer's own; a smooth segment's lowest step mean; 0 for a delta).</summary>
    internal static double MinimumPotential(this StackProfile profile, int i) =>
        profile.IsDelta(i) ? 0 : profile.Kernel.IsSegment(i) ? profile.Kernel.Segment(i).PotentialRange.Minimum : profile.Kernel.LayerData(i).Potential;

    /// <summary>The highest potential of element <paramref name="i"/>, eV (a layer's own; a smooth segment's highest step mean; 0 for a delta).</summary>
    internal static double MaximumPotential(this StackProfile profile, int i) =>
        profile.IsDelta(i) ? 0 : profile.Kernel.IsSegment(i) ? profile.Kernel.Segment(i).PotentialRange.Maximum : profile.Kernel.LayerData(i).Potential;

    /// <summary>Band-edge mass of element <paramref name="i"/>, m₀ (a smooth segment's mean mass; 0 for a delta).</summary>
    internal static double Mass(this StackProfile profile, int i) =>
        profile.IsDelta(i) ? 0 : profile.Kernel.IsSegment(i) ? profile.Kernel.Segment(i).MeanMass : profile.Kernel.LayerData(i).Mass;

    /// <summary>Mass slope dm/dE of layer <paramref name="i"/>, m₀/eV (0 for a delta).</summary>
    internal static double MassSlope(this StackProfile profile, int i) => profile.IsDelta(i) ? 0 : profile.Kernel.LayerData(i).MassSlope;
}
