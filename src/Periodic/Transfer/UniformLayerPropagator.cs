// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;

namespace Periodic.Transfer;

/// <summary>
/// The one home of the closed-form propagation through a region of constant coefficients, written in s = k² (1/nm²;
/// negative under a barrier) so that one formula covers oscillating, linear and evanescent solutions without a branch
/// cut at s = 0: c = cos(√s·w), S = sin(√s·w)/√s (cosh and sinh(κw)/κ for s = −κ² &lt; 0), with ∂c/∂s = −w·S/2 and
/// ∂S/∂s = (w·c − S)/(2s); the layer matrix in the (ψ, ψ′/m) basis is [[c, m·S], [−(s/m)·S, c]]. Also the integrals
/// of c², c·S and S² over the layer, for norms and moments of states.
/// </summary>
/// <remarks>
/// For |s·w²| &lt; 1 the functions come from their Taylor series in z = s·w², which avoids the cancellation in (w·c − S)
/// near s = 0 (truncation below 1e-18 relative with the <see cref="ValueSeriesTerms"/> used for values alone, 1e-25 for
/// the derivative-carrying forms). For evanescent regions the values are returned divided by e^(κw) (the growing
/// exponential) where κw is large, and the exponent κw is returned in <c>logScale</c>, so that no barrier overflows.
/// The SIMD lanes of <see cref="TraceKernel"/> repeat <see cref="Values"/> on vectors for speed (TraceKernelTest pins them).
/// </remarks>
internal static class UniformLayerPropagator
{
    /// <summary>Series terms for the values alone: the first omitted term of c is below 1/20! ≈ 4e-19.</summary>
    internal const int ValueSeriesTerms = 9;

    /// <summary>Series terms when first derivatives are carried (∂S/∂s loses a factor j per term).</summary>
    private const int DerivativeSeriesTerms = 13;

    /// <summary>Series terms for the third-order Taylor coefficients.</summary>
    private const int TaylorSeriesTerms = 18;

    /// <summary>Below κw = 20 a barrier's cosh and sinh are formed directly by <see cref="Values"/> (≤ e^20 ≈ 5e8, far
    /// inside the renormalisation headroom); thicker barriers use the scaled form and the log scale.</summary>
    internal const double DirectBarrierLimit = 20;

    /// <summary>cSeries[j] = (−1)^j/(2j)!: c = Σ CSeries[j] z^j.</summary>
    internal static readonly double[] CSeries = BuildSeries(0, TaylorSeriesTerms);

    /// <summary>sSeries[j] = (−1)^j/(2j + 1)!: S/w = Σ SSeries[j] z^j.</summary>
    internal static readonly double[] SSeries = BuildSeries(1, TaylorSeriesTerms);

    /// <summary>Taylor coefficients in z = s·w²: (−1)^j/(2j + offset)! for j = 0 … terms (offset 0: c, 1: S/w).</summary>
    private static double[] BuildSeries(int offset, int terms)
    {
        var coefficients = new double[terms + 1];
        double factorial = 1;
        for (var n = 1; n <= offset; n++)
        {
            factorial *= n;
        }
        for (var j = 0; j <= terms; j++)
        {
            coefficients[j] = (j % 2 == 0 ? 1.0 : -1.0) / factorial;
            var next = 2 * j + offset;
            factorial *= (next + 1) * (double)(next + 2);
        }
        return coefficients;
    }

