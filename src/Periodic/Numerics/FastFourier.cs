// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;

namespace Periodic.Numerics;

/// <summary>
/// The unscaled inverse discrete Fourier transform X_j = Σ_k a_k e^{+2πijk/M} of any length M in O(M log M):
/// iterative radix-2 Cooley–Tukey for powers of two (J. W. Cooley and J. W. Tukey, Math. Comp. 19, 297 (1965)),
/// otherwise Bluestein's chirp-z convolution on a power-of-two length ≥ 2M − 1 (L. I. Bluestein, IEEE Trans.
/// Audio Electroacoust. 18, 451 (1970)).
/// </summary>
/// <remarks>
/// Our own because MathNet's managed transform took 26 s for M = 3.2·10⁶ (Bluestein) and 1.2 s for 2²⁰ on the
/// build machine, where this one takes a fraction of a second; twiddles and chirps are computed per index by
/// <see cref="Math.SinCos"/> (chirp phases reduced exactly as k² mod 2M in integers), so rounding grows only as log M.
/// </remarks>
internal static class FastFourier
{
    /// <summary>Replaces <paramref name="data"/> by Σ_k data_k e^{+2πijk/M} (no 1/M).</summary>
    public static void InverseUnscaled(Complex[] data)
    {
        var m = data.Length;
        if (m <= 1)
        {
            return;
        }
        if (BitOperations.IsPow2(m))
        {
            Radix2(data, +1);
            return;
        }
        var p = (int)BitOperations.RoundUpToPowerOf2((uint)(2 * m - 1));
        // e^{2πijk/M} = c_j c_k conj(c_{j−k}) with c_k = e^{iπk²/M}.
        var chirp = new Complex[m];
        var twoM = 2L * m;
        for (long k = 0; k < m; k++)
        {
            var (sin, cos) = Math.SinCos(Math.PI * (k * k % twoM) / m);
            chirp[k] = new Complex(cos, sin);
        }
        var u = new Complex[p];
        for (var k = 0; k < m; k++)
        {
            u[k] = data[k] * chirp[k];
        }
        var v = new Complex[p];
        v[0] = Complex.Conjugate(chirp[0]);
        for (var k = 1; k < m; k++)
        {
            v[k] = v[p - k] = Complex.Conjugate(chirp[k]);
        }
        Radix2(u, -1);
        Radix2(v, -1);
        for (var i = 0; i < p; i++)
        {
            u[i] *= v[i];
        }
        v = null;
        Radix2(u, +1);
        var scale = 1.0 / p;
        for (var j = 0; j < m; j++)
        {
            data[j] = u[j] * chirp[j] * scale;
        }
    }

    /// <summary>In-place radix-2 transform Σ_k a_k e^{sign·2πijk/n}, n a power of two.</summary>
    private static void Radix2(Complex[] a, int sign)
    {
        var n = a.Length;
        for (int i = 1, j = 0; i < n; i++)
        {
            var bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1)
            {
                j ^= bit;
            }
            j ^= bit;
            if (i < j)
            {
                (a[i], a[j]) = (a[j], a[i]);
            }
        }
        // Twiddles stage by stage, contiguous: table[half + k] = e^{sign·2πik/length} for the stage of that length,
        // so no stage reads the table with a stride (a strided read per butterfly made large transforms cache-bound).
        var table = new Complex[n];
        for (var k = 0; k < n / 2; k++)
        {
            var (sin, cos) = Math.SinCos(sign * 2 * Math.PI * k / n);
            table[n / 2 + k] = new Complex(cos, sin);
        }
        for (var half = n / 4; half >= 1; half >>= 1)
        {
            var stride = n / 2 / half;
            for (var k = 0; k < half; k++)
            {
                table[half + k] = table[n / 2 + k * stride];
            }
        }
        for (var length = 2; length <= n; length <<= 1)
        {
            var half = length >> 1;
            var twiddle = table.AsSpan(half, half);
            for (var start = 0; start < n; start += length)
            {
                for (var k = 0; k < half; k++)
                {
                    var t = a[start + k + half] * twiddle[k];
                    var x = a[start + k];
                    a[start + k] = x + t;
                    a[start + k + half] = x - t;
                }
            }
        }
    }
}
