// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// The Wannier–Stark ladder of one miniband: the resonances of a long superlattice in a uniform field F, found as the
/// transmission peaks of the biased stack (<see cref="StackTransmission.Create(LayerStack, Energy)"/>,
/// <see cref="StackTransmission.FindResonances"/>), with their spacing (eFd for an ideal lattice), their widths and the
/// Bloch frequency eFd/h.
/// </summary>
/// <remarks>
/// <para>Physics: a field F turns the miniband into states localised over about Δ/(eF) (Δ the band width), one per period,
/// at energies E_j = E_c − eFdj (G. H. Wannier, Phys. Rev. 117, 432 (1960); E. E. Mendez, F. Agulló-Rueda and
/// J. M. Hong, Phys. Rev. Lett. 60, 2426 (1988), the observation in a GaAs/AlGaAs superlattice [from memory]). A carrier
/// placed in the band oscillates at the Bloch frequency eFd/h. In the finite stack each state has a width: it escapes by
/// tunnelling to the contacts and, through the gap, to the ladder of the next miniband (Zener tunnelling); the coherent
/// transmission calculation contains both.</para>
/// <para>Set-up: <c>periods</c> copies of the cell between two leads of the first layer's mass, whose band edge lies below
/// every energy of the ladder (so each rung can couple out), and a bias eU = eF·N·d across the periods. The rungs in the
/// middle third of the ladder's energy window belong to states far from the contacts; their spacings are reported.</para>
/// <para>Limits: the single-band envelope-function model; coherent transport; a uniform field with no space charge; no
/// scattering (a real ladder is broadened by it, and observed only when eFd exceeds the scattering width ħ/τ).</para>
/// </remarks>
public sealed class WannierStarkLadder
{
    private WannierStarkLadder(int bandIndex, double period, int periods, double field, double bias, Resonance[] rungs, double[] spacings, double middleLower, double middleUpper, Lead lead, double gapAbove)
    {
        BandIndex = bandIndex;
        PeriodNanometres = period;
        Periods = periods;
        FieldVoltsPerMetre = field;
        BiasElectronVolts = bias;
        Rungs = new ReadOnlyCollection<Resonance>(rungs);
        MiddleSpacingsElectronVolts = new ReadOnlyCollection<double>(spacings);
        MiddleLowerElectronVolts = middleLower;
        MiddleUpperElectronVolts = middleUpper;
        Lead = lead;
        GapAboveElectronVolts = gapAbove;
    }

    /// <summary>The fewest periods accepted: the middle of the ladder must lie a few periods from each contact.</summary>
    public const int MinPeriods = 8;

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>The number of periods of the stack.</summary>
    public int Periods { get; }

    /// <summary>The field F, V/m.</summary>
    public double FieldVoltsPerMetre { get; }

    /// <summary>The potential drop eU = eF·N·d across the stack, eV.</summary>
    public double BiasElectronVolts { get; }

    /// <summary>The ideal ladder spacing eFd, eV.</summary>
    public double SpacingElectronVolts => FieldVoltsPerMetre * PeriodNanometres * PhysicalConstants.MetresPerNanometre;

    /// <summary>The Bloch frequency eFd/h, Hz.</summary>
    public double BlochFrequencyHertz => SpacingElectronVolts * PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.PlanckJouleSeconds;

    /// <summary>The gap above the band at zero field, eV.</summary>
    public double GapAboveElectronVolts { get; }

    /// <summary>The lead used on both sides (the right one shifted down by the bias).</summary>
    public Lead Lead { get; }

    /// <summary>Every transmission peak found in the ladder's energy window, ascending (rungs of this band and, where they overlap, of others).</summary>
    public IReadOnlyList<Resonance> Rungs { get; }

    /// <summary>Lower end of the middle third of the window, eV (see <see cref="MiddleSpacingsElectronVolts"/>).</summary>
    public double MiddleLowerElectronVolts { get; }

    /// <summary>Upper end of the middle third of the window, eV.</summary>
    public double MiddleUpperElectronVolts { get; }

    /// <summary>
    /// For each rung in the middle third of the window, the distance to the rung closest to one spacing eFd below it (when one
    /// lies within 10 % of eFd), ascending in energy, eV.
    /// </summary>
    public IReadOnlyList<double> MiddleSpacingsElectronVolts { get; }

    /// <summary>
    /// The spacing at the centre of the ladder: of the middle rungs with a partner one eFd below, the one closest to the centre
    /// of the window (the state farthest from both contacts), eV; NaN is never returned: +∞ when there is none.
    /// </summary>
    public double CentralSpacingElectronVolts { get; private init; }

    /// <summary>The largest |spacing − eFd|/eFd over <see cref="MiddleSpacingsElectronVolts"/>; +∞ when there is none.</summary>
    public double LargestRelativeSpacingError =>
        MiddleSpacingsElectronVolts.Count == 0 ? double.PositiveInfinity : MiddleSpacingsElectronVolts.Max(s => Math.Abs(s - SpacingElectronVolts)) / SpacingElectronVolts;

