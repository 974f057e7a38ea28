// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// Range information of a smooth (non-uniform) segment, so a cell can bound its spectrum without
/// knowing the segment's form. Implemented by the library's smooth segment types only.
/// </summary>
internal interface IPotentialSegment
{
    Energy MinimumPotential { get; }

    Energy MaximumPotential { get; }

    EffectiveMass MinimumMass { get; }
}
