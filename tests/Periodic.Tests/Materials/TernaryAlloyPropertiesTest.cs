// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Materials;
using Periodic.Units;

namespace Periodic.Tests.Materials;

public sealed class TernaryAlloyPropertiesTest
{
    private static readonly Arbitrary<double> Composition = Gen.Choose(0, 100000).Select(i => i / 1e5).ToArbitrary();
    private static readonly Arbitrary<double> Temperature = Gen.Choose(0, 100000).Select(i => i / 100.0).ToArbitrary();

    [Fact]
    public void At_AnyCompositionAndTemperature_Invariants()
    {
        // Invariants of the interpolation P(x) = xP_A + (1 − x)P_B − x(1 − x)b (Vurgaftman et al. 2001) and
        // of the Varshni law with α ≥ 0 (Varshni 1967): Vegard lattice constant between the endpoints, gap at
        // T not above the gap at 0 K, ΔEc − ΔEv = ΔEg (definition; tolerance 1e-12 eV for a few roundings).
        var alloys = new[] { TernaryAlloy.AlGaAs, TernaryAlloy.InGaAs, TernaryAlloy.InAlAs };
        var property = Prop.ForAll(Composition, Temperature, (x, t) =>
        {
            foreach (var alloy in alloys)
            {
                var m = alloy.At(x);
                double lo = Math.Min(alloy.MaterialAtOne.LatticeConstant.Nanometres, alloy.MaterialAtZero.LatticeConstant.Nanometres);
                double hi = Math.Max(alloy.MaterialAtOne.LatticeConstant.Nanometres, alloy.MaterialAtZero.LatticeConstant.Nanometres);
                if (m.LatticeConstant.Nanometres < lo - 1e-15 || m.LatticeConstant.Nanometres > hi + 1e-15)
                {
                    return false;
                }
                if (m.BandGapElectronVolts(Periodic.Units.Temperature.FromKelvin(t)) > m.BandGapAtZeroKelvin.ElectronVolts)
                {
                    return false;
                }
                var o = BandOffset.Between(alloy.MaterialAtZero, m, Periodic.Units.Temperature.FromKelvin(t));
                if (Math.Abs(o.ConductionElectronVolts - o.ValenceElectronVolts - o.GapDifferenceElectronVolts) > 1e-12)
                {
                    return false;
                }
            }
            return true;
        });
        Check.One(Config.QuickThrowOnFailure.WithReplay(20261201UL, 1UL), property);
    }

    [Fact]
    public void Build_AnyComposition_LowestEdgeIsZeroAndMassParabolic()
    {
        // The documented reference: the lowest conduction-band edge is exactly 0 and every other edge ≥ 0.
        var property = Prop.ForAll(Composition, Temperature, (x, t) =>
        {
            var built = StructureRecipe.Create(Periodic.Units.Temperature.FromKelvin(t)).Add(Material.GaAs, Length.FromNanometres(4))
                .Add(TernaryAlloy.AlGaAs.At(x), Length.FromNanometres(3)).Build();
            var min = built.Layers.Min(l => l.PotentialElectronVolts);
            return min == 0 && built.Layers.All(l => l.PotentialElectronVolts >= 0 && l.NonParabolicityPerElectronVolt == 0);
        });
        Check.One(Config.QuickThrowOnFailure.WithReplay(20261202UL, 3UL), property);
    }
}
