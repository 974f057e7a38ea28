// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using MathNet.Numerics.Integration;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Tests.Support;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Conventions;

/// <summary>
/// The conventions (finite outputs, documented exceptions, named parameters, T = 0 K and very high T)
/// applied to the APIs integrated later: carrier densities and Fermi levels, Bloch functions, the
/// tight-binding fit, Chebyshev band dispersions, band sweeps, vectorised traces and structure files.
/// </summary>
public sealed class NewApisTest(ITestOutputHelper output)
{
    private static void Finite(double value, string what) => Assert.True(double.IsFinite(value), $"{what} = {value}");

    private static readonly BandProperties Many = BandProperties.Create(BandStructure.Compute(Fixtures.Cell, 60));

    [Fact]
    public void CarrierDensities_FromZeroToVeryHighTemperature()
    {
        var p = Many;
        var e1 = p.Structure.GetBand(1).BottomElectronVolts;
        var cases = 0;
        foreach (var t in new[] { 0.0, 1e-3, 4.2, 77, 300, 1000, 3000 })
        {
            var previous = -1.0;
            foreach (var mu in new[] { e1 - 0.3, e1 - 0.01, e1, e1 + 0.02, 0.2, 0.5 })
            {
                var n = p.LinearCarrierDensity(mu, t);
                Finite(n.DensityPerNanometre, $"n({mu}, {t} K)");
                Finite(n.ErrorEstimatePerNanometre, "error");
                Assert.True(n.DensityPerNanometre >= 0);
                // n(μ) is non-decreasing (f rises with μ; common practice). Slack: the error estimates.
                Assert.True(n.DensityPerNanometre >= previous - 1e-12, $"n fell at mu = {mu}, T = {t}");
                previous = n.DensityPerNanometre;
                if (t == 0)
                {
                    // Documented: at T = 0 the occupation is a step and n = N(μ); the quadrature is exact up to rounding (1e-12 relative).
                    Assert.Equal(p.IntegratedDensityOfStatesPerNanometre(mu), n.DensityPerNanometre, 1e-12 * Math.Max(1, n.DensityPerNanometre));
                }
                var v = p.SuperlatticeCarrierDensity(mu, t, EffectiveMass.FromElectronMasses(0.067));
                Finite(v.DensityPerCubicNanometre, "n3D");
                Assert.True(v.DensityPerCubicNanometre >= 0);
                cases++;
            }
            // Round trip through the Fermi-level search (Brent): n(μ*) reproduces the target to the reported residual.
            var target = p.LinearCarrierDensity(e1 + 0.02, t).DensityPerNanometre;
            var solution = p.FermiLevelForLinearDensity(target, t);
            Finite(solution.FermiLevelElectronVolts, "mu*");
            Finite(solution.RelativeDensityResidual, "residual");
            Assert.True(solution.Converged, solution.ToString());
            var back = p.LinearCarrierDensity(solution.FermiLevelElectronVolts, t).DensityPerNanometre;
            // 1e-9 relative: the tolerance 1e-12 eV times dn/dμ / n, which is at most ~1e3 /eV near the band bottom.
            Assert.Equal(target, back, 1e-9 * target);
        }
        output.WriteLine($"carrier densities: {cases} (mu, T) cases");
    }

