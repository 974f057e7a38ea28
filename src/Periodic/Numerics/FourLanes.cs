// SPDX-License-Identifier: MIT
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace Periodic.Numerics;

/// <summary>
/// Four running sums of products, kept in four lanes whatever vector width the machine or the compiler offers, so that a
/// dot product gives the same bits under the JIT (which uses 256-bit vectors on AVX2 machines) and under NativeAOT
/// (whose baseline has only 128-bit vectors), and therefore the C ABI returns exactly what the .NET API returns.
/// </summary>
/// <remarks>
/// Lane j accumulates the products of elements j, j + 4, j + 8 …; <see cref="Sum"/> adds the lanes in the fixed order
/// (l₀ + l₁) + (l₂ + l₃). Multiply and add stay two roundings (no fused multiply-add), which both implementations honour.
/// </remarks>
internal interface IFourLanes<TSelf> where TSelf : struct, IFourLanes<TSelf>
{
    /// <summary>Elements <paramref name="index"/> … index + 3 of <paramref name="values"/>.</summary>
    static abstract TSelf Load(ReadOnlySpan<double> values, int index);

    /// <summary>sum + a·b lane by lane, product and sum each rounded.</summary>
    static abstract TSelf AddProduct(TSelf sum, TSelf a, TSelf b);

    /// <summary>(l₀ + l₁) + (l₂ + l₃).</summary>
    double Sum();
}

/// <summary>The four lanes in one 256-bit vector (AVX on x64).</summary>
internal readonly struct Lanes256 : IFourLanes<Lanes256>
{
    private readonly Vector256<double> _v;

    private Lanes256(Vector256<double> v) => _v = v;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Lanes256 Load(ReadOnlySpan<double> values, int index) =>
        new(Vector256.LoadUnsafe(ref MemoryMarshal.GetReference(values[index..(index + 4)])));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Lanes256 AddProduct(Lanes256 sum, Lanes256 a, Lanes256 b) => new(sum._v + a._v * b._v);

    public double Sum() => (_v.GetElement(0) + _v.GetElement(1)) + (_v.GetElement(2) + _v.GetElement(3));
}

/// <summary>The four lanes in two 128-bit vectors (SSE2 on x64, AdvSIMD on Arm64).</summary>
internal readonly struct Lanes128Pair : IFourLanes<Lanes128Pair>
{
    private readonly Vector128<double> _low;
    private readonly Vector128<double> _high;

    private Lanes128Pair(Vector128<double> low, Vector128<double> high)
    {
        _low = low;
        _high = high;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Lanes128Pair Load(ReadOnlySpan<double> values, int index)
    {
        ref var first = ref MemoryMarshal.GetReference(values[index..(index + 4)]);
        return new(Vector128.LoadUnsafe(ref first), Vector128.LoadUnsafe(ref first, 2));
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Lanes128Pair AddProduct(Lanes128Pair sum, Lanes128Pair a, Lanes128Pair b) =>
        new(sum._low + a._low * b._low, sum._high + a._high * b._high);

    public double Sum() => (_low.GetElement(0) + _low.GetElement(1)) + (_high.GetElement(0) + _high.GetElement(1));
}
