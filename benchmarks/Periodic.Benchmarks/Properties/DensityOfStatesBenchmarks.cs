// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Benchmarks.Properties;

/// <summary>
/// Cost of derived quantities on a span of 1,024 energies, against the bare trace evaluation
/// D(E) of the same energies (baseline): the DOS and IDOS should stay within a small factor of it.
/// </summary>
[MemoryDiagnoser]
public class DensityOfStatesBenchmarks
{
    private readonly double[] _energies = new double[1024];
    private readonly double[] _destination = new double[1024];
    private CellTransfer _transfer = null!;
    private BandProperties _properties = null!;

    /// <summary>A 5 nm / 2 nm, 0.25 eV superlattice with four bands (demo structure).</summary>
    [GlobalSetup]
    public void Setup()
    {
        var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25),
            EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));
        var structure = BandStructure.Compute(cell, 4);
        _transfer = structure.Transfer;
        _properties = BandProperties.Create(structure);
        var low = structure.GetBand(1).BottomElectronVolts;
        var high = _properties.UpperEnergyLimitElectronVolts;
        for (var i = 0; i < _energies.Length; i++)
        {
            _energies[i] = low + (i + 0.5) / _energies.Length * (high - low);
        }
    }

    /// <summary>D(E) on the span (baseline).</summary>
    [Benchmark(Baseline = true)]
    public void Traces() => _transfer.Traces(_energies, _destination);

    /// <summary>1D density of states on the span.</summary>
    [Benchmark]
    public void DensitiesOfStates() => _properties.DensitiesOfStates(_energies, _destination);

    /// <summary>Integrated density of states on the span.</summary>
    [Benchmark]
    public void IntegratedDensitiesOfStates() => _properties.IntegratedDensitiesOfStates(_energies, _destination);
}
