// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Benchmarks.Stacks;

/// <summary>
/// Cost of one T(E) evaluation against the number of periods: repeated squaring of the cell's
/// scattering matrix should make it grow as log₂ N. Ratios are against the 10-period baseline.
/// </summary>
[MemoryDiagnoser]
public class StackTransmissionBenchmarks
{
    private StackTransmission _ten = null!;
    private StackTransmission _thousand = null!;
    private StackTransmission _hundredThousand = null!;
    private StackTransmission _tenMillion = null!;

    /// <summary>A 4 nm / 2 nm, 0.3 eV superlattice between well-material leads (demo structure).</summary>
    [GlobalSetup]
    public void Setup()
    {
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var cell = UnitCell.Create(
            Layer.Create(Length.FromNanometres(4), default, mass),
            Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.3), mass));
        var lead = Lead.Create(default, mass);
        StackTransmission Build(int periods) => StackTransmission.Create(LayerStack.Periodic(lead, cell, periods, lead));
        _ten = Build(10);
        _thousand = Build(1_000);
        _hundredThousand = Build(100_000);
        _tenMillion = Build(10_000_000);
    }

    /// <summary>10 periods (baseline).</summary>
    [Benchmark(Baseline = true)]
    public double Periods10() => _ten.Evaluate(0.2).LogTransmission;

    /// <summary>1,000 periods.</summary>
    [Benchmark]
    public double Periods1000() => _thousand.Evaluate(0.2).LogTransmission;

    /// <summary>100,000 periods.</summary>
    [Benchmark]
    public double Periods100000() => _hundredThousand.Evaluate(0.2).LogTransmission;

    /// <summary>10,000,000 periods.</summary>
    [Benchmark]
    public double Periods10000000() => _tenMillion.Evaluate(0.2).LogTransmission;
}

/// <summary>
/// Cost of one T(E) evaluation under bias, where every element is written out and propagated exactly (Airy functions
/// or a sublayer series), against the same stacks at zero bias. Ratios are against the unbiased double barrier.
/// </summary>
[MemoryDiagnoser]
public class BiasedStackTransmissionBenchmarks
{
    private StackTransmission _doubleBarrier = null!;
    private StackTransmission _doubleBarrierBiased = null!;
    private StackTransmission _superlattice = null!;
    private StackTransmission _superlatticeBiased = null!;

    /// <summary>A 3/6/3 nm double barrier (0.3 eV) and a 100-period 4 nm / 2 nm superlattice, 0.1 eV bias (demo structures).</summary>
    [GlobalSetup]
    public void Setup()
    {
        var mass = EffectiveMass.FromElectronMasses(0.067);
        Layer Slab(double nm, double ev) => Layer.Create(Length.FromNanometres(nm), Energy.FromElectronVolts(ev), mass);
        var lead = Lead.Create(default, mass);
        var diode = LayerStack.Create(lead, lead, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3));
        var superlattice = LayerStack.Periodic(lead, UnitCell.Create(Slab(4, 0), Slab(2, 0.3)), 100, lead);
        var bias = Energy.FromElectronVolts(0.1);
        _doubleBarrier = StackTransmission.Create(diode);
        _doubleBarrierBiased = StackTransmission.Create(diode, bias);
        _superlattice = StackTransmission.Create(superlattice);
        _superlatticeBiased = StackTransmission.Create(superlattice, bias);
    }

    [Benchmark(Baseline = true)]
    public double DoubleBarrier() => _doubleBarrier.Evaluate(0.08).LogTransmission;

    [Benchmark]
    public double DoubleBarrierBiased() => _doubleBarrierBiased.Evaluate(0.08).LogTransmission;

    [Benchmark]
    public double Superlattice100() => _superlattice.Evaluate(0.08).LogTransmission;

    [Benchmark]
    public double Superlattice100Biased() => _superlatticeBiased.Evaluate(0.08).LogTransmission;
}
