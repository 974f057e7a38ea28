// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Transfer;

namespace Periodic.Benchmarks;

/// <summary>D(E) of the two-layer demo cell on 10^6 energies from 1 meV to 1 eV (across the barrier top).</summary>
[MemoryDiagnoser]
[BenchmarkCategory("DispersionFunction")]
public class DispersionFunctionBenchmarks
{
    private const int Points = 1_000_000;
    private NaiveKronigPenney _naive = null!;
    private CellTransfer _transfer = null!;
    private double[] _energies = null!;
    private double[] _destination = null!;

    [GlobalSetup]
    public void Setup()
    {
        var cell = Scenarios.KronigPenney();
        _naive = Scenarios.Naive();
        _transfer = CellTransfer.Create(cell);
        _energies = Scenarios.Grid(0.001, 1.0, Points);
        _destination = new double[Points];
    }

    /// <summary>The Kronig–Penney closed form for D(E), written out by hand.</summary>
    [Benchmark(Baseline = true)]
    public double HandInlinedClosedForm()
    {
        for (var i = 0; i < _energies.Length; i++)
        {
            _destination[i] = _naive.Trace(_energies[i]);
        }
        return _destination[Points / 3];
    }

    /// <summary>Public scalar path: <see cref="CellTransfer.Dispersion"/> per energy (D and the exact dD/dE).</summary>
    [Benchmark]
    public double ScalarDispersionLoop()
    {
        for (var i = 0; i < _energies.Length; i++)
        {
            _destination[i] = _transfer.Dispersion(_energies[i]).Trace;
        }
        return _destination[Points / 3];
    }

    /// <summary>Public scalar trace-only path: <see cref="CellTransfer.Trace"/> per energy.</summary>
    [Benchmark]
    public double ScalarTraceLoop()
    {
        for (var i = 0; i < _energies.Length; i++)
        {
            _destination[i] = _transfer.Trace(_energies[i]);
        }
        return _destination[Points / 3];
    }

    /// <summary>Public exact batch: <see cref="CellTransfer.Traces"/> (bitwise the scalar path's D).</summary>
    [Benchmark]
    public double BatchTracesExact()
    {
        _transfer.Traces(_energies, _destination);
        return _destination[Points / 3];
    }

    /// <summary>Public fast batch: <see cref="CellTransfer.TracesVectorized"/>, vectorised across energies.</summary>
    [Benchmark]
    public double BatchTraces()
    {
        _transfer.TracesVectorized(_energies, _destination);
        return _destination[Points / 3];
    }
}

/// <summary>D(E) of a 20-layer graded cell on 10^6 energies: batch against the scalar loop.</summary>
[MemoryDiagnoser]
[BenchmarkCategory("DispersionFunctionGraded")]
public class DispersionFunctionGradedBenchmarks
{
    private const int Points = 1_000_000;
    private CellTransfer _transfer = null!;
    private double[] _energies = null!;
    private double[] _destination = null!;

    [GlobalSetup]
    public void Setup()
    {
        _transfer = CellTransfer.Create(Scenarios.Stack(20));
        _energies = Scenarios.Grid(0.001, 1.0, Points);
        _destination = new double[Points];
    }

    [Benchmark(Baseline = true)]
    public double ScalarDispersionLoop()
    {
        for (var i = 0; i < _energies.Length; i++)
        {
            _destination[i] = _transfer.Dispersion(_energies[i]).Trace;
        }
        return _destination[Points / 3];
    }

    [Benchmark]
    public double ScalarTraceLoop()
    {
        for (var i = 0; i < _energies.Length; i++)
        {
            _destination[i] = _transfer.Trace(_energies[i]);
        }
        return _destination[Points / 3];
    }

    [Benchmark]
    public double BatchTraces()
    {
        _transfer.TracesVectorized(_energies, _destination);
        return _destination[Points / 3];
    }
}
