// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Numerics;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Bands;

/// <summary>
/// The allowed bands and forbidden gaps of an infinite periodic structure, with the dispersion E(k)
/// and the complex wavevector k(E). Immutable and thread-safe; keep it and query it freely.
/// </summary>
/// <remarks>
/// <para>Every band below the highest one returned is guaranteed present: the edge search is bracketed
/// by an oscillation (Prüfer-angle) count of band edges, and after the search the count is checked
/// again at the middle of every band and gap (see <see cref="CellTransfer.CountBandEdgesBelow"/>).</para>
/// <para>The model is the single-band envelope-function (effective-mass) approximation with BenDaniel–Duke
/// matching. Its results are as good as its inputs: treat band offsets and masses as uncertain and confirm
/// design-critical numbers against measurement.</para>
/// </remarks>
public sealed partial class BandStructure
{
    private readonly Band[] _bands;
    private readonly Gap[] _gaps;
    private readonly BandSearchOptions _options;
    private ReadOnlyCollection<Band>? _bandView;
    private ReadOnlyCollection<Gap>? _gapView;
    private BandDispersion?[]? _dispersions;

    private BandStructure(CellTransfer transfer, Band[] bands, Gap[] gaps, BandSearchOptions options, int countChecks)
    {
        Transfer = transfer;
        _bands = bands;
        _gaps = gaps;
        _options = options;
        CountChecks = countChecks;
    }

    /// <summary>The unit cell.</summary>
    public UnitCell Cell => Transfer.Cell;

    /// <summary>The compiled transfer matrix of the cell (callers outside the library use <c>CellTransfer.Create(Cell)</c>).</summary>
    internal CellTransfer Transfer { get; }

    /// <summary>The bands found, lowest first; <c>Bands[n - 1]</c> is band n.</summary>
    public IReadOnlyList<Band> Bands => _bandView ??= new ReadOnlyCollection<Band>(_bands); // made on first use: sweeps of many cells rarely need it

    /// <summary>The gaps above each band found; <c>Gaps[n - 1]</c> lies between band n and n + 1.</summary>
    public IReadOnlyList<Gap> Gaps => _gapView ??= new ReadOnlyCollection<Gap>(_gaps);

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres => Transfer.PeriodNanometres;

    /// <summary>The tolerances used.</summary>
    public BandSearchOptions Options => _options;

    /// <summary>How many independent oscillation-count checks the result passed (one in every band and every gap).</summary>
    public int CountChecks { get; }

    /// <summary>The largest error bound of any edge returned, eV.</summary>
    public double MaxEdgeErrorElectronVolts
    {
        get
        {
            var max = 0.0;
            foreach (var band in _bands)
            {
                max = Math.Max(max, Math.Max(band.BottomErrorElectronVolts, band.TopErrorElectronVolts));
            }
            return max;
        }
    }

    /// <summary>Finds the lowest <paramref name="count"/> bands of <paramref name="cell"/>.</summary>
    /// <param name="cell">The unit cell.</param>
    /// <param name="count">Number of bands, 1 to 10,000.</param>
    /// <param name="options">Tolerances; <see cref="BandSearchOptions.Default"/> when null.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="count"/> is outside 1 to 10,000.</exception>
    /// <exception cref="BandSearchException">The search could not complete (see message).</exception>
    public static BandStructure Compute(UnitCell cell, int count, BandSearchOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(count, 1, 10000);
        var transfer = CellTransfer.Create(cell);
        return Compute(transfer, count, options ?? DefaultOptionsFor(transfer));
    }

    /// <summary>Finds every band whose bottom lies below <paramref name="energyLimit"/> (at least one band).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">More than 10,000 bands lie below the limit, or the limit is outside the model's energy range.</exception>
    /// <exception cref="BandSearchException">The search could not complete (see message).</exception>
    public static BandStructure ComputeBelow(UnitCell cell, Energy energyLimit, BandSearchOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        var transfer = CellTransfer.Create(cell);
        var edgesBelow = transfer.CountBandEdgesBelow(energyLimit.ElectronVolts);
        var count = Math.Max(1, (edgesBelow + 1) / 2);
        if (count > 10000)
        {
            throw new ArgumentOutOfRangeException(nameof(energyLimit), energyLimit.ElectronVolts,
                string.Create(CultureInfo.InvariantCulture, $"energyLimit lies above {count} bands; at most 10000 can be computed at once."));
        }
        return Compute(transfer, count, options ?? DefaultOptionsFor(transfer));
    }

