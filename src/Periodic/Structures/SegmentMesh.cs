// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// The step data of a smooth segment for the fourth-order Magnus propagator: per step j of width h,
/// the potential V and mass m at the two Gauss–Legendre nodes x_j + (1/2 ∓ √3/6)h, reduced to the
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

    /// <summary>Lower Gauss–Legendre node on [0, 1].</summary>
    internal const double Node1 = 0.5 - GaussLegendre.TwoPointOffsetOnUnitInterval; // 1/2 − √3/6

    /// <summary>Upper Gauss–Legendre node on [0, 1].</summary>
    internal const double Node2 = 0.5 + GaussLegendre.TwoPointOffsetOnUnitInterval;

    private const double CommutatorWeight = 0.14433756729740644113; // √3/12

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

/// <summary>A smooth segment that the transfer layer propagates with the Magnus scheme over <see cref="Mesh"/>.</summary>
internal interface IMeshedSegment : IPotentialSegment
{
    SegmentMesh Mesh { get; }

    /// <summary>A copy with every step split in two (for step halving and Richardson extrapolation).</summary>
    CellElement Refined();
}

/// <summary>Shared argument checks and range scans of the smooth segment types.</summary>
internal static class SegmentChecks
{
    /// <summary>Largest step count of one segment (keeps the mesh below ~200 MB).</summary>
    internal const int MaxStepCount = 4_000_000;

    internal static void CheckStepCount(int stepCount, string paramName) =>
        Preconditions.CheckRange(stepCount, 1, MaxStepCount, paramName);

    internal static void CheckMass(EffectiveMass mass, string paramName)
    {
        if (!(mass.ElectronMasses > 0))
        {
            throw new ArgumentOutOfRangeException(paramName, mass.ElectronMasses,
                $"{paramName} must be positive and finite; got the default (zero) mass. Create it with EffectiveMass.FromElectronMasses.");
        }
    }
}
