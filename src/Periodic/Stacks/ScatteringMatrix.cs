// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using System.Runtime.CompilerServices;

namespace Periodic.Stacks;

/// <summary>
/// The 2×2 scattering matrix of a region at one energy, in the basis of plane waves of a fixed
/// reference medium (impedance q = k/m, 1/nm per m₀) on both sides, or of two different media for a
/// lead interface. R, Rp: reflection from the left and from the right; T, Tp: transmission left→right
/// and right→left, held as complex mantissas times e^LogScale so that no barrier underflows them.
/// </summary>
/// <remarks>
/// Composition is the Redheffer star product (R. Redheffer, J. Math. Phys. 41, 1 (1962)); its use for
/// heterostructures is D. Y. K. Ko and J. C. Inkson, Phys. Rev. B 38, 9945 (1988). A zero-thickness
/// reference medium between elements (as in R. C. Rumpf, Prog. Electromagn. Res. B 35, 241 (2011))
/// lets each element be converted on its own, so the growing exponentials of barriers never meet
/// across elements. In a flux-normalised basis the matrix is unitary and its entries are bounded by
/// one: this is what keeps the method stable where a product of transfer matrices loses the
/// decaying solution.
/// </remarks>
internal struct ScatteringMatrix
{
    internal Complex R, Rp, T, Tp;
    internal double LogScale;

    internal static ScatteringMatrix Identity => new() { R = Complex.Zero, Rp = Complex.Zero, T = Complex.One, Tp = Complex.One, LogScale = 0 };

    /// <summary>
    /// From a real transfer matrix e^logScale·[[a, b], [c, d]] (det = 1) acting on (ψ, ψ′/m), in the
    /// basis of reference impedance <paramref name="q"/> on both sides.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static ScatteringMatrix FromTransfer(double a, double b, double c, double d, double logScale, double q)
    {
        // H = W⁻¹ M W with W = [[1, 1], [iq, −iq]] (columns: right- and left-going waves).
        var h22 = new Complex(0.5 * (a + d), -0.5 * (q * b - c / q));
        var h21 = new Complex(0.5 * (a - d), 0.5 * (q * b + c / q));
        var h12 = new Complex(0.5 * (a - d), -0.5 * (q * b + c / q));
        var inverse = Complex.Reciprocal(h22);
        var s = new ScatteringMatrix
        {
            R = -h21 * inverse,
            Rp = h12 * inverse,
            T = inverse,
            Tp = inverse,
            LogScale = -logScale,
        };
        return s;
    }

    /// <summary>A bare junction from a medium of impedance q1 (left) to one of impedance q2 (right).</summary>
    internal static ScatteringMatrix Interface(double q1, double q2)
    {
        var rho = q1 / q2;
        var inv = 1.0 / (1.0 + rho);
        return new ScatteringMatrix
        {
            R = (rho - 1.0) * inv,
            Rp = (1.0 - rho) * inv,
            T = 2.0 * rho * inv,
            Tp = 2.0 * inv,
            LogScale = 0,
        };
    }

    /// <summary>The star product: region <paramref name="left"/> followed by region <paramref name="right"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static ScatteringMatrix Compose(in ScatteringMatrix left, in ScatteringMatrix right)
    {
        var den = Complex.One - left.Rp * right.R;
        if (den == Complex.Zero)
        {
            // Only when both sides reflect totally to the last bit with matching phase (a state bound
            // between them that double precision cannot resolve); the smallest normal keeps results finite.
            den = new Complex(2.2250738585072014e-308, 0);
        }
        var inv = Complex.Reciprocal(den);
        var leftRound = left.T * left.Tp * Math.Exp(2 * left.LogScale);
        var rightRound = right.T * right.Tp * Math.Exp(2 * right.LogScale);
        var s = new ScatteringMatrix
        {
            R = left.R + leftRound * right.R * inv,
            Rp = right.Rp + rightRound * left.Rp * inv,
            T = left.T * right.T * inv,
            Tp = left.Tp * right.Tp * inv,
            LogScale = left.LogScale + right.LogScale,
        };
        s.Renormalise();
        return s;
    }

    /// <summary>The region repeated <paramref name="count"/> times, by repeated squaring (O(log count) products).</summary>
    internal static ScatteringMatrix Power(in ScatteringMatrix cell, int count)
    {
        var result = Identity;
        var square = cell;
        var first = true;
        while (count > 0)
        {
            if ((count & 1) != 0)
            {
                result = first ? square : Compose(result, square);
                first = false;
            }
            count >>= 1;
            if (count > 0)
            {
                square = Compose(square, square);
            }
        }
        return result;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void Renormalise()
    {
        var max = Math.Max(Math.Max(Math.Abs(T.Real), Math.Abs(T.Imaginary)), Math.Max(Math.Abs(Tp.Real), Math.Abs(Tp.Imaginary)));
        if (max > 0 && (max > 1e100 || max < 1e-100))
        {
            var exponent = Math.ILogB(max);
            T = new Complex(Math.ScaleB(T.Real, -exponent), Math.ScaleB(T.Imaginary, -exponent));
            Tp = new Complex(Math.ScaleB(Tp.Real, -exponent), Math.ScaleB(Tp.Imaginary, -exponent));
            LogScale += exponent * Math.Log(2.0);
        }
    }
}
