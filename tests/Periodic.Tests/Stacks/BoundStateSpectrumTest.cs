// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

public sealed partial class BoundStateSpectrumTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private static Layer Slab(double widthNm, double potentialEv, double mass = 0.067) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(mass));

    private static LayerStack SquareWell(double width, double depth, double mass)
    {
        var lead = Lead.Create(Energy.FromElectronVolts(depth), EffectiveMass.FromElectronMasses(mass));
        return LayerStack.Create(lead, lead, Slab(width, 0, mass));
    }

    /// <summary>All roots z of Griffiths' even/odd equations for a given z0, by MathNet's Brent solver.</summary>
    private static List<double> GriffithsRoots(double z0)
    {
        // Even: z tan z = √(z0² − z²); odd: −z cot z = √(z0² − z²) (Griffiths, Introduction to Quantum
        // Mechanics, §2.6). Written as z sin z − √(z0² − z²) cos z = 0 and z cos z + √(z0² − z²) sin z = 0,
        // which have no poles; each has one root in every quarter-period branch it crosses.
        double Even(double z) => z * Math.Sin(z) - Math.Sqrt(Math.Max(0, z0 * z0 - z * z)) * Math.Cos(z);
        double Odd(double z) => z * Math.Cos(z) + Math.Sqrt(Math.Max(0, z0 * z0 - z * z)) * Math.Sin(z);
        var roots = new List<double>();
        const int grid = 200000;
        foreach (var f in new Func<double, double>[] { Even, Odd })
        {
            for (var i = 0; i < grid; i++)
            {
                double a = z0 * i / grid, b = z0 * (i + 1) / grid;
                if (a > 0 && Math.Sign(f(a)) != Math.Sign(f(b)))
                {
                    roots.Add(MathNet.Numerics.RootFinding.Brent.FindRoot(f, a, b, 1e-15, 200));
                }
            }
        }
        roots.Sort();
        return roots;
    }

    [Theory]
    [InlineData(1.2, 0)] // even level, z chosen, well depth constructed from it
    [InlineData(2.5, 1)] // odd level
    [InlineData(0.4, 0)]
    public void Find_SquareWell_MatchesExactConstruction(double z, int parity)
    {
        // Exact construction (docs/references.md, derived from Griffiths §2.6): pick z, then z0 = z/|cos z|
        // (even) or z/|sin z| (odd); with L = 2 nm, m = 0.067 the depth is V0 = C (2 z0 / L)² / m and the
        // level lies at E = C (2 z / L)² / m above the well bottom.
        const double width = 2, mass = 0.067;
        var z0 = parity == 0 ? z / Math.Abs(Math.Cos(z)) : z / Math.Abs(Math.Sin(z));
        var depth = C * Math.Pow(2 * z0 / width, 2) / mass;
        var expected = C * Math.Pow(2 * z / width, 2) / mass;
        var spectrum = BoundStateSpectrum.Find(SquareWell(width, depth, mass));
        // Griffiths: the number of bound states is the number of branches below z0, ⌈2 z0 / π⌉.
        Assert.Equal((int)Math.Ceiling(2 * z0 / Math.PI), spectrum.TotalCount);
        var level = spectrum.Levels.MinBy(l => Math.Abs(l.EnergyElectronVolts - expected));
        // Tolerance: search tolerance 1e-12 eV plus rounding of z0 and V0 (relative 1e-15 of ~1 eV).
        Assert.Equal(expected, level.EnergyElectronVolts, 2e-12);
        Assert.Equal(parity, level.Index % 2);
        // Every other level against the transcendental equations solved independently.
        var roots = GriffithsRoots(z0);
        Assert.Equal(roots.Count, spectrum.Levels.Count);
        var worst = 0.0;
        for (var i = 0; i < roots.Count; i++)
        {
            worst = Math.Max(worst, Math.Abs(C * Math.Pow(2 * roots[i] / width, 2) / mass - spectrum.Levels[i].EnergyElectronVolts));
        }
        output.WriteLine($"z0 = {z0}: {roots.Count} levels, worst error {worst:E3} eV");
        Assert.True(worst < 1e-11, $"worst {worst:E3} eV"); // Brent on both sides to 1e-15 in z, 1e-12 eV in E
    }

    [Fact]
    public void Find_GriffithsWorkedExample_MatchesTwoDigits()
    {
        // L = 1 nm, V0 = 2 eV, m = m_e: levels ≈ 0.23, 0.89, 1.81 eV above the bottom (textbook homework
        // answer to 2 digits, docs/references.md). Tolerance: half a unit of the last digit.
        var spectrum = BoundStateSpectrum.Find(SquareWell(1, 2, 1));
        Assert.Equal(3, spectrum.TotalCount);
        Assert.Equal(0.23, spectrum.Levels[0].EnergyElectronVolts, 0.005);
        Assert.Equal(0.89, spectrum.Levels[1].EnergyElectronVolts, 0.005);
        Assert.Equal(1.81, spectrum.Levels[2].EnergyElectronVolts, 0.005);
    }

    [Fact]
    public void GetWavefunction_SquareWellGroundState_MatchesClosedForm()
    {
        // Even state of the finite well (Griffiths §2.6): ψ = A cos(k y) inside (y from the centre),
        // A cos(kL/2) e^{−κ(|y| − L/2)} outside, with ∫ψ² = A² (L/2 + sin(kL)/(2k) + cos²(kL/2)/κ) = 1.
        const double width = 2, mass = 0.067, z = 1.2;
        var z0 = z / Math.Cos(z);
        var depth = C * Math.Pow(2 * z0 / width, 2) / mass;
        var spectrum = BoundStateSpectrum.Find(SquareWell(width, depth, mass));
        var psi = spectrum.GetWavefunction(0);
        var k = 2 * z / width;
        var kappa = Math.Sqrt(mass * (depth - psi.EnergyElectronVolts) / C);
        var a = 1 / Math.Sqrt(width / 2 + Math.Sin(k * width) / (2 * k) + Math.Pow(Math.Cos(k * width / 2), 2) / kappa);
        var positions = Enumerable.Range(0, 401).Select(i => -3.0 + 8.0 * i / 400).ToArray();
        var values = new double[positions.Length + 3]; // longer destination is allowed
        psi.Evaluate(positions, values);
        var worst = 0.0;
        for (var i = 0; i < positions.Length; i++)
        {
            var y = positions[i] - width / 2;
            var expected = Math.Abs(y) <= width / 2
                ? a * Math.Cos(k * y)
                : a * Math.Cos(k * width / 2) * Math.Exp(-kappa * (Math.Abs(y) - width / 2));
            worst = Math.Max(worst, Math.Abs(values[i] - expected));
        }
        output.WriteLine($"worst |psi - closed form| = {worst:E3} nm^-1/2");
        // Tolerance: the level is known to ~1e-12 eV; ψ moves by about (dψ/dE)·δE ≈ 1e-11 relative.
        Assert.True(worst < 1e-9 * a, $"worst {worst:E3}");
        Assert.Equal(0.0, values[^1]);
    }

    private static UnitCell Cell() => UnitCell.Create(Slab(4, 0), Slab(2, 0.3));

    [Theory]
    [InlineData(2)]
    [InlineData(5)]
    [InlineData(12)]
    [InlineData(30)]
    public void Find_CoupledWells_FillTheBandsOfTheInfiniteCell(int wells)
    {
        // N wells coupled through the barriers of the infinite cell: each miniband below the barrier top
        // holds N levels, inside its edges (tight-binding picture of band formation; common practice, no
        // single source; e.g. G. Bastard, Wave Mechanics Applied to Semiconductor Heterostructures, ch. 1).
        var cell = Cell();
        var lead = Lead.Like(Slab(1, 0.3));
        var stack = LayerStack.Periodic(lead, cell, wells - 1, lead, after: [Slab(4, 0)]);
        var spectrum = BoundStateSpectrum.Find(stack);
        var bands = BandStructure.ComputeBelow(cell, Energy.FromElectronVolts(0.3));
        var below = bands.Bands.Where(b => b.TopElectronVolts < 0.3).ToList();
        Assert.NotEmpty(below);
        foreach (var band in below)
        {
            var inside = spectrum.Levels.Count(l => l.EnergyElectronVolts >= band.BottomElectronVolts && l.EnergyElectronVolts <= band.TopElectronVolts);
            Assert.Equal(wells, inside);
        }
        output.WriteLine(spectrum.ToString());
    }

    [Fact]
    public void Find_DefectInSuperlattice_GivesOneLocalisedStateInTheMinigap()
    {
        // A narrower well in the middle of 2 x 12 periods pushes one level out of the first miniband into
        // the gap above it; the state decays away from the defect as the evanescent Bloch wave of the gap,
        // |ψ(x + d)| / |ψ(x)| → e^{−Im k · d} (Bloch's theorem at complex k; W. Kohn, Phys. Rev. 115, 809
        // (1959), from memory).
        var cell = Cell();
        var lead = Lead.Like(Slab(1, 0.3));
        var defect = new CellElement[] { Slab(2.5, 0), Slab(2, 0.3) };
        var stack = LayerStack.WithDefect(lead, cell, 12, defect, 12, lead);
        var spectrum = BoundStateSpectrum.Find(stack);
        var inGaps = spectrum.LevelsInGapsOf(cell);
        output.WriteLine(spectrum.ToString());
        Assert.Single(inGaps);
        var state = spectrum.GetWavefunction(inGaps[0].Index);
        var gamma = CellTransfer.Create(cell).Dispersion(state.EnergyElectronVolts).Wavevector.ImaginaryPerNanometre * 6.0;
        // Compare centres of wells 3 and 4 periods to the right of the defect (defect starts at 12 d = 72 nm).
        var x3 = 72 + 4.5 + 3 * 6 + 2;
        var ratio = Math.Abs(state.ValueAt(x3 + 6) / state.ValueAt(x3));
        output.WriteLine($"ratio {ratio}, e^-gamma {Math.Exp(-gamma)}");
        // Tolerance: the growing Bloch wave reflected at the far end adds e^{−2γ·8} relative; 1e-4 covers it for γ > 0.6.
        Assert.True(gamma > 0.6);
        Assert.Equal(Math.Exp(-gamma), ratio, Math.Exp(-gamma) * 1e-4);
    }

    [Fact]
    public void GetWavefunction_NodesAndNorm_FollowOscillationTheoryAndIntegrateToOne()
    {
        // The n-th level has n nodes (Sturm oscillation theorem); ∫ψ² = 1, checked with MathNet's
        // double-exponential quadrature on each layer separately (smooth integrands).
        var cell = Cell();
        var lead = Lead.Like(Slab(1, 0.3));
        var stack = LayerStack.Periodic(lead, cell, 3, lead, after: [Slab(4, 0)]);
        var spectrum = BoundStateSpectrum.Find(stack);
        Assert.True(spectrum.Levels.Count >= 4);
        foreach (var level in spectrum.Levels)
        {
            var psi = spectrum.GetWavefunction(level.Index);
            var grid = Enumerable.Range(0, 20001).Select(i => -10 + (stack.Thickness.Nanometres + 20) * i / 20000.0).ToArray();
            var values = new double[grid.Length];
            psi.Evaluate(grid, values);
            var nodes = 0;
            for (var i = 1; i < values.Length; i++)
            {
                nodes += Math.Sign(values[i]) != Math.Sign(values[i - 1]) && values[i] != 0 ? 1 : 0;
            }
            Assert.Equal(level.Index, nodes);
            var edges = new List<double> { -60 };
            for (double x = 0; x <= stack.Thickness.Nanometres + 1e-9; x += 0)
            {
                edges.Add(x);
                x += edges.Count % 2 == 0 ? 4 : 2;
            }
            edges.Add(stack.Thickness.Nanometres + 60);
            var norm = 0.0;
            for (var i = 1; i < edges.Count; i++)
            {
                norm += MathNet.Numerics.Integration.DoubleExponentialTransformation.Integrate(
                    x => Math.Pow(psi.ValueAt(x), 2), edges[i - 1], edges[i], 1e-13);
            }
            // Tolerance: quadrature to 1e-13 per piece; tails beyond 60 nm are below e^-100.
            Assert.Equal(1.0, norm, 1e-10);
        }
    }

    [Fact]
    public void CountBelow_AgreesWithLevels()
    {
        var lead = Lead.Like(Slab(1, 0.3));
        var spectrum = BoundStateSpectrum.Find(LayerStack.Periodic(lead, Cell(), 4, lead));
        for (var i = 0; i < spectrum.Levels.Count; i++)
        {
            var e = spectrum.Levels[i].EnergyElectronVolts;
            Assert.Equal(i, spectrum.CountBelow(e - 1e-9));
            Assert.Equal(i + 1, spectrum.CountBelow(e + 1e-9));
        }
        Assert.Equal(spectrum.TotalCount, spectrum.CountBelow(0.3));
    }

    [Theory]
    [InlineData(1e-12)]
    [InlineData(1e-16)]
    public void Find_TwentyCoupledWells_ProvesEveryLevelWithinItsTolerance(double tolerance)
    {
        // 8 nm wells (0.067 m0) between 10 nm barriers of 0.26 eV (0.092 m0), a demo design: one such well holds two levels
        // (ceil(2 z0/π) with z0 = (a/2)·sqrt(2mV)/ħ ≈ 2.7; Griffiths, Introduction to Quantum Mechanics, §2.6), and N coupled
        // wells split each into N (common practice, no single source), so both minibands of 20 levels each lie below the edge.
        var well = Slab(8, 0);
        var barrier = Layer.Create(Length.FromNanometres(10), Energy.FromElectronVolts(0.26), EffectiveMass.FromElectronMasses(0.092));
        var lead = Lead.Like(barrier);
        var stack = LayerStack.Create(lead, [StackPart.Repeat(UnitCell.Create(well, barrier), 19), StackPart.Single(well)], lead);
        var spectrum = BoundStateSpectrum.Find(stack, BoundStateOptions.Create(absoluteToleranceElectronVolts: tolerance));
        Assert.Equal(40, spectrum.TotalCount);
        Assert.Equal(40, spectrum.Levels.Count);
        for (var i = 0; i < spectrum.Levels.Count; i++)
        {
            var level = spectrum.Levels[i];
            Assert.True(level.IsResolved);
            var bound = Math.Max(tolerance, 4e-16 * Math.Abs(level.EnergyElectronVolts));
            Assert.True(level.ErrorElectronVolts <= bound, $"level {i}: error {level.ErrorElectronVolts:E2} eV");
            if (tolerance >= 1e-12)
            {
                // The count, the proof that no level is missed, puts level i within its tolerance (twice it, clear of rounding
                // in the count, which moves the step of a miniband level by about 1e-15 eV).
                Assert.Equal(i, spectrum.CountBelow(level.EnergyElectronVolts - 2 * bound));
                Assert.Equal(i + 1, spectrum.CountBelow(level.EnergyElectronVolts + 2 * bound));
            }
        }
    }

    [Fact]
    public void Find_DeltaWell_HasItsSingleTextbookLevel()
    {
        // Attractive delta −α δ(x): one bound state at E = −m α² / (2ħ²) = −m α² / (4C) (Griffiths §2.5.2,
        // eq. 2.129), wavefunction √κ e^{−κ|x|} with κ = m α / (2C).
        const double alpha = 0.1, mass = 0.067;
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(mass));
        var spectrum = BoundStateSpectrum.Find(LayerStack.Create(lead, lead, DeltaBarrier.Create(-alpha)));
        Assert.Equal(1, spectrum.TotalCount);
        var expected = -mass * alpha * alpha / (4 * C);
        // Tolerance: search tolerance 1e-12 eV on a level of 4.4e-3 eV.
        Assert.Equal(expected, spectrum.Levels[0].EnergyElectronVolts, 2e-12);
        var kappa = mass * alpha / (2 * C);
        var psi = spectrum.GetWavefunction(0);
        Assert.Equal(Math.Sqrt(kappa) * Math.Exp(-kappa * 3), psi.ValueAt(3), 1e-9);
        Assert.Equal(Math.Sqrt(kappa) * Math.Exp(-kappa * 2), psi.ValueAt(-2), 1e-9);
    }

    [Fact]
    public void LevelsInGapsOf_PerfectSuperlattice_HasNone()
    {
        // Without a defect every level of the coupled-well stack lies in a miniband (see above).
        var lead = Lead.Like(Slab(1, 0.3));
        var spectrum = BoundStateSpectrum.Find(LayerStack.Periodic(lead, Cell(), 9, lead, after: [Slab(4, 0)]));
        Assert.Equal(10, spectrum.TotalCount);
        Assert.Empty(spectrum.LevelsInGapsOf(Cell()));
    }

    [Fact]
    public void GetWavefunction_BadIndex_NamesParameter()
    {
        var spectrum = BoundStateSpectrum.Find(SquareWell(2, 0.3, 0.067));
        Assert.Equal("index", Assert.Throws<ArgumentOutOfRangeException>(() => spectrum.GetWavefunction(spectrum.Levels.Count)).ParamName);
        var psi = spectrum.GetWavefunction(0);
        Assert.Equal("destination", Assert.Throws<ArgumentException>(() => psi.Evaluate(new double[3], new double[2])).ParamName);
        var badPosition = Assert.Throws<ArgumentOutOfRangeException>(() => psi.Evaluate([0, double.NaN], new double[2]));
        Assert.Equal("positionsNanometres", badPosition.ParamName); // the parameter; the message names the element
        Assert.Contains("positionsNanometres[1]", badPosition.Message);
    }
}
