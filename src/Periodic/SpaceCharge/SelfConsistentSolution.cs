// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;

namespace Periodic.SpaceCharge;

/// <summary>
/// What every converged self-consistent solution reports (<see cref="SelfConsistentCell"/>, <see cref="SelfConsistentStack"/>):
/// the Fermi level, the Hartree potential and the electron and hole densities on the grid, and how far the iteration got. Immutable.
/// </summary>
public abstract class SelfConsistentSolution
{
    private protected SelfConsistentSolution(SpaceChargeOptions options, double[] positions, double[] hartree, double[] densityPerCubicCentimetre,
        double[] holeDensityPerCubicCentimetre, double fermiLevel, double neutralityError, int iterations, double residual, double temperatureKelvin)
    {
        Options = options;
        PositionsNanometres = new ReadOnlyCollection<double>(positions);
        HartreeElectronVolts = new ReadOnlyCollection<double>(hartree);
        ElectronDensityPerCubicCentimetre = new ReadOnlyCollection<double>(densityPerCubicCentimetre);
        HoleDensityPerCubicCentimetre = new ReadOnlyCollection<double>(holeDensityPerCubicCentimetre);
        FermiLevelElectronVolts = fermiLevel;
        NeutralityError = neutralityError;
        Iterations = iterations;
        ResidualElectronVolts = residual;
        TemperatureKelvin = temperatureKelvin;
    }

    /// <summary>The options used.</summary>
    public SpaceChargeOptions Options { get; }

    /// <summary>The grid positions, nm (a cell: from its start, the last one the period; a stack: from its rigid left interface).</summary>
    public IReadOnlyList<double> PositionsNanometres { get; }

    /// <summary>The Hartree potential energy U = −eφ of an electron at each position, eV (a cell: zero average; a stack: zero at the outer end of its left buffer).</summary>
    public IReadOnlyList<double> HartreeElectronVolts { get; }

    /// <summary>The electron density at each position, cm⁻³.</summary>
    public IReadOnlyList<double> ElectronDensityPerCubicCentimetre { get; }

    /// <summary>The hole density at each position, summed over the valence bands, cm⁻³ (zero everywhere when no valence band is modelled).</summary>
    public IReadOnlyList<double> HoleDensityPerCubicCentimetre { get; }

    /// <summary>The Fermi level μ that neutralises the cell or domain, eV, on the energy scale of the solution's bands or levels.</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>|∫(p − n)dz + ∫(N_D⁺ − N_A⁻)dz + sheets| / ∫(n + p)dz over one period or the whole domain, on the grid.</summary>
    public double NeutralityError { get; }

    /// <summary>Outer iterations used.</summary>
    public int Iterations { get; }

    /// <summary>The largest change of the Hartree potential in the last iteration, eV (at most the tolerance).</summary>
    public double ResidualElectronVolts { get; }

    /// <summary>The temperature, K.</summary>
    public double TemperatureKelvin { get; }
}
