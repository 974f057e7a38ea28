// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;

namespace Periodic.Transfer;

/// <summary>
/// Shooting through the whole compiled sequence at one energy: the state (ψ, ψ′/m) with the count of its zeros, optionally with
/// its exact energy derivative, for root searches that evaluate the same sequence at many energies (the bound-state search of
/// a stack written out element by element).
/// </summary>
/// <remarks>
/// A stack written out from repeated cells holds few distinct layers many times over. The matrices of each distinct layer are
/// formed once per energy into a caller's scratch (<see cref="ShootingScratchLength"/>) and reused for every copy, so a pass
/// costs a few multiplications per element instead of a closed-form evaluation (sines, exponentials or a series) per element;
/// the values are those of <see cref="StepForward"/> and <see cref="LayerMatrix"/>, bit for bit. The zeros inside a layer of
/// phase θ = √s·w are ⌊θ/π⌋ or one more, and their parity is that of the change of the Prüfer quadrant of ψ across the layer,
/// which decides between the two without the two arc tangents of <see cref="LayerZeros"/> (used where θ/π is within 1e-9 of
/// an integer, where the choice is delicate).
/// </remarks>
internal sealed partial class CompiledCell
{
    /// <summary>The most distinct layers the per-energy table holds; a sequence with more is shot element by element.</summary>
    private const int MaxLayerClasses = 512;

    /// <summary>Doubles per distinct layer in the scratch: c, m·S, −(s/m)·S, log scale, ⌊θ/π⌋ and the three derivatives.</summary>
    private const int ClassStride = 8;

    // Per element: the index of its distinct layer in the table, −1 for anything else; built on first use.
    private LayerClassTable? _classes;

    private sealed class LayerClassTable(int[] classOf, int[] representative)
    {
        internal int[] ClassOf { get; } = classOf;

        internal int[] Representative { get; } = representative;
    }

    /// <summary>Scratch doubles that <see cref="Shoot"/> and <see cref="ShootWithDerivative"/> use to reuse the matrices of repeated layers (0: no table; they then step element by element).</summary>
    internal int ShootingScratchLength => ClassStride * ClassTable().Representative.Length;

    /// <summary>True when <see cref="ShootWithDerivative"/> applies: no layer under a field (uniform layers, deltas and smooth segments).</summary>
    internal bool HasEnergyDerivative => !IsBiased;

    private LayerClassTable ClassTable() => _classes ??= BuildClassTable();

    private LayerClassTable BuildClassTable()
    {
        var n = _kinds.Length;
        var classOf = new int[n];
        var representative = new List<int>();
        var index = new Dictionary<(double, double, double, double), int>();
        var layers = 0;
        for (var i = 0; i < n; i++)
        {
            classOf[i] = -1;
            if (_kinds[i] != ElementKind.Layer)
            {
                continue;
            }
            layers++;
            var key = LayerData(i);
            if (!index.TryGetValue(key, out var k))
            {
                if (representative.Count == MaxLayerClasses)
                {
                    return new LayerClassTable([], []);
                }
                k = representative.Count;
                index.Add(key, k);
                representative.Add(i);
            }
            classOf[i] = k;
        }
        // Worth it only when layers repeat: each distinct one is then formed once per pass instead of once per copy.
        return 2 * representative.Count <= layers ? new LayerClassTable(classOf, representative.ToArray()) : new LayerClassTable([], []);
    }

    /// <summary>
    /// Propagates (u, w)·e^log from the start through every element at <paramref name="e"/>, returning the zeros of ψ in (0, L]
    /// (as the sum of <see cref="StepForward"/> over the elements, with the same state at the end).
    /// </summary>
    internal int Shoot(double e, ref double u, ref double w, ref double log, Span<double> scratch)
    {
        var table = scratch.IsEmpty ? null : ClassTable();
        var classes = table?.Representative.Length ?? 0;
        if (table is null || classes == 0 || scratch.Length < ClassStride * classes)
        {
            var sum = 0;
            for (var i = 0; i < _kinds.Length; i++)
            {
                sum += StepForward(i, e, ref u, ref w, ref log);
            }
            return sum;
        }
        FillValueClasses(table, e, scratch);
        var classOf = table.ClassOf;
        var zeros = 0;
        var quadrant = FloorQuadrant(u, w);
        for (var i = 0; i < classOf.Length; i++)
        {
            var k = classOf[i];
            if (k < 0)
            {
                zeros += StepForward(i, e, ref u, ref w, ref log);
                quadrant = FloorQuadrant(u, w);
                continue;
            }
            var at = ClassStride * k;
            double c = scratch[at], m12 = scratch[at + 1], m21 = scratch[at + 2];
            var u1 = c * u + m12 * w;
            var w1 = m21 * u + c * w;
            var next = FloorQuadrant(u1, w1);
            zeros += ParityLayerZeros(i, e, scratch[at + 4], u, w, u1, w1, quadrant, next);
            (u, w, quadrant) = (u1, w1, next);
            log += scratch[at + 3];
            ScaledProduct.Renormalise(ref u, ref w, ref log);
        }
        return zeros;
    }

