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
/// <c>levels FILE</c>: the bound and defect states of the file's stack (energies below both lead band edges), with
/// their error bounds and node counts, and optionally the normalised wavefunctions on a grid.
/// </summary>
internal static class LevelsCommand
{
    public const int MaxGridPoints = 1_000_000;

    public static Command Create()
    {
        var file = Common.FileArgument();
        var stackOptions = new StackOptions();
        var wavefunctions = new Option<bool>("--wavefunctions") { Description = "Also give psi(x) of every level on a grid across the stack (with --csv: the grid table only)." };
        var gridPoints = new Option<int>("--grid-points") { Description = "Points of the wavefunction grid (2 to 1,000,000).", DefaultValueFactory = _ => 401 };
        var margin = Common.NumberOption("--margin", "nm", "5", "Lead length shown on each side of the stack on the wavefunction grid, nm (default: 3 decay lengths of the least-bound level, at most the stack's thickness).");
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("levels", "Bound and defect states of the file's stack: energy, error bound, node count; optionally the wavefunctions.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        stackOptions.AddTo(command);
        foreach (var option in new Option[] { wavefunctions, gridPoints, margin, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            stackOptions.Check(result);
            var points = result.GetValue(gridPoints);
            if (points < 2 || points > MaxGridPoints)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--grid-points must be between 2 and {MaxGridPoints}; got {points}."));
            }
            var m = result.GetValue(margin);
            if (m is { } given && !(given >= 0 && given <= 1e6))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--margin must be between 0 and 1e6 nm; got {given:R}."));
            }
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.LoadStack(result, result.GetValue(file)!, "levels", null, usesBias: false));
            var (stack, source) = stackOptions.Build(result, structure);
            var spectrum = Find(stack);
            var energies = spectrum.Levels.Select(l => l.EnergyElectronVolts).ToArray();
            var warnings = Common.CheckEnergies(structure, energies);
            var grid = result.GetValue(wavefunctions) ? Grid(spectrum, points, m) : null;
            Write(structure, stack, source, spectrum, grid, warnings, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static BoundStateSpectrum Find(LayerStack stack)
    {
        try
        {
            return BoundStateSpectrum.Find(stack);
        }
        catch (ArgumentException e)
        {
            throw new UsageException("the stack's bound states cannot be searched: " + Common.Describe(e));
        }
    }

    /// <summary>Positions x (nm, 0 at the left lead) and ψ_n(x) (nm^−1/2) of every level.</summary>
    public sealed record WavefunctionGrid(double[] Positions, double[][] Values);

    public static WavefunctionGrid Grid(BoundStateSpectrum spectrum, int points, double? margin)
    {
        var length = spectrum.Stack.Thickness.Nanometres;
        var m = margin ?? DefaultMargin(spectrum);
        var x = new double[points];
        for (var i = 0; i < points; i++)
        {
            x[i] = i == points - 1 ? length + m : -m + (length + 2 * m) * i / (points - 1);
        }
        var values = new double[spectrum.Levels.Count][];
        for (var n = 0; n < values.Length; n++)
        {
            values[n] = new double[points];
            spectrum.GetWavefunction(n).Evaluate(x, values[n]);
        }
        return new WavefunctionGrid(x, values);
    }

    /// <summary>Three decay lengths 1/κ of the least-bound level in the slower-decaying lead, at most the stack's thickness (and 1 nm at least).</summary>
    public static double DefaultMargin(BoundStateSpectrum spectrum)
    {
        var length = spectrum.Stack.Thickness.Nanometres;
        if (spectrum.Levels.Count == 0)
        {
            return Math.Max(1, 0.25 * length);
        }
        var top = spectrum.Levels[^1].EnergyElectronVolts;
        var kappa = Math.Min(spectrum.Stack.LeftLead.DecayConstantPerNanometre(top), spectrum.Stack.RightLead.DecayConstantPerNanometre(top));
        var margin = kappa > 0 ? 3 / kappa : length;
        return Math.Max(Math.Min(margin, length), Math.Min(1.0, length));
    }

    private static void Write(StructureDefinition structure, LayerStack stack, string source, BoundStateSpectrum spectrum, WavefunctionGrid? grid,
        IReadOnlyList<Periodic.Materials.ModelWarning> warnings, OutputFormat format, string? outPath)
    {
        var levels = spectrum.Levels;
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("energy", "eV"), ("error", "eV"), ("position", "nm"), ("wavefunction", "nm^-1/2"), ("potential", "eV"), ("mass", "m0"), ("thickness", "nm"));
                Common.StackObject(w, stack, source);
                w.WriteNumber("totalCount", spectrum.TotalCount);
                w.WriteNumber("continuumEdge", spectrum.ContinuumEdgeElectronVolts);
                w.WriteStartArray("levels");
                foreach (var level in levels)
                {
                    w.WriteStartObject();
                    w.WriteNumber("index", level.Index + 1);
                    w.WriteNumber("energy", level.EnergyElectronVolts);
                    w.WriteNumber("error", level.ErrorElectronVolts);
                    w.WriteNumber("nodes", level.NodeCount);
                    w.WriteBoolean("resolved", level.IsResolved);
                    w.WriteNumber("bindingEnergy", spectrum.ContinuumEdgeElectronVolts - level.EnergyElectronVolts);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                if (grid is not null)
                {
                    w.WriteStartObject("wavefunctions");
                    w.WriteStartArray("positions");
                    foreach (var x in grid.Positions)
                    {
                        w.WriteNumberValue(x);
                    }
                    w.WriteEndArray();
                    w.WriteStartArray("values");
                    foreach (var psi in grid.Values)
                    {
                        w.WriteStartArray();
                        foreach (var v in psi)
                        {
                            w.WriteNumberValue(v);
                        }
                        w.WriteEndArray();
                    }
                    w.WriteEndArray();
                    w.WriteEndObject();
                }
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure, levels.Select(l => l.EnergyElectronVolts).Append(spectrum.ContinuumEdgeElectronVolts));
        if (format == OutputFormat.Csv && grid is not null)
        {
            var columns = new List<Column> { new("x", "nm") };
            columns.AddRange(levels.Select(l => new Column(string.Create(CultureInfo.InvariantCulture, $"psi{l.Index + 1}"), "nm^-1/2")));
            var wavefunctionTable = new Table([.. columns]);
            for (var i = 0; i < grid.Positions.Length; i++)
            {
                var row = new Cell[levels.Count + 1];
                row[0] = grid.Positions[i];
                for (var n = 0; n < levels.Count; n++)
                {
                    row[n + 1] = grid.Values[n][i];
                }
                wavefunctionTable.Add(row);
            }
            Common.Emit(wavefunctionTable.WriteCsv, outPath);
            return;
        }
        var table = new Table(new Column("level"), Column.Energy("energy", unit), new Column("error", "eV", Format: "G3"), new Column("nodes"),
            Column.Energy("binding", unit), new Column("resolved"));
        foreach (var level in levels)
        {
            table.Add(level.Index + 1, level.EnergyElectronVolts, level.ErrorElectronVolts, level.NodeCount, spectrum.ContinuumEdgeElectronVolts - level.EnergyElectronVolts, level.IsResolved);
        }
        var title = Common.TableTitle(structure, unit) + string.Create(CultureInfo.InvariantCulture,
            $"Stack: {source}: {StackOptions.Describe(stack)}; {stack.Thickness.Nanometres:G6} nm between leads V = {stack.LeftLead.Potential.ElectronVolts:G6} / {stack.RightLead.Potential.ElectronVolts:G6} eV\n")
            + string.Create(CultureInfo.InvariantCulture, $"{Common.Plural(spectrum.TotalCount, "bound state")} below the continuum edge {spectrum.ContinuumEdgeElectronVolts:G6} eV (oscillation count); binding: edge minus level.\n")
            + (grid is not null ? "Wavefunctions: use --json or --csv for the grid.\n" : "");
        Common.EmitTable(table, format, title, outPath);
    }
}
