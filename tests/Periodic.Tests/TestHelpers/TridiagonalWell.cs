// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// An independent finite-difference solver for a piecewise-constant profile in a closed box: the BenDaniel–Duke operator
/// −C d/dx (1/m d/dx) + V by the three-point finite-volume scheme (masses at midpoints, an interface node takes the mean
/// potential), Dirichlet walls, eigenvalues by Sturm-sequence bisection of the tridiagonal matrix and eigenvectors by
/// inverse iteration (G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., §8.4). Second-order accurate in h
/// when the interfaces lie on nodes (e.g. R. J. LeVeque, Finite Difference Methods for ODEs and PDEs, SIAM 2007, ch. 2).
/// </summary>
internal sealed class TridiagonalWell
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly double[] _diagonal;
    private readonly double[] _offDiagonal; // between node i and i + 1

    /// <param name="layers">(width nm, potential eV, mass m0) from the left wall; widths multiples of h.</param>
    /// <param name="h">Grid spacing, nm.</param>
    internal TridiagonalWell(IReadOnlyList<(double Width, double Potential, double Mass)> layers, double h)
    {
        var midMass = new List<double>();
        var midPotential = new List<double>();
        foreach (var (width, potential, mass) in layers)
        {
            var cells = (int)Math.Round(width / h);
            if (Math.Abs(cells * h - width) > 1e-9 * h)
            {
                throw new ArgumentException("layer widths must be multiples of h", nameof(h));
            }
            for (var j = 0; j < cells; j++)
            {
                midMass.Add(mass);
                midPotential.Add(potential);
            }
        }
        // Interior nodes 1 … cells − 1 (walls at 0 and cells).
        var n = midMass.Count - 1;
        H = h;
        _diagonal = new double[n];
        _offDiagonal = new double[Math.Max(0, n - 1)];
        for (var i = 0; i < n; i++)
        {
            var left = 1 / midMass[i];
            var right = 1 / midMass[i + 1];
            _diagonal[i] = C * (left + right) / (h * h) + 0.5 * (midPotential[i] + midPotential[i + 1]);
            if (i < n - 1)
            {
                _offDiagonal[i] = -C * right / (h * h);
            }
        }
    }

    internal double H { get; }

    internal int Count => _diagonal.Length;

    /// <summary>Number of eigenvalues below λ (Sturm count: negative pivots of the LDLᵀ of H − λ).</summary>
    private int CountBelow(double lambda)
    {
        var count = 0;
        var d = _diagonal[0] - lambda;
        if (d < 0)
        {
            count++;
        }
        for (var i = 1; i < _diagonal.Length; i++)
        {
            var b = _offDiagonal[i - 1];
            d = _diagonal[i] - lambda - b * b / (d == 0 ? 1e-300 : d);
            if (d < 0)
            {
                count++;
            }
        }
        return count;
    }

    /// <summary>Eigenvalue number <paramref name="index"/> (0-based) by bisection in [lo, hi].</summary>
    internal double Eigenvalue(int index, double lo, double hi)
    {
        for (var iteration = 0; iteration < 200 && hi - lo > 1e-15 * Math.Max(1, Math.Abs(hi)); iteration++)
        {
            var mid = 0.5 * (lo + hi);
            if (CountBelow(mid) > index)
            {
                hi = mid;
            }
            else
            {
                lo = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /// <summary>The eigenvector of eigenvalue λ by inverse iteration, normalised to Σ h ψ² = 1.</summary>
    internal double[] Eigenvector(double lambda) => Eigenvector(lambda + 1e-10 * Math.Max(1, Math.Abs(lambda)), 4);

    /// <summary><paramref name="iterations"/> steps of inverse iteration with <paramref name="shift"/> from <paramref name="start"/> (or a fixed vector), normalised to Σ h ψ² = 1.</summary>
    internal double[] Eigenvector(double shift, int iterations, double[]? start = null)
    {
        var n = _diagonal.Length;
        var x = new double[n];
        for (var i = 0; i < n; i++)
        {
            x[i] = start?[i] ?? 1 + 0.1 * Math.Sin(0.37 * i);
        }
        var c = new double[n];
        var y = new double[n];
        for (var iteration = 0; iteration < iterations; iteration++)
        {
            // Thomas algorithm for (H − shift) y = x.
            var denominator = _diagonal[0] - shift;
            c[0] = n > 1 ? _offDiagonal[0] / denominator : 0;
            y[0] = x[0] / denominator;
            for (var i = 1; i < n; i++)
            {
                var b = _offDiagonal[i - 1];
                denominator = _diagonal[i] - shift - b * c[i - 1];
                c[i] = i < n - 1 ? _offDiagonal[i] / denominator : 0;
                y[i] = (x[i] - b * y[i - 1]) / denominator;
            }
            for (var i = n - 2; i >= 0; i--)
            {
                y[i] -= c[i] * y[i + 1];
            }
            double norm = 0;
            foreach (var v in y)
            {
                norm += v * v;
            }
            norm = Math.Sqrt(norm * H);
            for (var i = 0; i < n; i++)
            {
                x[i] = y[i] / norm;
            }
        }
        return x;
    }

    /// <summary>
    /// The lowest <paramref name="count"/> eigenpairs in [<paramref name="lo"/>, <paramref name="hi"/>], as a tuned sparse solver
    /// would get them: bisection on Sturm counts shared by all wanted eigenvalues (each count narrows every bracket it falls in,
    /// as LAPACK's dstebz does) until each eigenvalue is isolated and its bracket is 1e-4 of its width at isolation, then inverse
    /// iteration from the bracket's middle (Golub and Van Loan, §8.4) until the residual ‖(T − ρ)x‖ of the Rayleigh quotient ρ
    /// stops falling, ρ the eigenvalue (its error is of the order of the squared residual over the gap). Vectors normalised to
    /// Σ h ψ² = 1 with a positive sum.
    /// </summary>
    internal (double[] Values, double[][] Vectors) LowestEigenpairs(int count, double lo, double hi)
    {
        var lower = new double[count];
        var upper = new double[count];
        var countLower = new int[count];
        var countUpper = new int[count];
        Array.Fill(lower, lo);
        Array.Fill(upper, hi);
        Array.Fill(countLower, CountBelow(lo));
        Array.Fill(countUpper, CountBelow(hi));
        var values = new double[count];
        var vectors = new double[count][];
        var buffer = new double[_diagonal.Length];
        void Narrow(double mid)
        {
            var below = CountBelow(mid);
            for (var j = 0; j < count; j++)
            {
                if (mid > lower[j] && mid < upper[j])
                {
                    if (below > j)
                    {
                        upper[j] = mid;
                        countUpper[j] = below;
                    }
                    else
                    {
                        lower[j] = mid;
                        countLower[j] = below;
                    }
                }
            }
        }
        for (var k = 0; k < count; k++)
        {
            // Isolated: the bracket holds eigenvalue k alone (k below its lower end, k + 1 below its upper end).
            while ((countLower[k] != k || countUpper[k] != k + 1) && upper[k] - lower[k] > 1e-15 * Math.Max(1, Math.Abs(upper[k])))
            {
                Narrow(0.5 * (lower[k] + upper[k]));
            }
            var target = 1e-4 * (upper[k] - lower[k]);
            while (upper[k] - lower[k] > Math.Max(target, 1e-15 * Math.Max(1, Math.Abs(upper[k]))))
            {
                Narrow(0.5 * (lower[k] + upper[k]));
            }
            var shift = 0.5 * (lower[k] + upper[k]);
            var x = Eigenvector(shift, 1);
            var rho = RayleighQuotient(x, buffer, out var residual);
            for (var iteration = 0; iteration < 6; iteration++)
            {
                var next = Eigenvector(shift, 1, x);
                var nextRho = RayleighQuotient(next, buffer, out var nextResidual);
                x = next;
                rho = nextRho;
                if (!(nextResidual < 0.5 * residual))
                {
                    break;
                }
                residual = nextResidual;
            }
            values[k] = rho;
            vectors[k] = x;
        }
        return (values, vectors);
    }

    /// <summary>xᵀTx/xᵀx and the residual ‖Tx − ρx‖/‖x‖ (<paramref name="y"/>: room for Tx).</summary>
    private double RayleighQuotient(double[] x, double[] y, out double residual)
    {
        var n = _diagonal.Length;
        double xx = 0, xtx = 0;
        for (var i = 0; i < n; i++)
        {
            var v = _diagonal[i] * x[i];
            if (i > 0)
            {
                v += _offDiagonal[i - 1] * x[i - 1];
            }
            if (i < n - 1)
            {
                v += _offDiagonal[i] * x[i + 1];
            }
            y[i] = v;
            xx += x[i] * x[i];
            xtx += x[i] * v;
        }
        var rho = xtx / xx;
        double r = 0;
        for (var i = 0; i < n; i++)
        {
            var d = y[i] - rho * x[i];
            r += d * d;
        }
        residual = Math.Sqrt(r / xx);
        return rho;
    }

    /// <summary>Σ h x_i ψ_a ψ_b with x_i = (i + 1)h − origin.</summary>
    internal double Dipole(double[] a, double[] b, double origin)
    {
        double sum = 0;
        for (var i = 0; i < a.Length; i++)
        {
            sum += ((i + 1) * H - origin) * a[i] * b[i];
        }
        return sum * H;
    }
}
