// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// What a smooth segment tells the transfer layer: per step j its width h and the potential V (eV) and mass m (m₀) at the
/// two Gauss–Legendre nodes x_j + (1/2 ∓ √3/6)h. The transfer layer turns these into its Magnus coefficients; the
/// structure holds only the samples. Immutable after construction.
/// </summary>
internal sealed class SegmentSamples(double[] widths, double[] v1, double[] v2, double[] m1, double[] m2)
{
    /// <summary>Lower Gauss–Legendre node on [0, 1].</summary>
    internal const double Node1 = 0.5 - GaussLegendre.TwoPointOffsetOnUnitInterval; // 1/2 − √3/6

    /// <summary>Upper Gauss–Legendre node on [0, 1].</summary>
    internal const double Node2 = 0.5 + GaussLegendre.TwoPointOffsetOnUnitInterval;

    internal double[] Widths { get; } = widths;

    internal double[] V1 { get; } = v1;

    internal double[] V2 { get; } = v2;

    internal double[] M1 { get; } = m1;

    internal double[] M2 { get; } = m2;

    internal int StepCount => Widths.Length;
}

/// <summary>A smooth segment that the transfer layer propagates with the Magnus scheme over its <see cref="Samples"/>.</summary>
internal interface IMeshedSegment : IPotentialSegment
{
    /// <summary>The potential and mass at the two Gauss–Legendre nodes of every step.</summary>
    SegmentSamples Samples { get; }

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
