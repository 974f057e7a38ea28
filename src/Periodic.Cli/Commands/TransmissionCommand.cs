// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary><c>transmission FILE --periods N</c>: T(E) and R(E) of a finite stack of N cells between leads.</summary>
internal static class TransmissionCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var periods = new Option<int?>("--periods", "-N") { Description = "Number of unit cells in the finite stack (1 to 1,000,000); default: the file's stack.periods." };
        var grid = new EnergyGridOptions();
        var leadPotential = new Option<double?>("--lead-potential") { Description = "Potential of both leads, eV (default: the first layer's)." };
        var leadMass = new Option<double?>("--lead-mass") { Description = "Effective mass in both leads, m0 (default: the first layer's)." };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var command = new Command("transmission", "Transmission and reflection of a finite stack of N periods between two uniform leads.");
        command.Arguments.Add(file);
        command.Options.Add(periods);
        grid.AddTo(command);
        command.Options.Add(leadPotential);
        command.Options.Add(leadMass);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = result.GetValue(periods);
            if (n is { } count)
            {
                Common.CheckCount(count, "--periods", 1_000_000);
            }
            var energies = grid.Read(result);
            var potential = result.GetValue(leadPotential);
            var mass = result.GetValue(leadMass);
            if (potential is { } v && !double.IsFinite(v))
            {
                throw new UsageException("--lead-potential must be a finite energy in eV.");
            }
            if (mass is { } m && !(double.IsFinite(m) && m > 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--lead-mass must be a positive mass in m0; got {m:R}."));
            }
            var structure = Common.Load(result.GetValue(file)!);
            Common.Emit(Render(structure, n ?? structure.Stack?.Parts[0].Repetitions
                ?? throw new UsageException("give --periods N (the structure file has no \"stack\" with periods)."), energies, potential, mass, format), null);
            return 0;
        });
        return command;
    }

    /// <summary>Leads like the cell's first layer unless overridden.</summary>
    public static Lead DefaultLead(UnitCell cell, double? potential, double? mass)
    {
        var first = cell.Elements.OfType<Layer>().FirstOrDefault();
        var v = potential ?? first?.Potential.ElectronVolts;
        var m = mass ?? first?.Mass.ElectronMasses;
        if (v is null || m is null)
        {
            throw new UsageException("the cell has no uniform layer to take the leads from; give --lead-potential and --lead-mass.");
        }
        return Lead.Create(Energy.FromElectronVolts(v.Value), EffectiveMass.FromElectronMasses(m.Value));
    }

    public static (StackTransmission Stack, TransmissionResult[] Results) Compute(StructureDefinition structure, int periods, double[] energies, double? potential, double? mass)
    {
        // Leads: the command-line options, else the file's stack, else the cell's first layer.
        Lead left, right;
        if (structure.Stack is { } given && potential is null && mass is null)
        {
            (left, right) = (given.LeftLead, given.RightLead);
        }
        else
        {
            left = right = DefaultLead(structure.Cell, potential, mass);
        }
        var transmission = StackTransmission.Create(LayerStack.Periodic(left, structure.Cell, periods, right));
        var results = new TransmissionResult[energies.Length];
        using var progress = new Progress("transmission", energies.Length);
        for (var i = 0; i < energies.Length; i++)
        {
            results[i] = transmission.Evaluate(energies[i]);
            if ((i & 63) == 0)
            {
                progress.Report(i);
            }
        }
        return (transmission, results);
    }

    public static string Render(StructureDefinition structure, int periods, double[] energies, double? potential, double? mass, OutputFormat format)
    {
        var (stack, results) = Compute(structure, periods, energies, potential, mass);
        var lead = stack.Stack.LeftLead;
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("energy", "eV"), ("transmission", "1"), ("reflection", "1"), ("potential", "eV"), ("mass", "m0"), ("thickness", "nm"), ("period", "nm"));
                w.WriteStartObject("stack");
                w.WriteNumber("periods", periods);
                w.WriteNumber("thickness", stack.Stack.ThicknessNanometres);
                foreach (var (name, l) in new[] { ("leftLead", stack.Stack.LeftLead), ("rightLead", stack.Stack.RightLead) })
                {
                    w.WriteStartObject(name);
                    w.WriteNumber("potential", l.PotentialElectronVolts);
                    w.WriteNumber("mass", l.MassElectronMasses);
                    w.WriteEndObject();
                }
                w.WriteEndObject();
                w.WriteStartArray("points");
                foreach (var r in results)
                {
                    w.WriteStartObject();
                    w.Number("energy", r.EnergyElectronVolts);
                    w.Number("transmission", r.Transmission);
                    w.Number("reflection", r.Reflection);
                    w.Number("log10Transmission", r.Log10Transmission);
                    w.WriteBoolean("leadsOpen", r.IsOpen);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var table = new Table("energy (eV)", "transmission", "reflection", "log10 T");
        foreach (var r in results)
        {
            table.Add(Table.Number(r.EnergyElectronVolts, "F6"), Table.Number(r.Transmission, "G8"), Table.Number(r.Reflection, "G8"), Table.Number(r.Log10Transmission, "F3"));
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        var title = Common.TableTitle(structure) + string.Create(CultureInfo.InvariantCulture,
            $"{periods} period(s), {stack.Stack.ThicknessNanometres:G6} nm, leads V = {lead.PotentialElectronVolts:G6} eV, m = {lead.MassElectronMasses:G6} m0\n");
        return title + "\n" + table.ToText();
    }
}
