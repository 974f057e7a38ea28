// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Optics;

/// <summary>Optics of a stack that holds smooth segments (e.g. a self-consistent potential).</summary>
public partial class IntersubbandSpectrumTest
{
    /// <summary>A uniform layer written as a sampled segment: constant samples every 0.1 nm.</summary>
    private static SampledSegment Flat(double width, double potential, double mass)
    {
        var count = (int)Math.Round(width / 0.1) + 1;
        return SampledSegment.Create(Enumerable.Range(0, count).Select(i => width * i / (count - 1)).ToArray(),
            Enumerable.Repeat(potential, count).ToArray(), EffectiveMass.FromElectronMasses(mass));
    }

    [Fact]
    public void Compute_FlatSegmentsOfUniformLayers_SameTransitionsAsLayers()
    {
        // An asymmetric double well written with uniform layers (the kernel's Wronskian closed forms) and with constant sampled
        // segments (the Magnus steps, whose states are exact at the step boundaries for a constant potential, integrated by the
        // 8-point rule on each step's cubic Hermite interpolant). Two independent integrations of the same functions: energies to
        // 1e-10 eV (root tolerance), dipoles, oscillator strengths (length and momentum forms) and the depolarisation length to
        // 1e-6 relative, the Hermite interpolant's O(h⁴) error at h = 0.1 nm, (kh)⁴/384 ≈ 1e-7 for k ≲ 3/nm, with a margin.
        var lead = Lead(0.3, 0.09);
        var layers = LayerStack.Create(lead, lead, L(6, 0, 0.067), L(2.5, 0.3, 0.09), L(4, 0, 0.067));
        var segments = LayerStack.Create(lead, lead, Flat(6, 0, 0.067), Flat(2.5, 0.3, 0.09), Flat(4, 0, 0.067));
        var exact = IntersubbandSpectrum.Compute(layers);
        var sampled = IntersubbandSpectrum.Compute(segments);
        Assert.Equal(exact.Transitions.Count, sampled.Transitions.Count);
        Assert.True(exact.Transitions.Count >= 1);
        Assert.Equal(exact.ReferenceMassElectronMasses, sampled.ReferenceMassElectronMasses, 1e-15);
        Assert.True(sampled.NormalisationError < 1e-6, $"normalisation error {sampled.NormalisationError}");
        for (var t = 0; t < exact.Transitions.Count; t++)
        {
            var a = exact.Transitions[t];
            var b = sampled.Transitions[t];
            Assert.Equal(a.EnergyElectronVolts, b.EnergyElectronVolts, 1e-10);
            Assert.Equal(Math.Abs(a.DipoleNanometres), Math.Abs(b.DipoleNanometres), 1e-6 * Math.Abs(a.DipoleNanometres));
            Assert.Equal(a.OscillatorStrength, b.OscillatorStrength, 1e-6 * a.OscillatorStrength + 1e-12);
            Assert.Equal(a.MomentumOscillatorStrength, b.MomentumOscillatorStrength, 1e-6 * a.MomentumOscillatorStrength + 1e-12);
        }
        for (var k = 0; k < exact.Levels.Count; k++)
        {
            Assert.Equal(exact.Levels[k].MeanMassElectronMasses, sampled.Levels[k].MeanMassElectronMasses, 1e-6 * exact.Levels[k].MeanMassElectronMasses);
        }
        var s0 = AbsorptionSpectrum.DepolarisationLength(exact, 0, 1);
        var s1 = AbsorptionSpectrum.DepolarisationLength(sampled, 0, 1);
        Assert.Equal(s0, s1, 1e-6 * Math.Abs(s0));
    }

    [Fact]
    public void Compute_SegmentsWithQuasiBound_IsRefusedNamingOptions()
    {
        var lead = Lead(0.3, 0.067);
        var segments = LayerStack.Create(lead, lead, Flat(6, 0, 0.067));
        var error = Assert.Throws<ArgumentException>(() => IntersubbandSpectrum.Compute(segments, IntersubbandOptions.Create(includeQuasiBound: true)));
        Assert.Equal("options", error.ParamName);
    }
}
