// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Numerics;

/// <summary>
/// Elementary functions that neither the runtime nor MathNet.Numerics gives to full accuracy: the one home of each.
/// </summary>
internal static class ElementaryFunctions
{
    /// <summary>
    /// e^x − 1 to a few ulps for every x, also where it is far smaller than 1 (x → 0) and e^x − 1 computed as written
    /// would lose most of its digits.
    /// </summary>
    /// <remarks>
    /// <para>Method: Kahan's formula, with u = e^x rounded, e^x − 1 = (u − 1)·x/ln u for u ≠ 1 (and x when u rounds to 1):
    /// the rounding error of u cancels between u − 1 and ln u, so the result keeps the accuracy of exp and log (N. J.
    /// Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §1.14.1; W. Kahan's note on it). Used for
    /// |x| &lt; 1; beyond, e^x − 1 loses at most one bit as written and overflows to +∞ where e^x does, so it is taken as
    /// written.</para>
    /// <para>Neither alternative is accurate: .NET 10's <c>double.ExpM1</c> is computed as exp(x) − 1 (relative error
    /// about ε/|x|, 8e-8 at x = 1e-10), and MathNet.Numerics 5.0's <c>SpecialFunctions.Expm1</c> was measured 1.3e-7
    /// relative off at x = 0.0625. NaN gives NaN.</para>
    /// </remarks>
    internal static double ExpM1(double x)
    {
        if (!(Math.Abs(x) < 1))
        {
            return Math.Exp(x) - 1;
        }
        var u = Math.Exp(x);
        if (u == 1)
        {
            return x;
        }
        var um1 = u - 1;
        return um1 == -1 ? -1 : um1 * x / Math.Log(u);
    }

    /// <summary>
    /// ln(1 + e^x) (softplus) for either sign of x without overflow, accurate to a few ulps also where e^x is tiny (far
    /// below a Fermi level), where Math.Log(1 + e^x) as written returns 0.
    /// </summary>
    /// <remarks>x + ln(1 + e^(−x)) for x &gt; 0, ln(1 + e^x) otherwise, with MathNet.Numerics' log1p (measured accurate to
    /// rounding, unlike its expm1).</remarks>
    internal static double Softplus(double x) =>
        x > 0 ? x + MathNet.Numerics.SpecialFunctions.Log1p(Math.Exp(-x)) : MathNet.Numerics.SpecialFunctions.Log1p(Math.Exp(x));
}
