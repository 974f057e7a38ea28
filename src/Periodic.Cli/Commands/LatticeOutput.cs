// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.OpticalLattices;
using Periodic.Properties;
using Periodic.Serialization;
using ScottPlot;

namespace Periodic.Cli.Commands;

/// <summary>
/// Tables and plots of optical-lattice cells in the trade's units: energies in recoil energies E_R, wavevectors in
/// units of k_L = π/d, masses in units of the atom's mass. JSON output stays in eV and 1/nm (see the commands).
/// </summary>
internal static class LatticeOutput
{
    private static string Title(StructureDefinition structure, OpticalLattice lattice) => string.Create(CultureInfo.InvariantCulture,
        $"{Common.Printable(structure.Name)}  ({lattice.Species.Name}, lambda = {lattice.Wavelength.Nanometres:G8} nm, s = {lattice.DepthInRecoilEnergies:G6} E_R, E_R = h x {OpticalLattice.ToHertz(lattice.RecoilEnergy.ElectronVolts) / 1e3:G6} kHz = {lattice.RecoilEnergy.ElectronVolts:G6} eV)\n");

    /// <summary>
    /// An energy column in <paramref name="unit"/> for both the table and the CSV (values passed already divided by the unit, so
    /// the CSV keeps the full round-trip precision of the quotient and its header names the unit).
    /// </summary>
    private static Column EnergyColumn(string name, EnergyUnit unit, string format) => new(name, unit.Symbol, Format: format);

    /// <summary>
    /// The band table in <paramref name="unit"/> (masses in units of the atom's mass). The CSV is in the same units as the table,
    /// named in its header; with eV its energies equal the JSON's bit for bit.
    /// </summary>
    public static void Bands(StructureDefinition structure, OpticalLattice lattice, BandStructure bands, EnergyUnit unit, OutputFormat format, string? outPath)
    {
        var atom = lattice.Species.Mass.ElectronMasses;
        var properties = BandProperties.Create(bands);
        var table = new Table(new Column("band"), EnergyColumn("bottom", unit, "G10"), EnergyColumn("top", unit, "G10"), EnergyColumn("width", unit, "G6"),
            new Column("m* bottom", "m", Format: "G5"), new Column("m* top", "m", Format: "G5"), EnergyColumn("gap above", unit, "G6"));
        foreach (var band in bands.Bands)
        {
            table.Add(band.Index, unit.From(band.BottomElectronVolts), unit.From(band.TopElectronVolts), unit.From(band.WidthElectronVolts),
                properties.BottomMass(band.Index).ElectronMasses / atom, properties.TopMass(band.Index).ElectronMasses / atom,
                unit.From(bands.Gaps[band.Index - 1].WidthElectronVolts));
        }
        Common.EmitTable(table, format, Title(structure, lattice), outPath);
    }

    /// <summary>E(q) on the grid <paramref name="k"/> (1/nm), quasimomentum in units of k_L, energies in <paramref name="unit"/>.</summary>
    public static void Dispersion(Stream stream, StructureDefinition structure, OpticalLattice lattice, double[] k, double[][] e, EnergyUnit unit, OutputFormat format)
    {
        var columns = new List<Column> { new("q/k_L", Format: "G8") };
        columns.AddRange(Enumerable.Range(1, e.Length).Select(n => EnergyColumn(string.Create(CultureInfo.InvariantCulture, $"E{n}"), unit, "G10")));
        var table = new Table([.. columns]);
        for (var i = 0; i < k.Length; i++)
        {
            var row = new Periodic.Cli.Output.Cell[e.Length + 1];
            row[0] = lattice.ToLatticeWavenumbers(k[i]);
            for (var n = 0; n < e.Length; n++)
            {
                row[n + 1] = unit.From(e[n][i]);
            }
            table.Add(row);
        }
        if (format == OutputFormat.Csv)
        {
            table.WriteCsv(stream);
            return;
        }
        stream.Write(new System.Text.UTF8Encoding(false).GetBytes(Title(structure, lattice) + "\n" + table.ToText()));
    }

    public static Plot DispersionPlot(StructureDefinition structure, OpticalLattice lattice, int count, EnergyUnit unit)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var (k, e) = DispersionCommand.Compute(bands, 201);
        var q = k.Select(lattice.ToLatticeWavenumbers).ToArray();
        var mirrored = q.Reverse().Select(x => -x).Concat(q.Skip(1)).ToArray();
        var plot = PlotCommand.NewPlot($"E(q): {structure.Name}", "quasimomentum q / k_L", $"energy E ({unit.Symbol})");
        var zone = q[^1];
        double low = double.PositiveInfinity, high = double.NegativeInfinity;
        foreach (var band in bands.Bands)
        {
            low = Math.Min(low, unit.From(band.BottomElectronVolts));
            high = Math.Max(high, unit.From(band.TopElectronVolts));
            // Each band's range shaded across the zone, so narrow deep-lattice bands stay visible as strips.
            var strip = plot.Add.Rectangle(-zone, zone, unit.From(band.BottomElectronVolts), unit.From(band.TopElectronVolts));
            strip.FillColor = Colors.SteelBlue.WithAlpha(0.15);
            strip.LineWidth = 0;
        }
        for (var n = 0; n < e.Length; n++)
        {
            var values = e[n].Reverse().Concat(e[n].Skip(1)).Select(unit.From).ToArray();
            var line = plot.Add.ScatterLine(mirrored, values);
            line.LineWidth = 2.5f;
        }
        var margin = 0.06 * (high - low);
        plot.Add.Text("bands shaded" + (unit.Note is { } note ? "\n" + note : ""), -0.97 * zone, high + 0.5 * margin).LabelFontSize = 12;
        plot.Axes.SetLimits(-zone * 1.02, zone * 1.02, low - margin, high + margin);
        return plot;
    }
}
