// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Benchmarks;

/// <summary>
/// The cells the benchmarks use: a demo superlattice of our own (5 nm wells, 2 nm barriers of 0.3 eV,
/// masses 0.067 and 0.088 m0 — GaAs-like numbers, not a calibrated material model).
/// </summary>
internal static class Scenarios
{
    internal const double WellNanometres = 5.0;
    internal const double BarrierNanometres = 2.0;
    internal const double BarrierElectronVolts = 0.3;
    internal const double WellMass = 0.067;
    internal const double BarrierMass = 0.088;

    /// <summary>The repository's root (the folder holding Periodic.sln), found above this assembly's folder.</summary>
    internal static string RepositoryRoot { get; } = FindRoot();

    internal static UnitCell KronigPenney(double barrierNanometres = BarrierNanometres) =>
        UnitCell.KronigPenney(Length.FromNanometres(WellNanometres), Length.FromNanometres(barrierNanometres),
            Energy.FromElectronVolts(BarrierElectronVolts), EffectiveMass.FromElectronMasses(WellMass), EffectiveMass.FromElectronMasses(BarrierMass));

    internal static NaiveKronigPenney Naive(double barrierNanometres = BarrierNanometres) =>
        new(WellNanometres, barrierNanometres, BarrierElectronVolts, WellMass, BarrierMass);

    /// <summary>Period of the graded cell of <see cref="Stack"/>, nm.</summary>
    internal const double GradedPeriodNanometres = 8.0;

    /// <summary>
    /// A graded superlattice cell of <paramref name="layers"/> equal layers: a 4 nm well, a 0.6 nm linear
    /// ramp up to a barrier of 0.3 eV, 2.8 nm of barrier and a 0.6 nm ramp down (mass graded with the
    /// potential from 0.067 to 0.088 m0), sampled at the middle of each layer — the staircase a sampled
    /// profile turns into. The same physics at every layer count, so the number of band-edge iterations
    /// stays the same and only the cost of one transfer-matrix product grows.
    /// </summary>
    internal static UnitCell Stack(int layers)
    {
        var widths = new double[layers];
        var potentials = new double[layers];
        var masses = new double[layers];
        var width = GradedPeriodNanometres / layers;
        for (var i = 0; i < layers; i++)
        {
            var x = (i + 0.5) * width;
            var fraction = x < 4.0 ? 0.0 : x < 4.6 ? (x - 4.0) / 0.6 : x < 7.4 ? 1.0 : (8.0 - x) / 0.6;
            widths[i] = width;
            potentials[i] = BarrierElectronVolts * fraction;
            masses[i] = WellMass + (BarrierMass - WellMass) * fraction;
        }
        return UnitCell.FromLayers(widths, potentials, masses);
    }

    /// <summary>Evenly spaced values from <paramref name="first"/> to <paramref name="last"/> inclusive.</summary>
    internal static double[] Grid(double first, double last, int count)
    {
        var values = new double[count];
        for (var i = 0; i < count; i++)
        {
            values[i] = first + (last - first) * i / (count - 1);
        }
        return values;
    }

    private static string FindRoot()
    {
        var directory = new DirectoryInfo(AppContext.BaseDirectory);
        while (directory is not null && !File.Exists(Path.Combine(directory.FullName, "Periodic.sln")))
        {
            directory = directory.Parent;
        }
        return directory?.FullName ?? throw new InvalidOperationException("repository root (Periodic.sln) not found above " + AppContext.BaseDirectory);
    }
}
