// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Numerics;

namespace Periodic.Transfer;

/// <summary>
/// The kernel's per-piece store of a compiled cell at one energy, for states that must be evaluated anywhere inside the
/// cell (Bloch functions): each uniform layer is one piece (closed form inside), each Magnus step of a smooth segment one
/// piece (cubic Hermite inside, the scheme's own O(h⁴) model), deltas none. It holds each piece's geometry, its step matrix
/// and the complex state (ψ, ψ′/m) at its ends once <see cref="PropagateForward"/> / <see cref="PropagateBackward"/> have
/// run; a state's real and imaginary parts propagate separately because every matrix is real. One uniform barrier may
/// be bridged: ψ inside it is interpolated between its two interface values (see <see cref="Bridge"/>).
/// </summary>
internal sealed class CellPieces
{
    private readonly CompiledCell _kernel;
    private readonly double _energy;
    private readonly double[] _matrices;

    private CellPieces(CompiledCell kernel, double energy, int count)
    {
        _kernel = kernel;
        _energy = energy;
        Starts = new double[count];
        Elements = new int[count];
        Widths = new double[count];
        S = new double[count];
        Masses = new double[count];
        MassesRight = new double[count];
        IsStep = new bool[count];
        U = new Complex[count];
        W = new Complex[count];
        URight = new Complex[count];
        WRight = new Complex[count];
        _matrices = new double[4 * count];
        BridgedIndex = -1;
    }

    internal int Count => Starts.Length;

    internal double[] Starts { get; }

    /// <summary>The kernel element each piece belongs to.</summary>
    internal int[] Elements { get; }

    internal double[] Widths { get; }

    /// <summary>Wavenumber squared s of a layer piece at the energy, 1/nm² (0 for steps).</summary>
    internal double[] S { get; }

    internal double[] Masses { get; }

    internal double[] MassesRight { get; }

    internal bool[] IsStep { get; }

    /// <summary>State at the left end of each piece.</summary>
    internal Complex[] U { get; }

    internal Complex[] W { get; }

    /// <summary>State at the right end of each step (steps only).</summary>
    internal Complex[] URight { get; }

    internal Complex[] WRight { get; }

    /// <summary>Σκw over the evanescent layers and steps: the rounding of forward propagation grows like ε·e^Opacity.</summary>
    internal double Opacity { get; private set; }

    /// <summary>κw of the thickest evanescent uniform layer (0 if none).</summary>
    internal double ThickestOpacity { get; private set; }

    /// <summary>The piece of that layer (−1 if none).</summary>
    internal int ThickestIndex { get; private set; }

    /// <summary>∫m dx over the cell = m̄d, m0·nm.</summary>
    internal double MassLength { get; private set; }

    /// <summary>The bridged layer piece, or −1.</summary>
    internal int BridgedIndex { get; private set; }

    /// <summary>ψ at the right interface of the bridged layer.</summary>
    internal Complex BridgeRight { get; private set; }

    /// <summary>The pieces of <paramref name="kernel"/> at <paramref name="energy"/>, with their step matrices and opacities.</summary>
    internal static CellPieces Create(CompiledCell kernel, double energy)
    {
        var count = 0;
        for (var el = 0; el < kernel.Count; el++)
        {
            count += kernel.IsLayer(el) ? 1 : kernel.IsDelta(el) ? 0 : kernel.Segment(el).Mesh.StepCount;
        }
        var pieces = new CellPieces(kernel, energy, count);
        double opacity = 0, thickest = 0, x = 0, massLength = 0;
        var thickIndex = -1;
        var index = 0;
        var matrices = pieces._matrices;
        for (var el = 0; el < kernel.Count; el++)
        {
            if (kernel.IsDelta(el))
            {
                continue;
            }
            if (!kernel.IsLayer(el))
            {
                var mesh = kernel.Segment(el).Mesh;
                for (var j = 0; j < mesh.StepCount; j++, index++)
                {
                    MagnusSegmentPropagator.StepMatrix(mesh, j, energy,
                        out matrices[4 * index], out matrices[4 * index + 1], out matrices[4 * index + 2], out matrices[4 * index + 3], out var zeta);
                    pieces.IsStep[index] = true;
                    pieces.Elements[index] = el;
                    (pieces.Masses[index], pieces.MassesRight[index]) = mesh.EndMasses(j);
                    pieces.Widths[index] = mesh.StepWidth(j);
                    massLength += 0.5 * (pieces.Masses[index] + pieces.MassesRight[index]) * pieces.Widths[index];
                    pieces.Starts[index] = x;
                    x += pieces.Widths[index];
                    if (zeta < 0)
                    {
                        opacity += Math.Sqrt(-zeta); // κh of the step; smooth barriers are never bridged
                    }
                }
                continue;
            }
            kernel.LayerCoefficients(el, energy, out pieces.Masses[index], out pieces.S[index]);
            pieces.Elements[index] = el;
            pieces.MassesRight[index] = pieces.Masses[index];
            pieces.Widths[index] = kernel.LayerData(el).Width;
            massLength += pieces.Masses[index] * pieces.Widths[index];
            pieces.Starts[index] = x;
            x += pieces.Widths[index];
            if (pieces.S[index] < 0)
            {
                var kw = Math.Sqrt(-pieces.S[index]) * pieces.Widths[index];
                opacity += kw;
                if (kw > thickest)
                {
                    thickest = kw;
                    thickIndex = index;
                }
            }
            index++;
        }
        pieces.Opacity = opacity;
        pieces.ThickestOpacity = thickest;
        pieces.ThickestIndex = thickIndex;
        pieces.MassLength = massLength;
        return pieces;
    }

