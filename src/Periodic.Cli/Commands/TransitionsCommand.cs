// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using Periodic.Cli.Output;
using Periodic.Materials;
using Periodic.Optics;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>transitions FILE</c>: intersubband transitions of the file's stack (energies, dipoles, oscillator strengths, the f-sum
/// check), or with <c>--carrier interband</c> the e–hh and e–lh transitions of a structure built from materials.
/// </summary>
internal static class TransitionsCommand
{
    private static readonly string[] Carriers = ["electron", "heavy-hole", "light-hole", "interband"];

    internal const string IntersubbandLimits =
        "Single-band envelope-function model (BenDaniel-Duke), light polarised along the growth axis, flat bands (a doped file: its self-consistent potential at zero bias) or a uniform field from the bias (no space charge under bias); no excitons or many-body effects beyond the optional depolarisation shift; band offsets and masses are uncertain by 10 % or more: confirm design numbers by measurement.";

    internal const string InterbandLimits =
        "Single-band model for each carrier (no heavy/light-hole mixing, no strain), envelope overlaps only (no Kane/Bloch factor). Excitons are not modelled: their binding, typically 5-10 meV in GaAs wells, lowers the real edge and emission line by that much.";

    /// <summary>Options shared with <c>absorption</c>: which stack, which carrier.</summary>
    internal sealed class StackOptions
    {
        public Option<string> Carrier { get; } = new("--carrier")
        {
            Description = "electron (default: the file's own carrier and stack), heavy-hole or light-hole (intersubband in that band; files with materials), or interband (e-hh and e-lh; files with materials).",
            DefaultValueFactory = _ => "electron",
        };

        public Option<int?> Periods { get; } = new("--periods", "-N") { Description = "Use N periods of the cell (1 to 100,000) instead of the file's stack; default: the file's stack as written, else 1 period." };

        public Option<double?> LeadPotential { get; } = new("--lead-potential") { Description = "Potential of both leads, eV (default: the file's stack, else the first layer's)." };

        public Option<double?> LeadMass { get; } = new("--lead-mass") { Description = "Effective mass in both leads, m0 (default: the file's stack, else the first layer's)." };

        public Option<double?> Bias { get; } = TransmissionCommand.BiasOption();

        public void AddTo(Command command, bool withInterband)
        {
            Carrier.AcceptOnlyFromAmong(withInterband ? Carriers : Carriers[..3]);
            if (!withInterband)
            {
                Carrier.Description = "electron (default: the file's own carrier and stack), heavy-hole or light-hole (intersubband in that band; files with materials).";
            }
            command.Options.Add(Carrier);
            command.Options.Add(Periods);
            command.Options.Add(LeadPotential);
            command.Options.Add(LeadMass);
        }

