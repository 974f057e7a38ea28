// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Numerics;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Bands;

/// <summary>
/// Locates band edges e₀ &lt; e₁ ≤ e₂ &lt; e₃ ≤ … of a cell. Brackets come from the oscillation count
/// (<see cref="CellTransfer.CountBandEdgesBelow"/>), never from a scan of D(E), so no band can be
/// missed however narrow: an interval is split until it holds at most two edges, and then
/// <list type="bullet">
/// <item>one edge, or the two edges of one band (different targets D = ±2), is refined by a
/// safeguarded Newton search on D(E) ∓ 2 with the exact derivative;</item>
/// <item>the two edges of one gap (same target) are separated at the extremum of D, the single zero of
/// D′ in the closed gap; if |D| does not exceed 2 there beyond rounding, the gap is closed.</item>
/// </list>
/// </summary>
internal sealed class BandEdgeFinder
{
    private readonly CellTransfer _transfer;
    private readonly BandSearchOptions _options;

    internal BandEdgeFinder(CellTransfer transfer, BandSearchOptions options)
    {
        _transfer = transfer;
        _options = options;
    }

    /// <summary>Target value of D at edge i: +2 at zone-centre edges (i = 0, 3, 4, 7, 8, …), −2 at zone-boundary edges.</summary>
    internal static double TargetTrace(int edgeIndex) => ((edgeIndex + 1) / 2) % 2 == 0 ? 2.0 : -2.0;

