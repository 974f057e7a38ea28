// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;

namespace Periodic.Cli.Commands;

/// <summary><c>dispersion FILE</c>: E(k) of the lowest bands on an even k grid from 0 to π/d.</summary>
internal static class DispersionCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var count = Common.CountOption(3);
        var points = new Option<int>("--points", "-k") { Description = "Number of k points from 0 to pi/d, ends included (2 to 100,000).", DefaultValueFactory = _ => 41 };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write to this file (atomically) instead of stdout." };
        var command = new Command("dispersion", "Tabulate E(k) of the lowest bands over the first Brillouin zone, k from 0 to pi/d.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        command.Options.Add(count);
        command.Options.Add(points);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(count));
            var k = Limits.CheckRange("--points", result.GetValue(points), Limits.MinGridPoints, 100_000);
            Limits.CheckWork("--count × --points", Limits.Product(n, k), Limits.MaxDispersionValues,
                "each value is one E(k) root (about 3 µs of CPU for a two-layer cell)");
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.Load(result.GetValue(file)!));
            Common.Emit(Render(structure, n, k, format), result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static (double[] K, double[][] E) Compute(BandStructure bands, int points)
    {
        var zone = Math.PI / bands.PeriodNanometres;
        var k = new double[points];
        for (var i = 0; i < points; i++)
        {
            k[i] = i == points - 1 ? zone : zone * i / (points - 1);
        }
        var energies = new double[bands.Bands.Count][];
        using var progress = new Progress("dispersion", energies.Length);
        for (var n = 0; n < energies.Length; n++)
        {
            energies[n] = new double[points];
            bands.EnergiesAt(n + 1, k, energies[n]);
            progress.Report(n + 1);
        }
        return (k, energies);
    }

    public static string Render(StructureDefinition structure, int count, int points, OutputFormat format)
    {
        var bands = Solver.Compute(structure.Cell, count).Bands;
        var (k, e) = Compute(bands, points);
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("wavevector", "1/nm"), ("energy", "eV"), ("period", "nm"));
                w.WriteNumber("zoneBoundary", Math.PI / bands.PeriodNanometres);
                w.WriteStartArray("wavevectors");
                foreach (var value in k)
                {
                    w.WriteNumberValue(value);
                }
                w.WriteEndArray();
                w.WriteStartArray("bands");
                for (var n = 0; n < e.Length; n++)
                {
                    w.WriteStartObject();
                    w.WriteNumber("index", n + 1);
                    w.WriteStartArray("energies");
                    foreach (var value in e[n])
                    {
                        w.WriteNumberValue(value);
                    }
                    w.WriteEndArray();
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var headers = new List<string> { "k (1/nm)", "kd/pi" };
        headers.AddRange(Enumerable.Range(1, e.Length).Select(n => string.Create(CultureInfo.InvariantCulture, $"E{n} (eV)")));
        var table = new Table([.. headers]);
        for (var i = 0; i < k.Length; i++)
        {
            var row = new List<string> { Table.Number(k[i], "G8"), Table.Number(k[i] * bands.PeriodNanometres / Math.PI, "F4") };
            row.AddRange(e.Select(band => Table.Number(band[i], "F6")));
            table.Add([.. row]);
        }
        return format == OutputFormat.Csv ? table.ToCsv() : Common.TableTitle(structure) + "\n" + table.ToText();
    }
}
