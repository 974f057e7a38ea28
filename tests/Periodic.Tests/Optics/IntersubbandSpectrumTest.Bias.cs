// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Tests.TestHelpers;
using Periodic.Units;

namespace Periodic.Tests.Optics;

/// <summary>Transitions under bias, and between two quasi-bound levels.</summary>
public partial class IntersubbandSpectrumTest
{
    private static IntersubbandSpectrum Biased(LayerStack stack, double bias, IntersubbandOptions? options = null) =>
        IntersubbandSpectrum.ComputeUnderBias(stack, Energy.FromElectronVolts(bias), options);

    [Fact]
    public void Compute_DeepWellUnderField_StarkShiftMatchesSecondOrderPerturbationTheory()
    {
        // Quantum-confined Stark shift of an infinite well of width L in a field F (perturbation −eF(z − L/2)): second-order
        // perturbation theory (D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., §6.1.3) gives
        // E_n⁽²⁾ = Σ_k |⟨k|eFz|n⟩|²/(E_n − E_k). The sum is done here with the sine states' dipoles by MathNet quadrature, and
        // checked against its closed form E_n⁽²⁾ = (e²F²mL⁴/ħ²)(n²π² − 15)/(24n⁴π⁴) (G. Bastard et al., Phys. Rev. B 28, 3241
        // (1983) — from memory). The first-order shift −eF·(centre) is the same for both levels and drops out of E_21.
        const double width = 10, mass = 0.067, v0 = 1e5, barrier = 2, field = 1e-3; // field in eV/nm (10 kV/cm)
        double Level(int n) => C * n * n * Math.PI * Math.PI / (mass * width * width);
        double Z(int k, int n) => GaussLegendreRule.Integrate(
            x => 2 / width * Math.Sin(k * Math.PI * x / width) * Math.Sin(n * Math.PI * x / width) * (x - width / 2), 0, width, 256);
        double SecondOrder(int n)
        {
            double sum = 0;
            for (var k = 1; k <= 200; k++)
            {
                if (k != n)
                {
                    var z = Z(k, n);
                    sum += field * field * z * z / (Level(n) - Level(k));
                }
            }
            return sum;
        }
        var scale = field * field * Math.Pow(width, 4) * mass / (2 * C); // e²F²mL⁴/ħ², eV
        for (var n = 1; n <= 2; n++)
        {
            // The truncated sum (k ≤ 200) misses terms falling like k⁻⁶: 1e-6 relative is ample.
            Assert.Equal((n * n * Math.PI * Math.PI - 15) / (24 * Math.Pow(n * Math.PI, 4)) * scale, SecondOrder(n), 1e-6 * Math.Abs(SecondOrder(n)));
        }
        var expectedShift = SecondOrder(2) - SecondOrder(1);

        var stack = LayerStack.Create(Lead(v0, mass), Lead(v0, mass), L(barrier, v0, mass), L(width, 0, mass), L(barrier, v0, mass));
        var options = IntersubbandOptions.Create(boundStates: BoundStateOptions.Create(maxLevels: 2));
        var flat = IntersubbandSpectrum.Compute(stack, options);
        var biased = Biased(stack, field * stack.Thickness.Nanometres, options);
        var shift = biased.Transition(1, 2).EnergyElectronVolts - flat.Transition(1, 2).EnergyElectronVolts;
        // Two model differences bound the agreement: walls of 1e5 eV let ψ leak by 1/κ ≈ 0.0024 nm per side, widening the
        // well by 2/(κL) ≈ 5e-4 relative, and the shift scales as L⁴ (≈ 2e-3); fourth order adds about (eFL/E_21)² ≈ 4e-3.
        // 1 % covers both.
        Assert.True(expectedShift > 0);
        Assert.Equal(1, shift / expectedShift, 0.01);
    }

    [Fact]
    public void ComputeUnderBias_LevelAboveLowerLeadEdge_IsQuasiBoundWithWidth()
    {
        // A 10 nm well between 15 nm barriers 0.4 eV high (leads of the barrier): three bound levels when flat (the finite well,
        // Griffiths §2.6: z0 = (L/2)√(2mV0)/ħ ≈ 4.2 > π). Under eU = 0.25 eV the right lead's edge drops to 0.15 eV while the third
        // level moves down by about eU/2 (first-order Stark shift of a level in the middle [derived]) to ≈ 0.18 eV: between the
        // two edges, it leaks into the right lead only. It is computed only with quasi-bound states requested, with a width
        // between zero and the level spacing, and levels 1 and 2 stay bound below 0.15 eV.
        const double mass = 0.067, bias = 0.25;
        var stack = LayerStack.Create(Lead(0.4, mass), Lead(0.4, mass), L(15, 0.4, mass), L(10, 0, mass), L(15, 0.4, mass));
        Assert.Equal(3, IntersubbandSpectrum.Compute(stack).BoundCount);
        var bound = Biased(stack, bias);
        Assert.Equal(2, bound.Levels.Count);
        var open = Biased(stack, bias, IntersubbandOptions.Create(includeQuasiBound: true, quasiBoundUpperElectronVolts: 0.4));
        Assert.Equal(2, open.BoundCount);
        var level = open.Levels[2];
        Assert.True(level.IsQuasiBound);
        Assert.InRange(level.EnergyElectronVolts, 0.4 - bias, 0.4);
        Assert.InRange(level.WidthElectronVolts, 1e-9, 0.01);
        var t = open.Transition(2, 3);
        Assert.Equal(level.EnergyElectronVolts - open.Levels[1].EnergyElectronVolts, t.EnergyElectronVolts, 1e-15);
        Assert.True(double.IsFinite(t.DomainChangeFraction));
    }

