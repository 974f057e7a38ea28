// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using FsCheck.Xunit;
using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

/// <summary>
/// <see cref="ElementaryFunctions.ExpM1"/> against the Maclaurin series e^x − 1 = Σ_{n≥1} xⁿ/n! (Abramowitz and Stegun
/// 4.2.1; docs/references.md) summed in exact integer arithmetic from the exact binary value of x, so the reference
/// is good to about 2⁻¹⁵⁰ relative, far below the double rounding under test.
/// </summary>
public sealed class ElementaryFunctionsTest
{
    // Kahan's formula keeps the accuracy of exp and log: a few ulps (Higham, Accuracy and Stability of Numerical
    // Algorithms, §1.14.1; docs/references.md). 4 ε ≈ 8.9e-16 relative allows that with margin; exp(x) − 1 as written
    // misses it by orders of magnitude for |x| ≤ 1e-3, and MathNet 5.0's Expm1 by 1.3e-7 at x = 1/16.
    private const double Tolerance = 4 * FloatingPoint.MachineEpsilon;

    private const int GuardBits = 200;

    /// <summary>(y − (e^x − 1))/(e^x − 1), with e^x − 1 from the exact series; x and y finite, 2⁻¹⁰²² ≤ |x| &lt; 1.</summary>
    internal static double RelativeErrorAgainstSeries(double x, double y)
    {
        var (mantissa, exponent) = Decompose(x);         // x = mantissa · 2^exponent exactly, exponent < 0
        var k = -exponent;
        var scale = k + GuardBits;                       // fixed point: value · 2^scale
        var term = mantissa << (scale - k);              // x · 2^scale exactly
        var sum = BigInteger.Zero;
        for (var n = 1; !term.IsZero; n++)
        {
            sum += term;
            term = term * mantissa / (BigInteger.One << k) / (n + 1); // next term x^(n+1)/(n+1)!, truncated: ≤ 1 unit each
        }
        var (ym, ye) = Decompose(y);
        var yFixed = ye + scale >= 0 ? ym << (ye + scale) : ym >> -(ye + scale);
        // The ratio as a double: shift the difference up by 64 bits before dividing so the quotient keeps its digits.
        return (double)(((yFixed - sum) << 64) / sum) / Math.ScaleB(1.0, 64);
    }

    private static (BigInteger Mantissa, int Exponent) Decompose(double x)
    {
        var bits = BitConverter.DoubleToInt64Bits(x);
        var biased = (int)((bits >> 52) & 0x7ff);
        var fraction = bits & 0xfffffffffffffL;
        Assert.True(biased is > 0 and < 0x7ff, "normal doubles only");
        var mantissa = new BigInteger(fraction | (1L << 52));
        return (x < 0 ? -mantissa : mantissa, biased - 1075);
    }

    [Theory]
    [InlineData(0.0625)]       // where MathNet 5.0's Expm1 was measured 1.3e-7 off
    [InlineData(-0.0625)]
    [InlineData(1e-10)]        // exp(x) − 1 as written keeps about 6 digits here
    [InlineData(-1e-10)]
    [InlineData(1e-300)]
    [InlineData(0.5)]
    [InlineData(-0.5)]
    [InlineData(0.9999999)]
    [InlineData(-0.9999999)]
    [InlineData(3.0517578125e-5)]
    [InlineData(0.34657359027997264)] // ln 2 / 2, where u − 1 and ln u are both inexact
    public void ExpM1_SmallArguments_MatchExactSeries(double x)
    {
        var error = RelativeErrorAgainstSeries(x, ElementaryFunctions.ExpM1(x));
        Assert.True(Math.Abs(error) <= Tolerance, $"x = {x:R}: relative error {error:E3}");
    }

