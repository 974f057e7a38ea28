// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

/// <summary>A square-well cell given as a sampled profile converges to the exact layered (Kronig–Penney) result.</summary>
public sealed class SampledProfileTest
{
    private const double Period = 10.0, Barrier = 0.3, MassValue = 0.067;
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(MassValue);

    /// <summary>Well [2.5, 7.5] nm at 0, barrier 0.3 eV elsewhere; N = 4j + 2 intervals put both jumps midway between samples.</summary>
    private static UnitCell Sampled(int j)
    {
        var n = 4 * j + 2;
        var x = new double[n + 1];
        var v = new double[n + 1];
        for (var i = 0; i <= n; i++)
        {
            x[i] = Period * i / n;
            v[i] = x[i] > 2.5 && x[i] < 7.5 ? 0 : Barrier;
        }
        return UnitCell.Create(SampledSegment.Create(x, v, Mass));
    }

    // The exact cell: Kronig & Penney (1931) with the well centred; the layered transfer matrix is closed form
    // (checked against the Kronig–Penney equation in the core tests).
    private static readonly UnitCell Layered = UnitCell.Create(
        Layer.Create(Length.FromNanometres(2.5), Energy.FromElectronVolts(Barrier), Mass),
        Layer.Create(Length.FromNanometres(5.0), default, Mass),
        Layer.Create(Length.FromNanometres(2.5), Energy.FromElectronVolts(Barrier), Mass));

    [Fact]
    public void Refine_GridHalving_ConvergesAtSecondOrder()
    {
        // Stated order: piecewise-linear interpolation with the jumps midway between samples has O(h²) energy
        // error (SampledSegment remarks: the ramp's first moment vanishes). Observed order from successive
        // halvings of h = 2.5/(j + 1/2) must lie in [1.8, 2.2] (tolerance: higher-order terms at these h).
        var exact = BandStructure.Compute(Layered, 2);
        int[] js = [4, 8, 16, 32, 64];
        var errors = new double[js.Length];
        var spacings = new double[js.Length];
        for (var t = 0; t < js.Length; t++)
        {
            var bands = RefinedBandStructure.Compute(Sampled(js[t]), 2, RefinementOptions.Create(1e-12)).Structure;
            spacings[t] = Period / (4 * js[t] + 2);
            errors[t] = Math.Abs(bands.GetBand(1).BottomElectronVolts - exact.GetBand(1).BottomElectronVolts);
        }
        for (var t = 1; t < js.Length; t++)
        {
            var order = Math.Log(errors[t - 1] / errors[t]) / Math.Log(spacings[t - 1] / spacings[t]);
            Assert.InRange(order, 1.8, 2.2);
        }
        // The finest grid (258 intervals, h = 0.039 nm) is within 1e-4 relative of the exact edge.
        Assert.True(errors[^1] <= 1e-4 * exact.GetBand(1).BottomElectronVolts, $"error {errors[^1]:G3} eV");
    }

    [Fact]
    public void Compute_ConstantProfileBesideLayers_EqualsLayeredCell()
    {
        // A constant sampled profile is a uniform layer: the Magnus step with constant coefficients is the exact
        // layer matrix (closed form), so edges agree to the search tolerance (1e-14 relative; 1e-12 allowed for
        // rounding over the steps).
        var flat = SampledSegment.Create([0.0, 1.0, 2.5, 5.0], [0.0, 0.0, 0.0, 0.0], Mass);
        var mixed = UnitCell.Create(Layer.Create(Length.FromNanometres(2.5), Energy.FromElectronVolts(Barrier), Mass), flat,
            Layer.Create(Length.FromNanometres(2.5), Energy.FromElectronVolts(Barrier), Mass));
        var a = BandStructure.Compute(mixed, 4);
        var b = BandStructure.Compute(Layered, 4);
        for (var n = 1; n <= 4; n++)
        {
            Assert.Equal(b.GetBand(n).BottomElectronVolts, a.GetBand(n).BottomElectronVolts, 1e-12 * b.GetBand(n).TopElectronVolts);
            Assert.Equal(b.GetBand(n).TopElectronVolts, a.GetBand(n).TopElectronVolts, 1e-12 * b.GetBand(n).TopElectronVolts);
        }
    }
}
