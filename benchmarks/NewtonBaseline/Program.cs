// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

// Baseline for the whole-process dispersion benchmark: a hand-written Newton solver of the Kronig–Penney
// relation in closed form (Kronig & Penney, Proc. R. Soc. A 130, 499 (1931), with BenDaniel–Duke matching,
// Phys. Rev. 152, 683 (1966)) for the two-layer cell of docs/examples/structures/superlattice.json:
// E(k) of bands 1–5 on 200,001 k points from 0 to π/d (10^6 energies). It finds the band edges by a scan
// and bisection, then solves D(E)/2 = cos kd per point by Newton with the analytic derivative, warm-started
// from the previous k, kept inside the band by bisection. It writes nothing but one checksum line.
using System.Globalization;

// ħ²/(2 m_e) in eV nm² from CODATA 2018 (h and e exact, m_e = 9.1093837015e-31 kg)
const double Hbar = 6.62607015e-34 / (2 * Math.PI);
const double C = Hbar * Hbar / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18;
const double A = 5.0, B = 2.0, V0 = 0.25, Mw = 0.067, Mb = 0.092; // well a, barrier b (nm), barrier height (eV), masses (m0)
var bands = args.Length > 0 ? int.Parse(args[0], CultureInfo.InvariantCulture) : 5;
var points = args.Length > 1 ? int.Parse(args[1], CultureInfo.InvariantCulture) : 200_001;
var dump = args.Length > 2; // a third argument prints every 50,000th energy (to compare with the tool's CSV)

// Band edges: roots of D/2 = ±1, bracketed by a scan, refined by bisection.
var edges = new List<double>();
double previous = 1e-9, fPrev = Math.Abs(HalfTrace(previous, out _)) - 1;
for (var i = 1; edges.Count < 2 * bands; i++)
{
    var e = 1e-9 + i * 2e-4;
    if (Math.Abs(e - V0) < 1e-9)
    {
        e += 2e-9;
    }
    var f = Math.Abs(HalfTrace(e, out _)) - 1;
    if (Math.Sign(f) != Math.Sign(fPrev))
    {
        double lo = previous, hi = e, flo = fPrev;
        for (var it = 0; it < 200 && hi - lo > 1e-15 * hi; it++)
        {
            var mid = 0.5 * (lo + hi);
            var fm = Math.Abs(HalfTrace(mid, out _)) - 1;
            if (Math.Sign(fm) == Math.Sign(flo)) { lo = mid; flo = fm; } else { hi = mid; }
        }
        edges.Add(0.5 * (lo + hi));
    }
    previous = e;
    fPrev = f;
}

double checksum = 0;
long iterations = 0;
for (var n = 0; n < bands; n++)
{
    double bottom = edges[2 * n], top = edges[2 * n + 1];
    var energy = n % 2 == 0 ? bottom : top; // odd bands start at k = 0 from the bottom, even ones from the top
    for (var i = 0; i < points; i++)
    {
        var target = Math.Cos(Math.PI * i / (points - 1));
        double lo = bottom, hi = top;
        for (var it = 0; it < 60; it++)
        {
            iterations++;
            var f = HalfTrace(energy, out var slope) - target;
            // D/2 falls through odd bands and rises through even ones: keep the bracket on the right side.
            if ((f > 0) == (n % 2 == 0)) { lo = energy; } else { hi = energy; }
            var next = energy - f / slope;
            if (!(next > lo && next < hi))
            {
                next = 0.5 * (lo + hi);
            }
            var step = Math.Abs(next - energy);
            energy = next;
            if (step <= 1e-14 * Math.Abs(energy) || hi - lo <= 1e-14 * Math.Abs(energy))
            {
                break;
            }
        }
        checksum += energy;
        if (dump && i % 50_000 == 0)
        {
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"band {n + 1} k[{i}] {energy:R}"));
        }
    }
}
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{(long)bands * points} energies, {iterations} Newton steps, checksum {checksum:R}"));
return 0;

// D(E)/2 of the Kronig–Penney cell and its derivative d(D/2)/dE, in closed form.
static double HalfTrace(double e, out double derivative)
{
    var kw = Math.Sqrt(Mw * e / C);
    var dkw = kw / (2 * e);
    double alpha = kw * A, dAlpha = dkw * A;
    double sa = Math.Sin(alpha), ca = Math.Cos(alpha);
    if (e > V0)
    {
        var kb = Math.Sqrt(Mb * (e - V0) / C);
        var dkb = kb / (2 * (e - V0));
        double beta = kb * B, dBeta = dkb * B;
        double sb = Math.Sin(beta), cb = Math.Cos(beta);
        var xi = kb * Mw / (kw * Mb);
        var dXi = xi * (dkb / kb - dkw / kw);
        var g = 0.5 * (xi + 1 / xi);
        var dg = 0.5 * (1 - 1 / (xi * xi)) * dXi;
        derivative = -sa * cb * dAlpha - ca * sb * dBeta - dg * sa * sb - g * (ca * sb * dAlpha + sa * cb * dBeta);
        return ca * cb - g * sa * sb;
    }
    else
    {
        var kappa = Math.Sqrt(Mb * (V0 - e) / C);
        var dKappa = -kappa / (2 * (V0 - e));
        double beta = kappa * B, dBeta = dKappa * B;
        double sh = Math.Sinh(beta), ch = Math.Cosh(beta);
        var eta = kappa * Mw / (kw * Mb);
        var dEta = eta * (dKappa / kappa - dkw / kw);
        var h = 0.5 * (eta - 1 / eta);
        var dh = 0.5 * (1 + 1 / (eta * eta)) * dEta;
        derivative = -sa * ch * dAlpha + ca * sh * dBeta + dh * sa * sh + h * (ca * sh * dAlpha + sa * ch * dBeta);
        return ca * ch + h * sa * sh;
    }
}
