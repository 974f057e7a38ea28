// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// Published dispersion relations, written out independently of the library (only the constant
/// ħ²/2m₀ is shared, and it is checked against CODATA in PhysicalConstantsTest).
/// </summary>
internal static class ClosedForms
{
    internal const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>
    /// cos kd of the two-layer Kronig–Penney cell with BenDaniel–Duke masses: well a (V = 0, mass mw),
    /// barrier b (height v0, mass mb). Kronig &amp; Penney, Proc. R. Soc. A 130, 499 (1931), with
    /// BenDaniel–Duke matching (Phys. Rev. 152, 683 (1966)); the form of docs/references.md:
    /// E &lt; V0: cos(kw a) cosh(κb) + ½(ξ − 1/ξ) sin(kw a) sinh(κb), ξ = (κ/mb)/(kw/mw);
    /// E &gt; V0: κ → i kb: cos cos − ½(ξ + 1/ξ) sin sin.
    /// For E &lt; 0 (both evanescent) the same derivation gives cosh cosh + ½(η + 1/η) sinh sinh,
    /// η = (κb/mb)/(κw/mw) [derived]. Also returns the rounding scale: the sum of the magnitudes of the terms.
    /// </summary>
    internal static double KronigPenneyHalfTrace(double a, double b, double v0, double mw, double mb, double e, out double scale)
    {
        if (e > 0)
        {
            var kw = Math.Sqrt(mw * e / C);
            if (e < v0)
            {
                var kappa = Math.Sqrt(mb * (v0 - e) / C);
                var xi = (kappa / mb) / (kw / mw);
                double t1 = Math.Cos(kw * a) * Math.Cosh(kappa * b), t2 = 0.5 * (xi - 1 / xi) * Math.Sin(kw * a) * Math.Sinh(kappa * b);
                scale = Math.Abs(t1) + Math.Abs(t2);
                return t1 + t2;
            }
            if (e > v0)
            {
                var kb = Math.Sqrt(mb * (e - v0) / C);
                var xi = (kb / mb) / (kw / mw);
                double t1 = Math.Cos(kw * a) * Math.Cos(kb * b), t2 = -0.5 * (xi + 1 / xi) * Math.Sin(kw * a) * Math.Sin(kb * b);
                scale = Math.Abs(t1) + Math.Abs(t2) + 1;
                return t1 + t2;
            }
            throw new ArgumentOutOfRangeException(nameof(e), "E = V0 exactly is a removable singularity of this form; avoid it.");
        }
        if (e < 0)
        {
            var kappaW = Math.Sqrt(mw * -e / C);
            var kappaB = Math.Sqrt(mb * (v0 - e) / C);
            var eta = (kappaB / mb) / (kappaW / mw);
            double t1 = Math.Cosh(kappaW * a) * Math.Cosh(kappaB * b), t2 = 0.5 * (eta + 1 / eta) * Math.Sinh(kappaW * a) * Math.Sinh(kappaB * b);
            scale = Math.Abs(t1) + Math.Abs(t2);
            return t1 + t2;
        }
        throw new ArgumentOutOfRangeException(nameof(e), "E = 0 exactly is a removable singularity of this form; avoid it.");
    }

    internal static double KronigPenneyHalfTrace(double a, double b, double v0, double mw, double mb, double e) =>
        KronigPenneyHalfTrace(a, b, v0, mw, mb, e, out _);

    /// <summary>
    /// The same Kronig–Penney relation continued to complex energy (the E &gt; V0 form with complex
    /// wavenumbers; cos and sin of iκ give cosh and i·sinh, which reproduces the E &lt; V0 form), for
    /// complex-step differentiation.
    /// </summary>
    internal static Complex KronigPenneyHalfTrace(double a, double b, double v0, double mw, double mb, Complex e)
    {
        var kw = Complex.Sqrt(mw * e / C);
        var kb = Complex.Sqrt(mb * (e - v0) / C);
        var xi = (kb / mb) / (kw / mw);
        return Complex.Cos(kw * a) * Complex.Cos(kb * b) - 0.5 * (xi + 1 / xi) * Complex.Sin(kw * a) * Complex.Sin(kb * b);
    }

    /// <summary>
    /// d/dE of a real-analytic function by the complex step, f′(x) = Im f(x + ih)/h + O(h²), free of
    /// subtractive cancellation (W. Squire and G. Trapp, SIAM Review 40, 110 (1998)).
    /// </summary>
    internal static double ComplexStepDerivative(Func<Complex, Complex> f, double x)
    {
        var h = 1e-20 * Math.Max(1.0, Math.Abs(x));
        return f(new Complex(x, h)).Imaginary / h;
    }

