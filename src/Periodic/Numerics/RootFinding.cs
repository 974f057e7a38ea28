// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Numerics;

/// <summary>How a bracketed root search ended.</summary>
internal enum RootStatus
{
    /// <summary>The step or bracket fell below the tolerance.</summary>
    Converged,

    /// <summary>The iteration budget ran out; the bracket still holds the root.</summary>
    IterationLimit,

    /// <summary>The function did not change sign over the bracket.</summary>
    NotBracketed,
}

/// <summary>The outcome of a bracketed root search: root, final bracket, iterations and status.</summary>
internal readonly record struct RootResult(double Root, double Lower, double Upper, double LastStep, int Iterations, RootStatus Status)
{
    /// <summary>A bound on the error of <see cref="Root"/>: the last step or the final bracket width.</summary>
    public double ErrorBound => Math.Max(Math.Min(LastStep, Upper - Lower), FloatingPoint.MachineEpsilon * Math.Abs(Root));
}

/// <summary>A function with its derivative, evaluated without allocation (a struct, so calls specialise).</summary>
internal interface IDifferentiableFunction
{
    /// <summary>f(x); <paramref name="derivative"/> receives f′(x). Either may be ±∞ far from a root.</summary>
    double Evaluate(double x, out double derivative);
}

/// <summary>A function of one variable, evaluated without allocation.</summary>
internal interface IRealFunction
{
    double Evaluate(double x);
}

/// <summary>Bracketed root finders with named tolerances.</summary>
internal static class RootFinding
{
    /// <summary>
    /// Safeguarded Newton–Raphson: a Newton step when it stays inside the current bracket and the
    /// function values are finite, a bisection step otherwise (W. H. Press et al., Numerical Recipes,
    /// 3rd ed., §9.4, "rtsafe"). Converges when a step is below max(absolute, relative·|x|).
    /// </summary>
    internal static RootResult SafeguardedNewton<TFunction>(ref TFunction function, double lower, double upper,
        double absoluteTolerance, double relativeTolerance, int maxIterations)
        where TFunction : struct, IDifferentiableFunction
    {
        var fLower = function.Evaluate(lower, out _);
        var fUpper = function.Evaluate(upper, out _);
        if (fLower == 0)
        {
            return new RootResult(lower, lower, lower, 0, 0, RootStatus.Converged);
        }
        if (fUpper == 0)
        {
            return new RootResult(upper, upper, upper, 0, 0, RootStatus.Converged);
        }
        if (Math.Sign(fLower) == Math.Sign(fUpper))
        {
            return new RootResult(double.NaN, lower, upper, double.PositiveInfinity, 0, RootStatus.NotBracketed);
        }
        var lowerIsNegative = fLower < 0;
        var x = 0.5 * (lower + upper);
        var step = upper - lower;
        for (var iteration = 1; iteration <= maxIterations; iteration++)
        {
            var f = function.Evaluate(x, out var df);
            if (f == 0)
            {
                return new RootResult(x, x, x, 0, iteration, RootStatus.Converged);
            }
            if ((f < 0) == lowerIsNegative)
            {
                lower = x;
            }
            else
            {
                upper = x;
            }
            var next = x - f / df;
            if (!double.IsFinite(next) || next <= lower || next >= upper)
            {
                next = 0.5 * (lower + upper);
            }
            step = Math.Abs(next - x);
            x = next;
            var tolerance = Math.Max(absoluteTolerance, relativeTolerance * Math.Abs(x));
            if (step <= tolerance || upper - lower <= tolerance)
            {
                return new RootResult(x, lower, upper, step, iteration, RootStatus.Converged);
            }
        }
        return new RootResult(x, lower, upper, step, maxIterations, RootStatus.IterationLimit);
    }

    /// <summary>
    /// Brent's method: inverse quadratic interpolation and secant steps safeguarded by bisection
    /// (R. P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 4).
    /// </summary>
    internal static RootResult Brent<TFunction>(ref TFunction function, double lower, double upper,
        double absoluteTolerance, double relativeTolerance, int maxIterations)
        where TFunction : struct, IRealFunction
    {
        double a = lower, b = upper;
        double fa = function.Evaluate(a), fb = function.Evaluate(b);
        if (fa == 0)
        {
            return new RootResult(a, a, a, 0, 0, RootStatus.Converged);
        }
        if (fb == 0)
        {
            return new RootResult(b, b, b, 0, 0, RootStatus.Converged);
        }
        if (Math.Sign(fa) == Math.Sign(fb))
        {
            return new RootResult(double.NaN, lower, upper, double.PositiveInfinity, 0, RootStatus.NotBracketed);
        }
        double c = a, fc = fa, d = b - a, e = d;
        for (var iteration = 1; iteration <= maxIterations; iteration++)
        {
            if (Math.Sign(fb) == Math.Sign(fc))
            {
                c = a; fc = fa; d = b - a; e = d;
            }
            if (Math.Abs(fc) < Math.Abs(fb))
            {
                a = b; b = c; c = a;
                fa = fb; fb = fc; fc = fa;
            }
            var tolerance = 0.5 * Math.Max(absoluteTolerance, relativeTolerance * Math.Abs(b));
            var m = 0.5 * (c - b);
            if (Math.Abs(m) <= tolerance || fb == 0)
            {
                return new RootResult(b, Math.Min(b, c), Math.Max(b, c), Math.Abs(m), iteration, RootStatus.Converged);
            }
            if (Math.Abs(e) >= tolerance && Math.Abs(fa) > Math.Abs(fb))
            {
                double p, q, r, s = fb / fa;
                if (a == c)
                {
                    p = 2 * m * s;
                    q = 1 - s;
                }
                else
                {
                    q = fa / fc;
                    r = fb / fc;
                    p = s * (2 * m * q * (q - r) - (b - a) * (r - 1));
                    q = (q - 1) * (r - 1) * (s - 1);
                }
                if (p > 0)
                {
                    q = -q;
                }
                p = Math.Abs(p);
                if (2 * p < Math.Min(3 * m * q - Math.Abs(tolerance * q), Math.Abs(e * q)))
                {
                    e = d;
                    d = p / q;
                }
                else
                {
                    d = m; e = m;
                }
            }
            else
            {
                d = m; e = m;
            }
            a = b; fa = fb;
            b += Math.Abs(d) > tolerance ? d : (m > 0 ? tolerance : -tolerance);
            fb = function.Evaluate(b);
        }
        return new RootResult(b, Math.Min(b, c), Math.Max(b, c), Math.Abs(c - b), maxIterations, RootStatus.IterationLimit);
    }
}
