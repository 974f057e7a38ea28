// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Serialization;

public sealed partial class StructureDefinition
{
    /// <summary>
    /// The optical lattice the file describes (its <c>opticalLattice</c> field), whose <see cref="Periodic.OpticalLattices.OpticalLattice.Cell"/>
    /// is <see cref="Cell"/>; null for a cell of layers, deltas or segments. Tools use it to show energies in recoil
    /// energies and wavevectors in units of k_L.
    /// </summary>
    public Periodic.OpticalLattices.OpticalLattice? OpticalLattice { get; internal init; }
}
