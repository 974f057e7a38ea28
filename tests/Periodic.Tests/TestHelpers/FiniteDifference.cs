// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.LinearAlgebra;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// An independent eigenvalue solver for one period: the BenDaniel–Duke operator −C d/dx (1/m d/dx) + V
/// discretised by the standard three-point finite-volume scheme (nodes at x_i = i·h, masses at the
/// midpoints x_{i+½}, node potential the average over its control volume [x_i − h/2, x_i + h/2], a delta
/// at a node adds S/h), with periodic (k = 0) or antiperiodic (k = π/d) wrap-around, diagonalised by
/// MathNet's dense symmetric eigenvalue decomposition. Second-order accurate in h (e.g. R. J. LeVeque,
/// Finite Difference Methods for ODEs and PDEs, SIAM 2007, ch. 2).
/// </summary>
internal static class FiniteDifference
{
    /// <param name="elements">The cell; every layer width must be an integer multiple of <paramref name="h"/>.</param>
    /// <param name="h">Grid spacing, nm.</param>
    /// <param name="antiperiodic">False: ψ(x + d) = ψ(x); true: ψ(x + d) = −ψ(x).</param>
    internal static double[] Eigenvalues(IReadOnlyList<ElementSpec> elements, double h, bool antiperiodic)
    {
        // Midpoint masses and half-cell potentials, cell by cell.
        var midMass = new List<double>();
        var midPotential = new List<double>();
        var nodeDelta = new List<double>();
        var pendingDelta = 0.0;
        foreach (var element in elements)
        {
            if (element.IsDelta)
            {
                pendingDelta += element.StrengthElectronVoltNanometres;
                continue;
            }
            var cells = (int)Math.Round(element.WidthNanometres / h);
            if (Math.Abs(cells * h - element.WidthNanometres) > 1e-9 * h)
            {
                throw new ArgumentException("layer widths must be multiples of h", nameof(h));
            }
            for (var j = 0; j < cells; j++)
            {
                midMass.Add(element.MassElectronMasses);
                midPotential.Add(element.PotentialElectronVolts);
                nodeDelta.Add(j == 0 ? pendingDelta : 0);
            }
            pendingDelta = 0;
        }
        // A delta after the last layer sits at x = d, i.e. at node 0 of the next period.
        nodeDelta[0] += pendingDelta;
        var n = midMass.Count;
        var c = ClosedForms.C / (h * h);
        var matrix = Matrix<double>.Build.Dense(n, n);
        for (var i = 0; i < n; i++)
        {
            var left = (i - 1 + n) % n; // midpoint i − ½ is interval i − 1
            var potential = 0.5 * (midPotential[left] + midPotential[i]) + nodeDelta[i] / h;
            matrix[i, i] = potential + c * (1 / midMass[left] + 1 / midMass[i]);
            var next = (i + 1) % n;
            var coupling = -c / midMass[i];
            if (next == 0 && antiperiodic)
            {
                coupling = -coupling;
            }
            matrix[i, next] += coupling;
            matrix[next, i] += coupling;
        }
        var values = matrix.Evd(Symmetricity.Symmetric).EigenValues.Select(z => z.Real).ToArray();
        Array.Sort(values);
        return values;
    }
}
