// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.Properties;

namespace Periodic.Benchmarks;

/// <summary>
/// The 1D density of states g(E) = 2|D′| / (π d √(4 − D²)) of the demo cell on 10^6 energies from 1 meV to
/// 1 eV (bands 1 to 3 and their gaps).
/// </summary>
[MemoryDiagnoser]
[BenchmarkCategory("DensityOfStates")]
public class DensityOfStatesBenchmarks
{
    private const int Points = 1_000_000;
    private NaiveKronigPenney _naive = null!;
    private BandProperties _properties = null!;
    private double[] _energies = null!;
    private double[] _destination = null!;

    [GlobalSetup]
    public void Setup()
    {
        _naive = Scenarios.Naive();
        _properties = BandProperties.Create(BandStructure.Compute(Scenarios.KronigPenney(), 3));
        _energies = Scenarios.Grid(0.001, 1.0, Points);
        _destination = new double[Points];
    }

    /// <summary>Hand-written: closed-form D and a forward-difference D′ per energy.</summary>
    [Benchmark(Baseline = true)]
    public double NaiveClosedForm()
    {
        var d = _naive.Period;
        for (var i = 0; i < _energies.Length; i++)
        {
            var e = _energies[i];
            var trace = _naive.Trace(e);
            if (Math.Abs(trace) >= 2)
            {
                _destination[i] = 0;
                continue;
            }
            var h = 1e-7 * Math.Max(1, e);
            var slope = (_naive.Trace(e + h) - trace) / h;
            _destination[i] = 2 * Math.Abs(slope) / (Math.PI * d * Math.Sqrt(4 - trace * trace));
        }
        return _destination[Points / 3];
    }

    /// <summary>The library's batch DOS (exact D′, closed-gap handling).</summary>
    [Benchmark]
    public double LibraryDensitiesOfStates()
    {
        _properties.DensitiesOfStates(_energies, _destination);
        return _destination[Points / 3];
    }
}