    [Fact]
    public void CarrierDensities_RejectBadInputNamingTheParameter()
    {
        var p = Fixtures.Properties;
        foreach (var bad in new[] { double.NaN, double.PositiveInfinity, -1.0 })
        {
            Assert.Equal("temperatureKelvin", Assert.ThrowsAny<ArgumentException>(() => p.LinearCarrierDensity(0.05, bad)).ParamName);
            Assert.Equal("temperatureKelvin", Assert.ThrowsAny<ArgumentException>(() => p.SuperlatticeCarrierDensity(0.05, bad, EffectiveMass.FromElectronMasses(0.067))).ParamName);
            Assert.Equal("densityPerNanometre", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForLinearDensity(bad, 300)).ParamName);
            Assert.Equal("densityPerCubicNanometre", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForSuperlatticeDensity(bad, 300, EffectiveMass.FromElectronMasses(0.067))).ParamName);
        }
        Assert.Equal("fermiLevelElectronVolts", Assert.ThrowsAny<ArgumentException>(() => p.LinearCarrierDensity(double.NaN, 300)).ParamName);
        Assert.Equal("inPlaneMass", Assert.ThrowsAny<ArgumentException>(() => p.SuperlatticeCarrierDensity(0.05, 300, default)).ParamName);
        Assert.Equal("absoluteToleranceElectronVolts", Assert.ThrowsAny<ArgumentException>(() => p.FermiLevelForLinearDensity(0.1, 300, 0)).ParamName);
        // Very high T needs bands that were not computed: a documented ArgumentOutOfRangeException, not a wrong number.
        Assert.ThrowsAny<ArgumentOutOfRangeException>(() => p.LinearCarrierDensity(0.05, 1e5));
        // A density above what the computed bands can hold.
        Assert.ThrowsAny<ArgumentOutOfRangeException>(() => p.FermiLevelForLinearDensity(1e6, 300));
    }

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

    [Fact]
    public void TightBindingFit_StaysWithinItsErrorBounds()
    {
        var bands = Fixtures.Bands;
        var kMax = Math.PI / bands.PeriodNanometres;
        for (var n = 1; n <= 2; n++)
        {
            var fit = TightBindingBand.Fit(bands, n);
            Finite(fit.OnSiteEnergyElectronVolts, "E0");
            Finite(fit.NearestNeighbourHoppingElectronVolts, "t");
            var m = fit.CoefficientsElectronVolts.Count - 1;
            foreach (var terms in new[] { 1, Math.Min(3, m), m })
            {
                var bound = fit.TruncationErrorBoundElectronVolts(terms) + fit.AliasingErrorElectronVolts;
                Finite(bound, "bound");
                foreach (var f in new[] { 0.0, 0.3, 0.77, 1.0 })
                {
                    var k = f * kMax;
                    var exact = bands.EnergyAt(n, k);
                    var fitted = fit.EnergyAt(k, terms);
                    Finite(fitted, "fit");
                    // The documented bounds, plus 1e-12 eV of rounding.
                    Assert.True(Math.Abs(fitted - exact) <= bound + 1e-12, $"band {n}, {terms} terms, k = {k}: |{fitted} - {exact}| > {bound}");
                }
            }
            Assert.Equal("terms", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(0.1, m + 1)).ParamName);
            Assert.Equal("terms", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(0.1, -1)).ParamName);
            Assert.Equal("wavevectorPerNanometre", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(double.NaN, 1)).ParamName);
        }
        Assert.Equal("bandIndex", Assert.ThrowsAny<ArgumentException>(() => TightBindingBand.Fit(bands, 5)).ParamName);
    }

    [Fact]
    public void BandSweep_MatchesSingleComputations()
    {
        var cells = Enumerable.Range(0, 6).Select(i => UnitCell.KronigPenney(Length.FromNanometres(3 + i), Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067))).ToArray();
        var swept = BandSweep.Compute(cells, 2, maxDegreeOfParallelism: 2);
        Assert.Equal(cells.Length, swept.Length);
        for (var i = 0; i < cells.Length; i++)
        {
            var single = BandStructure.Compute(cells[i], 2);
            Assert.Equal(single.GetBand(2).TopElectronVolts, swept[i].GetBand(2).TopElectronVolts); // same algorithm, same inputs: identical
        }
        Assert.Equal("bandCount", Assert.ThrowsAny<ArgumentException>(() => BandSweep.Compute(cells, 0)).ParamName);
    }

    [Fact]
    public void VectorisedTraces_RandomCells_NeverNaNAndCloseToScalar()
    {
        var points = 0;
        var destination = new double[5];
        RandomCells.Check(RandomCells.Cells(6, 5), 600, 0x5EED_0009UL, spec =>
        {
            var transfer = CellTransfer.Create(spec.Build());
            transfer.TracesVectorized(spec.EnergiesElectronVolts, destination);
            for (var i = 0; i < 5; i++)
            {
                var e = spec.EnergiesElectronVolts[i];
                Assert.False(double.IsNaN(destination[i]), $"NaN at {e}");
                var m = transfer.Evaluate(e);
                var scale = Math.Exp(Math.Log(m.Mantissa.MaxAbsEntry) + m.LogScale);
                // Documented agreement: 1e-13 × elements × max|M(E)|.
                if (double.IsFinite(scale))
                {
                    Assert.Equal(transfer.Trace(e), destination[i], 1e-13 * spec.Elements.Length * scale + 1e-300);
                }
                points++;
            }
        });
        output.WriteLine($"vectorised traces: {points} energies");
    }

    [Fact]
    public void StructureFile_BadInputThrowsTheDocumentedException()
    {
        // Malformed JSON and bad values are reported as StructureFileException (a FormatException) with a location.
        foreach (var json in new[] { "", "{", "[]", "{\"cell\": 5}", "{\"layers\": [{\"width\": \"NaN\"}]}" })
        {
            var ex = Assert.ThrowsAny<FormatException>(() => StructureFile.Parse(json, "test.json"));
            Assert.IsType<StructureFileException>(ex);
            Assert.Equal("test.json", ((StructureFileException)ex).SourceName);
            Assert.False(string.IsNullOrWhiteSpace(ex.Message));
        }
        Assert.ThrowsAny<ArgumentNullException>(() => StructureFile.Parse((string)null!, "x"));
    }
}
