// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Benchmarks;

/// <summary>
/// The baseline: a closed-form two-layer Kronig–Penney solver of the kind written in an afternoon.
/// D(E) from the Kronig–Penney relation with BenDaniel–Duke matching (Kronig and Penney, Proc. R. Soc.
/// A 130, 499 (1931)); band edges by a fixed-step scan of |D| − 2 refined by bisection; E(k) by a
/// safeguarded Newton iteration on D(E) = 2 cos kd with a forward-difference derivative.
/// </summary>
internal sealed class NaiveKronigPenney(double a, double b, double v0, double mw, double mb)
{
    private const double C = Periodic.Units.PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    internal double Period => a + b;

    /// <summary>D(E) = 2 cos kd in closed form.</summary>
    internal double Trace(double e)
    {
        if (e == v0)
        {
            e = v0 * (1 + 1e-15); // the E > V0 form has a removable 0/0 at the barrier top
        }
        var kw = Math.Sqrt(mw * e / C);
        if (e < v0)
        {
            var kappa = Math.Sqrt(mb * (v0 - e) / C);
            var xi = (kappa / mb) / (kw / mw);
            return 2 * (Math.Cos(kw * a) * Math.Cosh(kappa * b) + 0.5 * (xi - 1 / xi) * Math.Sin(kw * a) * Math.Sinh(kappa * b));
        }
        var kb = Math.Sqrt(mb * (e - v0) / C);
        var eta = (kb / mb) / (kw / mw);
        return 2 * (Math.Cos(kw * a) * Math.Cos(kb * b) - 0.5 * (eta + 1 / eta) * Math.Sin(kw * a) * Math.Sin(kb * b));
    }

    /// <summary>Band edges (bottom, top) of the first <paramref name="bands"/> bands, by a 1 meV scan and bisection.</summary>
    internal (double Bottom, double Top)[] Edges(int bands, double step = 1e-3)
    {
        var result = new (double, double)[bands];
        var found = 0;
        double e = 1e-9, previous = Math.Abs(Trace(e)) - 2;
        double bottom = 0;
        var inBand = previous <= 0;
        while (found < bands)
        {
            var next = e + step;
            var value = Math.Abs(Trace(next)) - 2;
            if ((value <= 0) != inBand)
            {
                var edge = Bisect(e, next);
                if (!inBand)
                {
                    bottom = edge;
                }
                else
                {
                    result[found++] = (bottom, edge);
                }
                inBand = !inBand;
            }
            e = next;
        }
        return result;
    }

    private double Bisect(double lo, double hi)
    {
        var fLo = Math.Abs(Trace(lo)) - 2;
        while (hi - lo > 1e-13)
        {
            var mid = 0.5 * (lo + hi);
            var f = Math.Abs(Trace(mid)) - 2;
            if ((f <= 0) == (fLo <= 0))
            {
                lo = mid;
                fLo = f;
            }
            else
            {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /// <summary>E(k) in band [bottom, top] by safeguarded Newton on D(E) − 2 cos kd.</summary>
    internal double Energy(double bottom, double top, double k)
    {
        var target = 2 * Math.Cos(k * Period);
        double lo = bottom, hi = top;
        var fLo = Trace(lo) - target;
        var fHi = Trace(hi) - target;
        if ((fLo < 0) == (fHi < 0))
        {
            return Math.Abs(fLo) <= Math.Abs(fHi) ? lo : hi; // k on a zone point: the root is an edge
        }
        var x = 0.5 * (lo + hi);
        for (var iteration = 0; iteration < 100; iteration++)
        {
            var f = Trace(x) - target;
            if ((f < 0) == (fLo < 0))
            {
                lo = x;
                fLo = f;
            }
            else
            {
                hi = x;
            }
            var h = 1e-7 * Math.Max(1.0, Math.Abs(x));
            var df = (Trace(x + h) - target - f) / h;
            var next = x - f / df;
            if (!(next > lo && next < hi))
            {
                next = 0.5 * (lo + hi);
            }
            if (Math.Abs(next - x) < 1e-13)
            {
                return next;
            }
            x = next;
        }
        return x;
    }
}
