// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using System.Runtime.CompilerServices;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// A quantity f(E, p) with its exact derivatives f, ∂f/∂E, ∂²f/∂E², ∂f/∂p and ∂²f/∂E∂p at one point: forward-mode
/// automatic differentiation truncated to what the implicit derivative of a stationary point needs (A. Griewank and
/// A. Walther, Evaluating Derivatives, 2nd ed., SIAM 2008, ch. 13). Products follow Leibniz's rule term by term.
/// </summary>
internal readonly record struct ParameterJet(double Value, double E, double EE, double P, double EP) : IMatrixJet<ParameterJet>
{
    internal static ParameterJet Constant(double value) => new(value, 0, 0, 0, 0);

    public double MaxAbs => Math.Max(Math.Max(Math.Max(Math.Abs(Value), Math.Abs(E)), Math.Max(Math.Abs(EE), Math.Abs(P))), Math.Abs(EP));

    public ParameterJet ScaleB(int exponent) =>
        new(Math.ScaleB(Value, exponent), Math.ScaleB(E, exponent), Math.ScaleB(EE, exponent), Math.ScaleB(P, exponent), Math.ScaleB(EP, exponent));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static ParameterJet operator *(ParameterJet x, ParameterJet y) => new(
        x.Value * y.Value,
        x.E * y.Value + x.Value * y.E,
        x.EE * y.Value + 2 * x.E * y.E + x.Value * y.EE,
        x.P * y.Value + x.Value * y.P,
        x.EP * y.Value + x.E * y.P + x.P * y.E + x.Value * y.EP);

    public static ParameterJet operator *(double f, ParameterJet x) => new(f * x.Value, f * x.E, f * x.EE, f * x.P, f * x.EP);

    public static ParameterJet operator +(ParameterJet x, ParameterJet y) => new(x.Value + y.Value, x.E + y.E, x.EE + y.EE, x.P + y.P, x.EP + y.EP);

    public static ParameterJet operator -(ParameterJet x, ParameterJet y) => new(x.Value - y.Value, x.E - y.E, x.EE - y.EE, x.P - y.P, x.EP - y.EP);

    /// <summary>1/x by the chain rule.</summary>
    internal ParameterJet Reciprocal()
    {
        var r = 1 / Value;
        var r2 = r * r;
        return new ParameterJet(r, -E * r2, 2 * E * E * r2 * r - EE * r2, -P * r2, 2 * E * P * r2 * r - EP * r2);
    }

    /// <summary>ln x by the chain rule (x &gt; 0).</summary>
    internal ParameterJet Log()
    {
        var r = 1 / Value;
        return new ParameterJet(Math.Log(Value), E * r, EE * r - E * E * r * r, P * r, EP * r - E * P * r * r);
    }
}

/// <summary>A truncated-derivative number (a jet) that transfer matrices can carry as entries.</summary>
internal interface IMatrixJet<T> : IAdditionOperators<T, T, T>, IMultiplyOperators<T, T, T>
    where T : struct, IMatrixJet<T>
{
    /// <summary>The largest magnitude of its components (for renormalisation).</summary>
    double MaxAbs { get; }

    /// <summary>Every component times 2^exponent (exact).</summary>
    T ScaleB(int exponent);
}

/// <summary>The one product step of matrices with jet entries: P ← M·P, renormalised by exact powers of two.</summary>
internal static class JetMatrix
{
    /// <summary>
    /// P ← M·P for 2×2 matrices of jets, M scaled by e^<paramref name="logScale"/>; the product is kept inside
    /// [1e-120, 1e120] by powers of two (exact), which are added to <paramref name="productLogScale"/>.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void ApplyLeft<T>(T m11, T m12, T m21, T m22, double logScale, ref T p11, ref T p12, ref T p21, ref T p22, ref double productLogScale)
        where T : struct, IMatrixJet<T>
    {
        var q11 = m11 * p11 + m12 * p21;
        var q12 = m11 * p12 + m12 * p22;
        var q21 = m21 * p11 + m22 * p21;
        var q22 = m21 * p12 + m22 * p22;
        productLogScale += logScale;
        var max = Math.Max(Math.Max(q11.MaxAbs, q12.MaxAbs), Math.Max(q21.MaxAbs, q22.MaxAbs));
        if (max > 1e120 || (max < 1e-120 && max > 0))
        {
            var exponent = Math.ILogB(max);
            (q11, q12, q21, q22) = (q11.ScaleB(-exponent), q12.ScaleB(-exponent), q21.ScaleB(-exponent), q22.ScaleB(-exponent));
            productLogScale += exponent * Math.Log(2.0);
        }
        (p11, p12, p21, p22) = (q11, q12, q21, q22);
    }
}

