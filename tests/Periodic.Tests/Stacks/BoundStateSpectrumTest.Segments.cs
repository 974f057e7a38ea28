// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Stacks;

/// <summary>Bound states of stacks that hold smooth segments (a self-consistent potential), and of a closed box.</summary>
public sealed partial class BoundStateSpectrumTest
{
    /// <summary>A uniform layer written as a sampled segment: constant samples every <paramref name="step"/> nm.</summary>
    private static SampledSegment Flat(double width, double potential, double mass, double step = 0.1)
    {
        var count = (int)Math.Round(width / step) + 1;
        var x = Enumerable.Range(0, count).Select(i => width * i / (count - 1)).ToArray();
        var v = Enumerable.Repeat(potential, count).ToArray();
        return SampledSegment.Create(x, v, EffectiveMass.FromElectronMasses(mass));
    }

    [Fact]
    public void Find_SampledSegmentsOfUniformLayers_SameLevelsAndWavefunctions()
    {
        // A double well written once with uniform layers (closed forms) and once with constant sampled segments (Magnus steps).
        // For a constant potential each Magnus step is the exact exponential (the commutator term vanishes), so the two stacks are
        // the same problem: levels to 1e-10 eV (their root tolerance is 1e-12 eV; rounding of 400 steps adds far less). The
        // wavefunctions at the step boundaries are propagated exactly; their normalisation integrates the segment by the
        // cubic Hermite interpolant of each 0.1 nm step, whose error is O(h⁴) ≈ (κh)⁴/384 ≲ 1e-6 relative for κ, k ≤ 3/nm, so 1e-6 of the peak.
        var lead = Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09));
        var layers = LayerStack.Create(lead, lead, Slab(6, 0), Slab(3, 0.3, 0.09), Slab(6, 0));
        var segments = LayerStack.Create(lead, lead, Flat(6, 0, 0.067), Flat(3, 0.3, 0.09), Flat(6, 0, 0.067));
        var exact = BoundStateSpectrum.Find(layers);
        var sampled = BoundStateSpectrum.Find(segments);
        Assert.Equal(exact.TotalCount, sampled.TotalCount);
        Assert.True(exact.TotalCount >= 2);
        double[] x = [-1, 0.5, 3, 6, 7.5, 9, 12, 15, 16];
        for (var n = 0; n < exact.Levels.Count; n++)
        {
            Assert.Equal(exact.Levels[n].EnergyElectronVolts, sampled.Levels[n].EnergyElectronVolts, 1e-10);
            var a = new double[x.Length];
            var b = new double[x.Length];
            exact.GetWavefunction(n).Evaluate(x, a);
            sampled.GetWavefunction(n).Evaluate(x, b);
            var peak = a.Max(Math.Abs);
            for (var i = 0; i < x.Length; i++)
            {
                Assert.Equal(a[i], b[i], 1e-6 * peak);
            }
        }
    }

    [Fact]
    public void Find_SampledLinearPotential_MatchesBiasedLayer()
    {
        // Two independent propagators of one tilted well: the biased kernel (Airy functions or the sublayer series) for a layer
        // under a bias, and the Magnus steps of a function segment V(x) = −F·x between leads whose right edge is lowered by hand.
        // Magnus is fourth order: 4000 and 8000 steps over 10 nm differ by far less than 1e-9 eV (self-check below), so the levels
        // must agree to 1e-9 eV.
        const double width = 10, drop = 0.05, mass = 0.067;
        var lead = Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(mass));
        var biased = BoundStateSpectrum.FindUnderBias(LayerStack.Create(lead, lead, Slab(width, 0, mass)), Energy.FromElectronVolts(drop));
        LayerStack Smooth(int steps) => LayerStack.Create(lead,
            Lead.Create(Energy.FromElectronVolts(0.3 - drop), EffectiveMass.FromElectronMasses(mass)),
            FunctionSegment.Create(Length.FromNanometres(width), z => -drop * z / width, EffectiveMass.FromElectronMasses(mass), steps));
        var fine = BoundStateSpectrum.Find(Smooth(8000));
        var coarse = BoundStateSpectrum.Find(Smooth(4000));
        Assert.Equal(biased.TotalCount, fine.TotalCount);
        for (var n = 0; n < biased.Levels.Count; n++)
        {
            var self = Math.Abs(fine.Levels[n].EnergyElectronVolts - coarse.Levels[n].EnergyElectronVolts);
            output.WriteLine($"level {n}: biased layer {biased.Levels[n].EnergyElectronVolts:R} eV, Magnus {fine.Levels[n].EnergyElectronVolts:R} eV (self-check {self:E2})");
            Assert.True(self < 1e-10, $"Magnus self-check {self}");
            Assert.Equal(biased.Levels[n].EnergyElectronVolts, fine.Levels[n].EnergyElectronVolts, 1e-9);
        }
    }

    [Fact]
    public void FindInBox_FlatSegment_InfiniteWellLevelsAndStates()
    {
        // Hard walls at both ends of a flat 20 nm region: the infinite square well, E_n = n²π²ħ²/(2mL²) and
        // ψ_n = √(2/L) sin(nπx/L) (D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., §2.2). The Magnus steps are
        // exact for the constant potential, so the levels agree to 1e-9 relative (root tolerance 1e-12 eV on E₁ ≈ 0.014 eV);
        // the states' normalisation by the Hermite rule is O(h⁴) ≈ 1e-7 relative at h = 0.1 nm, k ≤ 0.8/nm, hence 1e-6.
        const double length = 20, mass = 0.067;
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(mass));
        var profile = new StackProfile(LayerStack.Create(lead, lead, Flat(length, 0, mass)), long.MaxValue, "stack", hardWalls: true);
        var ceiling = 30 * C * Math.PI * Math.PI / (mass * length * length); // between E₅ (25 units) and E₆ (36)
        var spectrum = BoundStateSpectrum.FindInBox(profile, ceiling, BoundStateOptions.Default);
        Assert.Equal(5, spectrum.TotalCount);
        double[] x = [0, 1.3, 5, 10, 14.1, 20];
        for (var n = 1; n <= 5; n++)
        {
            var expected = n * n * Math.PI * Math.PI * C / (mass * length * length);
            Assert.Equal(1, spectrum.Levels[n - 1].EnergyElectronVolts / expected, 1e-9);
            var values = new double[x.Length];
            spectrum.GetWavefunction(n - 1).Evaluate(x, values);
            for (var i = 0; i < x.Length; i++)
            {
                Assert.Equal(Math.Sqrt(2 / length) * Math.Sin(n * Math.PI * x[i] / length), values[i], 1e-6);
            }
            Assert.Equal(0, spectrum.GetWavefunction(n - 1).LeadProbability);
        }
    }
}
