// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.OpticalLattices;

/// <summary>
/// A one-dimensional optical lattice in the cold-atom trade's own terms: a standing wave of wavelength λ and depth s
/// (in recoil energies) for an atom of given mass, optionally with a second standing wave (a bichromatic lattice).
/// Converts to the library's <see cref="UnitCell"/> and between eV, recoil energies and frequency. Immutable.
/// </summary>
/// <remarks>
/// <para>Potential: V(x) = s·E_R·sin²(k_L x) + s₂·E_R·sin²(k₂x + φ), k_L = 2π/λ, k₂ = 2π/λ₂, with the recoil energy
/// E_R = ħ²k_L²/2m of the first wave (both depths in that unit) and the period d = λ/2 (k_L = π/d). The depths are
/// those of a red-detuned lattice written as barriers between the sites at x = 0, d, 2d, ….</para>
/// <para>A second wave needs a combined period: λ/λ₂ must equal n₂/n₁ for whole numbers n₁, n₂ ≤
/// <see cref="MaxCommensurateOrder"/> (to 1e-9 relative), and the cell is then n₁ periods of the first wave. An
/// incommensurate ratio (a quasi-periodic lattice) has no Bloch bands and is refused.</para>
/// <para>Model limits: one atom in a static, perfectly periodic potential; the envelope of the beams and any
/// harmonic trap are not modelled, nor the light shifts' dependence on the internal state.</para>
/// </remarks>
public sealed class OpticalLattice
{
    /// <summary>Largest n₁, n₂ of a commensurate bichromatic lattice (λ/λ₂ = n₂/n₁): larger orders make cells of many sites whose bands fold into very narrow minibands.</summary>
    public const int MaxCommensurateOrder = 12;

    private OpticalLattice(Length wavelength, double depth, AtomicSpecies species, SecondStandingWave? second, int primaryPeriods, int secondaryPeriods)
    {
        Wavelength = wavelength;
        DepthInRecoilEnergies = depth;
        Species = species;
        SecondWave = second;
        PrimaryPeriodsPerCell = primaryPeriods;
        SecondaryPeriodsPerCell = secondaryPeriods;
        RecoilEnergy = FourierSegment.RecoilEnergy(LatticePeriod, species.Mass);
        Cell = UnitCell.Create(BuildSegment());
    }

    /// <summary>The wavelength λ of the (first) standing wave.</summary>
    public Length Wavelength { get; }

    /// <summary>The depth s of the first wave in units of <see cref="RecoilEnergy"/>.</summary>
    public double DepthInRecoilEnergies { get; }

    /// <summary>The trapped atom.</summary>
    public AtomicSpecies Species { get; }

    /// <summary>The second standing wave of a bichromatic lattice, or null.</summary>
    public SecondStandingWave? SecondWave { get; }

    /// <summary>The period d = λ/2 of the first wave.</summary>
    public Length LatticePeriod => Length.FromNanometres(Wavelength.Nanometres / 2);

    /// <summary>Periods of the first wave in one cell (n₁; 1 without a second wave).</summary>
    public int PrimaryPeriodsPerCell { get; }

    /// <summary>Periods of the second wave in one cell (n₂; 0 without a second wave).</summary>
    public int SecondaryPeriodsPerCell { get; }

    /// <summary>The recoil energy E_R = ħ²k_L²/2m = ħ²π²/(2md²) of the first wave.</summary>
    public Energy RecoilEnergy { get; }

    /// <summary>The lattice's unit cell: one Fourier-series segment of period n₁·d.</summary>
    public UnitCell Cell { get; }

    /// <summary>The lattice wavenumber k_L = 2π/λ = π/d, 1/nm.</summary>
    public double LatticeWavenumberPerNanometre => 2 * Math.PI / Wavelength.Nanometres;

