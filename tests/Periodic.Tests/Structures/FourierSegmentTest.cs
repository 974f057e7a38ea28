// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Structures;

public sealed class FourierSegmentTest
{
    private static readonly Length Period = Length.FromNanometres(2);

    [Fact]
    public void RecoilEnergy_MatchesDefinition()
    {
        // E_R = ħ²k_L²/2m with k_L = π/d (common practice for optical lattices, no single source);
        // ħ²/2m0 = 0.03809982116 eV nm² (CODATA 2018, derived in docs/references.md), 1e-9 relative for its rounding.
        var expected = 0.03809982116 * Math.PI * Math.PI / (2.0 * 2.0) / 0.5;
        Assert.Equal(expected, FourierSegment.RecoilEnergy(Period, EffectiveMass.FromElectronMasses(0.5)).ElectronVolts, expected * 1e-9);
    }

    [Fact]
    public void OpticalLattice_PotentialIsSinSquared()
    {
        // s·E_R·sin²(πx/d) by definition: 0 at x = 0, s·E_R at x = d/2, s·E_R/2 at x = d/4 (1e-14 relative: rounding).
        var mass = EffectiveMass.FreeElectron;
        var recoil = FourierSegment.RecoilEnergy(Period, mass).ElectronVolts;
        var lattice = FourierSegment.OpticalLattice(Period, 8, mass);
        Assert.Equal(0, lattice.PotentialAt(0), 1e-14 * recoil);
        Assert.Equal(8 * recoil, lattice.PotentialAt(1.0), 1e-14 * recoil);
        Assert.Equal(4 * recoil, lattice.PotentialAt(0.5), 1e-14 * recoil);
        Assert.Equal(0, lattice.MinimumPotential.ElectronVolts, 1e-13 * recoil);
        Assert.Equal(8 * recoil, lattice.MaximumPotential.ElectronVolts, 1e-13 * recoil);
    }

    [Fact]
    public void Create_MixedHarmonics_RangeAndPeriodicity()
    {
        // V = 0.1 + 0.2 cos(gx) + 0.05 sin(2gx): periodic in d (exact), and the range found by scan and Newton
        // must bracket every value on a fine grid (1e-12 eV slack for rounding).
        var segment = FourierSegment.Create(Period, Energy.FromElectronVolts(0.1), [0.2], [0.0, 0.05], EffectiveMass.FreeElectron);
        Assert.Equal(2, segment.HarmonicCount);
        Assert.Equal(segment.PotentialAt(0.3), segment.PotentialAt(2.3), 1e-14);
        for (var i = 0; i <= 2000; i++)
        {
            var v = segment.PotentialAt(2.0 * i / 2000);
            Assert.InRange(v, segment.MinimumPotential.ElectronVolts - 1e-12, segment.MaximumPotential.ElectronVolts + 1e-12);
        }
    }

    [Fact]
    public void UnitCell_WithSegmentAndLayer_SumsWidthsAndRanges()
    {
        var segment = FourierSegment.Cosine(Period, Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.07));
        var cell = UnitCell.Create(segment, Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0.5), EffectiveMass.FromElectronMasses(0.09)));
        Assert.Equal(3.0, cell.Period.Nanometres, 1e-15);
        Assert.Equal(-0.3, cell.MinimumPotential.ElectronVolts, 1e-13);
        Assert.Equal(0.5, cell.MaximumPotential.ElectronVolts, 1e-15);
        Assert.Equal(0.07, cell.MinimumMass.ElectronMasses, 1e-15);
    }

    [Fact]
    public void Create_BadInput_NamesTheParameter()
    {
        var mass = EffectiveMass.FreeElectron;
        Assert.Equal("period", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Length.FromNanometres(0), default, [1.0], [], mass)).ParamName);
        Assert.Equal("cosineElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Period, default, [1.0, double.NaN], [], mass)).ParamName);
        Assert.Equal("sineElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Period, default, [], [double.PositiveInfinity], mass)).ParamName);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Period, default, [1.0], [], default)).ParamName);
        Assert.Equal("stepCount", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Period, default, [1.0], [], mass, 0)).ParamName);
        Assert.Equal("depthInRecoilEnergies", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.OpticalLattice(Period, -1, mass)).ParamName);
        Assert.Equal("positionNanometres", Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Cosine(Period, default, mass).PotentialAt(double.NaN)).ParamName);
        var message = Assert.Throws<ArgumentOutOfRangeException>(() => FourierSegment.Create(Period, default, [1.0, double.NaN], [], mass)).Message;
        Assert.Contains("[1]", message, StringComparison.Ordinal);
    }

    [Fact]
    public void ToString_NamesWidthAndSteps()
    {
        var text = FourierSegment.Cosine(Length.FromNanometres(1.5), Energy.FromElectronVolts(0.25), EffectiveMass.FreeElectron).ToString();
        Assert.Contains("1.5 nm", text, StringComparison.Ordinal);
        Assert.Contains("64 steps", text, StringComparison.Ordinal);
    }

    [Fact]
    public void WithStepCount_KeepsThePotential()
    {
        var segment = FourierSegment.Cosine(Period, Energy.FromElectronVolts(0.25), EffectiveMass.FreeElectron).WithStepCount(500);
        Assert.Equal(500, segment.StepCount);
        Assert.Equal(0.25, segment.PotentialAt(0), 1e-15);
    }

    [Theory]
    [InlineData(1024)] // a power of two: the radix-2 path
    [InlineData(1000)] // otherwise: the chirp-z path
    [InlineData(7)] // fewer steps than harmonics: harmonics alias onto the same bins
    public void Mesh_MatchesTheSeriesSummedDirectly(int steps)
    {
        // The mesh is sampled by a fast transform; direct summation of V₀ + Σ aₙcos + bₙsin at the Gauss nodes
        // (the definition) is the reference. Tolerance 1e-12 × Σ|aₙ| + |bₙ|: rounding of a transform of ≤ 2¹¹ points.
        var random = new Random(7);
        var cosine = new double[40];
        var sine = new double[25];
        for (var i = 0; i < cosine.Length; i++)
        {
            cosine[i] = random.NextDouble() - 0.5;
        }
        for (var i = 0; i < sine.Length; i++)
        {
            sine[i] = random.NextDouble() - 0.5;
        }
        var segment = FourierSegment.Create(Period, Energy.FromElectronVolts(0.3), cosine, sine, EffectiveMass.FreeElectron, steps);
        var samples = segment.Samples;
        var scale = cosine.Sum(Math.Abs) + sine.Sum(Math.Abs);
        var h = Period.Nanometres / steps;
        for (var j = 0; j < steps; j++)
        {
            double x1 = (j + SegmentSamples.Node1) * h, x2 = (j + SegmentSamples.Node2) * h;
            // The samples at the two Gauss–Legendre nodes of each step, which the Magnus mesh is built from.
            Assert.Equal(Direct(x1), samples.V1[j], 1e-12 * scale);
            Assert.Equal(Direct(x2), samples.V2[j], 1e-12 * scale);
        }

        double Direct(double x)
        {
            var v = 0.3;
            for (var n = 1; n <= cosine.Length; n++)
            {
                v += cosine[n - 1] * Math.Cos(2 * Math.PI * n * x / Period.Nanometres);
                v += (n <= sine.Length ? sine[n - 1] : 0) * Math.Sin(2 * Math.PI * n * x / Period.Nanometres);
            }
            return v;
        }
    }
}
