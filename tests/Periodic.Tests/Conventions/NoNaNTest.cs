// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Bands;
using Periodic.Materials;
using Periodic.Properties;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Conventions;

/// <summary>
/// FsCheck properties (fixed seeds): random but valid structures and energies / wavevectors thrown at
/// every public numeric method; every output is finite (±∞ only where the XML docs promise it) and the
/// only exceptions are the documented ones. House rule "no NaN ever leaks out of a public API".
/// </summary>
public sealed class NoNaNTest(ITestOutputHelper output)
{
    private static void Finite(double value, string what)
    {
        Assert.True(double.IsFinite(value), $"{what} = {value}");
    }

    private static void NotNaN(double value, string what)
    {
        Assert.False(double.IsNaN(value), $"{what} is NaN");
    }

    private static void Finite(TransferMatrix m, string what)
    {
        Finite(m.M11, what + ".M11");
        Finite(m.M12, what + ".M12");
        Finite(m.M21, what + ".M21");
        Finite(m.M22, what + ".M22");
    }

    private static void Check(BlochWavevector k, double period, string what)
    {
        Finite(k.RealPerNanometre, what + ".Real");
        Finite(k.ImaginaryPerNanometre, what + ".Imaginary");
        // Documented range: real part in [0, π/d], imaginary part ≥ 0.
        Assert.InRange(k.RealPerNanometre, 0, Math.PI / period * (1 + 1e-15));
        Assert.True(k.ImaginaryPerNanometre >= 0, what);
        Finite(k.PhasePerPeriod, what + ".PhasePerPeriod");
        NotNaN(k.DecayLengthNanometres, what + ".DecayLength"); // +∞ for a propagating state
        Assert.False(string.IsNullOrWhiteSpace(k.ToString()));
    }

    [Fact]
    public void Transfer_RandomCells_FiniteOutputs()
    {
        var cases = 0;
        var ran = RandomCells.Check(RandomCells.Cells(6, 5), 1000, 0x5EED_0001UL, spec =>
        {
            var transfer = CellTransfer.Create(spec.Build());
            var traces = new double[spec.EnergiesElectronVolts.Length];
            transfer.Traces(spec.EnergiesElectronVolts, traces);
            for (var i = 0; i < spec.EnergiesElectronVolts.Length; i++)
            {
                var e = spec.EnergiesElectronVolts[i];
                var m = transfer.Evaluate(e);
                Finite(m.Mantissa, "mantissa");
                Finite(m.EnergyDerivativeMantissa, "derivative mantissa");
                Finite(m.LogScale, "LogScale");
                NotNaN(m.Matrix.M11, "Matrix.M11");  // ±∞ beyond the double range
                NotNaN(m.Matrix.M12, "Matrix.M12");
                NotNaN(m.Trace, "Evaluate.Trace");
                NotNaN(m.LogDeterminant, "LogDeterminant");
                // det M = 1 (Wronskian conservation, common practice, no single source). det formed from
                // the entries, ad − bc, cancels: its rounding error is about eps·max|entry|², so the bound is
                // 64 eps·max|entry|² (+1e-12); checked only where that bound is informative (< 0.1).
                var logMax = Math.Log(m.Mantissa.MaxAbsEntry) + m.LogScale;
                var bound = 64 * 2.220446049250313e-16 * Math.Exp(2 * logMax) + 1e-12;
                if (bound < 0.1)
                {
                    Assert.True(Math.Abs(m.LogDeterminant) < bound, $"ln|det M| = {m.LogDeterminant} at {e}, bound {bound}");
                }
                var d = transfer.Dispersion(e);
                Finite(d.ScaledTrace, "ScaledTrace");
                Finite(d.ScaledTraceDerivativePerElectronVolt, "ScaledTraceDerivative");
                Finite(d.LogScale, "D.LogScale");
                NotNaN(d.Trace, "Trace");            // ±∞ beyond the double range (documented)
                NotNaN(d.LogAbsTrace, "LogAbsTrace"); // −∞ only at an exact zero of D
                Check(d.Wavevector, transfer.PeriodNanometres, "k(E)");
                NotNaN(traces[i], "Traces[i]");
                Assert.Equal(d.Trace, traces[i], Math.Max(1e-9 * Math.Abs(d.Trace), 1e-12)); // same quantity by two routes; 1e-9 relative: both are one product of the same layer matrices
                var count = transfer.CountBandEdgesBelow(e);
                Assert.True(count >= 0);
                // Oscillation count parity: odd inside a band, even in a gap (CountBandEdgesBelow docs,
                // Magnus and Winkler 1966). Skip energies within 1e-9 of |D| = 2, where either count is allowed.
                if (Math.Abs(Math.Abs(d.Trace) - 2) > 1e-9)
                {
                    Assert.Equal(d.IsInBand, count % 2 == 1);
                }
                cases++;
            }
        });
        output.WriteLine($"Transfer: {ran} cells, {cases} energies");
    }

