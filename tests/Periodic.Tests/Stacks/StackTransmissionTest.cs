// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

public sealed class StackTransmissionTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);
    private static readonly Lead Ground = Lead.Create(default, Mass);

    private static Layer Slab(double widthNm, double potentialEv, double mass = 0.067) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(mass));

    /// <summary>ln of the textbook rectangular-barrier T for E &lt; V0 (same mass everywhere), overflow-free.</summary>
    private static double LogBarrierTransmissionBelowTop(double e, double v0, double width, double mass)
    {
        // T = 1 / (1 + V0² sinh²(κa) / (4E(V0 − E))), κ = √(2m(V0 − E))/ħ (e.g. D. J. Griffiths,
        // Introduction to Quantum Mechanics, 2nd ed., Problem 2.33).
        var kappa = Math.Sqrt(mass * (v0 - e) / C);
        var y = kappa * width;
        var logSinh = y + Math.Log(-double.ExpM1(-2 * y)) - Math.Log(2);
        var logX = 2 * Math.Log(v0) + 2 * logSinh - Math.Log(4 * e * (v0 - e));
        return -(logX + Math.Log(1 + Math.Exp(-logX)));
    }

    [Theory]
    [InlineData(0.05)]
    [InlineData(0.15)]
    [InlineData(0.29)]
    public void Evaluate_SingleBarrierBelowTop_MatchesClosedForm(double energy)
    {
        var stack = LayerStack.Create(Ground, Ground, Slab(5, 0.3));
        var result = StackTransmission.Create(stack).Evaluate(energy);
        var expected = Math.Exp(LogBarrierTransmissionBelowTop(energy, 0.3, 5, 0.067));
        // Tolerance: both sides are closed forms evaluated in double precision; 1e-12 relative allows
        // for the cancellation in V0 - E and the sinh of a few units.
        Assert.Equal(expected, result.Transmission, expected * 1e-12);
        Assert.True(result.UnitarityError < 1e-14);
    }

    [Theory]
    [InlineData(0.31)]
    [InlineData(0.45)]
    [InlineData(1.2)]
    public void Evaluate_SingleBarrierAboveTop_MatchesClosedForm(double energy)
    {
        // T = 1 / (1 + V0² sin²(k₂a) / (4E(E − V0))) above the barrier (Griffiths, Problem 2.33).
        const double v0 = 0.3, a = 5;
        var k2 = Math.Sqrt(0.067 * (energy - v0) / C);
        var sin = Math.Sin(k2 * a);
        var expected = 1 / (1 + v0 * v0 * sin * sin / (4 * energy * (energy - v0)));
        var result = StackTransmission.Create(LayerStack.Create(Ground, Ground, Slab(a, v0))).Evaluate(energy);
        // Tolerance: closed form vs composed S-matrices, a few roundings each; 1e-13 absolute on T ≤ 1.
        Assert.Equal(expected, result.Transmission, 1e-13);
    }

    [Theory]
    [InlineData(0.1, 0.01)]
    [InlineData(-0.1, 0.2)]
    public void Evaluate_DeltaBarrierOrWell_MatchesClosedForm(double strength, double energy)
    {
        // Delta potential ±α δ(x): T = 1 / (1 + m α² / (2ħ² E)) = 1 / (1 + m α² / (4 C E)), the same for
        // barrier and well (Griffiths, 2nd ed., §2.5.2, eq. 2.141).
        var expected = 1 / (1 + 0.067 * strength * strength / (4 * C * energy));
        var result = StackTransmission.Create(LayerStack.Create(Ground, Ground, DeltaBarrier.Create(strength))).Evaluate(energy);
        // Tolerance: a few roundings in either closed form.
        Assert.Equal(expected, result.Transmission, 1e-14);
    }

    [Fact]
    public void Evaluate_AtTheBarrierTop_MatchesClosedFormLimit()
    {
        // E = V0 exactly (k = 0 inside, the series branch of the propagator): T = 1 / (1 + m a² V0 / (2ħ²))
        // = 1 / (1 + m a² V0 / (4C)) (Griffiths, Problem 2.33, the E → V0 limit).
        const double v0 = 0.3, a = 5;
        var expected = 1 / (1 + 0.067 * a * a * v0 / (4 * C));
        var result = StackTransmission.Create(LayerStack.Create(Ground, Ground, Slab(a, v0))).Evaluate(v0);
        // Tolerance: a few roundings in either form.
        Assert.Equal(expected, result.Transmission, 1e-14);
    }

    [Fact]
    public void Evaluate_VeryThickBarrier_GivesFiniteLogBelow1e300()
    {
        // A 300 nm, 2 eV barrier at 0.1 eV: κa ≈ 548, T ≈ e^-1095 ≈ 1e-476, far below the double range.
        var stack = LayerStack.Create(Ground, Ground, Slab(300, 2.0));
        var result = StackTransmission.Create(stack).Evaluate(0.1);
        var expectedLog = LogBarrierTransmissionBelowTop(0.1, 2.0, 300, 0.067);
        Assert.True(expectedLog / Math.Log(10) < -300);
        Assert.Equal(0.0, result.Transmission);
        Assert.False(double.IsNaN(result.Reflection));
        // Tolerance: ln T ≈ -780 is known to 1e-15 relative on each side; 1e-11 relative is ample.
        Assert.Equal(expectedLog, result.LogTransmission, Math.Abs(expectedLog) * 1e-11);
        Assert.Equal(1.0, result.Reflection, 1e-15);
    }

    [Fact]
    public void Evaluate_StepBetweenUnequalLeads_MatchesCurrentRatio()
    {
        // Step with BenDaniel–Duke matching: T = 4 q1 q2 / (q1 + q2)², q = k/m (any QM text for the
        // equal-mass case; with ψ'/m continuous the mass enters through q = k/m).
        var left = Lead.Create(default, EffectiveMass.FromElectronMasses(0.067));
        var right = Lead.Create(Energy.FromElectronVolts(0.1), EffectiveMass.FromElectronMasses(0.09));
        var stack = LayerStack.Create(left, right);
        const double e = 0.25;
        var q1 = Math.Sqrt(0.067 * e / C) / 0.067;
        var q2 = Math.Sqrt(0.09 * (e - 0.1) / C) / 0.09;
        var expected = 4 * q1 * q2 / ((q1 + q2) * (q1 + q2));
        var result = StackTransmission.Create(stack).Evaluate(e);
        // Tolerance: a handful of roundings in both closed forms.
        Assert.Equal(expected, result.Transmission, 1e-14);
        Assert.Equal(1 - expected, result.Reflection, 1e-14);
    }

    [Fact]
    public void Evaluate_BelowALeadEdge_ReportsClosedChannelAndZeroTransmission()
    {
        var raised = Lead.Create(Energy.FromElectronVolts(0.2), Mass);
        var transmission = StackTransmission.Create(LayerStack.Create(Ground, raised, Slab(3, 0.3)));
        var rightClosed = transmission.Evaluate(0.1);
        Assert.Equal(LeadChannels.RightLeadClosed, rightClosed.Channels);
        Assert.Equal(0.0, rightClosed.Transmission);
        Assert.Equal(double.NegativeInfinity, rightClosed.LogTransmission);
        // Total reflection: |r| = 1 (current conservation with no transmitted current).
        Assert.Equal(1.0, rightClosed.ReflectionAmplitude.Magnitude, 1e-14);

        var leftClosed = StackTransmission.Create(LayerStack.Create(raised, Ground, Slab(3, 0.3))).Evaluate(0.1);
        Assert.Equal(LeadChannels.LeftLeadClosed, leftClosed.Channels);
        Assert.Equal(0.0, leftClosed.Transmission);
    }

    /// <summary>The Kronig–Penney-like cell of these tests: 4 nm well, 2 nm barrier of 0.3 eV.</summary>
    private static UnitCell Cell() => UnitCell.Create(Slab(4, 0), Slab(2, 0.3));

    /// <summary>The Chebyshev (Abelès) form, in logs: ln T_N from ln T_1 and the Bloch wavevector.</summary>
    private static double ChebyshevLogTransmission(double logT1, BlochWavevector k, int n)
    {
        // 1/T_N = 1 + (1/T_1 − 1) U²_{N−1}(cos kd), U_{N−1} = sin(Nkd)/sin(kd) in a band and
        // sinh(Nγ)/sinh(γ) (γ = Im k·d) in a gap (F. Abelès 1950; P. Yeh, Optical Waves in Layered
        // Media, ch. 6; from memory, derived in docs/stacks.md).
        double logRatioSquared;
        if (k.IsPropagating)
        {
            var phase = k.PhasePerPeriod;
            var ratio = Math.Sin(n * phase) / Math.Sin(phase);
            logRatioSquared = Math.Log(ratio * ratio);
        }
        else
        {
            var gamma = k.ImaginaryPerNanometre * k.PeriodNanometres;
            // ln(sinh(Nγ)/sinh γ), overflow-free.
            double LogSinh(double y) => y + Math.Log(-double.ExpM1(-2 * y)) - Math.Log(2);
            logRatioSquared = 2 * (LogSinh(n * gamma) - LogSinh(gamma));
        }
        var logOneOverT1MinusOne = -logT1 + Math.Log(-double.ExpM1(logT1)); // ln((1 − T1)/T1)
        var logX = logOneOverT1MinusOne + logRatioSquared;
        var log1pX = logX > 0 ? logX + Math.Log(1 + Math.Exp(-logX)) : Math.Log(1 + Math.Exp(logX));
        return -log1pX;
    }

    [Theory]
    [InlineData(4.0, 2.0, 0.3, 0.067, 4)]  // shallow superlattice, equal masses
    [InlineData(3.0, 4.0, 1.0, 0.09, 3)]   // deep, thick barriers of another mass: T_100 in the first gap below 1e-300
    public void Evaluate_NPeriods_MatchesChebyshevFormInBandsAndGaps(double well, double barrier, double height, double barrierMass, int bandCount)
    {
        var cell = UnitCell.Create(Slab(well, 0), Slab(barrier, height, barrierMass));
        var single = StackTransmission.Create(LayerStack.Periodic(Ground, cell, 1, Ground));
        var dispersion = CellTransfer.Create(cell);
        var bands = Periodic.Bands.BandStructure.Compute(cell, bandCount);
        // Energies inside bands and gaps, kept 2% of the band or gap width away from the edges, where
        // sin(kd) → 0 makes the closed form itself ill-conditioned.
        var energies = new List<double>();
        foreach (var band in bands.Bands)
        {
            for (var j = 1; j <= 9; j++)
            {
                energies.Add(band.BottomElectronVolts + (0.02 + 0.96 * j / 10.0) * band.WidthElectronVolts);
            }
            for (var j = 1; j <= 5; j++)
            {
                energies.Add(band.TopElectronVolts + (0.02 + 0.96 * j / 6.0) * band.GapAboveElectronVolts);
            }
        }
        var worst = 0.0;
        var smallest = 0.0;
        foreach (var n in new[] { 2, 3, 5, 10, 17, 32, 64, 99, 100 })
        {
            var stack = StackTransmission.Create(LayerStack.Periodic(Ground, cell, n, Ground));
            foreach (var e in energies)
            {
                var expected = ChebyshevLogTransmission(single.Evaluate(e).LogTransmission, dispersion.Dispersion(e).Wavevector, n);
                var actual = stack.Evaluate(e).LogTransmission;
                smallest = Math.Min(smallest, actual / Math.Log(10));
                worst = Math.Max(worst, Math.Abs(Math.Exp(actual - expected) - 1));
            }
        }
        output.WriteLine($"{energies.Count} energies x 9 period counts: worst relative error of T_N {worst:E3}, smallest T_N = 10^{smallest:F1}");
        // Acceptance: relative error of T_N at most 1e-9 for N up to 100.
        Assert.True(worst <= 1e-9, $"worst relative error {worst:E3}");
    }
}
