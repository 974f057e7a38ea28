// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Benchmarks;

/// <summary>
/// A 10,000-point sampled profile (demo scenario of our own: a 20 nm cell with a smoothed 0.25 eV double
/// well, as a Poisson solver might return it), solved for its lowest three bands. Baseline: the same samples
/// as a 9,999-layer staircase of uniform layers (closed-form layer matrices, no Magnus steps).
/// </summary>
[MemoryDiagnoser]
public class SampledProfileBenchmarks
{
    private const int Samples = 10_000;
    private const double PeriodNanometres = 20.0;

    private UnitCell _sampled = null!;
    private UnitCell _staircase = null!;

    [GlobalSetup]
    public void Setup()
    {
        var x = new double[Samples];
        var v = new double[Samples];
        for (var i = 0; i < Samples; i++)
        {
            x[i] = PeriodNanometres * i / (Samples - 1);
            var t = x[i] / PeriodNanometres;
            // Two wells of smooth (tanh) walls on a 0.25 eV background.
            v[i] = 0.25 - 0.125 * (Math.Tanh((t - 0.15) * 40) - Math.Tanh((t - 0.40) * 40))
                        - 0.125 * (Math.Tanh((t - 0.55) * 40) - Math.Tanh((t - 0.85) * 40));
        }
        var mass = EffectiveMass.FromElectronMasses(0.067);
        _sampled = UnitCell.Create(SampledSegment.Create(x, v, mass));
        var widths = new double[Samples - 1];
        var potentials = new double[Samples - 1];
        var masses = new double[Samples - 1];
        for (var i = 0; i < widths.Length; i++)
        {
            widths[i] = x[i + 1] - x[i];
            potentials[i] = 0.5 * (v[i] + v[i + 1]);
            masses[i] = 0.067;
        }
        _staircase = UnitCell.FromLayers(widths, potentials, masses);
    }

    /// <summary>Baseline: 9,999 uniform layers.</summary>
    [Benchmark(Baseline = true)]
    public double Staircase9999Layers() => BandStructure.Compute(_staircase, 3).GetBand(3).TopElectronVolts;

    /// <summary>The sampled profile, one Magnus step per interval (piecewise-linear interpolant).</summary>
    [Benchmark]
    public double Sampled10000Points() => BandStructure.Compute(_sampled, 3).GetBand(3).TopElectronVolts;

    /// <summary>The sampled profile to a stated tolerance (1e-10 relative), with step halving.</summary>
    [Benchmark]
    public double Sampled10000PointsRefined() => RefinedBandStructure.Compute(_sampled, 3, RefinementOptions.Create(1e-10)).Structure.GetBand(3).TopElectronVolts;
}
