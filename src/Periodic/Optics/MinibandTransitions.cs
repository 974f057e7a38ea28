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
/// G′ = (E_1 − E_2)/(ħ²/2m₀)·ψ_1*ψ_2 and the periodicity of G; the integrals are the kernel's exact element integrals of pairs of states
/// (<see cref="CompiledCell.PairIntegrals"/>), as in <see cref="IntersubbandSpectrum"/>. |z_12(k)| does not depend on the cell's origin or the Bloch phases.</para>
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
        WavevectorsPerNanometre = new ReadOnlyCollection<double>(k);
        LowerEnergiesElectronVolts = new ReadOnlyCollection<double>(e1);
        UpperEnergiesElectronVolts = new ReadOnlyCollection<double>(e2);
        DipolesNanometres = new ReadOnlyCollection<double>(dipole);
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
    public IReadOnlyList<double> WavevectorsPerNanometre { get; }

    /// <summary>E_lower(k), eV, at each sample.</summary>
    public IReadOnlyList<double> LowerEnergiesElectronVolts { get; }

    /// <summary>E_upper(k), eV, at each sample.</summary>
    public IReadOnlyList<double> UpperEnergiesElectronVolts { get; }

    /// <summary>|z_12(k)|, nm, at each sample.</summary>
    public IReadOnlyList<double> DipolesNanometres { get; }

    /// <summary>Largest |⟨ψ_1k|ψ_2k⟩_cell| over the samples: the accuracy the Bloch states and integrals reached (exactly 0 in theory).</summary>
    public double OrthogonalityError { get; }

    /// <summary>Default number of k samples of <see cref="Compute"/>.</summary>
    public const int DefaultPoints = 101;

    /// <summary>Computes the transitions from band <paramref name="lowerBand"/> to band <paramref name="upperBand"/> at <paramref name="points"/> k values.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="bands"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A band does not exist, the bands are not in order, or points is outside 2 to 100,000.</exception>
    /// <exception cref="ArgumentException">The cell holds an element other than layers and delta barriers.</exception>
    public static MinibandTransitions Compute(BandStructure bands, int lowerBand = 1, int upperBand = 2, int points = DefaultPoints)
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
        var worst = 0.0;
        for (var i = 0; i < points; i++)
        {
            // Stay just inside the zone: at the edges E(k) is extremal and both signs of k give the same state.
            k[i] = Math.PI / d * i / (points - 1);
            e1[i] = bands.EnergyAt(lowerBand, k[i]);
            e2[i] = bands.EnergyAt(upperBand, k[i]);
            var (basis1, c1, g1) = Bloch(profile, e1[i], k[i] * d);
            var (basis2, c2, g2) = Bloch(profile, e2[i], k[i] * d);
            Complex overlap = 0, moment = 0;
            for (var p = 0; p < 2; p++)
            {
                for (var q = 0; q < 2; q++)
                {
                    // The kernel's exact integrals of the real basis solutions, combined bilinearly.
                    var (o, m, _) = KernelState.Pair(basis1[p], basis2[q], 0);
                    var weight = Complex.Conjugate(c1[p]) * c2[q];
                    overlap += weight * o;
                    moment += weight * m;
                }
            }
            var g = Complex.Conjugate(g1.Psi) * g2.W - Complex.Conjugate(g1.W) * g2.Psi;
            var z = moment + C * d * g / (e2[i] - e1[i]);
            dipole[i] = z.Magnitude;
            worst = Math.Max(worst, overlap.Magnitude);
        }
        return new MinibandTransitions(lowerBand, upperBand, k, e1, e2, dipole, worst, d);
    }

    /// <summary>
    /// The Bloch state with e^{iθ} across the cell at <paramref name="energy"/> as c₀φ₀ + c₁φ₁ of the two real solutions starting
    /// from (1, 0) and (0, 1), normalised on the cell, and its (ψ, ψ′/m) at the cell start.
    /// </summary>
    private static (KernelState[] Basis, Complex[] Coefficients, (Complex Psi, Complex W) Start) Bloch(StackProfile profile, double energy, double theta)
    {
        var n = profile.Count;
        var basis = new KernelState[2];
        for (var b = 0; b < 2; b++)
        {
            double u = b == 0 ? 1 : 0, w = b == 0 ? 0 : 1, log = 0;
            var us = new double[n + 1];
            var ws = new double[n + 1];
            us[0] = u; ws[0] = w;
            for (var j = 0; j < n; j++)
            {
                profile.Kernel.StepForward(j, energy, ref u, ref w, ref log);
                var scale = Math.Exp(log);
                us[j + 1] = u * scale; ws[j + 1] = w * scale;
            }
            basis[b] = KernelState.OnDomain(profile.Kernel, energy, us, ws);
        }
        double m11 = basis[0].Psi[n], m21 = basis[0].DerivativeOverMass[n], m12 = basis[1].Psi[n], m22 = basis[1].DerivativeOverMass[n];
        var lambda = Complex.FromPolarCoordinates(1, theta);
        // (M − λ)v = 0: v = (m12, λ − m11), or (λ − m22, m21) when m12 is the smaller.
        Complex a, b2;
        if (Math.Abs(m12) + Complex.Abs(lambda - m11) >= Math.Abs(m21) + Complex.Abs(lambda - m22))
        {
            a = m12;
            b2 = lambda - m11;
        }
        else
        {
            a = lambda - m22;
            b2 = m21;
        }
        double n00 = 0, n01 = 0, n11 = 0;
        for (var j = 0; j < n; j++)
        {
            n00 += profile.Kernel.SquareIntegral(j, energy, basis[0].Ends(j), fromLeft: true);
            n11 += profile.Kernel.SquareIntegral(j, energy, basis[1].Ends(j), fromLeft: true);
            n01 += profile.Kernel.PairIntegrals(j, energy, basis[0].Ends(j), energy, basis[1].Ends(j)).Overlap;
        }
        var norm = a.Magnitude * a.Magnitude * n00 + 2 * (Complex.Conjugate(a) * b2).Real * n01 + b2.Magnitude * b2.Magnitude * n11;
        var factor = 1 / Math.Sqrt(norm);
        return (basis, [a * factor, b2 * factor], (a * factor, b2 * factor));
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
        $"Miniband transitions {LowerBand} → {UpperBand}: {_k.Length} k values, E_21 from {_energy.Min():G6} to {_energy.Max():G6} eV, |z_12| from {DipolesNanometres.Min():G6} to {DipolesNanometres.Max():G6} nm, orthogonality {OrthogonalityError:G2}");
}
