// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck.Fluent;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Tests.Transfer;

public sealed partial class CellTransferTest
{
    private const int PropertyCells = 2000;

    /// <summary>
    /// The normwise rounding bound of a product of n 2×2 matrices, γ·‖P‖ with γ = 64 n ε (Higham, Accuracy
    /// and Stability of Numerical Algorithms, 2nd ed., §3.5: |fl(AB) − AB| ≤ γ_k |A||B|; the factor 64 covers
    /// the rounding of the closed-form entries cos, sin, cosh, sinh themselves).
    /// </summary>
    private static double RoundingBound(ScaledTransferMatrix m, int elements) =>
        64 * (elements + 1) * DoubleEpsilon * Math.Max(m.Mantissa.MaxAbsEntry * Math.Exp(m.LogScale), 1.0);

    private static void AssertSameTrace(CellTransfer expected, CellTransfer actual, double e, string what)
    {
        var m1 = expected.Evaluate(e);
        var m2 = actual.Evaluate(e);
        var tolerance = Math.Max(RoundingBound(m1, expected.Cell.Elements.Count), RoundingBound(m2, actual.Cell.Elements.Count));
        var difference = Math.Abs(m1.Trace - m2.Trace);
        Assert.True(difference <= tolerance, $"{what} at E = {e:R}: D = {m1.Trace:R} vs {m2.Trace:R} (difference {difference:E2}, allowed {tolerance:E2})");
    }

    [Fact]
    public void Evaluate_RandomCells_DeterminantIsOne()
    {
        // det M = 1 for every lossless cell: each layer matrix has det c² + s S² = 1 and a delta's is 1
        // (Wronskian conservation; Kittel ch. 7). In scaled form det = det(mantissa)·e^(2 LogScale), which
        // suffers cancellation when the entries are large: the allowed error is the rounding bound of the
        // two products in the determinant, 2·γ·|m11 m22| + |m12 m21|, relative to det = 1.
        var worst = 0.0;
        var ran = RandomCells.Check(RandomCells.Cells(4, 3), PropertyCells, 20260101UL, spec =>
        {
            var transfer = CellTransfer.Create(spec.Build());
            foreach (var e in spec.EnergiesElectronVolts)
            {
                var m = transfer.Evaluate(e);
                var p = m.Mantissa;
                var size = (Math.Abs(p.M11 * p.M22) + Math.Abs(p.M12 * p.M21)) * Math.Exp(2 * m.LogScale);
                var tolerance = 64 * (spec.Elements.Length + 1) * DoubleEpsilon * Math.Max(size, 1.0);
                var determinant = p.Determinant * Math.Exp(2 * m.LogScale);
                Assert.True(Math.Abs(determinant - 1) <= tolerance, $"{spec}: det M = {determinant:R} at E = {e:R} (allowed {tolerance:E2})");
                if (size < 1e3)
                {
                    // Moderate cells: LogDeterminant itself is ≈ 0.
                    Assert.True(Math.Abs(m.LogDeterminant) <= tolerance, $"{spec}: ln det M = {m.LogDeterminant:R}");
                }
                worst = Math.Max(worst, Math.Abs(determinant - 1) / Math.Max(size, 1.0));
            }
        });
        output.WriteLine($"det M = 1: {ran} random cells x 3 energies, worst |det - 1| / (|m11 m22| + |m12 m21|) = {worst:E2}");
    }

    [Fact]
    public void Dispersion_RandomCells_InvariantUnderCyclicShift()
    {
        // Tr(AB) = Tr(BA): D does not depend on where the period starts (any textbook on Bloch's theorem).
        var ran = RandomCells.Check(RandomCells.Cells(5, 3), PropertyCells, 20260102UL, spec =>
        {
            var cell = spec.Build();
            var transfer = CellTransfer.Create(cell);
            for (var shift = 1; shift < cell.Elements.Count; shift++)
            {
                var rotated = CellTransfer.Create(cell.Rotate(shift));
                foreach (var e in spec.EnergiesElectronVolts)
                {
                    AssertSameTrace(transfer, rotated, e, $"{spec} rotated by {shift}");
                }
            }
        });
        output.WriteLine($"cyclic shift: {ran} random cells");
    }