    /// <summary>A lattice of one standing wave.</summary>
    /// <param name="wavelength">The laser wavelength λ; positive (the period is λ/2).</param>
    /// <param name="depthInRecoilEnergies">The depth s in units of E_R; positive and finite.</param>
    /// <param name="species">The atom (<see cref="AtomicSpecies.Find"/> or <see cref="AtomicSpecies.FromMass"/>).</param>
    /// <exception cref="ArgumentNullException"><paramref name="species"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The wavelength or depth is not positive and finite.</exception>
    public static OpticalLattice Create(Length wavelength, double depthInRecoilEnergies, AtomicSpecies species)
    {
        ArgumentNullException.ThrowIfNull(species);
        CheckWavelength(wavelength, nameof(wavelength));
        CheckDepth(depthInRecoilEnergies, nameof(depthInRecoilEnergies));
        return new OpticalLattice(wavelength, depthInRecoilEnergies, species, null, 1, 0);
    }

    /// <summary>A copy with the depth of the first wave set to <paramref name="depthInRecoilEnergies"/> (depth scans).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The depth is not positive and finite.</exception>
    public OpticalLattice WithDepth(double depthInRecoilEnergies)
    {
        CheckDepth(depthInRecoilEnergies, nameof(depthInRecoilEnergies));
        return new OpticalLattice(Wavelength, depthInRecoilEnergies, Species, SecondWave, PrimaryPeriodsPerCell, SecondaryPeriodsPerCell);
    }

    /// <summary>A bichromatic copy: adds s₂·E_R·sin²(2πx/λ₂ + φ) to the potential.</summary>
    /// <param name="wavelength">λ₂; positive, with λ/λ₂ = n₂/n₁ for whole n₁, n₂ ≤ <see cref="MaxCommensurateOrder"/>.</param>
    /// <param name="depthInRecoilEnergies">s₂ in units of the first wave's E_R; zero or positive, finite.</param>
    /// <param name="phaseRadians">φ, radians, finite.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule; the message says which and, for the wavelength, the nearest ratio tried.</exception>
    public OpticalLattice WithSecondWave(Length wavelength, double depthInRecoilEnergies, double phaseRadians)
    {
        CheckWavelength(wavelength, nameof(wavelength));
        Preconditions.CheckNonNegativeFinite(depthInRecoilEnergies);
        Preconditions.CheckFinite(phaseRadians);
        var (n1, n2) = CommonPeriod(Wavelength.Nanometres, wavelength.Nanometres);
        return new OpticalLattice(Wavelength, DepthInRecoilEnergies, Species, new SecondStandingWave(wavelength, depthInRecoilEnergies, phaseRadians), n1, n2);
    }

    /// <summary>Converts an energy in eV to recoil energies of this lattice.</summary>
    public double ToRecoilEnergies(double energyElectronVolts) => energyElectronVolts / RecoilEnergy.ElectronVolts;

    /// <summary>Converts an energy in eV to the frequency E/h, Hz.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public static double ToHertz(double energyElectronVolts) =>
        Preconditions.CheckFinite(energyElectronVolts) * PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.PlanckJouleSeconds;

    /// <summary>The energy h·f of a frequency f in Hz.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The frequency is not finite.</exception>
    public static Energy FromHertz(double frequencyHertz) =>
        Energy.FromElectronVolts(Preconditions.CheckFinite(frequencyHertz) * PhysicalConstants.PlanckJouleSeconds / PhysicalConstants.ElementaryChargeCoulombs);

    /// <summary>Converts a Bloch wavevector in 1/nm to units of k_L (the zone boundary of the first wave is at 1).</summary>
    public double ToLatticeWavenumbers(double wavevectorPerNanometre) => wavevectorPerNanometre / LatticeWavenumberPerNanometre;

    /// <inheritdoc />
    public override string ToString()
    {
        var text = string.Create(CultureInfo.InvariantCulture,
            $"OpticalLattice {Species.Name}, λ = {Wavelength.Nanometres:G8} nm, s = {DepthInRecoilEnergies:G6} E_R, E_R = {ToHertz(RecoilEnergy.ElectronVolts):G6} Hz·h");
        return SecondWave is { } w
            ? text + string.Create(CultureInfo.InvariantCulture, $" + λ₂ = {w.Wavelength.Nanometres:G8} nm, s₂ = {w.DepthInRecoilEnergies:G6} E_R, φ = {w.PhaseRadians:G6} rad")
            : text;
    }

