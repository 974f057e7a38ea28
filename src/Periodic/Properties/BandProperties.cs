// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Transfer;
using Periodic.Units;
using Periodic.Numerics;

namespace Periodic.Properties;

/// <summary>
/// Quantities derived from the exact dispersion cos(kd) = D(E)/2 of a computed
/// <see cref="BandStructure"/>: group velocity, effective masses, density of states (1D and
/// superlattice), integrated density of states and carrier densities. Immutable and thread-safe;
/// create once per band structure and query freely.
/// </summary>
/// <remarks>
/// <para>Everything here follows from D(E) = Tr M(E) and its exact energy derivatives (the core's
/// product-rule derivative D′, and Taylor-mode derivatives D″, D‴ for curvatures and closed gaps),
/// never from finite differences of E(k).</para>
/// <para>Energy arguments must lie below the bottom of the first band that was not computed
/// (top of the highest computed band plus the gap above it), so that every band edge involved is known.</para>
/// <para>The model is the single-band envelope-function approximation of the cell: treat band offsets
/// and masses as uncertain inputs and confirm design-critical numbers against measurement.</para>
/// </remarks>
public sealed partial class BandProperties
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>
    /// Half-width, in units of the band width, of the window around a closed gap inside which the local
    /// expansion E = E₀ + a q + b q² replaces a 0/0 ratio, for quantities computed from √(4 − D²): there the
    /// ratio loses ε/δ² relatively and the expansion δ², balanced at δ = ε^¼ ≈ 1e-4 (both ≈ 1e-8).
    /// </summary>
    private const double ClosedGapWindowFromTrace = 1e-4;

    /// <summary>
    /// Half-width in Bloch phase |kd − zone point| of the window around a closed gap inside which quantities
    /// at a given k use the crossing expansion. E(k) from the trace carries a relative error ε/(qd)² in E − E₀
    /// there (cos kd near ±1 resolves (qd)² only to ε), which the slope inherits and the curvature amplifies to
    /// ε/(qd)³; the expansion errs by O((qd)²) for the slope and O(qd) for the curvature. At 1e-4 the slope is
    /// good to ≈ 1e-8 and the curvature to ≈ 1e-4 (documented).
    /// </summary>
    private const double ClosedGapPhaseWindow = 1e-4;

    private readonly BandStructure _structure;
    private readonly CellTransfer _transfer;
    private readonly double _d;
    private readonly EdgeData[] _bottoms;
    private readonly EdgeData[] _tops;
    private readonly double _upperLimit;

    private BandProperties(BandStructure structure)
    {
        _structure = structure;
        _transfer = structure.Transfer;
        _d = structure.PeriodNanometres;
        var count = structure.Bands.Count;
        _bottoms = new EdgeData[count];
        _tops = new EdgeData[count];
        for (var i = 0; i < count; i++)
        {
            var band = structure.Bands[i];
            var closedBelow = i > 0 && structure.Gaps[i - 1].IsClosed;
            var closedAbove = structure.Gaps[i].IsClosed;
            _bottoms[i] = MakeEdge(band.BottomElectronVolts, band.BottomZonePoint, closedBelow);
            _tops[i] = MakeEdge(band.TopElectronVolts, band.TopZonePoint, closedAbove);
        }
        var last = structure.Bands[count - 1];
        _upperLimit = last.TopElectronVolts + last.GapAboveElectronVolts;
    }

    /// <summary>The band structure these properties derive from.</summary>
    public BandStructure Structure => _structure;

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres => _d;

    /// <summary>
    /// The highest energy (eV) accepted by the energy-based methods: the bottom of the first band
    /// above those computed.
    /// </summary>
    public double UpperEnergyLimitElectronVolts => _upperLimit;

    /// <summary>Prepares the derived quantities of <paramref name="structure"/> (evaluates D′ at every band edge).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    public static BandProperties Create(BandStructure structure)
    {
        ArgumentNullException.ThrowIfNull(structure);
        return new BandProperties(structure);
    }

    /// <summary>What is known about one band edge.</summary>
    private readonly struct EdgeData
    {
        internal EdgeData(double energy, double sigma, double slope, bool closed, double crossingSlope, double crossingCurvature)
        {
            Energy = energy;
            Sigma = sigma;
            TraceSlope = slope;
            Closed = closed;
            CrossingSlope = crossingSlope;
            CrossingCurvature = crossingCurvature;
        }

        internal double Energy { get; }

        /// <summary>D(E0)/2: +1 at the zone centre, −1 at the boundary.</summary>
        internal double Sigma { get; }

        /// <summary>D′(E0), 1/eV.</summary>
        internal double TraceSlope { get; }

        internal bool Closed { get; }

        /// <summary>Closed gap: a = |dE/dq| of the smooth crossing E = E0 + a q + b q², eV·nm.</summary>
        internal double CrossingSlope { get; }

        /// <summary>Closed gap: b (eV·nm²), so d²E/dk² = 2b.</summary>
        internal double CrossingCurvature { get; }
    }

    private EdgeData MakeEdge(double energy, ZonePoint point, bool closed)
    {
        var sigma = point == ZonePoint.Center ? 1.0 : -1.0;
        var slope = _transfer.Dispersion(energy).TraceDerivativePerElectronVolt;
        if (!closed)
        {
            return new EdgeData(energy, sigma, slope, false, 0, 0);
        }
        // Near a closed gap D − 2σ = (D″/2)δ² + (D‴/6)δ³ and D/2 = σ cos(qd) with q the extended-zone
        // offset; matching orders with δ = a q + b q² gives a² = −2σd²/D″ and b = σ D‴ d² / (3 D″²).
        var jet = DispersionDerivatives.Evaluate(_structure.Transfer.Compiled, energy);
        var d2 = jet.D2; // the common scale cancels in both ratios below
        var d3 = jet.D3;
        var a2 = -2 * sigma * _d * _d / (d2 * jet.Scale);
        var a = a2 > 0 && double.IsFinite(a2) ? Math.Sqrt(a2) : 0.0;
        var b = sigma * d3 * _d * _d / (3 * d2 * d2 * jet.Scale);
        if (!double.IsFinite(b))
        {
            b = 0;
        }
        return new EdgeData(energy, sigma, slope, true, a, b);
    }

    private static string Format(double value) => Preconditions.Format(value);

    /// <summary>One line per band: edges with their masses and the closed-gap flags.</summary>
    public override string ToString()
    {
        var text = new System.Text.StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"BandProperties: {_bottoms.Length} band(s), period {_d:G6} nm, energies up to {_upperLimit:G8} eV").AppendLine();
        text.AppendLine("  band   bottom (eV)     m* bottom (m0)   top (eV)        m* top (m0)");
        for (var n = 1; n <= _bottoms.Length; n++)
        {
            var bottom = BottomMassText(n);
            var top = TopMassText(n);
            text.Append(CultureInfo.InvariantCulture,
                $"  {n,4}   {_bottoms[n - 1].Energy,-14:F9}  {bottom,-15}{(_bottoms[n - 1].Closed ? "*" : " ")}  {_tops[n - 1].Energy,-14:F9}  {top}{(_tops[n - 1].Closed ? "*" : "")}").AppendLine();
        }
        text.Append("  (* closed gap: mass of the smooth crossing)");
        return text.ToString();
    }

    private string BottomMassText(int n) => MassText(() => BottomMass(n).ElectronMasses);

    private string TopMassText(int n) => MassText(() => TopMass(n).ElectronMasses);

    private static string MassText(Func<double> mass) => mass().ToString("G8", CultureInfo.InvariantCulture);

    /// <summary>Where an energy lies: band n (1-based) or gap n (0 below the first band).</summary>
    /// <summary>Checks every energy of a span before anything is written (no partial output).</summary>
    private void CheckEnergies(ReadOnlySpan<double> energies, string parameter)
    {
        for (var i = 0; i < energies.Length; i++)
        {
            var energy = energies[i];
            if (!double.IsFinite(energy) || energy <= _transfer.LowestValidEnergyElectronVolts || energy > _upperLimit)
            {
                Locate(energy, parameter, i); // throws with the standard message
            }
        }
    }

    /// <summary>Checks every wavevector of a span before anything is written (no partial output).</summary>
    private void CheckWavevectors(ReadOnlySpan<double> wavevectors, string parameter)
    {
        for (var i = 0; i < wavevectors.Length; i++)
        {
            Phase(wavevectors[i], parameter, i);
        }
    }

    private (int Index, bool InBand) Locate(double energy, string parameter, int element = -1)
    {
        if (!double.IsFinite(energy) || energy <= _transfer.LowestValidEnergyElectronVolts || energy > _upperLimit)
        {
            // ParamName is the real parameter; the message names the element of a span.
            var paramName = element < 0 ? parameter : ElementName(parameter, element);
            throw new ArgumentOutOfRangeException(parameter, energy, string.Create(CultureInfo.InvariantCulture,
                $"{paramName} must be a finite energy above {Format(_transfer.LowestValidEnergyElectronVolts)} eV and at most {Format(_upperLimit)} eV (the bottom of band {_bottoms.Length + 1}, the first band not computed); got {Format(energy)}. Compute more bands to go higher."));
        }
        // Largest n with bottom_n ≤ E.
        int lo = 0, hi = _bottoms.Length - 1, found = -1;
        while (lo <= hi)
        {
            var mid = (lo + hi) >> 1;
            if (_bottoms[mid].Energy <= energy)
            {
                found = mid;
                lo = mid + 1;
            }
            else
            {
                hi = mid - 1;
            }
        }
        if (found < 0)
        {
            return (0, false);
        }
        return energy <= _tops[found].Energy ? (found + 1, true) : (found + 1, false);
    }

    private int CheckBand(int bandIndex) => Preconditions.CheckRange(bandIndex, 1, _bottoms.Length);

    /// <summary>Reduces k to the Bloch phase |k|d in [0, π]; throws outside the first zone.</summary>
    private double Phase(double k, string parameter, int element = -1)
    {
        var phase = Math.Abs(k) * _d;
        if (!(phase <= Math.PI * (1 + 8 * FloatingPoint.MachineEpsilon)))
        {
            var paramName = element < 0 ? parameter : ElementName(parameter, element);
            throw new ArgumentOutOfRangeException(parameter, k,
                $"{paramName} must be a finite wavevector in the first Brillouin zone [-pi/d, pi/d] = [-{Format(Math.PI / _d)}, {Format(Math.PI / _d)}] 1/nm; got {Format(k)}.");
        }
        return Math.Min(phase, Math.PI);
    }

    /// <summary>The closed-gap edge of band n within the expansion window of <paramref name="energy"/>, if any.</summary>
    private bool NearClosedEdge(int bandIndex, double energy, double relativeWindow, out EdgeData edge, out double offset)
    {
        var window = relativeWindow * Math.Max(_tops[bandIndex - 1].Energy - _bottoms[bandIndex - 1].Energy, 1e-300);
        edge = _tops[bandIndex - 1];
        offset = energy - edge.Energy;
        if (HasCrossing(edge) && Math.Abs(offset) <= window)
        {
            return true;
        }
        edge = _bottoms[bandIndex - 1];
        offset = energy - edge.Energy;
        return HasCrossing(edge) && Math.Abs(offset) <= window;
    }

    /// <summary>
    /// The closed-gap edge of band n at the zone point nearest to Bloch phase θ, when θ lies within
    /// <see cref="ClosedGapPhaseWindow"/> of it; <paramref name="offset"/> is the extended-zone offset q (1/nm)
    /// along which E rises: E ≈ E₀ + a q + b q².
    /// </summary>
    private bool NearClosedZonePoint(int bandIndex, double phase, out EdgeData edge, out double offset)
    {
        var atCenter = phase < 0.5 * Math.PI;
        var distance = atCenter ? phase : Math.PI - phase;
        var isBottom = atCenter == (bandIndex % 2 == 1);
        edge = isBottom ? _bottoms[bandIndex - 1] : _tops[bandIndex - 1];
        offset = (isBottom ? 1 : -1) * distance / _d;
        return HasCrossing(edge) && distance <= ClosedGapPhaseWindow;
    }

    /// <summary>A closed gap whose crossing slope is usable; a zero slope (D″ = 0 too) falls back to the general formulas.</summary>
    private static bool HasCrossing(EdgeData edge) => edge.Closed && edge.CrossingSlope != 0;
}
