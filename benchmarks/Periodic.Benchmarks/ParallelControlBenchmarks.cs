// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Transfer;

namespace Periodic.Benchmarks;

/// <summary>
/// The control for parallel speed-ups on this machine: pure compute that allocates nothing and shares nothing — D(E) of the
/// two-layer demo cell on 4·10^5 energies — in one loop against the same loop split over all cores. Its ratio is the most a
/// parallel sweep can gain here (a virtual machine whose host runs other guests gives less than the core count).
/// </summary>
[MemoryDiagnoser]
[BenchmarkCategory("Sweep")]
public class ParallelControlBenchmarks
{
    private const int Points = 400_000;
    private CellTransfer _transfer = null!;
    private double[] _energies = null!;
    private double[] _destination = null!;

    [GlobalSetup]
    public void Setup()
    {
        _transfer = CellTransfer.Create(Scenarios.KronigPenney());
        _energies = Scenarios.Grid(0.001, 1.0, Points);
        _destination = new double[Points];
    }

    /// <summary>One thread, every energy in turn.</summary>
    [Benchmark(Baseline = true)]
    public double Serial()
    {
        Fill(0, Points);
        return _destination[Points / 3];
    }

    /// <summary>The energies in 100 blocks that all cores take in turn (as a sweep's designs are taken).</summary>
    [Benchmark]
    public double Parallel()
    {
        const int Blocks = 100;
        System.Threading.Tasks.Parallel.For(0, Blocks, b => Fill(b * (Points / Blocks), (b + 1) * (Points / Blocks)));
        return _destination[Points / 3];
    }

    private void Fill(int start, int end)
    {
        for (var i = start; i < end; i++)
        {
            _destination[i] = _transfer.Trace(_energies[i]);
        }
    }
}
