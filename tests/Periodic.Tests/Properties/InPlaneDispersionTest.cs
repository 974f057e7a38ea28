// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Properties;

public sealed class InPlaneDispersionTest(ITestOutputHelper output)
{
    private static UnitCell Unequal() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(3),
        Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));

    [Fact]
    public void MassAtBottom_HellmannFeynman_AgreesWithFiniteDifferences()
    {
        // Hellmann–Feynman (R. P. Feynman, Phys. Rev. 56, 340 (1939)) against the Richardson-extrapolated slope of the exact
        // bottom energy in k∥²: two independent routes to m∥.
        var structure = BandStructure.Compute(Unequal(), 3);
        for (var n = 1; n <= 3; n++)
        {
            var analytic = InPlaneDispersion.MassAtBottom(structure, n);
            var numeric = InPlaneDispersion.FiniteDifferenceMass(structure, n);
            var relative = Math.Abs(analytic.ElectronMasses - numeric.ElectronMasses) / analytic.ElectronMasses;
            output.WriteLine($"band {n}: HF {analytic.ElectronMasses:R} (± {analytic.ErrorEstimateElectronMasses:E1}), FD {numeric.ElectronMasses:R} (± {numeric.ErrorEstimateElectronMasses:E1}); relative difference {relative:E2}");
            // 1e-6: the finite difference's Richardson remainder (h² with h = 1e-3 /nm²) and rounding (1e-15 eV / 5e-4 /nm²).
            Assert.True(relative < 1e-6, $"band {n}: relative difference {relative:E3}");
            // m∥ lies between the layer masses: 1/m∥ is a probability-weighted mean of 1/m (follows from the theorem).
            Assert.InRange(analytic.ElectronMasses, 0.067, 0.092);
        }
    }

    [Fact]
    public void MassAtBottom_EqualMasses_IsThatMass()
    {
        // One mass everywhere: ⟨1/m⟩ = 1/m for any normalised state (common practice, no single source).
        var structure = BandStructure.Compute(UnitCell.KronigPenney(Length.FromNanometres(4), Length.FromNanometres(2),
            Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067)), 2);
        var mass = InPlaneDispersion.MassAtBottom(structure, 1);
        // 1e-12 relative: the normalisation of the Bloch function and the 64-point rule (exact to rounding here).
        Assert.Equal(0.067, mass.ElectronMasses, 0.067 * 1e-12);
    }

    [Fact]
    public void MassAtBottom_NonParabolic_UsesFiniteDifferenceAndLiesNearParabolicValue()
    {
        var cell = UnitCell.Create(
            Layer.Create(Length.FromNanometres(5), default, EffectiveMass.FromElectronMasses(0.067), 0.6),
            Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.092), 0.4));
        var mass = InPlaneDispersion.MassAtBottom(BandStructure.Compute(cell, 1), 1);
        output.WriteLine(mass.ToString());
        Assert.Equal(InPlaneMassMethod.FiniteDifference, mass.Method);
        // With m(E) = m(1 + α(E − V)) the well mass at E ≈ 0.05 eV is about 3 % heavier, the barrier's (E − V < 0) lighter:
        // m∥ stays between 0.9·0.067 and 0.092 (bounds from the layer masses at that energy; derived).
        Assert.InRange(mass.ElectronMasses, 0.9 * 0.067, 0.092);
    }

    [Fact]
    public void EnergyAt_EqualMasses_AddsInPlaneKineticEnergy()
    {
        // Separable case (common practice): E(k_z, k∥) = E(k_z) + ħ²k∥²/2m; ħ²/2m₀ from CODATA 2018 (h, e exact).
        var hbar = 6.62607015e-34 / (2 * Math.PI);
        var c = hbar * hbar / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18;
        var cell = UnitCell.KronigPenney(Length.FromNanometres(4), Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067));
        var flat = BandStructure.Compute(cell, 2).EnergyAt(2, 0.3);
        var energy = InPlaneDispersion.EnergyAt(cell, 2, 0.3, 0.4);
        // 1e-12 eV: the band search's accuracy at E ≈ 0.3 eV.
        Assert.Equal(flat + c * 0.16 / 0.067, energy, 1e-12);
    }

    [Fact]
    public void EdgesAt_BadWavevector_ThrowsNamingIt()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => InPlaneDispersion.EdgesAt(Unequal(), 2, -1));
        Assert.Equal("inPlaneWavevectorPerNanometre", e.ParamName);
    }
}
