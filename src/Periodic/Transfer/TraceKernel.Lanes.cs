// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Periodic.Transfer;

/// <summary>
/// The batch path of the trace-only kernel: <see cref="Vector{T}.Count"/> energies at a time, the whole product
/// over the elements kept in registers (one pass over the elements per group of energies, no intermediate arrays).
/// </summary>
/// <remarks>
/// Each lane follows the scalar path's formulas and regimes (<see cref="ScalarElement"/>): series for
/// |s|w² &lt; 1, sin and cos for s w² ≥ 1, cosh and sinh (direct below κw = 20, scaled beyond) for s w² ≤ −1.
/// When the lanes of a group fall into different regimes for one element, that element is evaluated lane by lane
/// with the scalar formula; renormalisation by exact powers of two likewise happens lane by lane, only when a lane
/// leaves [1e-120, 1e120]. <see cref="Vector.SinCos(Vector{double})"/> and <see cref="Vector.Exp(Vector{double})"/>
/// differ from <see cref="Math.SinCos"/> and <see cref="Math.Exp"/> by a few ulps, so lanes agree with the scalar
/// path to rounding, not bitwise.
/// </remarks>
internal static partial class TraceKernel
{
    /// <summary>destination[i] = D(energies[i]) in groups of <see cref="Vector{T}.Count"/>; the tail by the scalar path.</summary>
    private static void TracesInLanes(ElementKind[] kinds, double[] data, ReadOnlySpan<double> energies, Span<double> destination)
    {
        var width = Vector<double>.Count;
        var i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            ref var input = ref MemoryMarshal.GetReference(energies);
            ref var output = ref MemoryMarshal.GetReference(destination);
            for (; i <= energies.Length - width; i += width)
            {
                var e = Vector.LoadUnsafe(ref input, (nuint)i);
                var mantissa = TraceLanes(kinds, data, e, out var log);
                if (Vector.EqualsAll(log, Vector<double>.Zero))
                {
                    mantissa.StoreUnsafe(ref output, (nuint)i);
                }
                else
                {
                    for (var j = 0; j < width; j++)
                    {
                        destination[i + j] = Combine(mantissa[j], log[j]);
                    }
                }
            }
        }
        for (; i < energies.Length; i++)
        {
            destination[i] = Trace(kinds, data, energies[i]);
        }
    }

    /// <summary>The mantissa of D and its log scale for one group of energies.</summary>
    private static Vector<double> TraceLanes(ElementKind[] kinds, double[] data, Vector<double> e, out Vector<double> log)
    {
        var n = kinds.Length;
        ref var first = ref MemoryMarshal.GetArrayDataReference(data);
        log = Vector<double>.Zero;
        ElementLanes(kinds[0], ref first, e, out var c0, out var p12, out var p21, ref log);
        if (n == 1)
        {
            return c0 + c0;
        }
        Vector<double> p11 = c0, p22 = c0;
        var above = new Vector<double>(RenormaliseAbove);
        for (var i = 1; i < n - 1; i++)
        {
            ElementLanes(kinds[i], ref Unsafe.Add(ref first, ElementData.Stride * i), e, out var c, out var m12, out var m21, ref log);
            var q11 = c * p11 + m12 * p21;
            var q12 = c * p12 + m12 * p22;
            var q21 = m21 * p11 + c * p21;
            var q22 = m21 * p12 + c * p22;
            p11 = q11; p12 = q12; p21 = q21; p22 = q22;
            var max = Vector.Max(Vector.Max(Vector.Abs(q11), Vector.Abs(q12)), Vector.Max(Vector.Abs(q21), Vector.Abs(q22)));
            // Out of [1e-120, 1e120] in some lane (rare): the scalar rule lane by lane. NaN cannot occur here
            // (finite inputs, finite element matrices), so plain comparisons suffice.
            if (Vector.GreaterThanAny(max, above) || Vector.LessThanAny(max, new Vector<double>(RenormaliseBelow)))
            {
                RenormaliseLanes(ref p11, ref p12, ref p21, ref p22, ref log, max);
            }
        }
        ElementLanes(kinds[n - 1], ref Unsafe.Add(ref first, ElementData.Stride * (n - 1)), e, out var cl, out var l12, out var l21, ref log);
        return cl * (p11 + p22) + l12 * p21 + l21 * p12;
    }

    private static void RenormaliseLanes(ref Vector<double> p11, ref Vector<double> p12, ref Vector<double> p21, ref Vector<double> p22,
        ref Vector<double> log, Vector<double> max)
    {
        Span<double> scale = stackalloc double[Vector<double>.Count];
        Span<double> added = stackalloc double[Vector<double>.Count];
        for (var j = 0; j < scale.Length; j++)
        {
            var m = max[j];
            if (m > RenormaliseAbove || (m < RenormaliseBelow && m > 0))
            {
                var exponent = Math.ILogB(m);
                scale[j] = Math.ScaleB(1.0, -exponent); // exact power of two
                added[j] = exponent * Math.Log(2.0);
            }
            else
            {
                scale[j] = 1;
                added[j] = 0;
            }
        }
        var s = new Vector<double>(scale);
        p11 *= s; p12 *= s; p21 *= s; p22 *= s;
        log += new Vector<double>(added);
    }

    /// <summary>The element matrices [[c, m12], [m21, c]] of all lanes; scale factors taken out are added to <paramref name="log"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void ElementLanes(ElementKind kind, ref double element, Vector<double> e,
        out Vector<double> c, out Vector<double> m12, out Vector<double> m21, ref Vector<double> log)
    {
        if (kind == ElementKind.Delta)
        {
            c = Vector<double>.One;
            m12 = Vector<double>.Zero;
            m21 = new Vector<double>(Unsafe.Add(ref element, ElementData.Jump));
            return;
        }
        var excess = e - new Vector<double>(Unsafe.Add(ref element, ElementData.Potential));
        var slope = Unsafe.Add(ref element, ElementData.MassSlope);
        Vector<double> mass, s, inverseMass;
        if (slope == 0)
        {
            mass = new Vector<double>(Unsafe.Add(ref element, ElementData.Mass));
            s = excess * Unsafe.Add(ref element, ElementData.MassOverC);
            inverseMass = new Vector<double>(Unsafe.Add(ref element, ElementData.InverseMass));
        }
        else
        {
            mass = new Vector<double>(Unsafe.Add(ref element, ElementData.Mass)) + excess * slope;
            s = mass * excess / new Vector<double>(C);
            inverseMass = Vector<double>.One / mass;
        }
        var width = Unsafe.Add(ref element, ElementData.Width);
        var z = s * (width * width);
        var one = Vector<double>.One;
        if (Vector.LessThanAll(Vector.Abs(z), one))
        {
            var cSum = new Vector<double>(CSeries[SeriesTerms]);
            var sSum = new Vector<double>(SSeries[SeriesTerms]);
            for (var j = SeriesTerms - 1; j >= 0; j--)
            {
                cSum = cSum * z + new Vector<double>(CSeries[j]);
                sSum = sSum * z + new Vector<double>(SSeries[j]);
            }
            var sinc = sSum * width;
            c = cSum;
            m12 = mass * sinc;
            m21 = -(s * inverseMass) * sinc;
            return;
        }
        if (Vector.GreaterThanOrEqualAll(z, one))
        {
            var k = Vector.SquareRoot(s);
            var (sin, cos) = Vector.SinCos(k * width);
            c = cos;
            m12 = mass / k * sin;
            m21 = -(k * inverseMass) * sin;
            return;
        }
        if (Vector.LessThanOrEqualAll(z, -one))
        {
            var kappa = Vector.SquareRoot(-s);
            var theta = kappa * width;
            Vector<double> sinh;
            if (Vector.LessThanAll(theta, new Vector<double>(DirectBarrierLimit)))
            {
                var grow = Vector.Exp(theta);
                var decay = one / grow;
                c = (grow + decay) * 0.5;
                sinh = (grow - decay) * 0.5;
            }
            else if (Vector.GreaterThanOrEqualAll(theta, new Vector<double>(DirectBarrierLimit)))
            {
                var q = Vector.Exp(theta * -2.0);
                c = (one + q) * 0.5;
                sinh = (one - q) * 0.5;
                log += theta;
            }
            else
            {
                LanesByScalar(ElementKind.Layer, ref element, e, out c, out m12, out m21, ref log);
                return;
            }
            m12 = mass / kappa * sinh;
            m21 = kappa * inverseMass * sinh;
            return;
        }
        LanesByScalar(ElementKind.Layer, ref element, e, out c, out m12, out m21, ref log);
    }

    /// <summary>An element whose lanes straddle regimes: the scalar formula lane by lane.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void LanesByScalar(ElementKind kind, ref double element, Vector<double> e,
        out Vector<double> c, out Vector<double> m12, out Vector<double> m21, ref Vector<double> log)
    {
        var width = Vector<double>.Count;
        Span<double> buffer = stackalloc double[4 * width];
        var cs = buffer[..width];
        var a12 = buffer.Slice(width, width);
        var a21 = buffer.Slice(2 * width, width);
        var added = buffer.Slice(3 * width, width);
        for (var j = 0; j < width; j++)
        {
            double scale = 0;
            ScalarElement(kind, ref element, e[j], out cs[j], out a12[j], out a21[j], ref scale);
            added[j] = scale;
        }
        c = new Vector<double>(cs);
        m12 = new Vector<double>(a12);
        m21 = new Vector<double>(a21);
        log += new Vector<double>(added);
    }
}
