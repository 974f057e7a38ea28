// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics.Tensors;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// Trace-only evaluation of D(E) = Tr M(E) for cells of uniform layers and delta barriers: the same
/// closed-form layer matrices as <see cref="CellTransfer"/> without the energy derivative, scalar and
/// vectorised across energies.
/// </summary>
/// <remarks>
/// <para>Method: every element's matrix has the form [[c, m12], [m21, c]]. A layer with wavenumber squared
/// s = m(E − V)/C has c = cos(√s w), m12 = m·S, m21 = −(s/m)·S with S = sin(√s w)/√s, continued to s &lt; 0 as
/// c = cosh κw, S = sinh(κw)/κ; a delta has c = 1, m12 = 0, m21 = its jump. Three regimes keep every
/// digit: |s|w² &lt; 1, Taylor series of c and S/w in z = s·w² (no cancellation near s = 0, where the exp-minus-one
/// forms of .NET lose digits: <c>double.ExpM1</c> is computed as exp(x) − 1); s &gt; 0, sin and cos; s &lt; 0, cosh and
/// sinh from e^κw for κw &lt; 20 and, beyond, scaled by e^(−κw) with κw added to a log scale, so that no barrier
/// overflows (the scaled transfer-matrix form of e.g. P. Yeh, Optical Waves in Layered Media, ch. 5, applied to
/// the BenDaniel–Duke envelope equation). The first element's matrix is the running product itself and of the
/// last only the trace of the product is formed. Products are renormalised by exact powers of two.</para>
/// <para>The batch path processes the energies in chunks of 256 and, for each element whose regime is the same
/// over the chunk, evaluates every step with <see cref="TensorPrimitives"/> (SIMD across energies); chunks that
/// straddle regimes fall back to the scalar formula per energy.</para>
/// <para>Results agree with the derivative-carrying path of <see cref="CellTransfer.Dispersion"/> to
/// rounding: the vectorised sin, cos and exp differ from the scalar ones by a few ulps, which the
/// product carries as a relative error of order (number of layers)·ε on the largest matrix entry.</para>
/// </remarks>
internal static class TraceKernel
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;
    private const int Chunk = 256;

    /// <summary>Below κw = 20 a barrier's cosh and sinh are formed directly (≤ e^20 ≈ 5e8, far inside the
    /// renormalisation headroom); thicker barriers use the scaled form and the log scale.</summary>
    private const double DirectBarrierLimit = 20;

    /// <summary>Terms of the series in z = s·w², |z| &lt; 1: the first omitted term of c is below 1/20! ≈ 4e-19.</summary>
    private const int SeriesTerms = 9;

    // CSeries[j] = (−1)^j/(2j)!, SSeries[j] = (−1)^j/(2j + 1)!: c = Σ CSeries[j] z^j, S/w = Σ SSeries[j] z^j.
    private static readonly double[] CSeries = UniformLayerPropagator.BuildSeries(0, SeriesTerms);
    private static readonly double[] SSeries = UniformLayerPropagator.BuildSeries(1, SeriesTerms);

    /// <summary>
    /// D(E) by the scalar trace-only product over the packed elements of a cell of layers and deltas
    /// (<see cref="ElementData"/>); ±∞ beyond the double range, 0 for a zero mantissa. The energy is
    /// assumed already validated.
    /// </summary>
    internal static double Trace(ElementKind[] kinds, double[] data, double e)
    {
        var n = CheckLayout(kinds, data);
        ref var first = ref MemoryMarshal.GetArrayDataReference(data);
        double log = 0;
        ScalarElement(kinds[0], ref first, e, out var c0, out var p12, out var p21, ref log);
        if (n == 1)
        {
            return Combine(2 * c0, log);
        }
        double p11 = c0, p22 = c0;
        for (var i = 1; i < n - 1; i++)
        {
            // In range: data holds Stride doubles per element (CheckLayout).
            ScalarElement(kinds[i], ref Unsafe.Add(ref first, ElementData.Stride * i), e, out var c, out var m12, out var m21, ref log);
            var q11 = c * p11 + m12 * p21;
            var q12 = c * p12 + m12 * p22;
            var q21 = m21 * p11 + c * p21;
            var q22 = m21 * p12 + c * p22;
            p11 = q11; p12 = q12; p21 = q21; p22 = q22;
            var max = Math.Max(Math.Max(Math.Abs(q11), Math.Abs(q12)), Math.Max(Math.Abs(q21), Math.Abs(q22)));
            if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
            {
                var exponent = Math.ILogB(max);
                p11 = Math.ScaleB(p11, -exponent); p12 = Math.ScaleB(p12, -exponent);
                p21 = Math.ScaleB(p21, -exponent); p22 = Math.ScaleB(p22, -exponent);
                log += exponent * Math.Log(2.0);
            }
        }
        ScalarElement(kinds[n - 1], ref Unsafe.Add(ref first, ElementData.Stride * (n - 1)), e, out var cl, out var l12, out var l21, ref log);
        return Combine(cl * (p11 + p22) + l12 * p21 + l21 * p12, log);
    }

    private static int CheckLayout(ElementKind[] kinds, double[] data)
    {
        var n = kinds.Length;
        if (n == 0 || data.Length < ElementData.Stride * n)
        {
            throw new InvalidOperationException("packed element data does not match its element count.");
        }
        return n;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Combine(double mantissa, double log) =>
        mantissa == 0 ? 0 : log == 0 ? mantissa : mantissa * Math.Exp(log);

    /// <summary>The matrix [[c, m12], [m21, c]] of one element at energy <paramref name="e"/>; a scale factor e^κw taken out goes into <paramref name="log"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void ScalarElement(ElementKind kind, ref double element, double e, out double c, out double m12, out double m21, ref double log)
    {
        if (kind == ElementKind.Delta)
        {
            c = 1;
            m12 = 0;
            m21 = Unsafe.Add(ref element, ElementData.Jump);
            return;
        }
        var excess = e - Unsafe.Add(ref element, ElementData.Potential);
        var slope = Unsafe.Add(ref element, ElementData.MassSlope);
        double mass, s, inverseMass;
        if (slope == 0)
        {
            mass = Unsafe.Add(ref element, ElementData.Mass);
            s = excess * Unsafe.Add(ref element, ElementData.MassOverC);
            inverseMass = Unsafe.Add(ref element, ElementData.InverseMass);
        }
        else
        {
            mass = Unsafe.Add(ref element, ElementData.Mass) + slope * excess;
            s = mass * excess / C;
            inverseMass = 1 / mass;
        }
        var width = Unsafe.Add(ref element, ElementData.Width);
        var z = s * width * width;
        if (Math.Abs(z) < 1)
        {
            double cSum = CSeries[SeriesTerms], sSum = SSeries[SeriesTerms];
            for (var j = SeriesTerms - 1; j >= 0; j--)
            {
                cSum = cSum * z + CSeries[j];
                sSum = sSum * z + SSeries[j];
            }
            var sinc = sSum * width;
            c = cSum;
            m12 = mass * sinc;
            m21 = -(s * inverseMass) * sinc;
        }
        else if (s > 0)
        {
            var k = Math.Sqrt(s);
            var (sin, cos) = Math.SinCos(k * width);
            c = cos;
            m12 = mass / k * sin;
            m21 = -(k * inverseMass) * sin;
        }
        else
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width; // ≥ 1 here
            double sinh;
            if (theta < DirectBarrierLimit)
            {
                var grow = Math.Exp(theta);
                var decay = 1 / grow;
                c = 0.5 * (grow + decay);
                sinh = 0.5 * (grow - decay); // no cancellation for θ ≥ 1 (loses at most a factor 1.3)
            }
            else
            {
                // Scaled by e^(−κw): cosh → (1 + e^(−2κw))/2, sinh → (1 − e^(−2κw))/2; log += κw.
                var q = Math.Exp(-2 * theta);
                c = 0.5 * (1 + q);
                sinh = 0.5 * (1 - q);
                log += theta;
            }
            m12 = mass / kappa * sinh;
            m21 = kappa * inverseMass * sinh;
        }
    }

    /// <summary>
    /// Effectively computes destination[i] = D(energies[i]); energies are assumed already validated.
    /// Does not allocate (chunk buffers live on the stack).
    /// </summary>
    internal static void Traces(ElementKind[] kinds, double[] data, ReadOnlySpan<double> energies, Span<double> destination)
    {
        CheckLayout(kinds, data);
        Span<double> buffer = stackalloc double[Chunk * 11];
        for (var start = 0; start < energies.Length; start += Chunk)
        {
            var length = Math.Min(Chunk, energies.Length - start);
            TracesChunk(kinds, data, energies.Slice(start, length), destination.Slice(start, length), buffer);
        }
    }

    private static void TracesChunk(ElementKind[] kinds, double[] data, ReadOnlySpan<double> e, Span<double> destination, Span<double> buffer)
    {
        var n = e.Length;
        var p11 = buffer.Slice(0 * Chunk, n);
        var p12 = buffer.Slice(1 * Chunk, n);
        var p21 = buffer.Slice(2 * Chunk, n);
        var p22 = buffer.Slice(3 * Chunk, n);
        var log = buffer.Slice(4 * Chunk, n);
        var c = buffer.Slice(5 * Chunk, n);
        var m12 = buffer.Slice(6 * Chunk, n);
        var m21 = buffer.Slice(7 * Chunk, n);
        var s = buffer.Slice(8 * Chunk, n);
        var x = buffer.Slice(9 * Chunk, n);
        var y = buffer.Slice(10 * Chunk, n);
        log.Clear();
        var count = kinds.Length;
        ElementChunk(kinds[0], data, 0, e, log, p11, p12, p21, s, x, y);
        if (count == 1)
        {
            TensorPrimitives.Multiply(p11, 2.0, destination);
        }
        else
        {
            p11.CopyTo(p22);
            for (var i = 1; i < count - 1; i++)
            {
                ElementChunk(kinds[i], data, i, e, log, c, m12, m21, s, x, y);
                // Column 1: (p11, p21) ← (c p11 + m12 p21, m21 p11 + c p21); then column 2 likewise.
                ApplyColumn(c, m12, m21, p11, p21, x, y);
                ApplyColumn(c, m12, m21, p12, p22, x, y);
                Renormalise(p11, p12, p21, p22, log);
            }
            // Tr(M·P) = c (P11 + P22) + m12 P21 + m21 P12 for the last element M.
            ElementChunk(kinds[count - 1], data, count - 1, e, log, c, m12, m21, s, x, y);
            TensorPrimitives.Add(p11, p22, x);
            TensorPrimitives.Multiply(x, c, destination);
            TensorPrimitives.FusedMultiplyAdd(m12, p21, destination, destination);
            TensorPrimitives.FusedMultiplyAdd(m21, p12, destination, destination);
        }
        if (TensorPrimitives.MaxMagnitude(log) != 0)
        {
            for (var j = 0; j < n; j++)
            {
                destination[j] = Combine(destination[j], log[j]);
            }
        }
    }

    /// <summary>
    /// The matrices [[c, m12], [m21, c]] of element <paramref name="index"/> at every energy of the chunk, into
    /// <paramref name="c"/>, <paramref name="m12"/>, <paramref name="m21"/>; scale factors taken out are added to
    /// <paramref name="log"/>. <paramref name="s"/>, <paramref name="x"/> and <paramref name="y"/> are scratch.
    /// </summary>
    private static void ElementChunk(ElementKind kind, double[] data, int index, ReadOnlySpan<double> e, Span<double> log,
        Span<double> c, Span<double> m12, Span<double> m21, Span<double> s, Span<double> x, Span<double> y)
    {
        var at = ElementData.Stride * index;
        if (kind == ElementKind.Delta)
        {
            c.Fill(1);
            m12.Clear();
            m21.Fill(data[at + ElementData.Jump]);
            return;
        }
        var width = data[at + ElementData.Width];
        var mass = data[at + ElementData.Mass];
        var inverseMass = data[at + ElementData.InverseMass];
        var slope = data[at + ElementData.MassSlope];
        TensorPrimitives.Subtract(e, data[at + ElementData.Potential], x); // E − V
        // s = m(E)(E − V)/C; with a non-parabolic mass m(E) = m + slope·(E − V) is kept in y.
        if (slope == 0)
        {
            TensorPrimitives.Multiply(x, data[at + ElementData.MassOverC], s);
        }
        else
        {
            TensorPrimitives.Multiply(x, slope, y);
            TensorPrimitives.Add(y, mass, y);
            TensorPrimitives.Multiply(y, x, s);
            TensorPrimitives.Multiply(s, 1.0 / C, s);
        }
        var sMin = TensorPrimitives.Min(s);
        var sMax = TensorPrimitives.Max(s);
        var w2 = width * width;
        if (Math.Max(-sMin, sMax) * w2 < 1)
        {
            // Series in z = s·w² (x): c and S/w by Horner; S into m12.
            TensorPrimitives.Multiply(s, w2, x);
            c.Fill(CSeries[SeriesTerms]);
            m12.Fill(SSeries[SeriesTerms]);
            for (var j = SeriesTerms - 1; j >= 0; j--)
            {
                TensorPrimitives.MultiplyAdd(c, x, CSeries[j], c);
                TensorPrimitives.MultiplyAdd(m12, x, SSeries[j], m12);
            }
            TensorPrimitives.Multiply(m12, width, m12);
            // m21 = −(s/m)·S, m12 = m·S.
            TensorPrimitives.Multiply(s, m12, m21);
            if (slope == 0)
            {
                TensorPrimitives.Multiply(m21, -inverseMass, m21);
                TensorPrimitives.Multiply(m12, mass, m12);
            }
            else
            {
                TensorPrimitives.Divide(m21, y, m21);
                TensorPrimitives.Negate(m21, m21);
                TensorPrimitives.Multiply(m12, y, m12);
            }
        }
        else if (sMin > 0)
        {
            // Oscillating everywhere: k = √s (x), sin kw (m21) and cos kw (c).
            TensorPrimitives.Sqrt(s, x);
            TensorPrimitives.Multiply(x, width, m12);
            TensorPrimitives.SinCos(m12, m21, c);
            FinishWithSine(x, m21, m12, slope == 0 ? Span<double>.Empty : y, mass, inverseMass, negative: true);
        }
        else if (sMax < 0 && -sMax * w2 >= 1)
        {
            // Evanescent everywhere with κw ≥ 1: κ = √−s (x), θ = κw (m21).
            TensorPrimitives.Negate(s, x);
            TensorPrimitives.Sqrt(x, x);
            TensorPrimitives.Multiply(x, width, m21);
            if (TensorPrimitives.Max(m21) < DirectBarrierLimit)
            {
                TensorPrimitives.Exp(m21, m21); // e^θ
                TensorPrimitives.Divide(1.0, m21, c); // e^−θ
                TensorPrimitives.Subtract(m21, c, m12);
                TensorPrimitives.Multiply(m12, 0.5, m12); // sinh θ
                TensorPrimitives.Add(m21, c, c);
                TensorPrimitives.Multiply(c, 0.5, c); // cosh θ
            }
            else
            {
                TensorPrimitives.Add(log, m21, log);
                TensorPrimitives.Multiply(m21, -2.0, m21);
                TensorPrimitives.Exp(m21, m21); // q = e^(−2θ)
                TensorPrimitives.Multiply(m21, 0.5, c);
                TensorPrimitives.Add(c, 0.5, c); // (1 + q)/2
                TensorPrimitives.Multiply(m21, -0.5, m12);
                TensorPrimitives.Add(m12, 0.5, m12); // (1 − q)/2
            }
            m12.CopyTo(m21);
            FinishWithSine(x, m21, m12, slope == 0 ? Span<double>.Empty : y, mass, inverseMass, negative: false);
        }
        else
        {
            // The chunk straddles regimes: per energy.
            ref var element = ref data[at];
            for (var j = 0; j < e.Length; j++)
            {
                var added = 0.0;
                ScalarElement(kind, ref element, e[j], out c[j], out m12[j], out m21[j], ref added);
                log[j] += added;
            }
        }
    }

    /// <summary>
    /// From k (or κ) in <paramref name="k"/> and sin kw (or sinh κw, possibly scaled) in <paramref name="sine"/>:
    /// m12 = (m/k)·sine into <paramref name="m12"/> and m21 = ∓(k/m)·sine into <paramref name="sine"/> (minus when
    /// <paramref name="negative"/>). <paramref name="massOfEnergy"/> holds m(E) for a non-parabolic layer, else null.
    /// Overwrites <paramref name="k"/>.
    /// </summary>
    private static void FinishWithSine(Span<double> k, Span<double> sine, Span<double> m12, Span<double> massOfEnergy,
        double mass, double inverseMass, bool negative)
    {
        if (massOfEnergy.IsEmpty)
        {
            TensorPrimitives.Divide(mass, k, m12);
            TensorPrimitives.Multiply(m12, sine, m12);
            TensorPrimitives.Multiply(k, negative ? -inverseMass : inverseMass, k);
            TensorPrimitives.Multiply(k, sine, sine);
        }
        else
        {
            TensorPrimitives.Divide(massOfEnergy, k, m12);
            TensorPrimitives.Multiply(m12, sine, m12);
            TensorPrimitives.Divide(k, massOfEnergy, k);
            TensorPrimitives.Multiply(k, sine, sine);
            if (negative)
            {
                TensorPrimitives.Negate(sine, sine);
            }
        }
    }

    private static void ApplyColumn(ReadOnlySpan<double> c, ReadOnlySpan<double> m12, ReadOnlySpan<double> m21,
        Span<double> top, Span<double> bottom, Span<double> scratch1, Span<double> scratch2)
    {
        TensorPrimitives.Multiply(m12, bottom, scratch1);
        TensorPrimitives.FusedMultiplyAdd(c, top, scratch1, scratch1); // new top
        TensorPrimitives.Multiply(m21, top, scratch2);
        TensorPrimitives.FusedMultiplyAdd(c, bottom, scratch2, bottom); // new bottom
        scratch1.CopyTo(top);
    }

    private static void Renormalise(Span<double> p11, Span<double> p12, Span<double> p21, Span<double> p22, Span<double> log)
    {
        // Fast exit when no entry of any energy is near either end of the range (the common case);
        // otherwise the exact per-energy rule of the scalar path.
        var max = Math.Max(Math.Max(Math.Abs(TensorPrimitives.MaxMagnitude(p11)), Math.Abs(TensorPrimitives.MaxMagnitude(p12))),
                           Math.Max(Math.Abs(TensorPrimitives.MaxMagnitude(p21)), Math.Abs(TensorPrimitives.MaxMagnitude(p22))));
        var min = Math.Min(Math.Min(Math.Abs(TensorPrimitives.MinMagnitude(p11)), Math.Abs(TensorPrimitives.MinMagnitude(p12))),
                           Math.Min(Math.Abs(TensorPrimitives.MinMagnitude(p21)), Math.Abs(TensorPrimitives.MinMagnitude(p22))));
        if (max <= RenormaliseAbove && min >= RenormaliseBelow)
        {
            return;
        }
        for (var j = 0; j < p11.Length; j++)
        {
            var m = Math.Max(Math.Max(Math.Abs(p11[j]), Math.Abs(p12[j])), Math.Max(Math.Abs(p21[j]), Math.Abs(p22[j])));
            if (m > RenormaliseAbove || (m < RenormaliseBelow && m > 0))
            {
                var exponent = Math.ILogB(m);
                p11[j] = Math.ScaleB(p11[j], -exponent); p12[j] = Math.ScaleB(p12[j], -exponent);
                p21[j] = Math.ScaleB(p21[j], -exponent); p22[j] = Math.ScaleB(p22[j], -exponent);
                log[j] += exponent * Math.Log(2.0);
            }
        }
    }
}
