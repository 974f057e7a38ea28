// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// Exact transfer matrix of a layer of constant mass whose potential varies linearly,
/// V(x) = V₀ + slope·x on [0, w] (a layer in a uniform electric field), on the state (ψ, ψ′/m) of the
/// BenDaniel–Duke equation ψ″ = (m/C)(V(x) − E)ψ. Returned as e^logScale·[[m11, m12], [m21, m22]] with
/// det = 1, so that no barrier overflows.
/// </summary>
/// <remarks>
/// <para>Two exact forms, chosen per energy: the sublayer series wherever it needs at most
/// <see cref="SeriesPreferredSublayers"/> sublayers (it is then far cheaper), otherwise the Airy form where it is
/// accurate, otherwise the series.</para>
/// <para><b>Airy functions</b> (the Airy-function transfer-matrix method, K. F. Brennan and C. J. Summers,
/// J. Appl. Phys. 61, 614 (1987)). With β = (m|slope|/C)^(1/3) and z(x) = (V(x) − E)/ε₀, ε₀ = (C·slope²/m)^(1/3),
/// the equation becomes d²ψ/dz² = zψ, solved by Ai(z) and Bi(z) (M. Abramowitz and I. A. Stegun, Handbook of
/// Mathematical Functions, §10.4, Wronskian W{Ai, Bi} = 1/π, eq. 10.4.10), so M = Φ(w)Φ(0)⁻¹ in closed form. For
/// z &gt; 0 the exponentially scaled functions e^ζAi, e^(−ζ)Bi (ζ = ⅔z^(3/2)) are used and the factors
/// e^(±(ζ₁ − ζ₀)) combined analytically, so nothing overflows. The functions come from MathNet.Numerics
/// (a port of the AMOS routines); their error grows roughly as ε·ζ in the oscillating region
/// (measured against 40-digit values: 4e-14 relative at z = −100, 1e-12 at z = −1000).</para>
/// <para><b>Power series on sublayers</b> where the Airy form would lose digits: when the arguments are large
/// (small fields: z ∝ F^(−2/3)), and when the span βw of the arguments is small (the combination
/// Ai₁Bi₀ − Bi₁Ai₀ then cancels). The layer is cut into n sublayers of width h with k_max·h ≤ 1 and
/// βh ≤ 1, k_max² = (m/C)·max|V − E| over the layer; on each, ψ = Σ cₙtⁿ with
/// c_(n+2) = (a·cₙ + b·c_(n−1))/((n+1)(n+2)) (the Maclaurin series of the Airy equation shifted to the
/// sublayer, cf. Abramowitz and Stegun 10.4.2–3), which converges like 1/n! with no cancellation
/// because |a|h², |b|h³ ≤ 1. The product over sublayers costs n ≈ max(k_max·w, βw) small series: a
/// few hundred operations per unit of phase or decay exponent. The same form is exact for a flat
/// layer, which is what makes the zero-field limit continuous.</para>
/// </remarks>
internal static class LinearLayerPropagator
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>Largest |z| at either end for which the Airy form is used (error there ≲ 1e-13, measured).</summary>
    internal const double AiryMaxArgument = 40.0;

    /// <summary>Smallest span |z₁ − z₀| = βw for which the Airy form is used (below it the difference of products cancels).</summary>
    internal const double AiryMinSpan = 0.25;

    private const int MaxSeriesTerms = 60;

    /// <summary>Most sublayers one layer may need (about 0.2 s); energies needing more are rejected by the callers.</summary>
    internal const int MaxSublayers = 1_000_000;

    internal enum Method
    {
        Airy,
        Series,
    }

    /// <summary>
    /// Up to this many sublayers the series is used even where the Airy form is accurate: it is then the cheaper exact
    /// form (a sublayer costs about 0.2 µs, one Airy evaluation of a layer, eight calls of the special functions, about 20 µs).
    /// </summary>
    internal const int SeriesPreferredSublayers = 64;

    /// <summary>Which form <see cref="Evaluate"/> uses for these arguments.</summary>
    internal static Method Choose(double e, double v0, double slope, double width, double mass) => Choose(e, v0, slope, width, mass, out _);

    /// <summary>As <see cref="Choose(double, double, double, double, double)"/>, also returning the series' sublayer count.</summary>
    private static Method Choose(double e, double v0, double slope, double width, double mass, out int sublayers)
    {
        sublayers = SublayerCount(e, v0, slope, width, mass);
        if (slope == 0 || sublayers <= SeriesPreferredSublayers)
        {
            return Method.Series;
        }
        var beta = Math.Cbrt(mass * Math.Abs(slope) / C);
        var eps0 = Math.Cbrt(C * slope * slope / mass);
        var z0 = (v0 - e) / eps0;
        var z1 = (v0 + slope * width - e) / eps0;
        return beta * width >= AiryMinSpan && Math.Max(Math.Abs(z0), Math.Abs(z1)) <= AiryMaxArgument
            ? Method.Airy
            : Method.Series;
    }

    /// <summary>The transfer matrix across the layer, by the form <see cref="Choose(double, double, double, double, double)"/> picks.</summary>
    internal static Method Evaluate(double e, double v0, double slope, double width, double mass,
        out double m11, out double m12, out double m21, out double m22, out double logScale)
    {
        var method = Choose(e, v0, slope, width, mass, out var sublayers);
        if (method == Method.Airy)
        {
            EvaluateAiry(e, v0, slope, width, mass, out m11, out m12, out m21, out m22, out logScale);
        }
        else
        {
            SeriesProduct(e, v0, slope, width, mass, sublayers, out m11, out m12, out m21, out m22, out logScale);
        }
        return method;
    }

    /// <summary>The Airy-function form (slope ≠ 0).</summary>
    internal static void EvaluateAiry(double e, double v0, double slope, double width, double mass,
        out double m11, out double m12, out double m21, out double m22, out double logScale)
    {
        var sign = Math.Sign(slope);
        var beta = Math.Cbrt(mass * Math.Abs(slope) / C);
        var eps0 = Math.Cbrt(C * slope * slope / mass);
        var z0 = (v0 - e) / eps0;
        var z1 = (v0 + slope * width - e) / eps0;
        ScaledAiry(z0, out var a0, out var ap0, out var b0, out var bp0, out var zeta0);
        ScaledAiry(z1, out var a1, out var ap1, out var b1, out var bp1, out var zeta1);
        // Ai₁Bi₀ carries e^(ζ₀ − ζ₁) = e^(−d), Bi₁Ai₀ carries e^(d); factor out e^|d|.
        var d = zeta1 - zeta0;
        logScale = Math.Abs(d);
        var down = Math.Exp(-d - logScale); // e^(−d) / e^|d|
        var up = Math.Exp(d - logScale);    // e^(d) / e^|d|
        m11 = Math.PI * (a1 * bp0 * down - b1 * ap0 * up);
        m12 = Math.PI * mass / (sign * beta) * (b1 * a0 * up - a1 * b0 * down);
        m21 = Math.PI * sign * beta / mass * (ap1 * bp0 * down - bp1 * ap0 * up);
        m22 = Math.PI * (bp1 * a0 * up - ap1 * b0 * down);
    }

    /// <summary>Ai, Ai′ times e^ζ and Bi, Bi′ times e^(−ζ), with ζ = ⅔z^(3/2) for z &gt; 0 and ζ = 0 otherwise.</summary>
    private static void ScaledAiry(double z, out double ai, out double aip, out double bi, out double bip, out double zeta)
    {
        if (z > 0)
        {
            zeta = 2.0 / 3.0 * z * Math.Sqrt(z);
            ai = SpecialFunctions.AiryAiScaled(z);
            aip = SpecialFunctions.AiryAiPrimeScaled(z);
            bi = SpecialFunctions.AiryBiScaled(z);
            bip = SpecialFunctions.AiryBiPrimeScaled(z);
        }
        else
        {
            // The scaled Ai of this library is NaN for real z < 0; unscaled values are bounded there.
            zeta = 0;
            ai = SpecialFunctions.AiryAi(z);
            aip = SpecialFunctions.AiryAiPrime(z);
            bi = SpecialFunctions.AiryBi(z);
            bip = SpecialFunctions.AiryBiPrime(z);
        }
    }

    /// <summary>The sublayer power-series form (any slope, including zero).</summary>
    internal static void EvaluateSeries(double e, double v0, double slope, double width, double mass,
        out double m11, out double m12, out double m21, out double m22, out double logScale) =>
        SeriesProduct(e, v0, slope, width, mass, SublayerCount(e, v0, slope, width, mass), out m11, out m12, out m21, out m22, out logScale);

    /// <summary>The sublayer power-series form on <paramref name="n"/> sublayers (<see cref="SublayerCount"/>).</summary>
    private static void SeriesProduct(double e, double v0, double slope, double width, double mass, int n,
        out double m11, out double m12, out double m21, out double m22, out double logScale)
    {
        var scale = mass / C;
        var b = scale * slope;
        var h = width / n;
        double p11 = 1, p12 = 0, p21 = 0, p22 = 1;
        logScale = 0;
        var bh3 = b * h * h * h;
        for (var j = 0; j < n; j++)
        {
            var aj = scale * (v0 + slope * (j * h) - e);
            Sublayer(aj * h * h, bh3, out var u, out var hu, out var vh, out var vp);
            // Sublayer matrix on (ψ, ψ′/m): [[u, m·h·(v/h)], [(h·u′)/(h·m), v′]].
            var s11 = u;
            var s12 = mass * h * vh;
            var s21 = hu / (h * mass);
            var s22 = vp;
            var q11 = s11 * p11 + s12 * p21;
            var q12 = s11 * p12 + s12 * p22;
            var q21 = s21 * p11 + s22 * p21;
            var q22 = s21 * p12 + s22 * p22;
            p11 = q11; p12 = q12; p21 = q21; p22 = q22;
            // Entries mix units (m·nm and 1/(m·nm)); compare the dimensionless ψ-diagonal and the geometric mean of the off-diagonals.
            var max = Math.Max(Math.Max(Math.Abs(p11), Math.Abs(p22)), Math.Sqrt(Math.Abs(p12 * p21)));
            if (max > 1e100)
            {
                var exponent = Math.ILogB(max);
                p11 = Math.ScaleB(p11, -exponent);
                p12 = Math.ScaleB(p12, -exponent);
                p21 = Math.ScaleB(p21, -exponent);
                p22 = Math.ScaleB(p22, -exponent);
                logScale += exponent * Math.Log(2.0);
            }
        }
        m11 = p11; m12 = p12; m21 = p21; m22 = p22;
    }

    /// <summary>
    /// Propagates the state (u, w)·e^log = (ψ, ψ′/m) across the layer, left to right, by the sublayer series, and returns the
    /// zeros of ψ in (0, w] (a zero at the far end counts). Exact count: on a sublayer k_max·h ≤ 1 &lt; π, so by the Sturm
    /// comparison theorem ψ has at most one zero there, and a zero of a non-trivial solution is simple (a sign change).
    /// </summary>
    internal static int PropagateCounting(double e, double v0, double slope, double width, double mass, ref double u, ref double w, ref double log)
    {
        var scale = mass / C;
        var n = SublayerCount(e, v0, slope, width, mass);
        var h = width / n;
        var bh3 = scale * slope * h * h * h;
        var zeros = 0;
        for (var j = 0; j < n; j++)
        {
            var aj = scale * (v0 + slope * (j * h) - e);
            Sublayer(aj * h * h, bh3, out var s11, out var hu, out var vh, out var s22);
            var u1 = s11 * u + mass * h * vh * w;
            var w1 = hu / (h * mass) * u + s22 * w;
            if (u != 0 && (u1 == 0 || (u1 < 0) != (u < 0)))
            {
                zeros++;
            }
            u = u1;
            w = w1;
            ScaledProduct.Renormalise(ref u, ref w, ref log);
        }
        return zeros;
    }

    /// <summary>Sublayers of the series form: n ≥ k_max·w and n ≥ βw, so that |a|h² ≤ 1 and |b|h³ ≤ 1 on each.</summary>
    internal static int SublayerCount(double e, double v0, double slope, double width, double mass)
    {
        var scale = mass / C;
        var a0 = scale * (v0 - e);
        var a1 = scale * (v0 + slope * width - e);
        var reach = Math.Max(Math.Sqrt(Math.Max(Math.Abs(a0), Math.Abs(a1))), Math.Cbrt(Math.Abs(scale * slope))) * width;
        return (int)Math.Min(int.MaxValue - 1, Math.Max(1.0, Math.Ceiling(reach)));
    }

    /// <summary>
    /// Fundamental solutions of ψ″ = (A + Bτ)ψ on τ ∈ [0, 1] (A = a·h², B = b·h³, both of modulus ≤ 1):
    /// u(1) and u′(1) with u(0) = 1, u′(0) = 0; v(1) and v′(1) with v(0) = 0, v′(0) = 1 (derivatives in τ).
    /// </summary>
    private static void Sublayer(double a, double b, out double u, out double up, out double v, out double vp)
    {
        // Coefficients dₙ of u and eₙ of v, with d_(n+2) = (A dₙ + B d_(n−1))/((n+1)(n+2)).
        double dPrev = 0, d0 = 1, d1 = 0; // d_(n−1), d_n, d_(n+1)
        double ePrev = 0, e0 = 0, e1 = 1;
        u = d0 + d1;
        up = d1;
        v = e0 + e1;
        vp = e1;
        for (var k = 0; k < MaxSeriesTerms; k++)
        {
            // k plays n; the new coefficient has index k + 2.
            var denominator = (k + 1.0) * (k + 2.0);
            var d2 = (a * d0 + b * dPrev) / denominator;
            var e2 = (a * e0 + b * ePrev) / denominator;
            u += d2;
            up += (k + 2) * d2;
            v += e2;
            vp += (k + 2) * e2;
            if (k >= 4 && Math.Abs(d2) + Math.Abs(d1) + Math.Abs(e2) + Math.Abs(e1) < 1e-18)
            {
                break;
            }
            dPrev = d0; d0 = d1; d1 = d2;
            ePrev = e0; e0 = e1; e1 = e2;
        }
    }
}
