// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Properties;
using Periodic.Serialization;

namespace Periodic.Cli.Commands;

/// <summary><c>bands FILE</c>: the band table (edges, widths, edge masses) and the gaps.</summary>
internal static class BandsCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var count = Common.CountOption(4);
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var command = new Command("bands", "List the lowest minibands: edges, widths, band-edge masses, and the gaps between them.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        command.Options.Add(count);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(count));
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.Load(result.GetValue(file)!));
            Common.Emit(Render(structure, n, format), null);
            return 0;
        });
        return command;
    }

    public static string Render(StructureDefinition structure, int count, OutputFormat format)
    {
        var solved = Solver.Compute(structure.Cell, count);
        var bands = solved.Bands;
        var properties = BandProperties.Create(bands);
        var masses = bands.Bands.Select(b => (Bottom: properties.BottomMass(b.Index).ElectronMasses, Top: properties.TopMass(b.Index).ElectronMasses)).ToArray();
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("energy", "eV"), ("width", "eV"), ("mass", "m0"), ("period", "nm"));
                w.WriteStartArray("bands");
                foreach (var band in bands.Bands)
                {
                    w.WriteStartObject();
                    w.WriteNumber("index", band.Index);
                    w.Number("bottom", band.BottomElectronVolts);
                    w.Number("top", band.TopElectronVolts);
                    w.Number("width", band.WidthElectronVolts);
                    w.Number("massAtBottom", masses[band.Index - 1].Bottom);
                    w.Number("massAtTop", masses[band.Index - 1].Top);
                    w.WriteString("bottomAt", band.BottomZonePoint == ZonePoint.Center ? "center" : "boundary");
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartArray("gaps");
                foreach (var gap in bands.Gaps)
                {
                    w.WriteStartObject();
                    w.WriteNumber("index", gap.Index);
                    w.Number("bottom", gap.LowerElectronVolts);
                    w.Number("top", gap.UpperElectronVolts);
                    w.Number("width", gap.WidthElectronVolts);
                    w.WriteBoolean("closed", gap.IsClosed);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteStartObject("accuracy");
                w.Number("maxEdgeError", solved.MaxEdgeErrorElectronVolts);
                w.WriteNumber("countChecks", bands.CountChecks);
                if (solved.Refined)
                {
                    // Smooth segments: edges from step-halving refinement (RefinedBandStructure).
                    w.WriteBoolean("converged", solved.Converged);
                    w.WriteNumber("magnusSteps", solved.MagnusSteps);
                }
                w.WriteEndObject();
            });
        }
        var table = new Table("band", "bottom (eV)", "top (eV)", "width (meV)", "m* bottom (m0)", "m* top (m0)", "gap above (meV)");
        foreach (var band in bands.Bands)
        {
            var (mb, mt) = masses[band.Index - 1];
            table.Add(Table.Integer(band.Index), Table.Number(band.BottomElectronVolts, "F6"), Table.Number(band.TopElectronVolts, "F6"),
                Table.Number(band.WidthElectronVolts * 1e3, "F4"), Table.Number(mb, "G5"), Table.Number(mt, "G5"),
                Table.Number(bands.Gaps[band.Index - 1].WidthElectronVolts * 1e3, "F4"));
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        return Common.TableTitle(structure) + "\n" + table.ToText();
    }
}