    /// <summary>
    /// The natural energy scale of a cell, eV: the larger of its potential spread and the first-zone
    /// kinetic energy ħ²(π/d)²/(2m). Lets tolerances and thresholds follow the cell, whether its bands
    /// lie at 0.1 eV (a semiconductor superlattice) or 1e-11 eV (cold atoms in an optical lattice).
    /// </summary>
    internal static double EnergyScaleElectronVolts(CellTransfer transfer)
    {
        var cell = transfer.Cell;
        var k = Math.PI / transfer.PeriodNanometres;
        var kinetic = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * k * k / cell.MinimumMass.ElectronMasses;
        return Math.Max(cell.MaximumPotential.ElectronVolts - cell.MinimumPotential.ElectronVolts, kinetic);
    }

    /// <summary>The default options, with the absolute tolerance capped at 1e-15 of the cell's energy scale.</summary>
    private static BandSearchOptions DefaultOptionsFor(CellTransfer transfer)
    {
        var scaled = BandSearchOptions.DefaultAbsoluteToleranceElectronVolts * Math.Min(1.0, EnergyScaleElectronVolts(transfer));
        return scaled >= BandSearchOptions.DefaultAbsoluteToleranceElectronVolts || !(scaled >= 1e-300)
            ? BandSearchOptions.Default
            : BandSearchOptions.Create(absoluteToleranceElectronVolts: scaled);
    }

    private static BandStructure Compute(CellTransfer transfer, int count, BandSearchOptions options)
    {
        try
        {
            return Search(transfer, count, options);
        }
        catch (BandSearchException failure) when (transfer.Cell.RepeatCount() > 1)
        {
            throw SupercellHint(transfer.Cell, failure);
        }
    }

    private static BandStructure Search(CellTransfer transfer, int count, BandSearchOptions options)
    {
        // Edges 0 … 2N: the extra one is the bottom of band N + 1, so the gap above band N is known.
        var finder = new BandEdgeFinder(transfer, options);
        var edgeCount = 2 * count + 1;
        // Scratch on the stack for a few bands (sweeps of many small cells then allocate only their results).
        var small = edgeCount <= 65;
        var edges = small ? stackalloc double[edgeCount] : new double[edgeCount];
        var errors = small ? stackalloc double[edgeCount] : new double[edgeCount];
        var closed = small ? stackalloc bool[count + 2] : new bool[count + 2];
        closed.Clear();
        finder.FindEdges(edges, errors, closed);
        ApplyRoundingFloor(transfer, edges, errors, closed);
        var bands = new Band[count];
        var gaps = new Gap[count];
        for (var n = 1; n <= count; n++)
        {
            double bottom = edges[2 * n - 2], top = edges[2 * n - 1], next = edges[2 * n];
            bands[n - 1] = new Band(n, bottom, top, errors[2 * n - 2], errors[2 * n - 1], next - top);
            gaps[n - 1] = new Gap(n, top, next, closed[n] || next == top);
        }
        var checks = Reconcile(transfer, bands, gaps);
        return new BandStructure(transfer, bands, gaps, options, checks);
    }

