// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using MathNet.Numerics.LinearAlgebra;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// An independent second method for a cosine potential V(x) = V₀ + V₁cos(2πx/d) with constant mass m: the central
/// equation C(k + G)²/m·c_G + Σ V_{G−G′}c_G′ = E·c_G in the basis G = 2πn/d, |n| ≤ N (N. W. Ashcroft and
/// N. D. Mermin, Solid State Physics, ch. 9), solved by MathNet's symmetric eigensolver. Written here in the tests,
/// so it shares no code with the library's transfer matrices or its own plane-wave solver.
/// The Bloch function is ψ(x) = Σ c_G e^{i(k+G)x}/√d, normalised over one cell when Σ|c_G|² = 1.
/// </summary>
internal sealed class PlaneWaveReference
{
    private readonly double _period;
    private readonly double _k;
    private readonly int _cutoff;
    private readonly double _mass;
    private readonly Matrix<double> _vectors;

    private PlaneWaveReference(double period, double mass, double k, int cutoff, double[] energies, Matrix<double> vectors)
    {
        _period = period;
        _mass = mass;
        _k = k;
        _cutoff = cutoff;
        Energies = energies;
        _vectors = vectors;
    }

    /// <summary>Ascending energies in eV.</summary>
    internal double[] Energies { get; }

    internal static PlaneWaveReference Solve(double period, double mass, double constant, double cosine, double k, int cutoff)
    {
        var size = 2 * cutoff + 1;
        var h = Matrix<double>.Build.Dense(size, size);
        for (var i = 0; i < size; i++)
        {
            var q = k + 2 * Math.PI * (i - cutoff) / period;
            h[i, i] = Cells.C * q * q / mass + constant;
            if (i + 1 < size)
            {
                h[i, i + 1] = 0.5 * cosine; // V₁cos = (V₁/2)(e^{iGx} + e^{−iGx})
                h[i + 1, i] = 0.5 * cosine;
            }
        }
        var evd = h.Evd(Symmetricity.Symmetric);
        var energies = evd.EigenValues.Select(e => e.Real).ToArray(); // MathNet returns them ascending for symmetric input
        return new PlaneWaveReference(period, mass, k, cutoff, energies, evd.EigenVectors);
    }

    /// <summary>
    /// d²E_n/dk² in eV·nm² from second-order perturbation theory in k (the k·p form of the effective mass; e.g. P. Y. Yu
    /// and M. Cardona, Fundamentals of Semiconductors, §2.6, from memory): E″ = 2C/m + 2Σ_{n′≠n}|⟨n|∂H/∂k|n′⟩|²/(E_n − E_n′)
    /// with ∂H/∂k = diag(2C(k + G)/m). Exact for the truncated central equation, with no finite-difference step.
    /// </summary>
    internal double Curvature(int bandIndex)
    {
        var n = bandIndex - 1;
        var size = 2 * _cutoff + 1;
        var sum = 0.0;
        for (var other = 0; other < size; other++)
        {
            if (other == n)
            {
                continue;
            }
            var element = 0.0;
            for (var i = 0; i < size; i++)
            {
                var q = _k + 2 * Math.PI * (i - _cutoff) / _period;
                element += _vectors[i, n] * _vectors[i, other] * 2 * Cells.C * q / _mass;
            }
            sum += element * element / (Energies[n] - Energies[other]);
        }
        return 2 * Cells.C / _mass + 2 * sum;
    }

    /// <summary>ψ_n(x) in nm^(−1/2), phase arbitrary (the caller aligns it).</summary>
    internal Complex Psi(int bandIndex, double x)
    {
        Complex sum = 0;
        for (var i = 0; i <= 2 * _cutoff; i++)
        {
            var q = _k + 2 * Math.PI * (i - _cutoff) / _period;
            sum += _vectors[i, bandIndex - 1] * Complex.FromPolarCoordinates(1, q * x);
        }
        return sum / Math.Sqrt(_period);
    }
}
