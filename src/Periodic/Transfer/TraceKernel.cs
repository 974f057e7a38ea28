// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics.Tensors;
using System.Runtime.CompilerServices;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// Trace-only evaluation of D(E) = Tr M(E) for cells of uniform layers and delta barriers: the same
/// closed-form layer matrices as <see cref="CellTransfer"/> without the energy derivative, scalar and
/// vectorised across energies.
/// </summary>
/// <remarks>
/// <para>Method: for each layer, the matrix [[c, mS], [−(s/m)S, c]] with c = cos(√s w), S = sin(√s w)/√s
/// (s &gt; 0) or, under a barrier (s &lt; 0), c = cosh(κw)e^(−κw) = (1 + e^(−2κw))/2 and
/// S = sinh(κw)e^(−κw)/κ = −expm1(−2κw)/(2κ), the growing exponential κw being added to a log scale
/// (the scaled transfer-matrix form of e.g. P. Yeh, Optical Waves in Layered Media, ch. 5, applied to
/// the BenDaniel–Duke envelope equation). The batch path processes the energies in chunks and, for
/// each layer whose wavenumber squared s has one sign over the chunk, evaluates every step with
/// <see cref="TensorPrimitives"/> (SIMD across energies); chunks where s changes sign fall back to the
/// scalar formula per energy. Products are renormalised by exact powers of two.</para>
/// <para>Results agree with the derivative-carrying path of <see cref="CellTransfer.Dispersion"/> to
/// rounding: the vectorised sin, cos and exp differ from the scalar ones by a few ulps, which the
/// product carries as a relative error of order (number of layers)·ε on the largest matrix entry.</para>
/// </remarks>
internal sealed class TraceKernel
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;
    private const int Chunk = 256;

    private readonly bool[] _isDelta;
    private readonly double[] _widths;
    private readonly double[] _potentials;
    private readonly double[] _masses;
    private readonly double[] _massSlopes;
    private readonly double[] _deltaJumps;

    private TraceKernel(bool[] isDelta, double[] widths, double[] potentials, double[] masses, double[] massSlopes, double[] deltaJumps)
    {
        _isDelta = isDelta;
        _widths = widths;
        _potentials = potentials;
        _masses = masses;
        _massSlopes = massSlopes;
        _deltaJumps = deltaJumps;
    }

    /// <summary>Compiles the kernel, or returns null when the cell holds an element other than layers and deltas.</summary>
    internal static TraceKernel? TryCreate(UnitCell cell)
    {
        var elements = cell.ElementSpan;
        var n = elements.Length;
        var isDelta = new bool[n];
        var widths = new double[n];
        var potentials = new double[n];
        var masses = new double[n];
        var slopes = new double[n];
        var jumps = new double[n];
        for (var i = 0; i < n; i++)
        {
            switch (elements[i])
            {
                case Layer layer:
                    widths[i] = layer.Width.Nanometres;
                    potentials[i] = layer.Potential.ElectronVolts;
                    masses[i] = layer.Mass.ElectronMasses;
                    slopes[i] = layer.Mass.ElectronMasses * layer.NonParabolicityPerElectronVolt;
                    break;
                case DeltaBarrier delta:
                    isDelta[i] = true;
                    jumps[i] = delta.StrengthElectronVoltNanometres / C;
                    break;
                default:
                    return null;
            }
        }
        return new TraceKernel(isDelta, widths, potentials, masses, slopes, jumps);
    }

    /// <summary>D(E) by the scalar trace-only product; ±∞ beyond the double range, 0 for a zero mantissa.</summary>
    internal double Trace(double e)
    {
        double p11 = 1, p12 = 0, p21 = 0, p22 = 1, log = 0;
        for (var i = 0; i < _isDelta.Length; i++)
        {
            if (_isDelta[i])
            {
                var jump = _deltaJumps[i];
                p21 += jump * p11;
                p22 += jump * p12;
                continue;
            }
            var excess = e - _potentials[i];
            var mass = _masses[i] + _massSlopes[i] * excess;
            var s = mass * excess / C;
            LayerFunctions(s, _widths[i], out var c, out var sinc, out var scale);
            log += scale;
            var m12 = mass * sinc;
            var m21 = -s * sinc / mass;
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
        return Combine(p11 + p22, log);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Combine(double mantissa, double log) =>
        mantissa == 0 ? 0 : log == 0 ? mantissa : mantissa * Math.Exp(log);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void LayerFunctions(double s, double width, out double c, out double sinc, out double logScale)
    {
        if (s > 0)
        {
            var k = Math.Sqrt(s);
            var (sin, cos) = Math.SinCos(k * width);
            c = cos;
            sinc = sin / k;
            logScale = 0;
        }
        else if (s < 0)
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width;
            var m1 = double.ExpM1(-2 * theta);
            c = 1 + 0.5 * m1;
            sinc = -0.5 * m1 / kappa;
            logScale = theta;
        }
        else
        {
            c = 1;
            sinc = width;
            logScale = 0;
        }
    }

    /// <summary>
    /// Effectively computes destination[i] = D(energies[i]); energies are assumed already validated.
    /// Does not allocate (chunk buffers live on the stack).
    /// </summary>
    internal void Traces(ReadOnlySpan<double> energies, Span<double> destination)
    {
        Span<double> buffer = stackalloc double[Chunk * 10];
        for (var start = 0; start < energies.Length; start += Chunk)
        {
            var length = Math.Min(Chunk, energies.Length - start);
            TracesChunk(energies.Slice(start, length), destination.Slice(start, length), buffer);
        }
    }

    private void TracesChunk(ReadOnlySpan<double> e, Span<double> destination, Span<double> buffer)
    {
        var n = e.Length;
        var p11 = buffer.Slice(0 * Chunk, n);
        var p12 = buffer.Slice(1 * Chunk, n);
        var p21 = buffer.Slice(2 * Chunk, n);
        var p22 = buffer.Slice(3 * Chunk, n);
        var log = buffer.Slice(4 * Chunk, n);
        var excess = buffer.Slice(5 * Chunk, n);
        var s = buffer.Slice(6 * Chunk, n);
        var c = buffer.Slice(7 * Chunk, n);
        var sinc = buffer.Slice(8 * Chunk, n);
        var t = buffer.Slice(9 * Chunk, n);
        p11.Fill(1); p12.Clear(); p21.Clear(); p22.Fill(1); log.Clear();
        for (var i = 0; i < _isDelta.Length; i++)
        {
            if (_isDelta[i])
            {
                // P21 += J P11, P22 += J P12.
                var jump = _deltaJumps[i];
                TensorPrimitives.FusedMultiplyAdd(p11, jump, p21, p21);
                TensorPrimitives.FusedMultiplyAdd(p12, jump, p22, p22);
                continue;
            }
            var width = _widths[i];
            var mass0 = _masses[i];
            var slope = _massSlopes[i];
            TensorPrimitives.Subtract(e, _potentials[i], excess);
            // s = m(E)(E − V)/C with m(E) = m + slope·(E − V); m(E) kept in `t` when it varies.
            if (slope == 0)
            {
                TensorPrimitives.Multiply(excess, mass0 / C, s);
            }
            else
            {
                TensorPrimitives.Multiply(excess, slope, t);
                TensorPrimitives.Add(t, mass0, t);
                TensorPrimitives.Multiply(t, excess, s);
                TensorPrimitives.Multiply(s, 1.0 / C, s);
            }
            var sMin = TensorPrimitives.Min(s);
            var sMax = TensorPrimitives.Max(s);
            if (sMin > 0)
            {
                // Oscillating everywhere in the chunk: k = √s, c = cos kw, S = sin(kw)/k.
                TensorPrimitives.Sqrt(s, sinc);
                TensorPrimitives.Multiply(sinc, width, c);
                TensorPrimitives.Divide(1.0, sinc, excess); // excess now holds 1/k
                TensorPrimitives.Sin(c, sinc);
                TensorPrimitives.Cos(c, c);
                TensorPrimitives.Multiply(sinc, excess, sinc);
            }
            else if (sMax < 0)
            {
                // Evanescent everywhere: κ = √−s, scaled cosh and sinh from expm1(−2κw), log += κw.
                TensorPrimitives.Negate(s, sinc);
                TensorPrimitives.Sqrt(sinc, sinc); // κ
                TensorPrimitives.FusedMultiplyAdd(sinc, width, log, log);
                TensorPrimitives.Multiply(sinc, -2 * width, c);
                TensorPrimitives.ExpM1(c, c); // m1 = expm1(−2κw)
                TensorPrimitives.Divide(c, sinc, sinc);
                TensorPrimitives.Multiply(sinc, -0.5, sinc);
                TensorPrimitives.Multiply(c, 0.5, c);
                TensorPrimitives.Add(c, 1.0, c);
            }
            else
            {
                for (var j = 0; j < n; j++)
                {
                    LayerFunctions(s[j], width, out var cj, out var sj, out var lj);
                    c[j] = cj;
                    sinc[j] = sj;
                    log[j] += lj;
                }
            }
            // m12 = m S (into excess), m21 = −(s/m) S (into s).
            if (slope == 0)
            {
                TensorPrimitives.Multiply(sinc, mass0, excess);
                TensorPrimitives.Multiply(s, sinc, s);
                TensorPrimitives.Multiply(s, -1.0 / mass0, s);
            }
            else
            {
                TensorPrimitives.Multiply(sinc, t, excess);
                TensorPrimitives.Multiply(s, sinc, s);
                TensorPrimitives.Divide(s, t, s);
                TensorPrimitives.Negate(s, s);
            }
            // Column 1: (p11, p21) ← (c p11 + m12 p21, m21 p11 + c p21); then column 2 likewise.
            ApplyColumn(c, excess, s, p11, p21, sinc, t);
            ApplyColumn(c, excess, s, p12, p22, sinc, t);
            Renormalise(p11, p12, p21, p22, log);
        }
        TensorPrimitives.Add(p11, p22, destination);
        for (var j = 0; j < n; j++)
        {
            destination[j] = Combine(destination[j], log[j]);
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
