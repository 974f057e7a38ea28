// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Periodic.Cli.Output;

/// <summary>
/// A double in its shortest round-trip decimal form, as UTF-8, byte for byte what <c>double.TryFormat(…, "R",
/// CultureInfo.InvariantCulture)</c> writes, several times faster: the table of a large sweep is mostly such numbers.
/// </summary>
/// <remarks>
/// The digits come from the Ryū algorithm (Ulf Adams, "Ryū: fast float-to-string conversion", PLDI 2018): the shortest
/// decimal in the interval of reals that read back to the double, the one nearest the double where several are that
/// short. The layout is .NET's for "R": fixed notation from 10^−4 up to below 10^17 in magnitude (e.g. <c>0.0001</c>,
/// <c>10000000000000000</c>, <c>123456789012345.67</c>), otherwise one digit, the rest after a point and <c>E±XX</c> (at
/// least two exponent digits: <c>1E+17</c>, <c>1E-05</c>, <c>5E-324</c>). Zero, infinities, NaN and powers of two are left to .NET.
/// The tests compare both on millions of doubles of every exponent.
/// </remarks>
internal static class ShortestDecimal
{
    /// <summary>Longest form: a sign, 17 digits, a point, "E", an exponent sign and three digits (25 with slack).</summary>
    public const int MaxBytes = 25;

    private const int MantissaBits = 52;
    private const int ExponentBias = 1023;
    private const int Pow5InverseBitCount = 125;
    private const int Pow5BitCount = 125;
    private const int InverseTableSize = 342;
    private const int TableSize = 326;

    // 5^q as 125-bit numbers (high bits of 5^i; 2^k / 5^q rounded up), low and high 64-bit halves.
    private static readonly (ulong Low, ulong High)[] Pow5Split = BuildPow5Split();
    private static readonly (ulong Low, ulong High)[] Pow5InverseSplit = BuildPow5InverseSplit();

    private static (ulong, ulong)[] BuildPow5Split()
    {
        var table = new (ulong, ulong)[TableSize];
        for (var i = 0; i < table.Length; i++)
        {
            var pow = BigInteger.Pow(5, i);
            var shift = (int)pow.GetBitLength() - Pow5BitCount;
            var split = shift >= 0 ? pow >> shift : pow << -shift;
            table[i] = Halves(split);
        }
        return table;
    }

    private static (ulong, ulong)[] BuildPow5InverseSplit()
    {
        var table = new (ulong, ulong)[InverseTableSize];
        for (var i = 0; i < table.Length; i++)
        {
            var pow = BigInteger.Pow(5, i);
            var j = (int)pow.GetBitLength() - 1 + Pow5InverseBitCount;
            table[i] = Halves((BigInteger.One << j) / pow + 1);
        }
        return table;
    }

    private static (ulong, ulong) Halves(BigInteger value) => ((ulong)(value & ulong.MaxValue), (ulong)(value >> 64));

    /// <summary>Writes <paramref name="value"/> into <paramref name="destination"/> (at least <see cref="MaxBytes"/> long); returns the byte count.</summary>
    public static int Format(double value, Span<byte> destination)
    {
        var bits = BitConverter.DoubleToUInt64Bits(value);
        var ieeeMantissa = bits & ((1UL << MantissaBits) - 1);
        var ieeeExponent = (int)((bits >> MantissaBits) & 0x7FF);
        // Zero, infinities, NaN, and powers of two (whose interval is narrower below than above: there .NET's digits can
        // differ from the shortest, and its bytes are the ones to keep) go to .NET.
        if (ieeeExponent == 0x7FF || ieeeMantissa == 0)
        {
            value.TryFormat(destination, out var written, "R", CultureInfo.InvariantCulture);
            return written;
        }
        var (digits, exponent) = Shortest(ieeeMantissa, ieeeExponent);
        return Layout(bits >> 63 != 0, digits, exponent, destination);
    }

