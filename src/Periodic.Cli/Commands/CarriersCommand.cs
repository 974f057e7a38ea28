// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Properties;
using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>carriers FILE --temperature T (--fermi-level E | --density N)</c>: the superlattice's electron density at a Fermi
/// level, or the Fermi level that holds a density (both directions), with free in-plane motion of one mass.
/// </summary>
internal static class CarriersCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var temperature = Common.NumberOption("--temperature", "K", "77", "Temperature, K, from 0 to 1000 (default: the file's temperature for a cell of material layers).");
        var fermi = Common.NumberOption("--fermi-level", "eV", "0.06", "Fermi level, eV, on the scale of the file's potentials: gives the density.");
        var density = Common.NumberOption("--density", "1/cm3", "1e17", "Carrier density, 1/cm3 (positive): gives the Fermi level.");
        var mass = InPlaneMassOption();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("carriers", "Superlattice carrier density at a Fermi level and temperature, or the Fermi level for a density (spin included, free in-plane motion).");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { temperature, fermi, density, mass, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var mu = result.GetValue(fermi);
            var n = result.GetValue(density);
            if ((mu is null) == (n is null))
            {
                throw new UsageException("give exactly one of --fermi-level E (eV) and --density N (1/cm3).");
            }
            if (n is { } given && !(given > 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--density must be a positive density in 1/cm3; got {given:R}."));
            }
            CheckTemperature(result.GetValue(temperature), "--temperature");
            CheckMass(result.GetValue(mass));
            var structure = Common.Load(result, result.GetValue(file)!);
            var kelvin = result.GetValue(temperature) ?? structure.Materials?.TemperatureKelvin
                ?? throw new UsageException("give --temperature K (the structure file has no material temperature to take it from).");
            var inPlane = InPlaneMass(structure.Cell, result.GetValue(mass));
            Write(structure, kelvin, inPlane, mu, n, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static Option<double?> InPlaneMassOption() => Common.NumberOption("--in-plane-mass", "m0", "0.067",
        "Mass of the free motion in the layer plane, m0 (default: the mass of the cell's lowest-potential layer, where the carriers sit).");

    public static void CheckMass(double? mass)
    {
        if (mass is { } m && !(m > 0 && m <= 1e7))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--in-plane-mass must be a positive mass in m0 (at most 1e7); got {m:R}."));
        }
    }

    private static void CheckTemperature(double? kelvin, string option)
    {
        if (kelvin is { } t && !(t >= 0 && t <= 1000))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{option} must be between 0 and 1000 K; got {t:R}."));
        }
    }

    /// <summary>The in-plane mass: the option, else the mass of the lowest-potential uniform layer (the well), else the cell's smallest mass.</summary>
    public static EffectiveMass InPlaneMass(UnitCell cell, double? option)
    {
        if (option is { } m)
        {
            return EffectiveMass.FromElectronMasses(m);
        }
        var well = cell.Elements.OfType<Layer>().OrderBy(l => l.Potential.ElectronVolts).FirstOrDefault();
        return well?.Mass ?? cell.MinimumMass;
    }

    private static void Write(StructureDefinition structure, double kelvin, EffectiveMass inPlane, double? fermi, double? densityPerCm3, OutputFormat format, string? outPath)
    {
        double level, perNm3, error;
        int evaluations;
        Periodic.Properties.FermiLevelSolution? solution = null;
        try
        {
            if (fermi is { } mu)
            {
                var properties = PointQuantities.PropertiesUpTo(structure.Cell, mu + 40 * PhysicalConstants.BoltzmannElectronVoltsPerKelvin * kelvin);
                var n = properties.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(kelvin), inPlane);
                (level, perNm3, error, evaluations) = (mu, n.DensityPerCubicNanometre, n.ErrorEstimatePerCubicNanometre, n.EnergyEvaluations);
            }
            else
            {
                var target = densityPerCm3!.Value * 1e-21;
                var properties = PropertiesForDensity(structure.Cell, target, kelvin, inPlane);
                var s = properties.FermiLevelForSuperlatticeDensity(target, Temperature.FromKelvin(kelvin), inPlane);
                solution = s;
                var n = properties.SuperlatticeCarrierDensity(Energy.FromElectronVolts(s.FermiLevelElectronVolts), Temperature.FromKelvin(kelvin), inPlane);
                (level, perNm3, error, evaluations) = (s.FermiLevelElectronVolts, n.DensityPerCubicNanometre, n.ErrorEstimatePerCubicNanometre, n.EnergyEvaluations);
            }
        }
        catch (ArgumentOutOfRangeException e)
        {
            var option = fermi is not null ? "--fermi-level" : "--density";
            var value = fermi ?? densityPerCm3!.Value;
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{option} {value:R} cannot be used: {Common.Describe(e)}"));
        }
        var warnings = Common.CheckEnergies(structure, [level]);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("fermiLevel", "eV"), ("temperature", "K"), ("density", "1/nm3"), ("densityPerCm3", "1/cm3"), ("errorEstimate", "1/nm3"), ("inPlaneMass", "m0"));
                w.WriteString("given", fermi is not null ? "fermiLevel" : "density");
                w.WriteNumber("fermiLevel", level);
                w.WriteNumber("temperature", kelvin);
                w.WriteNumber("inPlaneMass", inPlane.ElectronMasses);
                w.WriteNumber("density", perNm3);
                w.WriteNumber("densityPerCm3", perNm3 * 1e21);
                w.WriteNumber("errorEstimate", error);
                w.WriteNumber("evaluations", evaluations);
                if (solution is { } s)
                {
                    w.WriteNumber("fermiLevelTolerance", s.ToleranceElectronVolts);
                    w.WriteNumber("relativeDensityResidual", s.RelativeDensityResidual);
                    w.WriteBoolean("converged", s.Converged);
                }
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure.Cell, [level]);
        var table = new Table(Column.Energy("Fermi level", unit), new Column("T", "K", Format: "G6"), new Column("density", "1/cm3", Format: "G10"),
            new Column("error", "1/cm3", Format: "G3"), new Column("in-plane mass", "m0", Format: "G6"));
        table.Add(level, kelvin, perNm3 * 1e21, error * 1e21, inPlane.ElectronMasses);
        var title = Common.TableTitle(structure, unit) + (fermi is not null ? "Density at the given Fermi level" : "Fermi level for the given density")
            + " (spin included; free in-plane motion of one mass; no space charge or band bending).\n";
        Common.EmitTable(table, format, title, outPath);
    }

    /// <summary>Bands enough for <paramref name="density"/>: doubled until the density at the top computed band's edge exceeds it.</summary>
    private static BandProperties PropertiesForDensity(UnitCell cell, double density, double kelvin, EffectiveMass inPlane)
    {
        var kT = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * kelvin;
        for (var count = 2; ; count *= 2)
        {
            var properties = BandProperties.Create(Solver.Compute(cell, count).Structure);
            var top = properties.Structure.Bands[^1].BottomElectronVolts;
            var limit = top - 40 * kT;
            if (limit > properties.Structure.Bands[0].BottomElectronVolts && properties.SuperlatticeCarrierDensity(Energy.FromElectronVolts(limit), Temperature.FromKelvin(kelvin), inPlane).DensityPerCubicNanometre > density)
            {
                return properties;
            }
            if (count >= 1024)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--density {density * 1e21:R} 1/cm3 needs more than 1024 bands; give a smaller density."));
            }
        }
    }
}