    [Fact]
    public void Compute_BiasToZero_IsContinuous()
    {
        // A symmetric stack: by the Hellmann–Feynman theorem a level moves as dE/dU = ⟨∂V/∂U⟩ = −1/2 at U = 0 (V = −U·x/L in the
        // stack and −U in the right lead; the symmetric state's mean of min(max(x, 0), L)/L is 1/2 by symmetry) [derived]; the
        // dipoles move at most linearly in U.
        const double mass = 0.067;
        var stack = LayerStack.Create(Lead(0.3, mass), Lead(0.3, mass), L(10, 0.3, mass), L(8, 0, mass), L(10, 0.3, mass));
        var flat = IntersubbandSpectrum.Compute(stack);
        foreach (var bias in new[] { 1e-6, -1e-6 })
        {
            var biased = Biased(stack, bias);
            Assert.Equal(flat.BoundCount, biased.BoundCount);
            for (var i = 0; i < flat.BoundCount; i++)
            {
                // The second-order (Stark) term is ≈ (eFL)²/E ≈ (1e-6)²/0.05: 1e-10 covers it and the 1e-12 eV energy tolerance.
                Assert.Equal(flat.Levels[i].EnergyElectronVolts - bias / 2, biased.Levels[i].EnergyElectronVolts, 1e-10);
            }
            var z0 = Math.Abs(flat.Transition(1, 2).DipoleNanometres);
            var z = Math.Abs(biased.Transition(1, 2).DipoleNanometres);
            // dz/dU ~ z·L/(E_21·…) ≈ nm/eV scale: 1e-6 eV moves z by ≲ 1e-5 nm.
            Assert.Equal(z0, z, 1e-5);
            Assert.Equal(bias, biased.Bias.ElectronVolts);
        }
    }

    /// <summary>
    /// A 10 nm well (one mass) between 8 nm barriers 0.5 eV high and leads at 0.06 eV: level 1 is bound, levels 2 and 3 of the
    /// well lie above the leads and are narrow resonances; with leads at the barrier height they are the bound states of the
    /// finite square well (Griffiths §2.6, <see cref="FiniteWellReference"/>).
    /// </summary>
    private static LayerStack LeakyWell(double lead) =>
        LayerStack.Create(Lead(lead, 0.067), Lead(lead, 0.067), L(8, 0.5, 0.067), L(10, 0, 0.067), L(8, 0.5, 0.067));

    [Fact]
    public void Compute_TwoQuasiBoundLevels_DipoleMatchesTheClosedWell()
    {
        var spectrum = IntersubbandSpectrum.Compute(LeakyWell(0.06), IntersubbandOptions.Create(includeQuasiBound: true, quasiBoundUpperElectronVolts: 0.45));
        Assert.Equal(1, spectrum.BoundCount);
        var reference = FiniteWellReference.Solve(10, 0.5, 0.067);
        var quasi = spectrum.Levels.Where(l => l.IsQuasiBound).ToList();
        Assert.True(quasi.Count >= 2, $"{quasi.Count} quasi-bound levels");
        // Tunnelling through 8 nm of barrier shifts the states by about e^{−2κb} (κ ≈ 0.6/nm at E_3: 6e-5): 1e-3 relative.
        Assert.Equal(1, quasi[0].EnergyElectronVolts / reference[1].Energy, 1e-3);
        Assert.Equal(1, quasi[1].EnergyElectronVolts / reference[2].Energy, 1e-3);
        Assert.True(quasi[0].WidthElectronVolts > 0 && quasi[0].WidthElectronVolts < 1e-3);
        var t = spectrum.Transition(quasi[0].Number, quasi[1].Number);
        Assert.True(t.IsResolved, t.Status);
        Assert.Equal(1, Math.Abs(t.DipoleNanometres) / FiniteWellReference.Dipole(reference[1], reference[2], 10), 1e-3);
        // The domain check: the states carry ≲ e^{−2κb} of their weight in a margin, so doubling it moves |z| little.
        Assert.True(t.DomainChangeFraction < 1e-3, $"{t.DomainChangeFraction}");
        // Bound to quasi-bound: z_12 of the closed well, likewise.
        var t12 = spectrum.Transition(1, quasi[0].Number);
        Assert.Equal(1, Math.Abs(t12.DipoleNanometres) / FiniteWellReference.Dipole(reference[0], reference[1], 10), 1e-3);
    }

    [Fact]
    public void Compute_QuasiBoundUnderBias_ContinuousAtZeroBias()
    {
        // Under a small bias the resonances of the biased stack (exact Airy layers) and their dipoles on the finite domain move
        // continuously: 1e-5 eV of bias moves them by ≲ 1e-5 (first order, as for the bound levels above).
        var options = IntersubbandOptions.Create(includeQuasiBound: true, quasiBoundUpperElectronVolts: 0.45);
        var flat = IntersubbandSpectrum.Compute(LeakyWell(0.06), options);
        var biased = Biased(LeakyWell(0.06), 1e-5, options);
        Assert.Equal(flat.Levels.Count, biased.Levels.Count);
        for (var i = 0; i < flat.Levels.Count; i++)
        {
            Assert.Equal(flat.Levels[i].IsQuasiBound, biased.Levels[i].IsQuasiBound);
            Assert.Equal(flat.Levels[i].EnergyElectronVolts, biased.Levels[i].EnergyElectronVolts, 1e-5);
        }
        foreach (var t in flat.Transitions.Where(t => t.IsResolved))
        {
            var b = biased.Transition(t.From, t.To);
            Assert.True(b.IsResolved, b.Status);
            Assert.Equal(Math.Abs(t.DipoleNanometres), Math.Abs(b.DipoleNanometres), 1e-4 * Math.Max(1, Math.Abs(t.DipoleNanometres)));
        }
    }
}
