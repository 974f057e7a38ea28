// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Serialization;

/// <summary>
/// The bounds <see cref="StructureFile"/> checks before any work starts: how large a file, how many elements, harmonics and
/// samples, and the physical range of every quantity. docs/limits.md states each bound with the measured cost behind it.
/// </summary>
public static class StructureFileLimits
{
    /// <summary>
    /// Largest structure file, bytes (16 MiB). The reader holds the file and a tree of its values, about 30 bytes of memory
    /// per byte of JSON numbers (measured: a 172 MB file took 5 GB), so 16 MiB keeps a file below about 0.5 GB.
    /// </summary>
    public const long MaxFileBytes = 16L * 1024 * 1024;

    /// <summary>Most elements (layers, deltas, segments) in one cell: every energy evaluation walks them all.</summary>
    public const int MaxElements = 100_000;

    /// <summary>
    /// Most harmonics of one Fourier segment. The default mesh has 32 Magnus steps per harmonic and every energy
    /// evaluation walks it (measured: a band table of N = 3,000 took about 10 s; N = 10,000 had not finished after 57 s of CPU).
    /// </summary>
    public const int MaxHarmonics = 4_000;

    /// <summary>Most samples of one profile segment (one Magnus step per interval, halved by refinement up to 4·10⁶ steps).</summary>
    public const int MaxSamples = 200_000;

    /// <summary>Smallest effective mass, m₀: below the lightest carriers of narrow-gap semiconductors (about 0.01 m₀).</summary>
    public const double MinMassElectronMasses = 1e-4;

    /// <summary>Largest mass, m₀ (10⁷ m₀ ≈ 5,500 u): above the heaviest atoms held in optical lattices (about 250 u).</summary>
    public const double MaxMassElectronMasses = 1e7;

    /// <summary>Smallest positive width or period, nm (10⁻⁶ nm, far below a monolayer).</summary>
    public const double MinWidthNanometres = 1e-6;

    /// <summary>Largest width or period, nm (1 mm): far above any superlattice or optical-lattice period.</summary>
    public const double MaxWidthNanometres = 1e6;

    /// <summary>Largest magnitude of a potential, lead potential, bias or Fourier amplitude, eV (band offsets are below ~5 eV).</summary>
    public const double MaxPotentialElectronVolts = 1e3;

    /// <summary>
    /// Deepest optical lattice, in recoil energies of its own wave (first and second wave): 10⁵ E_R is about 10 mK for ⁸⁷Rb
    /// at 1064 nm, beyond the deepest optical traps, and the band solvers' cost grows with the depth (E(k) of 3 bands:
    /// 0.5 s at 10⁵, 2.4 s at 10⁶, 47 s at 10⁹).
    /// </summary>
    public const double MaxLatticeDepthRecoilEnergies = 1e5;

    /// <summary>Largest magnitude of a delta strength, eV·nm.</summary>
    public const double MaxDeltaStrengthElectronVoltNanometres = 1e3;

    /// <summary>Largest non-parabolicity, 1/eV (semiconductors: below ~5 /eV).</summary>
    public const double MaxNonParabolicityPerElectronVolt = 100;

    /// <summary>Largest donor or acceptor density, cm⁻³ (about 2 % of the atoms of a III–V crystal; see <see cref="SpaceCharge.LayerDoping"/>).</summary>
    public const double MaxDopingPerCubicCentimetre = SpaceCharge.LayerDoping.MaxVolumeDensityPerCubicCentimetre;

    /// <summary>Largest sheet (delta) donor density, cm⁻² (about one and a half monolayers of atoms).</summary>
    public const double MaxSheetDopingPerSquareCentimetre = SpaceCharge.LayerDoping.MaxSheetDensityPerSquareCentimetre;

    /// <summary>Smallest relative permittivity (vacuum).</summary>
    public const double MinRelativePermittivity = 1;

    /// <summary>Largest relative permittivity (ferroelectrics reach a few thousand).</summary>
    public const double MaxRelativePermittivity = SpaceCharge.LayerDoping.MaxRelativePermittivity;
}
