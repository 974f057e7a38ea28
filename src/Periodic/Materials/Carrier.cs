// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Materials;

/// <summary>Which carrier a built structure describes, and so which band edge and mass each layer contributes.</summary>
public enum Carrier
{
    /// <summary>Conduction-band electrons (Γ valley): potential from E_c(T), mass m_e.</summary>
    Electron,

    /// <summary>
    /// Heavy holes in a <b>single-band approximation</b>: potential from the valence-band edge (hole
    /// energies counted downwards), mass m_hh along [001]. Heavy/light-hole mixing, the split-off band
    /// and in-plane dispersion are ignored; good for rough subband positions at k∥ = 0 only.
    /// </summary>
    HeavyHole,

    /// <summary>
    /// Light holes in a <b>single-band approximation</b>: as <see cref="HeavyHole"/> with m_lh; the
    /// neglected band mixing matters even more for light holes.
    /// </summary>
    LightHole,
}
