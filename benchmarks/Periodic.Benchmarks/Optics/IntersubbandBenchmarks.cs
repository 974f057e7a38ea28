// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using BenchmarkDotNet.Attributes;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Tests.TestHelpers;
using Periodic.Units;

namespace Periodic.Benchmarks.Optics;

/// <summary>
/// Every intersubband transition (levels, wavefunctions, dipoles, oscillator strengths) of a 50-well stack, against a
/// finite-difference calculation of equal accuracy: the three-point scheme at h = 0.02 and 0.01 nm with Richardson
/// extrapolation, whose dipoles agree with the library's to the level <c>--calibrate-optics</c> prints. Ratios are
/// against the finite-difference baseline. Each call takes seconds; run it in process with few iterations:
/// <c>-- --filter '*IntersubbandBenchmarks*' --inProcess --warmupCount 1 --iterationCount 3</c>.
/// </summary>
[MemoryDiagnoser]
public class IntersubbandBenchmarks
{
    internal const int Wells = 50;
    private const double Well = 8, Barrier = 10, Height = 0.26, WellMass = 0.067, BarrierMass = 0.092, Outer = 40;

    private LayerStack _stack = null!;

    /// <summary>50 GaAs-like 8 nm wells between 10 nm barriers 0.26 eV high (a demo design), leads of the barrier.</summary>
    [GlobalSetup]
    public void Setup() => _stack = Stack();

    internal static LayerStack Stack()
    {
        var well = Layer.Create(Length.FromNanometres(Well), default, EffectiveMass.FromElectronMasses(WellMass));
        var barrier = Layer.Create(Length.FromNanometres(Barrier), Energy.FromElectronVolts(Height), EffectiveMass.FromElectronMasses(BarrierMass));
        var lead = Lead.Like(barrier);
        return LayerStack.Create(lead, [StackPart.Repeat(UnitCell.Create(well, barrier), Wells - 1), StackPart.Single(well)], lead);
    }

    /// <summary>The library: every level and every transition.</summary>
    [Benchmark]
    public double Periodic()
    {
        var spectrum = IntersubbandSpectrum.Compute(_stack);
        double sum = 0;
        foreach (var t in spectrum.Transitions)
        {
            sum += t.IsResolved ? Math.Abs(t.DipoleNanometres) : 0;
        }
        return sum;
    }

    /// <summary>The share of the bound-state search and the wavefunctions (Stacks) in <see cref="Periodic"/>: levels only.</summary>
    [Benchmark]
    public double LevelsAndWavefunctions()
    {
        var levels = BoundStateSpectrum.Find(_stack);
        double sum = 0;
        for (var i = 0; i < levels.Levels.Count; i++)
        {
            sum += levels.GetWavefunction(i).LeadProbability;
        }
        return sum;
    }

    /// <summary>The finite-difference baseline: all levels, eigenvectors and dipoles at two grids, Richardson-extrapolated.</summary>
    [Benchmark(Baseline = true)]
    public double FiniteDifference() => FiniteDifferenceDipoles(out _).Cast<double>().Sum(Math.Abs);

    /// <summary>|z_if| for all pairs by (4 z(h/2) − z(h))/3, h = 0.02 nm; also the level energies (extrapolated the same way).</summary>
    internal static double[,] FiniteDifferenceDipoles(out double[] energies)
    {
        var layers = new List<(double, double, double)> { (Outer, Height, BarrierMass) };
        for (var i = 0; i < Wells; i++)
        {
            layers.Add((Well, 0, WellMass));
            if (i < Wells - 1)
            {
                layers.Add((Barrier, Height, BarrierMass));
            }
        }
        layers.Add((Outer, Height, BarrierMass));
        var length = layers.Sum(l => l.Item1);
        var levels = Stack() is var stack ? BoundStateSpectrum.Find(stack).TotalCount : 0;
        var results = new double[2][,];
        var e = new double[2][];
        var steps = new[] { 0.02, 0.01 };
        for (var g = 0; g < 2; g++)
        {
            var fd = new TridiagonalWell(layers, steps[g]);
            var vectors = new double[levels][];
            e[g] = new double[levels];
            for (var n = 0; n < levels; n++)
            {
                e[g][n] = fd.Eigenvalue(n, 0, Height);
                vectors[n] = fd.Eigenvector(e[g][n]);
            }
            results[g] = new double[levels, levels];
            for (var i = 0; i < levels; i++)
            {
                for (var f = i + 1; f < levels; f++)
                {
                    results[g][i, f] = Math.Abs(fd.Dipole(vectors[i], vectors[f], length / 2));
                }
            }
        }
        var z = new double[levels, levels];
        energies = new double[levels];
        for (var i = 0; i < levels; i++)
        {
            energies[i] = (4 * e[1][i] - e[0][i]) / 3;
            for (var f = i + 1; f < levels; f++)
            {
                z[i, f] = (4 * results[1][i, f] - results[0][i, f]) / 3;
            }
        }
        return z;
    }

    /// <summary><c>--calibrate-optics</c>: how closely the extrapolated finite differences reproduce the library's levels and dipoles.</summary>
    internal static void Calibrate()
    {
        var spectrum = IntersubbandSpectrum.Compute(Stack());
        var z = FiniteDifferenceDipoles(out var energies);
        double worstEnergy = 0, worstDipole = 0, worstAbsolute = 0;
        var counted = 0;
        for (var i = 0; i < spectrum.BoundCount; i++)
        {
            worstEnergy = Math.Max(worstEnergy, Math.Abs(energies[i] / spectrum.Levels[i].EnergyElectronVolts - 1));
            for (var f = i + 1; f < spectrum.BoundCount; f++)
            {
                var exact = Math.Abs(spectrum.Transition(i + 1, f + 1).DipoleNanometres);
                worstAbsolute = Math.Max(worstAbsolute, Math.Abs(z[i, f] - exact));
                if (exact > 1e-3)
                {
                    worstDipole = Math.Max(worstDipole, Math.Abs(z[i, f] / exact - 1));
                    counted++;
                }
            }
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"{Wells}-well stack: {spectrum.BoundCount} levels, {spectrum.Transitions.Count} transitions; FD (Richardson, h = 0.02/0.01 nm) vs library: energies {worstEnergy:E2} relative, dipoles {worstDipole:E2} relative over the {counted} with |z| > 1e-3 nm, {worstAbsolute:E2} nm absolute over all; library normalisation error {spectrum.NormalisationError:E2}"));
    }
}
