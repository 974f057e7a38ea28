// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Properties;

/// <summary>Curvature masses (Taylor-mode D″ through Magnus steps) of cells with smooth segments.</summary>
public sealed partial class BandPropertiesTest
{
    private const double LatticePeriod = 532;
    private const double AtomMass = 86.909 * 1822.888; // ⁸⁷Rb in m0, u/m_e from memory; the checks are scale-free

    private static double Recoil => C * Math.PI * Math.PI / (AtomMass * LatticePeriod * LatticePeriod); // ħ²π²/(2md²)

    private static UnitCell OpticalLattice(double depth, int? steps = null)
    {
        var segment = FourierSegment.OpticalLattice(Length.FromNanometres(LatticePeriod), depth, EffectiveMass.FromElectronMasses(AtomMass));
        return UnitCell.Create(steps is int n ? segment.WithStepCount(n) : segment);
    }

    /// <summary>The central equation (PlaneWaveReference) of s·E_R·sin²(πx/d) = (s/2)E_R − (s/2)E_R cos(2πx/d).</summary>
    private static PlaneWaveReference PlaneWaves(double depth, double k) =>
        // 25 plane waves: for s ≤ 10 the coefficients of bands 1–3 fall like (s/16)^n/(n!)² and are below 1e-20 at |n| = 12.
        PlaneWaveReference.Solve(LatticePeriod, AtomMass, 0.5 * depth * Recoil, -0.5 * depth * Recoil, k, 12);

    [Theory]
    [InlineData(1.0)]
    [InlineData(5.0)]
    [InlineData(10.0)]
    public void CurvatureMass_OpticalLatticeMatchesPlaneWaves(double depth)
    {
        // Outside reference: d²E/dk² of the central equation (Ashcroft and Mermin ch. 9, written independently in the
        // tests) by second-order perturbation theory in k, no step to tune. The library's mass comes from the exact D′, D″
        // of the Magnus-discretised cell, refined to RefinedBandStructure's default 1e-11.
        var structure = RefinedBandStructure.Compute(OpticalLattice(depth), 3).Structure;
        var props = BandProperties.Create(structure);
        var d = LatticePeriod;
        var worst = 0.0;
        foreach (var band in new[] { 1, 2, 3 })
        {
            var width = structure.GetBand(band).WidthElectronVolts;
            foreach (var fraction in new[] { 0.0, 0.15, 0.3, 0.5, 0.7, 0.85, 1.0 })
            {
                var k = fraction * Math.PI / d;
                var reference = PlaneWaves(depth, k).Curvature(band);
                var curvature = 2 * C / props.CurvatureMassElectronMasses(band, k); // d²E/dk² = ħ²/m* = 2C/(m*/m0)
                // Relative to |E″| itself, but at least to a tenth of the band's curvature scale W·d² (a cosine band peaks
                // at W d²/2), so inflection points, where m* → ∞, are measured fairly.
                var scale = Math.Max(Math.Abs(reference), 0.1 * width * d * d);
                var error = Math.Abs(curvature - reference) / scale;
                output.WriteLine($"s = {depth}, band {band}, kd/π = {fraction}: m* = {2 * C / curvature:G10} m0, reference {2 * C / reference:G10} m0, error {error:E2}");
                worst = Math.Max(worst, error);
            }
        }
        output.WriteLine($"s = {depth}: curvature vs plane waves worst {worst:E2}");
        // Both sides are converged far below this (edges to 1e-11 of the energy scale, plane waves to rounding); a narrow
        // band's curvature amplifies the energy scale's errors by E_R/W (≈ 30 for band 1 at s = 10), and the zone-point
        // curvatures beside the small gaps of s = 1 (E″ ≈ 1e5 × the free value) are conditioned as 1/gap: tolerance 1e-9.
        Assert.True(worst <= 1e-9, $"worst {worst:E3}");
    }