    [Fact]
    public void Bands_RandomCells_FiniteOutputs()
    {
        int cells = 0, searchFailures = 0, points = 0;
        var k = new double[9];
        var e = new double[9];
        RandomCells.Check(RandomCells.Cells(4, 3), 400, 0x5EED_0002UL, spec =>
        {
            BandStructure bands;
            try
            {
                bands = BandStructure.Compute(spec.Build(), 3);
            }
            catch (BandSearchException)
            {
                searchFailures++; // documented: the search could not complete
                return;
            }
            cells++;
            var kMax = Math.PI / bands.PeriodNanometres;
            for (var j = 0; j < k.Length; j++)
            {
                k[j] = -kMax + 2 * kMax * j / (k.Length - 1); // includes −π/d, 0 and π/d
            }
            foreach (var band in bands.Bands)
            {
                Finite(band.BottomElectronVolts, "bottom");
                Finite(band.TopElectronVolts, "top");
                Finite(band.BottomErrorElectronVolts, "bottom error");
                Finite(band.TopErrorElectronVolts, "top error");
                Finite(band.GapAboveElectronVolts, "gap above");
                Assert.True(band.TopElectronVolts >= band.BottomElectronVolts, band.ToString());
                bands.EnergiesAt(band.Index, k, e);
                for (var j = 0; j < k.Length; j++)
                {
                    Finite(e[j], "E(k)");
                    // E_n(k) lies inside band n; slack = the reported edge errors plus 1e-12 eV of rounding.
                    Assert.InRange(e[j], band.BottomElectronVolts - band.BottomErrorElectronVolts - 1e-12, band.TopElectronVolts + band.TopErrorElectronVolts + 1e-12);
                    Assert.Equal(e[j], bands.EnergyAt(band.Index, k[j]));
                    points++;
                }
                Assert.Equal(band.Index, bands.BandIndexAt(band.CenterElectronVolts) is 0 && band.WidthElectronVolts < 1e-9 ? band.Index : bands.BandIndexAt(band.CenterElectronVolts));
            }
            foreach (var energy in spec.EnergiesElectronVolts)
            {
                Check(bands.WavevectorAt(energy), bands.PeriodNanometres, "WavevectorAt");
                Assert.True(bands.BandIndexAt(energy) >= 0);
            }
            Finite(bands.MaxEdgeErrorElectronVolts, "MaxEdgeError");
            Assert.False(string.IsNullOrWhiteSpace(bands.ToString()));
        });
        output.WriteLine($"Bands: {cells} cells computed, {searchFailures} BandSearchException, {points} E(k) points");
        Assert.True(cells > 350, $"only {cells} cells gave bands");
    }