/// <summary>
/// The transfer product P = M_n ⋯ M_1 over a compiled sequence with every entry a <see cref="ParameterJet"/> in the energy E
/// and one parameter p (the width, potential or mass of a set of layers), as mantissas times e^<see cref="LogScale"/>.
/// </summary>
internal readonly record struct SecondOrderProduct(ParameterJet P11, ParameterJet P12, ParameterJet P21, ParameterJet P22, double LogScale);

/// <summary>
/// The layer matrix [[c, m·S], [−(s/m)·S, c]] of <see cref="UniformLayerPropagator"/> as jets in (E, p): c and S are
/// composed with s(E, p) = m(E, p)·(E − V)/C and the width w(p) by the chain rule, from their s-derivatives
/// (<see cref="UniformLayerPropagator.Taylor3"/>) and ∂c/∂w = −s·S, ∂S/∂w = c.
/// </summary>
internal static class LayerJets
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>
    /// The jets of a layer of width <paramref name="width"/>, potential <paramref name="potential"/>, band-edge mass
    /// <paramref name="bandEdgeMass"/> and mass slope <paramref name="massSlope"/> = m·α at <paramref name="e"/>, with p the
    /// layer's <paramref name="parameter"/> when <paramref name="isVaried"/> (else p does not enter); scaled by e^logScale.
    /// </summary>
    internal static void Evaluate(double e, double width, double potential, double bandEdgeMass, double massSlope, bool isVaried, LayerParameter parameter,
        out ParameterJet m11, out ParameterJet m12, out ParameterJet m21, out ParameterJet m22, out double logScale)
    {
        var excessValue = e - potential;
        var byPotential = isVaried && parameter == LayerParameter.Potential;
        var byMass = isVaried && parameter == LayerParameter.Mass;
        var byWidth = isVaried && parameter == LayerParameter.Width ? 1.0 : 0.0;
        var excess = new ParameterJet(excessValue, 1, 0, byPotential ? -1 : 0, 0);
        var massValue = bandEdgeMass + massSlope * excessValue;
        // m = m₀(1 + α(E − V)) with α fixed: ∂m/∂V = −m₀α, ∂m/∂m₀ = m/m₀, ∂²m/∂E∂m₀ = α.
        var mass = new ParameterJet(massValue, massSlope, 0,
            byPotential ? -massSlope : byMass ? massValue / bandEdgeMass : 0,
            byMass ? massSlope / bandEdgeMass : 0);
        var s = (1 / C) * (mass * excess);
        UniformLayerPropagator.Taylor3(s.Value, width, out var c, out var sinc, out logScale);
        // Actual s-derivatives from Taylor coefficients: g_s = g1, g_ss = 2·g2.
        var cJet = Compose(c.Item1, c.Item2, 2 * c.Item3, -s.Value * sinc.Item1, -sinc.Item1 - s.Value * sinc.Item2, s, byWidth);
        var sJet = Compose(sinc.Item1, sinc.Item2, 2 * sinc.Item3, c.Item1, c.Item2, s, byWidth);
        m11 = cJet;
        m22 = cJet;
        m12 = mass * sJet;
        m21 = -1.0 * (s * sJet * mass.Reciprocal());
    }

    /// <summary>g(s(E, p), w(p)) from g, g_s, g_ss, g_w, g_sw at the point, with dw/dp = <paramref name="dwdp"/>.</summary>
    private static ParameterJet Compose(double g, double gs, double gss, double gw, double gsw, ParameterJet s, double dwdp) => new(
        g,
        gs * s.E,
        gss * s.E * s.E + gs * s.EE,
        gs * s.P + gw * dwdp,
        gss * s.E * s.P + gs * s.EP + gsw * s.E * dwdp);
}