    [Fact]
    public void CurvatureMass_ConvergesAtFourthOrderInTheMagnusStep()
    {
        // The masses are those of the discretised model; the fourth-order Magnus scheme (Iserles and Nørsett 1999;
        // Blanes, Casas and Ros 2000) makes every smooth function of E, D″ included, converge like h⁴. Observed order
        // from three successive differences; the finest mesh is also compared with the plane-wave reference.
        const double depth = 5;
        var k = 0.3 * Math.PI / LatticePeriod;
        foreach (var band in new[] { 1, 2 })
        {
            var masses = new List<double>();
            foreach (var steps in new[] { 16, 32, 64, 128 })
            {
                var props = BandProperties.Create(BandStructure.Compute(OpticalLattice(depth, steps), 2));
                masses.Add(props.CurvatureMassElectronMasses(band, k));
            }
            var order1 = Math.Log2(Math.Abs((masses[0] - masses[1]) / (masses[1] - masses[2])));
            var order2 = Math.Log2(Math.Abs((masses[1] - masses[2]) / (masses[2] - masses[3])));
            var reference = 2 * C / PlaneWaves(depth, k).Curvature(band);
            output.WriteLine($"band {band}: m* at 16/32/64/128 steps {string.Join(", ", masses.Select(m => m.ToString("G12")))}; observed orders {order1:F3}, {order2:F3}; relative error at 128 steps vs plane waves {Cells.RelativeError(masses[3], reference):E2}");
            // Stated order 4; accept 3.7 … 4.3 (the next term is h⁶).
            Assert.InRange(order2, 3.7, 4.3);
        }
    }

