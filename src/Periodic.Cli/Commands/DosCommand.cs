// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
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
        var output = Common.OutOption();
        var command = new Command("dos", "Density of states (spin included), Bloch wavevector, decay constant and dE/dk at each energy.");
        command.Arguments.Add(file);
        grid.AddTo(command);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var energies = grid.Read(result);
            var structure = Common.Load(result.GetValue(file)!);
            Write(structure, energies, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static PointQuantities.Values[] Compute(StructureDefinition structure, double[] energies)
    {
        var properties = PointQuantities.PropertiesUpTo(structure.Cell, energies.Max());
        var values = new PointQuantities.Values[energies.Length];
        using var progress = new Progress("dos", energies.Length);
        for (var i = 0; i < energies.Length; i++)
        {
            values[i] = PointQuantities.At(properties, energies[i]);
            if ((i & 255) == 0)
            {
                progress.Report(i);
            }
        }
        return values;
    }

    public static void Write(StructureDefinition structure, double[] energies, OutputFormat format, string? outPath)
    {
        var values = Compute(structure, energies);
        var warnings = Common.CheckEnergies(structure, energies);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
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
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure.Cell, energies);
        var table = new Table(Column.Energy("energy", unit), new Column("dos", "1/(eV nm)", Format: "G8"), new Column("Re k", "1/nm", Format: "G8"),
            new Column("Im k", "1/nm", Format: "G8"), new Column("dE/dk", "eV nm", Format: "G8"));
        foreach (var p in values)
        {
            table.Add(p.Energy, p.Dos, p.Wavevector, p.Decay, p.Slope);
        }
        Common.EmitTable(table, format, Common.TableTitle(structure, unit), outPath);
    }
}
