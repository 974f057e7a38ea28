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
        var periods = new Option<int?>("--periods", "-N") { Description = "Use N periods of the cell (1 to 1,000,000) instead of the file's stack." };
        var grid = new EnergyGridOptions();
        var leadPotential = Common.NumberOption("--lead-potential", "eV", "0", "Potential of both leads, eV (default: the file's stack, else the first layer's).");
        var leadMass = Common.NumberOption("--lead-mass", "m0", "0.067", "Effective mass in both leads, m0 (default: the file's stack, else the first layer's).");
        var bias = BiasOption();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("transmission", "Transmission and reflection of a finite stack of N periods between two uniform leads.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        command.Options.Add(periods);
        grid.AddTo(command);
        command.Options.Add(leadPotential);
        command.Options.Add(leadMass);
        command.Options.Add(bias);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
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
            if (potential is { } v)
            {
                Limits.CheckEnergy("--lead-potential", v);
            }
            if (mass is { } m)
            {
                Limits.CheckMass("--lead-mass", m);
            }
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.LoadStack(result, result.GetValue(file)!, "transmission", result.GetValue(bias), usesBias: true));
            var (stack, source) = Physics.StackOptions.Choose(structure, n, potential, mass);
            Write(structure, stack, source, energies, ChooseBias(result.GetValue(bias), structure), format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    /// <summary>The <c>--bias</c> option of <c>transmission</c> and <c>plot</c>: one energy eU in eV.</summary>
    public static Option<double?> BiasOption() => Common.NumberOption("--bias", "eV", "0.1",
        "Applied bias eU across the stack, eV: a uniform field, the right lead's band edge lowered by eU (default: the file's stack.bias, else 0). No space charge: a design guide.");

    /// <summary>The bias to apply and where it came from (for messages): <c>--bias</c> if given, else the file's <c>stack.bias</c> (0 without one).</summary>
    public static (double ElectronVolts, string Source) ChooseBias(double? option, StructureDefinition structure) =>
        option is { } u ? (Limits.CheckEnergy("--bias", u), "--bias") : (structure.StackBias.ElectronVolts + 0.0, $"stack.bias of {structure.SourceName}");

    /// <summary>
    /// Compiles <paramref name="stack"/> under <paramref name="bias"/>; the library's refusal (too many elements written
    /// out, an element that cannot be put under bias) becomes a usage error naming the option, the value and what is allowed.
    /// </summary>
    public static StackTransmission Compile(LayerStack stack, double bias, string source)
    {
        try
        {
            return StackTransmission.Create(stack, Energy.FromElectronVolts(bias));
        }
        catch (ArgumentException e)
        {
            var allowed = stack.ElementCount > StackTransmission.MaxBiasedElements && stack.Parts.Count == 1 && stack.Parts[0].Cell is { } cell
                ? string.Create(CultureInfo.InvariantCulture,
                    $" Allowed: at most {StackTransmission.MaxBiasedElements / cell.Elements.Count} periods of this {cell.Elements.Count}-element cell (--periods) under a non-zero bias, or bias 0.")
                : " Allowed: bias 0 for this stack.";
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{source} {bias:R} eV cannot be applied: {Common.Describe(e)}{allowed}"));
        }
    }

    /// <summary>N periods of the cell between leads: the command-line lead options, else the file's stack, else the cell's first layer.</summary>
    public static LayerStack BuildStack(StructureDefinition structure, int periods, double? potential, double? mass)
    {
        Lead left, right;
        if (structure.Stack is { } given)
        {
            // Each option replaces its own quantity on both of the file's leads; the other keeps the file's value.
            (left, right) = (Override(given.LeftLead, potential, mass), Override(given.RightLead, potential, mass));
        }
        else
        {
            left = right = structure.SelfConsistent is { } sc
                ? SelfConsistentLead(sc, potential, mass)
                : DefaultLead(structure.Cell, potential, mass);
        }
        return LayerStack.Periodic(left, structure.Cell, periods, right);
    }

    private static Lead Override(Lead lead, double? potential, double? mass) =>
        potential is null && mass is null
            ? lead
            : Lead.Create(Energy.FromElectronVolts(potential ?? lead.Potential.ElectronVolts), EffectiveMass.FromElectronMasses(mass ?? lead.Mass.ElectronMasses));

    /// <summary>
    /// For a self-consistent cell (whose layers are sampled segments): leads like the rigid cell's first layer, raised by the
    /// Hartree potential at the cell start, where they attach, unless overridden.
    /// </summary>
    private static Lead SelfConsistentLead(Periodic.SpaceCharge.SelfConsistentCell solution, double? potential, double? mass)
    {
        var rigid = DefaultLead(solution.Input.Cell, null, null);
        return Lead.Create(Energy.FromElectronVolts(potential ?? rigid.Potential.ElectronVolts + solution.HartreeElectronVolts[0]),
            EffectiveMass.FromElectronMasses(mass ?? rigid.Mass.ElectronMasses));
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

    public static (StackTransmission Stack, TransmissionResult[] Results) Compute(LayerStack layers, double[] energies, (double ElectronVolts, string Source) bias)
    {
        if (bias.ElectronVolts != 0)
        {
            Limits.CheckWork("energies × stack elements under bias", Limits.Product(energies.Length, layers.ElementCount),
                Limits.MaxBiasedTransmissionWork, "under bias every energy walks every element of the stack (about 1.1 µs each)");
        }
        var transmission = Compile(layers, bias.ElectronVolts, bias.Source);
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

    public static void Write(StructureDefinition structure, LayerStack layers, string source, double[] energies,
        (double ElectronVolts, string Source) bias, OutputFormat format, string? outPath)
    {
        var (stack, results) = Compute(layers, energies, bias);
        var lead = stack.Stack.LeftLead;
        var warnings = Common.CheckEnergies(structure, energies);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("energy", "eV"), ("transmission", "1"), ("reflection", "1"), ("potential", "eV"), ("mass", "m0"), ("thickness", "nm"), ("period", "nm"), ("bias", "eV"));
                Common.StackObject(w, stack.Stack, source, stack.Bias.ElectronVolts);
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
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure, energies);
        var table = new Table(Column.Energy("energy", unit), new Column("transmission", Format: "G8"), new Column("reflection", Format: "G8"), new Column("log10 T", Format: "F3"));
        foreach (var r in results)
        {
            table.Add(r.EnergyElectronVolts, r.Transmission, r.Reflection, r.Log10Transmission);
        }
        var title = Common.TableTitle(structure, unit) + string.Create(CultureInfo.InvariantCulture,
            $"Stack: {source}: {Physics.StackOptions.Describe(layers)}; {stack.Stack.Thickness.Nanometres:G6} nm, leads V = {lead.Potential.ElectronVolts:G6} eV, m = {lead.Mass.ElectronMasses:G6} m0, bias eU = {stack.Bias.ElectronVolts:G6} eV\n")
            + "log10 T: empty in CSV (null in JSON) where T = 0 (a lead closed).\n";
        Common.EmitTable(table, format, title, outPath);
    }
}