    private FourierSegment BuildSegment()
    {
        var recoil = RecoilEnergy.ElectronVolts;
        var first = 0.5 * DepthInRecoilEnergies * recoil;
        if (SecondWave is not { } second)
        {
            return FourierSegment.OpticalLattice(LatticePeriod, DepthInRecoilEnergies, Species.Mass);
        }
        // On the cell of n₁ periods: sin²(πx/d) = ½ − ½cos(2π n₁ x/D), and
        // sin²(πx/d₂ + φ) = ½ − ½[cos 2φ · cos(2π n₂ x/D) − sin 2φ · sin(2π n₂ x/D)].
        var harmonics = Math.Max(PrimaryPeriodsPerCell, SecondaryPeriodsPerCell);
        var cosine = new double[harmonics];
        var sine = new double[harmonics];
        var half2 = 0.5 * second.DepthInRecoilEnergies * recoil;
        cosine[PrimaryPeriodsPerCell - 1] -= first;
        cosine[SecondaryPeriodsPerCell - 1] -= half2 * Math.Cos(2 * second.PhaseRadians);
        sine[SecondaryPeriodsPerCell - 1] += half2 * Math.Sin(2 * second.PhaseRadians);
        var period = Length.FromNanometres(PrimaryPeriodsPerCell * LatticePeriod.Nanometres);
        return FourierSegment.Create(period, Energy.FromElectronVolts(first + half2), cosine, sine, Species.Mass);
    }

    /// <summary>Smallest n₁, n₂ with n₁·λ₁ = n₂·λ₂ to 1e-9 relative.</summary>
    private static (int N1, int N2) CommonPeriod(double lambda1, double lambda2)
    {
        var ratio = lambda1 / lambda2; // = n₂/n₁
        for (var n1 = 1; n1 <= MaxCommensurateOrder; n1++)
        {
            var n2 = (int)Math.Round(ratio * n1);
            if (n2 >= 1 && n2 <= MaxCommensurateOrder && Math.Abs(n1 * lambda1 - n2 * lambda2) <= 1e-9 * n1 * lambda1)
            {
                return (n1, n2);
            }
        }
        throw new ArgumentOutOfRangeException("wavelength", lambda2, string.Create(CultureInfo.InvariantCulture,
            $"the second wavelength {Preconditions.Format(lambda2)} nm is not commensurate with the first, {Preconditions.Format(lambda1)} nm: their ratio {Preconditions.Format(ratio)} must equal n2/n1 for whole numbers n1, n2 ≤ {MaxCommensurateOrder} (to 1e-9 relative) so that the lattice has a period; a quasi-periodic lattice has no Bloch bands."));
    }

    private static void CheckWavelength(Length wavelength, string paramName)
    {
        if (!(wavelength.Nanometres > 0) || !double.IsFinite(wavelength.Nanometres))
        {
            throw new ArgumentOutOfRangeException(paramName, wavelength.Nanometres,
                $"{paramName} must be a positive, finite wavelength; got {Preconditions.Format(wavelength.Nanometres)} nm.");
        }
    }

    private static void CheckDepth(double depth, string paramName)
    {
        if (!(depth > 0) || !double.IsFinite(depth))
        {
            throw new ArgumentOutOfRangeException(paramName, depth,
                $"{paramName} must be a positive, finite depth in recoil energies (s > 0); got {Preconditions.Format(depth)}.");
        }
    }
}

/// <summary>The second standing wave of a bichromatic <see cref="OpticalLattice"/>: s₂·E_R·sin²(2πx/λ₂ + φ).</summary>
/// <param name="Wavelength">λ₂.</param>
/// <param name="DepthInRecoilEnergies">s₂ in units of the first wave's recoil energy.</param>
/// <param name="PhaseRadians">φ, radians.</param>
public sealed record SecondStandingWave(Length Wavelength, double DepthInRecoilEnergies, double PhaseRadians);
