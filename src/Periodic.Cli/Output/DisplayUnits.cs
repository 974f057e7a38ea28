// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Output;

/// <summary>
/// The unit a table (or a plot axis) shows energies in. CSV and JSON always carry eV at full precision; only
/// the human-readable forms choose a unit, and within one output every energy column uses the same one.
/// </summary>
/// <param name="Symbol">The unit's name in headers (eV, meV, µeV, neV, E_R).</param>
/// <param name="ElectronVolts">One unit in eV.</param>
/// <param name="Note">A line saying what the unit is, for units a reader may not know (the recoil energy); else null.</param>
internal readonly record struct EnergyUnit(string Symbol, double ElectronVolts, string? Note = null)
{
    public static EnergyUnit ElectronVolt { get; } = new("eV", 1.0);

    /// <summary>The value in this unit.</summary>
    public double From(double electronVolts) => electronVolts / ElectronVolts;
}

/// <summary>The energy units an optical-lattice file is shown in (<c>--unit</c>).</summary>
internal enum LatticeEnergyUnit
{
    /// <summary>Recoil energies E_R = ħ²k_L²/2m of the (first) standing wave: the default.</summary>
    Recoil,

    /// <summary>Energies as frequencies E/h in kHz.</summary>
    Kilohertz,

    /// <summary>Electronvolts, the unit of the JSON output.</summary>
    ElectronVolt,
}

/// <summary>
/// The one place that chooses display units. A heavy-particle cell (every mass at least
/// <see cref="AtomMassElectronMasses"/>: atoms, not carriers in a crystal) is shown in its recoil energy
/// E_R = ħ²(π/d)²/(2m) (the optical-lattice convention, d = λ/2; common practice, no single source); other cells in
/// the SI-prefixed eV unit that puts the largest magnitude between 1 and 1000. Another unit system (e.g. E_R given
/// by the structure file's laser) plugs in here.
/// </summary>
internal static class DisplayUnits
{
    /// <summary>The lightest atom (¹H) is 1837 electron masses; no effective mass in a solid comes near 1000.</summary>
    public const double AtomMassElectronMasses = 1000;

    private static readonly EnergyUnit[] Prefixed =
    [
        new("eV", 1.0), new("meV", 1e-3), new("µeV", 1e-6), new("neV", 1e-9), new("peV", 1e-12), new("feV", 1e-15),
    ];

    /// <summary>The allowed values of <c>--unit</c>, as the error message lists them.</summary>
    public const string LatticeUnitChoices = "recoil (E_R, the default), kHz (E/h) or eV";

    /// <summary>Parses <c>--unit</c> (case-insensitive): recoil (also E_R), kHz or eV.</summary>
    public static LatticeEnergyUnit ParseLatticeUnit(string text) => text.Trim().ToLowerInvariant() switch
    {
        "recoil" or "er" or "e_r" => LatticeEnergyUnit.Recoil,
        "khz" => LatticeEnergyUnit.Kilohertz,
        "ev" => LatticeEnergyUnit.ElectronVolt,
        _ => throw new UsageException($"--unit \"{Printable.Escape(text)}\" is not known; use {LatticeUnitChoices}."),
    };

    /// <summary>
    /// The energy unit of an optical lattice's tables and plots: its recoil energy E_R (of the first standing wave, whatever
    /// the cell's common period), kHz as E/h, or eV.
    /// </summary>
    public static EnergyUnit Lattice(OpticalLattice lattice, LatticeEnergyUnit unit) => unit switch
    {
        LatticeEnergyUnit.Recoil => new EnergyUnit("E_R", lattice.RecoilEnergy.ElectronVolts, string.Create(CultureInfo.InvariantCulture,
            $"energies in recoil units E_R = hbar^2 k_L^2 / 2m = h x {OpticalLattice.ToHertz(lattice.RecoilEnergy.ElectronVolts) / 1e3:G6} kHz = {lattice.RecoilEnergy.ElectronVolts:G6} eV")),
        LatticeEnergyUnit.Kilohertz => new EnergyUnit("kHz", OpticalLattice.FromHertz(1e3).ElectronVolts, "energies as frequencies E/h in kHz"),
        _ => EnergyUnit.ElectronVolt,
    };

    /// <summary>
    /// The energy unit for a table or axis of <paramref name="structure"/>: an optical-lattice file in its own recoil energy
    /// (or <paramref name="latticeUnit"/>), any other cell as <see cref="Energy(UnitCell?, IEnumerable{double})"/> chooses.
    /// </summary>
    public static EnergyUnit Energy(StructureDefinition structure, IEnumerable<double> energiesElectronVolts, LatticeEnergyUnit latticeUnit = LatticeEnergyUnit.Recoil) =>
        structure.OpticalLattice is { } lattice ? Lattice(lattice, latticeUnit) : Energy(structure.Cell, energiesElectronVolts);

    /// <summary>The energy unit for a table or axis of <paramref name="cell"/> showing <paramref name="energiesElectronVolts"/>.</summary>
    public static EnergyUnit Energy(UnitCell? cell, IEnumerable<double> energiesElectronVolts)
    {
        if (cell is not null && cell.MinimumMass.ElectronMasses >= AtomMassElectronMasses)
        {
            var k = Math.PI / cell.Period.Nanometres;
            var recoil = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * k * k / cell.MinimumMass.ElectronMasses;
            return new EnergyUnit("E_R", recoil, string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"energies in recoil units E_R = hbar^2 (pi/d)^2 / 2m = {recoil:G6} eV"));
        }
        var largest = 0.0;
        foreach (var e in energiesElectronVolts)
        {
            if (double.IsFinite(e))
            {
                largest = Math.Max(largest, Math.Abs(e));
            }
        }
        foreach (var unit in Prefixed)
        {
            if (largest >= unit.ElectronVolts)
            {
                return unit;
            }
        }
        return largest == 0 ? Prefixed[0] : Prefixed[^1];
    }

    private static readonly (string Symbol, double Seconds)[] Times = [("s", 1), ("ms", 1e-3), ("µs", 1e-6), ("ns", 1e-9), ("ps", 1e-12), ("fs", 1e-15)];

    /// <summary>The time unit (s … fs) that puts the largest of <paramref name="seconds"/> between 1 and 1000.</summary>
    public static (string Symbol, double Seconds) Time(IEnumerable<double> seconds)
    {
        var largest = seconds.Where(double.IsFinite).Select(Math.Abs).DefaultIfEmpty(0).Max();
        foreach (var unit in Times)
        {
            if (largest >= unit.Seconds)
            {
                return unit;
            }
        }
        return largest == 0 ? Times[0] : Times[^1];
    }
}
