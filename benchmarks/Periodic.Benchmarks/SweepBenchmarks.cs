// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.Structures;

namespace Periodic.Benchmarks;

/// <summary>A design sweep: the first 3 bands of 10^4 Kronig–Penney cells, barrier width 1 to 3 nm.</summary>
[MemoryDiagnoser]
[BenchmarkCategory("Sweep")]
public class SweepBenchmarks
{
    private const int Cells = 10_000;
    private const int Bands = 3;
    private UnitCell[] _cells = null!;
    private NaiveKronigPenney[] _naive = null!;

    [GlobalSetup]
    public void Setup()
    {
        var barriers = Scenarios.Grid(1.0, 3.0, Cells);
        _cells = barriers.Select(b => Scenarios.KronigPenney(b)).ToArray();
        _naive = barriers.Select(b => Scenarios.Naive(b)).ToArray();
    }

    /// <summary>The hand-written solver's edge scan, cell after cell.</summary>
    [Benchmark(Baseline = true)]
    public double NaiveSerial()
    {
        var sum = 0.0;
        foreach (var solver in _naive)
        {
            sum += solver.Edges(Bands)[Bands - 1].Top;
        }
        return sum;
    }

    [Benchmark]
    public double LibrarySerial() => Sum(BandSweep.Compute(_cells, Bands, BandSweepOptions.Create(maxDegreeOfParallelism: 1)));

    [Benchmark]
    public double LibraryParallel() => Sum(BandSweep.Compute(_cells, Bands));

    private static double Sum(BandStructure[] results)
    {
        var sum = 0.0;
        foreach (var result in results)
        {
            sum += result.GetBand(Bands).TopElectronVolts;
        }
        return sum;
    }
}
