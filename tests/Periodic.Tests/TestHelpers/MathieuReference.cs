// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// Mathieu characteristic values a_r(q), b_r(q) computed independently of the library: as eigenvalues of
/// the (symmetrised) tridiagonal matrices of the three-term recurrences for the Fourier coefficients of
/// ce_r and se_r (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions, §20.2, eqs.
/// 20.2.5–20.2.11, from memory; the matrix form is the standard numerical method, e.g. S. Zhang and
/// J. Jin, Computation of Special Functions, 1996, ch. 20). Solved by Sturm-count bisection in 28-digit
/// decimal arithmetic — a method with nothing in common with the transfer matrix or the library's
/// plane-wave code, and exact far below double rounding. (MathNet.Numerics 5.0 offers no Mathieu functions — its
/// API documentation has none — so the reference is computed here.) Validated in the tests against the published
/// q = 25 (Zhang and Jin) and q = 5 (Abramowitz and Stegun, Table 20.1) values.
/// </summary>
internal static class MathieuReference
{
    private const int Size = 80; // coefficients decay like q^r/(r!)^2: 80 terms are exact to rounding for q ≤ 100

    /// <summary>a_r(q), r ≥ 0 (even solutions ce_r).</summary>
    public static double A(int r, double q) => r % 2 == 0
        ? Eigenvalue(r / 2, q, j => 4.0 * j * j, Math.Sqrt(2))       // ce_2n: A0, A2, …; (a − 4j²) rows, √2 from 2A0
        : Eigenvalue(r / 2, q, j => (2.0 * j + 1) * (2 * j + 1) + (j == 0 ? q : 0), 1); // ce_2n+1: (a − 1 − q)A1 − qA3 = 0

    /// <summary>b_r(q), r ≥ 1 (odd solutions se_r).</summary>
    public static double B(int r, double q) => r % 2 == 0
        ? Eigenvalue(r / 2 - 1, q, j => 4.0 * (j + 1) * (j + 1), 1)   // se_2n+2: B2, B4, …
        : Eigenvalue(r / 2, q, j => (2.0 * j + 1) * (2 * j + 1) - (j == 0 ? q : 0), 1); // se_2n+1: (a − 1 + q)B1 − qB3 = 0

    private static double Eigenvalue(int index, double q, Func<int, double> diagonal, double firstCoupling)
    {
        // Bisection on the Sturm count of the tridiagonal matrix in 28-digit decimal arithmetic: the count of
        // negative pivots of T − x is exact for a matrix within a few 1e-28 of T, so the eigenvalue is known far
        // beyond double precision and the reference adds nothing to a measured error.
        var d = new decimal[Size];
        var e = new decimal[Size - 1];
        var dq = (decimal)q;
        for (var j = 0; j < Size; j++)
        {
            d[j] = (decimal)diagonal(j);
            if (j + 1 < Size)
            {
                e[j] = j == 0 && firstCoupling != 1 ? dq * Sqrt2 : dq;
            }
        }
        // Gershgorin bounds.
        decimal low = -4 * Math.Abs(dq) - 1, high = d[Size - 1] + 4 * Math.Abs(dq) + 1;
        for (var iteration = 0; iteration < 200 && high - low > 1e-25m; iteration++)
        {
            var middle = (low + high) / 2;
            if (NegativePivots(d, e, middle) > index)
            {
                high = middle;
            }
            else
            {
                low = middle;
            }
        }
        return (double)((low + high) / 2);
    }

    private const decimal Sqrt2 = 1.4142135623730950488016887242m;

    private static int NegativePivots(decimal[] d, decimal[] e, decimal x)
    {
        var count = 0;
        var pivot = d[0] - x;
        for (var i = 0; ; i++)
        {
            if (pivot < 0)
            {
                count++;
            }
            if (i + 1 == d.Length)
            {
                return count;
            }
            if (pivot == 0)
            {
                pivot = 1e-27m;
            }
            pivot = d[i + 1] - x - e[i] * e[i] / pivot;
        }
    }

    /// <summary>Edges of bands 1 … n of V0 cos(2πx/d) in units of E_R, in order: band n = [a_{n−1}, b_n] (docs/references.md mapping).</summary>
    public static double[] BandEdges(int bands, double q)
    {
        var edges = new double[2 * bands];
        for (var n = 1; n <= bands; n++)
        {
            edges[2 * n - 2] = A(n - 1, q);
            edges[2 * n - 1] = B(n, q);
        }
        return edges;
    }
}