    /// <summary>Ryū: the shortest decimal digits and their power of ten (value = digits × 10^exponent).</summary>
    private static (ulong Digits, int Exponent) Shortest(ulong ieeeMantissa, int ieeeExponent)
    {
        int e2;
        ulong m2;
        if (ieeeExponent == 0)
        {
            e2 = 1 - ExponentBias - MantissaBits - 2;
            m2 = ieeeMantissa;
        }
        else
        {
            e2 = ieeeExponent - ExponentBias - MantissaBits - 2;
            m2 = (1UL << MantissaBits) | ieeeMantissa;
        }
        var even = (m2 & 1) == 0;
        var acceptBounds = even;

        // The interval of reals that round to the double: (mm, mp) around mv, scaled by 4 so the bounds are integers.
        var mv = 4 * m2;
        var mmShift = ieeeMantissa != 0 || ieeeExponent <= 1 ? 1u : 0u;

        ulong vr, vp, vm;
        int e10;
        var vmIsTrailingZeros = false;
        var vrIsTrailingZeros = false;
        if (e2 >= 0)
        {
            var q = Log10Pow2(e2) - (e2 > 3 ? 1 : 0);
            e10 = q;
            var k = Pow5InverseBitCount + Pow5Bits(q) - 1;
            var i = -e2 + q + k;
            var multiplier = Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(Pow5InverseSplit), q); // q < 342 (Ryū's bound)
            vr = MulShift(4 * m2, multiplier, i);
            vp = MulShift(4 * m2 + 2, multiplier, i);
            vm = MulShift(4 * m2 - 1 - mmShift, multiplier, i);
            if (q <= 21)
            {
                // Only one of mp, mv and mm can be a multiple of 5, if any.
                if (mv % 5 == 0)
                {
                    vrIsTrailingZeros = MultipleOfPowerOf5(mv, q);
                }
                else if (acceptBounds)
                {
                    vmIsTrailingZeros = MultipleOfPowerOf5(mv - 1 - mmShift, q);
                }
                else
                {
                    vp -= MultipleOfPowerOf5(mv + 2, q) ? 1UL : 0UL;
                }
            }
        }
        else
        {
            var q = Log10Pow5(-e2) - (-e2 > 1 ? 1 : 0);
            e10 = q + e2;
            var i = -e2 - q;
            var k = Pow5Bits(i) - Pow5BitCount;
            var j = q - k;
            var multiplier = Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(Pow5Split), i); // i < 326 (Ryū's bound)
            vr = MulShift(4 * m2, multiplier, j);
            vp = MulShift(4 * m2 + 2, multiplier, j);
            vm = MulShift(4 * m2 - 1 - mmShift, multiplier, j);
            if (q <= 1)
            {
                // mv = 4 m2 has at least two trailing zero bits, and so does vr.
                vrIsTrailingZeros = true;
                if (acceptBounds)
                {
                    vmIsTrailingZeros = mmShift == 1;
                }
                else
                {
                    vp--;
                }
            }
            else if (q < 63)
            {
                vrIsTrailingZeros = MultipleOfPowerOf2(mv, q);
            }
        }

        // Remove digits while the interval still holds a shorter number.
        var removed = 0;
        var lastRemovedDigit = 0;
        ulong output;
        if (vmIsTrailingZeros || vrIsTrailingZeros)
        {
            while (vp / 10 > vm / 10)
            {
                vmIsTrailingZeros &= vm % 10 == 0;
                RemoveDigit(ref vr, ref vp, ref vm, ref lastRemovedDigit, ref vrIsTrailingZeros);
                removed++;
            }
            if (vmIsTrailingZeros)
            {
                while (vm % 10 == 0)
                {
                    RemoveDigit(ref vr, ref vp, ref vm, ref lastRemovedDigit, ref vrIsTrailingZeros);
                    removed++;
                }
            }
            if (vrIsTrailingZeros && lastRemovedDigit == 5 && vr % 2 == 0)
            {
                lastRemovedDigit = 4; // exactly halfway: round to even
            }
            output = vr + ((vr == vm && (!acceptBounds || !vmIsTrailingZeros)) || lastRemovedDigit >= 5 ? 1UL : 0UL);
        }
        else
        {
            // The common case (Ryū's own order of operations): each quotient computed once, remainders from it.
            var roundUp = false;
            var vpDiv100 = vp / 100;
            var vmDiv100 = vm / 100;
            if (vpDiv100 > vmDiv100)
            {
                var vrDiv100 = vr / 100;
                roundUp = vr - 100 * vrDiv100 >= 50;
                vr = vrDiv100;
                vp = vpDiv100;
                vm = vmDiv100;
                removed += 2;
            }
            while (true)
            {
                var vpDiv10 = vp / 10;
                var vmDiv10 = vm / 10;
                if (vpDiv10 <= vmDiv10)
                {
                    break;
                }
                var vrDiv10 = vr / 10;
                roundUp = vr - 10 * vrDiv10 >= 5;
                vr = vrDiv10;
                vp = vpDiv10;
                vm = vmDiv10;
                removed++;
            }
            output = vr + (vr == vm || roundUp ? 1UL : 0UL);
        }
        return (output, e10 + removed);
    }

    /// <summary>Drops the last digit of the value and of both bounds, keeping whether all digits dropped from the value were zeros.</summary>
    private static void RemoveDigit(ref ulong vr, ref ulong vp, ref ulong vm, ref int lastRemovedDigit, ref bool vrIsTrailingZeros)
    {
        vrIsTrailingZeros &= lastRemovedDigit == 0;
        lastRemovedDigit = (int)(vr % 10);
        vr /= 10;
        vp /= 10;
        vm /= 10;
    }

    /// <summary>.NET's "R" layout of ± <paramref name="digits"/> × 10^<paramref name="exponent"/>.</summary>
    private static int Layout(bool negative, ulong digits, int exponent, Span<byte> destination)
    {
        var count = DecimalLength(digits);
        // The decimal point sits after `scale` digits (value = 0.d1d2… × 10^scale).
        var scale = exponent + count;
        var k = 0;
        if (negative)
        {
            destination[k++] = (byte)'-';
        }
        if (scale > 17 || scale < -3)
        {
            // d.ddd…E±XX: the digits one place on, the first moved before the point.
            WriteDigits(digits, destination.Slice(k + 1, count));
            destination[k] = destination[k + 1];
            if (count > 1)
            {
                destination[k + 1] = (byte)'.';
                k += count + 1;
            }
            else
            {
                k++;
            }
            destination[k++] = (byte)'E';
            var power = scale - 1;
            destination[k++] = power < 0 ? (byte)'-' : (byte)'+';
            power = Math.Abs(power);
            if (power >= 100)
            {
                destination[k++] = (byte)('0' + power / 100);
                power %= 100;
            }
            destination[k++] = DigitPairs[2 * power];
            destination[k++] = DigitPairs[2 * power + 1];
        }
        else if (scale <= 0)
        {
            destination[k++] = (byte)'0';
            destination[k++] = (byte)'.';
            for (var z = scale; z < 0; z++)
            {
                destination[k++] = (byte)'0'; // at most three: smaller magnitudes take the exponent form
            }
            WriteDigits(digits, destination.Slice(k, count));
            k += count;
        }
        else if (scale < count)
        {
            // ddd.ddd: the digits one place on, those before the point moved back.
            WriteDigits(digits, destination.Slice(k + 1, count));
            for (var i = 0; i < scale; i++)
            {
                destination[k + i] = destination[k + 1 + i]; // a few bytes: cheaper than a memmove call
            }
            destination[k + scale] = (byte)'.';
            k += count + 1;
        }
        else
        {
            WriteDigits(digits, destination.Slice(k, count));
            k += count;
            destination.Slice(k, scale - count).Fill((byte)'0');
            k += scale - count;
        }
        return k;
    }

    /// <summary>Decimal digits of <paramref name="value"/> (1 to 17 here).</summary>
    private static int DecimalLength(ulong value)
    {
        // ⌊log10⌋ from the bit length (1233/4096 ≈ log10 2), one too small at most.
        var guess = ((64 - BitOperations.LeadingZeroCount(value | 1)) * 1233) >> 12;
        return guess + (value >= PowersOfTen[guess] ? 1 : 0);
    }

    private static ReadOnlySpan<ulong> PowersOfTen =>
    [
        1, 10, 100, 1_000, 10_000, 100_000, 1_000_000, 10_000_000, 100_000_000, 1_000_000_000, 10_000_000_000,
        100_000_000_000, 1_000_000_000_000, 10_000_000_000_000, 100_000_000_000_000, 1_000_000_000_000_000,
        10_000_000_000_000_000, 100_000_000_000_000_000, 1_000_000_000_000_000_000, 10_000_000_000_000_000_000,
    ];

    /// <summary>All <paramref name="destination"/>.Length digits of <paramref name="value"/>, eight at a time in 32-bit arithmetic.</summary>
    private static void WriteDigits(ulong value, Span<byte> destination)
    {
        ref var first = ref MemoryMarshal.GetReference(destination);
        var end = destination.Length;
        while (value >= 100_000_000)
        {
            var high = value / 100_000_000;
            end -= 8;
            WriteEight((uint)(value - high * 100_000_000), ref Unsafe.Add(ref first, end));
            value = high;
        }
        var rest = (uint)value;
        while (end >= 2)
        {
            var pair = rest % 100;
            rest /= 100;
            end -= 2;
            WritePair(pair, ref Unsafe.Add(ref first, end));
        }
        if (end == 1)
        {
            first = (byte)('0' + rest);
        }
    }

    /// <summary>The eight digits of <paramref name="value"/> (below 10^8, leading zeros written) from <paramref name="destination"/> on.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void WriteEight(uint value, ref byte destination)
    {
        // Two independent halves of four digits, each two pairs: short chains of multiplications instead of four divisions in a row.
        var high = value / 10_000;
        var low = value - high * 10_000;
        var highPair = high / 100;
        var lowPair = low / 100;
        WritePair(highPair, ref destination);
        WritePair(high - highPair * 100, ref Unsafe.Add(ref destination, 2));
        WritePair(lowPair, ref Unsafe.Add(ref destination, 4));
        WritePair(low - lowPair * 100, ref Unsafe.Add(ref destination, 6));
    }

    /// <summary>The two digits of <paramref name="pair"/> (below 100) as one two-byte store.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void WritePair(uint pair, ref byte destination) =>
        Unsafe.WriteUnaligned(ref destination, Unsafe.ReadUnaligned<ushort>(ref Unsafe.Add(ref MemoryMarshal.GetReference(DigitPairs), (nint)(2 * pair))));

    private static ReadOnlySpan<byte> DigitPairs =>
        "00010203040506070809101112131415161718192021222324252627282930313233343536373839404142434445464748495051525354555657585960616263646566676869707172737475767778798081828384858687888990919293949596979899"u8;

    // ⌊log10(2^e)⌋ for 0 ≤ e ≤ 1650, ⌊log10(5^e)⌋ for 0 ≤ e ≤ 2620, and the bit length of 5^e (Ryū's approximations).
    private static int Log10Pow2(int e) => (int)(((uint)e * 78913) >> 18);

    private static int Log10Pow5(int e) => (int)(((uint)e * 732923) >> 20);

    private static int Pow5Bits(int e) => (int)(((uint)e * 1217359) >> 19) + 1;

    private static bool MultipleOfPowerOf5(ulong value, int p)
    {
        var count = 0;
        while (value % 5 == 0 && value != 0)
        {
            value /= 5;
            count++;
        }
        return count >= p;
    }

    private static bool MultipleOfPowerOf2(ulong value, int p) => (value & ((1UL << p) - 1)) == 0;

    /// <summary>(m × multiplier) >> shift for the 128-bit multiplier and 64 &lt; shift &lt; 128 (the result fits 64 bits).</summary>
    private static ulong MulShift(ulong m, (ulong Low, ulong High) multiplier, int shift)
    {
        var carry = Math.BigMul(m, multiplier.Low, out _); // the high half of m × low: the low half cannot reach the result
        var high = Math.BigMul(m, multiplier.High, out var low);
        var sum = low + carry;
        if (sum < carry)
        {
            high++;
        }
        var distance = shift - 64;
        return (high << (64 - distance)) | (sum >> distance);
    }
}
