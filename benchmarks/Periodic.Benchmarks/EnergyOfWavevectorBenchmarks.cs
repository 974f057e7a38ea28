// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.Structures;

namespace Periodic.Benchmarks;

/// <summary>E(k) of the first 5 bands of the demo Kronig–Penney cell on 10^5 k-points across the zone.</summary>
[MemoryDiagnoser]
[BenchmarkCategory("EnergyOfWavevector")]
public class EnergyOfWavevectorBenchmarks
{
    private const int Bands = 5;
    private const int Points = 100_000;
    private UnitCell _cell = null!;
    private NaiveKronigPenney _naive = null!;
    private double[] _k = null!;
    private double[] _destination = null!;
    private BandDispersion[] _dispersions = null!;

    [GlobalSetup]
    public void Setup()
    {
        _cell = Scenarios.KronigPenney();
        _naive = Scenarios.Naive();
        _k = Scenarios.Grid(-Math.PI / _cell.Period.Nanometres, Math.PI / _cell.Period.Nanometres, Points);
        _destination = new double[Points];
        var bands = BandStructure.Compute(_cell, Bands);
        _dispersions = Enumerable.Range(1, Bands).Select(n => BandDispersion.Create(bands, n)).ToArray();
    }

    /// <summary>The hand-written solver: scan for edges, then safeguarded Newton per (band, k).</summary>
    [Benchmark(Baseline = true)]
    public double NaiveScanAndNewton()
    {
        var edges = _naive.Edges(Bands);
        for (var n = 0; n < Bands; n++)
        {
            for (var i = 0; i < _k.Length; i++)
            {
                _destination[i] = _naive.Energy(edges[n].Bottom, edges[n].Top, Math.Abs(_k[i]));
            }
        }
        return _destination[Points / 3];
    }

    /// <summary>Library reference path: band search, then one root search per (band, k).</summary>
    [Benchmark]
    public double LibraryRootSearch()
    {
        var bands = BandStructure.Compute(_cell, Bands);
        for (var n = 1; n <= Bands; n++)
        {
            bands.EnergiesAt(n, _k, _destination);
        }
        return _destination[Points / 3];
    }

    /// <summary>Library fast path from scratch: band search, Chebyshev inversion of each band, evaluation.</summary>
    [Benchmark]
    public double LibraryChebyshevIncludingBuild()
    {
        var bands = BandStructure.Compute(_cell, Bands);
        for (var n = 1; n <= Bands; n++)
        {
            BandDispersion.Create(bands, n).EnergiesAt(_k, _destination);
        }
        return _destination[Points / 3];
    }

    /// <summary>Library fast path in steady state (series built once): evaluation only; allocates nothing.</summary>
    [Benchmark]
    public double LibraryChebyshevPrebuilt()
    {
        for (var n = 0; n < Bands; n++)
        {
            _dispersions[n].EnergiesAt(_k, _destination);
        }
        return _destination[Points / 3];
    }
}
