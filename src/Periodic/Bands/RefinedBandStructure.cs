// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Structures;
using Periodic.Units;
using Periodic.Numerics;

namespace Periodic.Bands;

/// <summary>
/// Band structure of a cell with smooth segments, computed to a requested accuracy: the Magnus steps of
/// every smooth segment are halved until the band edges converge, with an error estimate per edge.
/// Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Method: step halving with Richardson's error estimate (L. F. Richardson, Phil. Trans. R. Soc. A
/// 210, 307 (1911)). The fourth-order Magnus scheme is time-symmetric, so an edge computed with steps h
/// behaves as E(h) = E + c₄h⁴ + c₆h⁶ + …; the error of E(h/2) is then estimated as
/// |E(h) − E(h/2)|/15. The estimate is used only once three successive levels show the h⁴ ratio
/// (differences shrinking by a factor 8 to 32); before that the whole difference |E(h) − E(h/2)| is taken as
/// the error, which overstates it. A safety factor 2 is applied to the asymptotic estimate. The band-edge
/// search error (<see cref="Band.BottomErrorElectronVolts"/>) and a rounding bound 4ε√N·max|M|/|D′| are added; refinement
/// stops for an edge once the change between meshes falls below that rounding bound.</para>
/// <para>The edges returned are those of <see cref="Structure"/>, the band structure on the finest mesh, so that
/// E(k), k(E) and every derived quantity come from the same, stated-accuracy model. The error is that of
/// solving the segments as given: a <see cref="SampledSegment"/> is solved as its piecewise-linear
/// interpolant, and the distance of that interpolant from the true profile is not part of the estimate.</para>
/// <para>Tolerance: an edge E has converged when its error estimate is at most
/// relativeTolerance × max(|E|, S), with the energy scale S = max(V_max − V_min, C·(π/d)²/m_min).</para>
/// </remarks>
public sealed class RefinedBandStructure
{
    private const double SafetyFactor = 2.0;

    private readonly double[] _errors;

    private RefinedBandStructure(BandStructure bands, double[] errors, double relativeTolerance, int refinements, bool converged, bool roundingLimited, long steps, double scale)
    {
        Structure = bands;
        _errors = errors;
        EdgeErrorsElectronVolts = new ReadOnlyCollection<double>(errors);
        RelativeTolerance = relativeTolerance;
        Refinements = refinements;
        Converged = converged;
        RoundingLimited = roundingLimited;
        MagnusStepCount = steps;
        EnergyScaleElectronVolts = scale;
    }

    /// <summary>The band structure on the finest mesh.</summary>
    public BandStructure Structure { get; }

    /// <summary>Estimated error of each edge, eV: entry 2(n − 1) is the bottom of band n, entry 2n − 1 its top.</summary>
    public IReadOnlyList<double> EdgeErrorsElectronVolts { get; }

    /// <summary>The largest estimated edge error, eV.</summary>
    public double MaxEdgeErrorElectronVolts => _errors.Max();

    /// <summary>The largest estimated edge error relative to max(|E|, <see cref="EnergyScaleElectronVolts"/>).</summary>
    public double MaxRelativeError => Structure.MaxRelativeEdgeError(_errors, EnergyScaleElectronVolts);

    /// <summary>The relative tolerance requested.</summary>
    public double RelativeTolerance { get; }

    /// <summary>How many times the steps were halved.</summary>
    public int Refinements { get; }

    /// <summary>True when every edge met the tolerance; false when the refinement budget or step limit ran out first.</summary>
    public bool Converged { get; }

    /// <summary>
    /// True when refinement stopped because the change between meshes had reached the rounding level of some
    /// edge that still misses the tolerance (typically the edges of a nearly closed gap, where D′ is small);
    /// the errors reported for those edges are their rounding bounds.
    /// </summary>
    public bool RoundingLimited { get; }

    /// <summary>Total Magnus steps over the cell on the finest mesh.</summary>
    public long MagnusStepCount { get; }

    /// <summary>The energy scale S of the tolerance test, eV.</summary>
    public double EnergyScaleElectronVolts { get; }

