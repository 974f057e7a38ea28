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
    public static Command Create()
    {
        var file = Common.FileArgument();
        var grid = new EnergyGridOptions();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var volume = new Option<bool>("--volume") { Description = "Add the superlattice's 3D density of states and its integral (free in-plane motion, see --in-plane-mass)." };
        var mass = CarriersCommand.InPlaneMassOption();
        var command = new Command("dos", "Density of states (spin included) and its integral, Bloch wavevector, decay constant and dE/dk at each energy; with --volume the superlattice's 3D density of states.");
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
        if (inPlane is { } m)
        {
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
                    w.Number("wavevector", p.Wavevector);
                    w.Number("decay", p.Decay);
                    w.Number("slope", p.Slope);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            }), outPath);
            return;
        }
        var unit = DisplayUnits.Energy(structure.Cell, energies);
        var columns = new List<Column> { Column.Energy("energy", unit), new("dos", "1/(eV nm)", Format: "G8"), new("integrated", "1/nm", Format: "G8") };
        if (dos3 is not null)
        {
            columns.Add(new("dos3d", "1/(eV nm3)", Format: "G8"));
            columns.Add(new("integrated3d", "1/nm3", Format: "G8"));
        }
        columns.AddRange([new("Re k", "1/nm", Format: "G8"), new("Im k", "1/nm", Format: "G8"), new("dE/dk", "eV nm", Format: "G8")]);
        var table = new Table([.. columns]);
        for (var i = 0; i < values.Length; i++)
        {
            var p = values[i];
            table.Add(dos3 is null
                ? [p.Energy, p.Dos, integrated[i], p.Wavevector, p.Decay, p.Slope]
                : [p.Energy, p.Dos, integrated[i], dos3[i], states3![i], p.Wavevector, p.Decay, p.Slope]);
        }
        Common.EmitTable(table, format, Common.TableTitle(structure, unit), outPath);
    }
}
