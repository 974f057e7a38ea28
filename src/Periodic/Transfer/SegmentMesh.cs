// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.CompilerServices;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// The step data of a smooth segment for the fourth-order Magnus propagator: per step j of width h,
/// the potential V and mass m at the two Gauss–Legendre nodes x_j + (1/2 ∓ √3/6)h (<see cref="SegmentSamples"/>), reduced to the
/// coefficients of the traceless step exponent Ω(E) = [[α, β], [γ, −α]] with
/// α = α₀ − α₁E, β fixed, γ = γ₀ − γ₁E (linear in E because the mass does not depend on E).
/// Immutable after construction; shared by every evaluation.
/// </summary>
/// <remarks>
/// Ω = (h/2)(A₁ + A₂) + (√3/12)h²[A₂, A₁] for A(x) = [[0, m], [(V − E)/C, 0]] (A. Iserles and
/// S. P. Nørsett, Phil. Trans. R. Soc. A 357, 983 (1999); S. Blanes, F. Casas and J. Ros, BIT 40,
/// 434 (2000)); [A₂, A₁] = (m₂q₁ − m₁q₂)·diag(1, −1) with q = (V − E)/C.
/// </remarks>
internal sealed class SegmentMesh
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    // Compiled once per segment and shared by every transfer calculation of it (the samples are immutable).
    private static readonly ConditionalWeakTable<SegmentSamples, SegmentMesh> Compiled = new();

    private const double CommutatorWeight = 0.14433756729740644113; // √3/12

    /// <summary>The mesh of <paramref name="segment"/>'s samples, compiled on first use.</summary>
    internal static SegmentMesh Of(IMeshedSegment segment) =>
        Compiled.GetValue(segment.Samples, static samples => new SegmentMesh(samples.Widths, samples.V1, samples.V2, samples.M1, samples.M2));

    internal SegmentMesh(ReadOnlySpan<double> widths, ReadOnlySpan<double> v1, ReadOnlySpan<double> v2, ReadOnlySpan<double> m1, ReadOnlySpan<double> m2)
    {
        var n = widths.Length;
        Alpha0 = new double[n];
        Alpha1 = new double[n];
        Beta = new double[n];
        Gamma0 = new double[n];
        Gamma1 = new double[n];
        for (var j = 0; j < n; j++)
        {
            var h = widths[j];
            var r = CommutatorWeight * h * h / C;
            Alpha0[j] = r * (m2[j] * v1[j] - m1[j] * v2[j]);
            Alpha1[j] = r * (m2[j] - m1[j]);
            Beta[j] = 0.5 * h * (m1[j] + m2[j]);
            Gamma0[j] = 0.5 * h * (v1[j] + v2[j]) / C;
            Gamma1[j] = h / C;
        }
    }

    internal double[] Alpha0 { get; }

    internal double[] Alpha1 { get; }

    internal double[] Beta { get; }

    internal double[] Gamma0 { get; }

    internal double[] Gamma1 { get; }

    internal int StepCount => Beta.Length;

    /// <summary>The width h of step <paramref name="j"/> in nm (γ₁ = h/C).</summary>
    internal double StepWidth(int j) => Gamma1[j] * C;

    /// <summary>
    /// The masses at the two ends of step <paramref name="j"/>, linearly extrapolated from its Gauss-node masses
    /// m₁ + m₂ = 2β/h and m₂ − m₁ = α₁C/(√3/12·h²): exact for a constant or linear mass, O(h²) otherwise.
    /// </summary>
    internal (double Left, double Right) EndMasses(int j)
    {
        var h = StepWidth(j);
        var sum = 2 * Beta[j] / h;
        var difference = Alpha1[j] * C / (CommutatorWeight * h * h);
        // m(τ) = m̄ + (m₂ − m₁)(τ − 1/2)/(Node2 − Node1), Node2 − Node1 = √3/3: at τ = 0 and 1, ∓(√3/2)(m₂ − m₁).
        var half = 0.86602540378443864676 * difference;
        return (0.5 * sum - half, 0.5 * sum + half);
    }
}

