// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Design;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Design;

public sealed class StackSensitivitiesTest
{
    private const double C = ClosedForms.C;

    // Tight searches for the finite-difference references: level and peak energies far below the difference steps' effect.
    private static readonly BoundStateOptions TightLevels = BoundStateOptions.Create(absoluteToleranceElectronVolts: 1e-15);
    private static readonly ResonanceSearchOptions TightPeaks = ResonanceSearchOptions.Create(absoluteToleranceElectronVolts: 1e-15);

    private static Layer L(double width, double potential, double mass) =>
        Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    private static Lead LeadOf(double potential, double mass) => Lead.Create(Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    /// <summary>An asymmetric double well between barrier leads, unequal masses, so that no derivative vanishes by symmetry.</summary>
    private static (double W, double V, double M)[] DoubleWell => [(5.0, 0.0, 0.067), (2.0, 0.25, 0.09), (4.0, 0.02, 0.07)];

    private static LayerStack WellStack((double W, double V, double M)[] layers, out Layer[] built)
    {
        built = layers.Select(l => L(l.W, l.V, l.M)).ToArray();
        return LayerStack.Create(LeadOf(0.36, 0.085), built.Select(l => StackPart.Single(l)), LeadOf(0.34, 0.085));
    }

    private static (double W, double V, double M)[] With((double W, double V, double M)[] layers, int j, LayerQuantity q, double value)
    {
        var copy = layers.ToArray();
        copy[j] = q switch
        {
            LayerQuantity.Width => copy[j] with { W = value },
            LayerQuantity.Potential => copy[j] with { V = value },
            _ => copy[j] with { M = value },
        };
        return copy;
    }

    private static double Get((double W, double V, double M) layer, LayerQuantity q) =>
        q switch { LayerQuantity.Width => layer.W, LayerQuantity.Potential => layer.V, _ => layer.M };

    /// <summary>
    /// Central differences with one Richardson step (Richardson 1911; Press et al., Numerical Recipes, 3rd ed., §5.7 —
    /// docs/references.md): (4·D(h/2) − D(h))/3 cancels the h² error of the central difference D(h).
    /// </summary>
    private static double Richardson(Func<double, double> f, double p, double h)
    {
        double Central(double step) => (f(p + step) - f(p - step)) / (2 * step);
        return (4 * Central(h / 2) - Central(h)) / 3;
    }

    // Steps: 1e-3 of a width or mass, 2e-4 eV of a potential. The Richardson remainder is O(h⁴): ~1e-12 relative for
    // these level curves, whose scale of variation is the binding energy (≥ 10 meV here); energies found to ~1e-15 eV leave
    // rounding of ~1e-12 eV/unit in the differences.
    private static double Step(LayerQuantity q, double value) => q == LayerQuantity.Potential ? 2e-4 : 1e-3 * value;

    public static TheoryData<int, LayerQuantity> LayerCases()
    {
        var data = new TheoryData<int, LayerQuantity>();
        foreach (var j in new[] { 0, 1, 2 })
        {
            foreach (var q in Enum.GetValues<LayerQuantity>())
            {
                data.Add(j, q);
            }
        }
        return data;
    }

    [Theory]
    [MemberData(nameof(LayerCases))]
    public void OfLevel_MatchesRichardsonExtrapolatedDifferences(int j, LayerQuantity q)
    {
        var layers = DoubleWell;
        var spectrum = BoundStateSpectrum.Find(WellStack(layers, out var built), TightLevels);
        Assert.True(spectrum.Levels.Count >= 3);
        for (var n = 0; n < spectrum.Levels.Count; n++)
        {
            // Every level here is bound by ≥ 10 meV (asserted), the scale on which the steps below are small.
            Assert.True(spectrum.ContinuumEdgeElectronVolts - spectrum.Levels[n].EnergyElectronVolts >= 0.01, spectrum.ToString());
            double Level(double value) => BoundStateSpectrum.Find(WellStack(With(layers, j, q, value), out _), TightLevels).Levels[n].EnergyElectronVolts;
            var p = Get(layers[j], q);
            var numeric = Richardson(Level, p, Step(q, p));
            var exact = StackSensitivities.OfLevel(spectrum, n, built[j], q)!.Value;
            // The acceptance bound of the design-loop checks: 1e-7 relative (1e-9 eV per unit where a derivative is tiny).
            Assert.True(Math.Abs(exact - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9,
                $"level {n}, layer {j}, {q}: exact {exact:R}, differences {numeric:R}");
        }
    }

    [Fact]
    public void OfLevel_PotentialDerivativeIsTheProbabilityInTheLayer()
    {
        // Hellmann–Feynman theorem (Hellmann 1937; Feynman, Phys. Rev. 56, 340 (1939) — docs/references.md): with one mass
        // everywhere H = −C d²/dx²/m + V(x), ∂H/∂V_j is the indicator of layer j, so dE/dV_j = ∫_j ψ² for the normalised ψ.
        (double W, double V, double M)[] layers = [(5.0, 0.0, 0.067), (2.0, 0.25, 0.067), (4.0, 0.02, 0.067)];
        var built = layers.Select(l => L(l.W, l.V, l.M)).ToArray();
        var stack = LayerStack.Create(LeadOf(0.3, 0.067), built.Select(l => StackPart.Single(l)), LeadOf(0.3, 0.067));
        var spectrum = BoundStateSpectrum.Find(stack);
        for (var n = 0; n < spectrum.Levels.Count; n++)
        {
            var psi = spectrum.GetWavefunction(n);
            var x = 0.0;
            for (var j = 0; j < layers.Length; j++)
            {
                // 64-point Gauss–Legendre (MathNet.Numerics) integrates ψ² of these few half-waves to rounding.
                var rule = new GaussLegendreRule(x, x + layers[j].W, 64);
                var probability = Enumerable.Range(0, rule.Order).Sum(i => rule.Weights[i] * psi.ValueAt(rule.Abscissas[i]) * psi.ValueAt(rule.Abscissas[i]));
                x += layers[j].W;
                var exact = StackSensitivities.OfLevel(spectrum, n, built[j], LayerQuantity.Potential)!.Value;
                // ψ is normalised by the library to ~1e-12; the integral is exact to rounding.
                Assert.True(Math.Abs(exact - probability) <= 1e-9, $"level {n}, layer {j}: dE/dV {exact:R}, ∫ψ² {probability:R}");
            }
        }
    }

    [Fact]
    public void OfLevel_MatchesGriffithsFiniteWellDifferentiated()
    {
        // A square well of width L = 2a and depth V0 in one mass: Griffiths §2.6 (docs/references.md), even states
        // G = z sin z − √(z0² − z²) cos z = 0, odd G = z cos z + √(z0² − z²) sin z = 0, z = ka, z0 = a√(mV0/C), ε = Cz²/(ma²)
        // above the well bottom. Differentiated implicitly [derived]: dz/dz0 = −G_z0/G_z; z0 ∝ a and z0 ∝ √V0 give dε/dL and
        // dε/dV0; the well's own potential V_w moves E = V_w + ε(V0 = V_lead − V_w) by 1 − dε/dV0.
        const double width = 6, depth = 0.3, mass = 0.067, bottom = 0.05;
        var well = L(width, bottom, mass);
        var stack = LayerStack.Create(LeadOf(bottom + depth, mass), [StackPart.Single(well)], LeadOf(bottom + depth, mass));
        var spectrum = BoundStateSpectrum.Find(stack);
        var reference = FiniteWellReference.Solve(width, depth, mass);
        Assert.Equal(reference.Length, spectrum.Levels.Count);
        var a = 0.5 * width;
        var z0 = a * Math.Sqrt(mass * depth / C);
        for (var n = 0; n < reference.Length; n++)
        {
            var z = reference[n].K * a;
            var w = Math.Sqrt(z0 * z0 - z * z);
            var (gz, gz0) = reference[n].Even
                ? (Math.Sin(z) + z * Math.Cos(z) + z / w * Math.Cos(z) + w * Math.Sin(z), -z0 / w * Math.Cos(z))
                : (Math.Cos(z) - z * Math.Sin(z) - z / w * Math.Sin(z) + w * Math.Cos(z), z0 / w * Math.Sin(z));
            var dzdz0 = -gz0 / gz;
            var dEpsilonDa = C / mass * (2 * z * dzdz0 * (z0 / a) / (a * a) - 2 * z * z / (a * a * a));
            var dEpsilonDV0 = C / mass * 2 * z * dzdz0 * (z0 / (2 * depth)) / (a * a);
            var dWidth = StackSensitivities.OfLevel(spectrum, n, well, LayerQuantity.Width)!.Value;
            var dPotential = StackSensitivities.OfLevel(spectrum, n, well, LayerQuantity.Potential)!.Value;
            // Both sides exact to rounding; the reference root is found to 1e-15 in z, so 1e-9 relative is generous.
            Assert.True(Math.Abs(dWidth - 0.5 * dEpsilonDa) <= 1e-9 * Math.Abs(dEpsilonDa), $"level {n}: dE/dL {dWidth:R}, Griffiths {0.5 * dEpsilonDa:R}");
            Assert.True(Math.Abs(dPotential - (1 - dEpsilonDV0)) <= 1e-9, $"level {n}: dE/dV {dPotential:R}, Griffiths {1 - dEpsilonDV0:R}");
        }
    }

    [Fact]
    public void OfLevel_RepeatedCellLayerChangesInEveryPeriod()
    {
        // Three periods of a well/barrier cell: the cell's barrier occurs three times, and its derivative is that of the stack
        // rebuilt from a changed cell (Richardson-extrapolated differences, 1e-7 relative as above).
        var well = L(4, 0, 0.067);
        var barrier = L(1.5, 0.25, 0.09);
        LayerStack Stack(double barrierWidth) => LayerStack.Periodic(LeadOf(0.3, 0.09), UnitCell.Create(well, L(barrierWidth, 0.25, 0.09)), 3, LeadOf(0.3, 0.09));
        var spectrum = BoundStateSpectrum.Find(LayerStack.Periodic(LeadOf(0.3, 0.09), UnitCell.Create(well, barrier), 3, LeadOf(0.3, 0.09)), TightLevels);
        for (var n = 0; n < spectrum.Levels.Count; n++)
        {
            var numeric = Richardson(b => BoundStateSpectrum.Find(Stack(b), TightLevels).Levels[n].EnergyElectronVolts, 1.5, 1.5e-2);
            var exact = StackSensitivities.OfLevel(spectrum, n, barrier, LayerQuantity.Width)!.Value;
            Assert.True(Math.Abs(exact - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9, $"level {n}: exact {exact:R}, differences {numeric:R}");
        }
    }

    private static LayerStack BarrierStack((double W, double V, double M)[] layers, out Layer[] built)
    {
        built = layers.Select(l => L(l.W, l.V, l.M)).ToArray();
        return LayerStack.Create(LeadOf(0, 0.067), built.Select(l => StackPart.Single(l)), LeadOf(0.01, 0.07));
    }

    /// <summary>An asymmetric double barrier (unequal barriers and masses) with leads at two different band edges.</summary>
    private static (double W, double V, double M)[] DoubleBarrier => [(2.0, 0.3, 0.092), (5.0, 0.0, 0.067), (2.5, 0.28, 0.09)];

    [Theory]
    [MemberData(nameof(LayerCases))]
    public void OfResonance_MatchesRichardsonExtrapolatedDifferences(int j, LayerQuantity q)
    {
        var layers = DoubleBarrier;
        var transmission = StackTransmission.Create(BarrierStack(layers, out var built));
        var peaks = transmission.FindResonances(0.011, 0.25, TightPeaks).Resonances;
        Assert.NotEmpty(peaks);
        for (var n = 0; n < peaks.Count; n++)
        {
            double Peak(double value) =>
                StackTransmission.Create(BarrierStack(With(layers, j, q, value), out _)).FindResonances(0.011, 0.25, TightPeaks).Resonances[n].EnergyElectronVolts;
            var p = Get(layers[j], q);
            var numeric = Richardson(Peak, p, Step(q, p));
            var exact = StackSensitivities.OfResonance(transmission, peaks[n], built[j], q)!.Value;
            // 1e-7 relative, the design-loop bound (1e-9 eV per unit floor).
            Assert.True(Math.Abs(exact - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9,
                $"peak {n} at {peaks[n].EnergyElectronVolts:R} eV, layer {j}, {q}: exact {exact:R}, differences {numeric:R}");
        }
    }

    [Fact]
    public void OfTransition_MatchesRichardsonExtrapolatedDifferences()
    {
        var layers = DoubleWell;
        var spectrum = IntersubbandSpectrum.Compute(WellStack(layers, out var built), IntersubbandOptions.Create(boundStates: TightLevels));
        Assert.NotEmpty(spectrum.Transitions);
        foreach (var transition in spectrum.Transitions)
        {
            for (var j = 0; j < layers.Length; j++)
            {
                double Energy(double value) => IntersubbandSpectrum.Compute(WellStack(With(layers, j, LayerQuantity.Width, value), out _),
                    IntersubbandOptions.Create(boundStates: TightLevels)).Transitions.First(t => t.From == transition.From && t.To == transition.To).EnergyElectronVolts;
                var numeric = Richardson(Energy, layers[j].W, Step(LayerQuantity.Width, layers[j].W));
                var exact = StackSensitivities.OfTransition(spectrum, transition, built[j], LayerQuantity.Width)!.Value;
                // 1e-7 relative, the design-loop bound.
                Assert.True(Math.Abs(exact - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9,
                    $"{transition.From}→{transition.To}, layer {j}: exact {exact:R}, differences {numeric:R}");
            }
        }
    }

    [Fact]
    public void OfTransition_ToAQuasiBoundLevel_MatchesRichardsonExtrapolatedDifferences()
    {
        // A well between thin barriers inside leads at 0.2 eV: bound levels below 0.2 eV, transmission peaks (quasi-bound
        // levels) between the leads' edge and the barrier tops. A bound-to-quasi-bound transition combines the level rule
        // and the resonance rule; checked against Richardson-extrapolated differences to 1e-7 relative.
        (double W, double V, double M)[] layers = [(3.0, 0.4, 0.092), (12.0, 0.0, 0.067), (3.0, 0.4, 0.092)];
        LayerStack Stack((double W, double V, double M)[] l, out Layer[] built)
        {
            built = l.Select(x => L(x.W, x.V, x.M)).ToArray();
            return LayerStack.Create(LeadOf(0.2, 0.08), built.Select(x => StackPart.Single(x)), LeadOf(0.2, 0.08));
        }
        var options = IntersubbandOptions.Create(boundStates: TightLevels, resonances: TightPeaks, includeQuasiBound: true, quasiBoundUpperElectronVolts: 0.4);
        var spectrum = IntersubbandSpectrum.Compute(Stack(layers, out var built), options);
        var toQuasiBound = spectrum.Transitions.Where(t => spectrum.Levels[t.To - 1].IsQuasiBound).ToArray();
        Assert.NotEmpty(toQuasiBound);
        foreach (var transition in toQuasiBound)
        {
            foreach (var q in Enum.GetValues<LayerQuantity>())
            {
                double Energy(double value) => IntersubbandSpectrum.Compute(Stack(With(layers, 1, q, value), out _), options)
                    .Transitions.First(t => t.From == transition.From && t.To == transition.To).EnergyElectronVolts;
                var p = Get(layers[1], q);
                var numeric = Richardson(Energy, p, Step(q, p));
                var exact = StackSensitivities.OfTransition(spectrum, transition, built[1], q)!.Value;
                Assert.True(Math.Abs(exact - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9,
                    $"{transition.From}→{transition.To} (quasi-bound), well {q}: exact {exact:R}, differences {numeric:R}");
            }
        }
    }

    [Fact]
    public void OfLevel_RejectsALayerNotInTheStack()
    {
        var spectrum = BoundStateSpectrum.Find(WellStack(DoubleWell, out _));
        var error = Assert.Throws<ArgumentException>(() => StackSensitivities.OfLevel(spectrum, 0, L(5, 0, 0.067), LayerQuantity.Width));
        Assert.Equal("layer", error.ParamName);
    }

    [Fact]
    public void OfResonance_RejectsABiasedStack()
    {
        var stack = BarrierStack(DoubleBarrier, out var built);
        var biased = StackTransmission.Create(stack, Energy.FromElectronVolts(0.05));
        var peak = StackTransmission.Create(stack).FindResonances(0.011, 0.25).Resonances[0];
        var error = Assert.Throws<ArgumentException>(() => StackSensitivities.OfResonance(biased, peak, built[1], LayerQuantity.Width));
        Assert.Equal("transmission", error.ParamName);
    }
}
