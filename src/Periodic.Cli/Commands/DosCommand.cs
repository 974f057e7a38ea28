// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;

using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary><c>dos FILE</c>: density of states, complex wavevector and band slope on an energy grid.</summary>
internal static class DosCommand
{
    /// <summary>
    /// Most energies for the exact 3D values: each costs two integrals over k∥ of a few hundred band searches (about 0.1 s for a
    /// two-layer cell), so this bounds the run at minutes.
    /// </summary>
    public const int MaxExactEnergies = 2000;

    public static Command Create()
    {
        var file = Common.FileArgument();
        var grid = new EnergyGridOptions();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var volume = new Option<bool>("--volume")
        {
            Description = "Add the superlattice's 3D density of states and its integral: exact, with each layer's own in-plane mass (cells of parabolic layers, "
                + "deltas and Fourier segments; at most " + MaxExactEnergies.ToString(CultureInfo.InvariantCulture) + " energies), beside the single-in-plane-mass values "
                + "(--in-plane-mass) and their relative error.",
        };
        var mass = CarriersCommand.InPlaneMassOption();
        var command = new Command("dos", "Density of states (spin included) and its integral, Bloch wavevector, decay constant and dE/dk at each energy; with --volume the superlattice's 3D density of states, exact and with one in-plane mass.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        grid.AddTo(command);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.Options.Add(volume);
        command.Options.Add(mass);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var energies = grid.Read(result);
            CarriersCommand.CheckMass(result.GetValue(mass));
            if (result.GetValue(mass) is not null && !result.GetValue(volume))
            {
                throw new UsageException("--in-plane-mass applies only with --volume.");
            }
            var structure = Common.AtInPlaneWavevector(result, inPlane, Common.Load(result, result.GetValue(file)!));
            var inPlaneMass = result.GetValue(volume) ? CarriersCommand.InPlaneMass(structure.Cell, result.GetValue(mass)) : (Periodic.Units.EffectiveMass?)null;
            Write(structure, energies, inPlaneMass, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    public static PointQuantities.Values[] Compute(StructureDefinition structure, double[] energies) => Compute(PointQuantities.PropertiesUpTo(structure.Cell, energies.Max()), energies);

    public static PointQuantities.Values[] Compute(Periodic.Properties.BandProperties properties, double[] energies)
    {
        var values = new PointQuantities.Values[energies.Length];
        using var progress = new Progress("dos", energies.Length);
        for (var i = 0; i < energies.Length; i++)
        {
            try
            {
                values[i] = PointQuantities.At(properties, energies[i]);
            }
            catch (ArgumentOutOfRangeException)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--to/--energies {energies[i]:R} eV lies above the bands this cell's density of states reaches ({properties.Structure.Bands.Count} bands, up to {properties.Structure.Bands[^1].TopElectronVolts:R} eV); choose a lower energy."));
            }
            if ((i & 255) == 0)
            {
                progress.Report(i);
            }
        }
        return values;
    }

    public static void Write(StructureDefinition structure, double[] energies, Periodic.Units.EffectiveMass? inPlane, OutputFormat format, string? outPath)
    {
        var properties = PointQuantities.PropertiesUpTo(structure.Cell, energies.Max());
        var values = Compute(properties, energies);
        var integrated = new double[energies.Length];
        properties.IntegratedDensitiesOfStates(energies, integrated);
        double[]? dos3 = null, states3 = null;
        Periodic.Properties.InPlaneDensityOfStates[]? exactDos = null;
        Periodic.Properties.InPlaneCarrierDensity[]? exactStates = null;
        string? exactWhy = null;
        if (inPlane is { } m)
        {
            exactWhy = ExactUnavailable(structure.Cell);
            if (exactWhy is null)
            {
                Limits.CheckRange("the number of energies with --volume", energies.Length, 1, MaxExactEnergies);
                var cell = structure.Cell;
                exactDos = energies.Select(e => Periodic.Properties.InPlaneDensities.DensityOfStates(cell, e, m)).ToArray();
                // The exact integral of g3 up to E: the exact density of a filled Fermi sea at E (T = 0).
                exactStates = energies.Select(e => Periodic.Properties.InPlaneDensities.CarrierDensity(cell, Periodic.Units.Energy.FromElectronVolts(e), Periodic.Units.Temperature.FromKelvin(0), m)).ToArray();
            }
            else
            {
                Console.Error.WriteLine($"periodic: note: {Common.Printable(structure.SourceName)}: exact 3D values not computed ({exactWhy}); the single-in-plane-mass values are given.");
            }
            dos3 = new double[energies.Length];
            properties.SuperlatticeDensitiesOfStates(energies, m, dos3);
            // The integral of g3 up to E is the density of a filled Fermi sea at E (T = 0).
            states3 = energies.Select(e => properties.SuperlatticeCarrierDensity(Energy.FromElectronVolts(e), Temperature.FromKelvin(0), m).DensityPerCubicNanometre).ToArray();
        }
        var warnings = Common.CheckEnergies(structure, energies);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("energy", "eV"), ("dos", "1/(eV nm)"), ("integrated", "1/nm"), ("dos3d", "1/(eV nm3)"), ("integrated3d", "1/nm3"),
                    ("wavevector", "1/nm"), ("decay", "1/nm"), ("slope", "eV nm"), ("period", "nm"), ("inPlaneMass", "m0"));
                if (inPlane is { } m)
                {
                    w.WriteNumber("inPlaneMass", m.ElectronMasses);
                    w.WriteBoolean("exactInPlane", exactDos is not null);
                    if (exactWhy is not null)
                    {
                        w.WriteString("exactInPlaneUnavailable", exactWhy);
                    }
                }
                w.WriteStartArray("points");
                for (var i = 0; i < values.Length; i++)
                {
                    var p = values[i];
                    w.WriteStartObject();
                    w.Number("energy", p.Energy);
                    w.Number("dos", p.Dos);
                    w.Number("integrated", integrated[i]);
                    if (dos3 is not null)
                    {
                        w.Number("dos3d", dos3[i]);
                        w.Number("integrated3d", states3![i]);
                    }
                    if (exactDos is not null)
                    {
                        w.Number("dos3dExact", exactDos[i].ExactPerElectronVoltCubicNanometre);
                        w.Number("dos3dExactError", exactDos[i].ErrorEstimatePerElectronVoltCubicNanometre);
                        w.Number("dos3dSingleMassRelativeError", exactDos[i].RelativeErrorOfSingleMass);
                        w.Number("integrated3dExact", exactStates![i].ExactPerCubicNanometre);
                        w.Number("integrated3dExactError", exactStates[i].ErrorEstimatePerCubicNanometre);
                        w.Number("integrated3dSingleMassRelativeError", exactStates[i].RelativeErrorOfSingleMass);
                    }
                    w.Number("wavevector", p.Wavevector);
                    w.Number("decay", p.Decay);
                    w.Number("slope", p.Slope);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure, energies);
        var columns = new List<Column> { Column.Energy("energy", unit), new("dos", "1/(eV nm)", Format: "G8"), new("integrated", "1/nm", Format: "G8") };
        if (dos3 is not null)
        {
            columns.Add(new("dos3d", "1/(eV nm3)", Format: "G8"));
            columns.Add(new("integrated3d", "1/nm3", Format: "G8"));
        }
        columns.AddRange([new("Re k", "1/nm", Format: "G8"), new("Im k", "1/nm", Format: "G8"), new("dE/dk", "eV nm", Format: "G8")]);
        if (exactDos is not null)
        {
            // Appended, so the columns before them keep their places in the CSV.
            columns.AddRange([new("dos3d exact", "1/(eV nm3)", Format: "G8"), new("dos3d exact error", "1/(eV nm3)", Format: "G2"), new("dos3d 1-mass rel. error", Format: "G3"),
                new("integrated3d exact", "1/nm3", Format: "G8"), new("integrated3d exact error", "1/nm3", Format: "G2"), new("integrated3d 1-mass rel. error", Format: "G3")]);
        }
        var table = new Table([.. columns]);
        for (var i = 0; i < values.Length; i++)
        {
            var p = values[i];
            var row = new List<Cell> { p.Energy, p.Dos, integrated[i] };
            if (dos3 is not null)
            {
                row.AddRange([dos3[i], states3![i]]);
            }
            row.AddRange([p.Wavevector, p.Decay, p.Slope]);
            if (exactDos is not null)
            {
                var (g, n) = (exactDos[i], exactStates![i]);
                row.AddRange([g.ExactPerElectronVoltCubicNanometre, g.ErrorEstimatePerElectronVoltCubicNanometre, g.RelativeErrorOfSingleMass,
                    n.ExactPerCubicNanometre, n.ErrorEstimatePerCubicNanometre, n.RelativeErrorOfSingleMass]);
            }
            table.Add([.. row]);
        }
        var title = Common.TableTitle(structure, unit) + (inPlane is { } mass
            ? string.Create(CultureInfo.InvariantCulture, $"3D values: dos3d and integrated3d with one in-plane mass {mass.ElectronMasses:G6} m0 (--in-plane-mass)")
                + (exactDos is not null ? "; exact: each layer's own in-plane mass; 1-mass rel. error = (one mass - exact)/exact\n" : $"; exact values not computed: {exactWhy}\n")
            : "")
            // Atoms in one internal state have one state per band and site; the columns count two (spin), as for electrons.
            + (structure.OpticalLattice is { } lattice
                ? string.Create(CultureInfo.InvariantCulture,
                    $"dos and integrated count two states per orbital (spin, as for electrons): for atoms in one internal state halve them; a filled band then holds 1/d = {1 / lattice.LatticePeriod.Nanometres:G6} /nm, one atom per site\n")
                : "");
        Common.EmitTable(table, format, title, outPath);
    }

    /// <summary>Why the exact in-plane densities cannot be computed for <paramref name="cell"/> (null: they can).</summary>
    public static string? ExactUnavailable(Periodic.Structures.UnitCell cell)
    {
        if (!Periodic.Structures.InPlaneMotion.IsParabolic(cell))
        {
            return "the cell holds non-parabolic layers, whose in-plane term depends on the energy itself; the exact densities cover parabolic layers, delta barriers and Fourier segments";
        }
        try
        {
            Periodic.Structures.InPlaneMotion.CellAt(cell, 0);
        }
        catch (ArgumentException e)
        {
            return Common.Describe(e);
        }
        return null;
    }
}
