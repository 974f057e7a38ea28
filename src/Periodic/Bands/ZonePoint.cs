// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Bands;

/// <summary>Where in the first Brillouin zone a band edge lies.</summary>
public enum ZonePoint
{
    /// <summary>The zone centre, k = 0 (D = +2, periodic Bloch function).</summary>
    Center,

    /// <summary>The zone boundary, k = π/d (D = −2, antiperiodic Bloch function).</summary>
    Boundary,
}
