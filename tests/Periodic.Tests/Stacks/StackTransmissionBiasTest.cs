// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using FsCheck;
using FsCheck.Fluent;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

/// <summary>Transmission of stacks under an applied bias (a uniform field across the layers).</summary>
public sealed class StackTransmissionBiasTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private static readonly Config Fixed = Config.QuickThrowOnFailure.WithReplay(0xB1A5_2026UL, 0x9E37_79B9UL).WithMaxTest(200);
    private static readonly EffectiveMass GaAs = EffectiveMass.FromElectronMasses(0.067);
    private static readonly Lead Ground = Lead.Create(default, GaAs);

    private static Layer Slab(double widthNm, double potentialEv, double mass = 0.067) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(mass));

    private static Energy Ev(double value) => Energy.FromElectronVolts(value);

    private static Arbitrary<int> Seeds => Gen.Choose(0, int.MaxValue - 1).ToArbitrary();

    /// <summary>A random stack of layers, deltas and repeated cells with unequal leads, a bias and an energy above both lead edges.</summary>
    private static (LayerStack Stack, double Bias, double Energy) RandomCase(int seed)
    {
        var random = new Random(seed);
        double Between(double a, double b) => a + (b - a) * random.NextDouble();
        var parts = RandomStacks.Parts(random, 40);
        parts.Add(Slab(Between(0.5, 3), Between(-0.1, 0.5), Between(0.04, 0.15))); // positive thickness
        var left = Lead.Create(Ev(Between(-0.1, 0.1)), EffectiveMass.FromElectronMasses(Between(0.04, 0.15)));
        var right = Lead.Create(Ev(Between(-0.1, 0.1)), EffectiveMass.FromElectronMasses(Between(0.04, 0.15)));
        var bias = Between(-0.5, 0.5);
        var edge = Math.Max(left.PotentialElectronVolts, right.PotentialElectronVolts - bias);
        return (LayerStack.Create(left, parts, right), bias, edge + Between(0.001, 1.0));
    }

    [Fact]
    public void Create_ZeroBias_IsTheUnbiasedCalculation()
    {
        // Definition: a zero drop is no field. Exact equality (same code path).
        Prop.ForAll(Seeds, seed =>
        {
            var (stack, _, energy) = RandomCase(seed);
            var plain = StackTransmission.Create(stack).Evaluate(energy);
            var zero = StackTransmission.Create(stack, Ev(0)).Evaluate(energy);
            return plain.LogTransmission == zero.LogTransmission && plain.ReflectionAmplitude == zero.ReflectionAmplitude;
        }).Check(Fixed.WithMaxTest(50));
    }

    [Fact]
    public void Evaluate_SmallBias_IsContinuous()
    {
        // ln T is a smooth function of the bias (analytic dependence of the ODE on a parameter), and at U = 0 the
        // calculation switches from closed-form flat layers to the tilted-layer forms. Continuity at the switch:
        // ln T(U) − ln T(0) − U·D must vanish to rounding for U = ±1e-12 eV, D the central difference at h = 1e-6 eV
        // (its truncation error h²·D‴/6 and rounding error 1e-13/h contribute < 1e-16 at this U). Tolerance 1e-12:
        // a few hundred roundings of ln T ≈ −25, computed by the two different algorithms. And D must be the same at
        // h = 1e-5 eV to 1e-5 relative (O(h²) truncation, rounding 1e-13/h ≈ 1e-7).
        var cell = UnitCell.Create(Slab(4, 0), Slab(2, 0.3));
        var stack = LayerStack.Create(Ground, [Slab(3, 0.2), DeltaBarrier.Create(0.05), StackPart.Repeat(cell, 8), Slab(4, 0)],
            Lead.Create(Ev(0.02), EffectiveMass.FromElectronMasses(0.08)));
        var worstJump = 0.0;
        var worstDerivative = 0.0;
        foreach (var energy in new[] { 0.05, 0.11, 0.23, 0.31, 0.5 })
        {
            var zero = StackTransmission.Create(stack).Evaluate(energy).LogTransmission;
            double LogT(double u) => StackTransmission.Create(stack, Ev(u)).Evaluate(energy).LogTransmission;
            var d6 = (LogT(1e-6) - LogT(-1e-6)) / 2e-6;
            var d5 = (LogT(1e-5) - LogT(-1e-5)) / 2e-5;
            worstDerivative = Math.Max(worstDerivative, Math.Abs(d6 - d5) / Math.Max(1, Math.Abs(d5)));
            foreach (var u in new[] { -1e-12, 1e-12 })
            {
                worstJump = Math.Max(worstJump, Math.Abs(LogT(u) - zero - u * d6));
            }
            output.WriteLine($"E = {energy}: ln T(0) = {zero:G10}, d ln T/dU = {d6:G8} 1/eV");
        }
        output.WriteLine($"worst |ln T(U) - ln T(0) - U D| at |U| = 1e-12 eV: {worstJump:E3}; worst derivative mismatch {worstDerivative:E3}");
        Assert.True(worstJump < 1e-12, $"{worstJump}");
        Assert.True(worstDerivative < 1e-5, $"{worstDerivative}");
    }

    [Theory]
    [InlineData(0.15, 0.05)]
    [InlineData(0.15, 0.32)]
    [InlineData(-0.2, 0.35)]
    [InlineData(0.6, 0.02)]
    public void Evaluate_LayersWithDelta_MatchesMagnusSegments(double bias, double energy)
    {
        // Independent method: the same tilted profile written as zero-bias smooth segments V(x) = V − F·x, propagated
        // by the library's fourth-order Magnus integrator (a different algorithm from the Airy/series forms), with the
        // right lead's edge shifted by hand. Tolerance 1e-10 on t and r: Magnus with 20 000 steps per segment
        // converges to ~1e-13 here (self-check against 10 000 steps below, error ∝ h⁴).
        var m2 = EffectiveMass.FromElectronMasses(0.09);
        var right = Lead.Create(Ev(0.1), EffectiveMass.FromElectronMasses(0.08));
        var biased = LayerStack.Create(Ground, [Slab(4, 0.25), DeltaBarrier.Create(0.05), Slab(5, 0.0, 0.09), DeltaBarrier.Create(-0.02), Slab(2, 0.3)], right);
        var field = bias / 11.0;
        LayerStack Reference(int steps) => LayerStack.Create(Ground,
            [FunctionSegment.Create(Length.FromNanometres(4), x => 0.25 - field * x, GaAs, steps), DeltaBarrier.Create(0.05),
             FunctionSegment.Create(Length.FromNanometres(5), x => 0.0 - field * (4 + x), m2, steps), DeltaBarrier.Create(-0.02),
             FunctionSegment.Create(Length.FromNanometres(2), x => 0.3 - field * (9 + x), GaAs, steps)],
            Lead.Create(Ev(0.1 - bias), EffectiveMass.FromElectronMasses(0.08)));
        var result = StackTransmission.Create(biased, Ev(bias)).Evaluate(energy);
        var fine = StackTransmission.Create(Reference(20_000)).Evaluate(energy);
        var coarse = StackTransmission.Create(Reference(10_000)).Evaluate(energy);
        var tError = Complex.Abs(result.TransmissionAmplitude - fine.TransmissionAmplitude);
        var rError = Complex.Abs(result.ReflectionAmplitude - fine.ReflectionAmplitude);
        var magnusSelf = Complex.Abs(coarse.TransmissionAmplitude - fine.TransmissionAmplitude);
        output.WriteLine($"T = {result.Transmission:G6}: |dt| = {tError:E3}, |dr| = {rError:E3}, Magnus self-check {magnusSelf:E3}");
        Assert.Equal(LeadChannels.Open, result.Channels);
        Assert.True(magnusSelf < 1e-11, $"{magnusSelf}");
        Assert.True(tError < 1e-10 && rError < 1e-10, $"{tError} {rError}");
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(0.45)]
    public void Evaluate_ThickLayerStrongField_MatchesMagnusSegment(double energy)
    {
        // A 60 nm layer under 1.5 eV: far more than 64 sublayers of phase, so the Airy form is the one used (asserted).
        // Independent Magnus reference as above (40 000 steps, kh ≤ 0.003); tolerance 1e-10 on t and r.
        const double bias = 1.5;
        var layer = Slab(60, 0.2);
        var stack = LayerStack.Create(Ground, Ground, layer);
        Assert.Equal(LinearLayerPropagator.Method.Airy, LinearLayerPropagator.Choose(energy, 0.2, -bias / 60, 60, 0.067));
        var result = StackTransmission.Create(stack, Ev(bias)).Evaluate(energy);
        LayerStack Reference(int steps) => LayerStack.Create(Ground,
            [FunctionSegment.Create(Length.FromNanometres(60), x => 0.2 - bias / 60 * x, GaAs, steps)], Lead.Create(Ev(-bias), GaAs));
        var fine = StackTransmission.Create(Reference(40_000)).Evaluate(energy);
        var coarse = StackTransmission.Create(Reference(20_000)).Evaluate(energy);
        var tError = Complex.Abs(result.TransmissionAmplitude - fine.TransmissionAmplitude);
        var rError = Complex.Abs(result.ReflectionAmplitude - fine.ReflectionAmplitude);
        var magnusSelf = Complex.Abs(coarse.TransmissionAmplitude - fine.TransmissionAmplitude);
        output.WriteLine($"T = {result.Transmission:G6}: |dt| = {tError:E3}, |dr| = {rError:E3}, Magnus self-check {magnusSelf:E3}");
        Assert.True(magnusSelf < 1e-11, $"{magnusSelf}");
        Assert.True(tError < 1e-10 && rError < 1e-10, $"{tError} {rError}");
    }

    [Fact]
    public void Evaluate_TinyTransmission_StaysFiniteAndAccurate()
    {
        // A 2 eV, 100 nm barrier under 0.5 eV bias: T far below the double range (log10 T ≈ −340). ln T must stay
        // finite and agree with the Magnus reference (as above) to 1e-10 relative (the scaled forms keep the
        // relative accuracy of ln T, which is a sum of logarithms).
        var heavy = EffectiveMass.FromElectronMasses(0.5);
        var lead = Lead.Create(default, heavy);
        var stack = LayerStack.Create(lead, lead, Slab(100, 2.0, 0.5));
        const double bias = 0.5, energy = 0.6;
        var result = StackTransmission.Create(stack, Ev(bias)).Evaluate(energy);
        var reference = StackTransmission.Create(LayerStack.Create(lead,
            [FunctionSegment.Create(Length.FromNanometres(100), x => 2.0 - bias / 100 * x, heavy, 40_000)],
            Lead.Create(Ev(-bias), heavy))).Evaluate(energy);
        var relative = Math.Abs(result.LogTransmission / reference.LogTransmission - 1);
        output.WriteLine($"log10 T = {result.Log10Transmission:G10} (Magnus {reference.Log10Transmission:G10}), relative {relative:E3}, |T + R - 1| = {result.UnitarityError:E3}");
        Assert.True(double.IsFinite(result.LogTransmission) && result.Log10Transmission < -310);
        Assert.True(relative < 1e-10, $"{relative}");
    }

    [Fact]
    public void Evaluate_TransmissionPlusReflection_IsOne()
    {
        // Current conservation for a lossless potential, T + R = 1 (any QM text), with unequal leads and the right
        // lead shifted by the bias. Tolerance 1e-12: the star product keeps unitarity to a few hundred roundings
        // for the few hundred elements of these stacks.
        var worst = 0.0;
        Prop.ForAll(Seeds, seed =>
        {
            var (stack, bias, energy) = RandomCase(seed);
            var result = StackTransmission.Create(stack, Ev(bias)).Evaluate(energy);
            worst = Math.Max(worst, result.UnitarityError);
            return result.IsOpen && result.UnitarityError < 1e-12 && result.Transmission <= 1 + 1e-12 && !double.IsNaN(result.LogTransmission);
        }).Check(Fixed);
        output.WriteLine($"worst |T + R - 1| = {worst:E3}");
    }

    [Fact]
    public void Evaluate_ReversedStackAndBias_GivesSameTransmission()
    {
        // Reciprocity of a lossless two-terminal scatterer (time reversal + unitarity; common practice, e.g.
        // M. Büttiker, IBM J. Res. Dev. 32, 317 (1988), from memory): the mirror image of the biased profile is the
        // reversed stack under −U, with energies measured from its own (left) lead, i.e. shifted by +U.
        // Tolerance as at zero bias: 1e-9 in ln T, or 1e-14 absolute for T near underflow.
        var worst = 0.0;
        Prop.ForAll(Seeds, seed =>
        {
            var (stack, bias, energy) = RandomCase(seed);
            var forward = StackTransmission.Create(stack, Ev(bias)).Evaluate(energy);
            var backward = StackTransmission.Create(stack.Reverse(), Ev(-bias)).Evaluate(energy + bias);
            var difference = Math.Abs(forward.LogTransmission - backward.LogTransmission);
            worst = Math.Max(worst, difference);
            return difference < 1e-9 || Math.Abs(forward.Transmission - backward.Transmission) < 1e-14;
        }).Check(Fixed);
        output.WriteLine($"worst |ln T - ln T_mirror| = {worst:E3}");
    }

    [Fact]
    public void Evaluate_TriangularBarrier_FollowsFowlerNordheimSlope()
    {
        // Fowler–Nordheim tunnelling through the triangular part of a 1.1 eV barrier (φ = 1 eV above the carrier),
        // mass 0.5 m₀ throughout: WKB gives ln T ≈ const − (4/3)√(2m)φ^(3/2)/(ħeF) (R. H. Fowler and L. Nordheim,
        // Proc. R. Soc. A 119, 173 (1928); the WKB exponent of a linear barrier, e.g. Griffiths §8.2). The
        // prefactor is not exact, so the check is the slope d ln T/d(1/F) from a least-squares line over F = 0.08 …
        // 0.2 eV/nm (exponents 60 … 24, where WKB holds). The right lead continues the layer's edge at x = L, so no
        // step there adds interference. Margin 2%: the leading corrections to the WKB phase are O(1/ζ) in the
        // prefactor (Abramowitz and Stegun 10.4.59, ζ = exponent/2 ≥ 12), which changes slowly with 1/F; the
        // measured deviation is printed.
        const double mass = 0.5, phi0 = 1.1, energy = 0.1, width = 25;
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(mass));
        var barrier = Slab(width, phi0, mass);
        var stack = LayerStack.Create(lead, Lead.Like(barrier), barrier);
        var phi = phi0 - energy;
        var expectedSlope = -4.0 / 3.0 * Math.Sqrt(mass / C) * Math.Pow(phi, 1.5); // √(2m)/ħ = √(m/C) in eV, nm units
        var xs = new List<double>();
        var ys = new List<double>();
        for (var i = 0; i <= 12; i++)
        {
            var field = 0.08 + 0.01 * i;
            var t = StackTransmission.Create(stack, Ev(field * width)).Evaluate(energy);
            xs.Add(1 / field);
            ys.Add(t.LogTransmission);
        }
        var (_, slope) = MathNet.Numerics.Fit.Line(xs.ToArray(), ys.ToArray());
        var deviation = Math.Abs(slope / expectedSlope - 1);
        output.WriteLine($"slope {slope:G8} eV/nm, WKB {expectedSlope:G8}, relative deviation {deviation:E3}");
        Assert.True(deviation < 0.02, $"{deviation}");
    }

    [Fact]
    public void FindResonances_DoubleBarrierUnderBias_PeakMovesDownByHalfTheDrop()
    {
        // Symmetric double barrier: the well sits at the middle of the structure, where the potential has dropped by
        // U/2, so the quasi-bound level follows it down by ≈ U/2 (common practice in resonant-tunnelling design). The
        // first-order Stark shift about the well centre vanishes by symmetry; the second-order shift, ≈ 2.2e-3
        // e²F²mL⁴/ħ² for an infinite well of width L (G. Bastard et al., Phys. Rev. B 28, 3241 (1983), from memory),
        // is at most ~1% of U/2 here even with L enlarged by the penetration into the barriers; tolerance 3% of U/2.
        var stack = LayerStack.Create(Ground, Ground, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3));
        var unbiased = StackTransmission.Create(stack).FindResonances(0.01, 0.2).Resonances[0].EnergyElectronVolts;
        var worst = 0.0;
        foreach (var bias in new[] { 0.01, 0.02, 0.04 })
        {
            var peaks = StackTransmission.Create(stack, Ev(bias)).FindResonances(0.005, 0.2).Resonances;
            var peak = peaks.MinBy(p => Math.Abs(p.EnergyElectronVolts - (unbiased - bias / 2)))!.EnergyElectronVolts;
            var shift = unbiased - peak;
            var relative = Math.Abs(shift / (bias / 2) - 1);
            worst = Math.Max(worst, relative);
            output.WriteLine($"U = {bias} eV: peak {peak:G8} eV, shift {shift:G6} eV, U/2 = {bias / 2}, relative deviation {relative:E3}");
        }
        Assert.True(worst < 0.03, $"{worst}");
    }

    [Fact]
    public void FindResonances_SuperlatticeUnderSmallBias_FindsEveryPeak()
    {
        // 100 periods give 100 transmission peaks per miniband (Chebyshev form of M^N, Yeh ch. 6); at the bottom of the
        // first miniband they are micro-electronvolts wide and closer together than a coarse scan step, so two of them in
        // one step can cancel their turns of arg t. Under a tiny bias the local Bloch-phase guide must still split those
        // steps. Reference, independent of the search: the maxima of T on a 20,000-point grid over the window (step
        // 1e-7 eV; the peaks there are ≥ 1e-6 eV apart and at least 3e-7 eV wide, so the grid resolves each one).
        var cell = UnitCell.Create(Slab(4, 0), Slab(2, 0.3));
        var stack = LayerStack.Periodic(Ground, cell, 100, Ground);
        var transmission = StackTransmission.Create(stack, Ev(1e-6));
        const double lower = 0.0790, upper = 0.0810;
        var found = transmission.FindResonances(lower, upper, ResonanceSearchOptions.Create(scanPoints: 20));
        var energies = new double[20_000];
        for (var i = 0; i < energies.Length; i++)
        {
            energies[i] = lower + (upper - lower) * i / (energies.Length - 1.0);
        }
        var t = new double[energies.Length];
        transmission.Transmissions(energies, t);
        var maxima = 0;
        for (var i = 1; i < t.Length - 1; i++)
        {
            if (t[i] > t[i - 1] && t[i] >= t[i + 1] && t[i] > 0.5)
            {
                maxima++;
            }
        }
        output.WriteLine($"found {found.Resonances.Count} peaks, grid maxima {maxima}, {found.Evaluations} evaluations");
        Assert.True(maxima >= 5, $"grid maxima {maxima}"); // the scenario really is dense
        Assert.Equal(maxima, found.Resonances.Count(p => p.PeakTransmission > 0.5));
    }

    [Fact]
    public void Evaluate_AtTurningPoints_IsContinuous()
    {
        // Energies exactly at a layer's potential at an interface (z = 0 there) or with the turning point inside a
        // layer: nothing is singular in the exact solution, so T is smooth there. Check: the second difference
        // |T(E + h) − 2T(E) + T(E − h)| at h = 1e-8 eV is T″h² ≲ 1e-13 for |T″| ≲ 1e3/eV², plus rounding ~1e-15; a
        // jump or kink of the method would show as its error. Tolerance 1e-12.
        var stack = LayerStack.Create(Ground, Ground, Slab(5, 0.2), Slab(4, 0.0));
        var transmission = StackTransmission.Create(stack, Ev(0.1));
        var worst = 0.0;
        foreach (var energy in new[] { 0.2, 0.2 - 0.1 * 5 / 9.0, 0.17, 0.03 })
        {
            var at = transmission.Evaluate(energy).Transmission;
            var above = transmission.Evaluate(energy + 1e-8).Transmission;
            var below = transmission.Evaluate(energy - 1e-8).Transmission;
            worst = Math.Max(worst, Math.Abs(above - 2 * at + below));
        }
        output.WriteLine($"worst second difference {worst:E3}");
        Assert.True(worst < 1e-12, $"{worst}");
        // The right lead's edge moves to −U: under +U it is open wherever the left one is (below the left edge the
        // left lead is closed, the same rule as at zero bias); under −U it lies at +|U|, and between the two edges the
        // wave is totally reflected: T = 0, |r| = 1 (current conservation with no transmitted current).
        Assert.Equal(-0.1, transmission.RightLead.PotentialElectronVolts, 15);
        Assert.Equal(LeadChannels.LeftLeadClosed, transmission.Evaluate(-0.05).Channels);
        var reversed = StackTransmission.Create(stack, Ev(-0.1)).Evaluate(0.05);
        Assert.Equal(LeadChannels.RightLeadClosed, reversed.Channels);
        Assert.Equal(0.0, reversed.Transmission);
        Assert.Equal(1.0, reversed.ReflectionAmplitude.Magnitude, 1e-12); // |r| = 1 to rounding of the product
    }

    [Fact]
    public void Create_Validation_NamesTheProblem()
    {
        var deltaOnly = LayerStack.Create(Ground, Ground, DeltaBarrier.Create(0.1));
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => StackTransmission.Create(deltaOnly, Ev(0.1)));
        Assert.Equal("bias", error.ParamName);
        Assert.Contains("zero thickness", error.Message, StringComparison.Ordinal);
        Assert.NotNull(StackTransmission.Create(deltaOnly, Ev(0))); // no field, nothing to reject

        var huge = LayerStack.Periodic(Ground, UnitCell.Create(Slab(1, 0), Slab(1, 0.1)), 60_000, Ground);
        var tooMany = Assert.Throws<ArgumentException>(() => StackTransmission.Create(huge, Ev(0.01)));
        Assert.Equal("stack", tooMany.ParamName);
        Assert.Contains("120000", tooMany.Message, StringComparison.Ordinal);
        Assert.Contains("100000", tooMany.Message, StringComparison.Ordinal);

        var kane = LayerStack.Create(Ground, Ground, Slab(2, 0), Layer.Create(Length.FromNanometres(2), Ev(0.2), GaAs, 0.6));
        var nonParabolic = Assert.Throws<ArgumentException>(() => StackTransmission.Create(kane, Ev(0.01)));
        Assert.Equal("stack", nonParabolic.ParamName);
        Assert.Contains("part 1", nonParabolic.Message, StringComparison.Ordinal);

        var smooth = LayerStack.Create(Ground, Ground, FunctionSegment.Create(Length.FromNanometres(3), x => 0.1 * x, GaAs));
        var segment = Assert.Throws<ArgumentException>(() => StackTransmission.Create(smooth, Ev(-0.01)));
        Assert.Equal("stack", segment.ParamName);
        Assert.Contains("FunctionSegment", segment.Message, StringComparison.Ordinal);

        Assert.Throws<ArgumentNullException>(() => StackTransmission.Create(null!, Ev(0.1)));
    }

    [Fact]
    public void Evaluate_AbsurdEnergyUnderBias_IsRejectedNotSlow()
    {
        // The exact series costs k_max·w sublayers; 1e12 eV in a 10 nm layer would need ~5e7 of them. Rejected with
        // the parameter, the element and the limit named, from every entry point; ordinary energies pass.
        var stack = LayerStack.Create(Ground, Ground, Slab(10, 0.2), Slab(10, 0));
        var transmission = StackTransmission.Create(stack, Ev(0.1));
        var single = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Evaluate(1e12));
        Assert.Equal("energyElectronVolts", single.ParamName);
        Assert.Contains("element 0", single.Message, StringComparison.Ordinal);
        Assert.Contains("1000000", single.Message, StringComparison.Ordinal);
        var destination = new double[3];
        var batch = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Transmissions([0.1, 1e12, 0.2], destination));
        Assert.Equal("energiesElectronVolts", batch.ParamName);
        Assert.Contains("energiesElectronVolts[1]", batch.Message, StringComparison.Ordinal);
        Assert.Equal(0.0, destination[0]); // nothing written before the check
        Assert.Equal("upperElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.FindResonances(0, 1e12)).ParamName);
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(1e13))).ParamName);
        Assert.True(double.IsFinite(transmission.Evaluate(1e4).LogTransmission)); // 10 keV: a few thousand sublayers
    }

    [Fact]
    public void Evaluate_EnergyAtTheSublayerBudget_IsRefusedOnlyBeyondIt()
    {
        // The budget is exact: a 10 nm layer needs ⌈√(m/C·|V − E|)·w⌉ sublayers (the series form's rule), so at most
        // 10⁶ of them allow |V − E| up to (10⁶/w)²·C/m ≈ 5.7e9 eV here. 0.1 % on either side of that (5.7e6 eV, far more
        // than the 0.3 eV spread of the potentials under bias) must pass and be refused; the per-stack window that skips
        // the per-layer check must not admit anything beyond.
        var stack = LayerStack.Create(Ground, Ground, Slab(10, 0.2), Slab(10, 0));
        var transmission = StackTransmission.Create(stack, Ev(0.1));
        var limit = 1e10 * C / 0.067;
        Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Evaluate(limit * 1.001));
        Assert.True(double.IsFinite(transmission.Evaluate(limit * 0.999).Log10Transmission));
        Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Evaluate(-limit * 1.001));
    }

    [Fact]
    public void Create_Biased_ReportsBiasAndShiftedLead()
    {
        var stack = LayerStack.Create(Ground, Lead.Create(Ev(0.05), GaAs), Slab(5, 0.2));
        var transmission = StackTransmission.Create(stack, Ev(0.3));
        Assert.Equal(0.3, transmission.Bias.ElectronVolts);
        Assert.Equal(0.05 - 0.3, transmission.RightLead.PotentialElectronVolts, 15);
        Assert.Same(stack, transmission.Stack);
        Assert.Contains("bias 0.3 eV", transmission.ToString(), StringComparison.Ordinal);
        Assert.Equal(0.05, StackTransmission.Create(stack).RightLead.PotentialElectronVolts);
    }
}
