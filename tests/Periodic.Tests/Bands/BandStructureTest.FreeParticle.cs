// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    /// <summary>Uniform media described as cells: (potential eV, mass m0, widths of the equal layers nm).</summary>
    public static TheoryData<double, double, double[]> UniformCells => new()
    {
        { 0.0, 1.0, new[] { 1.0 } },
        { 0.0, 0.067, new[] { 2.5, 1.5 } },
        { 0.37, 0.3, new[] { 0.4, 0.6, 0.5 } },
        { -1.2, 0.15, new[] { 3.0 } },
    };

    [Theory]
    [MemberData(nameof(UniformCells))]
    public void Compute_UniformMedium_FreeParticleEdgesAndClosedGaps(double v, double m, double[] widths)
    {
        // Free-particle limit: E = V + C k²/m folded into the zone (any textbook; docs/references.md): edges at
        // V + C(nπ/d)²/m, each (n ≥ 1) doubly degenerate, so every gap is closed.
        const int count = 6;
        var cell = UnitCell.FromLayers(widths, widths.Select(_ => v).ToArray(), widths.Select(_ => m).ToArray());
        var d = widths.Sum();
        var bands = BandStructure.Compute(cell, count);
        var worst = 0.0;
        // Band 1 starts at V (k = 0): the 1e-15 eV absolute near zero, 1e-12 relative otherwise.
        Assert.Equal(v, bands.GetBand(1).BottomElectronVolts, EdgeTolerance(v));
        worst = Math.Max(worst, Math.Abs(bands.GetBand(1).BottomElectronVolts - v) / Math.Max(Math.Abs(v), 1));
        for (var n = 1; n <= count; n++)
        {
            var edge = v + ClosedForms.C * Math.Pow(n * Math.PI / d, 2) / m;
            var band = bands.GetBand(n);
            var gap = bands.Gaps[n - 1];
            // The target: 1e-12 relative to the edge energy (1e-15 eV absolute near zero).
            var tolerance = EdgeTolerance(edge);
            Assert.Equal(edge, band.TopElectronVolts, tolerance);
            Assert.Equal(edge, gap.UpperElectronVolts, tolerance);
            Assert.True(gap.IsClosed, $"{gap} of a uniform medium must be closed");
            Assert.Equal(0.0, band.GapAboveElectronVolts, tolerance);
            worst = Math.Max(worst, Math.Max(Math.Abs(band.TopElectronVolts - edge), Math.Abs(gap.UpperElectronVolts - edge)) / Math.Abs(edge));
        }
        output.WriteLine($"free particle (V={v}, m={m}, {widths.Length} layer(s)): worst relative error of edges {worst:E2}");
    }

    [Theory]
    [MemberData(nameof(UniformCells))]
    public void EnergyAt_UniformMedium_IsFoldedParabola(double v, double m, double[] widths)
    {
        // E_n(k) = V + C q²/m with q = (n − 1)π/d + |k| for odd n and nπ/d − |k| for even n (the free
        // parabola folded into the first zone).
        const int count = 4;
        var cell = UnitCell.FromLayers(widths, widths.Select(_ => v).ToArray(), widths.Select(_ => m).ToArray());
        var d = widths.Sum();
        var bands = BandStructure.Compute(cell, count);
        var worst = 0.0;
        for (var n = 1; n <= count; n++)
        {
            for (var j = -10; j <= 10; j++)
            {
                var k = j / 10.0 * Math.PI / d;
                var q = n % 2 == 1 ? (n - 1) * Math.PI / d + Math.Abs(k) : n * Math.PI / d - Math.Abs(k);
                var expected = v + ClosedForms.C * q * q / m;
                var actual = bands.EnergyAt(n, k);
                // Same target as the edges (1e-12 relative, 1e-15 eV absolute near zero); D(E) = 2cos(kd) is well
                // conditioned at these k (|sin kd| ≥ sin(0.1π) away from the zone points, which are returned exactly).
                var tolerance = EdgeTolerance(expected);
                Assert.True(Math.Abs(actual - expected) <= tolerance, $"E_{n}({k:R}) = {actual:R}, folded parabola {expected:R}");
                Assert.Equal(actual, bands.EnergyAt(n, -k)); // E(k) = E(−k)
                worst = Math.Max(worst, Math.Abs(actual - expected) / Math.Max(Math.Abs(expected), 1e-3));
            }
        }
        output.WriteLine($"free particle E(k) (V={v}, m={m}): worst relative error (floor 1 meV) {worst:E2}");
    }
}