    /// <summary>
    /// Raises each edge's error bound to the rounding floor of the dispersion function, and closes gaps whose
    /// opening is below that floor (their width is not resolved in double precision).
    /// </summary>
    /// <remarks>
    /// D = Tr M carries a rounding error δD of about 8√n ulps (n elements) of max_j tr(|M_n⋯M_{j+1}|·|M_j⋯M_1|)
    /// (<see cref="CellTransfer.LogRoundingAmplification"/>). A simple edge then moves by
    /// δD/|D′|. A gap is resolved only if |D| exceeds 2 by more than δD between its edges; otherwise its two
    /// edges are one degenerate edge known to about √(2δD/|D″|). For most cells δD is ~1e-15 and nothing
    /// changes; for cells with several thick barriers per period it can grow to 1e-5 and more
    /// (docs/core.md, "Resolution limits"), and the bounds say so.
    /// </remarks>
    private static void ApplyRoundingFloor(CellTransfer transfer, Span<double> edges, Span<double> errors, Span<bool> closed)
    {
        // Rounding accumulates over the elements; √n is its statistical growth (Higham §2.8).
        var ulps = 8 * FloatingPoint.MachineEpsilon * Math.Sqrt(transfer.Cell.Elements.Count);
        for (var i = 0; i < edges.Length; i++)
        {
            var gapOfEdge = (i + 1) / 2; // edges 2j − 1 and 2j bound gap j
            if (i > 0 && gapOfEdge < closed.Length && closed[gapOfEdge])
            {
                continue; // handled with its pair below
            }
            var value = transfer.Dispersion(edges[i]);
            var logSlope = Math.Log(Math.Abs(value.ScaledTraceDerivativePerElectronVolt)) + value.LogScale;
            var logAmplification = transfer.LogRoundingAmplification(edges[i]);
            var logFloor = Math.Log(ulps) + logAmplification - logSlope;
            // Near M = ±I the edge search works on det(M ∓ I) (see BandEdgeFinder), whose rounding is
            // smaller by the factor |M ∓ I| (but never below the rounding of the entries themselves).
            var shifted = ShiftedNorm(transfer, edges[i], BandEdgeFinder.TargetTrace(i));
            if (shifted <= 1e-3)
            {
                logFloor += Math.Log(Math.Max(shifted, ulps * Math.Exp(Math.Min(logAmplification, 700))));
            }
            if (logFloor < 700)
            {
                errors[i] = Math.Max(errors[i], Math.Exp(logFloor));
            }
        }
        for (var j = 1; 2 * j < edges.Length && j < closed.Length; j++)
        {
            int lower = 2 * j - 1, upper = 2 * j;
            var middle = 0.5 * (edges[lower] + edges[upper]);
            var width = edges[upper] - edges[lower];
            var roundingOfTrace = ulps * Math.Exp(Math.Min(transfer.LogRoundingAmplification(middle), 700));
            var atMiddle = transfer.Dispersion(middle);
            var excess = Math.Abs(atMiddle.Trace) - 2;
            if (!closed[j] && excess > roundingOfTrace && width > errors[lower] + errors[upper])
            {
                continue; // a resolved open gap
            }
            // Degenerate within rounding: one edge, known to √(2δD/|D″|) plus half the width seen.
            var h = Math.Max(width, 1e-9 * Math.Max(Math.Abs(middle), EnergyScaleElectronVolts(transfer)));
            var curvature = Math.Abs(transfer.Dispersion(middle + h).TraceDerivativePerElectronVolt
                - transfer.Dispersion(middle - h).TraceDerivativePerElectronVolt) / (2 * h);
            var spread = curvature > 0 ? Math.Sqrt(2 * roundingOfTrace / curvature) : 0;
            var error = Math.Max(Math.Max(errors[lower], errors[upper]), 0.5 * width + (double.IsFinite(spread) ? spread : 0));
            edges[lower] = edges[upper] = middle;
            errors[lower] = errors[upper] = error;
            closed[j] = true;
        }
    }

    /// <summary>max |(M ∓ I)_ij| at an edge; +∞ when M is beyond the double range.</summary>
    private static double ShiftedNorm(CellTransfer transfer, double energy, double target)
    {
        var m = transfer.Evaluate(energy);
        if (m.LogScale > 600)
        {
            return double.PositiveInfinity;
        }
        var scale = Math.Exp(m.LogScale);
        var sign = target > 0 ? 1.0 : -1.0;
        var mantissa = m.Mantissa;
        return new Transfer.TransferMatrix(mantissa.M11 * scale - sign, mantissa.M12 * scale, mantissa.M21 * scale, mantissa.M22 * scale - sign).MaxAbsEntry;
    }

    /// <summary>Checks the oscillation count at the middle of every band (2n − 1) and open gap (2n).</summary>
    private static int Reconcile(CellTransfer transfer, Band[] bands, Gap[] gaps)
    {
        var checks = 0;
        var scale = EnergyScaleElectronVolts(transfer);
        for (var i = 0; i < bands.Length; i++)
        {
            var band = bands[i];
            if (band.WidthElectronVolts > 1e-9 * Math.Max(scale, Math.Abs(band.CenterElectronVolts)))
            {
                Expect(transfer, band.CenterElectronVolts, 2 * band.Index - 1, "band", band.Index);
                checks++;
            }
            var gap = gaps[i];
            if (!gap.IsClosed && gap.WidthElectronVolts > 1e-9 * Math.Max(scale, Math.Abs(gap.LowerElectronVolts)))
            {
                Expect(transfer, 0.5 * (gap.LowerElectronVolts + gap.UpperElectronVolts), 2 * gap.Index, "gap", gap.Index);
                checks++;
            }
        }
        return checks;
    }

