// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Structures;

namespace Periodic.SpaceCharge;

/// <summary>
/// A converged self-consistent solution of a <see cref="DopedCell"/> (from <see cref="SpaceChargeSolver"/>): the cell with
/// the Hartree potential added to each layer as a sampled smooth segment, ready for every band, dispersion, density or
/// Bloch-function computation of the library, with the Fermi level on the same energy scale, the Hartree potential and
/// the electron density on the grid, and how far the iteration got. Immutable; a host keeps and reuses it.
/// </summary>
public sealed class SelfConsistentCell : SelfConsistentSolution
{
    internal SelfConsistentCell(DopedCell input, UnitCell cell, SpaceChargeOptions options, double[] positions, double[] hartree, double[] density,
        double[] holeDensity, double fermiLevel, double neutralityError, int iterations, double residual, int bands, UnitCell[] valenceCells, int[] valenceBands)
        : base(options, [.. positions], Periodic(hartree, 1), Periodic(density, 1e21), Periodic(holeDensity, 1e21), fermiLevel, neutralityError, iterations,
            residual, input.Temperature.Kelvin)
    {
        Input = input;
        Cell = cell;
        OccupiedBands = bands;
        ValenceCells = new ReadOnlyCollection<UnitCell>(valenceCells);
        OccupiedValenceBands = new ReadOnlyCollection<int>(valenceBands);
    }

    /// <summary>The values at the N nodes of one period, scaled, with the period's end repeating its start.</summary>
    private static double[] Periodic(double[] values, double scale)
    {
        var n = values.Length;
        var result = new double[n + 1];
        for (var i = 0; i < n; i++)
        {
            result[i] = values[i] * scale;
        }
        result[n] = result[0];
        return result;
    }

    /// <summary>The doped cell that was solved.</summary>
    public DopedCell Input { get; }

    /// <summary>The self-consistent cell: each layer a <see cref="SampledSegment"/> of its band edge plus the Hartree potential, delta barriers as given.</summary>
    public UnitCell Cell { get; }

    /// <summary>Minibands in the carrier quadrature (every band whose bottom lies below μ + 40 k_BT; the lowest one always).</summary>
    public int OccupiedBands { get; }

    /// <summary>
    /// Per valence band of the input (<see cref="DopedCell.ValenceBands"/>), its self-consistent hole cell: each layer a
    /// <see cref="SampledSegment"/> of its hole potential minus the Hartree energy (hole energies count downwards; on the
    /// electron scale a hole energy E is <see cref="ValenceBand.EdgeElectronVolts"/> − E). Empty for electrons only.
    /// </summary>
    public IReadOnlyList<UnitCell> ValenceCells { get; }

    /// <summary>Per valence band, the hole minibands in the carrier quadrature (every band within 40 k_BT of μ; the highest one always).</summary>
    public IReadOnlyList<int> OccupiedValenceBands { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Self-consistent cell: converged in {Iterations} iteration(s) (residual {ResidualElectronVolts:G3} eV), mu = {FermiLevelElectronVolts:G10} eV, neutrality error {NeutralityError:G3}, {OccupiedBands} band(s){(ValenceCells.Count > 0 ? $", hole bands {string.Join("/", OccupiedValenceBands)}" : "")}, {PositionsNanometres.Count} grid points");
}
