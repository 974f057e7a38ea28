// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>current FILE --bias … --temperature K --fermi-level E</c>: the Tsu–Esaki current density of the file's stack at
/// each bias, with the quadrature's error estimate and convergence per row.
/// </summary>
internal static class CurrentCommand
{
    private const int MaxBiases = 10_000;

    // The range of the material table (materials.md); far above it the Fermi tails reach thousands of eV and the
    // integral under bias runs for hours without telling the user anything useful.
    private const double MinTemperatureKelvin = StackTransmission.MinCurrentTemperatureKelvin;
    private const double MaxTemperatureKelvin = StackTransmission.MaxCurrentTemperatureKelvin;

    public static Command Create()
    {
        var file = Common.FileArgument();
        var biases = new Option<string?>("--bias") { Description = "Comma-separated list of biases eU across the stack, eV (positive lowers the right lead), instead of --bias-from/--bias-to/--bias-points." };
        var from = Common.NumberOption("--bias-from", "eV", "0", "First bias of an evenly spaced range, eV.");
        var to = Common.NumberOption("--bias-to", "eV", "0.3", "Last bias of the range, eV.");
        var points = new Option<int?>("--bias-points") { Description = "Number of biases in the range (2 to 10,000), ends included." };
        var temperature = Common.NumberOption("--temperature", "K", "77", "Temperature of both contacts, K, from 0.1 to 1000 (default: the file's temperature for a cell of material layers).");
        var fermi = Common.NumberOption("--fermi-level", "eV", "0.02", "Fermi level of the left contact, eV, on the scale of the file's potentials (the right contact's is this minus eU).");
        var periods = new Option<int?>("--periods", "-N") { Description = "Use N periods of the cell (1 to 1,000,000; under a non-zero bias at most 100,000 elements in all) instead of the file's stack." };
        var leadPotential = Common.NumberOption("--lead-potential", "eV", "0", "Potential of both leads, eV (default: the file's stack, else the first layer's).");
        var leadMass = Common.NumberOption("--lead-mass", "m0", "0.067", "Effective mass in both leads, m0 (default: the file's stack, else the first layer's).");
        var output = Common.OutOption();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var command = new Command("current", "Current density through the file's stack at each bias (Tsu-Esaki: coherent transport, uniform field, no space charge).");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { biases, from, to, points, temperature, fermi, periods, leadPotential, leadMass, output, json, csv })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var biasList = ReadBiases(result.GetValue(biases), result.GetValue(from), result.GetValue(to), result.GetValue(points));
            if (result.GetValue(periods) is { } count)
            {
                Common.CheckCount(count, "--periods", 1_000_000);
            }
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
            var mu = Limits.CheckEnergy("--fermi-level", result.GetValue(fermi) ?? throw new UsageException("give --fermi-level E: the Fermi level of the left contact in eV, on the scale of the file's potentials."));
            foreach (var u in biasList)
            {
                Limits.CheckEnergy("--bias", u);
            }
            var t = result.GetValue(temperature);
            if (t is { } given && !(given >= MinTemperatureKelvin && given <= MaxTemperatureKelvin))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--temperature must be between {MinTemperatureKelvin} K and {MaxTemperatureKelvin} K; got {given:R}."));
            }
            var structure = Common.RequireRigid(result, Common.Load(result.GetValue(file)!), "current");
            var kelvin = t ?? structure.Materials?.Temperature.Kelvin
                ?? throw new UsageException("give --temperature K (the structure file has no material temperature to take it from).");
            if (!(kelvin >= MinTemperatureKelvin && kelvin <= MaxTemperatureKelvin))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"the file's temperature {kelvin:R} K cannot be used for the current; give --temperature in K, between {MinTemperatureKelvin} and {MaxTemperatureKelvin}."));
            }
            var (stack, source) = Physics.StackOptions.Choose(structure, result.GetValue(periods), potential, mass);
            // The library's own bound on a biased stack (elements written out) is named first: building it costs no evaluation.
            if (Array.Find(biasList, u => u != 0) is var firstBias && firstBias != 0)
            {
                TransmissionCommand.Compile(stack, firstBias, "--bias");
            }
            var elements = stack.ElementCount;
            Limits.CheckWork("(stack elements)² × biases", Limits.Product(Limits.Product(elements, elements), biasList.Length), Limits.MaxCurrentWork,
                string.Create(CultureInfo.InvariantCulture,
                    $"one bias costs about 6e-5 s × elements² of CPU (about 100 evaluations per period, each walking every element); here {(stack.Parts is [{ IsRepeatedCell: true } only] ? $"{only.Repetitions} periods × {only.Cell!.Elements.Count} elements" : $"{elements} elements")} × {biasList.Length} biases"));
            var below = FermiLevelWarnings(stack, mu);
            foreach (var line in below)
            {
                Console.Error.WriteLine("periodic: warning: " + line);
            }
            var rows = Compute(stack, biasList, mu, kelvin);
            Write(structure, stack, source, mu, kelvin, rows, below, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static double[] ReadBiases(string? list, double? from, double? to, int? points)
    {
        if (list is not null)
        {
            if (from is not null || to is not null || points is not null)
            {
                throw new UsageException("give either --bias or --bias-from/--bias-to/--bias-points, not both.");
            }
            var parts = list.Split(',', StringSplitOptions.TrimEntries);
            if (parts.Length > MaxBiases)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--bias: at most {MaxBiases} biases; got {parts.Length}."));
            }
            var values = new double[parts.Length];
            for (var i = 0; i < parts.Length; i++)
            {
                if (!double.TryParse(parts[i], NumberStyles.Float, CultureInfo.InvariantCulture, out values[i]) || !double.IsFinite(values[i]))
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                        $"--bias: item {i + 1} \"{parts[i]}\" is not a finite number (biases eU in eV, separated by commas, e.g. --bias 0,0.05,0.1)."));
                }
                values[i] += 0.0; // -0 is written as 0
            }
            return values;
        }
        if (from is null || to is null || points is null)
        {
            throw new UsageException("give the biases: --bias u1,u2,... or --bias-from U --bias-to U --bias-points N (eV).");
        }
        if (points.Value < 2 || points.Value > MaxBiases)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--bias-points must be between 2 and {MaxBiases}; got {points.Value}."));
        }
        if (from.Value == to.Value)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--bias-to must differ from --bias-from; both are {from.Value:R} eV."));
        }
        var grid = new double[points.Value];
        for (var i = 0; i < grid.Length; i++)
        {
            var s = (double)i / (grid.Length - 1);
            grid[i] = (i == grid.Length - 1 ? to.Value : from.Value * (1 - s) + to.Value * s) + 0.0;
        }
        return grid;
    }

    public static CurrentDensityResult[] Compute(LayerStack stack, double[] biases, double fermiLevel, double kelvin)
    {
        var rows = new CurrentDensityResult[biases.Length];
        using var progress = new Progress("current", biases.Length);
        for (var i = 0; i < biases.Length; i++)
        {
            var transmission = TransmissionCommand.Compile(stack, biases[i], "--bias");
            try
            {
                rows[i] = transmission.CurrentDensity(Energy.FromElectronVolts(fermiLevel), Temperature.FromKelvin(kelvin));
            }
            catch (ArgumentOutOfRangeException e) when (e.ParamName == "fermiLevel")
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--fermi-level {fermiLevel:R} eV cannot be used at --bias {biases[i]:R} eV: {Common.Describe(e).Replace("fermiLevelElectronVolts", "--fermi-level", StringComparison.Ordinal)}"));
            }
            progress.Report(i + 1);
        }
        return rows;
    }

    /// <summary>
    /// A Fermi level below a lead's band edge leaves that contact (nearly) empty: the current is then set by the
    /// thermal tail alone and comes out tiny (1e-11 A/cm2 and less), which is rarely what was meant. The right contact's
    /// level and band edge both move by eU, so one comparison per lead holds at every bias.
    /// </summary>
    public static List<string> FermiLevelWarnings(LayerStack stack, double fermiLevel)
    {
        var lines = new List<string>();
        foreach (var (name, lead) in new[] { ("left", stack.LeftLead), ("right", stack.RightLead) })
        {
            if (fermiLevel < lead.Potential.ElectronVolts)
            {
                lines.Add(string.Create(CultureInfo.InvariantCulture,
                    $"--fermi-level {fermiLevel:R} eV lies {lead.Potential.ElectronVolts - fermiLevel:G4} eV below the {name} lead's band edge ({lead.Potential.ElectronVolts:R} eV): that contact holds almost no carriers and the current is only its thermal tail; give a Fermi level above {lead.Potential.ElectronVolts:R} eV for a degenerate contact."));
            }
        }
        return lines;
    }

    public static void Write(StructureDefinition structure, LayerStack stack, string source, double fermiLevel, double kelvin, CurrentDensityResult[] rows,
        List<string> fermiWarnings, OutputFormat format, string? outPath)
    {
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("bias", "eV"), ("fermiLevel", "eV"), ("temperature", "K"), ("currentDensity", "A/m2"), ("currentDensityPerCm2", "A/cm2"),
                    ("errorEstimate", "A/m2"), ("potential", "eV"), ("mass", "m0"), ("thickness", "nm"), ("period", "nm"));
                Common.StackObject(w, stack, source);
                w.WriteNumber("fermiLevel", fermiLevel);
                w.WriteNumber("temperature", kelvin);
                w.WriteStartArray("warnings");
                foreach (var line in fermiWarnings)
                {
                    w.WriteStringValue(line);
                }
                w.WriteEndArray();
                w.WriteString("model", "Tsu-Esaki; coherent transport, uniform field, no space charge or self-consistency");
                w.WriteStartArray("points");
                foreach (var r in rows)
                {
                    w.WriteStartObject();
                    w.Number("bias", r.BiasElectronVolts);
                    w.Number("currentDensity", r.AmperesPerSquareMetre);
                    w.Number("currentDensityPerCm2", r.AmperesPerSquareCentimetre);
                    w.Number("errorEstimate", r.ErrorEstimateAmperesPerSquareMetre);
                    w.WriteBoolean("converged", r.IsConverged);
                    w.WriteNumber("resonances", r.ResonanceCount);
                    w.WriteNumber("evaluations", r.Evaluations);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            }), outPath);
            return;
        }
        var table = new Table(new Column("bias", "eV", Format: "G8"), new Column("J", "A/cm2", Format: "G8"), new Column("error", "A/cm2", Format: "G3"),
            new Column("converged"), new Column("resonances"), new Column("evaluations"));
        foreach (var r in rows)
        {
            table.Add(r.BiasElectronVolts, r.AmperesPerSquareCentimetre, r.ErrorEstimateAmperesPerSquareMetre * 1e-4, r.IsConverged, r.ResonanceCount, r.Evaluations);
        }
        var lead = stack.LeftLead;
        var title = Common.TableTitle(structure) + string.Create(CultureInfo.InvariantCulture,
            $"Stack: {source}: {Physics.StackOptions.Describe(stack)}; {stack.Thickness.Nanometres:G6} nm, leads V = {lead.Potential.ElectronVolts:G6} eV, m = {lead.Mass.ElectronMasses:G6} m0; Fermi level {fermiLevel:G6} eV (left contact), T = {kelvin:G6} K\n")
            + "Tsu-Esaki current, coherent, uniform field, no space charge or self-consistency: a design guide, check against measurement.\n"
            + string.Concat(fermiWarnings.Select(line => "warning: " + line + "\n"));
        Common.EmitTable(table, format, title, outPath);
    }
}