        /// <summary>The stack for an intersubband calculation and a description of where it came from.</summary>
        public LayerStack Build(ParseResult result, StructureDefinition structure)
        {
            var carrier = result.GetValue(Carrier)!;
            var periods = result.GetValue(Periods);
            if (structure.SelfConsistentStack is not null)
            {
                // The doped stack's own self-consistent potential: its stack and leads, its electrons.
                var option = periods is not null ? "--periods" : result.GetValue(LeadPotential) is not null ? "--lead-potential"
                    : result.GetValue(LeadMass) is not null ? "--lead-mass" : carrier != "electron" ? "--carrier " + carrier : null;
                if (option is not null)
                {
                    throw new UsageException($"{option} cannot be combined with the self-consistent stack of a doped file: the space charge is solved for the file's own stack, leads and electrons; drop {option}, or add --no-space-charge for the rigid bands.");
                }
                return structure.Stack!;
            }
            if (periods is { } p)
            {
                Common.CheckCount(p, "--periods", 100_000);
            }
            var potential = result.GetValue(LeadPotential);
            var mass = result.GetValue(LeadMass);
            if (potential is { } v && !double.IsFinite(v))
            {
                throw new UsageException("--lead-potential must be a finite energy in eV.");
            }
            if (mass is { } m && !(double.IsFinite(m) && m > 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--lead-mass must be a positive mass in m0; got {m:R}."));
            }
            var n = periods ?? structure.Stack?.Parts[0].Repetitions ?? 1;
            var wanted = carrier switch { "heavy-hole" => Materials.Carrier.HeavyHole, "light-hole" => Materials.Carrier.LightHole, _ => Materials.Carrier.Electron };
            if (structure.Materials is { } built && built.Carrier != wanted)
            {
                // Another band of the same recipe: leads of the first layer's material.
                RefuseStackParts(structure, periods, $"--carrier {carrier}");
                var other = built.Recipe.WithNonParabolicity(false).WithCarrier(wanted).WithPeriods(n).Build();
                var material = other.Layers[0].Material;
                if (potential is not null || mass is not null)
                {
                    throw new UsageException($"--lead-potential and --lead-mass apply to the file's own carrier only; with --carrier {carrier} the leads are the first layer's material ({material.Name}).");
                }
                // A lead takes only the layer's band edge and band-edge mass; the width is any positive value.
                var edge = other.LayerOf(material, Length.FromNanometres(1));
                var lead = Lead.Create(edge.Potential, edge.Mass);
                return LayerStack.Periodic(lead, other.Cell, other.Recipe.Periods, lead);
            }
            if (structure.Materials is null && wanted != Materials.Carrier.Electron)
            {
                throw new UsageException($"--carrier {carrier} needs a structure built from materials (the file gives potentials directly).");
            }
            if (periods is null && structure.Stack is not null && structure.SelfConsistent is null)
            {
                // The file's stack as written (its parts: extra layers, defects, several cells), as levels and resonances take it.
                return Physics.StackOptions.Choose(structure, null, potential, mass).Stack;
            }
            return TransmissionCommand.BuildStack(structure, n, potential, mass);
        }

        /// <summary>
        /// Where the leads of <see cref="Build"/> came from when nothing chose them (no stack in the file, no lead options, the
        /// file's own carrier): a hint for a stack that binds nothing because its leads are the cell's first layer; else null.
        /// </summary>
        public string? DefaultLeadsHint(ParseResult result, StructureDefinition structure, LayerStack stack)
        {
            if (structure.Stack is not null || structure.SelfConsistentStack is not null || result.GetValue(LeadPotential) is not null
                || result.GetValue(LeadMass) is not null || result.GetValue(Carrier) != "electron" || !structure.Cell.Elements.OfType<Structures.Layer>().Any())
            {
                return null;
            }
            return string.Create(CultureInfo.InvariantCulture,
                $"The file has no \"stack\", so both leads are like the cell's first layer (V = {stack.LeftLead.Potential.ElectronVolts:G6} eV); to confine the wells, start the cell with a barrier, give the file a stack with \"leads\" of the barrier's material or potential, or use --lead-potential.");
        }

        /// <summary>
        /// The model's warnings about the levels of <paramref name="spectrum"/> (a level far above a layer's band edge, where the
        /// single-band mass is poor), printed on stderr; none when the spectrum is of another band than the file's materials.
        /// </summary>
        public IReadOnlyList<ModelWarning> CheckLevels(ParseResult result, StructureDefinition structure, IntersubbandSpectrum spectrum)
        {
            var wanted = result.GetValue(Carrier) switch { "heavy-hole" => Materials.Carrier.HeavyHole, "light-hole" => Materials.Carrier.LightHole, _ => Materials.Carrier.Electron };
            return structure.Materials is { } built && built.Carrier == wanted
                ? Common.CheckEnergies(structure, spectrum.Levels.Select(l => l.EnergyElectronVolts).ToArray())
                : [];
        }
    }

