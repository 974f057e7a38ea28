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
        var command = new Command("design", "Adjust layer widths, potentials or masses within bounds to reach target band edges, widths, gaps, stack levels, resonances or transition energies (or wavelengths); report the residuals and a one-monolayer tolerance table.");
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

    internal sealed record Report(double[] Start, double[] Reached, double[] Values, int Iterations, string Exit, bool Converged,
        double[][] PlusOne, double[][] MinusOne, double[][] Linear, string[] ToleranceFields, double[] ToleranceSteps);

    private static Report Run(DesignSpec spec)
    {
        var model = new DesignModel(spec.Structure, spec.Fields, spec.Layers, spec.Targets);
        var count = spec.Targets.Count;
        var cache = (Point: (double[]?)null, Values: Array.Empty<double>(), Jacobian: new double[0, 0]);
        (double[] Values, double[,] Jacobian) At(Vector<double> p)
        {
            var point = p.ToArray();
            if (cache.Point is null || !cache.Point.AsSpan().SequenceEqual(point))
            {
                var (values, jacobian) = model.Evaluate(point);
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
        var plus = new double[spec.ToleranceFields.Count][];
        var minus = new double[spec.ToleranceFields.Count][];
        var linear = new double[spec.ToleranceFields.Count][];
        var steps = new double[spec.ToleranceFields.Count];
        for (var f = 0; f < spec.ToleranceFields.Count; f++)
        {
            var (field, element, step) = spec.ToleranceFields[f];
            steps[f] = step;
            var adjusted = spec.Fields.ToList().IndexOf(field);
            var basis = adjusted >= 0 ? reached[adjusted] : spec.BaseValue(field);
            plus[f] = Diff(model.Values(reached, d => FieldPath.Set(d, field, basis + step)), values);
            minus[f] = Diff(model.Values(reached, d => FieldPath.Set(d, field, basis - step)), values);
            linear[f] = model.Derivatives(reached, element, LayerQuantity.Width).Select(d => (d ?? double.NaN) * step).ToArray();
        }
        return new Report(spec.Start, reached, values, fit.Iterations, fit.ReasonForExit.ToString(), converged, plus, minus, linear,
            spec.ToleranceFields.Select(t => t.Field).ToArray(), steps);
    }

    /// <summary>The photon wavelength hc/E of a transition energy, µm.</summary>
    private static double Wavelength(double energyElectronVolts) => Periodic.Units.PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / energyElectronVolts / 1000;

    private static double[] Diff(double[] a, double[] b) => a.Zip(b, (x, y) => x - y).ToArray();

    private static string RenderTable(DesignSpec spec, Report report)
    {
        var text = new System.Text.StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"design: {spec.Source}  ({(report.Converged ? "targets reached" : "TARGETS NOT REACHED")}; {report.Iterations} iterations, optimiser exit: {report.Exit})\n\n");
        var adjusted = new Table(new Column("field"), new Column("unit"), new Column("start", Format: "G8"), new Column("reached", Format: "G10"),
            new Column("lower bound", Format: "G6"), new Column("upper bound", Format: "G6"));
        for (var j = 0; j < spec.Fields.Count; j++)
        {
            adjusted.Add(spec.Fields[j], FieldUnits.Of(spec.Fields[j]), report.Start[j], report.Reached[j], spec.Lower[j], spec.Upper[j]);
        }
        text.Append(adjusted.ToText()).Append('\n');
        var transitions = spec.Targets.Any(t => t.What == DesignQuantity.Kind.Transition);
        var columns = new List<Column> { new("target"), new("wanted", "meV", Format: "F4"), new("reached", "meV", Format: "F4"), new("residual", "µeV", Format: "G4") };
        if (transitions)
        {
            columns.Add(new Column("reached wavelength", "µm", Format: "F5"));
        }
        var targets = new Table([.. columns]);
        for (var i = 0; i < spec.Targets.Count; i++)
        {
            var cells = new List<Cell> { spec.Targets[i].Name, spec.Targets[i].TargetElectronVolts * 1e3, report.Values[i] * 1e3, (report.Values[i] - spec.Targets[i].TargetElectronVolts) * 1e6 };
            if (transitions)
            {
                cells.Add(spec.Targets[i].What == DesignQuantity.Kind.Transition ? Wavelength(report.Values[i]) : "");
            }
            targets.Add([.. cells]);
        }
        text.Append(targets.ToText()).Append('\n');
        if (report.ToleranceFields.Length > 0)
        {
            text.Append("growth tolerance: each layer one step thicker (+) and thinner (−), solved again; shifts in meV (first-order estimate in brackets)\n");
            var headers = new List<Column> { new("layer"), new("step", "nm", Format: "G4") };
            headers.AddRange(spec.Targets.SelectMany(t => new[] { new Column(t.Name + " +"), new Column(t.Name + " −") }));
            var table = new Table([.. headers]);
            for (var f = 0; f < report.ToleranceFields.Length; f++)
            {
                var cells = new List<Cell> { report.ToleranceFields[f], report.ToleranceSteps[f] };
                for (var i = 0; i < spec.Targets.Count; i++)
                {
                    cells.Add(string.Create(CultureInfo.InvariantCulture, $"{report.PlusOne[f][i] * 1e3:F3} [{report.Linear[f][i] * 1e3:F3}]"));
                    cells.Add(string.Create(CultureInfo.InvariantCulture, $"{report.MinusOne[f][i] * 1e3:F3} [{-report.Linear[f][i] * 1e3:F3}]"));
                }
                table.Add([.. cells]);
            }
            text.Append(table.ToText());
        }
        text.Append("\nModel: single-band envelope functions of an undoped structure; the material parameters are uncertain by more than these shifts. Confirm a design by measurement.\n");
        return text.ToString();
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
                w.WriteNumber("plus", report.PlusOne[f][i]);
                w.WriteNumber("minus", report.MinusOne[f][i]);
                w.Number("firstOrder", report.Linear[f][i]);
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
        var (structure, _, _) = SweepSpec.ReadStructure(path, root["structure"]);
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
            targets.Add(DesignQuantity.TryParse(name, target)
                ?? throw SweepSpec.Bad(path, $"{where}.quantity", $"{Printable.Quote(name)} is not a target; allowed: {DesignQuantity.Allowed}."));
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
