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
/// c = cosh κw, S = sinh(κw)/κ; a delta has c = 1, m12 = 0, m21 = its jump. Three regimes keep every
/// digit: |s|w² &lt; 1, Taylor series of c and S/w in z = s·w² (no cancellation near s = 0, where the exp-minus-one
/// forms of .NET lose digits: <c>double.ExpM1</c> is computed as exp(x) − 1); s &gt; 0, sin and cos; s &lt; 0, cosh and
/// sinh from e^κw for κw &lt; 20 and, beyond, scaled by e^(−κw) with κw added to a log scale, so that no barrier
/// overflows (the scaled transfer-matrix form of e.g. P. Yeh, Optical Waves in Layered Media, ch. 5, applied to
/// the BenDaniel–Duke envelope equation). The first element's matrix is the running product itself and of the
/// last only the trace of the product is formed. Products are renormalised by exact powers of two.</para>
/// <para>The batch path (TraceKernel.Lanes.cs) runs the same formulas on <see cref="System.Numerics.Vector{T}"/>
/// lanes, several energies at once with the whole product in registers; an element whose lanes straddle regimes
/// is evaluated lane by lane with the scalar formula.</para>
/// <para>Results agree with the derivative-carrying path of <see cref="CellTransfer.Dispersion"/> to
/// rounding: the vectorised sin, cos and exp differ from the scalar ones by a few ulps, which the
/// product carries as a relative error of order (number of layers)·ε on the largest matrix entry.</para>
/// </remarks>
internal static partial class TraceKernel
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;

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
    /// Does not allocate.
    /// </summary>
    internal static void Traces(ElementKind[] kinds, double[] data, ReadOnlySpan<double> energies, Span<double> destination)
    {
        CheckLayout(kinds, data);
        TracesInLanes(kinds, data, energies, destination);
    }
}
