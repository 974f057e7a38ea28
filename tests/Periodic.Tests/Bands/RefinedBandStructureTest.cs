// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

/// <summary>The tolerance-driven driver (step halving with Richardson's estimate). Lives with the smooth-transfer tests it serves.</summary>
public sealed class RefinedBandStructureTest
{
    private static readonly EffectiveMass Gaas = EffectiveMass.FromElectronMasses(0.067);

    [Fact]
    public void Compute_MixedCell_SameAnswerFromTwoPrimitives()
    {
        // The same cosine well written as a Fourier segment and as a function segment, each between a barrier
        // layer and a delta: two constructions of one potential must give the same bands (exact identity),
        // to within their reported errors plus 1e-12 relative.
        var d = Length.FromNanometres(6);
        var fourier = FourierSegment.Cosine(d, Energy.FromElectronVolts(0.05), Gaas);
        var function = FunctionSegment.Create(d, x => 0.05 * Math.Cos(2 * Math.PI * x / 6), Gaas, 64);
        var barrier = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.25), Gaas);
        var delta = DeltaBarrier.Create(0.02);
        var a = RefinedBandStructure.Compute(UnitCell.Create(fourier, barrier, delta), 3, RefinementOptions.Create(1e-11));
        var b = RefinedBandStructure.Compute(UnitCell.Create(function, barrier, delta), 3, RefinementOptions.Create(1e-11));
        Assert.True(a.Converged && b.Converged, a + "\n" + b);
        for (var i = 0; i < 6; i++)
        {
            var band = i / 2 + 1;
            double ea = i % 2 == 0 ? a.Structure.GetBand(band).BottomElectronVolts : a.Structure.GetBand(band).TopElectronVolts;
            double eb = i % 2 == 0 ? b.Structure.GetBand(band).BottomElectronVolts : b.Structure.GetBand(band).TopElectronVolts;
            Assert.True(Math.Abs(ea - eb) <= a.EdgeErrorsElectronVolts[i] + b.EdgeErrorsElectronVolts[i] + 1e-12 * Math.Abs(ea), $"edge {i}: {ea:R} vs {eb:R}");
        }
        Assert.True(a.Refinements >= 1);
        Assert.True(a.MagnusStepCount > 64);
    }

    [Fact]
    public void Compute_LayersOnly_NeedsNoRefinement()
    {
        var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.3), Gaas);
        var result = RefinedBandStructure.Compute(cell, 2);
        Assert.Equal(0, result.Refinements);
        Assert.True(result.Converged);
        Assert.Equal(0, result.MagnusStepCount);
    }

    [Fact]
    public void Compute_RefinementBudgetTooSmall_SaysNotConverged()
    {
        // One halving of a 4-step mesh cannot reach 1e-13 on a cosine lattice: the result must say so (no silent
        // success), while still returning its best bands and an error estimate.
        var coarse = FourierSegment.Cosine(Length.FromNanometres(1), Energy.FromElectronVolts(5), EffectiveMass.FreeElectron).WithStepCount(4);
        var result = RefinedBandStructure.Compute(UnitCell.Create(coarse), 2, RefinementOptions.Create(1e-13, 1));
        Assert.False(result.Converged);
        Assert.True(result.MaxRelativeError > 1e-13);
        Assert.Contains("NOT converged", result.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Compute_BadInput_NamesTheParameter()
    {
        var cell = UnitCell.Create(FourierSegment.Cosine(Length.FromNanometres(1), Energy.FromElectronVolts(1), EffectiveMass.FreeElectron));
        Assert.Equal("cell", Assert.Throws<ArgumentNullException>(() => RefinedBandStructure.Compute(null!, 1)).ParamName);
        Assert.Equal("count", Assert.Throws<ArgumentOutOfRangeException>(() => RefinedBandStructure.Compute(cell, 0)).ParamName);
        Assert.Equal("relativeTolerance", Assert.Throws<ArgumentOutOfRangeException>(() => RefinedBandStructure.Compute(cell, 1, RefinementOptions.Create(1e-20))).ParamName);
        Assert.Equal("maxRefinements", Assert.Throws<ArgumentOutOfRangeException>(() => RefinedBandStructure.Compute(cell, 1, RefinementOptions.Create(1e-8, 0))).ParamName);
    }
}
