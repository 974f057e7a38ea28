// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Units;

namespace Periodic.Properties;

public sealed partial class BandProperties
{
    /// <summary>
    /// The group velocity v = (1/ħ) dE/dk of band <paramref name="bandIndex"/> at Bloch wavevector
    /// <paramref name="wavevectorPerNanometre"/> in [−π/d, π/d].
    /// </summary>
    /// <remarks>
    /// <para>Method: differentiating the Bloch condition cos(kd) = D(E)/2 gives
    /// dE/dk = −2d·sin(kd)/D′(E) exactly, with D′ the exact energy derivative of the trace (F. Bloch,
    /// Z. Phys. 52, 555 (1929); N. W. Ashcroft and N. D. Mermin, Solid State Physics, ch. 8). E(−k) = E(k), so
    /// the velocity is odd in k.</para>
    /// <para>At a zone point (k = 0 or ±π/d) the velocity is exactly 0 at an open gap. At a closed gap
    /// (the two bands cross linearly) it is the one-sided limit from inside the zone, taken towards
    /// k ≥ 0: |dE/dk| of the crossing, positive in odd bands, negative in even bands. Within 1e-4 in kd of
    /// a closed gap the local expansion E = E₀ + a q + b q² is used; the relative accuracy there is about 1e-8
    /// instead of rounding level.</para>
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or k is not finite or outside the first zone.</exception>
    public GroupVelocity GroupVelocityAt(int bandIndex, double wavevectorPerNanometre)
    {
        CheckBand(bandIndex);
        var phase = Phase(wavevectorPerNanometre, nameof(wavevectorPerNanometre));
        var energy = _structure.EnergyAt(bandIndex, wavevectorPerNanometre);
        var slope = SlopeAtPhase(bandIndex, phase, energy) * (wavevectorPerNanometre < 0 ? -1.0 : 1.0);
        return new GroupVelocity(bandIndex, wavevectorPerNanometre, energy, slope);
    }

