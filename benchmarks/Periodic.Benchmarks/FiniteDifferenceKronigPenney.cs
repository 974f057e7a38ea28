// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.LinearAlgebra;

namespace Periodic.Benchmarks;

/// <summary>
/// The second baseline: the Kronig–Penney cell on a uniform grid, −C(ψ′/m)′ + Vψ = Eψ by the
/// three-point flux-conserving difference (masses at half points, the arithmetic mean of the two masses
/// on an interface), with periodic (k = 0) and antiperiodic (k = π/d) wrap-around, each matrix
/// diagonalised densely with MathNet.Numerics. The union of both spectra, sorted, is the list of band
/// edges (interlacing of periodic and antiperiodic eigenvalues; Magnus and Winkler, Hill's Equation,
/// 1966). Error O(h²).
/// </summary>
internal static class FiniteDifferenceKronigPenney
{
    private const double C = Periodic.Units.PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>The lowest <paramref name="edgeCount"/> band edges with <paramref name="pointsPerNanometre"/> grid points per nm.</summary>
    internal static double[] Edges(int pointsPerNanometre, int edgeCount)
    {
        var a = Scenarios.WellNanometres;
        var b = Scenarios.BarrierNanometres;
        var n = (int)Math.Round((a + b) * pointsPerNanometre);
        var wellPoints = (int)Math.Round(a * pointsPerNanometre);
        var h = (a + b) / n;
        var edges = new List<double>();
        foreach (var sign in new[] { 1.0, -1.0 })
        {
            var matrix = Matrix<double>.Build.Dense(n, n);
            for (var i = 0; i < n; i++)
            {
                // Node i sits at (i + ½)h: in the well for i < wellPoints.
                var inWell = i < wellPoints;
                var v = inWell ? 0 : Scenarios.BarrierElectronVolts;
                var right = HalfPointMass(i, wellPoints, n);
                var left = HalfPointMass(i - 1, wellPoints, n);
                var t = C / (h * h);
                matrix[i, i] = v + t * (1 / left + 1 / right);
                var j = i + 1;
                var wrap = 1.0;
                if (j == n)
                {
                    j = 0;
                    wrap = sign;
                }
                matrix[i, j] += -t / right * wrap;
                matrix[j, i] += -t / right * wrap;
            }
            var evd = matrix.Evd(Symmetricity.Symmetric);
            foreach (var value in evd.EigenValues)
            {
                edges.Add(value.Real);
            }
        }
        edges.Sort();
        return edges.Take(edgeCount).ToArray();
    }

    /// <summary>Mass on the half point between nodes i and i + 1 (periodic).</summary>
    private static double HalfPointMass(int i, int wellPoints, int n)
    {
        i = ((i % n) + n) % n;
        var leftInWell = i < wellPoints;
        var rightInWell = (i + 1) % n < wellPoints;
        if (leftInWell == rightInWell)
        {
            return leftInWell ? Scenarios.WellMass : Scenarios.BarrierMass;
        }
        return 0.5 * (Scenarios.WellMass + Scenarios.BarrierMass);
    }
}
