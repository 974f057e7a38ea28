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
        var output = Common.OutOption();
        var command = new Command("bands", "List the lowest minibands: edges, widths, band-edge masses along the growth axis, the in-plane mass at each band bottom, and the gaps between them.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        var unit = Common.LatticeUnitOption();
        command.Options.Add(inPlane);
        command.Options.Add(count);
        command.Options.Add(unit);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(count));
            var loaded = Common.Load(result, result.GetValue(file)!);
            var latticeUnit = Common.LatticeUnit(result, unit, loaded);
            var structure = Common.AtInPlaneWavevector(result, inPlane, loaded);
            Write(structure, n, format, result.GetValue(output), latticeUnit);
            return 0;
        });
        return command;
    }

    public static void Write(StructureDefinition structure, int count, OutputFormat format, string? outPath, LatticeEnergyUnit latticeUnit = LatticeEnergyUnit.Recoil)
    {
        var solved = Solver.Compute(structure.Cell, count);
        var bands = solved.Structure;
        var warnings = structure.Materials is { } built
            ? Common.ReportWarnings(structure, built.CheckEnergies(bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts }).ToArray()))
            : [];
        var properties = BandProperties.Create(bands);
        var masses = bands.Bands.Select(b => (Bottom: properties.BottomMass(b.Index).ElectronMasses, Top: properties.TopMass(b.Index).ElectronMasses)).ToArray();
        var (inPlane, inPlaneWhy) = InPlaneMasses(bands);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
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
                    if (inPlane is not null)
                    {
                        w.Number("inPlaneMassAtBottom", inPlane[band.Index - 1].ElectronMasses);
                        w.Number("inPlaneMassError", inPlane[band.Index - 1].ErrorEstimateElectronMasses);
                    }
                    else
                    {
                        w.WriteNull("inPlaneMassAtBottom");
                        w.WriteNull("inPlaneMassError");
                    }
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                if (inPlaneWhy is not null)
                {
                    w.WriteString("inPlaneMassUnavailable", inPlaneWhy);
                }
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
                // Which solver the library chose, and every error source it reports.
                w.WriteString("method", solved.Method.ToString().ToLowerInvariant());
                w.WriteBoolean("converged", solved.Converged);
                w.Number("maxRootFindingError", solved.MaxRootFindingErrorElectronVolts);
                w.Number("maxDiscretisationError", solved.MaxDiscretisationErrorElectronVolts);
                if (solved.Method == BandSolverMethod.Refined)
                {
                    w.WriteNumber("magnusSteps", solved.MagnusStepCount); // smooth segments: step-halving refinement
                }
                if (solved.Spectral is { } spectral)
                {
                    w.WriteNumber("planeWaves", spectral.BasisSize); // one Fourier segment: spectral edges
                }
                w.WriteEndObject();
            }), outPath);
            return;
        }
        if (structure.OpticalLattice is { } lattice)
        {
            LatticeOutput.Bands(structure, lattice, bands, DisplayUnits.Lattice(lattice, latticeUnit), format, outPath); // recoil energies and atom masses
            return;
        }
        var unit = DisplayUnits.Energy(structure, bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts }));
        // m* along the growth axis at the band's bottom and top; m∥ the in-plane mass at the bottom (per-layer masses weighted by the
        // Bloch state), last so that the CSV's earlier columns keep their places.
        var table = new Table(new Column("band"), Column.Energy("bottom", unit), Column.Energy("top", unit), Column.Energy("width", unit),
            new Column("m* bottom", "m0", Format: "G6"), new Column("m* top", "m0", Format: "G6"), Column.Energy("gap above", unit), new Column("m∥ bottom", "m0", Format: "G6"));
        foreach (var band in bands.Bands)
        {
            var (mb, mt) = masses[band.Index - 1];
            table.Add(band.Index, band.BottomElectronVolts, band.TopElectronVolts, band.WidthElectronVolts, mb, mt,
                bands.Gaps[band.Index - 1].WidthElectronVolts, inPlane?[band.Index - 1].ElectronMasses ?? double.NaN);
        }
        var note = inPlaneWhy is null ? "" : $"m∥ not available: {inPlaneWhy}\n";
        Common.EmitTable(table, format, Common.TableTitle(structure, unit) + note, outPath);
    }

    /// <summary>
    /// The in-plane mass of every band at its bottom (<see cref="InPlaneDispersion.MassAtBottom"/>), or null and why not (a cell
    /// element the in-plane transformation does not cover, or a band whose mass could not be computed).
    /// </summary>
    private static (IReadOnlyList<InPlaneMass>? Masses, string? Why) InPlaneMasses(BandStructure bands)
    {
        try
        {
            return (InPlaneDispersion.MassesAtBottom(bands, bands.Bands.Count), null);
        }
        catch (ArgumentException e)
        {
            return (null, Common.Describe(e));
        }
        catch (PeriodicComputationException e)
        {
            return (null, e.Message);
        }
    }
}
