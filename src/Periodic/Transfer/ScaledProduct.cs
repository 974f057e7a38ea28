// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;

namespace Periodic.Transfer;

/// <summary>
/// The kernel's running product P = M_n ⋯ M_1 and a derivative dP (with respect to the energy, or to one layer
/// parameter), as mantissas times e^LogScale. A mutable accumulator used only on the stack of one evaluation; the
/// result of <see cref="CompiledCell.Accumulate"/> and <see cref="CellTransfer.Accumulate"/>.
/// </summary>
internal struct ScaledProduct
{
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;

    internal double P11, P12, P21, P22, D11, D12, D21, D22, LogScale;

    /// <summary>The identity (no derivative).</summary>
    internal static ScaledProduct Identity
    {
        get
        {
            var p = default(ScaledProduct);
            p.Reset();
            return p;
        }
    }

    /// <summary>Tr P as a mantissa (times e^LogScale).</summary>
    internal readonly double TraceMantissa => P11 + P22;

    /// <summary>Tr dP as a mantissa (times e^LogScale).</summary>
    internal readonly double TraceDerivativeMantissa => D11 + D22;

    /// <summary>
    /// det(P·e^LogScale − σI) with σ = ±1 and its derivative, for <paramref name="scale"/> = e^LogScale: the form that
    /// resolves D ∓ 2 near P = ±I (see <see cref="TryShiftedTrace"/>).
    /// </summary>
    internal readonly double DeterminantOffIdentity(double scale, double sign, out double derivative)
    {
        double e11 = P11 * scale - sign, e22 = P22 * scale - sign, m12 = P12 * scale, m21 = P21 * scale;
        derivative = (D11 * e22 + e11 * D22 - D12 * m21 - m12 * D21) * scale;
        return e11 * e22 - m12 * m21;
    }

    /// <summary>
    /// Near M = ±I (the edges of a narrow gap) D ∓ 2 is a difference of nearly equal numbers with an error
    /// ε|M| that moves an edge by ε|M|/|D′|, and |D′| shrinks with the gap. Since det M = 1,
    /// D ∓ 2 = ∓det(M ∓ I) exactly; the determinant of the small matrix N = M ∓ I has an error of only
    /// ε|N|, which keeps the edges of a narrow gap as accurate as those of a wide one.
    /// Used when |N11|, |N22| and √|N12·N21| are at most 1e-3: there the trace would lose more than three digits; elsewhere it is as good.
    /// </summary>
    internal readonly bool TryShiftedTrace(double scale, double target, out double value, out double derivative)
    {
        var sign = target > 0 ? 1.0 : -1.0;
        double n11 = P11 * scale - sign, n22 = P22 * scale - sign, n12 = P12 * scale, n21 = P21 * scale;
        // M12 and M21 carry reciprocal units (mass × length and its inverse): compare their geometric mean.
        if (Math.Max(Math.Max(Math.Abs(n11), Math.Abs(n22)), Math.Sqrt(Math.Abs(n12 * n21))) > 1e-3)
        {
            value = 0;
            derivative = 0;
            return false;
        }
        double d11 = D11 * scale, d12 = D12 * scale, d21 = D21 * scale, d22 = D22 * scale;
        value = -sign * (n11 * n22 - n12 * n21);
        derivative = -sign * (d11 * n22 + n11 * d22 - d12 * n21 - n12 * d21);
        return true;
    }

    internal void Reset()
    {
        P11 = 1; P12 = 0; P21 = 0; P22 = 1;
        D11 = 0; D12 = 0; D21 = 0; D22 = 0;
        LogScale = 0;
    }

    /// <summary>P ← M·P, dP ← dM·P + M·dP, with M and dM scaled by e^logScale.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void ApplyLeft(double m11, double m12, double m21, double m22, double d11, double d12, double d21, double d22, double logScale)
    {
        var q11 = m11 * P11 + m12 * P21;
        var q12 = m11 * P12 + m12 * P22;
        var q21 = m21 * P11 + m22 * P21;
        var q22 = m21 * P12 + m22 * P22;
        var e11 = d11 * P11 + d12 * P21 + m11 * D11 + m12 * D21;
        var e12 = d11 * P12 + d12 * P22 + m11 * D12 + m12 * D22;
        var e21 = d21 * P11 + d22 * P21 + m21 * D11 + m22 * D21;
        var e22 = d21 * P12 + d22 * P22 + m21 * D12 + m22 * D22;
        P11 = q11; P12 = q12; P21 = q21; P22 = q22;
        D11 = e11; D12 = e12; D21 = e21; D22 = e22;
        LogScale += logScale;
        var max = Math.Max(Math.Max(Math.Max(Math.Abs(q11), Math.Abs(q12)), Math.Max(Math.Abs(q21), Math.Abs(q22))),
                           Math.Max(Math.Max(Math.Abs(e11), Math.Abs(e12)), Math.Max(Math.Abs(e21), Math.Abs(e22))));
        if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
        {
            // Powers of two rescale exactly, without rounding.
            var exponent = Math.ILogB(max);
            P11 = Math.ScaleB(P11, -exponent); P12 = Math.ScaleB(P12, -exponent);
            P21 = Math.ScaleB(P21, -exponent); P22 = Math.ScaleB(P22, -exponent);
            D11 = Math.ScaleB(D11, -exponent); D12 = Math.ScaleB(D12, -exponent);
            D21 = Math.ScaleB(D21, -exponent); D22 = Math.ScaleB(D22, -exponent);
            LogScale += exponent * Math.Log(2.0);
        }
    }

    /// <summary>
    /// Keeps a propagated state (u, w)·e^log inside [1e-120, 1e120] by exact powers of two (the state counterpart of the
    /// product's renormalisation); a zero state is left alone.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Renormalise(ref double u, ref double w, ref double log)
    {
        var max = Math.Max(Math.Abs(u), Math.Abs(w));
        if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
        {
            var exponent = Math.ILogB(max);
            u = Math.ScaleB(u, -exponent);
            w = Math.ScaleB(w, -exponent);
            log += exponent * Math.Log(2.0);
        }
    }

    /// <summary>As <see cref="Renormalise(ref double, ref double, ref double)"/> for a state and its derivative, by one power of two set by the larger.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Renormalise(ref double u, ref double w, ref double du, ref double dw, ref double log)
    {
        var max = Math.Max(Math.Max(Math.Abs(u), Math.Abs(w)), Math.Max(Math.Abs(du), Math.Abs(dw)));
        if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
        {
            var exponent = Math.ILogB(max);
            (u, w, du, dw) = (Math.ScaleB(u, -exponent), Math.ScaleB(w, -exponent), Math.ScaleB(du, -exponent), Math.ScaleB(dw, -exponent));
            log += exponent * Math.Log(2.0);
        }
    }
}
