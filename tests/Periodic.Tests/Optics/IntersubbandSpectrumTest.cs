// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Tests.TestHelpers;
using Periodic.Units;

namespace Periodic.Tests.Optics;

public partial class IntersubbandSpectrumTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    internal static Layer L(double width, double potential, double mass) =>
        Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    internal static Lead Lead(double potential, double mass) => Periodic.Stacks.Lead.Create(Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    /// <summary>A single well of width L (V = 0) between leads of height v0, one mass.</summary>
    internal static LayerStack Well(double width, double v0, double mass) =>
        LayerStack.Create(Lead(v0, mass), Lead(v0, mass), L(width, 0, mass));

    [Fact]
    public void Compute_InfiniteWellLimit_ApproachesSineWellDipoleAndStrength()
    {
        // Infinite well of width L with ψ_n = √(2/L) sin(nπx/L): z_12 = 16L/(9π²) and f_12 = 256/(27π²)
        // (/work/shared/REFERENCES.md, "Optical transitions"; any QW optics text, e.g. G. Bastard, Wave Mechanics
        // Applied to Semiconductor Heterostructures, 1988 — from memory). Derived here from the sine functions by
        // MathNet's Gauss–Legendre quadrature rather than trusted as printed.
        const double width = 10;
        double Psi(int n, double x) => Math.Sqrt(2 / width) * Math.Sin(n * Math.PI * x / width);
        var z12 = GaussLegendreRule.Integrate(x => (x - width / 2) * Psi(1, x) * Psi(2, x), 0, width, 64);
        Assert.Equal(16 * width / (9 * Math.PI * Math.PI), Math.Abs(z12), 1e-12);
        const double mass = 0.067;
        var e1 = C * Math.PI * Math.PI / (mass * width * width);
        var f12 = mass * (4 * e1 - e1) * z12 * z12 / C;
        Assert.Equal(256 / (27 * Math.PI * Math.PI), f12, 1e-12);

        foreach (var v0 in new[] { 1e4, 1e6 })
        {
            // Only the two lowest of the thousands of levels are needed.
            var spectrum = IntersubbandSpectrum.Compute(Well(width, v0, mass), IntersubbandOptions.Create(boundStates: BoundStateOptions.Create(maxLevels: 2)));
            var t = spectrum.Transition(1, 2);
            // A finite wall lets ψ leak by 1/κ on each side: the leading correction is of relative order 2/(κL),
            // so allow 3/(κL) (κL ≈ 133 at 10⁴ eV, 1330 at 10⁶ eV).
            var kappa = Math.Sqrt(mass * v0 / C);
            var tolerance = 3 / (kappa * width);
            Assert.Equal(1, Math.Abs(t.DipoleNanometres) / Math.Abs(z12), tolerance);
            Assert.Equal(1, t.OscillatorStrength / f12, tolerance);
        }
    }

    [Fact]
    public void Compute_SymmetricWell_ParityForbidsOneToThree()
    {
        // Parity selection rule: in a symmetric well ψ_1 and ψ_3 are both even, so ⟨1|z|3⟩ = 0
        // (/work/shared/REFERENCES.md, "Optical transitions"; common practice, no single source).
        var spectrum = IntersubbandSpectrum.Compute(Well(12, 0.5, 0.067));
        Assert.True(spectrum.BoundCount >= 3);
        var z12 = Math.Abs(spectrum.Transition(1, 2).DipoleNanometres);
        var z13 = Math.Abs(spectrum.Transition(1, 3).DipoleNanometres);
        // Rounding only: the sum ∫|z ψ1 ψ3| ≈ L/2 carries ≈ 1e-16 per term over ~10³ nodes.
        Assert.True(z13 < 1e-12 * 12, $"z13 = {z13}");
        Assert.True(z12 > 1);
    }

    [Fact]
    public void Compute_FiniteWell_MatchesTranscendentalSolution()
    {
        // Griffiths §2.6 finite square well (one mass): energies from the transcendental equations and dipoles from the
        // closed-form integrals of the analytic eigenfunctions (TestHelpers/FiniteWellReference).
        foreach (var (width, depth, mass) in new[] { (10.0, 0.3, 0.067), (6.0, 1.0, 0.041), (1.0, 2.0, 1.0) })
        {
            var reference = FiniteWellReference.Solve(width, depth, mass);
            var spectrum = IntersubbandSpectrum.Compute(Well(width, depth, mass));
            Assert.Equal(reference.Length, spectrum.BoundCount);
            for (var i = 0; i < reference.Length; i++)
            {
                // Energies to 1e-9 relative: the library's default tolerance is 1e-12 eV absolute.
                Assert.Equal(1, spectrum.Levels[i].EnergyElectronVolts / reference[i].Energy, 1e-9);
            }
            for (var i = 0; i < reference.Length; i++)
            {
                for (var f = i + 1; f < reference.Length; f++)
                {
                    var expected = FiniteWellReference.Dipole(reference[i], reference[f], width);
                    var t = spectrum.Transition(i + 1, f + 1);
                    if (expected == 0)
                    {
                        Assert.True(Math.Abs(t.DipoleNanometres) < 1e-12 * width);
                        continue;
                    }
                    // Dipoles and oscillator strengths to 1e-8 relative (the acceptance bound); what limits them is the
                    // energy tolerance (1e-12 eV) acting through dψ/dE, ≈ 1e-11 relative.
                    Assert.Equal(1, Math.Abs(t.DipoleNanometres) / expected, 1e-8);
                    var f0 = mass * (reference[f].Energy - reference[i].Energy) * expected * expected / C;
                    Assert.Equal(1, t.OscillatorStrength / f0, 1e-8);
                    // One mass everywhere: the momentum form equals the length form.
                    Assert.Equal(1, t.MomentumOscillatorStrength / f0, 1e-8);
                }
            }
        }
    }

    [Fact]
    public void SumRule_UniformMassWellInLargeBox_SumsToOne()
    {
        // Thomas–Reiche–Kuhn sum rule Σ_f f_if = 1 for one mass (/work/shared/REFERENCES.md, "Optical transitions";
        // e.g. J. J. Sakurai, Modern Quantum Mechanics). An 8 nm well between 10 nm barriers inside a box whose walls
        // are 200 eV high: every state below 200 eV is a bound state of the stack, so bound and "continuum" (box)
        // states are all summed.
        const double mass = 0.067;
        var box = LayerStack.Create(Lead(200, mass), Lead(200, mass), L(10, 0.3, mass), L(8, 0, mass), L(10, 0.3, mass));
        var spectrum = IntersubbandSpectrum.Compute(box);
        Assert.True(spectrum.BoundCount > 150);
        var check = spectrum.SumRule(1);
        Assert.Equal(1, check.ExpectedStrength, 1e-14);
        // The tail above the walls falls like Σ_{n>N} n⁻⁴ ∝ 1/(3N³) (ψ_1 smooth, one mass) for N ≈ 170: ≈ 1e-7, inside 1e-6.
        Assert.Equal(1, check.BoundStrength, 1e-6);
        Assert.True(check.MissingStrength > 0);
        // And from an excited state (downward terms negative).
        Assert.Equal(1, spectrum.SumRule(2).BoundStrength, 1e-6);
    }

    [Fact]
    public void SumRule_PositionDependentMassInBox_ConvergesToMassAverage()
    {
        // With a position-dependent mass the length-form sum is m*⟨1/m(z)⟩, not 1 (double commutator
        // [z, [H, z]] = ħ²/m(z); C. Sirtori et al., Phys. Rev. B 50, 8663 (1994) — from memory; derived in SumRuleCheck).
        // ψ_1′ jumps at the mass steps, so z_1n ∝ 1/n² and f_1n ∝ 1/n²: the missing tail falls like c/N. Two boxes (walls
        // at 50 and 200 eV, N ≈ 94 and 188) give c and the limit S∞ = S(N₂) + c/N₂, which must be the predicted total.
        double[] sums = new double[2], counts = new double[2];
        var expected = 0.0;
        for (var k = 0; k < 2; k++)
        {
            var wall = k == 0 ? 50.0 : 200.0;
            var box = LayerStack.Create(Lead(wall, 0.092), Lead(wall, 0.092), L(10, 0.3, 0.092), L(8, 0, 0.067), L(10, 0.3, 0.092));
            var spectrum = IntersubbandSpectrum.Compute(box);
            var check = spectrum.SumRule(1);
            sums[k] = check.BoundStrength;
            counts[k] = spectrum.BoundCount;
            expected = check.ExpectedStrength;
            if (k == 1)
            {
                // The momentum form differs from the length form when the mass varies.
                var t = spectrum.Transition(1, 2);
                Assert.NotEqual(t.OscillatorStrength, t.MomentumOscillatorStrength, 1e-3);
            }
        }
        Assert.True(expected < 1 && expected > 0.067 / 0.092);
        var c = (sums[1] - sums[0]) / (1 / counts[0] - 1 / counts[1]);
        var limit = sums[1] + c / counts[1];
        // The next term of the tail, O(1/N²), is a few per cent of the missing 1e-4 at N = 188: 1e-5.
        Assert.Equal(expected, limit, 1e-5);
        // Without the extrapolation the sum falls short by the tail, about 1e-4, and converges: both sums are below the total.
        Assert.True(sums[0] < sums[1] && sums[1] < expected);
    }

    [Fact]
    public void Compute_PositionDependentMassWell_FiniteDifferenceConvergesToDipoles()
    {
        // Independent calculation: the three-point finite-volume discretisation (TestHelpers/TridiagonalWell), second order
        // in h, in a 190 nm box (the third state, 0.03 eV below the barrier top, decays by e^{-κ·90 nm} ≈ 1e-11 before the walls).
        const double well = 10, barrier = 90, v0 = 0.3;
        var stack = LayerStack.Create(Lead(v0, 0.09), Lead(v0, 0.09), L(well, 0, 0.067));
        var spectrum = IntersubbandSpectrum.Compute(stack);
        var layers = new[] { (barrier, v0, 0.09), (well, 0.0, 0.067), (barrier, v0, 0.09) };
        var origin = barrier + well / 2;
        var exact = new[] { spectrum.Transition(1, 2).DipoleNanometres, spectrum.Transition(2, 3).DipoleNanometres };
        var errors = new List<double[]>();
        var values = new List<double[]>();
        foreach (var h in new[] { 0.02, 0.01 })
        {
            var fd = new TridiagonalWell(layers, h);
            var vectors = new double[3][];
            for (var n = 0; n < 3; n++)
            {
                vectors[n] = fd.Eigenvector(fd.Eigenvalue(n, 0, v0));
            }
            var z = new[] { Math.Abs(fd.Dipole(vectors[0], vectors[1], origin)), Math.Abs(fd.Dipole(vectors[1], vectors[2], origin)) };
            values.Add(z);
            errors.Add([Math.Abs(z[0] - Math.Abs(exact[0])), Math.Abs(z[1] - Math.Abs(exact[1]))]);
        }
        for (var t = 0; t < 2; t++)
        {
            // Second order: halving h divides the error by about 4 (between 3 and 5).
            var ratio = errors[0][t] / errors[1][t];
            Assert.InRange(ratio, 3, 5);
            // Richardson extrapolation (4 z(h/2) − z(h))/3 removes the h² term; the h⁴ term left is of order
            // (z(h) − z(h/2))²/z ≈ 1e-10 relative here, so 1e-8 is a bound with margin.
            var extrapolated = (4 * values[1][t] - values[0][t]) / 3;
            Assert.Equal(1, extrapolated / Math.Abs(exact[t]), 1e-8);
        }
    }

    [Fact]
    public void Compute_CoupledWells_AnticrossingFollowsTwoLevelFormula()
    {
        // Two wells coupled through a thin barrier, the right one detuned by raising its potential by δ. Two-level model
        // (any quantum-mechanics text; common practice, no single source): splitting Δ = √(ε² + (2t)²), ε the detuning of the
        // isolated levels, and the dipole between the two mixed states z_12 = (d/2)·2t/Δ, d the distance of the well centres.
        const double mass = 0.067, well = 6, barrier = 4, v0 = 0.3;
        LayerStack Pair(double delta) => LayerStack.Create(Lead(v0, mass), Lead(v0, mass), L(well, 0, mass), L(barrier, v0, mass), L(well, delta, mass));
        double Isolated(double delta) => IntersubbandSpectrum.Compute(LayerStack.Create(Lead(v0, mass), Lead(v0, mass), L(well, delta, mass))).Levels[0].EnergyElectronVolts;
        var atResonance = IntersubbandSpectrum.Compute(Pair(0));
        var split0 = atResonance.Transition(1, 2).EnergyElectronVolts;
        var d = well + barrier;
        // At resonance the two states are the symmetric and antisymmetric mixtures: |z_12| = d/2 up to the overlap of the
        // localised states (≈ e^{-κb} ≈ 0.05 here), so 5 %.
        Assert.Equal(d / 2, Math.Abs(atResonance.Transition(1, 2).DipoleNanometres), 0.05 * d / 2);
        foreach (var delta in new[] { 0.002, 0.005, 0.01 })
        {
            var spectrum = IntersubbandSpectrum.Compute(Pair(delta));
            var epsilon = Isolated(delta) - Isolated(0);
            var split = spectrum.Transition(1, 2).EnergyElectronVolts;
            // The two-level formula neglects the other levels (≥ 0.1 eV away; corrections of order t²/0.1 eV ≈ 1e-3 of Δ)
            // and the detuning dependence of t: 2 % on Δ.
            Assert.Equal(Math.Sqrt(epsilon * epsilon + split0 * split0), split, 0.02 * split);
            var z = Math.Abs(spectrum.Transition(1, 2).DipoleNanometres);
            Assert.Equal(Math.Abs(atResonance.Transition(1, 2).DipoleNanometres) * split0 / split, z, 0.03 * z);
        }
    }

    [Fact]
    public void Compute_NoBoundState_ThrowsNamingStack()
    {
        // A barrier above its leads binds nothing.
        var stack = LayerStack.Create(Lead(0, 0.067), Lead(0, 0.067), L(5, 0.3, 0.067));
        var e = Assert.Throws<ArgumentException>(() => IntersubbandSpectrum.Compute(stack));
        Assert.Equal("stack", e.ParamName);
        Assert.Contains("no bound state", e.Message);
    }

    [Fact]
    public void Compute_BadOptions_NameTheOption()
    {
        // Checked where the options are made (house style): the exception names the parameter.
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => IntersubbandOptions.Create(referenceMassElectronMasses: -1));
        Assert.Equal("referenceMassElectronMasses", e.ParamName);
        e = Assert.Throws<ArgumentOutOfRangeException>(() => IntersubbandOptions.Create(domainMarginNanometres: 0));
        Assert.Equal("domainMarginNanometres", e.ParamName);
    }

    [Fact]
    public void Compute_SingleWellWithQuasiBoundState_ReportsDomainConvergence()
    {
        // A well between two thin barriers and low leads: its second state lies above the leads and leaks out through the
        // barriers (a double-barrier resonance). Its dipole to the ground state, normalised on the stack plus a margin,
        // must hardly change when the margin doubles; a T = 1 peak of a symmetric double barrier (REFERENCES.md) marks it.
        const double mass = 0.067;
        var stack = LayerStack.Create(Lead(0.1, mass), Lead(0.1, mass), L(5, 0.5, mass), L(8, 0, mass), L(5, 0.5, mass));
        var spectrum = IntersubbandSpectrum.Compute(stack, IntersubbandOptions.Create(includeQuasiBound: true, quasiBoundUpperElectronVolts: 0.3));
        Assert.Equal(1, spectrum.BoundCount);
        var quasi = spectrum.Levels.Where(l => l.IsQuasiBound).ToArray();
        Assert.NotEmpty(quasi);
        var t = spectrum.Transition(1, quasi[0].Number);
        Assert.True(t.IsResolved, t.Status);
        Assert.True(t.DomainChangeFraction < 0.01);
        // The quasi-bound state is odd like the second state of a well: its dipole is of the size of the infinite-well
        // value 16L/(9π²) ≈ 1.44 nm for L = 8 nm (within a factor 1.5: the barriers are finite).
        Assert.InRange(Math.Abs(t.DipoleNanometres), 1.44 / 1.5, 1.44 * 1.5);
        Assert.True(quasi[0].WidthElectronVolts > 0);
    }
}