    public static Command Create()
    {
        var file = Common.FileArgument();
        var stackOptions = new StackOptions();
        var continuum = new Option<bool>("--continuum") { Description = "Also take quasi-bound final states: the stack's transmission resonances above both lead band edges and, where the edges differ (--bias), the states between them that leak into the lower lead." };
        var margin = Common.NumberOption("--margin", "nm", "20", "Lead margin of the domain a quasi-bound state is normalised on, nm (default 20; its dipoles are checked with twice the margin).");
        var mass = Common.NumberOption("--mass", "m0", "0.067", "Mass m* of the oscillator strengths f = 2m*w|z|^2/hbar, m0 (default: the well's, i.e. the layer with the lowest potential).");
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write the result to this file instead of stdout (atomically)." };
        var command = new Command("transitions", "Optical transitions of a stack: intersubband energies, dipoles |z_if| and oscillator strengths with the f-sum check, or interband e-hh/e-lh energies, overlaps and wavelengths.");
        command.Arguments.Add(file);
        stackOptions.AddTo(command, true);
        command.Options.Add(stackOptions.Bias);
        command.Options.Add(continuum);
        command.Options.Add(margin);
        command.Options.Add(mass);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var m = result.GetValue(mass);
            if (m is { } value && !(value > 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--mass must be a positive mass in m0; got {value:R}."));
            }
            var d = result.GetValue(margin);
            if (d is { } dm && !(dm > 0 && dm <= 10_000))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--margin must lie in (0, 10000] nm; got {dm:R}."));
            }
            var structure = Common.LoadStack(result, result.GetValue(file)!, "transitions", result.GetValue(stackOptions.Bias), usesBias: true);
            string text;
            if (result.GetValue(stackOptions.Carrier) == "interband")
            {
                if (structure.SelfConsistent is not null || structure.SelfConsistentStack is not null)
                {
                    throw new UsageException("--carrier interband cannot be combined with the self-consistent potential of a doped structure (holes are not modelled in it); add --no-space-charge for the rigid bands.");
                }
                if (result.GetValue(stackOptions.Bias) is { } b && b != 0)
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--bias {b:R} eV cannot be applied with --carrier interband: interband spectra are computed flat-band only. Allowed: --bias 0 or no --bias."));
                }
                text = RenderInterband(structure, result.GetValue(stackOptions.Periods), format);
            }
            else
            {
                var stack = stackOptions.Build(result, structure);
                var options = IntersubbandOptions.Create(referenceMassElectronMasses: m, includeQuasiBound: result.GetValue(continuum),
                    domainMarginNanometres: d ?? IntersubbandOptions.DefaultDomainMarginNanometres);
                var spectrum = Compute(stack, ChooseBias(result, stackOptions, structure), options, stackOptions.DefaultLeadsHint(result, structure, stack));
                text = Render(structure, spectrum, format, stackOptions.CheckLevels(result, structure, spectrum));
            }
            Common.Emit(text, result.GetValue(output));
            return 0;
        });
        return command;
    }

    private static string R(double value) => Table.Number(value, "R");

    /// <summary>
    /// Refuses a file whose stack is more than periods of its cell (stack.parts with other layers) for a calculation that builds N
    /// periods of the cell from the recipe (another band, interband), unless --periods asks for that explicitly.
    /// </summary>
    private static void RefuseStackParts(StructureDefinition structure, int? periods, string what)
    {
        if (periods is null && structure.Stack is { } stack && !(stack.Parts.Count == 1 && stack.Parts[0].IsRepeatedCell))
        {
            throw new UsageException($"{what} is computed for periods of the cell between leads of its first layer's material, not for the file's stack as written ({Physics.StackOptions.Describe(stack)}); give --periods N for N periods of the cell, or leave out --carrier for the file's own carrier in its stack.");
        }
    }

    /// <summary>
    /// The bias for an intersubband spectrum: <c>--bias</c>, else the file's <c>stack.bias</c>; only for the file's own carrier (a
    /// hole band's energies run the other way, and the file's bias belongs to its own stack).
    /// </summary>
    internal static (double ElectronVolts, string Source) ChooseBias(ParseResult result, StackOptions stackOptions, StructureDefinition structure)
    {
        var bias = TransmissionCommand.ChooseBias(result.GetValue(stackOptions.Bias), structure);
        var carrier = result.GetValue(stackOptions.Carrier);
        if (bias.ElectronVolts != 0 && carrier != "electron")
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{bias.Source} {bias.ElectronVolts:R} eV cannot be applied with --carrier {carrier}: a bias applies to the file's own carrier only. Allowed: --bias 0 for this carrier."));
        }
        return bias;
    }

    /// <summary>The spectrum under <paramref name="bias"/>; the library's refusal of a bias (an element that cannot take a field, too many elements) becomes a usage error.</summary>
    /// <param name="stack">The stack.</param>
    /// <param name="bias">The bias and where it came from.</param>
    /// <param name="options">The spectrum's options.</param>
    /// <param name="leadsHint">Appended to the refusal of a stack without a bound level (see <see cref="StackOptions.DefaultLeadsHint"/>).</param>
    internal static IntersubbandSpectrum Compute(LayerStack stack, (double ElectronVolts, string Source) bias, IntersubbandOptions? options, string? leadsHint)
    {
        try
        {
            if (bias.ElectronVolts == 0)
            {
                return IntersubbandSpectrum.Compute(stack, options);
            }
            TransmissionCommand.Compile(stack, bias.ElectronVolts, bias.Source); // validates the bias with the transmission's messages
            return IntersubbandSpectrum.ComputeUnderBias(stack, Energy.FromElectronVolts(bias.ElectronVolts), options);
        }
        catch (ArgumentException e) when (leadsHint is not null && e.Message.StartsWith("stack has no bound state", StringComparison.Ordinal))
        {
            throw new UsageException(Common.Describe(e) + " " + leadsHint);
        }
    }

    public static string Render(StructureDefinition structure, IntersubbandSpectrum spectrum, OutputFormat format, IReadOnlyList<ModelWarning> warnings)
    {
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("energy", "eV"), ("dipole", "nm"), ("wavelength", "um"), ("width", "eV"), ("mass", "m0"), ("thickness", "nm"), ("bias", "eV"), ("domain", "nm"));
                w.WriteString("model", IntersubbandLimits);
                w.WriteNumber("referenceMass", spectrum.ReferenceMassElectronMasses);
                w.Number("bias", spectrum.Bias.ElectronVolts);
                w.WriteNumber("normalisationError", spectrum.NormalisationError);
                w.WriteStartObject("stack");
                w.WriteNumber("thickness", spectrum.Stack.Thickness.Nanometres);
                Common.Leads(w, spectrum.Stack);
                w.WriteEndObject();
                w.WriteStartArray("levels");
                foreach (var level in spectrum.Levels)
                {
                    w.WriteStartObject();
                    w.WriteNumber("level", level.Number);
                    w.WriteString("kind", level.IsQuasiBound ? "quasi-bound" : "bound");
                    w.Number("energy", level.EnergyElectronVolts);
                    w.Number("energyError", level.ErrorElectronVolts);
                    w.Number("width", level.WidthElectronVolts);
                    w.Number("meanMass", level.MeanMassElectronMasses);
                    w.WriteBoolean("resolved", level.IsResolved);
                    if (level.IsQuasiBound)
                    {
                        w.Number("domainStart", level.DomainStartNanometres);
                        w.Number("domainEnd", level.DomainEndNanometres);
                    }
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartArray("transitions");
                foreach (var t in spectrum.Transitions)
                {
                    w.WriteStartObject();
                    w.WriteNumber("from", t.From);
                    w.WriteNumber("to", t.To);
                    w.WriteString("kind", Kind(spectrum, t));
                    if (Domain(spectrum, t) is { } domain)
                    {
                        w.Number("domainStart", domain.Start);
                        w.Number("domainEnd", domain.End);
                    }
                    w.Number("energy", t.EnergyElectronVolts);
                    w.Number("wavelength", t.WavelengthMicrometres);
                    w.WriteBoolean("resolved", t.IsResolved);
                    w.WriteString("status", t.Status);
                    if (t.IsResolved)
                    {
                        w.Number("dipole", Math.Abs(t.DipoleNanometres));
                        w.Number("oscillatorStrength", t.OscillatorStrength);
                        if (t.HasMomentumForm)
                        {
                            w.Number("momentumOscillatorStrength", t.MomentumOscillatorStrength);
                        }
                        else
                        {
                            w.WriteNull("momentumOscillatorStrength");
                        }
                    }
                    else
                    {
                        w.WriteNull("dipole");
                        w.WriteNull("oscillatorStrength");
                        w.WriteNull("momentumOscillatorStrength");
                    }
                    w.Number("domainChange", t.DomainChangeFraction);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartArray("sumRule");
                for (var i = 1; i <= spectrum.BoundCount; i++)
                {
                    var check = spectrum.SumRule(i);
                    w.WriteStartObject();
                    w.WriteNumber("from", i);
                    w.Number("bound", check.BoundStrength);
                    w.Number("quasiBound", check.QuasiBoundStrength);
                    w.Number("expected", check.ExpectedStrength);
                    w.Number("continuum", check.MissingStrength);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var csv = format == OutputFormat.Csv;
        var table = new Table("from", "to", csv ? "energy (eV)" : "energy (meV)", "wavelength (um)", "|z| (nm)", "f", "f_p", "kind", "domain start (nm)", "domain end (nm)", "domain change", "status");
        // A number that does not exist (an unresolved transition, no momentum form) is "n/a" in the table and an empty cell in the CSV.
        var missing = csv ? "" : "n/a";
        foreach (var t in spectrum.Transitions)
        {
            var domain = Domain(spectrum, t);
            table.Add(Table.Integer(t.From), Table.Integer(t.To),
                csv ? R(t.EnergyElectronVolts) : Table.Number(t.EnergyElectronVolts * 1000, "F4"),
                csv ? R(t.WavelengthMicrometres) : Table.Number(t.WavelengthMicrometres, "G6"),
                t.IsResolved ? (csv ? R(Math.Abs(t.DipoleNanometres)) : Table.Number(Math.Abs(t.DipoleNanometres), "G8")) : missing,
                t.IsResolved ? (csv ? R(t.OscillatorStrength) : Table.Number(t.OscillatorStrength, "G8")) : missing,
                t.HasMomentumForm ? (csv ? R(t.MomentumOscillatorStrength) : Table.Number(t.MomentumOscillatorStrength, "G8")) : missing,
                Kind(spectrum, t),
                domain is { } a ? (csv ? R(a.Start) : Table.Number(a.Start, "G6")) : "",
                domain is { } b ? (csv ? R(b.End) : Table.Number(b.End, "G6")) : "",
                domain is null ? "" : csv ? R(t.DomainChangeFraction) : Table.Number(t.DomainChangeFraction, "G3"),
                t.IsResolved ? "ok" : t.Status);
        }
        if (csv)
        {
            return table.ToCsv();
        }
        var text = Common.TableTitle(structure) + string.Create(CultureInfo.InvariantCulture,
            $"{spectrum.BoundCount} bound and {Common.Plural(spectrum.Levels.Count - spectrum.BoundCount, "quasi-bound level")}; bias eU = {spectrum.Bias.ElectronVolts:G6} eV; f with m* = {spectrum.ReferenceMassElectronMasses:G6} m0; integrals to {spectrum.NormalisationError:G2}\n");
        if (spectrum.Levels.FirstOrDefault(l => l.IsQuasiBound) is { } q)
        {
            text += string.Create(CultureInfo.InvariantCulture,
                $"quasi-bound levels are normalised on [{q.DomainStartNanometres:G6}, {q.DomainEndNanometres:G6}] nm (the stack plus a margin of each lead); 'domain change' is the change of |z| when the margin is doubled\n");
        }
        text += "levels (eV): " + string.Join(", ", spectrum.Levels.Select(l => string.Create(CultureInfo.InvariantCulture,
            $"{l.Number}: {l.EnergyElectronVolts:G8}{(l.IsQuasiBound ? $" (quasi-bound, {LevelWidth(l.WidthElectronVolts)})" : "")}"))) + "\n\n";
        text += table.ToText();
        var sum = spectrum.SumRule(1);
        text += string.Create(CultureInfo.InvariantCulture,
            $"\nf-sum from level 1: {sum.BoundStrength:G8} (bound) + {sum.QuasiBoundStrength:G8} (quasi-bound) of {sum.ExpectedStrength:G8}; the rest, {sum.MissingStrength:G4}, lies in the continuum.\n");
        return text + IntersubbandLimits + "\n";
    }

    /// <summary>
    /// A quasi-bound level's width for the table: the FWHM of its transmission peak, or, where T stays above half its peak on a
    /// side (a broad continuum peak), no width at all (null in JSON, as for <c>resonances</c>).
    /// </summary>
    private static string LevelWidth(double widthElectronVolts) => double.IsFinite(widthElectronVolts)
        ? string.Create(CultureInfo.InvariantCulture, $"width {widthElectronVolts:G3}")
        : "no width: T stays above half its peak on a side";

    /// <summary>"bound-bound", "bound-quasi-bound" or "quasi-bound-quasi-bound".</summary>
    private static string Kind(IntersubbandSpectrum spectrum, IntersubbandTransition t) =>
        (spectrum.Levels[t.From - 1].IsQuasiBound, spectrum.Levels[t.To - 1].IsQuasiBound) switch
        {
            (false, false) => "bound-bound",
            (false, true) => "bound-quasi-bound",
            _ => "quasi-bound-quasi-bound",
        };

    /// <summary>The finite domain a transition's dipole is taken on (null: the whole line, between bound states).</summary>
    private static (double Start, double End)? Domain(IntersubbandSpectrum spectrum, IntersubbandTransition t)
    {
        var upper = spectrum.Levels[t.To - 1];
        return upper.IsQuasiBound ? (upper.DomainStartNanometres, upper.DomainEndNanometres) : null;
    }

    public static string RenderInterband(StructureDefinition structure, int? periods, OutputFormat format)
    {
        if (structure.Materials is not { } built)
        {
            throw new UsageException("--carrier interband needs a structure built from materials (the file gives potentials directly).");
        }
        RefuseStackParts(structure, periods, "--carrier interband");
        var recipe = built.Recipe;
        if (periods is { } p)
        {
            recipe = recipe.WithPeriods(Common.CheckCount(p, "--periods", 100_000));
        }
        var lead = recipe.Layers[0].Material;
        var spectrum = InterbandSpectrum.Compute(recipe, lead, lead);
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("energy", "eV"), ("wavelength", "nm"), ("wavelengthMicrometres", "um"), ("temperature", "K"));
                w.WriteString("model", InterbandLimits);
                w.WriteNumber("excitonError", InterbandSpectrum.ExcitonErrorElectronVolts);
                w.WriteString("leadMaterial", lead.Name);
                if (spectrum.Edge is { } edge)
                {
                    w.WriteStartObject("edge");
                    Write(w, edge);
                    w.WriteEndObject();
                }
                w.WriteStartArray("transitions");
                foreach (var t in spectrum.Transitions)
                {
                    w.WriteStartObject();
                    Write(w, t);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var csv = format == OutputFormat.Csv;
        var table = new Table("transition", "energy (eV)", "wavelength (nm)", "wavelength (um)", "|<e|h>|^2");
        foreach (var t in spectrum.Transitions)
        {
            table.Add(t.Label, csv ? R(t.EnergyElectronVolts) : Table.Number(t.EnergyElectronVolts, "F5"),
                csv ? R(t.WavelengthNanometres) : Table.Number(t.WavelengthNanometres, "F2"),
                csv ? R(t.WavelengthMicrometres) : Table.Number(t.WavelengthMicrometres, "F5"),
                csv ? R(t.OverlapSquared) : Table.Number(t.OverlapSquared, "G6"));
        }
        if (csv)
        {
            return table.ToCsv();
        }
        var text = Common.TableTitle(structure) + string.Create(CultureInfo.InvariantCulture, $"interband at {recipe.Temperature.Kelvin:G6} K, leads of {lead.Name}\n");
        if (spectrum.Edge is { } e)
        {
            text += string.Create(CultureInfo.InvariantCulture,
                $"absorption edge and emission: {e.Label} at {e.EnergyElectronVolts:F5} eV = {e.WavelengthNanometres:F2} nm ({e.WavelengthMicrometres:F5} um)\n");
        }
        return text + "\n" + table.ToText() + "\n" + InterbandLimits + "\n";
    }

    private static void Write(Utf8JsonWriter w, InterbandTransition t)
    {
        w.WriteString("transition", t.Label);
        w.WriteNumber("electron", t.ElectronLevel);
        w.WriteString("hole", t.Hole == Carrier.HeavyHole ? "heavy" : "light");
        w.WriteNumber("holeLevel", t.HoleLevel);
        w.Number("energy", t.EnergyElectronVolts);
        w.Number("wavelength", t.WavelengthNanometres);
        w.Number("wavelengthMicrometres", t.WavelengthMicrometres);
        w.Number("overlapSquared", t.OverlapSquared);
    }
}
