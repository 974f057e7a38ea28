// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Periodic.Numerics;

namespace Periodic.Properties;

/// <summary>
/// The Bloch function ψ_nk(x) = e^(ikx)·u_nk(x) of one band and wavevector, normalised over one cell
/// (∫₀^d |ψ|² dx = 1, so ψ is in nm^(−1/2)), evaluated on a caller's grid of positions.
/// Immutable and thread-safe; evaluation does not allocate.
/// </summary>
/// <remarks>
/// <para>Method: the state (ψ, ψ′/m) at the cell origin is the eigenvector of the cell transfer matrix M(E)
/// with eigenvalue e^(ikd) (Bloch's theorem; F. Bloch, Z. Phys. 52, 555 (1929)), E = E_n(k); it is carried
/// through the cell with the closed-form layer matrices and the delta jumps, and ψ inside a layer follows
/// from the layer's state at its left interface. The norm is integrated in closed form per layer.</para>
/// <para>Smooth segments (<see cref="FourierSegment"/>, <see cref="FunctionSegment"/>, <see cref="SampledSegment"/>)
/// are crossed with the same fourth-order Magnus steps as the transfer matrix, so ψ belongs to the same discrete
/// model as the band structure's E(k). Inside a step ψ is the cubic Hermite interpolant of ψ and ψ′ = m·(ψ′/m) at
/// the step ends (C. de Boor, A Practical Guide to Splines, ch. 4), whose error h⁴|ψ⁗|/384 is of the scheme's
/// own order; with a position-dependent mass the end masses are extrapolated from the step's Gauss nodes, which
/// lowers the interpolation inside a step to O(h³). The norm over a step is the 4-point Gauss–Legendre rule,
/// exact for the interpolant. The discretisation error is measured by one step halving and reported as
/// <see cref="DiscretisationErrorEstimate"/>; build the structure with <see cref="RefinedBandStructure"/> to
/// make it small.</para>
/// <para>Phase convention: ψ(0) is real and positive at the cell origin x = 0 (the left end of the first
/// element); when |ψ(0)|·√d &lt; 1e-6, ψ′(0)/m is made real and positive instead. Positions outside [0, d]
/// use ψ(x + jd) = e^(ikjd)ψ(x). At a zone point of an open gap ψ is real. At a closed gap the two
/// degenerate states of a zone point are not fixed by k: the lower band gets the standing wave with
/// ψ′(0) = 0, the upper band the one with ψ(0) = 0.</para>
/// <para>Accuracy: relative rounding grows like ε·e^(Σκw) over the evanescent layers and steps of the cell (decay κ,
/// width w: the decaying and growing parts of the state cancel); it is reported as
/// <see cref="RelativeErrorEstimate"/>. When it would exceed 1e-6 (Σκw ≳ 22), the thickest barrier is bridged
/// instead: ψ inside it is interpolated between its two interface values, reached forwards from the origin and
/// backwards from the Bloch-shifted end state, so only the other barriers count; cells still above the limit
/// are refused. Only uniform layers are bridged; a barrier inside a smooth segment always counts. With non-parabolic layers the states of different
/// energies are not orthogonal in the plain inner product (the mass depends on energy).</para>
/// </remarks>
public sealed class BlochFunction
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    // The kernel's per-piece store at this energy: uniform layers (closed form inside) and the Magnus steps of smooth
    // segments (cubic Hermite inside), with the normalised states at their ends.
    private readonly CellPieces _pieces;
    private readonly Complex _end;
    private readonly Complex _endW;

    private const double Epsilon = FloatingPoint.MachineEpsilon;

    /// <summary>The largest relative rounding error accepted: the amplification e^(Σκw) of evanescent layers times ε.</summary>
    private const double MaxRelativeErrorEstimate = 1e-6;

    /// <summary>Safety factor on the change under one step halving: the error of a fourth-order result is 16/15 of it.</summary>
    private const double HalvingSafetyFactor = 2.0;

    private BlochFunction(double errorEstimate, int bandIndex, double k, double energy, double period, CellPieces pieces, Complex end, Complex endW, Complex origin, Complex originW)
    {
        _pieces = pieces;
        StateAtOrigin = (origin, originW);
        RelativeErrorEstimate = errorEstimate;
        BandIndex = bandIndex;
        WavevectorPerNanometre = k;
        EnergyElectronVolts = energy;
        PeriodNanometres = period;
        _end = end;
        _endW = endW;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The Bloch wavevector k, 1/nm.</summary>
    public double WavevectorPerNanometre { get; }

    /// <summary>The energy E_n(k), eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>
    /// Estimated relative rounding error of ψ: ε·e^(Σκw) over the evanescent layers and steps of the cell (κ the decay
    /// constant at this energy, w the width) — without the thickest barrier when that one is bridged. At most 1e-6.
    /// </summary>
    public double RelativeErrorEstimate { get; }

    /// <summary>
    /// Estimated discretisation error of ψ for a cell with smooth segments, as max |ψ − ψ_exact|·√d (relative to the
    /// unit-norm state): twice the largest change of ψ·√d when every segment's step is halved (the energy re-solved on
    /// the finer mesh), at every step end and step middle. 0 for cells of layers and deltas only (closed form, no
    /// discretisation); +∞ when the segments are already at their step limit, so no halving is possible. Like
    /// <see cref="RefinedBandStructure"/>, it covers the segments as given (a <see cref="Periodic.Structures.SampledSegment"/>
    /// as its piecewise-linear interpolant).
    /// </summary>
    public double DiscretisationErrorEstimate { get; private set; }

    /// <summary>Builds the normalised Bloch function of band <paramref name="bandIndex"/> at <paramref name="wavevectorPerNanometre"/> ∈ [−π/d, π/d].</summary>
    /// <remarks>
    /// For cells with smooth segments this also builds the state once more with every step halved, to measure
    /// <see cref="DiscretisationErrorEstimate"/>: about three times the work of the propagation alone.
    /// </remarks>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or k outside the first zone.</exception>
    /// <exception cref="PrecisionLimitException">The barriers are too opaque at this energy: even with the thickest uniform
    /// barrier bridged the estimated relative error would exceed 1e-6 (smooth segments are not bridged), or the transfer
    /// matrix exceeds the double range.</exception>
    public static BlochFunction Create(BandStructure structure, int bandIndex, double wavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(structure);
        var energy = structure.EnergyAt(bandIndex, wavevectorPerNanometre); // validates band and k
        var cell = structure.Cell;
        var function = Build(structure, cell, structure.Transfer, bandIndex, wavevectorPerNanometre, energy);
        if (!HasSegments(cell))
        {
            return function;
        }
        var refinedCell = RefinedBandStructure.Refine(cell);
        if (ReferenceEquals(refinedCell, cell))
        {
            function.DiscretisationErrorEstimate = double.PositiveInfinity;
            return function;
        }
        var refinedTransfer = CellTransfer.Create(refinedCell);
        var band = structure.GetBand(bandIndex);
        var refinedEnergy = SolveBlochCondition(refinedTransfer, wavevectorPerNanometre * structure.PeriodNanometres, energy, band.WidthElectronVolts)
            ?? BandStructure.Compute(refinedCell, bandIndex, structure.Options).EnergyAt(bandIndex, wavevectorPerNanometre);
        var fine = Build(structure, refinedCell, refinedTransfer, bandIndex, wavevectorPerNanometre, refinedEnergy);
        var estimate = HalvingSafetyFactor * function.LargestDifference(fine) * Math.Sqrt(structure.PeriodNanometres);
        function.DiscretisationErrorEstimate = double.IsNaN(estimate) ? double.PositiveInfinity : estimate;
        return function;
    }

    /// <summary>
    /// The Bloch function of the structure's own discrete model, without the step-halving check of
    /// <see cref="Create"/> (its <see cref="DiscretisationErrorEstimate"/> is 0 and means "not measured"): for callers
    /// that evaluate many states of one cell and measure the discretisation themselves (the space-charge solver).
    /// </summary>
    internal static BlochFunction CreateUnrefined(BandStructure structure, int bandIndex, double wavevectorPerNanometre)
    {
        var energy = structure.EnergyAt(bandIndex, wavevectorPerNanometre);
        return Build(structure, structure.Cell, structure.Transfer, bandIndex, wavevectorPerNanometre, energy);
    }

    private static bool HasSegments(UnitCell cell)
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

    /// <summary>
    /// E with D(E) = 2cos θ on the finer mesh by Newton's method from the coarse energy (the two differ by the
    /// discretisation error only); null when Newton does not settle within 1e-2 of the band width, so the caller
    /// falls back to a band search.
    /// </summary>
    private static double? SolveBlochCondition(CellTransfer transfer, double phase, double start, double bandWidth)
    {
        var target = 2 * Math.Cos(phase);
        var e = start;
        for (var iteration = 0; iteration < 40; iteration++)
        {
            var value = transfer.Dispersion(e);
            var step = (value.Trace - target) / value.TraceDerivativePerElectronVolt;
            if (!double.IsFinite(step) || Math.Abs(e - step - start) > 1e-2 * bandWidth)
            {
                return null;
            }
            e -= step;
            if (Math.Abs(step) <= 4 * Epsilon * Math.Max(Math.Abs(e), bandWidth))
            {
                return e;
            }
        }
        return null;
    }

    /// <summary>The largest |ψ − ψ_other| over the start and middle of every piece of this function.</summary>
    private double LargestDifference(BlochFunction other)
    {
        var largest = 0.0;
        for (var i = 0; i < _pieces.Count; i++)
        {
            foreach (var x in (ReadOnlySpan<double>)[_pieces.Starts[i], _pieces.Starts[i] + 0.5 * _pieces.Widths[i]])
            {
                largest = Math.Max(largest, (StateAt(x).Psi - other.StateAt(x).Psi).Magnitude);
            }
        }
        return Math.Max(largest, (_end - other._end).Magnitude);
    }

    private static BlochFunction Build(BandStructure structure, UnitCell cell, CellTransfer transfer, int bandIndex, double wavevectorPerNanometre, double energy)
    {
        var d = structure.PeriodNanometres;
        var m = transfer.Evaluate(energy).Matrix;
        if (!double.IsFinite(m.MaxAbsEntry))
        {
            throw new PrecisionLimitException(string.Create(CultureInfo.InvariantCulture,
                $"the transfer matrix of the cell at {energy:R} eV exceeds the double range; the Bloch function cannot be propagated through barriers this opaque."));
        }
        // The opacity Σκw of the evanescent layers and steps sets the rounding of forward propagation.
        var pieces = CellPieces.Create(transfer.Compiled, energy);
        var errorEstimate = Epsilon * Math.Exp(pieces.Opacity);
        var bridged = -1;
        if (!(errorEstimate <= MaxRelativeErrorEstimate))
        {
            // Two-sided construction: the thickest barrier is bridged by interpolating ψ between its interface
            // values, reached forwards from the origin and backwards from the Bloch-shifted end state.
            errorEstimate = Epsilon * Math.Exp(pieces.Opacity - pieces.ThickestOpacity);
            if (!(errorEstimate <= MaxRelativeErrorEstimate))
            {
                throw new PrecisionLimitException(string.Create(CultureInfo.InvariantCulture,
                    $"the barriers of the cell are too opaque at {energy:R} eV for a propagated Bloch function: the summed decay exponent outside the thickest uniform barrier is {pieces.Opacity - pieces.ThickestOpacity:G4}, so the relative rounding error would reach {errorEstimate:G3} (the limit is {MaxRelativeErrorEstimate:G1})."));
            }
            bridged = pieces.ThickestIndex;
        }
        var lambda = Complex.FromPolarCoordinates(1, wavevectorPerNanometre * d);
        var (u0, w0) = Eigenvector(structure, bandIndex, m, lambda, pieces.MassLength / Math.PI);

        // Forward from the origin (up to the bridged barrier, if any), then backwards from ψ(d) = e^{ikd}ψ(0) down to it.
        var end = pieces.PropagateForward(u0, w0, bridged);
        if (bridged >= 0)
        {
            end = (lambda * u0, lambda * w0);
            pieces.PropagateBackward(end.U, end.W, bridged);
        }
        // Normalise and fix the phase.
        var scale = 1 / Math.Sqrt(pieces.NormSquared());
        var phase = u0.Magnitude * scale * Math.Sqrt(d) >= 1e-6 ? Complex.Conjugate(u0) / u0.Magnitude : Complex.Conjugate(w0) / w0.Magnitude;
        var factor = scale * phase;
        pieces.Scale(factor);
        return new BlochFunction(errorEstimate, bandIndex, wavevectorPerNanometre, energy, d, pieces,
            end.U * factor, end.W * factor, u0 * factor, w0 * factor);
    }

    private static (Complex U, Complex W) Eigenvector(BandStructure structure, int bandIndex, TransferMatrix m, Complex lambda, double sigma)
    {
        // M12 (mass × length) and M21 (its inverse) carry units: compare entries in the state (ψ, σ·ψ′/m) with
        // σ = m̄d/π (m̄ the cell's mean mass), the ratio |M12/M21| of a free particle at the zone boundary, so that the
        // choice and the threshold do not depend on the mass and length scales (an atom of 1e5 m0 in a 500 nm lattice
        // has |M12| ~ 1e8 and |M21| ~ 1e-8). A fixed scale, not one from M itself, whose off-diagonal entries may be
        // rounding noise at a band edge.
        double b12 = m.M12 / sigma, b21 = m.M21 * sigma;
        // (M − λ) v = 0: v = (M12, λ − M11) or (λ − M22, M21); take the better conditioned.
        var a = (new Complex(b12, 0), lambda - m.M11);
        var b = (lambda - m.M22, new Complex(b21, 0));
        var na = a.Item1.Magnitude + a.Item2.Magnitude;
        var nb = b.Item1.Magnitude + b.Item2.Magnitude;
        var largest = Math.Max(Math.Max(Math.Abs(m.M11), Math.Abs(m.M22)), Math.Max(Math.Abs(b12), Math.Abs(b21)));
        var threshold = 64 * FloatingPoint.MachineEpsilon * (largest + 1);
        if (Math.Max(na, nb) > threshold)
        {
            var v = na >= nb ? a : b;
            return (v.Item1, v.Item2 / sigma);
        }
        // M = λI: a closed gap at a zone point; split the degenerate pair by parity at the origin.
        var band = structure.GetBand(bandIndex);
        var phase = Math.Abs(lambda.Imaginary) < 0.5 && lambda.Real > 0 ? ZonePoint.Center : ZonePoint.Boundary;
        var isTop = band.TopZonePoint == phase;
        return isTop ? (Complex.One, Complex.Zero) : (Complex.Zero, Complex.One);
    }

    /// <summary>ψ(x) in nm^(−1/2) at <paramref name="positionNanometres"/> (any real x).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position is not finite.</exception>
    public Complex ValueAt(double positionNanometres)
    {
        Preconditions.CheckFinite(positionNanometres);
        return Value(positionNanometres);
    }

    /// <summary>
    /// Effectively computes <c>ψ(positionsNanometres[i])</c> into <paramref name="destinationReal"/> and
    /// <paramref name="destinationImaginary"/> (nm^(−1/2)); does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">A destination is shorter than the input, or a position is not finite.</exception>
    public void Evaluate(ReadOnlySpan<double> positionsNanometres, Span<double> destinationReal, Span<double> destinationImaginary)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationReal.Length, nameof(positionsNanometres), nameof(destinationReal));
        Preconditions.CheckDestination(positionsNanometres.Length, destinationImaginary.Length, nameof(positionsNanometres), nameof(destinationImaginary));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var value = Value(positionsNanometres[i]);
            destinationReal[i] = value.Real;
            destinationImaginary[i] = value.Imaginary;
        }
    }

    /// <summary>Effectively computes <c>destination[i] = ψ(positionsNanometres[i])</c> (nm^(−1/2)); does not allocate.</summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a position is not finite.</exception>
    public void Evaluate(ReadOnlySpan<double> positionsNanometres, Span<Complex> destination)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destination.Length, nameof(positionsNanometres), nameof(destination));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            destination[i] = Value(positionsNanometres[i]);
        }
    }

    /// <summary>
    /// Effectively computes the cell-periodic part u(x) = e^(−ikx)ψ(x) at each position into
    /// <paramref name="destinationReal"/> and <paramref name="destinationImaginary"/> (nm^(−1/2)); does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">A destination is shorter than the input, or a position is not finite.</exception>
    public void EvaluatePeriodicPart(ReadOnlySpan<double> positionsNanometres, Span<double> destinationReal, Span<double> destinationImaginary)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationReal.Length, nameof(positionsNanometres), nameof(destinationReal));
        Preconditions.CheckDestination(positionsNanometres.Length, destinationImaginary.Length, nameof(positionsNanometres), nameof(destinationImaginary));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var x = positionsNanometres[i];
            var value = Value(x) * Complex.FromPolarCoordinates(1, -WavevectorPerNanometre * x);
            destinationReal[i] = value.Real;
            destinationImaginary[i] = value.Imaginary;
        }
    }

    /// <summary>Effectively computes <c>destination[i] = |ψ(positionsNanometres[i])|²</c> in 1/nm (periodic in x); does not allocate.</summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a position is not finite.</exception>
    public void ProbabilityDensities(ReadOnlySpan<double> positionsNanometres, Span<double> destinationPerNanometre)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationPerNanometre.Length, nameof(positionsNanometres), nameof(destinationPerNanometre));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var value = Value(positionsNanometres[i]);
            destinationPerNanometre[i] = value.Real * value.Real + value.Imaginary * value.Imaginary;
        }
    }

    private static void CheckPositions(ReadOnlySpan<double> positions)
    {
        for (var i = 0; i < positions.Length; i++)
        {
            if (!double.IsFinite(positions[i]))
            {
                var name = string.Create(CultureInfo.InvariantCulture, $"positionsNanometres[{i}]");
                throw new ArgumentOutOfRangeException("positionsNanometres", positions[i], $"{name} must be a finite position in nm; got {Preconditions.Format(positions[i])}.");
            }
        }
    }

    private Complex Value(double x)
    {
        var d = PeriodNanometres;
        var cells = Math.Floor(x / d);
        var local = x - cells * d;
        if (local >= d)
        {
            local = 0; // rounding at a multiple of d
            cells += 1;
        }
        var value = StateAt(local).Psi;
        return cells == 0 ? value : value * Complex.FromPolarCoordinates(1, WavevectorPerNanometre * d * cells);
    }

    /// <summary>(ψ, ψ′/m) at a position inside the cell, x ∈ [0, d], by propagation from the layer's left interface (no Bloch reduction).</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAt(double x) => _pieces.StateAt(x) ?? (_end, _endW);

    /// <summary>(ψ, ψ′/m) at the right end of the cell after every element (deltas included): equals e^(ikd) times the state at 0.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtEnd => (_end, _endW);

    /// <summary>(ψ, ψ′/m) at the left end of the cell, before any element.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtOrigin { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Bloch function: band {BandIndex}, k = {WavevectorPerNanometre:G8} /nm, E = {EnergyElectronVolts:G10} eV, period {PeriodNanometres:G6} nm");
}
