// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.RootFinding;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// The finite square well of one mass, solved independently of the library: the transcendental equations of
/// D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., §2.6 (even z tan z = √(z0² − z²), odd
/// −z cot z = √(z0² − z²), z = ka, z0 = a√(2mV0)/ħ, a = L/2), roots by MathNet's Brent, and the dipoles of the
/// analytic eigenfunctions (cos/sin inside, e^{−κ|x|} outside) by closed-form integrals [derived].
/// </summary>
internal static class FiniteWellReference
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    internal readonly record struct State(double Energy, double K, double Kappa, bool Even, double Amplitude);

    /// <summary>All bound states, lowest first; energies from the well bottom, eV.</summary>
    internal static State[] Solve(double widthNanometres, double depthElectronVolts, double mass)
    {
        var a = 0.5 * widthNanometres;
        var z0 = a * Math.Sqrt(mass * depthElectronVolts / C);
        var states = new List<State>();
        for (var n = 0; ; n++)
        {
            // Even roots in (nπ, nπ + π/2), odd roots in (nπ + π/2, (n + 1)π), each below z0.
            var even = n * Math.PI;
            if (even >= z0)
            {
                break;
            }
            states.Add(Make(Root(z => z * Math.Sin(z) - Math.Sqrt(z0 * z0 - z * z) * Math.Cos(z), even, Math.Min(even + Math.PI / 2, z0)), a, z0, mass, true));
            var odd = n * Math.PI + Math.PI / 2;
            if (odd >= z0)
            {
                break;
            }
            states.Add(Make(Root(z => z * Math.Cos(z) + Math.Sqrt(z0 * z0 - z * z) * Math.Sin(z), odd, Math.Min(odd + Math.PI / 2, z0)), a, z0, mass, false));
        }
        return [.. states];
    }

    private static double Root(Func<double, double> f, double lo, double hi) =>
        Brent.FindRoot(f, lo + 1e-15, hi - 1e-15 * Math.Max(1, hi), 1e-15, 500);

    private static State Make(double z, double a, double z0, double mass, bool even)
    {
        var k = z / a;
        var kappa = Math.Sqrt(z0 * z0 - z * z) / a;
        // Normalisation of A cos(kx) (even) or A sin(kx) (odd) with the matching exponential tails.
        var inside = even ? a + Math.Sin(2 * k * a) / (2 * k) : a - Math.Sin(2 * k * a) / (2 * k);
        var edge = even ? Math.Cos(k * a) : Math.Sin(k * a);
        var amplitude = 1 / Math.Sqrt(inside + edge * edge / kappa);
        return new State(C * k * k / mass, k, kappa, even, amplitude);
    }

    /// <summary>|⟨s|x|t⟩|, nm, x from the well centre: zero for equal parity, else the closed-form integrals.</summary>
    internal static double Dipole(State s, State t, double widthNanometres)
    {
        if (s.Even == t.Even)
        {
            return 0;
        }
        var (e, o) = s.Even ? (s, t) : (t, s);
        var a = 0.5 * widthNanometres;
        // ∫_0^a x cos(px) sin(qx) dx = ½[I(q + p) + I(q − p)], I(b) = ∫_0^a x sin(bx) dx = (sin ba − ba cos ba)/b².
        static double I(double b, double a) => b == 0 ? 0 : (Math.Sin(b * a) - b * a * Math.Cos(b * a)) / (b * b);
        var inside = 0.5 * (I(o.K + e.K, a) + I(o.K - e.K, a));
        // ∫_a^∞ x e^{−K(x − a)} dx = a/K + 1/K².
        var sum = e.Kappa + o.Kappa;
        var outside = Math.Cos(e.K * a) * Math.Sin(o.K * a) * (a / sum + 1 / (sum * sum));
        return Math.Abs(2 * e.Amplitude * o.Amplitude * (inside + outside));
    }
}
