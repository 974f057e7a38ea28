// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

public sealed partial class CompiledCellTest
{
    private const double C = ClosedForms.C;

    /// <summary>
    /// D = 2 cos kd of the Kronig–Penney cell with BenDaniel–Duke matching (Kronig and Penney, Proc. R. Soc. A 130, 499
    /// (1931); BenDaniel and Duke, Phys. Rev. 152, 683 (1966)), written with complex arguments so that every parameter can
    /// be differentiated by the complex step: D/2 = cos(k_w a) cos(k_b b) − ½(ξ + 1/ξ) sin(k_w a) sin(k_b b), ξ = (k_b/m_b)/(k_w/m_w).
    /// </summary>
    private static Complex Trace(Complex a, Complex b, Complex v0, Complex mw, Complex mb, double e)
    {
        var kw = Complex.Sqrt(mw * e / C);
        var kb = Complex.Sqrt(mb * (e - v0) / C);
        var xi = (kb / mb) / (kw / mw);
        return 2 * (Complex.Cos(kw * a) * Complex.Cos(kb * b) - 0.5 * (xi + 1 / xi) * Complex.Sin(kw * a) * Complex.Sin(kb * b));
    }

    public static TheoryData<double> Energies => new() { 0.05, 0.13, 0.21, 0.4, 0.9 };