    [Property(Replay = "(20261203,1)", MaxTest = 2000)]
    public bool ExpM1_RandomArgumentsAcrossScales_MatchExactSeries(int mantissa, int scale)
    {
        // x = ±f · 2^−s with f ∈ [0.5, 1) and s ∈ [0, 60]: every binade from 1 down to 1e-18.
        var f = 0.5 + (mantissa & 0x7fffffff) / (2.0 * int.MaxValue);
        var x = Math.ScaleB(f, -((scale & 0x7fffffff) % 61)) * (mantissa < 0 ? -1 : 1);
        if (!(Math.Abs(x) < 1))
        {
            return true;
        }
        return Math.Abs(RelativeErrorAgainstSeries(x, ElementaryFunctions.ExpM1(x))) <= Tolerance;
    }

    [Fact]
    public void ExpM1_One_IsEMinusOne()
    {
        // e − 1 = 1.718281828459045235360287… (e to 21 digits: OEIS A001113; docs/references.md). At x = 1 the
        // function takes exp(1) − 1 as written: within one rounding of exp and one of the subtraction.
        Assert.Equal(1.718281828459045235360287, ElementaryFunctions.ExpM1(1), 2 * FloatingPoint.MachineEpsilon * 1.8);
    }

    [Fact]
    public void ExpM1_Extremes_ZeroSignInfinityAndNaN()
    {
        // e^x − 1 → −1 as x → −∞ and overflows with e^x; expm1(±0) = ±0 and NaN propagates (IEEE 754-2008 §9.2
        // recommends these; docs/references.md).
        Assert.Equal(-1.0, ElementaryFunctions.ExpM1(-50));
        Assert.Equal(-1.0, ElementaryFunctions.ExpM1(double.NegativeInfinity));
        Assert.Equal(double.PositiveInfinity, ElementaryFunctions.ExpM1(710));
        Assert.Equal(double.PositiveInfinity, ElementaryFunctions.ExpM1(double.PositiveInfinity));
        Assert.True(double.IsNaN(ElementaryFunctions.ExpM1(double.NaN)));
        Assert.Equal(0.0, ElementaryFunctions.ExpM1(0.0));
        Assert.True(double.IsNegative(ElementaryFunctions.ExpM1(-0.0)));
    }

    [Fact]
    public void SeriesReference_SeesTheErrorOfExpMinusOneAsWritten()
    {
        // The reference must be able to fail: exp(x) − 1 at x = 1e-10 keeps about 6 digits (ε/x ≈ 2e-6 relative bound).
        var naive = Math.Exp(1e-10) - 1;
        Assert.True(Math.Abs(RelativeErrorAgainstSeries(1e-10, naive)) > 1e-9);
    }

    /// <summary>
    /// Softplus ln(1 + e^x) against the series ln(1 + z) = z − z²/2 + z³/3 − … (Abramowitz and Stegun 4.1.24) with
    /// z = e^(−|x|): for |x| ≥ 20, z ≤ 2e-9 and the first two terms leave an error below z³/3 ≈ 3e-27 of the result's
    /// z, far under the 4 ε asserted; x = 0 gives ln 2 exactly rounded. Far below a Fermi level (x = −40, −700) the result is
    /// e^x itself, where ln(1 + e^x) as written returns 0.
    /// </summary>
    [Theory]
    [InlineData(-700.0)]
    [InlineData(-40.0)]
    [InlineData(-20.0)]
    [InlineData(20.0)]
    [InlineData(40.0)]
    public void Softplus_FarFromZero_MatchesTheSeriesOfLog1p(double x)
    {
        var z = Math.Exp(-Math.Abs(x));
        var tail = z - z * z / 2;
        var expected = x > 0 ? x + tail : tail;
        var actual = ElementaryFunctions.Softplus(x);
        Assert.True(Math.Abs(actual - expected) <= Tolerance * expected, $"softplus({x}) = {actual:R}, series {expected:R}");
    }

    /// <summary>ln(1 + e⁰) = ln 2 (to the rounding of Math.Log(2); a fact of arithmetic, no source needed).</summary>
    [Fact]
    public void Softplus_AtZero_IsLogTwo() => Assert.Equal(Math.Log(2), ElementaryFunctions.Softplus(0), 15);
}
