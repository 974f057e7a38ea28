// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Numerics;

/// <summary>Named floating-point constants of IEEE 754 binary64, the one home of the machine epsilon.</summary>
internal static class FloatingPoint
{
    /// <summary>
    /// The machine epsilon ε = 2⁻⁵² ≈ 2.22e-16: the gap between 1 and the next larger double (IEEE 754-2008,
    /// binary64, 52 fraction bits). Not <see cref="double.Epsilon"/>, which is the smallest subnormal (≈ 4.9e-324).
    /// </summary>
    internal const double MachineEpsilon = 2.220446049250313e-16;
}