    [Fact]
    public void CurvatureMass_ConstantFunctionSegmentAgreesWithLayerAndFreeParticle()
    {
        // A function segment sampling a constant potential is the uniform layer (Ω = hA exactly, no commutator), so the
        // masses must agree to rounding with the closed-form layer cell (Kronig–Penney 1931); and with V = 0 alone it is
        // the free particle, whose mass is m at every k, including at the closed gaps (free parabola).
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var well = Length.FromNanometres(5);
        var barrier = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.092));
        var layered = BandProperties.Create(BandStructure.Compute(UnitCell.Create(Layer.Create(well, default, mass), barrier), 3));
        var smooth = BandProperties.Create(BandStructure.Compute(UnitCell.Create(FunctionSegment.Create(well, _ => 0.0, mass, 200), barrier), 3));
        var free = BandProperties.Create(BandStructure.Compute(UnitCell.Create(FunctionSegment.Create(Length.FromNanometres(7), _ => 0.0, mass, 100)), 3));
        const double d = 7;
        double worstLayer = 0, worstFree = 0;
        for (var n = 1; n <= 3; n++)
        {
            foreach (var fraction in new[] { 0.0, 0.2, 0.45, 0.7, 1.0 })
            {
                var k = fraction * Math.PI / d;
                worstLayer = Math.Max(worstLayer, Cells.RelativeError(smooth.CurvatureMassElectronMasses(n, k), layered.CurvatureMassElectronMasses(n, k)));
                if (n > 1 || fraction > 0)
                {
                    worstFree = Math.Max(worstFree, Cells.RelativeError(free.CurvatureMassElectronMasses(n, k), mass.ElectronMasses));
                }
            }
        }
        output.WriteLine($"constant function segment vs layer: curvature mass worst {worstLayer:E2}; free particle {worstFree:E2}");
        // Rounding of 200 steps and of E(k) (conditioned as ε/(qd)² near zone points): 1e-8. At closed gaps the crossing
        // expansion is documented to ≈1e-4 (BandPropertiesTest on layers), tolerance 3e-4 as there.
        Assert.True(worstLayer <= 1e-8, $"layer {worstLayer:E3}");
        Assert.True(worstFree <= 3e-4, $"free {worstFree:E3}");
    }

    [Fact]
    public void CurvatureMass_SampledSquareWellConvergesToLayerResult()
    {
        // Kronig–Penney profile sampled with the jumps midway between samples (O(h²) interpolant, docs/smooth-potentials):
        // the curvature mass approaches the exact layer result (Kronig and Penney 1931) with observed order ≈ 2.
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var barrier = Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0.25), mass);
        var layered = BandProperties.Create(BandStructure.Compute(UnitCell.Create(barrier, Layer.Create(Length.FromNanometres(5), default, mass), barrier), 2));
        const double d = 7;
        var k = 0.3 * Math.PI / d;
        var exact = layered.CurvatureMassElectronMasses(1, k);
        var errors = new List<double>();
        foreach (var perNanometre in new[] { 10, 20, 40 })
        {
            var xs = new List<double> { 0 };
            for (var i = 0; i < 7 * perNanometre; i++)
            {
                xs.Add((i + 0.5) / perNanometre);
            }
            xs.Add(d);
            var vs = xs.Select(x => x < 1 || x > 6 ? 0.25 : 0.0).ToArray();
            var sampled = BandProperties.Create(BandStructure.Compute(UnitCell.Create(SampledSegment.Create(xs.ToArray(), vs, mass).WithStepsPerInterval(4)), 2));
            errors.Add(Cells.RelativeError(sampled.CurvatureMassElectronMasses(1, k), exact));
        }
        var order1 = Math.Log2(errors[0] / errors[1]);
        var order2 = Math.Log2(errors[1] / errors[2]);
        output.WriteLine($"sampled square well: curvature mass errors {string.Join(", ", errors.Select(e => e.ToString("E2")))}; orders {order1:F3}, {order2:F3}");
        // Stated order 2; accept 1.7 … 2.3.
        Assert.InRange(order1, 1.7, 2.3);
        Assert.InRange(order2, 1.7, 2.3);
    }

    [Fact]
    public void DispersionDerivatives_SmoothCellMatchCoreTraceAndDerivative()
    {
        // Internal consistency of the Taylor-mode pass through Magnus steps with the core's product-rule derivative
        // (same discrete model, same D and D′), and D″ against a central difference of the exact D′.
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var cell = UnitCell.Create(
            Layer.Create(Length.FromNanometres(1.5), Energy.FromElectronVolts(0.2), EffectiveMass.FromElectronMasses(0.09)),
            FunctionSegment.Create(Length.FromNanometres(6), x => 0.08 * Math.Sin(Math.PI * x / 6) * Math.Sin(Math.PI * x / 6), x => 0.067 + 0.01 * x / 6, 128),
            DeltaBarrier.Create(0.02),
            FourierSegment.Cosine(Length.FromNanometres(3), Energy.FromElectronVolts(0.05), mass));
        var transfer = Periodic.Transfer.CellTransfer.Create(cell);
        foreach (var e in new[] { 0.01, 0.15, 0.6 })
        {
            var jet = DispersionDerivatives.Evaluate(cell, e);
            var core = transfer.Dispersion(e);
            // Same products in a different order of operations: rounding, 1e-12 of the larger of |D| and 1.
            Assert.Equal(core.Trace, jet.D0 * jet.Scale, Math.Max(Math.Abs(core.Trace), 1) * 1e-12);
            Assert.Equal(core.TraceDerivativePerElectronVolt, jet.D1 * jet.Scale, Math.Abs(core.TraceDerivativePerElectronVolt) * 1e-12);
            // Central difference with step 1e-5 eV: truncation ~1e-10·D⁗/D″, rounding ~1e-11; tolerance 1e-6 relative.
            var h = 1e-5;
            var fd = (transfer.Dispersion(e + h).TraceDerivativePerElectronVolt - transfer.Dispersion(e - h).TraceDerivativePerElectronVolt) / (2 * h);
            Assert.Equal(fd, jet.D2 * jet.Scale, Math.Abs(fd) * 1e-6);
        }
    }
}
