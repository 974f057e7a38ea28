// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Units;

namespace Periodic.OpticalLattices;

/// <summary>How the atoms are confined across the lattice axis, which sets the on-site interaction U.</summary>
public sealed class TransverseConfinement
{
    private TransverseConfinement(bool cubic, double frequency)
    {
        IsCubicLattice = cubic;
        FrequencyHertz = frequency;
    }

    /// <summary>
    /// A simple-cubic 3D lattice of three equal standing waves (same wavelength and depth on each axis): the Wannier
    /// function is the product of three 1D ones, U = (4πħ²a_s/m)(∫|w|⁴dx)³, and the Mott transition is the 3D one.
    /// </summary>
    public static TransverseConfinement CubicLattice { get; } = new(true, 0);

    /// <summary>True for <see cref="CubicLattice"/>.</summary>
    public bool IsCubicLattice { get; }

    /// <summary>The transverse trap frequency ω⊥/2π, Hz (0 for the cubic lattice).</summary>
    public double FrequencyHertz { get; }

    /// <summary>
    /// A 1D lattice of tubes: isotropic harmonic confinement of frequency ω⊥/2π across the axis, the atoms in its ground
    /// state, U = (4πħ²a_s/m)·∫|w|⁴dx/(2πa⊥²) = 2ħω⊥a_s∫|w|⁴dx with a⊥ = √(ħ/mω⊥); the Mott transition is the 1D one.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The frequency is not positive and finite.</exception>
    public static TransverseConfinement Harmonic(double frequencyHertz) => new(false, Preconditions.CheckPositiveFinite(frequencyHertz));

    /// <inheritdoc />
    public override string ToString() => IsCubicLattice ? "cubic 3D lattice" : string.Create(CultureInfo.InvariantCulture, $"1D tubes, ω⊥/2π = {FrequencyHertz:G6} Hz");
}

/// <summary>
/// The lowest-band Bose–Hubbard parameters of an optical lattice at one depth: tunnelling J, interaction U, U/J
/// against the superfluid–Mott-insulator transition, the gap to the next band and the adiabaticity time ħ/gap.
/// Immutable. Energies in eV (use <see cref="OpticalLattice.ToRecoilEnergies"/> or <see cref="OpticalLattice.ToHertz"/>).
/// </summary>
/// <remarks>
/// <para>J and the Wannier function come from <see cref="WannierFunction"/>; U from the contact interaction
/// g = 4πħ²a_s/m integrated over |w|⁴ (D. Jaksch, C. Bruder, J. I. Cirac, C. W. Gardiner, P. Zoller, Phys. Rev. Lett.
/// 81, 3108 (1998); I. Bloch, J. Dalibard, W. Zwerger, Rev. Mod. Phys. 80, 885 (2008)).</para>
/// <para>Critical values at unit filling: 3D simple cubic (U/J)_c = 29.34 from quantum Monte Carlo
/// (B. Capogrosso-Sansone, N. V. Prokof'ev, B. V. Svistunov, Phys. Rev. B 75, 134302 (2007); uncertainty in the last
/// digit); 1D (U/J)_c = 3.37 from DMRG (T. D. Kühner, S. R. White, H. Monien, Phys. Rev. B 61, 12474 (2000); other
/// methods give 3.3 to 3.4, and the 1D transition is of Kosterlitz–Thouless type, so its location is soft). Both
/// entered from memory of those papers.</para>
/// <para>Limits: the single-band Hubbard model holds only when the gap to the next band is much larger than U and
/// k_BT; the harmonic trap envelope (and so the Mott shells of a real cloud) is not modelled.</para>
/// </remarks>
public sealed class HubbardParameters
{
    /// <summary>(U/J)_c of the 3D simple-cubic Bose–Hubbard model at unit filling (quantum Monte Carlo, Capogrosso-Sansone et al. 2007).</summary>
    public const double CriticalRatioCubic = 29.34;

    /// <summary>(U/J)_c of the 1D Bose–Hubbard model at unit filling (DMRG, Kühner, White and Monien 2000).</summary>
    public const double CriticalRatioOneDimensional = 3.37;

    private HubbardParameters(OpticalLattice lattice, TransverseConfinement confinement, double scatteringLength, int band, WannierFunction wannier,
        double interaction, double gap)
    {
        Lattice = lattice;
        Confinement = confinement;
        ScatteringLengthNanometres = scatteringLength;
        BandIndex = band;
        Wannier = wannier;
        InteractionElectronVolts = interaction;
        GapAboveElectronVolts = gap;
    }

    /// <summary>The lattice.</summary>
    public OpticalLattice Lattice { get; }

    /// <summary>The transverse confinement.</summary>
    public TransverseConfinement Confinement { get; }

    /// <summary>The s-wave scattering length a_s, nm.</summary>
    public double ScatteringLengthNanometres { get; }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The band's Wannier function, with ∫|w|⁴dx and J₁ … J₃.</summary>
    public WannierFunction Wannier { get; }

    /// <summary>The nearest-neighbour tunnelling J = J₁, eV.</summary>
    public double TunnellingElectronVolts => Wannier.HoppingElectronVolts[0];

    /// <summary>The on-site interaction U, eV (negative for a negative scattering length).</summary>
    public double InteractionElectronVolts { get; }

    /// <summary>U/J.</summary>
    public double InteractionToTunnellingRatio => InteractionElectronVolts / TunnellingElectronVolts;

    /// <summary>(U/J)_c of the geometry: <see cref="CriticalRatioCubic"/> or <see cref="CriticalRatioOneDimensional"/>.</summary>
    public double CriticalRatio => Confinement.IsCubicLattice ? CriticalRatioCubic : CriticalRatioOneDimensional;

