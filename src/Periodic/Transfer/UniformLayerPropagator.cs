// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;

namespace Periodic.Transfer;

/// <summary>
/// Closed-form propagation through a region of constant coefficients, written in s = k² (1/nm²;
/// negative under a barrier) so that one formula covers oscillating, linear and evanescent
/// solutions without a branch cut at s = 0:
/// c = cos(√s·w), S = sin(√s·w)/√s, with ∂c/∂s = −w·S/2 and ∂S/∂s = (w·c − S)/(2s).
/// </summary>
/// <remarks>
/// For |s·w²| &lt; 1 the functions come from their Taylor series in z = s·w² (13 terms, truncation
/// below 1e-25 relative), which avoids the cancellation in (w·c − S) near s = 0. For evanescent
/// regions with κw &gt; 1 the values are returned divided by e^(κw) (the growing exponential), and
/// the exponent κw is returned in <c>logScale</c>, so that no barrier overflows.
/// </remarks>
internal static class UniformLayerPropagator
{
    private const int SeriesTerms = 13;

    // cSeries[j] = (-1)^j / (2j)!, sSeries[j] = (-1)^j / (2j+1)!.
    private static readonly double[] CSeries = BuildSeries(0, SeriesTerms);
    private static readonly double[] SSeries = BuildSeries(1, SeriesTerms);

    /// <summary>Taylor coefficients in z = s·w²: (−1)^j/(2j + offset)! for j = 0 … terms (offset 0: c, 1: S/w).</summary>
    internal static double[] BuildSeries(int offset, int terms)
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
    /// Evaluates c, S, ∂c/∂s, ∂S/∂s for wavenumber squared <paramref name="s"/> (1/nm²) over width
    /// <paramref name="width"/> (nm), all divided by e^logScale.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Evaluate(double s, double width, out double c, out double sinc, out double dcds, out double dSds, out double logScale)
    {
        var z = s * width * width;
        if (Math.Abs(z) < 1.0)
        {
            // Horner in z for c = Σ cS[j] z^j, S/w = Σ sS[j] z^j, dS/ds = w³ Σ (j+1) sS[j+1] z^j.
            double cSum = CSeries[SeriesTerms], sSum = SSeries[SeriesTerms], dSum = SeriesTerms * SSeries[SeriesTerms];
            for (var j = SeriesTerms - 1; j >= 0; j--)
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
            logScale = 0;
            return;
        }
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
        dcds = -0.5 * width * sinc;
        dSds = (width * c - sinc) / (2 * s);
    }
}