    /// <summary>The table entries of every distinct layer at <paramref name="e"/>: the values of <see cref="StepForward"/>, bit for bit.</summary>
    private void FillValueClasses(LayerClassTable table, double e, Span<double> scratch)
    {
        for (var k = 0; k < table.Representative.Length; k++)
        {
            var i = table.Representative[k];
            LayerCoefficients(i, e, out var mass, out var s);
            var width = _data[ElementData.Stride * i + ElementData.Width];
            UniformLayerPropagator.Values(s, width, out var c, out var sinc, out var logScale);
            var at = ClassStride * k;
            scratch[at] = c;
            scratch[at + 1] = mass * sinc;
            scratch[at + 2] = -(s / mass) * sinc;
            scratch[at + 3] = logScale;
            scratch[at + 4] = WholeHalfTurns(s, width);
        }
    }

    /// <summary>
    /// The state (u, w)·e^log at every element boundary: forwards from (<paramref name="u"/>, <paramref name="w"/>) at the start
    /// (<paramref name="us"/> index 0) or backwards from it at the end (index Count), as repeated <see cref="StepForward"/> or
    /// <see cref="StepBackward"/> would give, bit for bit. Each span holds Count + 1 entries.
    /// </summary>
    internal void ShootStates(double e, double u, double w, bool forward, Span<double> us, Span<double> ws, Span<double> logs, Span<double> scratch)
    {
        var n = _kinds.Length;
        var table = scratch.IsEmpty ? null : ClassTable();
        var cached = table is not null && table.Representative.Length > 0 && scratch.Length >= ClassStride * table.Representative.Length;
        if (cached)
        {
            FillValueClasses(table!, e, scratch);
        }
        double log = 0;
        var at = forward ? 0 : n;
        (us[at], ws[at], logs[at]) = (u, w, log);
        for (var step = 0; step < n; step++)
        {
            var i = forward ? step : n - 1 - step;
            var k = cached ? table!.ClassOf[i] : -1;
            if (k < 0)
            {
                if (forward)
                {
                    StepForward(i, e, ref u, ref w, ref log);
                }
                else
                {
                    StepBackward(i, e, ref u, ref w, ref log);
                }
            }
            else
            {
                var entry = ClassStride * k;
                double c = scratch[entry], m12 = scratch[entry + 1], m21 = scratch[entry + 2];
                (u, w) = forward ? (c * u + m12 * w, m21 * u + c * w) : (c * u - m12 * w, -m21 * u + c * w);
                log += scratch[entry + 3];
                ScaledProduct.Renormalise(ref u, ref w, ref log);
            }
            at = forward ? i + 1 : i;
            (us[at], ws[at], logs[at]) = (u, w, log);
        }
    }

    /// <summary>
    /// Fills <paramref name="scratch"/> with the per-layer numbers of <see cref="TabledLogLayerIntegral"/>
    /// at <paramref name="e"/>; false (and nothing filled) when the sequence has no table or the scratch is short.
    /// </summary>
    internal bool FillIntegralClasses(double e, Span<double> scratch)
    {
        var table = scratch.IsEmpty ? null : ClassTable();
        if (table is null || table.Representative.Length == 0 || scratch.Length < ClassStride * table.Representative.Length)
        {
            return false;
        }
        for (var k = 0; k < table.Representative.Length; k++)
        {
            var at = ClassStride * k;
            LayerIntegralCoefficients(table.Representative[k], e, out scratch[at], out scratch[at + 1], out scratch[at + 2], out scratch[at + 3], out scratch[at + 4]);
        }
        return true;
    }

