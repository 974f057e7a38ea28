// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Attributes;
using Periodic.Bands;
using Periodic.SpaceCharge;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Benchmarks;

/// <summary>
/// A 10-layer doped cell (demo scenario of our own: five 6 nm GaAs-like wells between 3 nm barriers whose middles carry
/// 1e18 cm⁻³ donors, at 300 K) solved self-consistently to 1e-9 eV. Baseline: one band solve of the converged (sampled)
/// cell, the Schrödinger part of a single iteration's band search. The same solve to 1e-5 eV runs beside it: allocation
/// per iteration must be the same at both tolerances (no growth with the iteration count). The iteration counts are
/// printed at setup, so time per iteration = mean / iterations.
/// </summary>
[MemoryDiagnoser]
public class SpaceChargeBenchmarks
{
    private DopedCell _doped = null!;
    private UnitCell _converged = null!;
    private static readonly SpaceChargeOptions Tight = SpaceChargeOptions.Create(toleranceElectronVolts: 1e-9);
    private static readonly SpaceChargeOptions Loose = SpaceChargeOptions.Create(toleranceElectronVolts: 1e-5);

    [GlobalSetup]
    public void Setup()
    {
        var elements = new List<CellElement>();
        var doping = new List<LayerDoping>();
        for (var i = 0; i < 5; i++)
        {
            elements.Add(Layer.Create(Length.FromNanometres(6), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067)));
            doping.Add(LayerDoping.Undoped(12.9));
            elements.Add(Layer.Create(Length.FromNanometres(3 + 0.2 * i), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.092)));
            doping.Add(LayerDoping.Create(1e18, 0, 12.2));
        }
        _doped = DopedCell.Create(UnitCell.Create(elements), doping, Temperature.FromKelvin(300));
        var tight = SpaceChargeSolver.Solve(_doped, Tight);
        var loose = SpaceChargeSolver.Solve(_doped, Loose);
        _converged = tight.Cell;
        Console.WriteLine($"// space charge: {tight.Iterations} iterations to 1e-9 eV (residual {tight.ResidualElectronVolts:G3} eV, {tight.OccupiedBands} bands, {tight.PositionsNanometres.Count} grid points); {loose.Iterations} iterations to 1e-5 eV");
    }

    /// <summary>Baseline: the band search of the converged cell (four bands), as one iteration does it.</summary>
    [Benchmark(Baseline = true)]
    public double OneBandSolveOfTheConvergedCell() => BandStructure.Compute(_converged, 4).GetBand(4).TopElectronVolts;

    /// <summary>The whole self-consistent solve to 1e-9 eV.</summary>
    [Benchmark]
    public double SolveTo1e9() => SpaceChargeSolver.Solve(_doped, Tight).FermiLevelElectronVolts;

    /// <summary>The same solve to 1e-5 eV (fewer iterations): compare allocation per iteration with <see cref="SolveTo1e9"/>.</summary>
    [Benchmark]
    public double SolveTo1e5() => SpaceChargeSolver.Solve(_doped, Loose).FermiLevelElectronVolts;
}