    /// <summary>
    /// cos kd of the Dirac comb V = S Σ δ(x − nd) in a medium of mass m: cos Kd + P sin(Kd)/(Kd),
    /// P = m S d/ħ² in these units m S d/(2C) (Kittel, Introduction to Solid State Physics, ch. 7;
    /// Griffiths, Introduction to Quantum Mechanics 2nd ed., eq. 5.65). For E &lt; 0, K = iκ gives
    /// cosh κd + P sinh(κd)/(κd) [derived].
    /// </summary>
    internal static double DiracCombHalfTrace(double d, double strength, double m, double e, out double scale)
    {
        var p = m * strength * d / (2 * C);
        if (e > 0)
        {
            var kd = Math.Sqrt(m * e / C) * d;
            double t1 = Math.Cos(kd), t2 = p * Math.Sin(kd) / kd;
            scale = 1 + Math.Abs(t2);
            return t1 + t2;
        }
        if (e < 0)
        {
            var kd = Math.Sqrt(m * -e / C) * d;
            double t1 = Math.Cosh(kd), t2 = p * Math.Sinh(kd) / kd;
            scale = Math.Abs(t1) + Math.Abs(t2);
            return t1 + t2;
        }
        scale = 1 + Math.Abs(p);
        return 1 + p;
    }

    /// <summary>Dirac-comb P = m S d / (ħ²) expressed with C = ħ²/2m₀ (Griffiths eq. 5.65, β = mαd/ħ²).</summary>
    internal static double DiracCombStrengthForP(double p, double d, double m) => p * 2 * C / (m * d);

    /// <summary>
    /// Chebyshev polynomial of the first kind T_N(x): cos(N arccos x) for |x| ≤ 1 and
    /// sign(x)^N cosh(N arcosh|x|) outside (Abramowitz &amp; Stegun 22.3.15), so that
    /// ½ Tr M^N = T_N(½ Tr M) for a unimodular 2×2 M [derived from Cayley–Hamilton].
    /// </summary>
    internal static double ChebyshevT(int n, double x) =>
        Math.Abs(x) <= 1 ? Math.Cos(n * Math.Acos(x))
        : (x < 0 && n % 2 == 1 ? -1 : 1) * Math.Cosh(n * Math.Acosh(Math.Abs(x)));

    /// <summary>ln |T_N(x)| for |x| &gt; 1 without overflow: N·arcosh|x| + ln((1 + e^(−2N arcosh|x|))/2).</summary>
    internal static double LogAbsChebyshevTOutside(int n, double x)
    {
        var t = n * Math.Acosh(Math.Abs(x));
        return t + Math.Log(0.5 * (1 + Math.Exp(-2 * t)));
    }

    /// <summary>
    /// A root of f in [lower, upper] by MathNet's Brent (MathNet.Numerics.RootFinding.Brent), refined
    /// to the resolution of double precision (the best bracket point is returned if MathNet stops
    /// because the bracket can no longer shrink).
    /// </summary>
    internal static double BrentRoot(Func<double, double> f, double lower, double upper)
    {
        var fl = f(lower);
        var fu = f(upper);
        if (Math.Sign(fl) == Math.Sign(fu))
        {
            throw new InvalidOperationException($"root not bracketed in [{lower:R}, {upper:R}]: f = {fl:R}, {fu:R}.");
        }
        MathNet.Numerics.RootFinding.Brent.TryFindRoot(f, lower, upper, 1e-300, 400, out var root);
        return root;
    }

    /// <summary>
    /// All roots of f in (lower, upper) found by a uniform scan with <paramref name="samples"/> intervals
    /// and Brent refinement of each sign change.
    /// </summary>
    internal static List<double> ScanRoots(Func<double, double> f, double lower, double upper, int samples)
    {
        var roots = new List<double>();
        var x0 = lower;
        var f0 = f(x0);
        for (var i = 1; i <= samples; i++)
        {
            var x1 = lower + (upper - lower) * i / samples;
            var f1 = f(x1);
            if (f0 == 0)
            {
                roots.Add(x0);
            }
            else if (Math.Sign(f0) == -Math.Sign(f1))
            {
                roots.Add(BrentRoot(f, x0, x1));
            }
            x0 = x1;
            f0 = f1;
        }
        return roots;
    }

    /// <summary>
    /// det(M ± I) of the equal-mass Kronig–Penney cell above the barrier, M = M_b·M_w with the textbook
    /// layer matrices [[cos θ, sin θ/q], [−q sin θ, cos θ]] in (ψ, ψ′) (any quantum-mechanics text; with
    /// equal masses ψ′/m matching is ψ′ matching). Since det M = 1, det(M + I) = D + 2 and det(M − I) = 2 − D,
    /// but the product form is accurate to ε·‖M ± I‖ where M is close to ∓I, i.e. near a nearly closed gap,
    /// where D ± 2 itself loses all digits to cancellation.
    /// </summary>
    internal static double KronigPenneyDeterminant(double a, double b, double v0, double m, double e, double sign)
    {
        var kw = Math.Sqrt(m * e / C);
        var kb = Math.Sqrt(m * (e - v0) / C);
        double cw = Math.Cos(kw * a), sw = Math.Sin(kw * a), cb = Math.Cos(kb * b), sb = Math.Sin(kb * b);
        var m11 = cb * cw - sb * kw * sw / kb;
        var m12 = cb * sw / kw + sb * cw / kb;
        var m21 = -kb * sb * cw - cb * kw * sw;
        var m22 = -kb * sb * sw / kw + cb * cw;
        return (m11 + sign) * (m22 + sign) - m12 * m21;
    }
}
