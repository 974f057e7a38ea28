// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// Small, ordinary objects of every layer of the API, built once per test class: a 5 nm well / 2 nm
/// barrier superlattice (0.067 m0 well, 0.092 m0 barrier, 0.3 eV offset: GaAs/AlGaAs-like numbers,
/// demo geometry), its bands and properties, a 4-period stack between barrier leads and its bound levels.
/// </summary>
internal static class Fixtures
{
    internal static Layer Well { get; } = Layer.Create(Length.FromNanometres(5), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067));

    internal static Layer Barrier { get; } = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092));

    internal static UnitCell Cell { get; } = UnitCell.Create(Well, Barrier);

    internal static CellTransfer Transfer { get; } = CellTransfer.Create(Cell);

    internal static BandStructure Bands { get; } = BandStructure.Compute(Cell, 4);

    internal static BandProperties Properties { get; } = BandProperties.Create(Bands);

    internal static BandDispersion Dispersion { get; } = BandDispersion.Create(Bands, 2);

    internal static BlochFunction Bloch { get; } = BlochFunction.Create(Bands, 1, 0.3);

    internal static Lead BarrierLead { get; } = Lead.Like(Barrier);

    internal static LayerStack Stack { get; } = LayerStack.Periodic(BarrierLead, Cell, 4, BarrierLead);

    internal static StackTransmission Transmission { get; } = StackTransmission.Create(Stack);

    internal static BoundStateSpectrum Bound { get; } = BoundStateSpectrum.Find(Stack);
}
