// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Tests.TestHelpers;

/// <summary>Assertions shared by the convention checks of several types.</summary>
internal static class Checks
{
    /// <summary>No NaN or infinity leaves a public API (house rule).</summary>
    public static void Finite(double value, string what) => Assert.True(double.IsFinite(value), $"{what} = {value}");
}