    /// <summary>
    /// The group velocity of the Bloch state with k ≥ 0 at energy <paramref name="energyElectronVolts"/>:
    /// positive in odd bands (E rises from the zone centre), negative in even bands.
    /// </summary>
    /// <remarks>Method as for <see cref="GroupVelocityAt"/>, with sin(kd) = √(4 − D²)/2. At an exact open band edge
    /// the velocity is 0; an energy exactly at a closed gap belongs to the upper of the two bands; within 1e-4 of
    /// the band width of a closed gap the crossing expansion is used (≈ 1e-8 relative).</remarks>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, outside the computed range, or in a gap.</exception>
    public GroupVelocity GroupVelocityAtEnergy(double energyElectronVolts)
    {
        var (index, inBand) = Locate(energyElectronVolts, nameof(energyElectronVolts));
        if (!inBand && _transfer.Dispersion(energyElectronVolts).IsInBand)
        {
            if (index == 0)
            {
                return new GroupVelocity(1, 0.0, energyElectronVolts, 0.0); // just below the bottom of band 1
            }
            // Within rounding of an edge (|D| ≤ 2 just outside the edge energies found): the edge state, v = 0.
            var below = energyElectronVolts - _tops[index - 1].Energy;
            var above = (index < _bottoms.Length ? _bottoms[index].Energy : _upperLimit) - energyElectronVolts;
            var band = below <= above ? index : index + 1;
            var zoneK = index % 2 == 1 ? Math.PI / _d : 0.0; // odd gaps open at the zone boundary, even ones at the centre
            return new GroupVelocity(band, zoneK, energyElectronVolts, 0.0);
        }
        if (!inBand)
        {
            throw new ArgumentOutOfRangeException(nameof(energyElectronVolts), energyElectronVolts, string.Create(CultureInfo.InvariantCulture,
                $"energyElectronVolts = {Format(energyElectronVolts)} eV lies in {(index == 0 ? "the region below the first band" : $"gap {index}")}, where no propagating state exists; allowed are energies inside a band."));
        }
        var value = _transfer.Dispersion(energyElectronVolts);
        var k = value.Wavevector.RealPerNanometre;
        var phase = k * _d;
        return new GroupVelocity(index, k, energyElectronVolts, SlopeAtPhase(index, phase, energyElectronVolts, fromTrace: true));
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = dE/dk</c> (eV·nm) of band <paramref name="bandIndex"/> at
    /// <c>wavevectorsPerNanometre[i]</c>, as <see cref="GroupVelocityAt"/>; does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a wavevector is outside the first zone.</exception>
    public void SlopesAt(int bandIndex, ReadOnlySpan<double> wavevectorsPerNanometre, Span<double> destinationElectronVoltNanometres)
    {
        CheckBand(bandIndex);
        Preconditions.CheckDestination(wavevectorsPerNanometre.Length, destinationElectronVoltNanometres.Length, nameof(wavevectorsPerNanometre), nameof(destinationElectronVoltNanometres));
        CheckWavevectors(wavevectorsPerNanometre, nameof(wavevectorsPerNanometre));
        WriteSlopes(bandIndex, wavevectorsPerNanometre, destinationElectronVoltNanometres);
    }

    private void WriteSlopes(int bandIndex, ReadOnlySpan<double> wavevectorsPerNanometre, Span<double> destinationElectronVoltNanometres)
    {
        for (var i = 0; i < wavevectorsPerNanometre.Length; i++)
        {
            var k = wavevectorsPerNanometre[i];
            var phase = Phase(k, nameof(wavevectorsPerNanometre), i);
            var energy = _structure.EnergyAt(bandIndex, Math.Min(phase / _d, Math.PI / _d));
            destinationElectronVoltNanometres[i] = SlopeAtPhase(bandIndex, phase, energy) * (k < 0 ? -1.0 : 1.0);
        }
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = v</c> (m/s) of band <paramref name="bandIndex"/> at
    /// <c>wavevectorsPerNanometre[i]</c>, as <see cref="GroupVelocityAt"/>; does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a wavevector is outside the first zone.</exception>
    public void GroupVelocitiesAt(int bandIndex, ReadOnlySpan<double> wavevectorsPerNanometre, Span<double> destinationMetresPerSecond)
    {
        CheckBand(bandIndex);
        Preconditions.CheckDestination(wavevectorsPerNanometre.Length, destinationMetresPerSecond.Length, nameof(wavevectorsPerNanometre), nameof(destinationMetresPerSecond));
        CheckWavevectors(wavevectorsPerNanometre, nameof(wavevectorsPerNanometre));
        WriteSlopes(bandIndex, wavevectorsPerNanometre, destinationMetresPerSecond);
        for (var i = 0; i < wavevectorsPerNanometre.Length; i++)
        {
            destinationMetresPerSecond[i] *= GroupVelocity.MetresPerSecondPerElectronVoltNanometre;
        }
    }

    /// <summary>dE/dk (eV·nm) of band n for k ≥ 0 at Bloch phase θ = kd ∈ [0, π] and energy E = E_n(k).</summary>
    private double SlopeAtPhase(int bandIndex, double phase, double energy, bool fromTrace = false)
    {
        var parity = bandIndex % 2 == 1 ? 1.0 : -1.0;
        if (phase == 0 || phase == Math.PI)
        {
            var edge = (phase == 0) == (bandIndex % 2 == 1) ? _bottoms[bandIndex - 1] : _tops[bandIndex - 1];
            if (!edge.Closed)
            {
                return 0.0;
            }
            return parity * edge.CrossingSlope;
        }
        EdgeData closed;
        double offset;
        bool near;
        if (fromTrace)
        {
            near = NearClosedEdge(bandIndex, energy, ClosedGapWindowFromTrace, out closed, out offset);
        }
        else
        {
            near = NearClosedZonePoint(bandIndex, phase, out closed, out var q);
            offset = closed.CrossingSlope * q + closed.CrossingCurvature * q * q; // δ = a q + b q²
        }
        if (near)
        {
            // dE/dq = a + 2bq along the smooth extended-zone crossing, with q ≈ δ/a from the energy offset δ.
            return parity * (closed.CrossingSlope + 2 * closed.CrossingCurvature * offset / closed.CrossingSlope);
        }
        var slope = _transfer.Dispersion(energy).TraceDerivativePerElectronVolt;
        var value = -2 * _d * Math.Sin(phase) / slope;
        return double.IsFinite(value) ? value : 0.0; // |D′| = ∞ only beyond the double range: a flat band
    }

    /// <summary>
    /// The effective mass at the bottom of band <paramref name="bandIndex"/> (positive), from D′(E) alone.
    /// </summary>
    /// <remarks>
    /// <para>Method: near an edge E₀ with D(E₀) = 2σ (σ = +1 at the zone centre, −1 at the boundary),
    /// D ≈ 2σ + D′(E₀)(E − E₀) and cos(qd) ≈ 1 − (qd)²/2 for the offset q from the zone point, so
    /// E − E₀ = −σ(qd)²/D′ and m*/m₀ = −σ (ħ²/2m₀) D′(E₀)/d². For the Dirac comb this reproduces
    /// m*/m = −P/(nπ)² at the band tops (Kittel's form of the comb).</para>
    /// <para>At a closed gap D′(E₀) = 0 and the two bands cross smoothly; the mass returned is then
    /// the curvature mass ħ²/(d²E/dq²) of the smooth extended-zone band through the crossing, the same
    /// for both bands (from D″ and D‴: m*/m₀ = 3(ħ²/2m₀)D″²/(σ D‴ d²)); for a free particle it is the
    /// particle's mass. <see cref="BandEdgeMass.IsClosedGap"/> says which case applies.</para>
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    public BandEdgeMass BottomMass(int bandIndex)
    {
        CheckBand(bandIndex);
        var band = _structure.GetBand(bandIndex);
        return EdgeMass(bandIndex, BandEdge.Bottom, band.BottomZonePoint, _bottoms[bandIndex - 1]);
    }

    /// <summary>The effective mass at the top of band <paramref name="bandIndex"/> (negative); method as <see cref="BottomMass"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    public BandEdgeMass TopMass(int bandIndex)
    {
        CheckBand(bandIndex);
        var band = _structure.GetBand(bandIndex);
        return EdgeMass(bandIndex, BandEdge.Top, band.TopZonePoint, _tops[bandIndex - 1]);
    }

    private BandEdgeMass EdgeMass(int bandIndex, BandEdge which, ZonePoint point, EdgeData edge)
    {
        double mass;
        if (edge.Closed)
        {
            mass = edge.CrossingCurvature == 0 ? double.PositiveInfinity : C / edge.CrossingCurvature;
        }
        else
        {
            mass = -edge.Sigma * C * edge.TraceSlope / (_d * _d);
        }
        return new BandEdgeMass(bandIndex, which, point, edge.Energy, mass, edge.Closed);
    }

    /// <summary>
    /// The curvature mass m* = ħ²/(d²E/dk²) in m₀ of band <paramref name="bandIndex"/> at
    /// <paramref name="wavevectorPerNanometre"/>: positive where the band curves up, negative where it
    /// curves down, ±∞ at an inflection point.
    /// </summary>
    /// <remarks>
    /// Method: differentiating dE/dk = −2d sin(kd)/D′ once more gives, exactly,
    /// d²E/dk² = −2d² cos(kd)/D′ − 4d² sin²(kd)·D″/D′³, with D′ and D″ exact (Taylor-mode
    /// propagation of the cell's transfer matrix, docs/properties.md). At a zone point this reduces to the
    /// band-edge mass (<see cref="BottomMass"/>); at a closed gap, to the mass of the smooth crossing, which is
    /// also returned within 1e-4 in kd of a closed gap, where E(k) itself is too ill-conditioned for the formula
    /// (accuracy there ≈ 1e-4 relative).
    /// <para>Cells with smooth segments (<see cref="Periodic.Structures.FourierSegment"/>,
    /// <see cref="Periodic.Structures.FunctionSegment"/>, <see cref="Periodic.Structures.SampledSegment"/>): D′ and D″ are
    /// the exact derivatives of the fourth-order Magnus discretisation at the segments' current step counts, so the mass
    /// is that of the same discrete model as the band structure's E(k), and its error falls like h⁴ with the step h, as
    /// the band energies' does. Build the structure with <see cref="RefinedBandStructure"/> for a stated accuracy: at its
    /// default tolerance (1e-11) the curvature masses of the optical lattices in the tests (s = 1, 5, 10) agree with an
    /// independent central-equation calculation to 4.5e-11 relative; on the default 64-step mesh of an s = 5 lattice to
    /// 2e-7 (band 1) and 7.5e-7 (band 2) (docs/properties.md).</para>
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or k outside the first zone.</exception>
    public double CurvatureMassElectronMasses(int bandIndex, double wavevectorPerNanometre)
    {
        CheckBand(bandIndex);
        var phase = Phase(wavevectorPerNanometre, nameof(wavevectorPerNanometre));
        var energy = _structure.EnergyAt(bandIndex, wavevectorPerNanometre);
        var curvature = CurvatureAtPhase(bandIndex, phase, energy);
        return curvature == 0 ? double.PositiveInfinity : 2 * C / curvature;
    }

    /// <summary>d²E/dk² in eV·nm² at Bloch phase θ ∈ [0, π], energy E = E_n(θ/d).</summary>
    private double CurvatureAtPhase(int bandIndex, double phase, double energy)
    {
        if (phase == 0 || phase == Math.PI)
        {
            var edge = (phase == 0) == (bandIndex % 2 == 1) ? _bottoms[bandIndex - 1] : _tops[bandIndex - 1];
            if (edge.Closed)
            {
                return 2 * edge.CrossingCurvature;
            }
            return -2 * _d * _d * edge.Sigma / edge.TraceSlope;
        }
        if (NearClosedZonePoint(bandIndex, phase, out var closed, out _))
        {
            return 2 * closed.CrossingCurvature;
        }
        var jet = DispersionDerivatives.Evaluate(_structure.Transfer.Compiled, energy);
        var scale = jet.Scale;
        var (sin, cos) = Math.SinCos(phase);
        var d1 = jet.D1;
        var value = -2 * _d * _d * cos / (d1 * scale) - 4 * _d * _d * sin * sin * jet.D2 / (d1 * d1 * d1 * scale * scale);
        return double.IsFinite(value) ? value : 0.0;
    }
}
