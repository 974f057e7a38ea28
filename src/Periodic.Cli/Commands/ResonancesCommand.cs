// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;
using Periodic.Stacks;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>resonances FILE --from E --to E</c>: the transmission peaks of the file's stack in an energy window, under the
/// file's bias or <c>--bias</c>: energy, peak T, full width at half maximum Γ and lifetime ħ/Γ.
/// </summary>
internal static class ResonancesCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var stackOptions = new StackOptions();
        var from = Common.NumberOption("--from", "eV", "0", "Lowest energy of the window, eV (raised to the higher lead's band edge if below it).");
        var to = Common.NumberOption("--to", "eV", "0.3", "Highest energy of the window, eV.");
        var bias = TransmissionCommand.BiasOption();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("resonances", "Transmission peaks of the file's stack between --from and --to: energy, peak T, width (FWHM) and lifetime hbar/width.");
        command.Arguments.Add(file);
        stackOptions.AddTo(command);
        foreach (var option in new Option[] { from, to, bias, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            stackOptions.Check(result);
            var low = result.GetValue(from) ?? throw new UsageException("give the window: --from E --to E (eV).");
            var high = result.GetValue(to) ?? throw new UsageException("give the window: --from E --to E (eV).");
            if (!(high > low))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--to must lie above --from; got --from {low:R} and --to {high:R} eV."));
            }
            var structure = Common.LoadStack(result, result.GetValue(file)!, "resonances", result.GetValue(bias), usesBias: true);
            var (stack, source) = stackOptions.Build(result, structure);
            var u = TransmissionCommand.ChooseBias(result.GetValue(bias), structure);
            var transmission = TransmissionCommand.Compile(stack, u.ElectronVolts, u.Source);
            ResonanceSpectrum spectrum;
            try
            {
                spectrum = transmission.FindResonances(low, high);
            }
            catch (ArgumentException e)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--from {low:R} / --to {high:R} eV cannot be searched: {Common.Describe(e)}"));
            }
            if (!spectrum.RefinementComplete)
            {
                Console.Error.WriteLine("periodic: warning: the peak search ran out of its evaluation budget; peaks may be missing (narrow the window).");
            }
            var warnings = Common.CheckEnergies(structure, spectrum.Resonances.Select(r => r.EnergyElectronVolts).ToArray());
            Write(structure, transmission, source, spectrum, warnings, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    private static void Write(StructureDefinition structure, StackTransmission transmission, string source, ResonanceSpectrum spectrum,
        IReadOnlyList<Periodic.Materials.ModelWarning> warnings, OutputFormat format, string? outPath)
    {
        var stack = transmission.Stack;
        var peaks = spectrum.Resonances;
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("energy", "eV"), ("energyError", "eV"), ("peakTransmission", "1"), ("width", "eV"), ("lifetime", "s"), ("bias", "eV"), ("potential", "eV"), ("mass", "m0"), ("thickness", "nm"));
                Common.StackObject(w, stack, source, transmission.Bias.ElectronVolts);
                w.WriteStartObject("window");
                w.WriteNumber("from", spectrum.LowerElectronVolts);
                w.WriteNumber("to", spectrum.UpperElectronVolts);
                w.WriteNumber("evaluations", spectrum.Evaluations);
                w.WriteBoolean("complete", spectrum.RefinementComplete);
                w.WriteEndObject();
                w.WriteStartArray("resonances");
                foreach (var r in peaks)
                {
                    w.WriteStartObject();
                    w.WriteNumber("energy", r.EnergyElectronVolts);
                    w.WriteNumber("energyError", r.EnergyErrorElectronVolts);
                    w.Number("peakTransmission", r.PeakTransmission);
                    w.WriteNumber("log10PeakTransmission", r.LogPeakTransmission / Math.Log(10));
                    // Width and lifetime are null when T does not fall to half its peak on both sides.
                    w.Number("width", r.WidthElectronVolts);
                    w.Number("lifetime", r.HasWidth ? r.LifetimeSeconds : double.NaN);
                    w.Number("halfMaximumLower", r.HalfMaximumLowerElectronVolts);
                    w.Number("halfMaximumUpper", r.HalfMaximumUpperElectronVolts);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure, peaks.Select(r => r.EnergyElectronVolts).DefaultIfEmpty(spectrum.UpperElectronVolts));
        var widthUnit = DisplayUnits.Energy(structure, peaks.Where(r => r.HasWidth).Select(r => r.WidthElectronVolts));
        var time = DisplayUnits.Time(peaks.Where(r => r.HasWidth).Select(r => r.LifetimeSeconds));
        var table = new Table(new Column("peak"), Column.Energy("energy", unit), new Column("peak T", Format: "G8"), Column.Energy("width", widthUnit),
            new Column("lifetime", "s", time.Symbol, time.Seconds, "G6"));
        for (var i = 0; i < peaks.Count; i++)
        {
            var r = peaks[i];
            // No width where T stays above half on a side: "n/a" like the lifetime, as the note above the table says (empty in CSV).
            table.Add(i + 1, r.EnergyElectronVolts, r.PeakTransmission, r.HasWidth ? r.WidthElectronVolts : double.NaN, r.HasWidth ? r.LifetimeSeconds : double.NaN);
        }
        var title = Common.TableTitle(structure, unit) + string.Create(CultureInfo.InvariantCulture,
            $"Stack: {source}: {StackOptions.Describe(stack)}; {stack.Thickness.Nanometres:G6} nm, bias eU = {transmission.Bias.ElectronVolts:G6} eV; window {spectrum.LowerElectronVolts:G6} to {spectrum.UpperElectronVolts:G6} eV\n")
            + "width: full width at half maximum; lifetime hbar/width (Breit-Wigner); n/a (empty in CSV) where T stays above half on a side.\n";
        Common.EmitTable(table, format, title, outPath);
    }
}
