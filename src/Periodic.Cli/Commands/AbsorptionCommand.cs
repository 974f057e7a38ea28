// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Optics;
using Periodic.Serialization;
using ScottPlot;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>absorption FILE --density N</c>: intersubband absorption α(ħω) of the file's stack for light polarised along the growth
/// axis, per unit length and per pass; optional pictures of α(ħω) and of the levels with |ψ|² on the potential profile.
/// </summary>
internal static class AbsorptionCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var stackOptions = new TransitionsCommand.StackOptions();
        var temperature = Common.NumberOption("--temperature", "K", "77", "Temperature, K (0.1 to 1000; default 77, or with a doped file's own Fermi level the temperature it was solved at).");
        var density = Common.NumberOption("--density", "cm^-2", "1e11", "Electrons in the whole stack per cm^2 (give this or --fermi; a doped file: default its self-consistent Fermi level).");
        var fermi = Common.NumberOption("--fermi", "eV", "0.05", "Fermi level, eV on the stack's energy scale (give this or --density; a doped file: default its self-consistent Fermi level).");
        var linewidth = Common.NumberOption("--linewidth", "eV", "0.005", "Full width at half maximum of each line, eV (default 0.005).");
        var shape = new Option<string>("--shape") { Description = "Line shape: lorentzian (default) or gaussian.", DefaultValueFactory = _ => "lorentzian" };
        shape.AcceptOnlyFromAmong("lorentzian", "gaussian");
        var index = Common.NumberOption("--index", "1", "3.3", "Refractive index at the transitions (default 3.3).");
        var depolarisation = new Option<bool>("--depolarisation") { Description = "Shift each line by the depolarisation (plasma) effect: E^2 -> E^2 (1 + 2e^2 dn S/(eps eps0 E))." };
        var permittivity = Common.NumberOption("--permittivity", "1", "10.9", "Relative permittivity for the depolarisation shift (default n^2).");
        var repeats = new Option<int>("--repeats") { Description = "Copies of the stack in one optical pass, for the fraction absorbed per pass (default 1).", DefaultValueFactory = _ => 1 };
        var grid = new EnergyGridOptions();
        var continuum = new Option<bool>("--continuum") { Description = "Also take lines to quasi-bound final states (as transitions --continuum; their widths are reported by transitions, the line width stays --linewidth)." };
        var plot = new Option<string?>("--plot") { Description = "Also draw alpha(hbar w) to this .png or .svg file." };
        var plotLevels = new Option<string?>("--plot-levels") { Description = "Also draw the potential profile with the levels and |psi|^2 to this .png or .svg file." };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write the table/JSON/CSV to this file instead of stdout (atomically)." };
        var command = new Command("absorption", "Intersubband absorption alpha(hbar w) of a stack for light polarised along the growth axis, from a sheet density or Fermi level at a temperature.");
        command.Arguments.Add(file);
        stackOptions.AddTo(command, false);
        command.Options.Add(stackOptions.Bias);
        foreach (var option in new Option[] { temperature, density, fermi, linewidth, shape, index, depolarisation, permittivity, repeats, continuum })
        {
            command.Options.Add(option);
        }
        grid.AddTo(command);
        command.Options.Add(plot);
        command.Options.Add(plotLevels);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var t = result.GetValue(temperature) ?? AbsorptionOptions.DefaultTemperatureKelvin;
            if (!(t >= AbsorptionOptions.MinTemperatureKelvin && t <= AbsorptionOptions.MaxTemperatureKelvin))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--temperature must lie in [{AbsorptionOptions.MinTemperatureKelvin}, {AbsorptionOptions.MaxTemperatureKelvin}] K; got {t:R}."));
            }
            var n = result.GetValue(density);
            var ef = result.GetValue(fermi);
            if (n is not null && ef is not null)
            {
                throw new UsageException("give exactly one of --density (cm^-2) and --fermi (eV).");
            }
            if (n is { } nv && !(nv > 0 && nv <= 1e15))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--density must lie in (0, 1e15] per cm^2; got {nv:R}."));
            }
            var gamma = result.GetValue(linewidth) ?? AbsorptionOptions.DefaultLinewidthElectronVolts;
            if (!(gamma > 0 && gamma <= 1))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--linewidth (FWHM) must lie in (0, 1] eV; got {gamma:R}."));
            }
            var refractive = result.GetValue(index) ?? AbsorptionOptions.DefaultRefractiveIndex;
            if (!(refractive >= 1 && refractive <= 10))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--index must lie in [1, 10]; got {refractive:R}."));
            }
            var eps = result.GetValue(permittivity);
            if (eps is { } ev && !(ev >= 1 && ev <= 1000))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--permittivity must lie in [1, 1000]; got {ev:R}."));
            }
            var copies = result.GetValue(repeats);
            if (copies < 1 || copies > 100_000)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--repeats must lie in [1, 100000]; got {copies}."));
            }
            // Every output path is checked before anything is computed or written, so a bad picture path leaves no --out file behind.
            foreach (var (name, path) in new[] { ("--plot", result.GetValue(plot)), ("--plot-levels", result.GetValue(plotLevels)) })
            {
                if (path is null)
                {
                    continue;
                }
                if (Path.GetExtension(path).ToLowerInvariant() is not (".png" or ".svg"))
                {
                    throw new UsageException($"{name} must end in .png or .svg; got {Printable.Quote(path)}.");
                }
                OutputFile.Validate(path, name);
            }
            if (result.GetValue(output) is { } outPath)
            {
                OutputFile.Validate(outPath);
            }
            var hasGrid = result.GetValue(grid.From) is not null || result.GetValue(grid.To) is not null || result.GetValue(grid.Points) is not null || result.GetValue(grid.Energies) is not null;
            var given = hasGrid ? grid.Read(result) : null;
            if (given is not null && Array.FindIndex(given, e => !(e > 0)) is var bad and >= 0)
            {
                var option = result.GetValue(grid.Energies) is not null ? string.Create(CultureInfo.InvariantCulture, $"--energies: item {bad + 1}") : bad == 0 ? "--from" : "--to";
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{option} is {given[bad]:R} eV, but photon energies must be positive (above 0 eV)."));
            }
            var structure = Common.LoadStack(result, result.GetValue(file)!, "absorption", result.GetValue(stackOptions.Bias), usesBias: true);
            // A doped file solved self-consistently has its electrons already: its Fermi level is the default.
            var selfConsistent = (Periodic.SpaceCharge.SelfConsistentSolution?)structure.SelfConsistentStack ?? structure.SelfConsistent;
            var fermiSource = n is not null ? "--density" : ef is not null ? "--fermi" : "self-consistent";
            if (n is null && ef is null && selfConsistent is not null && result.GetValue(temperature) is null)
            {
                // The Fermi level belongs to the solution's temperature (1 to 1000 K for a doped structure, inside the
                // absorption's range; AbsorptionOptions.Create checks it all the same).
                t = selfConsistent.TemperatureKelvin;
            }
            if (n is null && ef is null)
            {
                ef = selfConsistent?.FermiLevelElectronVolts
                    ?? throw new UsageException("give exactly one of --density (cm^-2) and --fermi (eV); only a doped file (solved self-consistently) has a Fermi level of its own.");
            }
            var stack = stackOptions.Build(result, structure);
            var spectrum = TransitionsCommand.Compute(stack, TransitionsCommand.ChooseBias(result, stackOptions, structure),
                result.GetValue(continuum) ? IntersubbandOptions.Create(includeQuasiBound: true) : null, stackOptions.DefaultLeadsHint(result, structure, stack));
            var options = AbsorptionOptions.Create(temperatureKelvin: t, linewidthElectronVolts: gamma,
                shape: result.GetValue(shape) == "gaussian" ? LineShape.Gaussian : LineShape.Lorentzian, refractiveIndex: refractive,
                depolarisation: result.GetValue(depolarisation), relativePermittivity: eps, passRepeats: copies);
            var absorption = n is { } sheetDensity
                ? AbsorptionSpectrum.Compute(spectrum, sheetDensity, options)
                : AbsorptionSpectrum.ComputeAtFermiLevel(spectrum, ef!.Value, options);
            var levelWarnings = stackOptions.CheckLevels(result, structure, spectrum);
            var energies = given ?? DefaultGrid(absorption);
            var alpha = new double[energies.Length];
            absorption.Evaluate(energies, alpha);
            // A self-consistent stack carries lead buffers inside its domain: alpha is averaged over the file's own stack, as for
            // the rigid bands (alpha L, and so the fraction absorbed per pass, is the same either way).
            var thickness = structure.SelfConsistentStack?.Input.Stack.Thickness.Nanometres ?? absorption.ThicknessNanometres;
            for (var i = 0; i < alpha.Length; i++)
            {
                alpha[i] *= absorption.ThicknessNanometres / thickness;
            }
            foreach (var warning in absorption.Warnings)
            {
                Console.Error.WriteLine($"periodic: warning: {warning}");
            }
            // Render everything before writing anything, so that a failure leaves no partial output.
            var text = Render(structure, absorption, energies, alpha, format, levelWarnings, fermiSource, thickness);
            var pictures = new List<(string Option, string Path, Plot Plot)>();
            if (result.GetValue(plot) is { } alphaPath)
            {
                pictures.Add(("--plot", alphaPath, AlphaPlot(structure, absorption, energies, alpha)));
            }
            if (result.GetValue(plotLevels) is { } levelsPath)
            {
                pictures.Add(("--plot-levels", levelsPath, LevelsPlot(structure, spectrum)));
            }
            Common.Emit(text, result.GetValue(output));
            foreach (var (option, path, picture) in pictures)
            {
                Save(picture, path, option);
                Console.Error.WriteLine($"wrote {path}");
            }
            return 0;
        });
        return command;
    }

    /// <summary>400 points from below the lowest line to above the highest, 6 line widths beyond each.</summary>
    private static double[] DefaultGrid(AbsorptionSpectrum absorption)
    {
        var lines = absorption.Lines.Where(l => l.DensityDifferencePerSquareCentimetre != 0).Select(l => l.EnergyElectronVolts).DefaultIfEmpty(absorption.Lines.Count > 0 ? absorption.Lines[0].EnergyElectronVolts : 0.1).ToArray();
        var width = absorption.Options.LinewidthElectronVolts;
        var low = Math.Max(0.1 * lines.Min(), lines.Min() - 6 * width);
        var high = lines.Max() + 6 * width;
        var grid = new double[400];
        for (var i = 0; i < grid.Length; i++)
        {
            grid[i] = low + (high - low) * i / (grid.Length - 1);
        }
        return grid;
    }

    private static string R(double value) => Table.Number(value, "R");

    private static string Render(StructureDefinition structure, AbsorptionSpectrum absorption, double[] energies, double[] alpha, OutputFormat format,
        IReadOnlyList<Periodic.Materials.ModelWarning> levelWarnings, string fermiSource, double thickness)
    {
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure, levelWarnings);
                Common.Units(w, ("energy", "eV"), ("alpha", "1/cm"), ("density", "1/cm^2"), ("dipole", "nm"), ("thickness", "nm"), ("temperature", "K"), ("linewidth", "eV"));
                w.WriteString("model", TransitionsCommand.IntersubbandLimits + " Only bound levels hold electrons; the line width is an input.");
                w.WriteNumber("temperature", absorption.Options.TemperatureKelvin);
                w.WriteNumber("fermiLevel", absorption.FermiLevelElectronVolts);
                w.WriteString("fermiLevelSource", fermiSource);
                w.WriteNumber("density", absorption.SheetDensityPerSquareCentimetre);
                w.WriteNumber("linewidth", absorption.Options.LinewidthElectronVolts);
                w.WriteString("shape", absorption.Options.Shape == LineShape.Gaussian ? "gaussian" : "lorentzian");
                w.WriteNumber("refractiveIndex", absorption.Options.RefractiveIndex);
                w.WriteNumber("thickness", thickness);
                w.WriteNumber("repeats", absorption.Options.PassRepeats);
                w.WriteStartArray("occupations");
                for (var i = 0; i < absorption.Occupations.Count; i++)
                {
                    w.WriteStartObject();
                    w.WriteNumber("level", i + 1);
                    w.Number("energy", absorption.Spectrum.Levels[i].EnergyElectronVolts);
                    w.Number("density", absorption.Occupations[i]);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartArray("lines");
                foreach (var line in absorption.Lines)
                {
                    w.WriteStartObject();
                    w.WriteNumber("from", line.From);
                    w.WriteNumber("to", line.To);
                    w.Number("energy", line.EnergyElectronVolts);
                    w.Number("transitionEnergy", line.TransitionEnergyElectronVolts);
                    w.Number("depolarisationShift", line.DepolarisationShiftElectronVolts);
                    w.Number("densityDifference", line.DensityDifferencePerSquareCentimetre);
                    w.Number("dipole", Math.Abs(line.DipoleNanometres));
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartArray("warnings");
                foreach (var warning in absorption.Warnings)
                {
                    w.WriteStringValue(warning);
                }
                w.WriteEndArray();
                w.WriteStartArray("points");
                for (var i = 0; i < energies.Length; i++)
                {
                    w.WriteStartObject();
                    w.Number("energy", energies[i]);
                    w.Number("alpha", alpha[i]);
                    w.Number("passAbsorption", absorption.PassAbsorption(energies[i]));
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var csv = format == OutputFormat.Csv;
        var table = new Table("photon energy (eV)", "alpha (1/cm)", "absorbed per pass");
        for (var i = 0; i < energies.Length; i++)
        {
            table.Add(csv ? R(energies[i]) : Table.Number(energies[i], "F5"), csv ? R(alpha[i]) : Table.Number(alpha[i], "G6"),
                csv ? R(absorption.PassAbsorption(energies[i])) : Table.Number(absorption.PassAbsorption(energies[i]), "G6"));
        }
        if (csv)
        {
            return table.ToCsv();
        }
        var head = Common.TableTitle(structure) + string.Create(CultureInfo.InvariantCulture,
            $"{absorption.Options.TemperatureKelvin:G6} K, E_F = {absorption.FermiLevelElectronVolts:G8} eV{(fermiSource == "self-consistent" ? " (the doped file's self-consistent Fermi level)" : "")}, {absorption.SheetDensityPerSquareCentimetre:G4} cm^-2 in {Common.Plural(absorption.Spectrum.BoundCount, "level")}, FWHM {absorption.Options.LinewidthElectronVolts * 1000:G4} meV, n = {absorption.Options.RefractiveIndex:G4}, alpha averaged over {thickness:G6} nm, {(absorption.Options.PassRepeats == 1 ? "1 copy" : $"{absorption.Options.PassRepeats} copies")} per pass\n");
        foreach (var line in absorption.Lines.Where(l => l.DensityDifferencePerSquareCentimetre != 0))
        {
            head += string.Create(CultureInfo.InvariantCulture,
                $"  line {line.From}->{line.To}: {line.EnergyElectronVolts * 1000:F3} meV (shift {line.DepolarisationShiftElectronVolts * 1000:F3} meV), dn = {line.DensityDifferencePerSquareCentimetre:G4} cm^-2, |z| = {Math.Abs(line.DipoleNanometres):G6} nm\n");
        }
        return head + "\n" + table.ToText() + TransitionsCommand.IntersubbandLimits + "\n";
    }

    private static Plot AlphaPlot(StructureDefinition structure, AbsorptionSpectrum absorption, double[] energies, double[] alpha)
    {
        var plot = new Plot();
        plot.Title($"Intersubband absorption: {structure.Name}", size: 16);
        plot.XLabel("Photon energy (eV)", size: 14);
        plot.YLabel("alpha (1/cm), field along the growth axis", size: 14);
        var line = plot.Add.ScatterLine(energies, alpha);
        line.LineWidth = 2.5f;
        line.Color = Color.FromHex("#1F4E79");
        return plot;
    }

    private static Plot LevelsPlot(StructureDefinition structure, IntersubbandSpectrum spectrum)
    {
        var plot = new Plot();
        plot.Title($"Levels and |psi|^2: {structure.Name}", size: 16);
        plot.XLabel("Position (nm)", size: 14);
        plot.YLabel("Energy (eV)", size: 14);
        var stack = spectrum.Stack;
        var length = stack.Thickness.Nanometres;
        var pad = Math.Max(2, 0.15 * length);
        var drop = spectrum.Bias.ElectronVolts;
        // The profile: step through the written-out layers.
        var xs = new List<double> { -pad, 0 };
        var vs = new List<double> { stack.LeftLead.Potential.ElectronVolts, stack.LeftLead.Potential.ElectronVolts };
        double x = 0;
        foreach (var part in stack.Parts)
        {
            var elements = part.Cell is null ? [part.Element!] : part.Cell.Elements.ToArray();
            for (var r = 0; r < part.Repetitions && xs.Count < 20_000; r++)
            {
                foreach (var element in elements)
                {
                    if (element is Structures.Layer layer)
                    {
                        // Under bias the potential drops linearly across the stack.
                        xs.Add(x);
                        vs.Add(layer.Potential.ElectronVolts - drop * x / length);
                        x += layer.Width.Nanometres;
                        xs.Add(x);
                        vs.Add(layer.Potential.ElectronVolts - drop * x / length);
                    }
                }
            }
        }
        xs.Add(length);
        vs.Add(stack.RightLead.Potential.ElectronVolts - drop);
        xs.Add(length + pad);
        vs.Add(stack.RightLead.Potential.ElectronVolts - drop);
        var profile = plot.Add.ScatterLine(xs.ToArray(), vs.ToArray());
        profile.Color = Color.FromHex("#404040");
        profile.LineWidth = 2;
        var energies = spectrum.Levels.Select(l => l.EnergyElectronVolts).ToArray();
        var spacing = energies.Length > 1 ? energies.Zip(energies.Skip(1), (a, b) => b - a).Where(d => d > 0).DefaultIfEmpty(0.05).Min() : 0.05;
        const int points = 600;
        var grid = Enumerable.Range(0, points).Select(i => -pad + (length + 2 * pad) * i / (points - 1)).ToArray();
        foreach (var level in spectrum.Levels.Take(30))
        {
            var density = grid.Select(p => level.WavefunctionAt(p) * level.WavefunctionAt(p)).ToArray();
            var max = density.Max();
            var scale = max > 0 ? 0.8 * spacing / max : 0;
            var curve = plot.Add.ScatterLine(grid, density.Select(d => level.EnergyElectronVolts + scale * d).ToArray());
            curve.LineWidth = 1.5f;
            curve.Color = level.IsQuasiBound ? Color.FromHex("#B85450") : Color.FromHex("#1F4E79");
            var baseline = plot.Add.HorizontalLine(level.EnergyElectronVolts);
            baseline.Color = Colors.Gray;
            baseline.LinePattern = LinePattern.Dotted;
        }
        plot.Axes.SetLimitsX(-pad, length + pad);
        return plot;
    }

    private static void Save(Plot plot, string path, string option)
    {
        if (Path.GetExtension(path).Equals(".svg", StringComparison.OrdinalIgnoreCase))
        {
            OutputFile.WriteText(path, plot.GetSvgXml(900, 600), option);
        }
        else
        {
            var bytes = plot.GetImage(900, 600).GetImageBytes(ImageFormat.Png);
            OutputFile.WriteAtomically(path, stream => stream.Write(bytes), option);
        }
    }
}
