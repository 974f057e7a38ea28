// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

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
/// c = cosh κw, S = sinh(κw)/κ (<see cref="UniformLayerPropagator.Values"/>: series near s = 0, sin and cos, cosh and
/// sinh direct below κw = 20 and scaled beyond, so that no barrier overflows; the scaled transfer-matrix form of e.g.
/// P. Yeh, Optical Waves in Layered Media, ch. 5, applied to the BenDaniel–Duke envelope equation); a delta has c = 1,
/// m12 = 0, m21 = its jump. The first element's matrix is the running product itself and of the
/// last only the trace of the product is formed. Products are renormalised by exact powers of two.</para>
/// <para>The batch path (TraceKernel.Lanes.cs) is a documented specialisation kept for speed (several energies per
/// instruction, the whole product in registers): it repeats the regimes of <see cref="UniformLayerPropagator.Values"/>
/// on <see cref="System.Numerics.Vector{T}"/> lanes, and an element whose lanes straddle regimes is evaluated lane by
/// lane with the scalar formula. TraceKernelTest pins it to the scalar path and to <see cref="CellTransfer.Dispersion"/>.</para>
/// <para>Results agree with the derivative-carrying path of <see cref="CellTransfer.Dispersion"/> to
/// rounding: the vectorised sin, cos and exp differ from the scalar ones by a few ulps, which the
/// product carries as a relative error of order (number of layers)·ε on the largest matrix entry.</para>
/// </remarks>
internal static partial class TraceKernel
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;

    // The lanes repeat the closed form of UniformLayerPropagator.Values on vectors, with its constants.
    private const double DirectBarrierLimit = UniformLayerPropagator.DirectBarrierLimit;
    private const int SeriesTerms = UniformLayerPropagator.ValueSeriesTerms;
    private static readonly double[] CSeries = UniformLayerPropagator.CSeries;
    private static readonly double[] SSeries = UniformLayerPropagator.SSeries;

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
        UniformLayerPropagator.Values(s, Unsafe.Add(ref element, ElementData.Width), out c, out var sinc, out var logScale);
        if (logScale != 0)
        {
            log += logScale; // rare (barriers beyond κw = 20): no store to the caller's scale on the common path
        }
        m12 = mass * sinc;
        m21 = -(s * inverseMass) * sinc;
    }

    /// <summary>
    /// Effectively computes destination[i] = D(energies[i]); energies are assumed already validated.
    /// Does not allocate.
    /// </summary>
    internal static void Traces(ElementKind[] kinds, double[] data, ReadOnlySpan<double> energies, Span<double> destination)
    {
        CheckLayout(kinds, data);
        TracesInLanes(kinds, data, energies, destination);
    }
}
