// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Runtime.CompilerServices;
using Periodic.Structures;
using Periodic.Units;

using Periodic.Transfer;

namespace Periodic.Properties;

/// <summary>
/// D(E) = Tr M(E) and its first three exact energy derivatives at one energy, as mantissas times
/// e^<see cref="LogScale"/>: D⁽ⁿ⁾ = Dn·e^LogScale (1/eVⁿ).
/// </summary>
internal readonly record struct DispersionJet(double D0, double D1, double D2, double D3, double LogScale)
{
    internal double Scale => Math.Exp(LogScale);
}

/// <summary>
/// Truncated Taylor arithmetic (order 3) through the cell: every transfer-matrix entry is carried as
/// its Taylor coefficients in δE, f(E + δE) = a0 + a1·δE + a2·δE² + a3·δE³, so the product rule and
/// the chain rule (Faà di Bruno) give exact second and third derivatives of D(E) in one pass
/// (automatic differentiation in Taylor mode: A. Griewank and A. Walther, Evaluating Derivatives,
/// 2nd ed., SIAM 2008, ch. 13).
/// </summary>
/// <remarks>
/// Chosen over finite differences of the exact D′(E) because it has no step size to tune and keeps
/// full precision at closed gaps, where D′ vanishes and the third derivative decides the mass.
/// Rounding is that of the core's first-derivative product (a few ulps of the largest entry).
/// Supports uniform layers (with non-parabolicity), delta barriers and smooth segments; for the latter the
/// derivatives are those of the fourth-order Magnus discretisation at the segments' step counts, which converge
/// to the exact ones like the band energies (h⁴).
/// </remarks>
internal static class DispersionDerivatives
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    internal static DispersionJet Evaluate(UnitCell cell, double e) => Evaluate(new CompiledCell(cell.ElementSpan, nameof(cell)), e);

    internal static DispersionJet Evaluate(CompiledCell cell, double e)
    {
        // P = identity; each entry a jet.
        Jet p11 = Jet.Constant(1), p12 = default, p21 = default, p22 = Jet.Constant(1);
        double logScale = 0;
        for (var i = 0; i < cell.Count; i++)
        {
            if (cell.IsLayer(i))
            {
                LayerJets(cell, i, e, out var m11, out var m12, out var m21, out var m22, out var l);
                ApplyLeft(m11, m12, m21, m22, l, ref p11, ref p12, ref p21, ref p22, ref logScale);
            }
            else if (cell.IsDelta(i))
            {
                ApplyLeft(Jet.Constant(1), default, Jet.Constant(cell.DeltaJump(i)), Jet.Constant(1), 0,
                    ref p11, ref p12, ref p21, ref p22, ref logScale);
            }
            else
            {
                var mesh = cell.Segment(i).Mesh;
                for (var j = 0; j < mesh.StepCount; j++)
                {
                    StepJets(mesh, j, e, out var m11, out var m12, out var m21, out var m22, out var l);
                    ApplyLeft(m11, m12, m21, m22, l, ref p11, ref p12, ref p21, ref p22, ref logScale);
                }
            }
        }
        var trace = p11 + p22;
        // Taylor coefficients to derivatives: D'' = 2 a2, the third derivative = 6 a3.
        return new DispersionJet(trace.A0, trace.A1, 2 * trace.A2, 6 * trace.A3, logScale);
    }

    /// <summary>P ← M·P for jets, renormalised by powers of two (exact) so that long products do not overflow.</summary>
    private static void ApplyLeft(Jet m11, Jet m12, Jet m21, Jet m22, double l, ref Jet p11, ref Jet p12, ref Jet p21, ref Jet p22, ref double logScale) =>
        JetMatrix.ApplyLeft(m11, m12, m21, m22, l, ref p11, ref p12, ref p21, ref p22, ref logScale);

    /// <summary>
    /// Jets of one fourth-order Magnus step M = exp Ω = c(ζ)·I + S(ζ)·Ω of a smooth segment (see
    /// <see cref="MagnusSegmentPropagator"/>): Ω = [[α, β], [γ, −α]] is linear in E (α = α₀ − α₁E,
    /// γ = γ₀ − γ₁E), so ζ = −(α² + βγ) is an exact quadratic in δE and c, S are composed with it by
    /// Faà di Bruno's formula. These are the exact derivatives of the discretised model.
    /// </summary>
    private static void StepJets(SegmentMesh mesh, int j, double e, out Jet m11, out Jet m12, out Jet m21, out Jet m22, out double logScale)
    {
        var alpha = new Jet(mesh.Alpha0[j] - mesh.Alpha1[j] * e, -mesh.Alpha1[j], 0, 0);
        var gamma = new Jet(mesh.Gamma0[j] - mesh.Gamma1[j] * e, -mesh.Gamma1[j], 0, 0);
        var beta = mesh.Beta[j];
        var zeta = -1.0 * (alpha * alpha + beta * gamma);
        UniformLayerPropagator.Taylor3(zeta.A0, 1.0, out var c, out var sinc, out logScale);
        var cJet = Compose(c, zeta);
        var sJet = Compose(sinc, zeta);
        var sAlpha = sJet * alpha;
        m11 = cJet + sAlpha;
        m22 = cJet + -1.0 * sAlpha;
        m12 = beta * sJet;
        m21 = sJet * gamma;
    }

    private static void LayerJets(CompiledCell cell, int i, double e, out Jet m11, out Jet m12, out Jet m21, out Jet m22, out double logScale)
    {
        var (width, potential, bandEdgeMass, slope) = cell.LayerData(i);
        var excess = e - potential;
        var mass = new Jet(bandEdgeMass + slope * excess, slope, 0, 0);
        var s = (1.0 / C) * (mass * new Jet(excess, 1, 0, 0));
        UniformLayerPropagator.Taylor3(s.A0, width, out var c, out var sinc, out logScale);
        var cJet = Compose(c, s);
        var sJet = Compose(sinc, s);
        m11 = cJet;
        m22 = cJet;
        m12 = mass * sJet;
        m21 = -1.0 * (s * sJet * Reciprocal(mass));
    }

    /// <summary>g(s(E)) for g given by Taylor coefficients at s0 = s.A0 (Faà di Bruno to order 3).</summary>
    private static Jet Compose((double G0, double G1, double G2, double G3) g, Jet s) => new(
        g.G0,
        g.G1 * s.A1,
        g.G1 * s.A2 + g.G2 * s.A1 * s.A1,
        g.G1 * s.A3 + 2 * g.G2 * s.A1 * s.A2 + g.G3 * s.A1 * s.A1 * s.A1);

    private static Jet Reciprocal(Jet x)
    {
        var r0 = 1.0 / x.A0;
        var r1 = -x.A1 * r0 * r0;
        var r2 = -(x.A1 * r1 + x.A2 * r0) * r0;
        var r3 = -(x.A1 * r2 + x.A2 * r1 + x.A3 * r0) * r0;
        return new Jet(r0, r1, r2, r3);
    }

    /// <summary>Taylor coefficients a0 … a3 of a function of δE.</summary>
    private readonly record struct Jet(double A0, double A1, double A2, double A3) : IMatrixJet<Jet>
    {
        internal static Jet Constant(double value) => new(value, 0, 0, 0);

        public double MaxAbs => Math.Max(Math.Max(Math.Abs(A0), Math.Abs(A1)), Math.Max(Math.Abs(A2), Math.Abs(A3)));

        public Jet ScaleB(int exponent) => new(Math.ScaleB(A0, exponent), Math.ScaleB(A1, exponent), Math.ScaleB(A2, exponent), Math.ScaleB(A3, exponent));

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public static Jet operator *(Jet x, Jet y) => new(
            x.A0 * y.A0,
            x.A0 * y.A1 + x.A1 * y.A0,
            x.A0 * y.A2 + x.A1 * y.A1 + x.A2 * y.A0,
            x.A0 * y.A3 + x.A1 * y.A2 + x.A2 * y.A1 + x.A3 * y.A0);

        public static Jet operator *(double f, Jet x) => new(f * x.A0, f * x.A1, f * x.A2, f * x.A3);

        public static Jet operator +(Jet x, Jet y) => new(x.A0 + y.A0, x.A1 + y.A1, x.A2 + y.A2, x.A3 + y.A3);
    }
}
