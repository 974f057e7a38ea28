// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Structures;

namespace Periodic.Cli.Physics;

/// <summary>
/// The tool's call of the library's band solver (<see cref="BandSolver"/>, which chooses exact or refined per cell), plus the
/// tool's own concern: a warning on stderr when the refinement of smooth segments, or the plane-wave basis of a Fourier cell, did not converge.
/// </summary>
internal static class Solver
{
    public static BandSolution Compute(UnitCell cell, int count)
    {
        // An optical lattice's bands come from plane waves up to the solver's limit; beyond it the library falls back to
        // the refined sampled potential, whose cost grows with the band's energy (n² recoil): minutes a band near 200.
        if (count > SpectralBandStructure.MaxBandCount && cell.Elements is [FourierSegment])
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{count} bands asked of an optical lattice: its bands come from the plane-wave solver, which gives at most {SpectralBandStructure.MaxBandCount}; beyond that the sampled-potential solver would take minutes a band. Ask for at most {SpectralBandStructure.MaxBandCount} bands."));
        }
        return Warn(BandSolver.Compute(cell, count));
    }

    /// <summary>Every band whose bottom lies below <paramref name="energyElectronVolts"/> (at least one).</summary>
    public static BandSolution ComputeBelow(UnitCell cell, double energyElectronVolts) =>
        Warn(BandSolver.ComputeBelow(cell, Periodic.Units.Energy.FromElectronVolts(energyElectronVolts)));

    private static BandSolution Warn(BandSolution solution)
    {
        if (!solution.Converged && solution.Refinement is { } refinement)
        {
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"periodic: warning: the smooth segments did not converge to {refinement.RelativeTolerance:G2} relative; edge errors up to {solution.MaxEdgeErrorElectronVolts:G3} eV."));
        }
        else if (!solution.Converged && solution.Spectral is { } spectral)
        {
            // A Fourier cell (an optical lattice) solved in plane waves: the basis reached its largest size first.
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"periodic: warning: the plane-wave basis ({spectral.BasisSize} waves) did not converge to {spectral.RelativeTolerance:G2} relative; edge errors up to {solution.MaxEdgeErrorElectronVolts:G3} eV ({spectral.MaxRelativeError:G2} relative)."));
        }
        return solution;
    }
}