    /// <summary>
    /// <see cref="LogLayerIntegral"/> from the numbers <see cref="FillIntegralClasses"/> put in
    /// <paramref name="table"/> (the same value; an empty table computes them here).
    /// </summary>
    internal double TabledLogLayerIntegral(int i, double e, double a, double b, ReadOnlySpan<double> table)
    {
        double flag, n1, n2, n3, n4;
        if (table.IsEmpty)
        {
            LayerIntegralCoefficients(i, e, out flag, out n1, out n2, out n3, out n4);
        }
        else
        {
            var at = ClassStride * _classes!.ClassOf[i];
            (flag, n1, n2, n3, n4) = (table[at], table[at + 1], table[at + 2], table[at + 3], table[at + 4]);
        }
        double integral, logExtra = 0;
        if (flag > 0)
        {
            // A thick barrier: ψ in decaying exponentials, scaled by e^(2κw).
            double kappa = n1, q = n2, width = n3;
            var alpha = 0.5 * (a + b / kappa);
            var beta = 0.5 * (a - b / kappa);
            integral = alpha * alpha * (1 - q) / (2 * kappa) + beta * beta * q * (1 - q) / (2 * kappa) + 2 * alpha * beta * width * q;
            logExtra = 2 * n4;
        }
        else
        {
            integral = a * a * n1 + 2 * a * b * n2 + b * b * n3;
        }
        return integral > 0 ? Math.Log(integral) + logExtra : double.NegativeInfinity;
    }