    /// <summary>
    /// Finds the ladder of band <paramref name="bandIndex"/> of <paramref name="cell"/> for <paramref name="periods"/> periods
    /// in the field <paramref name="fieldVoltsPerMetre"/>.
    /// </summary>
    /// <param name="cell">The cell: parabolic layers and delta barriers (as for a biased stack).</param>
    /// <param name="bandIndex">The band, from 1.</param>
    /// <param name="periods">Number of periods, from <see cref="MinPeriods"/>; at most <see cref="StackTransmission.MaxBiasedElements"/> elements in all.</param>
    /// <param name="fieldVoltsPerMetre">F &gt; 0, V/m, with eFd at most the gap above the band (beyond it the ladders of the two bands merge).</param>
    /// <param name="options">Resonance search options (null: the defaults).</param>
    /// <param name="cancellationToken">Cancels the search.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The band, period count or field is out of range.</exception>
    /// <exception cref="ArgumentException">The cell cannot be put under bias, or the stack would exceed <see cref="StackTransmission.MaxBiasedElements"/>.</exception>
    public static WannierStarkLadder Find(UnitCell cell, int bandIndex, int periods, double fieldVoltsPerMetre, ResonanceSearchOptions? options = null,
        CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(bandIndex, 1, 100);
        var maxPeriods = (int)Math.Min(LayerStack.MaxRepetitions, StackTransmission.MaxBiasedElements / Math.Max(1, cell.Elements.Count));
        if (periods < MinPeriods || periods > maxPeriods)
        {
            throw new ArgumentOutOfRangeException(nameof(periods), periods, string.Create(CultureInfo.InvariantCulture,
                $"periods must be from {MinPeriods} to {maxPeriods} (a biased stack holds at most {StackTransmission.MaxBiasedElements} elements; this cell has {cell.Elements.Count}); got {periods}."));
        }
        var bands = BandStructure.Compute(cell, bandIndex);
        var band = bands.GetBand(bandIndex);
        var d = cell.Period.Nanometres;
        var maxField = band.GapAboveElectronVolts / (d * PhysicalConstants.MetresPerNanometre);
        if (!(fieldVoltsPerMetre > 0) || !(fieldVoltsPerMetre <= maxField))
        {
            throw new ArgumentOutOfRangeException(nameof(fieldVoltsPerMetre), fieldVoltsPerMetre, string.Create(CultureInfo.InvariantCulture,
                $"fieldVoltsPerMetre must be above 0 and at most {Preconditions.Format(maxField)} V/m (eFd up to the {Preconditions.Format(band.GapAboveElectronVolts)} eV gap above band {bandIndex}; beyond it the ladders of neighbouring bands merge); got {Preconditions.Format(fieldVoltsPerMetre)}."));
        }
        var bias = fieldVoltsPerMetre * periods * d * PhysicalConstants.MetresPerNanometre;
        var first = cell.Elements.OfType<Layer>().FirstOrDefault()
            ?? throw new ArgumentException("cell must hold at least one layer for the ladder's leads to take its mass.", nameof(cell));
        var lead = Lead.Create(Energy.FromElectronVolts(band.BottomElectronVolts - bias - band.WidthElectronVolts - 0.1), first.Mass);
        var stack = LayerStack.Periodic(lead, cell, periods, lead);
        var transmission = StackTransmission.Create(stack, Energy.FromElectronVolts(bias));
        var spacing = fieldVoltsPerMetre * d * PhysicalConstants.MetresPerNanometre;
        double lower = band.BottomElectronVolts - bias, upper = band.TopElectronVolts;
        var spectrum = transmission.FindResonances(lower, upper, options, cancellationToken);
        var rungs = spectrum.Resonances.OrderBy(r => r.EnergyElectronVolts).ToArray();
        var center = 0.5 * (lower + upper);
        double middleLower = center - bias / 6, middleUpper = center + bias / 6;
        var spacings = new List<double>();
        double central = double.PositiveInfinity, closest = double.PositiveInfinity;
        foreach (var rung in rungs)
        {
            var e = rung.EnergyElectronVolts;
            if (e < middleLower || e > middleUpper)
            {
                continue;
            }
            var below = rungs.Where(r => Math.Abs(e - r.EnergyElectronVolts - spacing) <= 0.1 * spacing)
                .OrderBy(r => Math.Abs(e - r.EnergyElectronVolts - spacing)).ToArray();
            if (below.Length > 0)
            {
                spacings.Add(e - below[0].EnergyElectronVolts);
                if (Math.Abs(e - center) < closest)
                {
                    (closest, central) = (Math.Abs(e - center), e - below[0].EnergyElectronVolts);
                }
            }
        }
        return new WannierStarkLadder(bandIndex, d, periods, fieldVoltsPerMetre, bias, rungs, [.. spacings], middleLower, middleUpper, lead, band.GapAboveElectronVolts)
        {
            CentralSpacingElectronVolts = central,
        };
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Wannier–Stark ladder of band {BandIndex}: F = {FieldVoltsPerMetre:G6} V/m, eFd = {SpacingElectronVolts:G6} eV, Bloch frequency {BlochFrequencyHertz:G6} Hz, {Rungs.Count} rung(s), {MiddleSpacingsElectronVolts.Count} middle spacing(s)");
}
