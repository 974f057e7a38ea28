// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Materials;

/// <summary>The parameters a <see cref="Material"/> carries, for asking where each value came from.</summary>
public enum MaterialParameter
{
    /// <summary>Γ-valley band gap at 0 K.</summary>
    BandGapAtZeroKelvin,

    /// <summary>Varshni coefficient α of Eg(T) = Eg(0) − αT²/(T + β).</summary>
    VarshniAlpha,

    /// <summary>Varshni coefficient β of Eg(T) = Eg(0) − αT²/(T + β).</summary>
    VarshniBeta,

    /// <summary>Γ-valley conduction-band effective mass at the band edge.</summary>
    ElectronMass,

    /// <summary>Valence-band maximum on the common absolute scale of the table.</summary>
    ValenceBandOffset,

    /// <summary>Cubic lattice constant.</summary>
    LatticeConstant,

    /// <summary>Heavy-hole mass along [001].</summary>
    HeavyHoleMass,

    /// <summary>Light-hole mass along [001].</summary>
    LightHoleMass,
}

/// <summary>How sure we are of a parameter value, and where it came from.</summary>
public enum ParameterStatus
{
    /// <summary>No value is available (for example hole masses of a custom material that were not given).</summary>
    NotAvailable,

    /// <summary>
    /// Recalled from the published table (I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys.
    /// 89, 5815 (2001)), not re-read against it: treat as uncertain and override where you have a better value.
    /// </summary>
    FromMemory,

    /// <summary>Read in the source or a faithful copy of it.</summary>
    Read,

    /// <summary>
    /// Follows from other parameters by a published formula (for example a hole mass from Luttinger
    /// parameters, or an alloy value by interpolation); only as sure as its inputs.
    /// </summary>
    Derived,

    /// <summary>Supplied by the caller (a custom material or a With… override).</summary>
    CallerSupplied,
}
