// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Cli.Output;

namespace Periodic.Cli.Tests.Output;

/// <summary>
/// The sweep table's shortest round-trip decimals against .NET's own "R" format (the reference: the bytes must be those
/// .NET writes, since the table's format is "R"). Inputs come from a fixed seed, so every run checks the same doubles.
/// </summary>
public sealed class ShortestDecimalTest
{
    private static void AssertSameAsRoundTripFormat(double value)
    {
        Span<byte> mine = stackalloc byte[ShortestDecimal.MaxBytes];
        var length = ShortestDecimal.Format(value, mine);
        var expected = value.ToString("R", CultureInfo.InvariantCulture);
        var actual = Encoding.ASCII.GetString(mine[..length]);
        if (expected != actual)
        {
            Assert.Fail($"bits {BitConverter.DoubleToUInt64Bits(value):x16}: .NET writes {expected}, the table would write {actual}");
        }
    }

    [Fact]
    public void Format_RandomBitPatterns_SameBytesAsDotNet()
    {
        // Every exponent and sign, normal and subnormal, alike (NaN and infinities go to .NET itself).
        var random = new Random(20261203);
        for (var i = 0; i < 300_000; i++)
        {
            AssertSameAsRoundTripFormat(BitConverter.UInt64BitsToDouble((ulong)random.NextInt64() ^ ((ulong)random.Next(2) << 63)));
        }
    }

    [Fact]
    public void Format_ValuesOfASweepTable_SameBytesAsDotNet()
    {
        // The magnitudes a table holds (widths in nm, energies in eV, masses in m0, derivatives), both signs.
        var random = new Random(7);
        for (var i = 0; i < 300_000; i++)
        {
            AssertSameAsRoundTripFormat((random.NextDouble() - 0.3) * Math.Pow(10, random.Next(-8, 20)));
        }
    }

    [Fact]
    public void Format_ShortDecimalsAndTheirNeighbours_SameBytesAsDotNet()
    {
        // Doubles nearest short decimals (m × 10^e) sit where the shortest form has trailing zeros or the interval's bounds
        // matter; their neighbours one unit in the last place away test the other side of each bound.
        for (var e = -325; e <= 308; e++)
        {
            for (var m = 1; m < 200; m++)
            {
                var value = double.Parse(string.Create(CultureInfo.InvariantCulture, $"{m}e{e}"), CultureInfo.InvariantCulture);
                AssertSameAsRoundTripFormat(value);
                AssertSameAsRoundTripFormat(Math.BitIncrement(value));
                AssertSameAsRoundTripFormat(Math.BitDecrement(value));
            }
        }
    }

    [Fact]
    public void Format_PowersOfTwoIntegersAndLimits_SameBytesAsDotNet()
    {
        for (var p = -1074; p <= 1023; p++)
        {
            var value = Math.ScaleB(1.0, p);
            AssertSameAsRoundTripFormat(value);
            AssertSameAsRoundTripFormat(Math.BitIncrement(value));
            AssertSameAsRoundTripFormat(Math.BitDecrement(value));
            AssertSameAsRoundTripFormat(-value);
        }
        for (var i = 1; i < 20_000; i++)
        {
            AssertSameAsRoundTripFormat(i);
            AssertSameAsRoundTripFormat(i / 1000.0);
            AssertSameAsRoundTripFormat(-i * 1e-7);
            AssertSameAsRoundTripFormat(BitConverter.UInt64BitsToDouble((ulong)i)); // the smallest subnormals
        }
        // Where the layout changes (fixed from 1e-4 up to below 1e17), and the ends of the range.
        double[] edges = [1e-4, 1e-5, 9.999999999999999e-5, 1e16, 1e17, 99999999999999990, 123456789012345.67, 0.1, -0.0, 0.0,
            double.MaxValue, double.MinValue, double.Epsilon, double.PositiveInfinity, double.NaN, 2.2250738585072014e-308];
        foreach (var value in edges)
        {
            AssertSameAsRoundTripFormat(value);
        }
    }
}