    /// <summary>
    /// c and S for wavenumber squared <paramref name="s"/> over <paramref name="width"/>, divided by e^logScale: logScale is
    /// κw for barriers with κw ≥ <see cref="DirectBarrierLimit"/> and 0 otherwise. The cheapest form, for traces and states.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Values(double s, double width, out double c, out double sinc, out double logScale)
    {
        var z = s * width * width;
        logScale = 0;
        if (Math.Abs(z) < 1)
        {
            double cSum = CSeries[ValueSeriesTerms], sSum = SSeries[ValueSeriesTerms];
            for (var j = ValueSeriesTerms - 1; j >= 0; j--)
            {
                cSum = cSum * z + CSeries[j];
                sSum = sSum * z + SSeries[j];
            }
            c = cSum;
            sinc = sSum * width;
        }
        else if (s > 0)
        {
            var k = Math.Sqrt(s);
            var (sin, cos) = Math.SinCos(k * width);
            c = cos;
            sinc = sin / k;
        }
        else
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width; // |θ| ≥ 1 here; a negative width (propagating backwards) takes the direct form
            if (theta < DirectBarrierLimit)
            {
                var grow = Math.Exp(theta);
                var decay = 1 / grow;
                c = 0.5 * (grow + decay);
                sinc = 0.5 * (grow - decay) / kappa; // no cancellation for θ ≥ 1 (loses at most a factor 1.3)
            }
            else
            {
                // Scaled by e^(−κw): cosh → (1 + e^(−2κw))/2, sinh → (1 − e^(−2κw))/2.
                var q = Math.Exp(-2 * theta);
                c = 0.5 * (1 + q);
                sinc = 0.5 * (1 - q) / kappa;
                logScale = theta;
            }
        }
    }

    /// <summary>c and S unscaled (they may overflow to ∞ only for barriers beyond κw ≈ 709).</summary>
    internal static void UnscaledValues(double s, double width, out double c, out double sinc)
    {
        Values(s, width, out c, out sinc, out var logScale);
        if (logScale != 0)
        {
            var grow = Math.Exp(logScale);
            c *= grow;
            sinc *= grow;
        }
    }

    /// <summary>
    /// Evaluates c, S, ∂c/∂s, ∂S/∂s for wavenumber squared <paramref name="s"/> (1/nm²) over width
    /// <paramref name="width"/> (nm), all divided by e^logScale (κw for every barrier with κw ≥ 1).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Evaluate(double s, double width, out double c, out double sinc, out double dcds, out double dSds, out double logScale)
    {
        var z = s * width * width;
        if (Math.Abs(z) < 1.0)
        {
            SeriesWithDerivatives(z, width, DerivativeSeriesTerms, out c, out sinc, out dcds, out dSds);
            logScale = 0;
            return;
        }
        ScaledOutsideSeries(s, width, out c, out sinc, out logScale);
        dcds = -0.5 * width * sinc;
        dSds = (width * c - sinc) / (2 * s);
    }

    /// <summary>
    /// As <see cref="Evaluate"/> for the many short steps of a Magnus mesh, where |z| is typically 1e-6 to 1e-3: the series
    /// is cut at the number of terms |z| needs rather than at the worst case |z| → 1. For |z| &lt; 1e-4 four terms leave
    /// out |z|⁵/10! &lt; 3e-27 of c and 5|z|⁴/11! &lt; 2e-23 of ∂S/∂s (relative to its leading 1/6), for |z| &lt; 1e-2 six terms
    /// leave out |z|⁷/14! &lt; 2e-25 and 7|z|⁶/15! &lt; 6e-24: all far below an ulp of the results.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void EvaluateShortStep(double s, double width, out double c, out double sinc, out double dcds, out double dSds, out double logScale)
    {
        var z = s * width * width;
        var size = Math.Abs(z);
        if (size < 1.0)
        {
            SeriesWithDerivatives(z, width, size < 1e-4 ? 4 : size < 1e-2 ? 6 : DerivativeSeriesTerms, out c, out sinc, out dcds, out dSds);
            logScale = 0;
            return;
        }
        ScaledOutsideSeries(s, width, out c, out sinc, out logScale);
        dcds = -0.5 * width * sinc;
        dSds = (width * c - sinc) / (2 * s);
    }

    /// <summary>The Taylor series of c, S, ∂c/∂s, ∂S/∂s in z = s·w² (|z| &lt; 1), Horner to <paramref name="terms"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void SeriesWithDerivatives(double z, double width, int terms, out double c, out double sinc, out double dcds, out double dSds)
    {
        // Horner in z for c = Σ cS[j] z^j, S/w = Σ sS[j] z^j, dS/ds = w³ Σ (j+1) sS[j+1] z^j.
        double cSum = CSeries[terms], sSum = SSeries[terms], dSum = terms * SSeries[terms];
        for (var j = terms - 1; j >= 0; j--)
        {
            cSum = cSum * z + CSeries[j];
            sSum = sSum * z + SSeries[j];
            if (j >= 1)
            {
                dSum = dSum * z + j * SSeries[j];
            }
        }
        c = cSum;
        sinc = sSum * width;
        dSds = dSum * width * width * width;
        dcds = -0.5 * width * sinc;
    }

    /// <summary>c and S for |s·w²| ≥ 1, scaled by e^(−κw) for every barrier.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void ScaledOutsideSeries(double s, double width, out double c, out double sinc, out double logScale)
    {
        if (s > 0)
        {
            var k = Math.Sqrt(s);
            var (sin, cos) = Math.SinCos(k * width);
            c = cos;
            sinc = sin / k;
            logScale = 0;
        }
        else
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width;
            // cosh θ = e^θ (1 + e^{-2θ})/2, sinh θ = e^θ (1 − e^{-2θ})/2.
            var q = Math.Exp(-2 * theta);
            c = 0.5 * (1 + q);
            sinc = 0.5 * (1 - q) / kappa;
            logScale = theta;
        }
    }

    /// <summary>
    /// Taylor coefficients g⁽ⁿ⁾(s)/n!, n ≤ 3, of c(s) and S(s) at <paramref name="s"/> over <paramref name="w"/>, divided by
    /// e^logScale (the growing exponential of an evanescent layer): the layer part of the third-order energy jets.
    /// </summary>
    internal static void Taylor3(double s, double w, out (double, double, double, double) c, out (double, double, double, double) sinc, out double logScale)
    {
        var z = s * w * w;
        if (Math.Abs(z) < 1.0)
        {
            // Power series in z = s·w²: c = Σ cS[j] z^j, S = w Σ sS[j] z^j; differentiate term by term.
            double c0 = 0, c1 = 0, c2 = 0, c3 = 0, s0 = 0, s1 = 0, s2 = 0, s3 = 0;
            for (var j = TaylorSeriesTerms; j >= 0; j--)
            {
                c0 = c0 * z + CSeries[j];
                s0 = s0 * z + SSeries[j];
                if (j >= 1) { c1 = c1 * z + j * CSeries[j]; s1 = s1 * z + j * SSeries[j]; }
                if (j >= 2) { c2 = c2 * z + j * (j - 1) * CSeries[j]; s2 = s2 * z + j * (j - 1) * SSeries[j]; }
                if (j >= 3) { c3 = c3 * z + j * (j - 1) * (j - 2) * CSeries[j]; s3 = s3 * z + j * (j - 1) * (j - 2) * SSeries[j]; }
            }
            double w2 = w * w, w4 = w2 * w2, w6 = w4 * w2;
            c = (c0, c1 * w2, c2 * w4 / 2, c3 * w6 / 6);
            sinc = (s0 * w, s1 * w2 * w, s2 * w4 * w / 2, s3 * w6 * w / 6);
            logScale = 0;
            return;
        }
        ScaledOutsideSeries(s, w, out var cv, out var sv, out logScale);
        // c' = −wS/2; 2sS' = wc − S; 2sS'' = −w²S/2 − 3S'; 2sS''' = −w²S'/2 − 5S''; c⁽ⁿ⁺¹⁾ = −wS⁽ⁿ⁾/2.
        var sd1 = (w * cv - sv) / (2 * s);
        var sd2 = -(0.5 * w * w * sv + 3 * sd1) / (2 * s);
        var sd3 = -(0.5 * w * w * sd1 + 5 * sd2) / (2 * s);
        c = (cv, -0.5 * w * sv, -0.5 * w * sd1 / 2, -0.5 * w * sd2 / 6);
        sinc = (sv, sd1, sd2 / 2, sd3 / 6);
    }

    /// <summary>
    /// ∫₀ʷ c², ∫₀ʷ c·S and ∫₀ʷ S² for unscaled <paramref name="c"/> = c(w), <paramref name="sinc"/> = S(w):
    /// (w + cS)/2, S²/2 and (w − cS)/(2s), the last by its power series in z = s·w² where the difference cancels
    /// (∫₀ʷ S² = w³ Σ_{n≥1} (−1)^{n+1} 2^{2n−1} z^{n−1}/(2n+1)!, the series of sin²). For ψ = A·c + B·S over the layer,
    /// ∫ψ² = A²·cc + 2AB·cs + B²·ss.
    /// </summary>
    internal static void SquareIntegrals(double s, double w, double c, double sinc, out double cc, out double cs, out double ss)
    {
        cc = 0.5 * (w + c * sinc);
        cs = 0.5 * sinc * sinc;
        var z = s * w * w;
        if (Math.Abs(z) >= 1)
        {
            ss = (w - c * sinc) / (2 * s);
            return;
        }
        double sum = 0, term = 1.0 / 3.0;
        for (var n = 1; n <= 16; n++)
        {
            sum += term;
            term *= -4.0 * z / ((2 * n + 2) * (2.0 * n + 3));
        }
        ss = w * w * w * sum;
    }
}