    [Fact]
    public void Dispersion_RandomCells_InvariantUnderSplittingALayer()
    {
        // A uniform layer of width w1 + w2 is the same medium as two adjacent layers w1, w2 (the
        // propagator is a one-parameter group: M(w1 + w2) = M(w2) M(w1)).
        // Which layer and where to split come from the drawn energies (deterministic given the seed).
        var ran = RandomCells.Check(RandomCells.Cells(4, 3), PropertyCells, 20260103UL, spec =>
        {
            var layers = spec.Elements.Select((element, index) => (element, index)).Where(x => !x.element.IsDelta).ToArray();
            var (target, at) = layers[(int)(Math.Abs(spec.EnergiesElectronVolts[0] * 1e6) % layers.Length)];
            var unit = ((spec.EnergiesElectronVolts[1] * 1e3 % 1) + 1) % 1;
            var fraction = 0.05 + 0.9 * unit;
            var split = spec.Elements.Take(at)
                .Append(target with { WidthNanometres = target.WidthNanometres * fraction })
                .Append(target with { WidthNanometres = target.WidthNanometres * (1 - fraction) })
                .Concat(spec.Elements.Skip(at + 1))
                .ToArray();
            var original = CellTransfer.Create(spec.Build());
            var splitTransfer = CellTransfer.Create(new CellSpec(split, spec.EnergiesElectronVolts).Build());
            foreach (var e in spec.EnergiesElectronVolts)
            {
                AssertSameTrace(original, splitTransfer, e, $"{spec} with element {at} split at {fraction:F3}");
            }
        });
        output.WriteLine($"layer split: {ran} random cells");
    }

    [Fact]
    public void Dispersion_RandomCells_InvariantUnderMirror()
    {
        // Each element's matrix satisfies M⁻¹ = K M K with K = diag(1, −1) (equal diagonal, det 1), so
        // Tr(M1⋯Mn) = Tr(P⁻¹) = Tr(P) for the reversed order too [derived]: the mirror image has the same bands.
        var ran = RandomCells.Check(RandomCells.Cells(5, 3), PropertyCells, 20260104UL, spec =>
        {
            var cell = spec.Build();
            var transfer = CellTransfer.Create(cell);
            var mirrored = CellTransfer.Create(cell.Reverse());
            foreach (var e in spec.EnergiesElectronVolts)
            {
                AssertSameTrace(transfer, mirrored, e, $"{spec} reversed");
            }
        });
        output.WriteLine($"mirror: {ran} random cells");
    }

    [Fact]
    public void Dispersion_RandomCells_ScalingLaw()
    {
        // −C(ψ′/m)′ + Vψ = Eψ is invariant under x → s x, V, E → V/s², delta strengths → S/s (the equation
        // divides through by s²): D is dimensionless and unchanged (dimensional analysis, common practice).
        var gen = from spec in RandomCells.Cells(4, 3)
                  from s in FsCheck.Fluent.Gen.Choose(25, 400)
                  select new CellSpec(spec.Elements, spec.EnergiesElectronVolts.Append(s / 100.0).ToArray());
        var ran = RandomCells.Check(gen, PropertyCells, 20260105UL, spec =>
        {
            var s = spec.EnergiesElectronVolts[^1];
            var energies = spec.EnergiesElectronVolts[..^1];
            var original = CellTransfer.Create(new CellSpec(spec.Elements, energies).Build());
            var scaled = CellTransfer.Create(new CellSpec(spec.Elements.Select(x => x.Scaled(s)).ToArray(), energies).Build());
            foreach (var e in energies)
            {
                var m1 = original.Evaluate(e);
                var m2 = scaled.Evaluate(e / (s * s));
                // The scaled inputs are rounded once more each (w·s, V/s², E/s²), which perturbs the phases
                // by a few ε relative: same normwise bound, doubled.
                var tolerance = 2 * Math.Max(RoundingBound(m1, spec.Elements.Length), RoundingBound(m2, spec.Elements.Length));
                Assert.True(Math.Abs(m1.Trace - m2.Trace) <= tolerance, $"{spec} scaled by {s}: D = {m1.Trace:R} vs {m2.Trace:R}");
            }
        });
        output.WriteLine($"scaling law (D): {ran} random cells");
    }

    [Fact]
    public void AllOutputs_RandomCells_AreFinite()
    {
        // No NaN ever leaks out (house rule); values beyond the double range are ±∞ only where documented.
        var ran = RandomCells.Check(RandomCells.Cells(6, 4), PropertyCells, 20260106UL, spec =>
        {
            var transfer = CellTransfer.Create(spec.Build());
            var traces = new double[spec.EnergiesElectronVolts.Length];
            transfer.Traces(spec.EnergiesElectronVolts, traces);
            for (var i = 0; i < traces.Length; i++)
            {
                var e = spec.EnergiesElectronVolts[i];
                var value = transfer.Dispersion(e);
                var m = transfer.Evaluate(e);
                var k = value.Wavevector;
                Assert.False(double.IsNaN(traces[i]), spec.ToString());
                Assert.True(double.IsFinite(value.Trace) && double.IsFinite(value.TraceDerivativePerElectronVolt), spec.ToString());
                Assert.True(double.IsFinite(k.RealPerNanometre) && double.IsFinite(k.ImaginaryPerNanometre), spec.ToString());
                Assert.True(double.IsFinite(m.LogScale) && double.IsFinite(m.Mantissa.MaxAbsEntry) && double.IsFinite(m.EnergyDerivativeMantissa.MaxAbsEntry), spec.ToString());
                Assert.Equal(value.Trace, traces[i]);
                Assert.InRange(transfer.CountBandEdgesBelow(e), 0, int.MaxValue);
            }
        });
        output.WriteLine($"no NaN (transfer): {ran} random cells");
    }
}
