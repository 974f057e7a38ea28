// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Transfer;

/// <summary>
/// A real 2×2 transfer matrix acting on the state (ψ, ψ′/m) — ψ′ in 1/nm per unit ψ, m in m₀ —
/// from the left end of a region to its right end: (ψ, ψ′/m)_right = M · (ψ, ψ′/m)_left.
/// For a lossless region det M = 1. <c>default</c> is the zero matrix; use <see cref="Identity"/>.
/// </summary>
public readonly record struct TransferMatrix(double M11, double M12, double M21, double M22)
{
    /// <summary>The identity matrix.</summary>
    public static TransferMatrix Identity { get; } = new(1, 0, 0, 1);

    /// <summary>The determinant M11·M22 − M12·M21.</summary>
    public double Determinant => M11 * M22 - M12 * M21;

    /// <summary>The trace M11 + M22.</summary>
    public double Trace => M11 + M22;

    /// <summary>The largest absolute entry.</summary>
    public double MaxAbsEntry => Math.Max(Math.Max(Math.Abs(M11), Math.Abs(M12)), Math.Max(Math.Abs(M21), Math.Abs(M22)));

    /// <summary>The matrix product <paramref name="left"/> · <paramref name="right"/> (right acts first).</summary>
    public static TransferMatrix operator *(TransferMatrix left, TransferMatrix right) => new(
        left.M11 * right.M11 + left.M12 * right.M21,
        left.M11 * right.M12 + left.M12 * right.M22,
        left.M21 * right.M11 + left.M22 * right.M21,
        left.M21 * right.M12 + left.M22 * right.M22);

    /// <summary>Entry-wise sum.</summary>
    public static TransferMatrix operator +(TransferMatrix left, TransferMatrix right) =>
        new(left.M11 + right.M11, left.M12 + right.M12, left.M21 + right.M21, left.M22 + right.M22);

    /// <summary>The matrix times a scalar.</summary>
    public static TransferMatrix operator *(double factor, TransferMatrix matrix) =>
        new(factor * matrix.M11, factor * matrix.M12, factor * matrix.M21, factor * matrix.M22);

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"[[{M11:G6}, {M12:G6}], [{M21:G6}, {M22:G6}]]");
}
