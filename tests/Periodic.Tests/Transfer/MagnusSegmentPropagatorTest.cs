// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

public sealed class MagnusSegmentPropagatorTest
{
    private static readonly EffectiveMass Gaas = EffectiveMass.FromElectronMasses(0.067);

    private static FunctionSegment Smooth(int steps) =>
        FunctionSegment.Create(Length.FromNanometres(8), x => 0.2 * Math.Sin(Math.PI * x / 8) * Math.Sin(Math.PI * x / 8) + 0.05 * Math.Cos(3 * x), Gaas, steps);

    [Fact]
    public void Evaluate_AnyEnergy_IsUnimodular()
    {
        // Exact fact: exp of a traceless matrix has determinant 1 (Liouville), for every step and product.
        // Tolerance 1e-12 on ln det: rounding over 256 steps of entries of order one. Energies above every
        // potential (0.45 to 2.45 eV), where no entry grows: under a barrier the scaled mantissa's determinant is
        // e^(−2·LogScale), a difference of large products that says nothing about the propagator.
        var transfer = CellTransfer.Create(UnitCell.Create(Smooth(256), Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.4), Gaas)));
        Prop.ForAll(Gen.Choose(4500, 24500).ToArbitrary(), milli =>
        {
            var m = transfer.Evaluate(milli * 1e-4);
            return Math.Abs(m.LogDeterminant) < 1e-12;
        }).Check(Config.QuickThrowOnFailure.WithReplay(12345UL, 67891UL));
    }

    [Theory]
    [InlineData(-0.1)]
    [InlineData(0.03)]
    [InlineData(0.25)]
    [InlineData(1.7)]
    public void Dispersion_TraceDerivative_MatchesCentralDifference(double energy)
    {
        // The carried derivative is exact for the discrete product; a central difference with h = 1e-6 eV has
        // truncation error ~h²·D‴ ≈ 1e-12 relative and rounding ~ε/h ≈ 1e-10: tolerance 1e-7 relative.
        var transfer = CellTransfer.Create(UnitCell.Create(Smooth(64)));
        const double h = 1e-6;
        var numeric = (transfer.Dispersion(energy + h).Trace - transfer.Dispersion(energy - h).Trace) / (2 * h);
        var exact = transfer.Dispersion(energy).TraceDerivativePerElectronVolt;
        Assert.Equal(numeric, exact, 1e-7 * Math.Max(1, Math.Abs(numeric)));
    }

    [Fact]
    public void Evaluate_StepHalving_ShowsFourthOrder()
    {
        // Fourth-order Magnus (Iserles & Nørsett 1999; Blanes, Casas & Ros 2000): the error of D at fixed E
        // falls by 2⁴ per halving. Observed order from N = 16, 32, 64 against N = 4096 in [3.7, 4.3].
        const double e = 0.12;
        var reference = CellTransfer.Create(UnitCell.Create(Smooth(4096))).Dispersion(e).Trace;
        var e16 = Math.Abs(CellTransfer.Create(UnitCell.Create(Smooth(16))).Dispersion(e).Trace - reference);
        var e32 = Math.Abs(CellTransfer.Create(UnitCell.Create(Smooth(32))).Dispersion(e).Trace - reference);
        var e64 = Math.Abs(CellTransfer.Create(UnitCell.Create(Smooth(64))).Dispersion(e).Trace - reference);
        Assert.InRange(Math.Log2(e16 / e32), 3.7, 4.3);
        Assert.InRange(Math.Log2(e32 / e64), 3.7, 4.3);
    }

    [Fact]
    public void Evaluate_DeepBarrier_DoesNotOverflowAndMatchesLayer()
    {
        // A 50 nm, 10 eV barrier (free-electron mass) has κw ≈ 810: e^(κw) overflows a double. The scaled product must hold it;
        // a constant-potential segment is exactly the uniform layer (closed form), so ln|D| agrees to 1e-12
        // relative (rounding over 40 steps).
        var barrier = FunctionSegment.Create(Length.FromNanometres(50), _ => 10.0, EffectiveMass.FreeElectron, 40);
        var layer = Layer.Create(Length.FromNanometres(50), Energy.FromElectronVolts(10), EffectiveMass.FreeElectron);
        var a = CellTransfer.Create(UnitCell.Create(barrier)).Evaluate(0.1);
        var b = CellTransfer.Create(UnitCell.Create(layer)).Evaluate(0.1);
        Assert.True(a.LogScale > 700, $"log scale {a.LogScale}");
        Assert.True(double.IsFinite(a.LogAbsTrace));
        Assert.Equal(b.LogAbsTrace, a.LogAbsTrace, 1e-12 * b.LogAbsTrace);
    }

    [Fact]
    public void CountBandEdgesBelow_CoarseSteps_MatchesExactLayerCount()
    {
        // Oscillation count stays exact when one step spans many half-waves: a constant segment in one step
        // (phase up to ~60 rad at 5 eV) must count exactly like the uniform layer (Sturm oscillation theorem;
        // the layer count is the core's closed form).
        var well = FunctionSegment.Create(Length.FromNanometres(12), _ => 0.0, Gaas, 1);
        var barrier = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.3), Gaas);
        var smooth = CellTransfer.Create(UnitCell.Create(well, barrier));
        var exact = CellTransfer.Create(UnitCell.Create(Layer.Create(Length.FromNanometres(12), default, Gaas), barrier));
        for (var i = 1; i <= 400; i++)
        {
            var e = 5.0 * i / 400 + 1e-7;
            Assert.Equal(exact.CountBandEdgesBelow(e), smooth.CountBandEdgesBelow(e));
        }
    }

    [Fact]
    public void Compute_PositionDependentMass_AgreesWithPlaneWaves()
    {
        // Two independent methods with BenDaniel–Duke ordering: Magnus on m(x) = 1/(η0 + η1 cos(2πx/d)) and the
        // plane-wave central equation with the Fourier series of 1/m. Acceptance 1e-9 relative on every edge.
        const double d = 6, eta0 = 1 / 0.067, eta1 = 0.3 / 0.067, v1 = 0.08;
        var segment = FunctionSegment.Create(Length.FromNanometres(d), x => v1 * Math.Cos(2 * Math.PI * x / d),
            x => 1 / (eta0 + eta1 * Math.Cos(2 * Math.PI * x / d)), 64);
        var transfer = RefinedBandStructure.Compute(UnitCell.Create(segment), 3, RefinementOptions.Create(1e-12));
        var solver = PlaneWaveSolver.CreateWithInverseMass(Length.FromNanometres(d), default, [v1], [], eta0, [eta1], []);
        var centre = solver.EnergiesAt(0, 3);
        var boundary = solver.EnergiesAt(Math.PI / d, 3);
        var scale = transfer.EnergyScaleElectronVolts;
        for (var n = 1; n <= 3; n++)
        {
            var band = transfer.Structure.GetBand(n);
            double bottom = Math.Min(centre.EnergiesElectronVolts[n - 1], boundary.EnergiesElectronVolts[n - 1]);
            double top = Math.Max(centre.EnergiesElectronVolts[n - 1], boundary.EnergiesElectronVolts[n - 1]);
            Assert.True(Math.Abs(band.BottomElectronVolts - bottom) <= 1e-9 * Math.Max(scale, Math.Abs(bottom)), $"band {n} bottom {band.BottomElectronVolts:R} vs {bottom:R}");
            Assert.True(Math.Abs(band.TopElectronVolts - top) <= 1e-9 * Math.Max(scale, Math.Abs(top)), $"band {n} top {band.TopElectronVolts:R} vs {top:R}");
        }
    }

    [Fact]
    public void Compute_SineLattice_HasTheSpectrumOfTheCosineLattice()
    {
        // V0 sin(2πx/d) = V0 cos(2π(x − d/4)/d): a translation leaves the band spectrum unchanged (exact
        // symmetry). Compared at 1e-10 relative: both converged to 1e-12.
        var d = Length.FromNanometres(2);
        var sine = FourierSegment.Create(d, default, [], [0.3], EffectiveMass.FreeElectron);
        var cosine = FourierSegment.Cosine(d, Energy.FromElectronVolts(0.3), EffectiveMass.FreeElectron);
        var a = RefinedBandStructure.Compute(UnitCell.Create(sine), 3, RefinementOptions.Create(1e-12)).Structure;
        var b = RefinedBandStructure.Compute(UnitCell.Create(cosine), 3, RefinementOptions.Create(1e-12)).Structure;
        for (var n = 1; n <= 3; n++)
        {
            Assert.Equal(b.GetBand(n).BottomElectronVolts, a.GetBand(n).BottomElectronVolts, 1e-10 * Math.Max(1, Math.Abs(b.GetBand(n).BottomElectronVolts)));
            Assert.Equal(b.GetBand(n).TopElectronVolts, a.GetBand(n).TopElectronVolts, 1e-10 * Math.Max(1, Math.Abs(b.GetBand(n).TopElectronVolts)));
        }
    }
}
