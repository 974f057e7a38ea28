// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Properties;
using Periodic.Serialization;

namespace Periodic.Cli.Commands;

/// <summary><c>bloch FILE --band n --k K</c>: the normalised Bloch function ψ_k(x) and its periodic part u_k(x) on a grid.</summary>
internal static class BlochCommand
{
    public const int MaxPoints = 1_000_000;

    public static Command Create()
    {
        var file = Common.FileArgument();
        var band = new Option<int>("--band", "-b") { Description = "Band index, from 1.", DefaultValueFactory = _ => 1 };
        var k = Common.NumberOption("--k", "1/nm", "0.2", "Bloch wavevector k, 1/nm, in [-pi/d, pi/d] (default 0; or give --zone-fraction).");
        var fraction = Common.NumberOption("--zone-fraction", "", "0.5", "k as a fraction of the zone boundary, kd/pi in [-1, 1] (instead of --k).");
        var periods = new Option<int>("--periods", "-N") { Description = "Periods covered by the grid (1 to 1000).", DefaultValueFactory = _ => 1 };
        var points = new Option<int>("--points") { Description = "Grid points, ends included (2 to 1,000,000).", DefaultValueFactory = _ => 201 };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("bloch", "The Bloch function psi_k(x) and its cell-periodic part u_k(x) = exp(-ikx) psi_k(x) of one band at one k, on a grid.");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { band, k, fraction, periods, points, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(band), "--band", 1000);
            var p = Common.CheckCount(result.GetValue(periods), "--periods", 1000);
            var count = result.GetValue(points);
            if (count < 2 || count > MaxPoints)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--points must be between 2 and {MaxPoints}; got {count}."));
            }
            double? kGiven = result.GetValue(k), fGiven = result.GetValue(fraction);
            if (kGiven is not null && fGiven is not null)
            {
                throw new UsageException("give either --k or --zone-fraction, not both.");
            }
            if (fGiven is { } f && !(f >= -1 && f <= 1))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--zone-fraction must be between -1 and 1; got {f:R}."));
            }
            var structure = Common.Load(result, result.GetValue(file)!);
            var bands = Solver.Compute(structure.Cell, n).Structure;
            var zone = Math.PI / bands.PeriodNanometres;
            var wavevector = fGiven is { } g ? (g == 1 ? zone : g == -1 ? -zone : g * zone) : kGiven ?? 0.0;
            if (!(Math.Abs(wavevector) <= zone))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--k must lie in the first zone [-{zone:R}, {zone:R}] 1/nm; got {wavevector:R}."));
            }
            BlochFunction bloch;
            try
            {
                bloch = BlochFunction.Create(bands, n, wavevector);
            }
            catch (ArgumentException e) when (e is not ArgumentOutOfRangeException)
            {
                throw new InvalidOperationException(Common.Describe(e), e);
            }
            Write(structure, bloch, p, count, format, result.GetValue(output));
            return 0;
        });
        return command;
    }

    private static void Write(StructureDefinition structure, BlochFunction bloch, int periods, int count, OutputFormat format, string? outPath)
    {
        var length = periods * bloch.PeriodNanometres;
        var x = new double[count];
        for (var i = 0; i < count; i++)
        {
            x[i] = i == count - 1 ? length : length * i / (count - 1);
        }
        double[] psiRe = new double[count], psiIm = new double[count], uRe = new double[count], uIm = new double[count], density = new double[count];
        bloch.Evaluate(x, psiRe, psiIm);
        bloch.EvaluatePeriodicPart(x, uRe, uIm);
        bloch.ProbabilityDensities(x, density);
        var warnings = Common.CheckEnergies(structure, [bloch.EnergyElectronVolts]);
        if (format == OutputFormat.Json)
        {
            Common.Emit(Common.Json(w =>
            {
                Common.StructureHeader(w, structure, warnings);
                Common.Units(w, ("position", "nm"), ("wavevector", "1/nm"), ("energy", "eV"), ("psi", "nm^-1/2"), ("u", "nm^-1/2"), ("density", "1/nm"));
                w.WriteNumber("band", bloch.BandIndex);
                w.WriteNumber("wavevector", bloch.WavevectorPerNanometre);
                w.WriteNumber("energy", bloch.EnergyElectronVolts);
                w.WriteString("normalisation", "integral of |psi|^2 over one period = 1");
                w.WriteNumber("relativeErrorEstimate", bloch.RelativeErrorEstimate);
                w.WriteNumber("discretisationErrorEstimate", bloch.DiscretisationErrorEstimate);
                foreach (var (name, values) in new[] { ("positions", x), ("psiReal", psiRe), ("psiImaginary", psiIm), ("uReal", uRe), ("uImaginary", uIm), ("density", density) })
                {
                    w.WriteStartArray(name);
                    foreach (var v in values)
                    {
                        w.WriteNumberValue(v);
                    }
                    w.WriteEndArray();
                }
            }), outPath);
            return;
        }
        var table = new Table(new Column("x", "nm", Format: "G8"), new Column("Re psi", "nm^-1/2", Format: "G8"), new Column("Im psi", "nm^-1/2", Format: "G8"),
            new Column("Re u", "nm^-1/2", Format: "G8"), new Column("Im u", "nm^-1/2", Format: "G8"), new Column("|psi|^2", "1/nm", Format: "G8"));
        for (var i = 0; i < count; i++)
        {
            table.Add(x[i], psiRe[i], psiIm[i], uRe[i], uIm[i], density[i]);
        }
        var unit = DisplayUnits.Energy(structure, [bloch.EnergyElectronVolts]);
        var title = Common.TableTitle(structure, unit) + string.Create(CultureInfo.InvariantCulture,
            $"Band {bloch.BandIndex} at k = {bloch.WavevectorPerNanometre:G8} 1/nm (kd/pi = {bloch.WavevectorPerNanometre * bloch.PeriodNanometres / Math.PI:G6}), E = {unit.From(bloch.EnergyElectronVolts):G10} {unit.Symbol}; normalised to 1 over one period; relative error estimate {bloch.RelativeErrorEstimate:G2}\n");
        Common.EmitTable(table, format, title, outPath);
    }
}