    /// <summary>Computes the lowest <paramref name="count"/> bands of <paramref name="cell"/> to the tolerance of <paramref name="options"/>.</summary>
    /// <param name="cell">The cell; its smooth segments (Fourier, function, sampled) are refined, its layers and deltas are exact.</param>
    /// <param name="count">Number of bands, 1 to 10,000.</param>
    /// <param name="options">Tolerance and budget; null means <see cref="RefinementOptions.Default"/>.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="count"/> lies outside its range.</exception>
    /// <exception cref="BandSearchException">A band search could not complete.</exception>
    public static RefinedBandStructure Compute(UnitCell cell, int count, RefinementOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(count, 1, 10000);
        options ??= RefinementOptions.Default;
        var relativeTolerance = options.RelativeTolerance;
        var maxRefinements = options.MaxRefinements;
        var k = cell.ZoneBoundaryPerNanometre;
        var scale = Math.Max(cell.MaximumPotential.ElectronVolts - cell.MinimumPotential.ElectronVolts,
            PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * k * k / cell.MinimumMass.ElectronMasses);
        // The search must resolve far below the requested tolerance, on the energy scale of this cell (which
        // for an atom in an optical lattice is ~1e-11 eV, far from the eV default).
        var search = BandSearchOptions.Create(Math.Min(1e-14, relativeTolerance * 1e-2),
            Math.Clamp(1e-3 * relativeTolerance * scale, 1e-300, 1.0));
        var current = BandStructure.Compute(cell, count, search);
        if (!cell.Elements.Any(e => e is IMeshedSegment))
        {
            return new RefinedBandStructure(current, SearchErrors(current), relativeTolerance, 0, true, false, 0, scale);
        }
        var previousDifferences = new double[2 * count];
        var errors = new double[2 * count];
        for (var level = 1; level <= maxRefinements; level++)
        {
            var refined = Refine(cell);
            if (ReferenceEquals(refined, cell))
            {
                break; // every segment is at its step limit
            }
            cell = refined;
            var next = BandStructure.Compute(cell, count, search);
            var steps = StepCount(cell);
            var settled = true;
            var roundingLimited = false;
            var converged = true;
            for (var i = 0; i < 2 * count; i++)
            {
                double before = Edge(current, i), after = Edge(next, i);
                var difference = Math.Abs(after - before);
                var ratio = previousDifferences[i] / difference;
                var asymptotic = level >= 2 && ratio >= 8 && ratio <= 32;
                var discretisation = asymptotic ? SafetyFactor * difference / 15 : difference;
                var rounding = RoundingFloor(next.Transfer, i, after, steps, SearchError(next, i));
                errors[i] = discretisation + rounding + SearchError(next, i);
                var target = relativeTolerance * Math.Max(Math.Abs(after), scale);
                converged &= errors[i] <= target;
                // Halving further cannot help once the change between meshes is at the rounding level.
                var limited = difference <= rounding;
                roundingLimited |= limited && errors[i] > target;
                settled &= errors[i] <= target || limited;
                previousDifferences[i] = difference;
            }
            current = next;
            ClosedGapBounds(current, errors, scale);
            if (settled)
            {
                return new RefinedBandStructure(current, errors, relativeTolerance, level, converged, roundingLimited, steps, scale);
            }
        }
        ClosedGapBounds(current, errors, scale);
        return new RefinedBandStructure(current, errors, relativeTolerance, maxRefinements, false, false, StepCount(cell), scale);
    }

    /// <summary>
    /// Rounding level of an edge: the trace D is summed over N steps with rounding ~√N·ε·max|M|, and an
    /// edge moves by that over |D′|. Large where a gap nearly closes (D′ small at its edges).
    /// </summary>
    private static double RoundingFloor(Periodic.Transfer.CellTransfer transfer, int edgeIndex, double edge, long steps, double searchError)
    {
        var product = transfer.Accumulate(edge);
        var root = 4 * FloatingPoint.MachineEpsilon * Math.Sqrt(steps + 1.0);
        if (product.LogScale < 700)
        {
            var scale = Math.Exp(product.LogScale);
            var target = BandEdgeFinder.TargetTrace(edgeIndex);
            if (product.TryShiftedTrace(scale, target, out _, out var detSlope) && Math.Abs(detSlope) > 0)
            {
                // The edge is found from det(M ∓ I), whose rounding is ε|M ∓ I|.
                var sign = target > 0 ? 1.0 : -1.0;
                var n = Math.Max(Math.Max(Math.Abs(product.P11 * scale - sign), Math.Abs(product.P22 * scale - sign)),
                    Math.Sqrt(Math.Abs(product.P12 * product.P21)) * scale);
                return root * Math.Max(n, FloatingPoint.MachineEpsilon) / Math.Abs(detSlope);
            }
        }
        var slope = Math.Abs(product.TraceDerivativeMantissa);
        // Unit-balanced size of M: M12 and M21 carry reciprocal units.
        var entries = Math.Max(Math.Max(Math.Abs(product.P11), Math.Abs(product.P22)), Math.Sqrt(Math.Abs(product.P12 * product.P21)));
        if (!(slope > 0))
        {
            return searchError; // a closed gap: the search reports its own bound there
        }
        return root * entries / slope;
    }

