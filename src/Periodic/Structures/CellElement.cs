// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// One piece of a unit cell, in order along the growth axis: a uniform <see cref="Layer"/>, a
/// zero-width <see cref="DeltaBarrier"/>, or (where available) a smooth segment. The set of
/// element kinds is closed: the transfer-matrix layer knows how to propagate each one.
/// </summary>
public abstract class CellElement
{
    private protected CellElement()
    {
    }

    /// <summary>Thickness of the element along the growth axis (zero for a delta barrier).</summary>
    public abstract Length Width { get; }
}