    /// <summary>
    /// Carries (u, w) from the cell origin through every element, recording each piece's end states; with
    /// <paramref name="stopAt"/> ≥ 0 it stops at the left interface of that layer piece (recording its left state).
    /// Returns the state where it stopped (the cell's right end when it did not).
    /// </summary>
    internal (Complex U, Complex W) PropagateForward(Complex u, Complex w, int stopAt)
    {
        var index = 0;
        for (var el = 0; el < _kernel.Count; el++)
        {
            if (index == stopAt && _kernel.IsLayer(el))
            {
                U[index] = u;
                W[index] = w;
                break;
            }
            if (_kernel.IsDelta(el))
            {
                w += _kernel.DeltaJump(el) * u;
            }
            else if (_kernel.IsLayer(el))
            {
                U[index] = u;
                W[index] = w;
                (u, w) = LayerState(el, u, w, Widths[index]);
                index++;
            }
            else
            {
                for (var j = 0; j < _kernel.Segment(el).Mesh.StepCount; j++, index++)
                {
                    U[index] = u;
                    W[index] = w;
                    var at = 4 * index;
                    (u, w) = (_matrices[at] * u + _matrices[at + 1] * w, _matrices[at + 2] * u + _matrices[at + 3] * w);
                    URight[index] = u;
                    WRight[index] = w;
                }
            }
        }
        return (u, w);
    }

    /// <summary>
    /// Carries (u, w) from the cell's right end backwards (inverse matrices) down to the right interface of layer piece
    /// <paramref name="stopAt"/>, recording each piece's end states, and makes that layer the bridged one.
    /// </summary>
    internal void PropagateBackward(Complex u, Complex w, int stopAt)
    {
        var li = Count - 1;
        for (var el = _kernel.Count - 1; el >= 0; el--)
        {
            if (_kernel.IsDelta(el))
            {
                w -= _kernel.DeltaJump(el) * u;
                continue;
            }
            if (!_kernel.IsLayer(el))
            {
                for (var j = _kernel.Segment(el).Mesh.StepCount - 1; j >= 0; j--, li--)
                {
                    URight[li] = u;
                    WRight[li] = w;
                    var at = 4 * li;
                    // Unimodular: the inverse of [[m11, m12], [m21, m22]] is [[m22, −m12], [−m21, m11]].
                    (u, w) = (_matrices[at + 3] * u - _matrices[at + 1] * w, -_matrices[at + 2] * u + _matrices[at] * w);
                    U[li] = u;
                    W[li] = w;
                }
                continue;
            }
            if (li == stopAt)
            {
                Bridge(stopAt, u);
                return;
            }
            (u, w) = LayerState(el, u, w, -Widths[li]); // M(−w) = M(w)⁻¹
            U[li] = u;
            W[li] = w;
            li--;
        }
    }

    private void Bridge(int index, Complex right)
    {
        BridgedIndex = index;
        BridgeRight = right;
    }

    /// <summary>
    /// ∫|ψ|² over the cell: closed form per layer (<see cref="UniformLayerPropagator.SquareIntegrals"/>), the 4-point
    /// Gauss–Legendre rule on each step's Hermite cubic (exact: degree 6), and for the bridged layer the integrals of
    /// its two interpolating functions.
    /// </summary>
    internal double NormSquared()
    {
        var norm = 0.0;
        for (var i = 0; i < Count; i++)
        {
            if (IsStep[i])
            {
                var rule = GaussLegendre.Four;
                for (var g = 0; g < rule.Order; g++)
                {
                    var psi = Hermite(0.5 + 0.5 * rule.Nodes[g], Widths[i], U[i], W[i] * Masses[i], URight[i], WRight[i] * MassesRight[i], out _);
                    norm += 0.5 * rule.Weights[g] * Widths[i] * (psi.Real * psi.Real + psi.Imaginary * psi.Imaginary);
                }
                continue;
            }
            if (i == BridgedIndex)
            {
                var (i11, i12) = BridgeIntegrals(Math.Sqrt(-S[i]), Widths[i]);
                norm += (U[i].Magnitude * U[i].Magnitude + BridgeRight.Magnitude * BridgeRight.Magnitude) * i11 + 2 * (U[i] * Complex.Conjugate(BridgeRight)).Real * i12;
                continue;
            }
            UniformLayerPropagator.UnscaledValues(S[i], Widths[i], out var cl, out var sl);
            UniformLayerPropagator.SquareIntegrals(S[i], Widths[i], cl, sl, out var cc, out var cs, out var ss);
            var mass = Masses[i];
            norm += U[i].Magnitude * U[i].Magnitude * cc
                + 2 * mass * (U[i] * Complex.Conjugate(W[i])).Real * cs
                + mass * mass * W[i].Magnitude * W[i].Magnitude * ss;
        }
        return norm;
    }

