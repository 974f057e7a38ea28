// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

/// <summary>Invariants of the transmission calculation, as FsCheck properties with fixed seeds.</summary>
public sealed class StackTransmissionPropertyTest(ITestOutputHelper output)
{
    private static readonly Config Fixed = Config.QuickThrowOnFailure.WithReplay(0x5EED_2026UL, 0x9E37_79B9UL).WithMaxTest(200);

    private static Layer Slab(double widthNm, double potentialEv, double mass) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(mass));

    /// <summary>A random stack of layers, deltas and repeated cells, with random leads; built from one seed FsCheck draws.</summary>
    private static (LayerStack Stack, double Energy) RandomCase(int seed, bool equalLeads)
    {
        var random = new Random(seed);
        double Between(double a, double b) => a + (b - a) * random.NextDouble();
        var parts = RandomStacks.Parts(random, 60);
        var left = Lead.Create(Energy.FromElectronVolts(Between(-0.1, 0.1)), EffectiveMass.FromElectronMasses(Between(0.04, 0.15)));
        var right = equalLeads ? left : Lead.Create(Energy.FromElectronVolts(Between(-0.1, 0.1)), EffectiveMass.FromElectronMasses(Between(0.04, 0.15)));
        var energy = Between(0.101, 1.2); // above both leads' band edges
        return (LayerStack.Create(left, parts, right), energy);
    }

    private static Arbitrary<int> Seeds => Gen.Choose(0, int.MaxValue - 1).ToArbitrary();

    [Fact]
    public void Evaluate_TransmissionPlusReflection_IsOne()
    {
        // Current conservation for a lossless potential: T + R = 1 (any QM text). Tolerance: the star
        // product keeps unitarity to a few hundred roundings for stacks of a few hundred elements.
        var worst = 0.0;
        Prop.ForAll(Seeds, seed =>
        {
            var (stack, energy) = RandomCase(seed, equalLeads: false);
            var result = StackTransmission.Create(stack).Evaluate(energy);
            worst = Math.Max(worst, result.UnitarityError);
            return result.IsOpen && result.UnitarityError < 1e-12 && result.Transmission <= 1 + 1e-12 && !double.IsNaN(result.LogTransmission);
        }).Check(Fixed);
        output.WriteLine($"worst |T + R - 1| = {worst:E3}");
    }

    [Fact]
    public void Evaluate_ReversedStack_GivesSameTransmission()
    {
        // Reciprocity: in one dimension T is the same from either side for any lossless stack, leads
        // equal or not (time-reversal symmetry and unitarity of S; e.g. M. Büttiker, IBM J. Res. Dev. 32,
        // 317 (1988), from memory). Tolerance: relative 1e-9 of T or 1e-14 absolute, for T down to deep
        // tunnelling values computed by different orders of composition.
        var worstLog = 0.0;
        Prop.ForAll(Seeds, seed =>
        {
            var (stack, energy) = RandomCase(seed, equalLeads: seed % 2 == 0);
            var forward = StackTransmission.Create(stack).Evaluate(energy);
            var backward = StackTransmission.Create(stack.Reverse()).Evaluate(energy);
            worstLog = Math.Max(worstLog, Math.Abs(forward.LogTransmission - backward.LogTransmission));
            return Math.Abs(forward.LogTransmission - backward.LogTransmission) < 1e-9
                || Math.Abs(forward.Transmission - backward.Transmission) < 1e-14;
        }).Check(Fixed);
        output.WriteLine($"worst |ln T - ln T_reversed| = {worstLog:E3}");
    }

    [Fact]
    public void Evaluate_NPeriods_NeverExceedsOne()
    {
        // T_N ≤ 1 for every N (current conservation); Chebyshev form gives 1/T_N ≥ 1 since 1/T_1 ≥ 1.
        var gen = from seed in Gen.Choose(0, int.MaxValue - 1)
                  from periods in Gen.Choose(1, 5000)
                  select (seed, periods);
        Prop.ForAll(gen.ToArbitrary(), input =>
        {
            var random = new Random(input.seed);
            var cell = UnitCell.Create(Slab(0.5 + 6 * random.NextDouble(), 0, 0.067), Slab(0.5 + 4 * random.NextDouble(), 0.5 * random.NextDouble(), 0.067 + 0.05 * random.NextDouble()));
            var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(0.067));
            var t = StackTransmission.Create(LayerStack.Periodic(lead, cell, input.periods, lead)).Evaluate(0.001 + random.NextDouble());
            return t.Transmission <= 1 + 1e-12 && t.Reflection <= 1 + 1e-12 && t.UnitarityError < 1e-11;
        }).Check(Fixed);
    }

    [Fact]
    public void Evaluate_OneSymmetricCell_SatisfiesBlochPhaseRelation()
    {
        // One symmetric cell (half well, barrier, half well) between leads of the well material:
        // cos kd = cos(Kd + δ)/|t| with t = |t| e^{iδ} the amplitude of plane waves referred to the cell
        // centre and K the lead wavevector (Ashcroft & Mermin, Solid State Physics, Problem 8.1, from
        // memory). Our t refers the transmitted wave to the far face, t_AM = t e^{−iKd}.
        var worstBloch = 0.0;
        Prop.ForAll(Seeds, seed =>
        {
            var random = new Random(seed);
            var half = 0.5 + 3 * random.NextDouble();
            var barrierWidth = 0.3 + 3 * random.NextDouble();
            var height = 0.05 + 0.5 * random.NextDouble();
            var mass = 0.04 + 0.1 * random.NextDouble();
            var cell = UnitCell.Create(Slab(half, 0, mass), Slab(barrierWidth, height, 0.04 + 0.1 * random.NextDouble()), Slab(half, 0, mass));
            var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(mass));
            var e = 0.005 + 0.8 * random.NextDouble();
            var result = StackTransmission.Create(LayerStack.Periodic(lead, cell, 1, lead)).Evaluate(e);
            var d = cell.Period.Nanometres;
            var bigK = lead.WavenumberPerNanometre(e);
            var delta = result.TransmissionPhase - bigK * d;
            var lhs = CellTransfer.Create(cell).Dispersion(e).Trace / 2; // cos kd, also beyond ±1 in gaps
            var rhs = Math.Cos(bigK * d + delta) / Math.Exp(result.LogAbsTransmissionAmplitude);
            worstBloch = Math.Max(worstBloch, Math.Abs(lhs - rhs) / Math.Max(1, Math.Abs(lhs)));
            // Tolerance: 1e-10 relative to max(1, |cos kd|), both sides built from double-precision products.
            return Math.Abs(lhs - rhs) <= 1e-10 * Math.Max(1, Math.Abs(lhs));
        }).Check(Fixed);
        output.WriteLine($"worst relative Bloch-phase mismatch = {worstBloch:E3}");
    }
}
