// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.LinearAlgebra;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// Mathieu characteristic values a_r(q), b_r(q) computed independently of the library: as eigenvalues of
/// the (symmetrised) tridiagonal matrices of the three-term recurrences for the Fourier coefficients of
/// ce_r and se_r (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions, §20.2, eqs.
/// 20.2.5–20.2.11, from memory; the matrix form is the standard numerical method, e.g. S. Zhang and
/// J. Jin, Computation of Special Functions, 1996, ch. 20). Solved with MathNet.Numerics' symmetric
/// eigenvalue decomposition — a method with nothing in common with the transfer matrix or the
/// library's plane-wave code. Validated in the tests against the published q = 25 values.
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
        var m = Matrix<double>.Build.Dense(Size, Size);
        for (var j = 0; j < Size; j++)
        {
            m[j, j] = diagonal(j);
            if (j + 1 < Size)
            {
                var c = j == 0 ? firstCoupling * q : q;
                m[j, j + 1] = c;
                m[j + 1, j] = c;
            }
        }
        var values = m.Evd(Symmetricity.Symmetric).EigenValues.Select(z => z.Real).OrderBy(v => v).ToArray();
        return values[index];
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