    /// <summary>(U/J)/(U/J)_c: below 1 superfluid, above 1 Mott insulator (unit filling, lowest band).</summary>
    public double RatioToCritical => InteractionToTunnellingRatio / CriticalRatio;

    /// <summary>Where <see cref="CriticalRatio"/> comes from.</summary>
    public string CriticalRatioSource => Confinement.IsCubicLattice
        ? "3D simple cubic, unit filling: quantum Monte Carlo, Capogrosso-Sansone, Prokof'ev, Svistunov, PRB 75, 134302 (2007)"
        : "1D, unit filling: DMRG, Kühner, White, Monien, PRB 61, 12474 (2000); 3.3-3.4 across methods";

    /// <summary>The gap from the top of the band to the bottom of the next, eV.</summary>
    public double GapAboveElectronVolts { get; }

    /// <summary>ħ/gap, seconds: ramps of the lattice much slower than this keep the atoms in the band.</summary>
    public double AdiabaticTimeSeconds => PhysicalConstants.ReducedPlanckElectronVoltSeconds / GapAboveElectronVolts;

    /// <summary>Computes the Hubbard parameters of band <paramref name="bandIndex"/> (1 for the usual lowest-band model).</summary>
    /// <param name="lattice">The lattice (its depth is that of each axis for the cubic lattice).</param>
    /// <param name="confinement">The transverse confinement.</param>
    /// <param name="scatteringLength">The s-wave scattering length a_s, finite (negative for attraction); see <see cref="BohrRadii"/>.</param>
    /// <param name="bandIndex">The band, 1 to 50; it must be isolated.</param>
    /// <exception cref="ArgumentNullException">An argument is null.</exception>
    /// <exception cref="ArgumentException">A value breaks its rule, or the band is not isolated.</exception>
    public static HubbardParameters Compute(OpticalLattice lattice, TransverseConfinement confinement, Length scatteringLength, int bandIndex = 1)
    {
        ArgumentNullException.ThrowIfNull(lattice);
        ArgumentNullException.ThrowIfNull(confinement);
        var a = scatteringLength.Nanometres;
        if (!double.IsFinite(a))
        {
            throw new ArgumentOutOfRangeException(nameof(scatteringLength), a, $"scatteringLength must be finite; got {Preconditions.Format(a)} nm.");
        }
        Preconditions.CheckRange(bandIndex, 1, 50);
        var wannier = WannierFunction.Compute(lattice.Cell, bandIndex);
        var bands = SpectralBandStructure.Compute(lattice.Cell, bandIndex);
        var gap = bands.Bands.Gaps[bandIndex - 1].WidthElectronVolts;
        // ħ²/m in eV nm²: twice ħ²/2m₀ over the mass in m₀.
        var hbar2OverM = 2 * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 / lattice.Species.Mass.ElectronMasses;
        var coupling = 4 * Math.PI * hbar2OverM * a; // g = 4πħ²a_s/m, eV nm³
        var integral = wannier.OnSiteIntegralPerNanometre;
        double u;
        if (confinement.IsCubicLattice)
        {
            u = coupling * integral * integral * integral;
        }
        else
        {
            // a⊥² = ħ/(mω⊥) = (ħ²/m)/(ħω⊥).
            var hbarOmega = PhysicalConstants.ReducedPlanckElectronVoltSeconds * 2 * Math.PI * confinement.FrequencyHertz;
            var transverseArea = 2 * Math.PI * hbar2OverM / hbarOmega;
            u = coupling * integral / transverseArea;
        }
        return new HubbardParameters(lattice, confinement, a, bandIndex, wannier, u, gap);
    }

    /// <summary>Computes the parameters at each depth of <paramref name="depthsInRecoilEnergies"/>, in order (a depth scan).</summary>
    /// <exception cref="ArgumentException">A depth is not positive and finite (the message names its index), or as <see cref="Compute"/>.</exception>
    public static IReadOnlyList<HubbardParameters> Scan(OpticalLattice lattice, ReadOnlySpan<double> depthsInRecoilEnergies, TransverseConfinement confinement,
        Length scatteringLength, int bandIndex = 1)
    {
        ArgumentNullException.ThrowIfNull(lattice);
        for (var i = 0; i < depthsInRecoilEnergies.Length; i++)
        {
            var s = depthsInRecoilEnergies[i];
            if (!(s > 0) || !double.IsFinite(s))
            {
                throw new ArgumentOutOfRangeException(nameof(depthsInRecoilEnergies), s, string.Create(CultureInfo.InvariantCulture,
                    $"depthsInRecoilEnergies[{i}] must be a positive, finite depth in recoil energies; got {Preconditions.Format(s)}."));
            }
        }
        var results = new HubbardParameters[depthsInRecoilEnergies.Length];
        for (var i = 0; i < results.Length; i++)
        {
            results[i] = Compute(lattice.WithDepth(depthsInRecoilEnergies[i]), confinement, scatteringLength, bandIndex);
        }
        return Array.AsReadOnly(results);
    }

    /// <summary>A length of <paramref name="bohrRadii"/> Bohr radii (the usual unit of scattering lengths).</summary>
    public static Length BohrRadii(double bohrRadii) => Length.FromNanometres(bohrRadii * PhysicalConstants.BohrRadiusNanometres);

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Hubbard band {BandIndex}, s = {Lattice.DepthInRecoilEnergies:G6}: J = {Lattice.ToRecoilEnergies(TunnellingElectronVolts):G6} E_R, U = {Lattice.ToRecoilEnergies(InteractionElectronVolts):G6} E_R, U/J = {InteractionToTunnellingRatio:G6} ({RatioToCritical:G4} of critical), gap {Lattice.ToRecoilEnergies(GapAboveElectronVolts):G6} E_R");
}
