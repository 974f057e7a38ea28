// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// The doping and dielectric constant of one cell element: uniform donor and acceptor densities, an optional sheet
/// (delta) of donors at the middle of the layer, and the static relative permittivity. Immutable.
/// </summary>
/// <remarks>
/// Dopants are fully ionised by default (every donor gives its electron to the bands, every acceptor takes one from the
/// valence band; its holes are carriers where the cell has a valence band, <see cref="DopedCell.ValenceBands"/>);
/// <see cref="WithDonorIonisationEnergy"/> and <see cref="WithAcceptorIonisationEnergy"/> make the ionisation follow the
/// Fermi level (an acceptor level needs the cell's valence band). Bounds: volume densities up to <see cref="MaxVolumeDensityPerCubicCentimetre"/>
/// (about 2 % of the atoms of a III–V crystal, beyond any doping level that stays a crystal), sheet densities up to
/// <see cref="MaxSheetDensityPerSquareCentimetre"/> (about one and a half monolayers of atoms), relative permittivity
/// between 1 (vacuum) and <see cref="MaxRelativePermittivity"/>.
/// </remarks>
public sealed class LayerDoping
{
    /// <summary>The largest volume density accepted, cm⁻³.</summary>
    public const double MaxVolumeDensityPerCubicCentimetre = 1e21;

    /// <summary>The largest sheet density accepted, cm⁻².</summary>
    public const double MaxSheetDensityPerSquareCentimetre = 1e15;

    /// <summary>The largest relative permittivity accepted (ferroelectrics reach a few hundred to a few thousand).</summary>
    public const double MaxRelativePermittivity = 1e4;

    /// <summary>The largest donor ionisation energy accepted, eV (shallow donors in III–V crystals: a few meV; deep levels below 1 eV).</summary>
    public const double MaxDonorIonisationEnergyElectronVolts = 1;

    /// <summary>Degeneracy factor g of a donor level (spin: two states, one electron), in N_D⁺ = N_D/(1 + g·e^((μ − E_D)/k_BT)).</summary>
    public const double DonorDegeneracy = 2;

    /// <summary>
    /// Degeneracy factor g of an acceptor level, in N_A⁻ = N_A/(1 + g·e^((E_A − μ)/k_BT)): 4 for a shallow acceptor in a cubic
    /// semiconductor (spin and the two degenerate heavy- and light-hole bands at the valence-band top; S. M. Sze, Physics of
    /// Semiconductor Devices, 2nd ed., ch. 1).
    /// </summary>
    public const double AcceptorDegeneracy = 4;

    /// <summary>The largest acceptor ionisation energy accepted, eV (shallow acceptors in III–V crystals: tens of meV).</summary>
    public const double MaxAcceptorIonisationEnergyElectronVolts = 1;

    private LayerDoping(double donors, double acceptors, double sheet, double permittivity, double? ionisation = null, double? acceptorIonisation = null)
    {
        DonorIonisationEnergyElectronVolts = ionisation;
        AcceptorIonisationEnergyElectronVolts = acceptorIonisation;
        DonorsPerCubicCentimetre = donors;
        AcceptorsPerCubicCentimetre = acceptors;
        SheetDonorsPerSquareCentimetre = sheet;
        RelativePermittivity = permittivity;
    }

    /// <summary>Ionised donor density N_D, cm⁻³.</summary>
    public double DonorsPerCubicCentimetre { get; }

    /// <summary>Ionised acceptor density N_A, cm⁻³.</summary>
    public double AcceptorsPerCubicCentimetre { get; }

    /// <summary>Ionised donors of a sheet (delta) at the middle of the layer, cm⁻².</summary>
    public double SheetDonorsPerSquareCentimetre { get; }

    /// <summary>The static relative permittivity ε_r (dimensionless).</summary>
    public double RelativePermittivity { get; }

    /// <summary>
    /// The donors' ionisation energy E_b (the donor level lies E_b below the local conduction-band edge V + U), eV; null
    /// for full ionisation (the default). With a value, N_D⁺ = N_D/(1 + g·e^((μ − E_c + E_b)/k_BT)) with g =
    /// <see cref="DonorDegeneracy"/> (S. M. Sze, Physics of Semiconductor Devices, 2nd ed., ch. 1), for the volume donors and
    /// the sheet.
    /// </summary>
    public double? DonorIonisationEnergyElectronVolts { get; }

    /// <summary>A copy whose donors are ionised incompletely, with ionisation energy <paramref name="donorIonisationEnergy"/> in [0, 1] eV.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy lies outside its range.</exception>
    public LayerDoping WithDonorIonisationEnergy(Energy donorIonisationEnergy) => new(DonorsPerCubicCentimetre, AcceptorsPerCubicCentimetre,
        SheetDonorsPerSquareCentimetre, RelativePermittivity,
        Preconditions.CheckRange(donorIonisationEnergy.ElectronVolts, 0, MaxDonorIonisationEnergyElectronVolts, nameof(donorIonisationEnergy)),
        AcceptorIonisationEnergyElectronVolts);

