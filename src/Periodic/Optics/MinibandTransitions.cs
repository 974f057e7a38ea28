// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Numerics;
using Periodic.Bands;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// Vertical (same-k) transitions between two minibands of a superlattice: the k-resolved dipole z_12(k), the transition
/// energy E_2(k) − E_1(k), and the joint density of states. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Method: the Bloch state ψ_nk at the energy E_n(k) of the band finder is the eigenvector of the cell's transfer matrix
/// with eigenvalue e^{ikd}, propagated through the cell layer by layer and normalised to ∫_cell|ψ|² = 1. The interband position
/// matrix element of Bloch states (E. I. Blount, Solid State Physics 13, 305 (1962): X_12 = i⟨u_1|∂_k u_2⟩ = iħ v_12/(E_2 − E_1))
/// is evaluated through the velocity v = ½{p, 1/m(z)} with the exact identity
/// z_12(k) = ∫_cell z ψ_1*ψ_2 + (ħ²/2m₀) d G(0)/(E_2 − E_1), G = ψ_1* ψ_2′/m − ψ_1*′ψ_2/m, which follows from
/// G′ = (E_1 − E_2)/(ħ²/2m₀)·ψ_1*ψ_2 and the periodicity of G; the integrals use the same Gauss–Legendre layer quadrature as
/// <see cref="IntersubbandSpectrum"/>. |z_12(k)| does not depend on the cell's origin or the Bloch phases.</para>
/// <para>Joint density of states per unit length of the superlattice, per eV and per in-plane state (spin excluded):
/// g_J(E) = (1/π) Σ 1/|dE_21/dk| over the k in (0, π/d) where E_21(k) = E (both ±k counted), with E_21 interpolated
/// linearly between the k samples (error O(Δk²) away from the van Hove edges, where g_J diverges as 1/√).</para>
/// <para>Limits: layers and delta barriers only; equal in-plane masses assumed (the in-plane motion then does not change the
/// transition energy); single-band model as everywhere in the library.</para>
/// </remarks>
public sealed class MinibandTransitions
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly double[] _k;
    private readonly double[] _energy;

    private MinibandTransitions(int lower, int upper, double[] k, double[] e1, double[] e2, double[] dipole, double orthogonality, double period)
    {
        LowerBand = lower;
        UpperBand = upper;
        _k = k;
        _energy = e2.Zip(e1, (b, a) => b - a).ToArray();
        Wavevectors = new ReadOnlyCollection<double>(k);
        LowerEnergies = new ReadOnlyCollection<double>(e1);
        UpperEnergies = new ReadOnlyCollection<double>(e2);
        Dipoles = new ReadOnlyCollection<double>(dipole);
        OrthogonalityError = orthogonality;
        PeriodNanometres = period;
    }

    /// <summary>The lower band (counted from 1).</summary>
    public int LowerBand { get; }

    /// <summary>The upper band (counted from 1).</summary>
    public int UpperBand { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>The k samples, 1/nm, evenly spaced on [0, π/d].</summary>
    public IReadOnlyList<double> Wavevectors { get; }

    /// <summary>E_lower(k), eV, at each sample.</summary>
    public IReadOnlyList<double> LowerEnergies { get; }

    /// <summary>E_upper(k), eV, at each sample.</summary>
    public IReadOnlyList<double> UpperEnergies { get; }

    /// <summary>|z_12(k)|, nm, at each sample.</summary>
    public IReadOnlyList<double> Dipoles { get; }

    /// <summary>Largest |⟨ψ_1k|ψ_2k⟩_cell| over the samples: the accuracy the Bloch states and integrals reached (exactly 0 in theory).</summary>
    public double OrthogonalityError { get; }

    /// <summary>Computes the transitions from band <paramref name="lowerBand"/> to band <paramref name="upperBand"/> at <paramref name="points"/> k values.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="bands"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A band does not exist, the bands are not in order, or points is outside 2 to 100,000.</exception>
    /// <exception cref="ArgumentException">The cell holds an element other than layers and delta barriers.</exception>
    public static MinibandTransitions Compute(BandStructure bands, int lowerBand = 1, int upperBand = 2, int points = 101)
    {
        ArgumentNullException.ThrowIfNull(bands);
        Preconditions.CheckRange(lowerBand, 1, bands.Bands.Count - 1);
        Preconditions.CheckRange(upperBand, lowerBand + 1, bands.Bands.Count);
        Preconditions.CheckRange(points, 2, 100_000);
        var cell = bands.Cell;
        var first = cell.Elements.OfType<Layer>().FirstOrDefault();
        var lead = first is null ? Lead.Create(default, EffectiveMass.FromElectronMasses(1)) : Lead.Like(first);
        var profile = new StackProfile(LayerStack.Periodic(lead, cell, 1, lead), cell.Elements.Count, nameof(bands));
        var d = bands.PeriodNanometres;
        var k = new double[points];
        var e1 = new double[points];
        var e2 = new double[points];
        var dipole = new double[points];
        var lowest = bands.Bands[lowerBand - 1].BottomElectronVolts;
        var highest = bands.Bands[upperBand - 1].TopElectronVolts;
        var grid = LayerIntegrals.Create(profile, lowest, highest);
        var worst = 0.0;
        for (var i = 0; i < points; i++)
        {
            // Stay just inside the zone: at the edges E(k) is extremal and both signs of k give the same state.
            k[i] = Math.PI / d * i / (points - 1);
            e1[i] = bands.EnergyAt(lowerBand, k[i]);
            e2[i] = bands.EnergyAt(upperBand, k[i]);
            var (psi1, g1) = Bloch(profile, grid, e1[i], k[i] * d);
            var (psi2, g2) = Bloch(profile, grid, e2[i], k[i] * d);
            Complex overlap = 0, moment = 0;
            var origin = 0.0;
            for (var q = 0; q < grid.Count; q++)
            {
                var p = grid.Weights[q] * Complex.Conjugate(psi1[q]) * psi2[q];
                overlap += p;
                moment += p * (grid.Positions[q] - origin);
            }
            var g = Complex.Conjugate(g1.Psi) * g2.W - Complex.Conjugate(g1.W) * g2.Psi;
            var z = moment + C * d * g / (e2[i] - e1[i]);
            dipole[i] = z.Magnitude;
            worst = Math.Max(worst, overlap.Magnitude);
        }
        return new MinibandTransitions(lowerBand, upperBand, k, e1, e2, dipole, worst, d);
    }

    /// <summary>The normalised Bloch state with e^{iθ} across the cell, on the grid, and its (ψ, ψ′/m) at the cell start.</summary>
    private static (Complex[] Values, (Complex Psi, Complex W) Start) Bloch(StackProfile profile, LayerIntegrals grid, double energy, double theta)
    {
        var n = profile.Count;
        // Transfer matrix of the cell from the two real solutions (1, 0) and (0, 1).
        var columns = new double[2][][];
        for (var basis = 0; basis < 2; basis++)
        {
            double u = basis == 0 ? 1 : 0, w = basis == 0 ? 0 : 1, log = 0;
            var us = new double[n + 1];
            var ws = new double[n + 1];
            us[0] = u; ws[0] = w;
            for (var j = 0; j < n; j++)
            {
                profile.Kernel.StepForward(j, energy, ref u, ref w, ref log);
                var scale = Math.Exp(log);
                us[j + 1] = u * scale; ws[j + 1] = w * scale;
            }
            columns[basis] = [us, ws];
        }
        double m11 = columns[0][0][n], m21 = columns[0][1][n], m12 = columns[1][0][n], m22 = columns[1][1][n];
        var lambda = Complex.FromPolarCoordinates(1, theta);
        // (M − λ)v = 0: v = (m12, λ − m11), or (λ − m22, m21) when m12 is the smaller.
        Complex a, b;
        if (Math.Abs(m12) + Complex.Abs(lambda - m11) >= Math.Abs(m21) + Complex.Abs(lambda - m22))
        {
            a = m12;
            b = lambda - m11;
        }
        else
        {
            a = lambda - m22;
            b = m21;
        }
        var values = new Complex[grid.Count];
        for (var j = 0; j < n; j++)
        {
            if (grid.LayerStart[j] == grid.LayerStart[j + 1])
            {
                continue;
            }
            var u = a * columns[0][0][j] + b * columns[1][0][j];
            var w = a * columns[0][1][j] + b * columns[1][1][j];
            profile.Kernel.LayerCoefficients(j, energy, out var mass, out var s);
            for (var q = grid.LayerStart[j]; q < grid.LayerStart[j + 1]; q++)
            {
                UniformLayerPropagator.Evaluate(s, grid.Positions[q] - profile.Boundaries[j], out var c, out var sinc, out _, out _, out var logScale);
                values[q] = (c * u + mass * sinc * w) * Math.Exp(logScale);
            }
        }
        double norm = 0;
        for (var q = 0; q < values.Length; q++)
        {
            norm += grid.Weights[q] * (values[q].Real * values[q].Real + values[q].Imaginary * values[q].Imaginary);
        }
        var factor = 1 / Math.Sqrt(norm);
        for (var q = 0; q < values.Length; q++)
        {
            values[q] *= factor;
        }
        return (values, (a * factor, b * factor));
    }

    /// <summary>
    /// The joint density of states g_J(E) at transition energy <paramref name="transitionEnergyElectronVolts"/>, per nm per eV
    /// (per in-plane state, spin excluded); 0 outside the range of E_21(k).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public double JointDensityOfStates(double transitionEnergyElectronVolts)
    {
        Preconditions.CheckFinite(transitionEnergyElectronVolts);
        var e = transitionEnergyElectronVolts;
        double sum = 0;
        for (var i = 0; i + 1 < _k.Length; i++)
        {
            var lo = Math.Min(_energy[i], _energy[i + 1]);
            var hi = Math.Max(_energy[i], _energy[i + 1]);
            if (e >= lo && e < hi && hi > lo)
            {
                sum += (_k[i + 1] - _k[i]) / (hi - lo);
            }
        }
        return sum / Math.PI;
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Miniband transitions {LowerBand} → {UpperBand}: {_k.Length} k values, E_21 from {_energy.Min():G6} to {_energy.Max():G6} eV, |z_12| from {Dipoles.Min():G6} to {Dipoles.Max():G6} nm, orthogonality {OrthogonalityError:G2}");
}
