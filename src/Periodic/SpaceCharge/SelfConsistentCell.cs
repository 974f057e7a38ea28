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
public sealed class SelfConsistentCell
{
    internal SelfConsistentCell(DopedCell input, UnitCell cell, SpaceChargeOptions options, double[] positions, double[] hartree, double[] density,
        double fermiLevel, double neutralityError, int iterations, double residual, int bands)
    {
        Input = input;
        Cell = cell;
        Options = options;
        var n = hartree.Length;
        var u = new double[n + 1];
        var rho = new double[n + 1];
        Array.Copy(hartree, u, n);
        u[n] = hartree[0]; // periodic: the cell end repeats the start
        for (var i = 0; i < n; i++)
        {
            rho[i] = density[i] * 1e21;
        }
        rho[n] = rho[0];
        PositionsNanometres = new ReadOnlyCollection<double>([.. positions]);
        HartreeElectronVolts = new ReadOnlyCollection<double>(u);
        ElectronDensityPerCubicCentimetre = new ReadOnlyCollection<double>(rho);
        FermiLevelElectronVolts = fermiLevel;
        NeutralityError = neutralityError;
        Iterations = iterations;
        ResidualElectronVolts = residual;
        OccupiedBands = bands;
    }

    /// <summary>The doped cell that was solved.</summary>
    public DopedCell Input { get; }

    /// <summary>The self-consistent cell: each layer a <see cref="SampledSegment"/> of its band edge plus the Hartree potential, delta barriers as given.</summary>
    public UnitCell Cell { get; }

    /// <summary>The options used.</summary>
    public SpaceChargeOptions Options { get; }

    /// <summary>The grid positions from the cell start, nm (the last one is the period).</summary>
    public IReadOnlyList<double> PositionsNanometres { get; }

    /// <summary>The Hartree potential energy U = −eφ of an electron at each position, eV, with zero cell average.</summary>
    public IReadOnlyList<double> HartreeElectronVolts { get; }

    /// <summary>The electron density at each position, cm⁻³.</summary>
    public IReadOnlyList<double> ElectronDensityPerCubicCentimetre { get; }

    /// <summary>The Fermi level μ that neutralises the cell, eV, on the energy scale of <see cref="Cell"/>'s bands.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>|∫n dz − ∫(N_D − N_A)dz − sheets| / (net donors) over one period, on the grid.</summary>
    public double NeutralityError { get; }

    /// <summary>Outer iterations used.</summary>
    public int Iterations { get; }

    /// <summary>The largest change of the Hartree potential in the last iteration, eV (at most the tolerance).</summary>
    public double ResidualElectronVolts { get; }

    /// <summary>Minibands in the carrier quadrature (every band whose bottom lies below μ + 40 k_BT).</summary>
    public int OccupiedBands { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin => Input.Temperature.Kelvin;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Self-consistent cell: converged in {Iterations} iteration(s) (residual {ResidualElectronVolts:G3} eV), mu = {FermiLevelElectronVolts:G10} eV, neutrality error {NeutralityError:G3}, {OccupiedBands} band(s), {PositionsNanometres.Count} grid points");
}