    /// <summary>
    /// The acceptors' ionisation energy E_b (the acceptor level lies E_b above the local valence-band edge E_v + U), eV; null
    /// for full ionisation (the default). With a value, N_A⁻ = N_A/(1 + g·e^((E_v + E_b − μ)/k_BT)) with g =
    /// <see cref="AcceptorDegeneracy"/> (S. M. Sze, Physics of Semiconductor Devices, 2nd ed., ch. 1); the valence-band edge is
    /// that of the cell's first valence band, so the cell needs one (<see cref="DopedCell.Create(Periodic.Structures.UnitCell, IReadOnlyList{LayerDoping}, Temperature, IReadOnlyList{ValenceBand})"/>).
    /// </summary>
    public double? AcceptorIonisationEnergyElectronVolts { get; }

    /// <summary>A copy whose acceptors are ionised incompletely, with ionisation energy <paramref name="acceptorIonisationEnergy"/> in [0, 1] eV.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy lies outside its range.</exception>
    public LayerDoping WithAcceptorIonisationEnergy(Energy acceptorIonisationEnergy) => new(DonorsPerCubicCentimetre, AcceptorsPerCubicCentimetre,
        SheetDonorsPerSquareCentimetre, RelativePermittivity, DonorIonisationEnergyElectronVolts,
        Preconditions.CheckRange(acceptorIonisationEnergy.ElectronVolts, 0, MaxAcceptorIonisationEnergyElectronVolts, nameof(acceptorIonisationEnergy)));

    /// <summary>True when the element carries any dopant.</summary>
    public bool IsDoped => DonorsPerCubicCentimetre > 0 || AcceptorsPerCubicCentimetre > 0 || SheetDonorsPerSquareCentimetre > 0;

    /// <summary>Creates the doping of one element.</summary>
    /// <param name="donorsPerCubicCentimetre">N_D in [0, 1e21] cm⁻³.</param>
    /// <param name="acceptorsPerCubicCentimetre">N_A in [0, 1e21] cm⁻³.</param>
    /// <param name="relativePermittivity">ε_r in [1, 1e4].</param>
    /// <param name="sheetDonorsPerSquareCentimetre">A donor sheet at the middle of the layer, [0, 1e15] cm⁻².</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it).</exception>
    public static LayerDoping Create(double donorsPerCubicCentimetre, double acceptorsPerCubicCentimetre, double relativePermittivity,
        double sheetDonorsPerSquareCentimetre = 0) => new(
            Preconditions.CheckRange(donorsPerCubicCentimetre, 0, MaxVolumeDensityPerCubicCentimetre),
            Preconditions.CheckRange(acceptorsPerCubicCentimetre, 0, MaxVolumeDensityPerCubicCentimetre),
            Preconditions.CheckRange(sheetDonorsPerSquareCentimetre, 0, MaxSheetDensityPerSquareCentimetre),
            Preconditions.CheckRange(relativePermittivity, 1, MaxRelativePermittivity));

    /// <summary>An undoped element of relative permittivity <paramref name="relativePermittivity"/> (in [1, 1e4]).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The permittivity lies outside its range.</exception>
    public static LayerDoping Undoped(double relativePermittivity) => Create(0, 0, relativePermittivity);

    /// <summary>Donors per nm³.</summary>
    internal double DonorsPerCubicNanometre => DonorsPerCubicCentimetre * 1e-21;

    /// <summary>Acceptors per nm³.</summary>
    internal double AcceptorsPerCubicNanometre => AcceptorsPerCubicCentimetre * 1e-21;

    /// <summary>Net fixed charge per volume N_D − N_A in carriers per nm³ (1 cm⁻³ = 1e-21 nm⁻³).</summary>
    internal double NetVolumePerCubicNanometre => (DonorsPerCubicCentimetre - AcceptorsPerCubicCentimetre) * 1e-21;

    /// <summary>Sheet donors per nm² (1 cm⁻² = 1e-14 nm⁻²).</summary>
    internal double SheetPerSquareNanometre => SheetDonorsPerSquareCentimetre * 1e-14;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"N_D = {DonorsPerCubicCentimetre:G4} /cm3, N_A = {AcceptorsPerCubicCentimetre:G4} /cm3, sheet {SheetDonorsPerSquareCentimetre:G4} /cm2, eps_r = {RelativePermittivity:G4}")
        + (DonorIonisationEnergyElectronVolts is { } e ? string.Create(CultureInfo.InvariantCulture, $", donor level {e * 1e3:G4} meV below the band edge") : "")
        + (AcceptorIonisationEnergyElectronVolts is { } a ? string.Create(CultureInfo.InvariantCulture, $", acceptor level {a * 1e3:G4} meV above the valence-band edge") : "")
        + (DonorIonisationEnergyElectronVolts is null && AcceptorIonisationEnergyElectronVolts is null ? ", fully ionised" : "");
}