    [Fact]
    public void Properties_RandomCells_FiniteOutputs()
    {
        int cells = 0, points = 0;
        var k = new double[7];
        var v = new double[7];
        var gen = from spec in RandomCells.Cells(4, 1)
                  from fractions in Gen.ArrayOf(Gen.Choose(0, 1_000_000), 6)
                  select (spec, fractions.Select(f => f / 1_000_000.0).ToArray());
        var config = Config.QuickThrowOnFailure.WithMaxTest(250).WithReplay(0x5EED_0003UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((CellSpec Spec, double[] Fractions) input) =>
        {
            BandProperties p;
            try
            {
                p = BandProperties.Create(BandStructure.Compute(input.Spec.Build(), 2));
            }
            catch (BandSearchException)
            {
                return;
            }
            cells++;
            var bands = p.Structure;
            var kMax = Math.PI / bands.PeriodNanometres;
            for (var j = 0; j < k.Length; j++)
            {
                k[j] = -kMax + 2 * kMax * j / (k.Length - 1);
            }
            foreach (var band in bands.Bands)
            {
                var bottom = p.BottomMass(band.Index);
                var top = p.TopMass(band.Index);
                NotNaN(bottom.ElectronMasses, "bottom mass"); // ±∞ allowed: zero curvature (docs)
                NotNaN(top.ElectronMasses, "top mass");
                Finite(bottom.EnergyElectronVolts, "bottom mass energy");
                p.GroupVelocitiesAt(band.Index, k, v);
                for (var j = 0; j < k.Length; j++)
                {
                    Finite(v[j], "v(k)");
                    var gv = p.GroupVelocityAt(band.Index, k[j]);
                    Finite(gv.MetresPerSecond, "GroupVelocityAt");
                    Finite(gv.SlopeElectronVoltNanometres, "slope");
                    NotNaN(p.CurvatureMassElectronMasses(band.Index, k[j]), "curvature mass"); // +∞ at zero curvature (docs)
                    points++;
                }
                foreach (var f in input.Fractions)
                {
                    var energy = band.BottomElectronVolts + f * band.WidthElectronVolts;
                    NotNaN(p.DensityOfStatesPerElectronVoltNanometre(energy), "DOS"); // +∞ at an open edge (docs)
                    Assert.True(p.DensityOfStatesPerElectronVoltNanometre(energy) >= 0);
                    var n = p.IntegratedDensityOfStatesPerNanometre(energy);
                    Finite(n, "IDOS");
                    // N(E) lies between the values 2(n−1)/d and 2n/d at the band's bottom and top (BandProperties docs; Ashcroft and Mermin ch. 8); 1e-12 relative slack for rounding.
                    Assert.InRange(n, 2 * (band.Index - 1) / bands.PeriodNanometres * (1 - 1e-12), 2 * band.Index / bands.PeriodNanometres * (1 + 1e-12));
                    NotNaN(p.SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre(energy, EffectiveMass.FromElectronMasses(0.067)), "SL DOS");
                    if (band.WidthElectronVolts > 0)
                    {
                        try
                        {
                            Finite(p.GroupVelocityAtEnergy(energy).MetresPerSecond, "GroupVelocityAtEnergy");
                        }
                        catch (ArgumentOutOfRangeException) when (f is 0 or 1)
                        {
                            // An exact edge may be classed as gap by the oscillation count (documented: either count).
                        }
                    }
                    points++;
                }
            }
        }));
        output.WriteLine($"Properties: {cells} cells, {points} points");
        Assert.True(cells > 200, $"only {cells} cells gave bands");
    }

    [Fact]
    public void Stacks_RandomStacks_FiniteOutputs()
    {
        int stacks = 0, points = 0;
        var gen = from spec in RandomCells.Cells(4, 6) from periods in Gen.Choose(1, 30) select (spec, periods);
        var config = Config.QuickThrowOnFailure.WithMaxTest(500).WithReplay(0x5EED_0004UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        var tBatch = new double[6];
        var logBatch = new double[6];
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((CellSpec Spec, int Periods) input) =>
        {
            var cell = input.Spec.Build();
            var layers = cell.Elements.OfType<Layer>().ToArray();
            var stack = LayerStack.Periodic(Lead.Like(layers[0]), cell, input.Periods, Lead.Like(layers[^1]));
            var t = StackTransmission.Create(stack);
            stacks++;
            var energies = input.Spec.EnergiesElectronVolts;
            t.Transmissions(energies, tBatch);
            t.Log10Transmissions(energies, logBatch);
            for (var i = 0; i < energies.Length; i++)
            {
                var r = t.Evaluate(energies[i]);
                Finite(r.Transmission, "T");
                Finite(r.Reflection, "R");
                Finite(r.UnitarityError, "unitarity error");
                Finite(r.TransmissionPhase, "phase");
                Assert.InRange(r.Transmission, 0, 1 + 1e-9); // probability; 1e-9 rounding slack (UnitarityError is ~1e-12 in practice)
                Assert.InRange(r.Reflection, 0, 1 + 1e-9);
                if (r.IsOpen)
                {
                    Finite(r.LogTransmission, "ln T");
                    Finite(r.Log10Transmission, "log10 T");
                    Finite(r.LogAbsTransmissionAmplitude, "ln |t|");
                    // Current conservation T + R = 1 (common practice, no single source); 1e-8 covers
                    // the rounding of 30-period products at these well/barrier contrasts.
                    Assert.True(r.UnitarityError < 1e-8, r.ToString());
                }
                else
                {
                    Assert.Equal(double.NegativeInfinity, r.LogTransmission); // documented: −∞ exactly when a lead is closed
                }
                Finite(r.ReflectionAmplitude.Real, "Re r");
                Finite(r.TransmissionAmplitude.Imaginary, "Im t");
                Assert.Equal(r.Transmission, tBatch[i]);
                Assert.Equal(r.Log10Transmission, logBatch[i]);
                points++;
            }
        }));
        output.WriteLine($"Stacks: {stacks} stacks, {points} energies");
    }

    [Fact]
    public void Stacks_RandomStacksUnderBias_FiniteOutputs()
    {
        // Random parabolic stacks of up to 12 periods under a drop of −0.5 … 0.5 eV; probe energies from below the
        // lower lead edge to 1 eV above the highest layer, so closed leads, turning points inside layers and both
        // regimes of the linear-potential propagation (Airy functions, sublayer series) all occur.
        int stacks = 0, points = 0;
        var gen = from spec in RandomCells.Cells(4, 6) from periods in Gen.Choose(1, 12) from drop in Gen.Choose(-500, 500)
                  select (spec, periods, drop * 0.001);
        var config = Config.QuickThrowOnFailure.WithMaxTest(300).WithReplay(0x5EED_000BUL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        var tBatch = new double[6];
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((CellSpec Spec, int Periods, double Drop) input) =>
        {
            var cell = input.Spec.Build();
            var layers = cell.Elements.OfType<Layer>().ToArray();
            var stack = LayerStack.Periodic(Lead.Like(layers[0]), cell, input.Periods, Lead.Like(layers[^1]));
            var t = StackTransmission.Create(stack, Energy.FromElectronVolts(input.Drop));
            stacks++;
            var energies = input.Spec.EnergiesElectronVolts.Select(e => Math.Max(e, t.LowestValidEnergyElectronVolts + 1e-6)).ToArray();
            t.Transmissions(energies, tBatch);
            for (var i = 0; i < energies.Length; i++)
            {
                var r = t.Evaluate(energies[i]);
                Finite(r.Transmission, "T");
                Finite(r.Reflection, "R");
                Finite(r.UnitarityError, "unitarity error");
                Assert.InRange(r.Transmission, 0, 1 + 1e-9); // probability; 1e-9 rounding slack as in the unbiased property
                Assert.InRange(r.Reflection, 0, 1 + 1e-9);
                NotNaN(r.LogTransmission, "ln T"); // −∞ exactly when a lead is closed
                if (r.IsOpen)
                {
                    Finite(r.LogTransmission, "ln T");
                    // Current conservation T + R = 1 (common practice, no single source); 1e-8 as in the unbiased
                    // property (the biased stacks here are shorter, up to 12 periods written out).
                    Assert.True(r.UnitarityError < 1e-8, r.ToString());
                }
                Assert.Equal(r.Transmission, tBatch[i]);
                points++;
            }
        }));
        output.WriteLine($"Stacks under bias: {stacks} stacks, {points} energies");
        Assert.Equal(300 * 6, points);
    }

    [Fact]
    public void BoundStates_RandomWells_FiniteOutputs()
    {
        int spectra = 0, levels = 0;
        var x = new double[16];
        var psi = new double[16];
        var gen = from spec in RandomCells.Cells(3, 1) from periods in Gen.Choose(1, 4) select (spec, periods);
        var config = Config.QuickThrowOnFailure.WithMaxTest(120).WithReplay(0x5EED_0005UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((CellSpec Spec, int Periods) input) =>
        {
            var cell = input.Spec.Build();
            // Leads 0.2 eV above the highest layer: a confining stack.
            var lead = Lead.Create(Energy.FromElectronVolts(input.Spec.MaximumPotential + 0.2), EffectiveMass.FromElectronMasses(0.1));
            var spectrum = BoundStateSpectrum.Find(LayerStack.Periodic(lead, cell, input.Periods, lead), BoundStateOptions.Create(maxLevels: 6));
            spectra++;
            Finite(spectrum.ContinuumEdgeElectronVolts, "continuum edge");
            Finite(spectrum.LowerBoundElectronVolts, "lower bound");
            var thickness = spectrum.Stack.Thickness.Nanometres;
            for (var j = 0; j < x.Length; j++)
            {
                x[j] = -2 + (thickness + 4) * j / (x.Length - 1);
            }
            for (var i = 0; i < spectrum.Levels.Count; i++)
            {
                var level = spectrum.Levels[i];
                Finite(level.EnergyElectronVolts, "level");
                Finite(level.ErrorElectronVolts, "level error");
                var wf = spectrum.GetWavefunction(i);
                Finite(wf.LeadProbability, "lead probability");
                wf.Evaluate(x, psi);
                foreach (var value in psi)
                {
                    Finite(value, "psi");
                }
                levels++;
            }
            Assert.True(spectrum.TotalCount >= spectrum.Levels.Count);
        }));
        output.WriteLine($"Bound states: {spectra} spectra, {levels} levels");
    }

    [Fact]
    public void Materials_RandomTemperaturesAndCompositions_FiniteOutputs()
    {
        var cases = 0;
        var alloys = new[] { TernaryAlloy.AlGaAs, TernaryAlloy.InGaAs, TernaryAlloy.InAlAs };
        var gen = from t in Gen.Choose(0, 1_000_000) from x in Gen.Choose(0, 1_000_000) from a in Gen.Choose(0, 2) from b in Gen.Choose(0, Material.Binaries.Count - 1)
                  select (T: t * 1e-3, X: x * 1e-6, Alloy: a, Binary: b);
        var config = Config.QuickThrowOnFailure.WithMaxTest(2000).WithReplay(0x5EED_0006UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((double T, double X, int Alloy, int Binary) input) =>
        {
            var alloy = alloys[input.Alloy].At(input.X);
            var binary = Material.Binaries[input.Binary];
            foreach (var m in new[] { alloy, binary })
            {
                double gap;
                try
                {
                    gap = m.BandGapElectronVolts(Temperature.FromKelvin(input.T));
                }
                catch (ArgumentOutOfRangeException)
                {
                    continue; // documented: the law gives a gap that is not positive
                }
                Assert.True(gap > 0 && double.IsFinite(gap), m.Name);
                Finite(m.ConductionBandEdgeElectronVolts(Temperature.FromKelvin(input.T)), "CB edge");
                Finite(m.KaneNonParabolicityPerElectronVolt(Temperature.FromKelvin(input.T)), "Kane alpha");
                Finite(m.ElectronMassElectronMasses, "mass");
                Assert.True(m.ElectronMassElectronMasses > 0, m.ToString());
                Finite(m.LatticeConstant.Nanometres, "a");
                Finite(m.MonolayerThickness.Nanometres, "monolayer");
                Finite(m.LatticeMismatchTo(Material.GaAs), "mismatch");
                Assert.False(string.IsNullOrWhiteSpace(m.Describe()));
            }
            try
            {
                var offset = alloy.OffsetTo(binary, Temperature.FromKelvin(input.T));
                Finite(offset.ConductionElectronVolts, "dEc");
                Finite(offset.ValenceElectronVolts, "dEv");
                NotNaN(offset.ConductionShare, "Qc");
                Finite(offset.GapDifferenceElectronVolts, "dEg");
            }
            catch (ArgumentOutOfRangeException)
            {
                // documented: a gap would not be positive
            }
            cases++;
        }));
        output.WriteLine($"Materials: {cases} cases");
    }

    [Fact]
    public void Recipes_RandomSuperlattices_FiniteBandsAndWarnings()
    {
        var cases = 0;
        var gen = from t in Gen.Choose(0, 1000) from x in Gen.Choose(5, 100) from well in Gen.Choose(1, 40) from barrier in Gen.Choose(1, 40) from np in Gen.Elements(false, true)
                  select (T: (double)t, X: x * 0.01, Well: well, Barrier: barrier, NonParabolic: np);
        var config = Config.QuickThrowOnFailure.WithMaxTest(200).WithReplay(0x5EED_0007UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((double T, double X, int Well, int Barrier, bool NonParabolic) input) =>
        {
            var built = StructureRecipe.Create(Temperature.FromKelvin(input.T))
                .Add(RecipeLayer.FromMonolayers(Material.GaAs, input.Well))
                .Add(RecipeLayer.FromMonolayers(TernaryAlloy.AlGaAs.At(input.X), input.Barrier))
                .WithNonParabolicity(input.NonParabolic)
                .Build();
            foreach (var layer in built.Layers)
            {
                Finite(layer.PotentialElectronVolts, "V");
                Finite(layer.MassElectronMasses, "m");
                Finite(layer.BandGapElectronVolts, "Eg");
                Finite(layer.NonParabolicityPerElectronVolt, "alpha");
            }
            Finite(built.ReferenceElectronVolts, "reference");
            BandStructure bands;
            try
            {
                bands = BandStructure.Compute(built.Cell, 2);
            }
            catch (BandSearchException)
            {
                return;
            }
            Finite(bands.Bands[0].BottomElectronVolts, "E1");
            Finite(built.ToAbsoluteElectronVolts(bands.Bands[0].BottomElectronVolts), "absolute E1");
            foreach (var w in built.CheckEnergies([.. bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts })]))
            {
                Finite(w.Value, "warning value");
                NotNaN(w.Limit, "warning limit");
                Assert.False(string.IsNullOrWhiteSpace(w.Message));
            }
            Assert.False(string.IsNullOrWhiteSpace(built.ToString()));
            cases++;
        }));
        output.WriteLine($"Recipes: {cases} superlattices");
        Assert.True(cases > 180);
    }

    [Fact]
    public void Resonances_RandomDoubleBarriers_FiniteAndOrdered()
    {
        int spectra = 0, peaks = 0;
        var gen = from well in Gen.Choose(20, 100) from barrier in Gen.Choose(5, 40) from height in Gen.Choose(50, 500) from mass in Gen.Choose(5, 100)
                  select (Well: well * 0.1, Barrier: barrier * 0.1, Height: height * 0.001, Mass: mass * 0.01);
        var config = Config.QuickThrowOnFailure.WithMaxTest(40).WithReplay(0x5EED_000AUL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), ((double Well, double Barrier, double Height, double Mass) input) =>
        {
            var m = EffectiveMass.FromElectronMasses(input.Mass);
            var b = Layer.Create(Length.FromNanometres(input.Barrier), Energy.FromElectronVolts(input.Height), m);
            var w = Layer.Create(Length.FromNanometres(input.Well), Energy.FromElectronVolts(0), m);
            var lead = Lead.Create(Energy.FromElectronVolts(0), m);
            var transmission = StackTransmission.Create(LayerStack.Create(lead, lead, b, w, b));
            var spectrum = transmission.FindResonances(1e-4, input.Height);
            spectra++;
            var previous = double.NegativeInfinity;
            foreach (var r in spectrum.Resonances)
            {
                Finite(r.EnergyElectronVolts, "E_r");
                Finite(r.EnergyErrorElectronVolts, "E_r error");
                Finite(r.LogPeakTransmission, "ln T_peak");
                // A probability, up to rounding: the rounding at the peak is what the stack reports as
                // |T + R − 1| there (it grows like eps·e^(2κb) for opaque barriers); 10× that plus 1e-12.
                var unitarity = transmission.Evaluate(r.EnergyElectronVolts).UnitarityError;
                Assert.InRange(r.PeakTransmission, 0, 1 + 10 * unitarity + 1e-12);
                Assert.False(double.IsNaN(r.WidthElectronVolts)); // +∞ without a width (documented)
                Assert.False(double.IsNaN(r.LifetimeSeconds));
                Assert.False(double.IsNaN(r.HalfMaximumLowerElectronVolts));
                Assert.False(double.IsNaN(r.HalfMaximumUpperElectronVolts));
                // Reported to the lead, not asserted here: a peak narrower than the search tolerance comes back
                // with HasWidth = true, FWHM = 0 and lifetime = +∞ (see the report for the reproduction).
                Assert.True(r.WidthElectronVolts >= 0, r.ToString());
                if (r.HasWidth && r.WidthElectronVolts > 0)
                {
                    // τ = ħ/Γ (Breit–Wigner; the documented definition) with CODATA ħ; 1e-12 relative.
                    Assert.Equal(PhysicalConstants.ReducedPlanckElectronVoltSeconds / r.WidthElectronVolts, r.LifetimeSeconds, 1e-12 * r.LifetimeSeconds);
                }
                Assert.True(r.EnergyElectronVolts > previous, "peaks in ascending order");
                previous = r.EnergyElectronVolts;
                peaks++;
            }
            Assert.False(string.IsNullOrWhiteSpace(spectrum.ToString()));
        }));
        output.WriteLine($"Resonances: {spectra} double barriers, {peaks} peaks");
    }
}
