// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    [Theory]
    [InlineData(1e3)]
    [InlineData(1e6)] // a heavy particle: bands near 1e-7 eV, as for cold atoms in an optical lattice
    public void Compute_MassScaling_EdgesScaleAsOneOverMass(double lambda)
    {
        // Scaling law of −(ħ²/2m)(ψ′/m)′ + Vψ = Eψ [derived]: masses × λ and potentials × 1/λ leave the
        // dimensionless problem unchanged, so every edge scales exactly as 1/λ. The default tolerances
        // must follow the cell's energy scale (a fixed 1e-15 eV floor would leave only ~1e-8 relative here).
        UnitCell Cell(double s) => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2),
            Energy.FromElectronVolts(0.25 / s), EffectiveMass.FromElectronMasses(0.067 * s), EffectiveMass.FromElectronMasses(0.092 * s));
        var reference = BandStructure.Compute(Cell(1), 4);
        var heavy = BandStructure.Compute(Cell(lambda), 4);
        Assert.True(heavy.CountChecks >= reference.CountChecks, $"count checks {heavy.CountChecks} vs {reference.CountChecks}");
        for (var n = 1; n <= 4; n++)
        {
            var expected = reference.GetBand(n);
            var actual = heavy.GetBand(n);
            // 1e-12: the edge accuracy; both results are independently converged to ~1e-14.
            Assert.Equal(expected.BottomElectronVolts, actual.BottomElectronVolts * lambda, 1e-12 * expected.BottomElectronVolts);
            Assert.Equal(expected.TopElectronVolts, actual.TopElectronVolts * lambda, 1e-12 * expected.TopElectronVolts);
            Assert.True(actual.TopErrorElectronVolts * lambda <= 1e-12 * expected.TopElectronVolts);
        }
    }
}