    /// <summary>
    /// The search failed on a cell that is N copies of a shorter period: its N − 1 folded gaps per band are exactly
    /// closed, which thick barriers put below the resolution of double precision (docs/core.md). Says so and what to do.
    /// </summary>
    private static BandSearchException SupercellHint(UnitCell cell, BandSearchException failure)
    {
        var repeats = cell.RepeatCount();
        return new BandSearchException(string.Create(CultureInfo.InvariantCulture,
            $"{failure.Message} The cell is {repeats} identical copies of a period of {cell.Elements.Count / repeats} elements: its folded gaps are exactly closed and here below the resolution of double precision (docs/core.md, cells with several thick barriers). Compute the bands of the shorter period instead; each of its bands is {repeats} bands of this cell, folded."),
            failure);
    }

    private static void Expect(CellTransfer transfer, double energy, int expected, string what, int index)
    {
        var counted = transfer.CountBandEdgesBelow(energy);
        if (counted != expected)
        {
            throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
                $"the oscillation count at the middle of {what} {index} ({energy:R} eV) is {counted}, expected {expected}: an edge was missed or misplaced."));
        }
    }

    /// <summary>The band with 1-based index <paramref name="bandIndex"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">No such band was computed.</exception>
    public Band GetBand(int bandIndex)
    {
        Preconditions.CheckRange(bandIndex, 1, _bands.Length);
        return _bands[bandIndex - 1];
    }

    /// <summary>
    /// The energy E_n(k), eV, of band <paramref name="bandIndex"/> at Bloch wavevector
    /// <paramref name="wavevectorPerNanometre"/> in the first zone [−π/d, π/d] (E(−k) = E(k)).
    /// </summary>
    /// <remarks>Method: safeguarded Newton search on D(E) = 2 cos(kd) inside the band, where D is monotone.</remarks>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or k is not finite or lies outside the first zone.</exception>
    public double EnergyAt(int bandIndex, double wavevectorPerNanometre)
    {
        var band = GetBand(bandIndex);
        var phase = ReducedPhase(wavevectorPerNanometre);
        return EnergyAtPhase(band, phase);
    }

    /// <summary>
    /// Effectively computes <c>destinationElectronVolts[i] = E_n(wavevectorsPerNanometre[i])</c> in eV for band
    /// <paramref name="bandIndex"/>. From <see cref="FastPathMinimumPoints"/> wavevectors on, the band's
    /// Chebyshev inversion (<see cref="DispersionOf"/>, built once and kept) evaluates them, about 70 times
    /// faster than a root search per point; its accuracy is that dispersion's
    /// <see cref="BandDispersion.ErrorEstimateElectronVolts"/> (built to the root search's own tolerance).
    /// Shorter spans use the root search of <see cref="EnergyAt"/>. Allocates only when the inversion is first built.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a wavevector is outside the first zone (destination is then unchanged).</exception>
    public void EnergiesAt(int bandIndex, ReadOnlySpan<double> wavevectorsPerNanometre, Span<double> destinationElectronVolts)
    {
        var band = GetBand(bandIndex);
        Preconditions.CheckDestination(wavevectorsPerNanometre.Length, destinationElectronVolts.Length, nameof(wavevectorsPerNanometre), nameof(destinationElectronVolts));
        if (wavevectorsPerNanometre.Length >= FastPathMinimumPoints)
        {
            DispersionOf(bandIndex).EnergiesAt(wavevectorsPerNanometre, destinationElectronVolts);
            return;
        }
        // Validate every wavevector before writing anything: no partial output on a bad element.
        for (var i = 0; i < wavevectorsPerNanometre.Length; i++)
        {
            ReducedPhase(wavevectorsPerNanometre[i], i);
        }
        for (var i = 0; i < wavevectorsPerNanometre.Length; i++)
        {
            destinationElectronVolts[i] = EnergyAtPhase(band, ReducedPhase(wavevectorsPerNanometre[i], i));
        }
    }

    /// <summary>
    /// Number of wavevectors from which <see cref="EnergiesAt"/> uses the band's Chebyshev inversion: building it
    /// takes a few hundred root searches at most (the benchmark cells: 60 to 440), so from here on it pays even on
    /// the first call.
    /// </summary>
    public const int FastPathMinimumPoints = 512;

    /// <summary>
    /// The Chebyshev inversion of band <paramref name="bandIndex"/> (<see cref="BandDispersion"/>), built on first
    /// use to the accuracy of this structure's root search and kept; its error estimate is the accuracy of
    /// <see cref="EnergiesAt"/> on long spans. Thread-safe.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">No such band was computed.</exception>
    public BandDispersion DispersionOf(int bandIndex)
    {
        GetBand(bandIndex);
        var cache = _dispersions ?? Interlocked.CompareExchange(ref _dispersions, new BandDispersion?[_bands.Length], null) ?? _dispersions;
        var built = Volatile.Read(ref cache[bandIndex - 1]);
        if (built is null)
        {
            built = BandDispersion.CreateAtSearchAccuracy(this, bandIndex);
            built = Interlocked.CompareExchange(ref cache[bandIndex - 1], built, null) ?? built;
        }
        return built;
    }

    /// <summary>The complex Bloch wavevector k(E) at any energy (see <see cref="BlochWavevector"/>).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite or outside the model's range.</exception>
    public BlochWavevector WavevectorAt(double energyElectronVolts) => Transfer.Dispersion(energyElectronVolts).Wavevector;

    /// <summary>
    /// The 1-based index of the band containing <paramref name="energyElectronVolts"/>, or 0 when the
    /// energy lies in a gap (or below the lowest band). From the oscillation count, so valid for bands
    /// above those computed too.
    /// </summary>
    public int BandIndexAt(double energyElectronVolts)
    {
        var count = Transfer.CountBandEdgesBelow(energyElectronVolts);
        return count % 2 == 1 ? (count + 1) / 2 : 0;
    }

    private double ReducedPhase(double k, int index = -1)
    {
        var d = PeriodNanometres;
        var phase = Math.Abs(k) * d;
        // A wavevector computed as π/d by the caller may differ from ours by an ulp or two.
        if (!(phase <= Math.PI * (1 + 8 * FloatingPoint.MachineEpsilon)))
        {
            // ParamName is the real parameter; the message names the element of a span.
            var paramName = index < 0 ? "wavevectorPerNanometre" : "wavevectorsPerNanometre";
            var name = index < 0 ? paramName : string.Create(CultureInfo.InvariantCulture, $"wavevectorsPerNanometre[{index}]");
            throw new ArgumentOutOfRangeException(paramName, k,
                $"{name} must be a finite wavevector in the first Brillouin zone [-pi/d, pi/d] = [-{Preconditions.Format(Math.PI / d)}, {Preconditions.Format(Math.PI / d)}] 1/nm; got {Preconditions.Format(k)}.");
        }
        return Math.Min(phase, Math.PI);
    }

    private double EnergyAtPhase(Band band, double phase)
    {
        var bottomAtCenter = band.BottomZonePoint == ZonePoint.Center;
        if (phase == 0)
        {
            return bottomAtCenter ? band.BottomElectronVolts : band.TopElectronVolts;
        }
        if (phase == Math.PI)
        {
            return bottomAtCenter ? band.TopElectronVolts : band.BottomElectronVolts;
        }
        if (band.WidthElectronVolts == 0)
        {
            return band.BottomElectronVolts;
        }
        var function = new TraceMinusValue(Transfer, 2 * Math.Cos(phase));
        var result = RootFinding.SafeguardedNewton(ref function, band.BottomElectronVolts, band.TopElectronVolts,
            _options.AbsoluteToleranceElectronVolts, _options.RelativeTolerance, _options.MaxIterations);
        if (result.Status == RootStatus.NotBracketed)
        {
            // k within rounding of a zone point: cos(kd) and D(edge) agree to the last bit.
            var fBottom = Math.Abs(function.Evaluate(band.BottomElectronVolts, out _));
            var fTop = Math.Abs(function.Evaluate(band.TopElectronVolts, out _));
            return fBottom <= fTop ? band.BottomElectronVolts : band.TopElectronVolts;
        }
        return result.Root;
    }

    private readonly struct TraceMinusValue(CellTransfer transfer, double value) : IDifferentiableFunction
    {
        public double Evaluate(double x, out double derivative)
        {
            var p = transfer.Accumulate(x);
            var scale = Math.Exp(p.LogScale);
            derivative = p.TraceDerivativeMantissa * scale;
            return p.TraceMantissa * scale - value;
        }
    }

    /// <summary>A table of bands and gaps, one per line, energies in eV.</summary>
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"BandStructure: {_bands.Length} band(s), period {PeriodNanometres:G6} nm").AppendLine();
        text.AppendLine("  band   bottom (eV)     top (eV)        width (meV)    gap above (meV)");
        foreach (var band in _bands)
        {
            text.Append(CultureInfo.InvariantCulture,
                $"  {band.Index,4}   {band.BottomElectronVolts,-14:F9}  {band.TopElectronVolts,-14:F9}  {band.WidthElectronVolts * 1e3,-13:G8}  {band.GapAboveElectronVolts * 1e3:G8}").AppendLine();
        }
        return text.ToString().TrimEnd();
    }
}
