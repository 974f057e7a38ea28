// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Bands;

/// <summary>The method a <see cref="BandSolver"/> chose for a cell.</summary>
public enum BandSolverMethod
{
    /// <summary>Layers and delta barriers only: closed-form transfer matrices, no discretisation (<see cref="BandStructure.Compute(UnitCell, int, BandSearchOptions?)"/>).</summary>
    Exact,

    /// <summary>Smooth segments present: Magnus steps halved until the edges converge (<see cref="RefinedBandStructure"/>).</summary>
    Refined,

    /// <summary>One Fourier-series segment (optical and Mathieu lattices): edges from an exponentially convergent plane-wave
    /// basis with a Rayleigh–Ritz step (<see cref="SpectralBandStructure"/>).</summary>
    Spectral,
}

/// <summary>
/// The band structure of any cell the library can describe, with the solver chosen by the cell: the library's main entry
/// point for band structures. Cells of uniform layers and delta barriers are solved exactly
/// (<see cref="BandStructure.Compute(UnitCell, int, BandSearchOptions?)"/>); cells with smooth segments (Fourier, function,
/// sampled) through <see cref="RefinedBandStructure"/>, so that no discretised answer is reported as exact. The result
/// states the method and every error source: the root finding of the edges and the discretisation of smooth segments.
/// </summary>
public static class BandSolver
{
    /// <summary>Computes the lowest <paramref name="count"/> bands of <paramref name="cell"/>.</summary>
    /// <param name="cell">The cell.</param>
    /// <param name="count">Number of bands, 1 to 10,000.</param>
    /// <param name="options">For smooth segments that the plane-wave method does not take: tolerance and budget of the
    /// refinement (<see cref="RefinementOptions.Default"/> when null); cells without segments are solved to the band search's
    /// own tolerances.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range.</exception>
    /// <exception cref="BandSearchException">A band search could not complete.</exception>
    public static BandSolution Compute(UnitCell cell, int count, RefinementOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(count, 1, 10000);
        if (!HasSmoothSegments(cell))
        {
            var exact = BandStructure.Compute(cell, count);
            return new BandSolution(exact, BandSolverMethod.Exact, exact.MaxEdgeErrorElectronVolts, 0, true, null);
        }
        if (SpectralBandStructure.AppliesTo(cell, count))
        {
            // The truncation error of the basis is the discretisation error of this method; the edges are eigenvalues, so
            // there is no separate root-finding error.
            var spectral = SpectralBandStructure.Compute(cell, count);
            return new BandSolution(spectral.Bands, BandSolverMethod.Spectral, 0, spectral.MaxEdgeErrorElectronVolts, spectral.Converged, null)
            {
                Spectral = spectral,
            };
        }
        var refined = RefinedBandStructure.Compute(cell, count, options ?? RefinementOptions.Default);
        return FromRefined(refined);
    }

    /// <summary>Computes every band whose bottom lies below <paramref name="energyLimit"/> (at least one band).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <param name="cell">The cell.</param>
    /// <param name="energyLimit">Every band whose bottom lies below this energy.</param>
    /// <param name="options">As for <see cref="Compute"/>.</param>
    /// <exception cref="ArgumentOutOfRangeException">More than 10,000 bands lie below the limit, or the limit is outside the
    /// model's energy range.</exception>
    /// <exception cref="BandSearchException">A band search could not complete.</exception>
    public static BandSolution ComputeBelow(UnitCell cell, Energy energyLimit, RefinementOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        var coarse = BandStructure.ComputeBelow(cell, energyLimit);
        return HasSmoothSegments(cell)
            ? Compute(cell, coarse.Bands.Count, options)
            : new BandSolution(coarse, BandSolverMethod.Exact, coarse.MaxEdgeErrorElectronVolts, 0, true, null);
    }

    private static bool HasSmoothSegments(UnitCell cell)
    {
        foreach (var element in cell.ElementSpan)
        {
            if (element is IMeshedSegment)
            {
                return true;
            }
        }
        return false;
    }

    private static BandSolution FromRefined(RefinedBandStructure refined)
    {
        // Each edge error of the refinement is discretisation + rounding + search error; the search error is the band's own.
        var bands = refined.Structure;
        double search = 0, discretisation = 0;
        for (var i = 0; i < refined.EdgeErrorsElectronVolts.Count; i++)
        {
            var band = bands.GetBand(i / 2 + 1);
            var edgeSearch = i % 2 == 0 ? band.BottomErrorElectronVolts : band.TopErrorElectronVolts;
            search = Math.Max(search, edgeSearch);
            discretisation = Math.Max(discretisation, Math.Max(0, refined.EdgeErrorsElectronVolts[i] - edgeSearch));
        }
        return new BandSolution(bands, BandSolverMethod.Refined, search, discretisation, refined.Converged, refined);
    }
}

/// <summary>
/// A band structure with the method that produced it and its error budget (from <see cref="BandSolver"/>). Immutable.
/// </summary>
public sealed class BandSolution
{
    internal BandSolution(BandStructure bands, BandSolverMethod method, double rootFinding, double discretisation, bool converged, RefinedBandStructure? refinement)
    {
        Structure = bands;
        Method = method;
        MaxRootFindingErrorElectronVolts = rootFinding;
        MaxDiscretisationErrorElectronVolts = discretisation;
        Converged = converged;
        Refinement = refinement;
    }

    /// <summary>The band structure (for smooth segments, the one on the finest mesh).</summary>
    public BandStructure Structure { get; }

    /// <summary>The method chosen for the cell.</summary>
    public BandSolverMethod Method { get; }

    /// <summary>The largest error bound of the edge searches (root finding and the rounding of D), eV.</summary>
    public double MaxRootFindingErrorElectronVolts { get; }

    /// <summary>
    /// The largest estimated discretisation error of an edge (with the mesh's rounding level), eV: 0 for
    /// <see cref="BandSolverMethod.Exact"/>; for <see cref="BandSolverMethod.Refined"/> the Richardson estimate of the
    /// finest mesh. A <see cref="SampledSegment"/> is solved as its piecewise-linear interpolant, which this does not cover.
    /// </summary>
    public double MaxDiscretisationErrorElectronVolts { get; }

    /// <summary>A bound on the error of any edge, eV: for exact cells the search bound, for refined cells the largest summed
    /// edge error of the refinement (search, rounding and discretisation of the same edge).</summary>
    public double MaxEdgeErrorElectronVolts => Refinement?.MaxEdgeErrorElectronVolts ?? Spectral?.MaxEdgeErrorElectronVolts ?? MaxRootFindingErrorElectronVolts;

    /// <summary>True unless the refinement ran out of halvings or steps before every edge met its tolerance.</summary>
    public bool Converged { get; }

    /// <summary>The refinement record (levels, per-edge errors, Magnus steps) for <see cref="BandSolverMethod.Refined"/>; null otherwise.</summary>
    public RefinedBandStructure? Refinement { get; }

    /// <summary>The plane-wave record (basis size, per-edge errors) for <see cref="BandSolverMethod.Spectral"/>; null otherwise.</summary>
    public SpectralBandStructure? Spectral { get; internal init; }

    /// <summary>Total Magnus steps of the finest mesh; 0 for exact cells.</summary>
    public long MagnusStepCount => Refinement?.MagnusStepCount ?? 0;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{Structure.Bands.Count} band(s), {Method}: root finding ≤ {MaxRootFindingErrorElectronVolts:G3} eV, discretisation ≤ {MaxDiscretisationErrorElectronVolts:G3} eV{(Converged ? "" : " (not converged)")}");
}
