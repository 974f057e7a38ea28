// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Physics;

/// <summary>
/// Chooses the band solver: cells of layers and deltas are solved exactly by <see cref="BandStructure"/>;
/// cells with smooth segments go through <see cref="RefinedBandStructure"/>, which halves the Magnus steps
/// until every edge meets the relative tolerance, so the tool never reports a discretised answer as exact.
/// </summary>
internal static class Solver
{
    public sealed record Result(BandStructure Bands, double MaxEdgeErrorElectronVolts, bool Refined, bool Converged, long MagnusSteps);

    public static bool HasSmoothSegments(UnitCell cell) => cell.Elements.Any(e => e is not Layer and not DeltaBarrier);

    /// <summary>The lowest <paramref name="count"/> bands; <paramref name="quiet"/> leaves the non-convergence warning to the caller.</summary>
    public static Result Compute(UnitCell cell, int count, bool quiet = false)
    {
        if (!HasSmoothSegments(cell))
        {
            var exact = BandStructure.Compute(cell, count);
            return new Result(exact, exact.MaxEdgeErrorElectronVolts, false, true, 0);
        }
        var refined = RefinedBandStructure.Compute(cell, count);
        if (!refined.Converged && !quiet)
        {
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"periodic: warning: the smooth segments did not converge to {refined.RelativeTolerance:G2} relative; edge errors up to {refined.MaxEdgeErrorElectronVolts:G3} eV."));
        }
        return new Result(refined.Structure, refined.MaxEdgeErrorElectronVolts, true, refined.Converged, refined.MagnusStepCount);
    }

    /// <summary>Every band whose bottom lies below <paramref name="energyElectronVolts"/> (at least one).</summary>
    public static Result ComputeBelow(UnitCell cell, double energyElectronVolts)
    {
        var coarse = BandStructure.ComputeBelow(cell, Energy.FromElectronVolts(energyElectronVolts));
        return HasSmoothSegments(cell) ? Compute(cell, coarse.Bands.Count) : new Result(coarse, coarse.MaxEdgeErrorElectronVolts, false, true, 0);
    }
}
