// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using Periodic.Bands;
using Periodic.Structures;

namespace Periodic.Benchmarks;

/// <summary>Band edges of the first 10 bands of graded cells of 2 to 20,000 layers (the cost should grow linearly).</summary>
[MemoryDiagnoser]
[BenchmarkCategory("BandEdges")]
public class BandEdgeBenchmarks
{
    private UnitCell _cell = null!;

    [Params(2, 20, 200, 2000, 20000)]
    public int Layers { get; set; }

    [GlobalSetup]
    public void Setup() => _cell = Scenarios.Stack(Layers);

    [Benchmark]
    public double FirstTenBands() => BandStructure.Compute(_cell, 10).GetBand(10).TopElectronVolts;
}

/// <summary>
/// Band edges at 1 µeV: the finite-difference Hamiltonian at the grid that reaches 1 µeV on band 1
/// (80 points per nm, 560 × 560, two dense diagonalisations) against the library.
/// </summary>
[MemoryDiagnoser]
[BenchmarkCategory("FiniteDifference")]
public class FiniteDifferenceBenchmarks
{
    private UnitCell _cell = null!;

    [GlobalSetup]
    public void Setup() => _cell = Scenarios.KronigPenney();

    [Benchmark(Baseline = true)]
    public double FiniteDifferenceBandOne() => FiniteDifferenceKronigPenney.Edges(Calibration.FiniteDifferencePointsPerNanometre, 2)[1];

    [Benchmark]
    public double LibraryBandOne() => BandStructure.Compute(_cell, 1).GetBand(1).TopElectronVolts;

    [Benchmark]
    public double LibraryFirstTenBands() => BandStructure.Compute(_cell, 10).GetBand(10).TopElectronVolts;
}

/// <summary>
/// Every edge of the first three bands at 1 µeV: the finite-difference Hamiltonian at the grid that reaches 1 µeV on
/// all six edges (376 points per nm, 2632 × 2632, two dense diagonalisations of about half a minute each; the
/// calibration checks the grid) against the library. Few iterations (its own job): the baseline's time is large
/// and the ratio is of order 1e6, far beyond the noise.
/// </summary>
[MemoryDiagnoser]
[BenchmarkCategory("FiniteDifference")]
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 1, iterationCount: 2)]
public class FiniteDifferenceAllEdgesBenchmarks
{
    private UnitCell _cell = null!;

    [GlobalSetup]
    public void Setup() => _cell = Scenarios.KronigPenney();

    [Benchmark(Baseline = true)]
    public double FiniteDifferenceFirstThreeBands() =>
        FiniteDifferenceKronigPenney.Edges(Calibration.FiniteDifferenceAllEdgesPointsPerNanometre, 2 * Calibration.FiniteDifferenceBands)[5];

    [Benchmark]
    public double LibraryFirstThreeBands() => BandStructure.Compute(_cell, Calibration.FiniteDifferenceBands).GetBand(3).TopElectronVolts;
}
