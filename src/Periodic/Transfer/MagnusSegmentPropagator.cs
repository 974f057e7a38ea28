// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;
using Periodic.Numerics;

namespace Periodic.Transfer;

/// <summary>
/// Fourth-order Magnus propagation through a smooth segment (A. Iserles and S. P. Nørsett, Phil. Trans.
/// R. Soc. A 357, 983 (1999); S. Blanes, F. Casas and J. Ros, BIT 40, 434 (2000)): per step,
/// M = exp(Ω) with the traceless Ω = [[α, β], [γ, −α]] of <see cref="SegmentMesh"/>.
/// </summary>
/// <remarks>
/// <para>Closed form: Ω² = −ζ·I with ζ = −(α² + βγ), so exp(Ω) = cos√ζ·I + (sin√ζ/√ζ)·Ω, evaluated by
/// <see cref="UniformLayerPropagator.EvaluateShortStep"/> with s = ζ and unit width (series near ζ = 0, division by
/// e^√(−ζ) for evanescent steps so deep barriers never overflow). Since Ω is linear in E, the exact
/// energy derivative of each step is dM/dE = ζ′(∂c/∂ζ·I + ∂S/∂ζ·Ω) + S·Ω′ with ζ′ = 2αα₁ + βγ₁.</para>
/// <para>Zero count: the step is the exact solution over the step of the constant-coefficient system
/// y′ = (Ω/h)y, whose ψ-component is u(t) = u₀ cos(θt) + (αu₀ + βw₀)/θ · sin(θt), θ = √ζ; its zeros in
/// (0, 1] are counted in closed form, so the Prüfer count is exact for the discretised problem at any step
/// size. The scheme is time-symmetric: its error expands in even powers h⁴, h⁶, …, which
/// Richardson extrapolation in the refinement driver relies on.</para>
/// </remarks>
internal sealed class MagnusSegmentPropagator
{
    private readonly double[] _alpha0;
    private readonly double[] _alpha1;
    private readonly double[] _beta;
    private readonly double[] _gamma0;
    private readonly double[] _gamma1;

    internal MagnusSegmentPropagator(SegmentMesh mesh)
    {
        Mesh = mesh;
        _alpha0 = mesh.Alpha0;
        _alpha1 = mesh.Alpha1;
        _beta = mesh.Beta;
        _gamma0 = mesh.Gamma0;
        _gamma1 = mesh.Gamma1;
    }

    /// <summary>The step coefficients.</summary>
    internal SegmentMesh Mesh { get; }

    /// <summary>Applies the segment's scaled matrix and energy derivative to the running product.</summary>
    internal void Propagate(double energyElectronVolts, ref ScaledProduct product)
    {
        for (var j = 0; j < _beta.Length; j++)
        {
            Step(j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22,
                out var d11, out var d12, out var d21, out var d22, out var logScale, out _, out _, out _);
            product.ApplyLeft(m11, m12, m21, m22, d11, d12, d21, d22, logScale);
        }
    }

    /// <summary>As <see cref="Propagate"/>, and also propagates the state (u, w) = (ψ, ψ′/m), returning the number of zeros of ψ inside the segment (its far end included).</summary>
    internal int PropagateCounting(double energyElectronVolts, ref double u, ref double w, ref ScaledProduct product)
    {
        var zeros = 0;
        for (var j = 0; j < _beta.Length; j++)
        {
            Step(j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22,
                out var d11, out var d12, out var d21, out var d22, out var logScale, out var zeta, out var alpha, out var beta);
            var u1 = m11 * u + m12 * w;
            var w1 = m21 * u + m22 * w;
            zeros += StepZeros(u, w, u1, zeta, alpha, beta);
            u = u1;
            w = w1;
            double ignored = 0;
            ScaledProduct.Renormalise(ref u, ref w, ref ignored);
            product.ApplyLeft(m11, m12, m21, m22, d11, d12, d21, d22, logScale);
        }
        return zeros;
    }

    /// <summary>Zeros of ψ inside one step (its far end included), from the states at its two ends.</summary>
    private static int StepZeros(double u, double w, double u1, double zeta, double alpha, double beta)
    {
        if (zeta < Math.PI * Math.PI)
        {
            // θ < π (or no oscillation): at most one zero in (0, 1], present exactly when u changes sign or lands on zero.
            return u != 0 && (u1 == 0 || (u1 < 0) != (u < 0)) ? 1 : 0;
        }
        return CountOscillatingZeros(u, w, u1, alpha, beta, Math.Sqrt(zeta));
    }

