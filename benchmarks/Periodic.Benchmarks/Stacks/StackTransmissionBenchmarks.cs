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