    [Theory]
    [MemberData(nameof(Energies))]
    public void AccumulateParameterDerivative_MatchesComplexStepOfKronigPenney(double e)
    {
        // A GaAs/AlGaAs-like cell (any values would do): well 5 nm, 0.067 m0; barrier 2 nm, 0.25 eV, 0.092 m0.
        const double a = 5, b = 2, v0 = 0.25, mw = 0.067, mb = 0.092;
        var cell = UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0),
            EffectiveMass.FromElectronMasses(mw), EffectiveMass.FromElectronMasses(mb));
        var transfer = CellTransfer.Create(cell);
        var well = IndexOf(cell, 0.0);
        var barrier = IndexOf(cell, v0);
        // Complex-step derivatives of the closed form (Squire and Trapp, SIAM Review 40, 110 (1998)): exact to rounding.
        var expected = new (int Layer, LayerParameter Parameter, double Value)[]
        {
            (well, LayerParameter.Width, ClosedForms.ComplexStepDerivative(x => Trace(x, b, v0, mw, mb, e), a)),
            (barrier, LayerParameter.Width, ClosedForms.ComplexStepDerivative(x => Trace(a, x, v0, mw, mb, e), b)),
            (barrier, LayerParameter.Potential, ClosedForms.ComplexStepDerivative(x => Trace(a, b, x, mw, mb, e), v0)),
            (well, LayerParameter.Mass, ClosedForms.ComplexStepDerivative(x => Trace(a, b, v0, x, mb, e), mw)),
            (barrier, LayerParameter.Mass, ClosedForms.ComplexStepDerivative(x => Trace(a, b, v0, mw, x, e), mb)),
        };
        foreach (var (layer, parameter, value) in expected)
        {
            var mantissa = transfer.TraceParameterDerivative(e, layer, parameter, out _, out var logScale);
            var actual = mantissa * Math.Exp(logScale);
            // The product's rounding is a few ulps of its largest entry times the derivative's scale: 1e-9 relative
            // (with a floor of 1e-9 of the largest of the derivatives) leaves room for it and for the closed form's own rounding.
            var scale = expected.Max(x => Math.Abs(x.Value));
            Assert.True(Math.Abs(actual - value) <= 1e-9 * Math.Max(Math.Abs(value), scale),
                $"{parameter} of layer {layer} at {e} eV: kernel {actual:R}, closed form {value:R}");
        }
    }

    [Fact]
    public void AccumulateParameterDerivative_RejectsADelta()
    {
        var cell = UnitCell.DiracComb(Length.FromNanometres(1), 0.1, EffectiveMass.FromElectronMasses(1));
        var compiled = CellTransfer.Create(cell).Compiled;
        var delta = Enumerable.Range(0, compiled.Count).First(compiled.IsDelta);
        var error = Assert.Throws<ArgumentException>(() => compiled.AccumulateParameterDerivative(0.3, delta, LayerParameter.Width));
        Assert.Equal("layerIndex", error.ParamName);
    }

    [Theory]
    [InlineData(0.4, 3.0)]   // oscillating, several half-waves
    [InlineData(0.001, 2.0)] // |s|w² < 1: the series branch
    [InlineData(-0.3, 2.5)]  // evanescent
    public void Propagate_MomentsOfOneLayerMatchElementaryIntegrals(double e, double width)
    {
        // One layer of mass 0.5 m0 at V = 0; ψ(0) = 0, ψ′/m = 1 gives ψ(t) = m·sin(kt)/k (or m·sinh(κt)/κ).
        const double mass = 0.5;
        var cell = UnitCell.Create(Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(mass)));
        var compiled = CellTransfer.Create(cell).Compiled;
        Span<double> psi = stackalloc double[2];
        Span<double> w = stackalloc double[2];
        var moments = new ElementMoments[1];
        compiled.Propagate(e, 0, 1, psi, w, moments);
        var s = mass * e / C;
        // Elementary antiderivatives (e.g. Gradshteyn and Ryzhik, 2.513 and 2.631; common practice):
        // ∫₀ʷ sin² = w/2 − sin 2kw/(4k); ∫₀ʷ t sin² = w²/4 − w sin 2kw/(4k) − (cos 2kw − 1)/(8k²);
        // ∫₀ʷ sin⁴ = 3w/8 − sin 2kw/(4k) + sin 4kw/(32k); for sinh the signs follow from sin(ix) = i sinh x.
        double norm, first, quartic, a;
        if (s > 0)
        {
            var k = Math.Sqrt(s);
            a = mass / k;
            norm = width / 2 - Math.Sin(2 * k * width) / (4 * k);
            first = width * width / 4 - width * Math.Sin(2 * k * width) / (4 * k) - (Math.Cos(2 * k * width) - 1) / (8 * k * k);
            quartic = 3 * width / 8 - Math.Sin(2 * k * width) / (4 * k) + Math.Sin(4 * k * width) / (32 * k);
        }
        else
        {
            var k = Math.Sqrt(-s);
            a = mass / k;
            norm = Math.Sinh(2 * k * width) / (4 * k) - width / 2;
            first = width * Math.Sinh(2 * k * width) / (4 * k) - (Math.Cosh(2 * k * width) - 1) / (8 * k * k) - width * width / 4;
            quartic = 3 * width / 8 - Math.Sinh(2 * k * width) / (4 * k) + Math.Sinh(4 * k * width) / (32 * k);
        }
        // 20-point Gauss–Legendre on quarter-wave panels integrates these to rounding; the closed forms cancel digits
        // for small kw (series branch), so 1e-9 relative.
        Assert.Equal(a * a * norm, moments[0].Norm, 1e-9 * a * a * norm);
        Assert.Equal(a * a * first, moments[0].FirstMoment, 1e-9 * a * a * first);
        Assert.Equal(a * a * a * a * quartic, moments[0].Quartic, 1e-9 * a * a * a * a * quartic);
        // The end state is ψ(w) = a·sin(kw) (sinh): the same closed form.
        var end = s > 0 ? a * Math.Sin(Math.Sqrt(s) * width) : a * Math.Sinh(Math.Sqrt(-s) * width);
        Assert.Equal(end, psi[1], 1e-12 * Math.Max(1, Math.Abs(end)));
    }

    [Fact]
    public void StepBackward_InvertsStepForward()
    {
        // Every element matrix is unimodular, so propagating back recovers the start (common practice, no single source).
        var cell = UnitCell.Create(
            Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067)),
            DeltaBarrier.Create(0.2),
            Layer.Create(Length.FromNanometres(4), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09)),
            FourierSegment.Create(Length.FromNanometres(5), Energy.FromElectronVolts(0.1), [0.05], [], EffectiveMass.FromElectronMasses(0.07), 64));
        var compiled = CellTransfer.Create(cell).Compiled;
        double u = 0.3, w = -1.7, log = 0;
        for (var i = 0; i < compiled.Count; i++)
        {
            compiled.StepForward(i, 0.12, ref u, ref w, ref log);
        }
        for (var i = compiled.Count - 1; i >= 0; i--)
        {
            compiled.StepBackward(i, 0.12, ref u, ref w, ref log);
        }
        var scale = Math.Exp(log);
        // Rounding grows with the conditioning of the product (a 4 nm barrier, e^(κw) ≈ 10): 1e-12.
        Assert.Equal(0.3, u * scale, 1e-12);
        Assert.Equal(-1.7, w * scale, 1e-12);
    }

    private static int IndexOf(UnitCell cell, double potential)
    {
        var elements = cell.Elements;
        for (var i = 0; i < elements.Count; i++)
        {
            if (elements[i] is Layer layer && layer.Potential.ElectronVolts == potential)
            {
                return i;
            }
        }
        throw new InvalidOperationException("no such layer");
    }
}