    /// <summary>
    /// A gap reported closed may be open by less than the trace resolves: |D| − 2 ≤ T = 64ε·max(|M|, 2) at its
    /// centre. With D ≈ ±2 ± c(E − E₀)² there, its half-width is at most √(T/c); that bound (doubled) is
    /// added to the edges beside a closed gap. c comes from a central difference of D′.
    /// </summary>
    private static void ClosedGapBounds(BandStructure bands, double[] errors, double scale)
    {
        for (var n = 1; n <= bands.Gaps.Count; n++)
        {
            var gap = bands.Gaps[n - 1];
            if (!gap.IsClosed)
            {
                continue;
            }
            var centre = 0.5 * (gap.LowerElectronVolts + gap.UpperElectronVolts);
            var h = 1e-6 * Math.Max(Math.Abs(centre), scale);
            var slopeAbove = bands.Transfer.Dispersion(centre + h).TraceDerivativePerElectronVolt;
            var slopeBelow = bands.Transfer.Dispersion(centre - h).TraceDerivativePerElectronVolt;
            var curvature = Math.Abs(slopeAbove - slopeBelow) / (4 * h);
            var matrix = bands.Transfer.Evaluate(centre);
            var threshold = 64 * FloatingPoint.MachineEpsilon * Math.Max(matrix.Mantissa.MaxAbsEntry * Math.Exp(matrix.LogScale), 2.0); // as the edge finder's closed-gap test
            var bound = curvature > 0 ? 2 * Math.Sqrt(threshold / curvature) : Math.Abs(gap.UpperElectronVolts - gap.LowerElectronVolts) + h;
            foreach (var i in new[] { 2 * n - 1, 2 * n })
            {
                if (i < errors.Length)
                {
                    errors[i] = Math.Max(errors[i], bound);
                }
            }
        }
    }

    private static double Edge(BandStructure bands, int i)
    {
        var band = bands.GetBand(i / 2 + 1);
        return i % 2 == 0 ? band.BottomElectronVolts : band.TopElectronVolts;
    }

    private static double SearchError(BandStructure bands, int i)
    {
        var band = bands.GetBand(i / 2 + 1);
        return i % 2 == 0 ? band.BottomErrorElectronVolts : band.TopErrorElectronVolts;
    }

    private static double[] SearchErrors(BandStructure bands)
    {
        var errors = new double[2 * bands.Bands.Count];
        for (var i = 0; i < errors.Length; i++)
        {
            errors[i] = SearchError(bands, i);
        }
        return errors;
    }

    /// <summary>The cell with every smooth segment's steps halved; the same instance when every segment is at its step limit.</summary>
    internal static UnitCell Refine(UnitCell cell)
    {
        var changed = false;
        var elements = new CellElement[cell.Elements.Count];
        for (var i = 0; i < elements.Length; i++)
        {
            var element = cell.Elements[i];
            if (element is IMeshedSegment segment)
            {
                var refined = segment.Refined();
                changed |= !ReferenceEquals(refined, element);
                elements[i] = refined;
            }
            else
            {
                elements[i] = element;
            }
        }
        return changed ? UnitCell.Create(elements) : cell;
    }

    private static long StepCount(UnitCell cell) =>
        cell.Elements.OfType<IMeshedSegment>().Sum(s => (long)s.Samples.StepCount);

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"RefinedBandStructure: {(Converged ? "converged" : RoundingLimited ? "rounding-limited" : "NOT converged")} to relative {MaxRelativeError:G3} (requested {RelativeTolerance:G3}) after {Refinements} halving(s), {MagnusStepCount} Magnus steps").AppendLine();
        text.Append(Structure.ToString());
        return text.ToString();
    }
}
