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

    // Pieces of the cell in order: uniform layers (closed form inside) and the Magnus steps of smooth segments
    // (cubic Hermite inside). Left-end states in _u/_w; steps also keep their right-end state and end masses.
    private readonly double[] _starts;
    private readonly double[] _widths;
    private readonly double[] _s;
    private readonly double[] _masses;
    private readonly CompiledCell _kernel;
    private readonly int[] _elements;
    private readonly double[] _massesRight;
    private readonly bool[] _isStep;
    private readonly Complex[] _u;
    private readonly Complex[] _w;
    private readonly Complex[] _uRight;
    private readonly Complex[] _wRight;
    private readonly Complex _end;
    private readonly Complex _endW;
    private readonly int _bridged;
    private readonly Complex _bridgeRight;

    private const double Epsilon = FloatingPoint.MachineEpsilon;

    /// <summary>The largest relative rounding error accepted: the amplification e^(Σκw) of evanescent layers times ε.</summary>
    private const double MaxRelativeErrorEstimate = 1e-6;

    /// <summary>Safety factor on the change under one step halving: the error of a fourth-order result is 16/15 of it.</summary>
    private const double HalvingSafetyFactor = 2.0;

    private BlochFunction(CompiledCell kernel, double errorEstimate, int bandIndex, double k, double energy, double period, Pieces pieces, Complex end, Complex endW, Complex origin, Complex originW, int bridged, Complex bridgeRight)
    {
        _kernel = kernel;
        _elements = pieces.Elements;
        _bridged = bridged;
        _bridgeRight = bridgeRight;
        StateAtOrigin = (origin, originW);
        RelativeErrorEstimate = errorEstimate;
        BandIndex = bandIndex;
        WavevectorPerNanometre = k;
        EnergyElectronVolts = energy;
        PeriodNanometres = period;
        _starts = pieces.Starts;
        _widths = pieces.Widths;
        _s = pieces.S;
        _masses = pieces.Masses;
        _massesRight = pieces.MassesRight;
        _isStep = pieces.IsStep;
        _u = pieces.U;
        _w = pieces.W;
        _uRight = pieces.URight;
        _wRight = pieces.WRight;
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
        for (var i = 0; i < _starts.Length; i++)
        {
            foreach (var x in (ReadOnlySpan<double>)[_starts[i], _starts[i] + 0.5 * _widths[i]])
            {
                largest = Math.Max(largest, (StateAt(x).Psi - other.StateAt(x).Psi).Magnitude);
            }
        }
        return Math.Max(largest, (_end - other._end).Magnitude);
    }

    /// <summary>Per-piece storage while a Bloch function is built.</summary>
    private sealed class Pieces(int count)
    {
        internal double[] Starts { get; } = new double[count];

        /// <summary>The kernel element each piece belongs to.</summary>
        internal int[] Elements { get; } = new int[count];
        internal double[] Widths { get; } = new double[count];
        internal double[] S { get; } = new double[count];
        internal double[] Masses { get; } = new double[count];
        internal double[] MassesRight { get; } = new double[count];
        internal bool[] IsStep { get; } = new bool[count];
        internal Complex[] U { get; } = new Complex[count];
        internal Complex[] W { get; } = new Complex[count];
        internal Complex[] URight { get; } = new Complex[count];
        internal Complex[] WRight { get; } = new Complex[count];

        /// <summary>Step matrices exp Ω (4 per piece, steps only).</summary>
        internal double[] Matrices { get; } = new double[4 * count];
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
        // Per-piece data; the opacity Σκw of the evanescent layers and steps sets the rounding of forward propagation.
        var compiled = transfer.Compiled;
        var pieceCount = 0;
        for (var el = 0; el < compiled.Count; el++)
        {
            pieceCount += compiled.IsLayer(el) ? 1 : compiled.IsDelta(el) ? 0 : compiled.Segment(el).Mesh.StepCount;
        }
        var pieces = new Pieces(pieceCount);
        var starts = pieces.Starts;
        var widths = pieces.Widths;
        var s = pieces.S;
        var masses = pieces.Masses;
        var matrices = pieces.Matrices;
        double opacity = 0, thickest = 0, x = 0, massLength = 0; // massLength = ∫m dx = m̄d
        var thickIndex = -1;
        var index = 0;
        for (var el = 0; el < compiled.Count; el++)
        {
            if (compiled.IsDelta(el))
            {
                continue;
            }
            if (!compiled.IsLayer(el))
            {
                var mesh = compiled.Segment(el).Mesh;
                for (var j = 0; j < mesh.StepCount; j++, index++)
                {
                    MagnusSegmentPropagator.StepMatrix(mesh, j, energy,
                        out matrices[4 * index], out matrices[4 * index + 1], out matrices[4 * index + 2], out matrices[4 * index + 3], out var zeta);
                    pieces.IsStep[index] = true;
                    pieces.Elements[index] = el;
                    (masses[index], pieces.MassesRight[index]) = mesh.EndMasses(j);
                    widths[index] = mesh.StepWidth(j);
                    massLength += 0.5 * (masses[index] + pieces.MassesRight[index]) * widths[index];
                    starts[index] = x;
                    x += widths[index];
                    if (zeta < 0)
                    {
                        opacity += Math.Sqrt(-zeta); // κh of the step; smooth barriers are never bridged
                    }
                }
                continue;
            }
            compiled.LayerCoefficients(el, energy, out masses[index], out s[index]);
            pieces.Elements[index] = el;
            pieces.MassesRight[index] = masses[index];
            widths[index] = compiled.LayerData(el).Width;
            massLength += masses[index] * widths[index];
            starts[index] = x;
            x += widths[index];
            if (s[index] < 0)
            {
                var kw = Math.Sqrt(-s[index]) * widths[index];
                opacity += kw;
                if (kw > thickest)
                {
                    thickest = kw;
                    thickIndex = index;
                }
            }
            index++;
        }
        var errorEstimate = Epsilon * Math.Exp(opacity);
        if (!(errorEstimate <= MaxRelativeErrorEstimate))
        {
            // Two-sided construction: the thickest barrier is bridged by interpolating ψ between its interface
            // values, reached forwards from the origin and backwards from the Bloch-shifted end state.
            errorEstimate = Epsilon * Math.Exp(opacity - thickest);
            if (!(errorEstimate <= MaxRelativeErrorEstimate))
            {
                throw new PrecisionLimitException(string.Create(CultureInfo.InvariantCulture,
                    $"the barriers of the cell are too opaque at {energy:R} eV for a propagated Bloch function: the summed decay exponent outside the thickest uniform barrier is {opacity - thickest:G4}, so the relative rounding error would reach {errorEstimate:G3} (the limit is {MaxRelativeErrorEstimate:G1})."));
            }
        }
        else
        {
            thickIndex = -1;
        }
        var lambda = Complex.FromPolarCoordinates(1, wavevectorPerNanometre * d);
        var (u0, w0) = Eigenvector(structure, bandIndex, m, lambda, massLength / Math.PI);

        // Forward from the origin (up to the bridged barrier, if any), recording each piece's end states.
        var us = pieces.U;
        var ws = pieces.W;
        Complex u = u0, w = w0, right = Complex.Zero;
        index = 0;
        for (var el = 0; el < compiled.Count; el++)
        {
            if (index == thickIndex && compiled.IsLayer(el))
            {
                us[index] = u;
                ws[index] = w;
                break;
            }
            switch (compiled.IsDelta(el) ? 0 : compiled.IsLayer(el) ? 1 : 2)
            {
                case 0:
                    w += compiled.DeltaJump(el) * u;
                    break;
                case 1:
                {
                    us[index] = u;
                    ws[index] = w;
                    (u, w) = LayerState(compiled, el, energy, u, w, widths[index]);
                    index++;
                    break;
                }
                default:
                    for (var j = 0; j < compiled.Segment(el).Mesh.StepCount; j++, index++)
                    {
                        us[index] = u;
                        ws[index] = w;
                        var at = 4 * index;
                        (u, w) = (matrices[at] * u + matrices[at + 1] * w, matrices[at + 2] * u + matrices[at + 3] * w);
                        pieces.URight[index] = u;
                        pieces.WRight[index] = w;
                    }
                    break;
            }
        }
        var end = (U: u, W: w);
        if (thickIndex >= 0)
        {
            // Backwards from ψ(d) = e^{ikd}ψ(0) with the inverse matrices (unimodular: [[m22, −m12], [−m21, m11]]).
            Complex ub = lambda * u0, wb = lambda * w0;
            end = (ub, wb);
            var li = pieceCount - 1;
            for (var el = compiled.Count - 1; el >= 0; el--)
            {
                if (compiled.IsDelta(el))
                {
                    wb -= compiled.DeltaJump(el) * ub;
                    continue;
                }
                if (!compiled.IsLayer(el))
                {
                    for (var j = compiled.Segment(el).Mesh.StepCount - 1; j >= 0; j--, li--)
                    {
                        pieces.URight[li] = ub;
                        pieces.WRight[li] = wb;
                        var at = 4 * li;
                        (ub, wb) = (matrices[at + 3] * ub - matrices[at + 1] * wb, -matrices[at + 2] * ub + matrices[at] * wb);
                        us[li] = ub;
                        ws[li] = wb;
                    }
                    continue;
                }
                if (li == thickIndex)
                {
                    right = ub;
                    break;
                }
                (ub, wb) = LayerState(compiled, el, energy, ub, wb, -widths[li]); // M(−w) = M(w)⁻¹
                us[li] = ub;
                ws[li] = wb;
                li--;
            }
        }
        var norm = 0.0;
        for (var i = 0; i < pieceCount; i++)
        {
            if (pieces.IsStep[i])
            {
                // |Hermite cubic|² is a polynomial of degree 6: the 4-point Gauss–Legendre rule integrates it exactly.
                var rule = GaussLegendre.Four;
                for (var g = 0; g < rule.Order; g++)
                {
                    var psi = Hermite(0.5 + 0.5 * rule.Nodes[g], widths[i], us[i], ws[i] * masses[i], pieces.URight[i], pieces.WRight[i] * pieces.MassesRight[i], out _);
                    norm += 0.5 * rule.Weights[g] * widths[i] * (psi.Real * psi.Real + psi.Imaginary * psi.Imaginary);
                }
                continue;
            }
            if (i == thickIndex)
            {
                var (i11, i12) = BridgeIntegrals(Math.Sqrt(-s[i]), widths[i]);
                norm += (us[i].Magnitude * us[i].Magnitude + right.Magnitude * right.Magnitude) * i11 + 2 * (us[i] * Complex.Conjugate(right)).Real * i12;
                continue;
            }
            UniformLayerPropagator.UnscaledValues(s[i], widths[i], out var cl, out var sl);
            UniformLayerPropagator.SquareIntegrals(s[i], widths[i], cl, sl, out var cc, out var cs, out var ss);
            var mass = masses[i];
            norm += us[i].Magnitude * us[i].Magnitude * cc
                + 2 * mass * (us[i] * Complex.Conjugate(ws[i])).Real * cs
                + mass * mass * ws[i].Magnitude * ws[i].Magnitude * ss;
        }
        // Normalise and fix the phase.
        var scale = 1 / Math.Sqrt(norm);
        var phase = u0.Magnitude * scale * Math.Sqrt(d) >= 1e-6 ? Complex.Conjugate(u0) / u0.Magnitude : Complex.Conjugate(w0) / w0.Magnitude;
        var factor = scale * phase;
        for (var i = 0; i < pieceCount; i++)
        {
            us[i] *= factor;
            ws[i] *= factor;
            pieces.URight[i] *= factor;
            pieces.WRight[i] *= factor;
        }
        return new BlochFunction(compiled, errorEstimate, bandIndex, wavevectorPerNanometre, energy, d, pieces,
            end.U * factor, end.W * factor, u0 * factor, w0 * factor, thickIndex, right * factor);
    }

    /// <summary>The cubic Hermite interpolant of a step (the kernel's basis, <see cref="MagnusSegmentPropagator.Hermite"/>) and its derivative dψ/dx.</summary>
    private static Complex Hermite(double tau, double h, Complex psiLeft, Complex slopeLeft, Complex psiRight, Complex slopeRight, out Complex derivative)
    {
        var b = MagnusSegmentPropagator.Hermite(tau);
        derivative = (b.D00 * psiLeft + b.D01 * psiRight) / h + b.D10 * slopeLeft + b.D11 * slopeRight;
        return b.H00 * psiLeft + b.H10 * h * slopeLeft + b.H01 * psiRight + b.H11 * h * slopeRight;
    }

    /// <summary>
    /// ∫₀^w g₁² dt (= ∫ g₂²) and ∫₀^w g₁g₂ dt for g₁ = sinh(κ(w − t))/sinh(κw), g₂ = sinh(κt)/sinh(κw), written
    /// with e^(−2κw) so that thick barriers do not overflow: coth(κw)/(2κ) − w/(2 sinh²κw) and
    /// (w cosh κw − sinh(κw)/κ)/(2 sinh²κw).
    /// </summary>
    private static (double Same, double Cross) BridgeIntegrals(double kappa, double w)
    {
        var q = Math.Exp(-2 * kappa * w);
        var coth = (1 + q) / (1 - q);
        var inverseSinhSquared = 4 * q / ((1 - q) * (1 - q));
        var inverseSinh = 2 * Math.Sqrt(q) / (1 - q);
        return (coth / (2 * kappa) - 0.5 * w * inverseSinhSquared, 0.5 * w * coth * inverseSinh - inverseSinh / (2 * kappa));
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

    /// <summary>
    /// The complex state (u, w) = (ψ, ψ′/m) carried by <paramref name="t"/> through layer <paramref name="element"/> by the
    /// kernel (backwards for t &lt; 0); its matrix is real, so the real and imaginary parts propagate separately.
    /// </summary>
    private static (Complex U, Complex W) LayerState(CompiledCell kernel, int element, double e, Complex u, Complex w, double t)
    {
        var (ur, wr) = kernel.LayerStateAt(element, e, u.Real, w.Real, t);
        var (ui, wi) = kernel.LayerStateAt(element, e, u.Imaginary, w.Imaginary, t);
        return (new Complex(ur, ui), new Complex(wr, wi));
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
    internal (Complex Psi, Complex DerivativeOverMass) StateAt(double x)
    {
        if (_starts.Length == 0)
        {
            return (_end, _endW);
        }
        int lo = 0, hi = _starts.Length - 1;
        while (lo < hi)
        {
            var mid = (lo + hi + 1) >> 1;
            if (_starts[mid] <= x)
            {
                lo = mid;
            }
            else
            {
                hi = mid - 1;
            }
        }
        var t = Math.Clamp(x - _starts[lo], 0, _widths[lo]);
        if (_isStep[lo])
        {
            // ψ′ = m·(ψ′/m) at the step ends; the mass in between is linear in x (the mesh's Gauss-node masses).
            var h = _widths[lo];
            var tau = t / h;
            var psi = Hermite(tau, h, _u[lo], _w[lo] * _masses[lo], _uRight[lo], _wRight[lo] * _massesRight[lo], out var slope);
            return (psi, slope / (_masses[lo] + tau * (_massesRight[lo] - _masses[lo])));
        }
        if (lo == _bridged)
        {
            // ψ = u_L·sinh(κ(w − t))/sinh(κw) + u_R·sinh(κt)/sinh(κw), in decaying exponentials.
            var kappa = Math.Sqrt(-_s[lo]);
            var width = _widths[lo];
            var denominator = 1 - Math.Exp(-2 * kappa * width);
            double eLeft = Math.Exp(-kappa * t), eRight = Math.Exp(-kappa * (width - t));
            double qLeft = Math.Exp(-2 * kappa * (width - t)), qRight = Math.Exp(-2 * kappa * t);
            var g1 = eLeft * (1 - qLeft) / denominator;
            var g2 = eRight * (1 - qRight) / denominator;
            var g1Prime = -kappa * eLeft * (1 + qLeft) / denominator;
            var g2Prime = kappa * eRight * (1 + qRight) / denominator;
            var left = _u[lo];
            return (left * g1 + _bridgeRight * g2, (left * g1Prime + _bridgeRight * g2Prime) / _masses[lo]);
        }
        return LayerState(_kernel, _elements[lo], EnergyElectronVolts, _u[lo], _w[lo], t);
    }

    /// <summary>(ψ, ψ′/m) at the right end of the cell after every element (deltas included): equals e^(ikd) times the state at 0.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtEnd => (_end, _endW);

    /// <summary>(ψ, ψ′/m) at the left end of the cell, before any element.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtOrigin { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Bloch function: band {BandIndex}, k = {WavevectorPerNanometre:G8} /nm, E = {EnergyElectronVolts:G10} eV, period {PeriodNanometres:G6} nm");
}
