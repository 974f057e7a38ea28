// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using System.Text.Json.Nodes;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;
using Periodic.Cli.Output;
using Periodic.Cli.Sweeps;
using Periodic.Design;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>design FILE</c>: adjusts chosen layer fields within bounds until band quantities, stack levels, resonances or
/// transition energies reach their targets (MathNet's bounded Levenberg–Marquardt least squares with the exact Jacobian
/// from <see cref="EdgeSensitivities"/> and <see cref="StackSensitivities"/>),
/// then tabulates how far one monolayer more or less of each layer moves every target.
/// </summary>
internal static class DesignCommand
{
    public static Command Create()
    {
        var file = new Argument<string>("file") { Description = "Design file (JSON): structure, adjust, targets, monolayer (docs/design.md)." };
        var json = Common.JsonOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write to this file (atomically) instead of stdout." };
        var command = new Command("design", "Adjust layer widths, potentials or masses within bounds to reach target band edges, widths, gaps, stack levels, resonances or transition energies (or wavelengths); report the residuals and a one-monolayer tolerance table. A target not reached is a result, not an error: the closest design within the bounds is reported with exit status 0, and a script detects it by \"converged\": false (or a target's \"withinTolerance\": false) in --json.");
        command.Arguments.Add(file);
        command.Options.Add(json);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var spec = DesignSpec.Load(result.GetValue(file)!);
            var parsed = Periodic.Serialization.StructureFile.Parse(System.Text.Encoding.UTF8.GetBytes(spec.Structure.ToJsonString()), "structure");
            if ((parsed.Doping is not null || parsed.StackDoping is not null) && !result.GetValue(Common.NoSpaceCharge))
            {
                throw new UsageException("design: the structure is doped, but design adjusts rigid bands: its exact derivatives hold the potential fixed, and the self-consistent potential moves with every width; add --no-space-charge to design on the rigid bands (then check the result with the commands, which solve the space charge), or scan the doped design with 'periodic sweep'.");
            }
            var report = Run(spec);
            Common.Emit(result.GetValue(json) ? RenderJson(spec, report) : RenderTable(spec, report), result.GetValue(output));
            return 0;
        });
        return command;
    }

    /// <summary>
    /// A fitted design: start, reached fields and target values, how the optimiser ended, and per tolerance field the
    /// shifts one monolayer thicker and thinner (<c>MinusOne</c> is null for a layer not thicker than one monolayer, which
    /// one monolayer less would leave without width) with their first-order estimates and the layer's reached width.
    /// </summary>
    internal sealed record Report(double[] Start, double[] Reached, double[] Values, int Iterations, string Exit, bool Converged,
        double[][] PlusOne, double[]?[] MinusOne, double[][] Linear, string[] ToleranceFields, double[] ToleranceSteps, double[] ToleranceWidths);

    /// <summary>
    /// How far (eV) from its target a design that does not have a target quantity (fewer levels or resonances) is put:
    /// far beyond any real residual, so its sum of squares exceeds that of every design that has all targets and the
    /// Levenberg–Marquardt step that led there is rejected (its damping raised, a shorter step tried), while staying finite
    /// (MathNet stops at a NaN).
    /// </summary>
    private const double MissingPenaltyElectronVolts = 1e6;

    private static Report Run(DesignSpec spec)
    {
        var model = new DesignModel(spec.Structure, spec.Fields, spec.Layers, spec.Targets);
        var count = spec.Targets.Count;
        var startValues = model.Evaluate(spec.Start).Values;
        for (var i = 0; i < count; i++)
        {
            if (double.IsNaN(startValues[i]))
            {
                var at = string.Join(", ", spec.Fields.Select((f, j) => string.Create(CultureInfo.InvariantCulture, $"{f} = {spec.Start[j]:R} {FieldUnits.Of(f)}")));
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"{Printable.Quote(spec.Source)}: targets[{i}] {spec.Targets[i].Name}: the start design ({at}) has {spec.Targets[i].Missing}, so the optimiser has nothing to move; start from a design that has it (set the structure's value, within the bounds, to one where the target exists)."));
            }
        }
        var cache = (Point: (double[]?)null, Values: Array.Empty<double>(), Jacobian: new double[0, 0]);
        (double[] Values, double[,] Jacobian) At(Vector<double> p)
        {
            var point = p.ToArray();
            if (cache.Point is null || !cache.Point.AsSpan().SequenceEqual(point))
            {
                var (values, jacobian) = model.Evaluate(point);
                for (var i = 0; i < values.Length; i++)
                {
                    if (double.IsNaN(values[i]))
                    {
                        values[i] = spec.Targets[i].TargetElectronVolts + MissingPenaltyElectronVolts;
                    }
                }
                cache = (point, values, jacobian);
            }
            return (cache.Values, cache.Jacobian);
        }
        var objective = ObjectiveFunction.NonlinearModel(
            (p, _) => Vector<double>.Build.DenseOfArray(At(p).Values),
            (p, _) => Matrix<double>.Build.DenseOfArray(At(p).Jacobian),
            Vector<double>.Build.Dense(count, i => i),
            Vector<double>.Build.DenseOfArray(spec.Targets.Select(t => t.TargetElectronVolts).ToArray()));
        // Tolerances: MathNet compares the sum of squared residuals (eV²) with functionTolerance, so 1e-26 means
        // residuals of ~1e-13 eV, a hundred times the ~1e-15 eV edge accuracy: the optimiser stops at the true
        // minimum (or a bound), never on rounding noise, and a design is placed far more exactly than its
        // parameters are known.
        var minimizer = new LevenbergMarquardtMinimizer(initialMu: 1e-3, gradientTolerance: 1e-18, stepTolerance: 1e-14, functionTolerance: 1e-26, maximumIterations: DesignSpec.MaximumIterations);
        var lower = Vector<double>.Build.DenseOfArray(spec.Lower);
        var upper = Vector<double>.Build.DenseOfArray(spec.Upper);
        var scales = Vector<double>.Build.DenseOfArray(spec.Upper.Zip(spec.Lower, (u, l) => u - l).ToArray());
        var fit = minimizer.FindMinimum(objective, Vector<double>.Build.DenseOfArray(spec.Start), lower, upper, scales);
        var reached = fit.MinimizingPoint.ToArray();
        var values = model.Values(reached);
        var worst = values.Zip(spec.Targets, (v, t) => Math.Abs(v - t.TargetElectronVolts)).Max();
        var converged = worst <= spec.ResidualToleranceElectronVolts;

        // Tolerance table: every width of the cell one monolayer thicker and thinner, solved again (not linearised),
        // beside the first-order estimate from the exact sensitivities.
        // A layer thinner than one monolayer has no "one monolayer thinner" (its width would not be positive): that side is null.
        var plus = new double[spec.ToleranceFields.Count][];
        var minus = new double[]?[spec.ToleranceFields.Count];
        var linear = new double[spec.ToleranceFields.Count][];
        var steps = new double[spec.ToleranceFields.Count];
        var widths = new double[spec.ToleranceFields.Count];
        for (var f = 0; f < spec.ToleranceFields.Count; f++)
        {
            var (field, element, step) = spec.ToleranceFields[f];
            steps[f] = step;
            var adjusted = spec.Fields.ToList().IndexOf(field);
            var basis = adjusted >= 0 ? reached[adjusted] : spec.BaseValue(field);
            widths[f] = basis;
            plus[f] = Diff(model.Values(reached, d => FieldPath.Set(d, field, basis + step)), values);
            minus[f] = basis - step > 0 ? Diff(model.Values(reached, d => FieldPath.Set(d, field, basis - step)), values) : null;
            linear[f] = model.Derivatives(reached, element, LayerQuantity.Width).Select(d => (d ?? double.NaN) * step).ToArray();
        }
        return new Report(spec.Start, reached, values, fit.Iterations, fit.ReasonForExit.ToString(), converged, plus, minus, linear,
            spec.ToleranceFields.Select(t => t.Field).ToArray(), steps, widths);
    }

    /// <summary>The photon wavelength hc/E of a transition energy, µm.</summary>
    private static double Wavelength(double energyElectronVolts) => Periodic.Units.PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / energyElectronVolts / 1000;

    private static double[] Diff(double[] a, double[] b) => a.Zip(b, (x, y) => x - y).ToArray();

    /// <summary>A number rounded to <paramref name="decimals"/> and printed with them all; a value that rounds to zero prints unsigned.</summary>
    internal static string Fixed(double value, int decimals) =>
        double.IsNaN(value) ? "n/a" : (Math.Round(value, decimals) + 0.0).ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);

    /// <summary>Decimals of an adjusted field's value by its unit: 0.1 pm for widths, 1 µeV for potentials, 1e-5 m0 for masses.</summary>
    private static int FieldDecimals(string unit) => unit switch { "nm" => 4, "eV" => 6, _ => 5 };

    /// <summary>A target's display unit: its wavelength unit (µm or nm) where it was given as a wavelength, else meV.</summary>
    private static string DisplayUnit(DesignQuantity target) => target.WavelengthUnit ?? "meV";

    /// <summary>An energy (eV) in the target's display unit.</summary>
    private static double Display(DesignQuantity target, double energyElectronVolts) => target.WavelengthUnit switch
    {
        null => energyElectronVolts * 1e3,
        "nm" => Wavelength(energyElectronVolts) * 1000,
        _ => Wavelength(energyElectronVolts),
    };

    /// <summary>Decimals shown in a display unit: 0.1 µeV, 10 pm in µm, 1 pm in nm.</summary>
    private static int DisplayDecimals(string unit) => unit switch { "meV" => 4, "µm" => 5, _ => 3 };

    private static string RenderTable(DesignSpec spec, Report report)
    {
        var text = new System.Text.StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"design: {spec.Source}  ({(report.Converged ? "targets reached" : "TARGETS NOT REACHED")}; {report.Iterations} iterations, optimiser exit: {report.Exit})\n\n");
        var adjusted = new Table("field", "unit", "start", "reached", "lower bound", "upper bound");
        for (var j = 0; j < spec.Fields.Count; j++)
        {
            var unit = FieldUnits.Of(spec.Fields[j]);
            var decimals = FieldDecimals(unit);
            adjusted.Add(spec.Fields[j], unit, Fixed(report.Start[j], decimals), Fixed(report.Reached[j], decimals), Fixed(spec.Lower[j], decimals), Fixed(spec.Upper[j], decimals));
        }
        text.Append(adjusted.ToText()).Append('\n');
        var transitions = spec.Targets.Any(t => t.What == DesignQuantity.Kind.Transition);
        var columns = new List<string> { "target", "unit", "wanted", "reached", "residual", "within tolerance" };
        if (transitions)
        {
            columns.Add("reached photon");
        }
        var targets = new Table([.. columns]);
        for (var i = 0; i < spec.Targets.Count; i++)
        {
            var target = spec.Targets[i];
            var unit = DisplayUnit(target);
            var decimals = DisplayDecimals(unit);
            var wanted = Display(target, target.TargetElectronVolts);
            var reached = Display(target, report.Values[i]);
            var within = Math.Abs(report.Values[i] - target.TargetElectronVolts) <= spec.ResidualToleranceElectronVolts;
            var cells = new List<Cell> { target.Name, unit, Fixed(wanted, decimals), Fixed(reached, decimals), Fixed(reached - wanted, decimals), within ? "yes" : "NO" };
            if (transitions)
            {
                cells.Add(target.What != DesignQuantity.Kind.Transition ? ""
                    : target.WavelengthUnit is null ? Fixed(Wavelength(report.Values[i]), 5) + " µm"
                    : Fixed(report.Values[i] * 1e3, 4) + " meV");
            }
            targets.Add([.. cells]);
        }
        text.Append(targets.ToText());
        if (!report.Converged)
        {
            text.Append(CultureInfo.InvariantCulture, $"Not reached within {spec.ResidualToleranceElectronVolts * 1e6:G6} µeV: the design shown is the closest the optimiser found within the bounds (exit status 0; with --json, \"converged\" is false).\n");
        }
        text.Append('\n');
        if (report.ToleranceFields.Length > 0)
        {
            text.Append("growth tolerance: each layer one step thicker (+) and thinner (−), solved again; shifts in each target's unit (meV, or nm for a wavelength), first-order estimate in brackets\n");
            var headers = new List<string> { "layer", "step (nm)" };
            headers.AddRange(spec.Targets.SelectMany(t => new[] { $"{t.Name} + ({ShiftUnit(t)})", $"{t.Name} − ({ShiftUnit(t)})" }));
            var table = new Table([.. headers]);
            var thin = new List<string>();
            var gone = false;
            for (var f = 0; f < report.ToleranceFields.Length; f++)
            {
                var cells = new List<Cell> { report.ToleranceFields[f], Fixed(report.ToleranceSteps[f], 4) };
                for (var i = 0; i < spec.Targets.Count; i++)
                {
                    cells.Add(ShiftCell(spec.Targets[i], report.Values[i], report.PlusOne[f][i], report.Linear[f][i], ref gone));
                    cells.Add(report.MinusOne[f] is { } minus ? ShiftCell(spec.Targets[i], report.Values[i], minus[i], -report.Linear[f][i], ref gone) : "n/a¹");
                }
                if (report.MinusOne[f] is null)
                {
                    thin.Add(string.Create(CultureInfo.InvariantCulture, $"{report.ToleranceFields[f]} ({Fixed(report.ToleranceWidths[f], 4)} nm)"));
                }
                table.Add([.. cells]);
            }
            text.Append(table.ToText());
            if (thin.Count > 0)
            {
                text.Append(CultureInfo.InvariantCulture, $"¹ not applicable: {string.Join(", ", thin)} {(thin.Count == 1 ? "is" : "are")} not thicker than one monolayer ({Fixed(report.ToleranceSteps[0], 4)} nm), so one monolayer less leaves no layer.\n");
            }
            if (gone)
            {
                text.Append("² gone: the design one monolayer away does not have this level or resonance.\n");
            }
            text.Append("\nModel: single-band envelope functions of an undoped structure; the material parameters are uncertain by more than these shifts. Confirm a design by measurement.\n");
        }
        else
        {
            text.Append("Model: single-band envelope functions of an undoped structure; the material parameters are uncertain by more than most growth tolerances (give \"monolayer\", the growth step in nm, in the design file for a one-monolayer tolerance table). Confirm a design by measurement.\n");
        }
        return text.ToString();
    }

    /// <summary>The unit of a target's tolerance shifts: nm for a wavelength target, meV otherwise.</summary>
    private static string ShiftUnit(DesignQuantity target) => target.WavelengthUnit is null ? "meV" : "nm";

    /// <summary>One tolerance cell, "shift [first order]" in the target's shift unit; "gone²" where the neighbouring design lacks the target.</summary>
    private static string ShiftCell(DesignQuantity target, double reachedElectronVolts, double shiftElectronVolts, double linearElectronVolts, ref bool gone)
    {
        if (double.IsNaN(shiftElectronVolts))
        {
            gone = true;
            return "gone²";
        }
        var (shift, linear) = target.WavelengthUnit is null
            ? (shiftElectronVolts * 1e3, linearElectronVolts * 1e3)
            : ((Wavelength(reachedElectronVolts + shiftElectronVolts) - Wavelength(reachedElectronVolts)) * 1000, -Wavelength(reachedElectronVolts) * 1000 / reachedElectronVolts * linearElectronVolts);
        return $"{Fixed(shift, 3)} [{Fixed(linear, 3)}]";
    }

    private static string RenderJson(DesignSpec spec, Report report) => Common.Json(w =>
    {
        w.WriteString("source", spec.Source);
        w.WriteBoolean("converged", report.Converged);
        w.WriteNumber("iterations", report.Iterations);
        w.WriteString("optimiserExit", report.Exit);
        w.WriteStartArray("adjusted");
        for (var j = 0; j < spec.Fields.Count; j++)
        {
            w.WriteStartObject();
            w.WriteString("field", spec.Fields[j]);
            w.WriteString("unit", FieldUnits.Of(spec.Fields[j]));
            w.WriteNumber("start", report.Start[j]);
            w.WriteNumber("reached", report.Reached[j]);
            w.WriteNumber("lower", spec.Lower[j]);
            w.WriteNumber("upper", spec.Upper[j]);
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteStartArray("targets");
        for (var i = 0; i < spec.Targets.Count; i++)
        {
            w.WriteStartObject();
            w.WriteString("quantity", spec.Targets[i].Name);
            w.WriteNumber("wanted", spec.Targets[i].TargetElectronVolts);
            w.WriteNumber("reached", report.Values[i]);
            w.WriteNumber("residual", report.Values[i] - spec.Targets[i].TargetElectronVolts);
            w.WriteBoolean("withinTolerance", Math.Abs(report.Values[i] - spec.Targets[i].TargetElectronVolts) <= spec.ResidualToleranceElectronVolts);
            if (spec.Targets[i].What == DesignQuantity.Kind.Transition && report.Values[i] > 0)
            {
                w.WriteNumber("reachedWavelength", Wavelength(report.Values[i]));
            }
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteStartArray("tolerances");
        for (var f = 0; f < report.ToleranceFields.Length; f++)
        {
            w.WriteStartObject();
            w.WriteString("field", report.ToleranceFields[f]);
            w.WriteNumber("step", report.ToleranceSteps[f]);
            w.WriteStartArray("shifts");
            for (var i = 0; i < spec.Targets.Count; i++)
            {
                w.WriteStartObject();
                w.WriteString("quantity", spec.Targets[i].Name);
                w.Number("plus", report.PlusOne[f][i]);
                w.Number("minus", report.MinusOne[f] is { } minus ? minus[i] : double.NaN);
                w.Number("firstOrder", report.Linear[f][i]);
                if (spec.Targets[i].WavelengthUnit is not null)
                {
                    var reached = report.Values[i];
                    w.Number("plusWavelength", Wavelength(reached + report.PlusOne[f][i]) - Wavelength(reached));
                    w.Number("minusWavelength", report.MinusOne[f] is { } m ? Wavelength(reached + m[i]) - Wavelength(reached) : double.NaN);
                    w.Number("firstOrderWavelength", -Wavelength(reached) / reached * report.Linear[f][i]);
                }
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteEndObject();
        }
        w.WriteEndArray();
        Common.Units(w, ("energy", "eV"), ("step", "nm"), ("wavelength", "um"));
    });
}

/// <summary>A design file: the structure, the layer fields to adjust with bounds, the targets and the monolayer step.</summary>
internal sealed class DesignSpec
{
    public const int MaximumIterations = 200;

    public required string Source { get; init; }
    public required JsonObject Structure { get; init; }
    public required IReadOnlyList<string> Fields { get; init; }
    public required IReadOnlyList<(int Element, LayerQuantity Quantity)> Layers { get; init; }
    public required double[] Start { get; init; }
    public required double[] Lower { get; init; }
    public required double[] Upper { get; init; }
    public required IReadOnlyList<DesignQuantity> Targets { get; init; }
    public required IReadOnlyList<(string Field, int Element, double Step)> ToleranceFields { get; init; }
    public required double ResidualToleranceElectronVolts { get; init; }

    public double BaseValue(string field) => FieldValue(Structure, field);

    public static DesignSpec Load(string path)
    {
        var (root, _) = SweepSpec.ReadRoot(path, "design file", "\"structure\", \"adjust\" and \"targets\"");
        foreach (var (name, _) in root)
        {
            if (name is not ("$schema" or "description" or "structure" or "adjust" or "targets" or "monolayer" or "residualTolerance"))
            {
                throw SweepSpec.Bad(path, name, "is not a design field; allowed: structure, adjust, targets, monolayer, residualTolerance, description.");
            }
        }
        var (structure, structureSource, _) = SweepSpec.ReadStructure(path, root["structure"]);
        try
        {
            Periodic.Serialization.StructureFile.Parse(System.Text.Encoding.UTF8.GetBytes(structure.ToJsonString()), "structure");
        }
        catch (Periodic.Serialization.StructureFileException e)
        {
            // The structure is read as a JSON object and parsed again, so a line and column would point into that
            // copy: name the field path instead (inside the design file, or inside the structure file it names).
            var where = structureSource == "inline" ? "structure" : $"structure ({Printable.Quote(structureSource)})";
            throw SweepSpec.Bad(path, e.Field.Length == 0 ? where : $"{where} {e.Field}:", e.Problem);
        }
        var allowed = FieldPath.NumericFields(structure);
        if (root["adjust"] is not JsonArray adjust || adjust.Count == 0)
        {
            throw SweepSpec.Bad(path, "adjust", "must be a non-empty array of {\"field\": \"cell[I].width\", \"from\": a, \"to\": b}.");
        }
        var fields = new List<string>();
        var layers = new List<(int, LayerQuantity)>();
        var start = new List<double>();
        var lower = new List<double>();
        var upper = new List<double>();
        for (var j = 0; j < adjust.Count; j++)
        {
            var where = string.Create(CultureInfo.InvariantCulture, $"adjust[{j}]");
            var item = adjust[j] as JsonObject ?? throw SweepSpec.Bad(path, where, "must be an object with field, from and to.");
            var field = item["field"] is JsonValue f && f.TryGetValue<string>(out var text) ? text : throw SweepSpec.Bad(path, $"{where}.field", "is required.");
            if (!allowed.Contains(field) || SweepSpec.LayerField(field) is not { } layer || !SweepSpec.IsUniformLayer(structure, field))
            {
                throw SweepSpec.Bad(path, $"{where}.field", $"{Printable.Quote(field)} is not the width, potential or mass of a uniform layer of the structure; adjustable: {string.Join(", ", allowed.Where(a => SweepSpec.LayerField(a) is not null && SweepSpec.IsUniformLayer(structure, a)))}.");
            }
            if (fields.Contains(field))
            {
                throw SweepSpec.Bad(path, $"{where}.field", $"{Printable.Quote(field)} is adjusted twice.");
            }
            var from = SweepSpec.Number(path, $"{where}.from", item["from"]);
            var to = SweepSpec.Number(path, $"{where}.to", item["to"]);
            var value = FieldValue(structure, field);
            if (!(to > from) || value < from || value > to)
            {
                throw SweepSpec.Bad(path, where, string.Create(CultureInfo.InvariantCulture,
                    $"needs from < to with the structure's value in between (the optimiser starts there); got from {from:R}, to {to:R}, value {value:R}."));
            }
            fields.Add(field);
            layers.Add(layer);
            start.Add(value);
            lower.Add(from);
            upper.Add(to);
        }
        if (root["targets"] is not JsonArray targetArray || targetArray.Count == 0)
        {
            throw SweepSpec.Bad(path, "targets", "must be a non-empty array of {\"quantity\": \"band1.bottom\", \"value\": 0.05} (eV).");
        }
        var targets = new List<DesignQuantity>();
        for (var i = 0; i < targetArray.Count; i++)
        {
            var where = string.Create(CultureInfo.InvariantCulture, $"targets[{i}]");
            var item = targetArray[i] as JsonObject ?? throw SweepSpec.Bad(path, where, "must be an object with quantity and value.");
            var name = item["quantity"] is JsonValue q && q.TryGetValue<string>(out var n) ? n : throw SweepSpec.Bad(path, $"{where}.quantity", "is required.");
            var target = TargetEnergy(path, $"{where}.value", item["value"], name.StartsWith("transition", StringComparison.Ordinal));
            var quantity = DesignQuantity.TryParse(name, target)
                ?? throw SweepSpec.Bad(path, $"{where}.quantity", $"{Printable.Quote(name)} is not a target; allowed: {DesignQuantity.Allowed}.");
            var wavelengthUnit = item["value"] is JsonValue given && given.TryGetValue<string>(out var written)
                ? written.TrimEnd() switch { var t when t.EndsWith("nm", StringComparison.Ordinal) => "nm", var t when t.EndsWith("um", StringComparison.Ordinal) || t.EndsWith("µm", StringComparison.Ordinal) => "µm", _ => null }
                : null;
            targets.Add(quantity with { WavelengthUnit = wavelengthUnit });
        }
        var monolayer = root["monolayer"] is { } m ? SweepSpec.Number(path, "monolayer", m) : (double?)null;
        if (monolayer is { } step && !(step > 0 && step < 10))
        {
            throw SweepSpec.Bad(path, "monolayer", string.Create(CultureInfo.InvariantCulture, $"must be a thickness in nm between 0 and 10; got {step:R}."));
        }
        var tolerances = new List<(string, int, double)>();
        if (monolayer is { } ml)
        {
            foreach (var field in allowed.Where(a => a.EndsWith(".width", StringComparison.Ordinal) && SweepSpec.LayerField(a) is not null && SweepSpec.IsUniformLayer(structure, a)))
            {
                tolerances.Add((field, SweepSpec.LayerField(field)!.Value.Element, ml));
            }
        }
        var residual = root["residualTolerance"] is { } r ? SweepSpec.Number(path, "residualTolerance", r) : 1e-6;
        if (!(residual > 0))
        {
            throw SweepSpec.Bad(path, "residualTolerance", "must be a positive energy in eV.");
        }
        return new DesignSpec
        {
            Source = path, Structure = structure, Fields = fields, Layers = layers, Start = [.. start], Lower = [.. lower], Upper = [.. upper],
            Targets = targets, ToleranceFields = tolerances, ResidualToleranceElectronVolts = residual,
        };
    }

    /// <summary>
    /// A target value: a number in eV, or a string with a unit — "120 meV", "0.12 eV", and for a transition a photon
    /// wavelength "8.5 um" (also µm or nm), converted by E = hc/λ.
    /// </summary>
    internal static double TargetEnergy(string path, string field, JsonNode? node, bool wavelengthAllowed)
    {
        if (node is JsonValue v && v.TryGetValue<string>(out var text))
        {
            var match = System.Text.RegularExpressions.Regex.Match(text, @"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(eV|meV|um|µm|nm)\s*$", System.Text.RegularExpressions.RegexOptions.CultureInvariant);
            var units = wavelengthAllowed ? "eV, meV, or a wavelength in um, µm or nm" : "eV or meV";
            if (!match.Success)
            {
                throw SweepSpec.Bad(path, field, $"must be a number in eV or a value with a unit ({units}); got {Printable.Quote(text)}.");
            }
            var number = double.Parse(match.Groups[1].Value, NumberStyles.Float, CultureInfo.InvariantCulture);
            var unit = match.Groups[2].Value;
            if (unit is "um" or "µm" or "nm")
            {
                var nanometres = unit == "nm" ? number : number * 1000;
                if (!wavelengthAllowed || !(nanometres > 0 && double.IsFinite(nanometres)))
                {
                    throw SweepSpec.Bad(path, field, wavelengthAllowed
                        ? $"must be a positive wavelength; got {Printable.Quote(text)}."
                        : $"is a wavelength ({Printable.Quote(text)}); only a transition target takes one; give an energy in eV or meV.");
                }
                return Periodic.Units.PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / nanometres;
            }
            var energy = unit == "meV" ? number * 1e-3 : number;
            return double.IsFinite(energy) ? energy : throw SweepSpec.Bad(path, field, $"must be a finite energy; got {Printable.Quote(text)}.");
        }
        return SweepSpec.Number(path, field, node);
    }

    private static double FieldValue(JsonObject structure, string field)
    {
        var parsed = Periodic.Serialization.StructureFile.Parse(System.Text.Encoding.UTF8.GetBytes(structure.ToJsonString()), "structure");
        var (element, quantity) = SweepSpec.LayerField(field)!.Value;
        var layer = (Periodic.Structures.Layer)parsed.Cell.Elements[element];
        return quantity switch
        {
            LayerQuantity.Width => layer.Width.Nanometres,
            LayerQuantity.Potential => layer.Potential.ElectronVolts,
            _ => layer.Mass.ElectronMasses,
        };
    }
}
