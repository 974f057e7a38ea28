// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Stacks;

public sealed partial class BoundStateSpectrumTest
{
    [Fact]
    public void FindUnderBias_TriangularWell_LevelsAtAiryZeros()
    {
        // A wall (left lead 1e5 eV) and a layer whose potential rises as F·x under a negative bias: a triangular well with levels
        // E_n = −a_n (C F²/m)^(1/3), a_n the zeros of Ai (M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions,
        // Table 10.13: a_1 = −2.33810741, a_2 = −4.08794944, a_3 = −5.52055983; from memory). Each layer is propagated by the biased
        // kernel (Airy functions or the sublayer series) and the levels found by its Sturm count.
        const double mass = 0.067, width = 200, drop = 0.4, wall = 1e5;
        var stack = LayerStack.Create(Lead.Create(Energy.FromElectronVolts(wall), EffectiveMass.FromElectronMasses(mass)),
            Lead.Create(default, EffectiveMass.FromElectronMasses(mass)),
            Layer.Create(Length.FromNanometres(width), default, EffectiveMass.FromElectronMasses(mass)));
        var spectrum = BoundStateSpectrum.FindUnderBias(stack, Energy.FromElectronVolts(-drop), BoundStateOptions.Create(maxLevels: 3));
        var field = drop / width;
        var unit = Math.Cbrt(ClosedForms.C * field * field / mass);
        double[] zeros = [-2.33810741, -4.08794944, -5.52055983];
        Assert.Equal(drop, spectrum.ContinuumEdgeElectronVolts, 1e-15);
        for (var n = 0; n < 3; n++)
        {
            // The table's 9 digits, and the wall's leak of 1/κ ≈ 0.0024 nm, which raises E_n by about F/κ ≈ 5e-6 eV: 1e-5 relative
            // of E_n ≈ 0.05 eV would be too tight, so allow 2e-4 relative.
            Assert.Equal(1, spectrum.Levels[n].EnergyElectronVolts / (-zeros[n] * unit), 2e-4);
        }
        // The wavefunction lives on the biased kernel: normalised, and vanishing where the field has lifted V far above E.
        var wave = spectrum.GetWavefunction(0);
        Assert.True(Math.Abs(wave.ValueAt(width - 1)) < 1e-6 * Math.Abs(wave.ValueAt(5)));
    }

    [Fact]
    public void FindUnderBias_ZeroBias_EqualsFind()
    {
        // A zero field is the flat stack: the same levels to the search tolerance (common practice, no single source).
        const double mass = 0.067;
        var stack = LayerStack.Create(Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(mass)),
            Lead.Create(Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(mass)),
            Layer.Create(Length.FromNanometres(8), default, EffectiveMass.FromElectronMasses(mass)));
        var flat = BoundStateSpectrum.Find(stack);
        var biased = BoundStateSpectrum.FindUnderBias(stack, Energy.FromElectronVolts(1e-12));
        Assert.Equal(flat.Levels.Count, biased.Levels.Count);
        for (var i = 0; i < flat.Levels.Count; i++)
        {
            // 1e-12 eV of bias moves a level by ≈ 5e-13 eV; the search tolerance is 1e-12 eV.
            Assert.Equal(flat.Levels[i].EnergyElectronVolts, biased.Levels[i].EnergyElectronVolts, 3e-12);
        }
    }
}