    /// <summary>
    /// Propagates the state (u, w)·e^log through the segment, forwards (returning the zeros of ψ inside, its far end
    /// included) or backwards (with the inverse step matrices [[m22, −m12], [−m21, m11]]; returns 0).
    /// </summary>
    internal int PropagateState(double energyElectronVolts, ref double u, ref double w, ref double log, bool forward)
    {
        var zeros = 0;
        var n = _beta.Length;
        for (var k = 0; k < n; k++)
        {
            var j = forward ? k : n - 1 - k;
            StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out var zeta);
            if (forward)
            {
                var u1 = m11 * u + m12 * w;
                zeros += StepZeros(u, w, u1, zeta, _alpha0[j] - _alpha1[j] * energyElectronVolts, _beta[j]);
                (u, w) = (u1, m21 * u + m22 * w);
            }
            else
            {
                (u, w) = (m22 * u - m12 * w, -m21 * u + m11 * w);
            }
            ScaledProduct.Renormalise(ref u, ref w, ref log);
        }
        return zeros;
    }

    /// <summary>
    /// Propagates the unscaled state (u, w) through the segment and returns ∫ψ², ∫xψ² and ∫ψ⁴ over it (x from
    /// <paramref name="start"/> at the segment's left end), with ψ inside each step the cubic Hermite interpolant of its end
    /// values (the 8-point Gauss–Legendre rule is exact for its fourth power).
    /// </summary>
    internal ElementMoments PropagateWithMoments(double energyElectronVolts, ref double u, ref double w, double start)
    {
        var rule = GaussLegendre.Eight;
        double norm = 0, first = 0, quartic = 0, x = start;
        for (var j = 0; j < _beta.Length; j++)
        {
            StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
            var h = Mesh.StepWidth(j);
            var (mLeft, mRight) = Mesh.EndMasses(j);
            double u1 = m11 * u + m12 * w, w1 = m21 * u + m22 * w;
            for (var g = 0; g < rule.Order; g++)
            {
                var tau = 0.5 + 0.5 * rule.Nodes[g];
                var psi = Interpolate(h, mLeft, mRight, tau, u, w, u1, w1);
                var weight = 0.5 * h * rule.Weights[g];
                var square = psi * psi;
                norm += weight * square;
                first += weight * (x + tau * h) * square;
                quartic += weight * square * square;
            }
            (u, w) = (u1, w1);
            x += h;
        }
        return new ElementMoments(norm, first, quartic);
    }

    /// <summary>
    /// ψ at offset <paramref name="t"/> inside the segment, divided by e^logScale: for t ≥ +0 from the state (u, w) at its left
    /// end, stepped forwards to the step that holds x = t; for t ≤ −0 (negative zero included: the right end itself) from the state at its right end, stepped backwards to the
    /// step that holds x = width + t. Inside the step ψ is the cubic Hermite interpolant of the step's end values, the scheme's
    /// own O(h⁴) model (as in <see cref="PropagateWithMoments"/>); at a step boundary it is the propagated value itself.
    /// </summary>
    internal double ScaledValue(double energyElectronVolts, double u, double w, double t, out double logScale)
    {
        var n = _beta.Length;
        double log = 0;
        if (!double.IsNegative(t))
        {
            double x = 0;
            for (var j = 0; j < n; j++)
            {
                var h = Mesh.StepWidth(j);
                StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
                double u1 = m11 * u + m12 * w, w1 = m21 * u + m22 * w;
                if (x + h >= t || j == n - 1)
                {
                    logScale = log;
                    return Interpolate(j, Math.Clamp((t - x) / h, 0, 1), u, w, u1, w1);
                }
                (u, w) = (u1, w1);
                x += h;
                ScaledProduct.Renormalise(ref u, ref w, ref log);
            }
        }
        else
        {
            // Distance from the right end, stepping leftwards: step j spans [−(distance + h), −distance] from that end.
            double distance = 0;
            for (var j = n - 1; j >= 0; j--)
            {
                var h = Mesh.StepWidth(j);
                StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
                double u0 = m22 * u - m12 * w, w0 = -m21 * u + m11 * w;
                if (distance + h >= -t || j == 0)
                {
                    logScale = log;
                    return Interpolate(j, Math.Clamp(1 - (-t - distance) / h, 0, 1), u0, w0, u, w);
                }
                (u, w) = (u0, w0);
                distance += h;
                ScaledProduct.Renormalise(ref u, ref w, ref log);
            }
        }
        logScale = log;
        return u;
    }

    /// <summary>
    /// ln ∫ψ² over the segment for the state (u, w) given at its left end (<paramref name="fromLeft"/>) or its right end, each
    /// step integrated by the 8-point Gauss–Legendre rule on the cubic Hermite interpolant of its end values (as
    /// <see cref="PropagateWithMoments"/>), stepping away from the given end with renormalisation so that nothing overflows.
    /// </summary>
    internal double LogSquareIntegral(double energyElectronVolts, double u, double w, bool fromLeft)
    {
        var rule = GaussLegendre.Eight;
        var n = _beta.Length;
        double log = 0, sum = 0; // sum in units of e^(2·log)
        for (var k = 0; k < n; k++)
        {
            var j = fromLeft ? k : n - 1 - k;
            StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
            double u0, w0, u1, w1;
            if (fromLeft)
            {
                (u0, w0, u1, w1) = (u, w, m11 * u + m12 * w, m21 * u + m22 * w);
                (u, w) = (u1, w1);
            }
            else
            {
                (u0, w0, u1, w1) = (m22 * u - m12 * w, -m21 * u + m11 * w, u, w);
                (u, w) = (u0, w0);
            }
            var h = Mesh.StepWidth(j);
            for (var g = 0; g < rule.Order; g++)
            {
                var psi = Interpolate(j, 0.5 + 0.5 * rule.Nodes[g], u0, w0, u1, w1);
                sum += 0.5 * h * rule.Weights[g] * psi * psi;
            }
            var before = log;
            ScaledProduct.Renormalise(ref u, ref w, ref log);
            if (log != before)
            {
                sum *= Math.Exp(-2 * (log - before));
            }
        }
        return sum > 0 ? Math.Log(sum) + 2 * log : double.NegativeInfinity;
    }

    /// <summary>The mass averaged over the segment, m₀ (the mean of its Gauss-node masses, weighted by step width).</summary>
    internal double MeanMass
    {
        get
        {
            double beta = 0, width = 0;
            for (var j = 0; j < _beta.Length; j++)
            {
                beta += _beta[j];
                width += Mesh.StepWidth(j);
            }
            return beta / width; // β = h(m₁ + m₂)/2
        }
    }

    /// <summary>The lowest and highest step-mean potential of the segment, eV (γ₀ = h(V₁ + V₂)/(2C)).</summary>
    internal (double Minimum, double Maximum) PotentialRange
    {
        get
        {
            double low = double.PositiveInfinity, high = double.NegativeInfinity;
            for (var j = 0; j < _beta.Length; j++)
            {
                var v = _gamma0[j] / _gamma1[j]; // γ₁ = h/C
                low = Math.Min(low, v);
                high = Math.Max(high, v);
            }
            return (low, high);
        }
    }

    /// <summary>
    /// The state with end values <paramref name="ends"/> at every step boundary (Count + 1 values of ψ and ψ′/m, unscaled),
    /// propagated from the end where it is smaller towards the end where it is larger: in its growing direction, where
    /// propagation keeps its relative accuracy.
    /// </summary>
    internal void StepStates(double energyElectronVolts, in ElementEnds ends, Span<double> u, Span<double> w)
    {
        var n = _beta.Length;
        var scale = MeanMass; // compare ψ with m·ψ′/m·(1 nm)
        var forward = Math.Max(Math.Abs(ends.U0), scale * Math.Abs(ends.W0)) <= Math.Max(Math.Abs(ends.U1), scale * Math.Abs(ends.W1));
        if (forward)
        {
            (u[0], w[0]) = (ends.U0, ends.W0);
            for (var j = 0; j < n; j++)
            {
                StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
                (u[j + 1], w[j + 1]) = (m11 * u[j] + m12 * w[j], m21 * u[j] + m22 * w[j]);
            }
        }
        else
        {
            (u[n], w[n]) = (ends.U1, ends.W1);
            for (var j = n - 1; j >= 0; j--)
            {
                StepMatrix(Mesh, j, energyElectronVolts, out var m11, out var m12, out var m21, out var m22, out _);
                (u[j], w[j]) = (m22 * u[j + 1] - m12 * w[j + 1], -m21 * u[j + 1] + m11 * w[j + 1]);
            }
        }
    }

    /// <summary>
    /// ∫ψ_aψ_b, ∫yψ_aψ_b (y from the segment's left end) and ∫ψ_aψ_b′ over the segment for state a of
    /// <paramref name="segmentA"/> and state b of this segment (two segments with the same steps), each given by its end values:
    /// per step the cubic Hermite interpolants of the step-boundary states (<see cref="StepStates"/>), the scheme's own O(h⁴)
    /// model, integrated by the 8-point Gauss–Legendre rule, exact for these polynomials of degree at most 7.
    /// </summary>
    internal PairMoments PairIntegrals(MagnusSegmentPropagator segmentA, double ea, in ElementEnds a, double eb, in ElementEnds b)
    {
        var n = _beta.Length;
        var ua = new double[n + 1];
        var wa = new double[n + 1];
        var ub = new double[n + 1];
        var wb = new double[n + 1];
        segmentA.StepStates(ea, a, ua, wa);
        StepStates(eb, b, ub, wb);
        var rule = GaussLegendre.Eight;
        double overlap = 0, moment = 0, momentum = 0, x = 0;
        for (var j = 0; j < n; j++)
        {
            var h = Mesh.StepWidth(j);
            var (mLeft, mRight) = Mesh.EndMasses(j);
            for (var g = 0; g < rule.Order; g++)
            {
                var tau = 0.5 + 0.5 * rule.Nodes[g];
                var basis = Hermite(tau);
                var psiA = segmentA.Interpolate(j, tau, ua[j], wa[j], ua[j + 1], wa[j + 1]);
                var psiB = Interpolate(j, tau, ub[j], wb[j], ub[j + 1], wb[j + 1]);
                var slopeB = (basis.D00 * ub[j] + basis.D01 * ub[j + 1]) / h + basis.D10 * (wb[j] * mLeft) + basis.D11 * (wb[j + 1] * mRight);
                var weight = 0.5 * h * rule.Weights[g];
                overlap += weight * psiA * psiB;
                moment += weight * (x + tau * h) * psiA * psiB;
                momentum += weight * psiA * slopeB;
            }
            x += h;
        }
        return new PairMoments(overlap, moment, momentum);
    }

    /// <summary>
    /// ∫F² over the segment, F(y) = <paramref name="start"/> + ∫₀^y ψ_aψ_b, for two states of this segment: on each step the
    /// Hermite interpolants (as <see cref="PairIntegrals"/>), the inner integral by the 8-point rule on [0, y] and the outer on the
    /// step, both exact for these polynomials (F has degree 7 in a step).
    /// </summary>
    internal double CumulativeSquare(double ea, in ElementEnds a, double eb, in ElementEnds b, double start)
    {
        var n = _beta.Length;
        var ua = new double[n + 1];
        var wa = new double[n + 1];
        var ub = new double[n + 1];
        var wb = new double[n + 1];
        StepStates(ea, a, ua, wa);
        StepStates(eb, b, ub, wb);
        var rule = GaussLegendre.Eight;
        double sum = 0, f = start;
        for (var j = 0; j < n; j++)
        {
            var h = Mesh.StepWidth(j);
            double Product(double tau) =>
                Interpolate(j, tau, ua[j], wa[j], ua[j + 1], wa[j + 1]) * Interpolate(j, tau, ub[j], wb[j], ub[j + 1], wb[j + 1]);
            for (var g = 0; g < rule.Order; g++)
            {
                var tau = 0.5 + 0.5 * rule.Nodes[g];
                double inner = 0;
                for (var r = 0; r < rule.Order; r++)
                {
                    inner += 0.5 * tau * h * rule.Weights[r] * Product(0.5 * tau * (1 + rule.Nodes[r]));
                }
                var value = f + inner;
                sum += 0.5 * h * rule.Weights[g] * value * value;
            }
            for (var r = 0; r < rule.Order; r++)
            {
                f += 0.5 * h * rule.Weights[r] * Product(0.5 + 0.5 * rule.Nodes[r]);
            }
        }
        return sum;
    }

    /// <summary>ψ at τ ∈ [0, 1] of step <paramref name="j"/> from its end states (ψ, ψ′/m): the cubic Hermite interpolant.</summary>
    private double Interpolate(int j, double tau, double u0, double w0, double u1, double w1)
    {
        var (mLeft, mRight) = Mesh.EndMasses(j);
        return Interpolate(Mesh.StepWidth(j), mLeft, mRight, tau, u0, w0, u1, w1);
    }

    /// <summary>
    /// ψ at τ ∈ [0, 1] of a step of width <paramref name="h"/> with end masses <paramref name="mLeft"/>, <paramref name="mRight"/>
    /// (<see cref="SegmentMesh.EndMasses"/>) from its end states (ψ, ψ′/m): the cubic Hermite interpolant.
    /// </summary>
    private static double Interpolate(double h, double mLeft, double mRight, double tau, double u0, double w0, double u1, double w1)
    {
        var basis = Hermite(tau);
        return basis.H00 * u0 + basis.H10 * h * (w0 * mLeft) + basis.H01 * u1 + basis.H11 * h * (w1 * mRight);
    }

    /// <summary>
    /// The cubic Hermite basis at τ ∈ [0, 1] (C. de Boor, A Practical Guide to Splines, ch. 4): ψ(τ) = h00·ψ₀ + h10·h·ψ′₀ +
    /// h01·ψ₁ + h11·h·ψ′₁ for a step of width h, and dψ/dx = (d00·ψ₀ + d01·ψ₁)/h + d10·ψ′₀ + d11·ψ′₁. Its error is
    /// h⁴·max|ψ⁗|/384, the order of the Magnus scheme itself.
    /// </summary>
    internal static HermiteWeights Hermite(double tau)
    {
        var t2 = tau * tau;
        var t3 = t2 * tau;
        return new HermiteWeights(2 * t3 - 3 * t2 + 1, t3 - 2 * t2 + tau, -2 * t3 + 3 * t2, t3 - t2,
            6 * t2 - 6 * tau, 3 * t2 - 4 * tau + 1, -6 * t2 + 6 * tau, 3 * t2 - 2 * tau);
    }

    /// <summary>
    /// Zeros of u(t) = A·sin(θt + φ₀) for t in (0, 1]: the multiples nπ in (φ₀, φ₀ + θ]. The end phase
    /// is made consistent with the sign of the propagated u₁ so rounding cannot gain or lose a zero.
    /// </summary>
    private static int CountOscillatingZeros(double u0, double w0, double u1, double alpha, double beta, double theta)
    {
        var v0 = (alpha * u0 + beta * w0) / theta;
        // Index of the last multiple of π at or below φ₀ (φ₀ ∈ (−π, π]); a zero at t = 0 is not counted here.
        var k0 = u0 > 0 ? 0 : u0 < 0 ? -1 : v0 > 0 ? 0 : 1;
        var phi0 = u0 == 0 ? (v0 > 0 ? 0.0 : Math.PI) : Math.Atan2(u0, v0);
        var turns = (phi0 + theta) / Math.PI;
        double k1;
        if (u1 == 0)
        {
            k1 = Math.Round(turns);
        }
        else
        {
            k1 = Math.Floor(turns);
            // sin(φ) > 0 on (2jπ, (2j+1)π): even k1 means u1 > 0.
            var evenK = Math.IEEERemainder(k1, 2) == 0;
            if (evenK != (u1 > 0))
            {
                k1 += turns - k1 < 0.5 ? -1 : 1;
            }
        }
        return (int)k1 - k0;
    }

    /// <summary>
    /// The unscaled matrix exp Ω of step <paramref name="j"/> of <paramref name="mesh"/> at energy <paramref name="e"/>
    /// (for state propagation, e.g. Bloch functions) and ζ = −(α² + βγ): √(−ζ) is the step's decay exponent κh where ζ &lt; 0.
    /// </summary>
    internal static void StepMatrix(SegmentMesh mesh, int j, double e, out double m11, out double m12, out double m21, out double m22, out double zeta)
    {
        var alpha = mesh.Alpha0[j] - mesh.Alpha1[j] * e;
        var beta = mesh.Beta[j];
        var gamma = mesh.Gamma0[j] - mesh.Gamma1[j] * e;
        zeta = -(alpha * alpha + beta * gamma);
        UniformLayerPropagator.UnscaledValues(zeta, 1.0, out var c, out var s);
        m11 = c + s * alpha;
        m22 = c - s * alpha;
        m12 = s * beta;
        m21 = s * gamma;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void Step(int j, double e, out double m11, out double m12, out double m21, out double m22,
        out double d11, out double d12, out double d21, out double d22, out double logScale, out double zeta, out double alpha, out double beta)
    {
        var a1 = _alpha1[j];
        var g1 = _gamma1[j];
        alpha = _alpha0[j] - a1 * e;
        beta = _beta[j];
        var gamma = _gamma0[j] - g1 * e;
        zeta = -(alpha * alpha + beta * gamma);
        var dzeta = 2 * alpha * a1 + beta * g1;
        UniformLayerPropagator.EvaluateShortStep(zeta, 1.0, out var c, out var s, out var dcdz, out var dsdz, out logScale);
        m11 = c + s * alpha;
        m22 = c - s * alpha;
        m12 = s * beta;
        m21 = s * gamma;
        var dc = dzeta * dcdz;
        var ds = dzeta * dsdz;
        d11 = dc + ds * alpha - s * a1;
        d22 = dc - ds * alpha + s * a1;
        d12 = ds * beta;
        d21 = ds * gamma - s * g1;
    }
}

/// <summary>Values (H..) and derivatives (D..) of the four cubic Hermite basis functions at one point of [0, 1].</summary>
internal readonly record struct HermiteWeights(double H00, double H10, double H01, double H11, double D00, double D10, double D01, double D11);
