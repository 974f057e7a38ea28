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
        $"{structure.Name}  ({lattice.Species.Name}, lambda = {lattice.Wavelength.Nanometres:G8} nm, s = {lattice.DepthInRecoilEnergies:G6} E_R, E_R = h x {OpticalLattice.ToHertz(lattice.RecoilEnergy.ElectronVolts) / 1e3:G6} kHz)\n");

    public static string Bands(StructureDefinition structure, OpticalLattice lattice, BandStructure bands, OutputFormat format)
    {
        var er = lattice.RecoilEnergy.ElectronVolts;
        var atom = lattice.Species.Mass.ElectronMasses;
        var properties = BandProperties.Create(bands);
        var table = new Table("band", "bottom (E_R)", "top (E_R)", "width (E_R)", "m* bottom (m)", "m* top (m)", "gap above (E_R)");
        foreach (var band in bands.Bands)
        {
            table.Add(Table.Integer(band.Index), Table.Number(band.BottomElectronVolts / er, "G10"), Table.Number(band.TopElectronVolts / er, "G10"),
                Table.Number(band.WidthElectronVolts / er, "G6"), Table.Number(properties.BottomMass(band.Index).ElectronMasses / atom, "G5"),
                Table.Number(properties.TopMass(band.Index).ElectronMasses / atom, "G5"), Table.Number(bands.Gaps[band.Index - 1].WidthElectronVolts / er, "G6"));
        }
        return format == OutputFormat.Csv ? table.ToCsv() : Title(structure, lattice) + "\n" + table.ToText();
    }

    public static string Dispersion(StructureDefinition structure, OpticalLattice lattice, BandStructure bands, double[] k, double[][] e, OutputFormat format)
    {
        var er = lattice.RecoilEnergy.ElectronVolts;
        var headers = new List<string> { "q/k_L" };
        headers.AddRange(Enumerable.Range(1, e.Length).Select(n => string.Create(CultureInfo.InvariantCulture, $"E{n} (E_R)")));
        var table = new Table([.. headers]);
        for (var i = 0; i < k.Length; i++)
        {
            var row = new List<string> { Table.Number(lattice.ToLatticeWavenumbers(k[i]), "G8") };
            row.AddRange(e.Select(band => Table.Number(band[i] / er, "G10")));
            table.Add([.. row]);
        }
        return format == OutputFormat.Csv ? table.ToCsv() : Title(structure, lattice) + "\n" + table.ToText();
    }

    public static Plot DispersionPlot(StructureDefinition structure, OpticalLattice lattice, int count)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var (k, e) = DispersionCommand.Compute(bands, 201);
        var er = lattice.RecoilEnergy.ElectronVolts;
        var q = k.Select(lattice.ToLatticeWavenumbers).ToArray();
        var mirrored = q.Reverse().Select(x => -x).Concat(q.Skip(1)).ToArray();
        var plot = PlotCommand.NewPlot($"E(q): {structure.Name}", "quasimomentum q / k_L", "energy E / E_R");
        var zone = q[^1];
        double low = double.PositiveInfinity, high = double.NegativeInfinity;
        foreach (var band in bands.Bands)
        {
            low = Math.Min(low, band.BottomElectronVolts / er);
            high = Math.Max(high, band.TopElectronVolts / er);
            // Each band's range shaded across the zone, so narrow deep-lattice bands stay visible as strips.
            var strip = plot.Add.Rectangle(-zone, zone, band.BottomElectronVolts / er, band.TopElectronVolts / er);
            strip.FillColor = Colors.SteelBlue.WithAlpha(0.15);
            strip.LineWidth = 0;
        }
        for (var n = 0; n < e.Length; n++)
        {
            var values = e[n].Reverse().Concat(e[n].Skip(1)).Select(v => v / er).ToArray();
            var line = plot.Add.ScatterLine(mirrored, values);
            line.LineWidth = 2.5f;
        }
        var margin = 0.06 * (high - low);
        plot.Add.Text("bands shaded", -0.97 * zone, high + 0.5 * margin).LabelFontSize = 12;
        plot.Axes.SetLimits(-zone * 1.02, zone * 1.02, low - margin, high + margin);
        return plot;
    }
}
