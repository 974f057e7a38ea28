// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;

namespace Periodic.Cli.Commands;

/// <summary><c>dos FILE</c>: density of states, complex wavevector and band slope on an energy grid.</summary>
internal static class DosCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var grid = new EnergyGridOptions();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var command = new Command("dos", "Density of states (spin included), Bloch wavevector, decay constant and dE/dk at each energy.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        grid.AddTo(command);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var energies = grid.Read(result);
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.Load(result.GetValue(file)!));
            Common.Emit(Render(structure, energies, format), null);
            return 0;
        });
        return command;
    }

    public static PointQuantities.Values[] Compute(StructureDefinition structure, double[] energies)
    {
        var highest = energies.Max();
        Periodic.Properties.BandProperties properties;
        try
        {
            properties = PointQuantities.PropertiesUpTo(structure.Cell, highest);
        }
        catch (ArgumentOutOfRangeException e)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"the highest energy asked for ({highest:R} eV, --to or --energies) lies above more bands than are computed at once (at most 10000): {Common.Describe(e).Replace("energyLimit", "the energy", StringComparison.Ordinal)} Choose a lower energy."));
        }
        var values = new PointQuantities.Values[energies.Length];
        using var progress = new Progress("dos", energies.Length);
        for (var i = 0; i < energies.Length; i++)
        {
            try
            {
                values[i] = PointQuantities.At(properties, energies[i]);
            }
            catch (ArgumentOutOfRangeException)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--to/--energies {energies[i]:R} eV lies above the bands this cell's density of states reaches ({properties.Structure.Bands.Count} bands, up to {properties.Structure.Bands[^1].TopElectronVolts:R} eV); choose a lower energy."));
            }
            if ((i & 255) == 0)
            {
                progress.Report(i);
            }
        }
        return values;
    }

    public static string Render(StructureDefinition structure, double[] energies, OutputFormat format)
    {
        var values = Compute(structure, energies);
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("energy", "eV"), ("dos", "1/(eV nm)"), ("wavevector", "1/nm"), ("decay", "1/nm"), ("slope", "eV nm"), ("period", "nm"));
                w.WriteStartArray("points");
                foreach (var p in values)
                {
                    w.WriteStartObject();
                    w.Number("energy", p.Energy);
                    w.Number("dos", p.Dos);
                    w.Number("wavevector", p.Wavevector);
                    w.Number("decay", p.Decay);
                    w.Number("slope", p.Slope);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var table = new Table("energy (eV)", "dos (1/(eV nm))", "Re k (1/nm)", "Im k (1/nm)", "dE/dk (eV nm)");
        foreach (var p in values)
        {
            table.Add(Table.Number(p.Energy, "F6"), Table.Number(p.Dos, "G8"), Table.Number(p.Wavevector, "G8"), Table.Number(p.Decay, "G8"), Table.Number(p.Slope, "G8"));
        }
        return format == OutputFormat.Csv ? table.ToCsv() : Common.TableTitle(structure) + "\n" + table.ToText();
    }
}
