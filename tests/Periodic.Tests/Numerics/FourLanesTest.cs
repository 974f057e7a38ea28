// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;

namespace Periodic.Tests.Numerics;

public sealed class FourLanesTest
{
    /// <summary>
    /// Both layouts must give the same bits, or the C ABI (NativeAOT, which may lack 256-bit vectors) and the .NET API
    /// (JIT) disagree in the last place. IEEE 754 rounds each product and each sum the same way in any register width,
    /// so the only way to differ is a different order of operations, which this catches.
    /// </summary>
    [Fact]
    public void BothLayouts_GiveTheSameBits_AsTheScalarDefinitionOfTheLanes()
    {
        var random = new Random(20261203);
        for (var trial = 0; trial < 200; trial++)
        {
            var length = 4 * random.Next(1, 64);
            var a = new double[length];
            var b = new double[length];
            for (var i = 0; i < length; i++)
            {
                // Mixed signs and magnitudes over 12 decades, so that a different summation order changes the rounding.
                a[i] = (random.NextDouble() - 0.5) * Math.Pow(10, random.Next(-6, 6));
                b[i] = (random.NextDouble() - 0.5) * Math.Pow(10, random.Next(-6, 6));
            }
            var expected = ScalarLanes(a, b);
            Assert.Equal(BitConverter.DoubleToInt64Bits(expected), BitConverter.DoubleToInt64Bits(Dot<Lanes128Pair>(a, b)));
            Assert.Equal(BitConverter.DoubleToInt64Bits(expected), BitConverter.DoubleToInt64Bits(Dot<Lanes256>(a, b)));
        }
    }

    private static double Dot<TLanes>(double[] a, double[] b) where TLanes : struct, IFourLanes<TLanes>
    {
        TLanes sum = default;
        for (var q = 0; q < a.Length; q += 4)
        {
            sum = TLanes.AddProduct(sum, TLanes.Load(a, q), TLanes.Load(b, q));
        }
        return sum.Sum();
    }

    /// <summary>The documented definition: lane j sums the products j, j + 4 …; then (l₀ + l₁) + (l₂ + l₃).</summary>
    private static double ScalarLanes(double[] a, double[] b)
    {
        var lanes = new double[4];
        for (var q = 0; q < a.Length; q++)
        {
            lanes[q % 4] += a[q] * b[q];
        }
        return (lanes[0] + lanes[1]) + (lanes[2] + lanes[3]);
    }
}