    /// <summary>Multiplies every recorded state by <paramref name="factor"/> (normalisation and phase).</summary>
    internal void Scale(Complex factor)
    {
        for (var i = 0; i < Count; i++)
        {
            U[i] *= factor;
            W[i] *= factor;
            URight[i] *= factor;
            WRight[i] *= factor;
        }
        BridgeRight *= factor;
    }

    /// <summary>(ψ, ψ′/m) at x ∈ [0, d] from the recorded state of the piece holding x; null for a cell without pieces.</summary>
    internal (Complex Psi, Complex DerivativeOverMass)? StateAt(double x)
    {
        if (Count == 0)
        {
            return null;
        }
        int lo = 0, hi = Count - 1;
        while (lo < hi)
        {
            var mid = (lo + hi + 1) >> 1;
            if (Starts[mid] <= x)
            {
                lo = mid;
            }
            else
            {
                hi = mid - 1;
            }
        }
        var t = Math.Clamp(x - Starts[lo], 0, Widths[lo]);
        if (IsStep[lo])
        {
            // ψ′ = m·(ψ′/m) at the step ends; the mass in between is linear in x (the mesh's Gauss-node masses).
            var h = Widths[lo];
            var tau = t / h;
            var psi = Hermite(tau, h, U[lo], W[lo] * Masses[lo], URight[lo], WRight[lo] * MassesRight[lo], out var slope);
            return (psi, slope / (Masses[lo] + tau * (MassesRight[lo] - Masses[lo])));
        }
        if (lo == BridgedIndex)
        {
            // ψ = u_L·sinh(κ(w − t))/sinh(κw) + u_R·sinh(κt)/sinh(κw), in decaying exponentials.
            var kappa = Math.Sqrt(-S[lo]);
            var width = Widths[lo];
            var denominator = 1 - Math.Exp(-2 * kappa * width);
            double eLeft = Math.Exp(-kappa * t), eRight = Math.Exp(-kappa * (width - t));
            double qLeft = Math.Exp(-2 * kappa * (width - t)), qRight = Math.Exp(-2 * kappa * t);
            var g1 = eLeft * (1 - qLeft) / denominator;
            var g2 = eRight * (1 - qRight) / denominator;
            var g1Prime = -kappa * eLeft * (1 + qLeft) / denominator;
            var g2Prime = kappa * eRight * (1 + qRight) / denominator;
            var left = U[lo];
            return (left * g1 + BridgeRight * g2, (left * g1Prime + BridgeRight * g2Prime) / Masses[lo]);
        }
        return LayerState(Elements[lo], U[lo], W[lo], t);
    }

    /// <summary>
    /// The complex state carried by <paramref name="t"/> through layer <paramref name="element"/> (backwards for t &lt; 0);
    /// the layer matrix is real, so the real and imaginary parts propagate separately.
    /// </summary>
    private (Complex U, Complex W) LayerState(int element, Complex u, Complex w, double t)
    {
        var (ur, wr) = _kernel.LayerStateAt(element, _energy, u.Real, w.Real, t);
        var (ui, wi) = _kernel.LayerStateAt(element, _energy, u.Imaginary, w.Imaginary, t);
        return (new Complex(ur, ui), new Complex(wr, wi));
    }

    /// <summary>The cubic Hermite interpolant of a step (the kernel's basis, <see cref="MagnusSegmentPropagator.Hermite"/>) and its derivative dψ/dx.</summary>
    private static Complex Hermite(double tau, double h, Complex psiLeft, Complex slopeLeft, Complex psiRight, Complex slopeRight, out Complex derivative)
    {
        var b = MagnusSegmentPropagator.Hermite(tau);
        derivative = (b.D00 * psiLeft + b.D01 * psiRight) / h + b.D10 * slopeLeft + b.D11 * slopeRight;
        return b.H00 * psiLeft + b.H10 * h * slopeLeft + b.H01 * psiRight + b.H11 * h * slopeRight;
    }

    /// <summary>
    /// ∫₀^w g₁² dt (= ∫ g₂²) and ∫₀^w g₁g₂ dt for g₁ = sinh(κ(w − t))/sinh(κw), g₂ = sinh(κt)/sinh(κw), written
    /// with e^(−2κw) so that thick barriers do not overflow: coth(κw)/(2κ) − w/(2 sinh²κw) and
    /// (w cosh κw − sinh(κw)/κ)/(2 sinh²κw).
    /// </summary>
    private static (double Same, double Cross) BridgeIntegrals(double kappa, double w)
    {
        var q = Math.Exp(-2 * kappa * w);
        var coth = (1 + q) / (1 - q);
        var inverseSinhSquared = 4 * q / ((1 - q) * (1 - q));
        var inverseSinh = 2 * Math.Sqrt(q) / (1 - q);
        return (coth / (2 * kappa) - 0.5 * w * inverseSinhSquared, 0.5 * w * coth * inverseSinh - inverseSinh / (2 * kappa));
    }
}