    /// <summary>
    /// The numbers of ∫ψ² over layer <paramref name="i"/> that do not depend on the state: for a thick barrier (s·w² ≤ −1) a flag,
    /// κ, e^(−2κw), w and κw; otherwise 0 and the integrals of c², c·S and S² (<see cref="UniformLayerPropagator.SquareIntegrals"/>).
    /// </summary>
    private void LayerIntegralCoefficients(int i, double e, out double flag, out double n1, out double n2, out double n3, out double n4)
    {
        LayerCoefficients(i, e, out _, out var s);
        var width = _data[ElementData.Stride * i + ElementData.Width];
        var z = s * width * width;
        if (s < 0 && z <= -1)
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width;
            (flag, n1, n2, n3, n4) = (1, kappa, Math.Exp(-2 * theta), width, theta);
            return;
        }
        UniformLayerPropagator.UnscaledValues(s, width, out var c, out var sinc);
        UniformLayerPropagator.SquareIntegrals(s, width, c, sinc, out n1, out n2, out n3);
        (flag, n4) = (0, 0);
    }

    /// <summary>
    /// As <see cref="Shoot"/>, and also propagates the exact energy derivative (du, dw)·e^log of the state (given at the start,
    /// e.g. from the energy dependence of a lead's decay constant). Not for layers under a field (<see cref="HasEnergyDerivative"/>).
    /// </summary>
    internal int ShootWithDerivative(double e, ref double u, ref double w, ref double du, ref double dw, ref double log, Span<double> scratch)
    {
        var table = scratch.IsEmpty ? null : ClassTable();
        var classes = table?.Representative.Length ?? 0;
        var cached = table is not null && classes > 0 && scratch.Length >= ClassStride * classes;
        if (cached)
        {
            for (var k = 0; k < classes; k++)
            {
                FillDerivativeClass(table!.Representative[k], e, scratch.Slice(ClassStride * k, ClassStride));
            }
        }
        Span<double> own = stackalloc double[ClassStride];
        var classOf = cached ? table!.ClassOf : null;
        var zeros = 0;
        var quadrant = FloorQuadrant(u, w);
        for (var i = 0; i < _kinds.Length; i++)
        {
            var k = classOf is null ? -1 : classOf[i];
            if (k >= 0 || _kinds[i] == ElementKind.Layer)
            {
                Span<double> source = own;
                var at = 0;
                if (k >= 0)
                {
                    source = scratch;
                    at = ClassStride * k;
                }
                else
                {
                    FillDerivativeClass(i, e, own);
                }
                double c = source[at], m12 = source[at + 1], m21 = source[at + 2], d11 = source[at + 5], d12 = source[at + 6], d21 = source[at + 7];
                var u1 = c * u + m12 * w;
                var w1 = m21 * u + c * w;
                var du1 = d11 * u + d12 * w + c * du + m12 * dw;
                var dw1 = d21 * u + d11 * w + m21 * du + c * dw;
                var next = FloorQuadrant(u1, w1);
                zeros += ParityLayerZeros(i, e, source[at + 4], u, w, u1, w1, quadrant, next);
                (u, w, du, dw, quadrant) = (u1, w1, du1, dw1, next);
                log += source[at + 3];
                ScaledProduct.Renormalise(ref u, ref w, ref du, ref dw, ref log);
                continue;
            }
            switch (_kinds[i])
            {
                case ElementKind.Delta:
                {
                    var jump = DeltaJump(i);
                    w += jump * u;
                    dw += jump * du;
                    quadrant = FloorQuadrant(u, w);
                    break;
                }
                case ElementKind.Segment:
                {
                    // The segment's product and derivative, with its zeros counted on the state in the same pass.
                    var product = ScaledProduct.Identity;
                    double uc = u, wc = w;
                    zeros += _segments![i]!.PropagateCounting(e, ref uc, ref wc, ref product);
                    var u1 = product.P11 * u + product.P12 * w;
                    var w1 = product.P21 * u + product.P22 * w;
                    var du1 = product.D11 * u + product.D12 * w + product.P11 * du + product.P12 * dw;
                    var dw1 = product.D21 * u + product.D22 * w + product.P21 * du + product.P22 * dw;
                    (u, w, du, dw) = (u1, w1, du1, dw1);
                    log += product.LogScale;
                    quadrant = FloorQuadrant(u, w);
                    break;
                }
                default:
                    throw new InvalidOperationException("Energy derivatives of a state are not available under a field.");
            }
            ScaledProduct.Renormalise(ref u, ref w, ref du, ref dw, ref log);
        }
        return zeros;
    }

    /// <summary>
    /// The table entries of layer <paramref name="i"/> at <paramref name="e"/> with its energy derivatives: the values of
    /// <see cref="StepForward"/> (so that a pass with derivatives counts and propagates exactly as one without) and the
    /// derivatives of <see cref="LayerMatrix"/>, brought to the same scale factor.
    /// </summary>
    private void FillDerivativeClass(int i, double e, Span<double> entries)
    {
        LayerMatrix(i, e, out _, out _, out _, out _, out var d11, out var d12, out var d21, out _, out var derivativeLog, out var s, out var mass);
        var width = _data[ElementData.Stride * i + ElementData.Width];
        UniformLayerPropagator.Values(s, width, out var c, out var sinc, out var logScale);
        var rescale = derivativeLog == logScale ? 1 : Math.Exp(derivativeLog - logScale);
        entries[0] = c;
        entries[1] = mass * sinc;
        entries[2] = -(s / mass) * sinc;
        entries[3] = logScale;
        entries[4] = WholeHalfTurns(s, width);
        entries[5] = d11 * rescale;
        entries[6] = d12 * rescale;
        entries[7] = d21 * rescale;
    }

    /// <summary>
    /// ⌊θ/π⌋ for the phase θ = √s·w of a layer (0 for barriers and θ &lt; π), or −1 where θ/π lies within 1e-9 of an integer
    /// ≥ 1 and the zeros are left to the Prüfer phases of <see cref="LayerZeros"/>.
    /// </summary>
    private static double WholeHalfTurns(double s, double width)
    {
        var theta = s > 0 ? Math.Sqrt(s) * width : 0;
        if (theta < Math.PI)
        {
            return 0;
        }
        var turns = theta / Math.PI;
        var whole = Math.Floor(turns);
        return Math.Min(turns - whole, whole + 1 - turns) < 1e-9 ? -1 : whole;
    }

    /// <summary>
    /// Zeros of ψ in (0, w] of layer <paramref name="i"/>: ⌊θ/π⌋ (<paramref name="halfTurns"/>) or one more, whichever has the
    /// parity of the change of the Prüfer quadrant (⌊φ/π⌋, φ the Prüfer angle) from <paramref name="quadrant"/> to
    /// <paramref name="next"/>; the Prüfer phases decide where <paramref name="halfTurns"/> is −1.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private int ParityLayerZeros(int i, double e, double halfTurns, double u, double w, double u1, double w1, int quadrant, int next)
    {
        if (halfTurns < 0)
        {
            LayerCoefficients(i, e, out var mass, out var s);
            return LayerZeros(u, w, u1, w1, s, _data[ElementData.Stride * i + ElementData.Width], mass);
        }
        var q = (int)halfTurns;
        return q + ((next - quadrant - q) & 1);
    }
}
