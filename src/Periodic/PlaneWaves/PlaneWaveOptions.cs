// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.PlaneWaves;

/// <summary>
/// Tolerance of the plane-wave basis-size search (<see cref="PlaneWaveSolver.EnergiesAt"/>), and of the spectral band
/// edges built on it (<c>SpectralBandStructure.Compute</c>), validated when created. Every default is a constant here;
/// <see cref="Default"/> uses them all.
/// </summary>
public sealed class PlaneWaveOptions
{
    /// <summary>Default relative tolerance of each energy.</summary>
    public const double DefaultRelativeTolerance = 1e-12;

    private PlaneWaveOptions(double relativeTolerance) => RelativeTolerance = relativeTolerance;

    /// <summary>The defaults: 1e-12 relative.</summary>
    public static PlaneWaveOptions Default { get; } = Create();

    /// <summary>
    /// Relative tolerance of each energy, relative to max(|E|, energy scale of the cell). The energies carry a rounding
    /// level of about 2e-15 to 4e-15 relative; a tolerance below it is never met: the basis then grows until the change
    /// between two sizes is rounding, and the result says it did not converge.
    /// </summary>
    public double RelativeTolerance { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="relativeTolerance">In [1e-15, 1e-2].</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static PlaneWaveOptions Create(double relativeTolerance = DefaultRelativeTolerance)
    {
        Preconditions.CheckRange(relativeTolerance, 1e-15, 1e-2);
        return new PlaneWaveOptions(relativeTolerance);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"relative {RelativeTolerance:G3}");
}
