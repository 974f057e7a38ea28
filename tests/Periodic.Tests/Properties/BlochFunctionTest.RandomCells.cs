// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using MathNet.Numerics.Integration;
using Periodic.Bands;
using Periodic.Properties;
using static Periodic.Tests.TestHelpers.Checks;

namespace Periodic.Tests.Properties;

/// <summary>Bloch functions of random cells: finite, normalised, periodic in density.</summary>
public sealed partial class BlochFunctionTest
{
    [Fact]
    public void BlochFunctions_RandomCells_AreFiniteNormalisedAndPeriodicInDensity()
    {
        int cells = 0, functions = 0, rejected = 0;
        var gen = from spec in RandomCells.Cells(3, 1) from k in Gen.Choose(-1000, 1000) from band in Gen.Choose(1, 2) select (spec, k / 1000.0, band);
        var config = Config.QuickThrowOnFailure.WithMaxTest(200).WithReplay(0x5EED_0008UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((CellSpec Spec, double K, int Band) input) =>
        {
            BandStructure bands;
            try
            {
                bands = BandStructure.Compute(input.Spec.Build(), 2);
            }
            catch (BandSearchException)
            {
                return;
            }
            cells++;
            var d = bands.PeriodNanometres;
            BlochFunction psi;
            try
            {
                psi = BlochFunction.Create(bands, input.Band, input.K * Math.PI / d);
            }
            catch (ArgumentException ex) when (ex is not ArgumentOutOfRangeException)
            {
                rejected++; // documented: barriers too opaque for the stated accuracy
                return;
            }
            functions++;
            Finite(psi.RelativeErrorEstimate, "error estimate");
            // ∫_cell |ψ|² = 1 (documented normalisation), by MathNet Gauss–Legendre per layer (|ψ|² is smooth
            // inside a layer); tolerance 1e-8 + 100× the reported error estimate.
            double x = 0, norm = 0;
            foreach (var element in bands.Cell.Elements)
            {
                var w = element.Width.Nanometres;
                if (w > 0)
                {
                    var a = x;
                    norm += GaussLegendreRule.Integrate(y => { var v = psi.ValueAt(y); return v.Real * v.Real + v.Imaginary * v.Imaginary; }, a, a + w, 64);
                }
                x += w;
            }
            Assert.Equal(1, norm, 1e-8 + 100 * psi.RelativeErrorEstimate);
            foreach (var f in new[] { 0.0, 0.17, 0.5, 0.93 })
            {
                var v0 = psi.ValueAt(f * d);
                var v1 = psi.ValueAt(f * d + d);
                Finite(v0.Real, "Re psi");
                Finite(v0.Imaginary, "Im psi");
                // Bloch's theorem: |ψ(x + d)| = |ψ(x)|; 1e-9 + 100× the error estimate (relative to max|ψ|² ~ 1/d).
                var d0 = v0.Real * v0.Real + v0.Imaginary * v0.Imaginary;
                var d1 = v1.Real * v1.Real + v1.Imaginary * v1.Imaginary;
                Assert.Equal(d0, d1, (1e-9 + 100 * psi.RelativeErrorEstimate) * (1 + d0) * 10 / d);
            }
        }));
        output.WriteLine($"Bloch functions: {cells} cells, {functions} functions, {rejected} documented rejections");
        Assert.True(functions > 120);
    }
}