    /// <summary>
    /// Finds edges 0 … edges.Length − 1 into <paramref name="edges"/> with their error bounds in
    /// <paramref name="errors"/> (same length), and marks in <paramref name="closedAbove"/>
    /// (length (edges.Length + 1) / 2 + 1, cleared) whether each odd-even gap pair (e_{2j−1}, e_{2j}) is closed.
    /// The caller supplies the buffers so that a small search allocates nothing.
    /// </summary>
    internal void FindEdges(Span<double> edges, Span<double> errors, Span<bool> closedAbove)
    {
        var edgeCount = edges.Length;
        errors.Fill(double.NaN); // NaN: not found yet (a stored bound is never NaN)
        var sink = new EdgeSink(edges, errors);

        var (low, high) = InitialInterval(edgeCount);
        // Depth-first bisection; the pending intervals fit on the stack for any realistic search (one per
        // bisection level), and spill to the heap only beyond that.
        var stack = new IntervalStack(stackalloc Interval[64]);
        stack.Push(new Interval(low, 0, high, _transfer.CountBandEdgesBelow(high)));
        while (stack.Count > 0)
        {
            var (a, ca, b, cb) = stack.Pop();
            if (ca >= edgeCount || cb <= ca)
            {
                continue;
            }
            var width = b - a;
            var resolution = 4 * Math.Max(_options.AbsoluteToleranceElectronVolts, FloatingPoint.MachineEpsilon * Math.Max(Math.Abs(a), Math.Abs(b)));
            if (width <= resolution)
            {
                // Several edges closer together than double precision resolves: a degenerate cluster.
                var mid = 0.5 * (a + b);
                for (var i = ca; i < cb && i < edgeCount; i++)
                {
                    sink.Store(i, mid, width);
                    if (i % 2 == 1 && i + 1 < cb)
                    {
                        closedAbove[(i + 1) / 2] = true;
                    }
                }
                continue;
            }
            if (cb - ca == 1)
            {
                RefineInto(ref sink, ca, a, b);
                continue;
            }
            if (cb - ca == 2 && ca % 2 == 0)
            {
                RefineInto(ref sink, ca, a, b);
                RefineInto(ref sink, ca + 1, a, b);
                continue;
            }
            if (cb - ca == 2 && TrySeparateGapPair(ca, a, b, out var extremum, out var closed, out var closedError))
            {
                if (closed)
                {
                    var error = closedError;
                    sink.Store(ca, extremum, error);
                    sink.Store(ca + 1, extremum, error);
                    closedAbove[(ca + 1) / 2] = true;
                }
                else if (TryRefineNarrowPair(ca, a, extremum, b, out var lowerRoot, out var upperRoot))
                {
                    sink.Store(ca, lowerRoot.Root, lowerRoot.ErrorBound);
                    sink.Store(ca + 1, upperRoot.Root, upperRoot.ErrorBound);
                }
                else
                {
                    RefineInto(ref sink, ca, a, extremum);
                    RefineInto(ref sink, ca + 1, extremum, b);
                }
                continue;
            }
            var middle = 0.5 * (a + b);
            var cm = _transfer.CountBandEdgesBelow(middle);
            // The count is monotone; rounding right at an edge can only shift it by one, so keep it in range.
            cm = Math.Clamp(cm, ca, cb);
            stack.Push(new Interval(middle, cm, b, cb));
            stack.Push(new Interval(a, ca, middle, cm));
        }
        for (var i = 0; i < edgeCount; i++)
        {
            if (double.IsNaN(errors[i]))
            {
                throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                    $"band edge {i} was not located in [{low:R}, {high:R}] eV; the oscillation count and the edge search disagree."));
            }
        }
        // Rounding can leave a coincident pair in the wrong order; edges are sorted by definition.
        edges.Sort(errors);
    }

    private void RefineInto(ref EdgeSink sink, int index, double lower, double upper)
    {
        if (index >= sink.Count)
        {
            return;
        }
        var result = RefineEdge(index, lower, upper);
        sink.Store(index, result.Root, result.ErrorBound);
    }

    /// <summary>Where found edges go: energies and error bounds by edge index; indices beyond the count are ignored.</summary>
    private readonly ref struct EdgeSink(Span<double> edges, Span<double> errors)
    {
        private readonly Span<double> _edges = edges;
        private readonly Span<double> _errors = errors;

        public int Count => _edges.Length;

        public void Store(int index, double energy, double error)
        {
            if (index < _edges.Length)
            {
                _edges[index] = energy;
                _errors[index] = error;
            }
        }
    }

    /// <summary>An energy interval [A, B] with the oscillation counts at its ends.</summary>
    internal readonly record struct Interval(double A, int CountA, double B, int CountB);

    /// <summary>A last-in-first-out store of intervals on a caller-supplied buffer, moved to the heap when full.</summary>
    internal ref struct IntervalStack(Span<Interval> buffer)
    {
        private Span<Interval> _items = buffer;

        public int Count { get; private set; }

        public void Push(Interval item)
        {
            if (Count == _items.Length)
            {
                var larger = new Interval[2 * _items.Length];
                _items.CopyTo(larger);
                _items = larger;
            }
            _items[Count++] = item;
        }

        public Interval Pop() => _items[--Count];
    }

    /// <summary>An interval [low, high] with no edge below low and at least <paramref name="edgeCount"/> edges below high.</summary>
    private (double Low, double High) InitialInterval(int edgeCount)
    {
        var cell = _transfer.Cell;
        var vMin = cell.MinimumPotential.ElectronVolts;
        var vMax = cell.MaximumPotential.ElectronVolts;
        var spread = Math.Max(vMax - vMin, 1e-3);
        var step = 1e-6 * spread;
        var low = vMin - step;
        for (var attempt = 0; ; attempt++)
        {
            if (low <= _transfer.LowestValidEnergyElectronVolts)
            {
                low = _transfer.LowestValidEnergyElectronVolts + 1e-9 * spread;
                if (_transfer.CountBandEdgesBelow(low) != 0)
                {
                    throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                        $"states exist below {low:R} eV, where a non-parabolic mass would turn negative; the model does not apply there."));
                }
                break;
            }
            if (_transfer.CountBandEdgesBelow(low) == 0)
            {
                break;
            }
            if (attempt > 2000)
            {
                throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                    $"no energy without states found down to {low:R} eV."));
            }
            step *= 2; // delta wells bind below the lowest layer potential
            low = vMin - step;
        }

        // Free-particle estimate of the top of band N, then doubling until the count confirms it.
        var bandsNeeded = (edgeCount + 1) / 2 + 1;
        var k = bandsNeeded * Math.PI / cell.Period.Nanometres;
        var excess = 1.5 * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * k * k / cell.MinimumMass.ElectronMasses + spread;
        var high = vMax + excess;
        for (var attempt = 0; _transfer.CountBandEdgesBelow(high) < edgeCount; attempt++)
        {
            if (attempt > 200 || !double.IsFinite(high))
            {
                throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                    $"could not find an energy with {edgeCount} band edges below it (last tried {high:R} eV)."));
            }
            excess *= 2;
            high = vMax + excess;
        }
        return (low, high);
    }

    private RootResult RefineEdge(int index, double lower, double upper)
    {
        var function = new TraceMinusTarget(_transfer, TargetTrace(index));
        var result = RootFinding.SafeguardedNewton(ref function, lower, upper,
            _options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance, _options.MaxIterations);
        if (result.Status == RootStatus.NotBracketed)
        {
            // Rounding at an end point that sits on a neighbouring edge: the end nearer in |D − target| wins.
            var fLower = Math.Abs(function.Evaluate(lower, out _));
            var fUpper = Math.Abs(function.Evaluate(upper, out _));
            var root = fLower <= fUpper ? lower : upper;
            return new RootResult(root, lower, upper, upper - lower, 0, RootStatus.Converged);
        }
        if (result.Status != RootStatus.Converged)
        {
            throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                $"band edge {index} did not converge in {result.Iterations} iterations; bracket [{result.Lower:R}, {result.Upper:R}] eV."));
        }
        return result;
    }

    /// <summary>
    /// Finds the extremum of D between the two edges of one gap and decides whether the gap is closed.
    /// <paramref name="closedError"/> bounds the distance of both edges from the extremum when it is.
    /// </summary>
    /// <remarks>
    /// Near a gap edge pair, D ∓ 2 = ∓det(M ∓ I) exactly (det M = 1). Linearising M(E_m + δ) ≈ M_m + δ·dM/dE
    /// at the extremum E_m turns the edges into the roots of the quadratic det(η + δA) = 0, η = M_m ∓ I,
    /// A = dM/dE, whose separation W is the gap width. W inherits only the rounding of the entries of M
    /// divided by |A|, whereas the value D(E_m) ∓ 2 (the width from it, 2√(excess/|D″/2|), takes the square
    /// root of that rounding) cannot resolve a gap below √ε relative when rounding accumulates over many
    /// elements. The gap is closed when W is below the edge tolerance (M = ±I there: coexistence of two
    /// periodic solutions, Magnus and Winkler, Hill's Equation, 1966, §2.3).
    /// </remarks>
    private bool TrySeparateGapPair(int lowerEdge, double a, double b, out double extremum, out bool closed, out double closedError)
    {
        var slope = new TraceSlope(_transfer);
        var result = RootFinding.Brent(ref slope, a, b, _options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance, _options.MaxIterations);
        extremum = result.Root;
        closed = false;
        closedError = 0;
        if (result.Status != RootStatus.Converged)
        {
            return false;
        }
        var value = _transfer.Dispersion(extremum);
        var target = TargetTrace(lowerEdge);
        var matrix = _transfer.Evaluate(extremum);
        var tolerance = Math.Max(_options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance * Math.Abs(extremum));
        var excessOverTarget = target > 0 ? value.Trace - 2 : -2 - value.Trace;
        if (excessOverTarget > 1e-6)
        {
            return true; // |D| exceeds 2 far beyond any rounding: an open gap
        }
        var width = LinearisedGapWidth(matrix, target, out var shift, out var curvature);
        if (double.IsNaN(width))
        {
            // No usable linear model (entries beyond the double range, or a degenerate derivative): fall back
            // on the value, whose rounding level is a few ulps of the largest entry that enters the trace.
            var scale = matrix.Mantissa.MaxAbsEntry * Math.Exp(matrix.LogScale);
            closed = excessOverTarget <= 64 * FloatingPoint.MachineEpsilon * Math.Max(scale, 2.0);
            closedError = Math.Max(Math.Abs(extremum) * 1e-12, _options.AbsoluteToleranceElectronVolts);
            return true;
        }
        // D′ = 0 comes from a noisy slope; the centre of the linearised pair, E_m − (linear)/(2·quadratic), places
        // a (nearly) degenerate point better. Move there for the decision (the open-gap refinement keeps E_m,
        // which is known to lie inside the gap).
        var centre = extremum;
        for (var step = 0; step < 3 && Math.Abs(shift) > tolerance; step++)
        {
            var moved = centre + shift;
            if (!(moved > a && moved < b))
            {
                break;
            }
            var movedMatrix = _transfer.Evaluate(moved);
            var movedWidth = LinearisedGapWidth(movedMatrix, target, out var movedShift, out var movedCurvature);
            if (double.IsNaN(movedWidth))
            {
                break;
            }
            centre = moved;
            matrix = movedMatrix;
            width = movedWidth;
            shift = movedShift;
            curvature = movedCurvature;
        }
        // Rounding accumulated over the product shows in det M − 1 (exactly 0 in exact arithmetic); D ∓ 2 carries
        // rounding of the same size. A gap whose |D| exceeds 2 by no more than that is closed within resolution.
        var centreScale = Math.Exp(matrix.LogScale);
        var m = matrix.Mantissa;
        // Floor: a few ulps of the largest entry that enters the trace (the rounding of the final sum).
        var noise = Math.Max(8 * Math.Abs((m.M11 * m.M22 - m.M12 * m.M21) * centreScale * centreScale - 1),
            64 * FloatingPoint.MachineEpsilon * Math.Max(m.MaxAbsEntry * centreScale, 2.0));
        var centreTrace = m.Trace * centreScale;
        var centreExcess = target > 0 ? centreTrace - 2 : -2 - centreTrace;
        if (width <= tolerance)
        {
            closed = true;
            closedError = Math.Max(Math.Max(width, tolerance), Math.Abs(shift));
        }
        else if (Math.Min(centreExcess, excessOverTarget) <= noise)
        {
            // Closed within the resolution that rounding allows: an open gap this shallow would be at most
            // 2√(noise/curvature) wide (D ∓ 2 ≈ ±curvature·δ² near the centre), which bounds the edges' error.
            closed = true;
            closedError = Math.Max(tolerance, Math.Sqrt(noise / curvature));
        }
        if (closed)
        {
            extremum = centre;
        }
        return true;
    }

    /// <summary>
    /// The separation of the roots of det(η + δA) = 0 (see <see cref="TrySeparateGapPair"/>), eV; 0 when the
    /// quadratic has no real roots (no gap within rounding); NaN when the model cannot be formed.
    /// <paramref name="shift"/> is the offset of the quadratic's centre from the evaluation point (eV) and
    /// <paramref name="curvature"/> its leading coefficient det A (1/eV²).
    /// </summary>
    private static double LinearisedGapWidth(Transfer.ScaledTransferMatrix matrix, double target, out double shift, out double curvature)
    {
        shift = 0;
        curvature = double.NaN;
        if (matrix.LogScale > 600)
        {
            return double.NaN;
        }
        var scale = Math.Exp(matrix.LogScale);
        var sign = target > 0 ? 1.0 : -1.0;
        var m = matrix.Mantissa;
        var d = matrix.EnergyDerivativeMantissa;
        double e11 = m.M11 * scale - sign, e12 = m.M12 * scale, e21 = m.M21 * scale, e22 = m.M22 * scale - sign;
        double a11 = d.M11 * scale, a12 = d.M12 * scale, a21 = d.M21 * scale, a22 = d.M22 * scale;
        // det(η + δA) = det(A) δ² + (η11 A22 + η22 A11 − η12 A21 − η21 A12) δ + det(η).
        var quadratic = a11 * a22 - a12 * a21;
        var linear = e11 * a22 + e22 * a11 - e12 * a21 - e21 * a12;
        var constant = e11 * e22 - e12 * e21;
        // At an extremum inside a gap det A > 0 (it is ∓D″/2 there); otherwise the model does not apply.
        if (!(quadratic > 0) || !double.IsFinite(linear) || !double.IsFinite(constant))
        {
            return double.NaN;
        }
        var discriminant = linear * linear - 4 * quadratic * constant;
        shift = -linear / (2 * quadratic);
        curvature = quadratic;
        return discriminant <= 0 ? 0.0 : Math.Sqrt(discriminant) / quadratic;
    }

    /// <summary>
    /// Refines the two edges of an open but narrow gap, where M is close to ±I, on det(M(E) ∓ I) in product
    /// form instead of D(E) ∓ 2: both vanish at the edges (det M = 1), but near M = ±I the trace form loses
    /// its digits to cancellation (|dD/dE| is tiny at the edges of a narrow gap, so an ulp of D moves the edge
    /// by ulp/|dD/dE|) while the product of the small entries keeps them. Starts from the roots of the
    /// linearised model (see <see cref="TrySeparateGapPair"/>). False when M is not near ±I or the brackets
    /// cannot be confirmed; the caller then uses the trace form.
    /// </summary>
    private bool TryRefineNarrowPair(int lowerEdge, double a, double extremum, double b, out RootResult lower, out RootResult upper)
    {
        lower = upper = default;
        var matrix = _transfer.Evaluate(extremum);
        if (matrix.LogScale > 600)
        {
            return false;
        }
        var scale = Math.Exp(matrix.LogScale);
        var sign = TargetTrace(lowerEdge) > 0 ? 1.0 : -1.0;
        var m = matrix.Mantissa;
        var d = matrix.EnergyDerivativeMantissa;
        double e11 = m.M11 * scale - sign, e12 = m.M12 * scale, e21 = m.M21 * scale, e22 = m.M22 * scale - sign;
        if (Math.Max(Math.Abs(e11), Math.Abs(e22)) > 1e-3 || Math.Abs(e12 * e21) > 1e-6)
        {
            return false; // not near ±I: the trace form is as well conditioned
        }
        double a11 = d.M11 * scale, a12 = d.M12 * scale, a21 = d.M21 * scale, a22 = d.M22 * scale;
        var quadratic = a11 * a22 - a12 * a21;
        var linear = e11 * a22 + e22 * a11 - e12 * a21 - e21 * a12;
        var constant = e11 * e22 - e12 * e21;
        var discriminant = linear * linear - 4 * quadratic * constant;
        if (!(quadratic > 0) || !(discriminant > 0) || !double.IsFinite(discriminant))
        {
            return false;
        }
        var root = Math.Sqrt(discriminant);
        var below = (-linear - root) / (2 * quadratic);
        var above = (-linear + root) / (2 * quadratic);
        if (!(below < 0 && above > 0))
        {
            return false;
        }
        var function = new DeterminantOffIdentity(_transfer, sign);
        var lowerEnd = Math.Max(a, extremum + 4 * below);
        var upperEnd = Math.Min(b, extremum + 4 * above);
        // Outside the gap det(M ∓ I) = ±(2 ∓ D)·… is positive, inside negative: confirm both brackets.
        if (!(function.Evaluate(lowerEnd, out _) > 0 && function.Evaluate(extremum, out _) < 0 && function.Evaluate(upperEnd, out _) > 0))
        {
            return false;
        }
        lower = RootFinding.SafeguardedNewton(ref function, lowerEnd, extremum, _options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance, _options.MaxIterations);
        upper = RootFinding.SafeguardedNewton(ref function, extremum, upperEnd, _options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance, _options.MaxIterations);
        return lower.Status == RootStatus.Converged && upper.Status == RootStatus.Converged;
    }

    /// <summary>det(M(E) − σI) in product form and its exact energy derivative; σ = ±1.</summary>
    private readonly struct DeterminantOffIdentity(CellTransfer transfer, double sign) : IDifferentiableFunction
    {
        public double Evaluate(double x, out double derivative)
        {
            var p = transfer.Accumulate(x);
            if (p.LogScale > 300)
            {
                derivative = double.PositiveInfinity;
                return double.PositiveInfinity; // far outside any narrow gap: only the sign matters
            }
            return p.DeterminantOffIdentity(Math.Exp(p.LogScale), sign, out derivative);
        }
    }

    private readonly struct TraceMinusTarget(CellTransfer transfer, double target) : IDifferentiableFunction
    {
        public double Evaluate(double x, out double derivative)
        {
            var p = transfer.Accumulate(x);
            var trace = p.TraceMantissa;
            if (p.LogScale > 700)
            {
                // |D| is astronomically far from ±2 here: only the sign matters to the bracket.
                derivative = double.PositiveInfinity;
                return trace == 0 ? -target : Math.CopySign(double.PositiveInfinity, trace);
            }
            var scale = Math.Exp(p.LogScale);
            if (p.TryShiftedTrace(scale, target, out var value, out var slope))
            {
                derivative = slope;
                return value;
            }
            derivative = p.TraceDerivativeMantissa * scale;
            return trace * scale - target;
        }
    }



    private readonly struct TraceSlope(CellTransfer transfer) : IRealFunction
    {
        public double Evaluate(double x)
        {
            var p = transfer.Accumulate(x);
            return p.TraceDerivativeMantissa; // the sign of dD/dE is that of its mantissa
        }
    }
}
