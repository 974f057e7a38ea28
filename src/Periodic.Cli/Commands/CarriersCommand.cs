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
        var command = new Command("carriers", "Superlattice carrier density at a Fermi level and temperature, or the Fermi level for a density (spin included): with one in-plane mass, and exact with each layer's own in-plane mass.");
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
            var kelvin = result.GetValue(temperature) ?? structure.Materials?.Temperature.Kelvin
                ?? throw new UsageException("give --temperature K (the structure file has no material temperature to take it from).");
            var inPlane = InPlaneMass(structure.Cell, result.GetValue(mass));
            Write(structure, kelvin, inPlane, mu, n, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static Option<double?> InPlaneMassOption() => Common.NumberOption("--in-plane-mass", "m0", "0.067",
        "Mass of the one-in-plane-mass approximation, m0 (default: the mass of the cell's lowest-potential layer, where the carriers sit); the exact values use each layer's own mass.");

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
        var exactWhy = DosCommand.ExactUnavailable(structure.Cell);
        ExactDensity? exact = null;
        if (exactWhy is null)
        {
            exact = fermi is not null
                ? new ExactDensity(InPlaneDensities.CarrierDensity(structure.Cell, Energy.FromElectronVolts(level), Temperature.FromKelvin(kelvin), inPlane), 0, true, 0)
                : ExactFermiLevel(structure.Cell, densityPerCm3!.Value * 1e-21, level, kelvin, inPlane);
        }
        else
        {
            Console.Error.WriteLine($"periodic: note: {Common.Printable(structure.SourceName)}: exact in-plane density not computed ({exactWhy}); the single-in-plane-mass value is given.");
        }
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
                if (exact is { } x)
                {
                    // Each layer's own in-plane mass; the single-mass value above, at the exact Fermi level, beside it.
                    w.WriteStartObject("exact");
                    w.WriteNumber("fermiLevel", x.Density.FermiLevelElectronVolts);
                    w.WriteNumber("density", x.Density.ExactPerCubicNanometre);
                    w.WriteNumber("densityPerCm3", x.Density.ExactPerCubicNanometre * 1e21);
                    w.WriteNumber("errorEstimate", x.Density.ErrorEstimatePerCubicNanometre);
                    w.WriteNumber("singleMassDensity", x.Density.SingleMassPerCubicNanometre);
                    w.Number("singleMassRelativeError", x.Density.RelativeErrorOfSingleMass);
                    if (fermi is null)
                    {
                        w.WriteNumber("relativeDensityResidual", x.RelativeResidual);
                        w.WriteBoolean("converged", x.Converged);
                        w.WriteNumber("iterations", x.Iterations);
                    }
                    w.WriteEndObject();
                }
                else
                {
                    w.WriteString("exactUnavailable", exactWhy);
                }
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure, [level]);
        // The one-mass columns first (as before the exact values existed), the exact ones appended.
        var columns = new List<Column> { Column.Energy("Fermi level", unit), new("T", "K", Format: "G6"), new("density", "1/cm3", Format: "G10"),
            new("error", "1/cm3", Format: "G3"), new("in-plane mass", "m0", Format: "G6") };
        var row = new List<Cell> { level, kelvin, perNm3 * 1e21, error * 1e21, inPlane.ElectronMasses };
        if (exact is { } x)
        {
            columns.AddRange([Column.Energy("exact Fermi level", unit), new("exact density", "1/cm3", Format: "G10"), new("exact error", "1/cm3", Format: "G3"),
                new("1-mass rel. error", Format: "G3")]);
            row.AddRange([x.Density.FermiLevelElectronVolts, x.Density.ExactPerCubicNanometre * 1e21, x.Density.ErrorEstimatePerCubicNanometre * 1e21, x.Density.RelativeErrorOfSingleMass]);
        }
        var table = new Table([.. columns]);
        table.Add([.. row]);
        var title = Common.TableTitle(structure, unit) + (fermi is not null ? "Density at the given Fermi level" : "Fermi level for the given density")
            + " (spin included; no space charge or band bending), with free in-plane motion of one mass (--in-plane-mass)"
            + (exact is null ? $"; exact values not computed: {exactWhy}" : " and exact (each layer's own in-plane mass); 1-mass rel. error: (one-mass - exact)/exact density at the exact Fermi level") + ".\n";
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

    /// <summary>The exact density (each layer's own in-plane mass) at a Fermi level, and for a given density how it was reached.</summary>
    private readonly record struct ExactDensity(InPlaneCarrierDensity Density, double RelativeResidual, bool Converged, int Iterations);

    private const int MaxExactIterations = 40;

    /// <summary>
    /// The Fermi level at which the exact density equals <paramref name="target"/> (1/nm³): quasi-Newton steps on ln n from the
    /// single-mass level <paramref name="start"/>, with the slope d ln n/dμ of the single-mass density (close to the exact one, so each
    /// step gains about two digits), until the relative residual is below 1e-10 or the exact density's own quadrature error.
    /// </summary>
    private static ExactDensity ExactFermiLevel(UnitCell cell, double target, double start, double kelvin, EffectiveMass inPlane)
    {
        var properties = PointQuantities.PropertiesUpTo(cell, start + 40 * PhysicalConstants.BoltzmannElectronVoltsPerKelvin * kelvin + 0.05);
        double LogSingle(double mu) => Math.Log(properties.SuperlatticeCarrierDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(kelvin), inPlane).DensityPerCubicNanometre);
        var mu = start;
        var n = InPlaneDensities.CarrierDensity(cell, Energy.FromElectronVolts(mu), Temperature.FromKelvin(kelvin), inPlane);
        for (var i = 1; i <= MaxExactIterations; i++)
        {
            var residual = Math.Log(n.ExactPerCubicNanometre / target);
            var tolerance = Math.Max(1e-10, n.ErrorEstimatePerCubicNanometre / n.ExactPerCubicNanometre);
            if (Math.Abs(residual) <= tolerance)
            {
                return new ExactDensity(n, n.ExactPerCubicNanometre / target - 1, true, i);
            }
            var h = Math.Max(1e-6, 1e-3 * PhysicalConstants.BoltzmannElectronVoltsPerKelvin * kelvin);
            var slope = (LogSingle(mu + h) - LogSingle(mu - h)) / (2 * h);
            if (!(slope > 0) || !double.IsFinite(slope))
            {
                break;
            }
            mu -= residual / slope;
            n = InPlaneDensities.CarrierDensity(cell, Energy.FromElectronVolts(mu), Temperature.FromKelvin(kelvin), inPlane);
        }
        return new ExactDensity(n, n.ExactPerCubicNanometre / target - 1, false, MaxExactIterations);
    }
}
