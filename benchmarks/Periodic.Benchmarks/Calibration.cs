// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;

namespace Periodic.Benchmarks;

/// <summary>
/// `--calibrate`: the accuracy side of the benchmarks (not timed by BenchmarkDotNet): the grid the
/// finite-difference baseline needs for 1 µeV, and the worst errors of the fast paths against the
/// reference paths on the benchmark inputs.
/// </summary>
internal static class Calibration
{
    internal const int FiniteDifferenceBands = 3;

    /// <summary>Grid density at which the finite-difference edges of band 1 are within 1 µeV (found by this calibration).</summary>
    internal const int FiniteDifferencePointsPerNanometre = 80;

    /// <summary>
    /// Grid density at which all six finite-difference edges of the first three bands are within 1 µeV: the O(h²)
    /// extrapolation from the coarser grids below gives 376 points per nm, and this calibration checks it.
    /// </summary>
    internal const int FiniteDifferenceAllEdgesPointsPerNanometre = 376;

    internal static void Run()
    {
        var inv = CultureInfo.InvariantCulture;
        foreach (var layers in new[] { 2, 20, 200, 2000, 20000 })
        {
            var stack = Scenarios.Stack(layers);
            var structure = BandStructure.Compute(stack, 10);
            Console.WriteLine(string.Create(inv, $"Graded cell of {layers} layers: max edge error bound {structure.MaxEdgeErrorElectronVolts:E2} eV, {structure.GetBand(10)}"));
        }
        var cell = Scenarios.KronigPenney();
        var exact = BandStructure.Compute(cell, FiniteDifferenceBands);
        var reference = new List<double>();
        foreach (var band in exact.Bands)
        {
            reference.Add(band.BottomElectronVolts);
            reference.Add(band.TopElectronVolts);
        }
        Console.WriteLine("Finite differences, first {0} bands ({1} edges): grid points per nm, matrix size, max edge error (eV); timing is in FiniteDifferenceBenchmarks", FiniteDifferenceBands, reference.Count);
        foreach (var density in new[] { 10, 20, 40, FiniteDifferencePointsPerNanometre, FiniteDifferenceAllEdgesPointsPerNanometre })
        {
            var fd = FiniteDifferenceKronigPenney.Edges(density, reference.Count);
            var error = reference.Select((e, i) => Math.Abs(e - fd[i])).Max();
            Console.WriteLine("    per edge: " + string.Join(" ", reference.Select((e, i) => (e - fd[i]).ToString("E2", inv))));
            Console.WriteLine(string.Create(inv, $"  {density,4} {density * 7,6} {error,12:E3}"));
            var bandOne = Math.Max(Math.Abs(reference[0] - fd[0]), Math.Abs(reference[1] - fd[1]));
            Console.WriteLine(string.Create(inv, $"    band 1 only: max edge error {bandOne:E3} eV; O(h^2) extrapolation to 1 µeV on all {reference.Count} edges: {density * Math.Sqrt(error / 1e-6):F0} points per nm"));
        }

        var bands = BandStructure.Compute(cell, 5);
        var naive = Scenarios.Naive();
        var naiveEdges = naive.Edges(5);
        for (var n = 1; n <= 5; n++)
        {
            Console.WriteLine(string.Create(inv, $"  naive band {n}: {naiveEdges[n - 1].Bottom:R} {naiveEdges[n - 1].Top:R}; library {bands.GetBand(n)}"));
        }
        var k = Scenarios.Grid(-Math.PI / cell.Period.Nanometres, Math.PI / cell.Period.Nanometres, 100_000);
        var fast = new double[k.Length];
        var slow = new double[k.Length];
        for (var n = 1; n <= 5; n++)
        {
            var dispersion = BandDispersion.Create(bands, n);
            dispersion.EnergiesAt(k, fast);
            bands.EnergiesAt(n, k, slow);
            var worst = 0.0;
            var worstNaive = 0.0;
            for (var i = 0; i < k.Length; i += 1)
            {
                worst = Math.Max(worst, Math.Abs(fast[i] - slow[i]));
                if (i % 97 == 0)
                {
                    worstNaive = Math.Max(worstNaive, Math.Abs(naive.Energy(naiveEdges[n - 1].Bottom, naiveEdges[n - 1].Top, Math.Abs(k[i])) - slow[i]));
                }
            }
            Console.WriteLine(string.Create(inv, $"Band {n}: {dispersion}; worst |fast - root search| on 1e5 k = {worst:E3} eV; naive vs library (every 97th k) {worstNaive:E3} eV"));
        }

        var transfer = bands.Transfer;
        var energies = Scenarios.Grid(0.001, 1.0, 1_000_000);
        var batch = new double[energies.Length];
        transfer.TracesVectorized(energies, batch);
        double worstTrace = 0, worstInline = 0;
        for (var i = 0; i < energies.Length; i++)
        {
            var scalar = transfer.Dispersion(energies[i]).Trace;
            var scale = transfer.Evaluate(energies[i]).Mantissa.MaxAbsEntry * Math.Exp(transfer.Evaluate(energies[i]).LogScale);
            worstTrace = Math.Max(worstTrace, Math.Abs(batch[i] - scalar) / Math.Max(2, scale));
            worstInline = Math.Max(worstInline, Math.Abs(naive.Trace(energies[i]) - scalar) / Math.Max(2, scale));
        }
        Console.WriteLine(string.Create(inv, $"D(E) on 1e6 energies: worst |batch - scalar| / max(2, max|M_ij|) = {worstTrace:E3}; closed form vs scalar {worstInline:E3}"));
    }
}
