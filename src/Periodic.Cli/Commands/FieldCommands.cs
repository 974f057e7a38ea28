// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Properties;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>drift FILE</c>: miniband drift velocity against field (relaxation-time approximation, Esaki–Tsu generalised to the band's
/// true E(k)); <c>ladder FILE</c>: the Wannier–Stark ladder of a long biased superlattice. Fields in kV/cm.
/// </summary>
internal static class FieldCommands
{
    private const double VoltsPerMetrePerKilovoltPerCentimetre = 1e5;

    public const int MaxLadderPeriods = 400;

    private const string DriftLimits = "Model: one miniband, one relaxation time, non-degenerate carriers, uniform field, no space charge or field domains; a guide to compare designs.";

    private const string LadderLimits = "Model: coherent transmission of the biased stack (resonances), uniform field, no scattering or space charge; a guide, to be checked against measurement.";

    public static Command Drift()
    {
        var file = Common.FileArgument();
        var band = new Option<int>("--band") { Description = "The miniband, from 1.", DefaultValueFactory = _ => 1 };
        var tau = Common.NumberOption("--scattering-time", "ps", "0.1", "Relaxation time tau, ps (required; 1e-6 to 1e6).");
        var temperature = Common.NumberOption("--temperature", "K", "77", "Temperature of the (Boltzmann) occupation, K (default 0: carriers at the band bottom, as Esaki and Tsu).");
        var maxField = Common.NumberOption("--max-field", "kV/cm", "20", "Highest field of the table, kV/cm (default: 4 times the peak field, at most the single-miniband limit eFd = gap).");
        var points = new Option<int>("--points") { Description = "Fields from 0 to --max-field, ends included (2 to 100,000).", DefaultValueFactory = _ => 41 };
        var density = Common.NumberOption("--density", "1/cm3", "1e16", "Carrier density, 1/cm3: adds the current density e n v.");
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write to this file (atomically) instead of stdout." };
        var command = new Command("drift", "Miniband drift velocity against electric field (relaxation-time approximation): peak field, peak velocity, Bloch frequency, current density. Picture: plot FILE --show drift.");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { band, tau, temperature, maxField, points, density, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(band), "--band", 100);
            var ps = CheckScatteringTime(result.GetValue(tau));
            var t = CheckDriftTemperature(result.GetValue(temperature));
            var nDensity = result.GetValue(density);
            if (nDensity is { } given && !(given >= 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--density must be a carrier density of 0 or more per cm3; got {given:R}."));
            }
            var k = Common.CheckCount(result.GetValue(points), "--points", 100_000);
            if (k < 2)
            {
                throw new UsageException("--points must be between 2 and 100000; got 1.");
            }
            var structure = Common.Load(result, result.GetValue(file)!);
            var (drift, top) = SetUpDrift(structure, n, ps, t, result.GetValue(maxField));
            Common.Emit(RenderDrift(structure, drift, top, k, nDensity, format), result.GetValue(output));
            return 0;
        });
        return command;
    }

    /// <summary>The relaxation time in ps (required; 1e-6 to 1e6).</summary>
    public static double CheckScatteringTime(double? ps)
    {
        var value = ps ?? throw new UsageException("--scattering-time is required (the relaxation time in ps, e.g. --scattering-time 0.1).");
        if (!(value >= 1e-6 && value <= 1e6))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--scattering-time must be from 1e-6 to 1e6 ps; got {value:R}."));
        }
        return value;
    }

    /// <summary>The drift's temperature in K (default 0: carriers at the band bottom).</summary>
    public static double CheckDriftTemperature(double? kelvin)
    {
        var t = kelvin ?? 0;
        if (!(t >= 0 && t <= 1e4))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--temperature must be from 0 to 10000 K; got {t:R}."));
        }
        return t;
    }

    /// <summary>The drift of band <paramref name="band"/> and the highest field of its table or plot, kV/cm (checked against the single-miniband limit).</summary>
    public static (MinibandDrift Drift, double TopKilovoltsPerCentimetre) SetUpDrift(StructureDefinition structure, int band, double ps, double kelvin, double? maxField)
    {
        RefuseNeutralAtoms(structure, "drift");
        var bands = BandStructure.Compute(structure.Cell, band);
        var drift = MinibandDrift.Create(bands, band, ps * 1e-12, Temperature.FromKelvin(kelvin));
        var limit = drift.MaxFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre;
        var top = maxField ?? Math.Min(limit, 4 * drift.PeakFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre);
        if (!(top > 0 && top <= limit))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"--max-field must be above 0 and at most {limit:R} kV/cm (eFd up to the {drift.GapAboveElectronVolts:R} eV gap above band {band}; beyond it Zener tunnelling breaks the single-miniband model); got {top:R}."));
        }
        return (drift, top);
    }

    /// <summary>The fields of the table or plot: <paramref name="points"/> from 0 to <paramref name="top"/> kV/cm, the last exactly <paramref name="top"/>.</summary>
    public static double[] Fields(double top, int points) =>
        [.. Enumerable.Range(0, points).Select(i => i == points - 1 ? top : top * i / (points - 1))];

    private static string RenderDrift(StructureDefinition structure, MinibandDrift drift, double top, int points, double? density, OutputFormat format)
    {
        var fields = Fields(top, points);
        var velocities = fields.Select(f => drift.VelocityAt(f * VoltsPerMetrePerKilovoltPerCentimetre)).ToArray();
        double Bloch(double kvPerCm) => drift.BlochAngularFrequencyAt(kvPerCm * VoltsPerMetrePerKilovoltPerCentimetre) / (2 * Math.PI);
        double Current(int i) => drift.CurrentDensityAmperesPerSquareMetreAt(fields[i] * VoltsPerMetrePerKilovoltPerCentimetre, density!.Value) * 1e-4; // A/cm2
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("field", "kV/cm"), ("velocity", "m/s"), ("blochFrequency", "Hz"), ("currentDensity", "A/cm2"), ("scatteringTime", "s"), ("temperature", "K"));
                w.WriteNumber("band", drift.BandIndex);
                w.WriteNumber("scatteringTime", drift.ScatteringTimeSeconds);
                w.WriteNumber("temperature", drift.TemperatureKelvin);
                w.Number("peakField", drift.PeakFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre);
                w.Number("peakVelocity", drift.PeakVelocityMetresPerSecond);
                w.Number("criticalField", drift.CriticalFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre);
                w.Number("maxField", drift.MaxFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre);
                w.WriteStartArray("hoppings");
                for (var j = 1; j < Math.Min(8, drift.CoefficientsElectronVolts.Count); j++)
                {
                    w.WriteNumberValue(-0.5 * drift.CoefficientsElectronVolts[j]);
                }
                w.WriteEndArray();
                w.WriteStartArray("points");
                for (var i = 0; i < points; i++)
                {
                    w.WriteStartObject();
                    w.Number("field", fields[i]);
                    w.Number("velocity", velocities[i]);
                    w.Number("blochFrequency", Bloch(fields[i]));
                    if (density is not null)
                    {
                        w.Number("currentDensity", Current(i));
                    }
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteString("model", DriftLimits);
            });
        }
        // CSV in the JSON's units at full precision (the Bloch frequency in Hz); the table shows THz.
        var columns = new List<Column> { new("field", "kV/cm", Format: "G8"), new("velocity", "m/s", Format: "G8"), new("Bloch frequency", "Hz", "THz", 1e12, "G8") };
        if (density is not null)
        {
            columns.Add(new("current density", "A/cm2", Format: "G8"));
        }
        var table = new Table([.. columns]);
        for (var i = 0; i < points; i++)
        {
            table.Add(density is null ? [fields[i], velocities[i], Bloch(fields[i])] : [fields[i], velocities[i], Bloch(fields[i]), Current(i)]);
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        var summary = string.Create(CultureInfo.InvariantCulture,
            $"band {drift.BandIndex}, tau = {drift.ScatteringTimeSeconds * 1e12:G6} ps, T = {drift.TemperatureKelvin:G6} K: peak {drift.PeakVelocityMetresPerSecond:G8} m/s at {drift.PeakFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre:G8} kV/cm (hbar/(e d tau) = {drift.CriticalFieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre:G8} kV/cm)\n");
        return Common.TableTitle(structure) + summary + "\n" + table.ToText() + "\n" + DriftLimits + "\n";
    }

    public static Command Ladder()
    {
        var file = Common.FileArgument();
        var band = new Option<int>("--band") { Description = "The miniband, from 1.", DefaultValueFactory = _ => 1 };
        var field = Common.NumberOption("--field", "kV/cm", "10", "Uniform electric field, kV/cm (required; above 0, with eFd at most the gap above the band).");
        var periods = new Option<int>("--periods", "-N") { Description = "Periods of the biased stack (8 to 400, default 30).", DefaultValueFactory = _ => 30 };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write to this file (atomically) instead of stdout." };
        var command = new Command("ladder", "Wannier–Stark ladder of a long superlattice in a uniform field: rung energies and widths, spacing eFd, Bloch frequency. Picture: plot FILE --show ladder.");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { band, field, periods, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(band), "--band", 100);
            var f = result.GetValue(field);
            var p = Limits.CheckRange("--periods", result.GetValue(periods), WannierStarkLadder.MinPeriods, MaxLadderPeriods);
            var structure = Common.RequireRigid(result, Common.Load(result.GetValue(file)!), "ladder");
            Common.Emit(RenderLadder(structure, FindLadder(structure, n, p, f), format), result.GetValue(output));
            return 0;
        });
        return command;
    }

    /// <summary>
    /// The ladder of band <paramref name="band"/> over <paramref name="periods"/> periods at <paramref name="fieldKilovoltsPerCentimetre"/>
    /// (required), the library's refusals mapped to the options. Each rung search evaluates the written-out stack thousands of
    /// times (O(periods) per energy): a long ladder's middle needs a few tens of periods, so more than 400 only costs time.
    /// </summary>
    public static WannierStarkLadder FindLadder(StructureDefinition structure, int band, int periods, double? fieldKilovoltsPerCentimetre)
    {
        var f = fieldKilovoltsPerCentimetre ?? throw new UsageException("--field is required (kV/cm, e.g. --field 10).");
        Limits.CheckRange("--periods", periods, WannierStarkLadder.MinPeriods, MaxLadderPeriods);
        RefuseNeutralAtoms(structure, "ladder");
        try
        {
            return WannierStarkLadder.Find(structure.Cell, band, periods, f * VoltsPerMetrePerKilovoltPerCentimetre);
        }
        catch (ArgumentOutOfRangeException e) when (e.ParamName is "fieldVoltsPerMetre" or "periods")
        {
            throw new UsageException(e.ParamName == "periods" ? $"--periods: {Common.Describe(e)}" : string.Create(CultureInfo.InvariantCulture,
                $"--field must be above 0 and at most {LadderLimit(structure, band):R} kV/cm (eFd up to the gap above band {band}); got {f:R}."));
        }
        catch (ArgumentException e) when (e is not ArgumentOutOfRangeException)
        {
            // The cell cannot be put under bias (non-parabolic layers, smooth segments): say so in terms of the ladder, not a bias.
            throw new UsageException($"the ladder puts {Common.Plural(periods, "period")} of the cell under the field, which needs parabolic layers and delta barriers: {Common.Describe(e)}");
        }
    }

    /// <summary>Drift and ladder are for charged carriers: an optical-lattice file holds neutral atoms, which an electric field does not tilt.</summary>
    public static void RefuseNeutralAtoms(StructureDefinition structure, string what)
    {
        if (structure.OpticalLattice is not null)
        {
            throw new UsageException($"{what} applies an electric field to charged carriers; {Common.Printable(structure.SourceName)} is an optical lattice of neutral atoms "
                + "(a tilt by gravity or another force is not modelled).");
        }
    }

    /// <summary>The central spacing in meV, or why no pair of middle rungs eFd apart was found.</summary>
    private static string CentralSpacing(StructureDefinition structure, WannierStarkLadder ladder)
    {
        if (double.IsFinite(ladder.CentralSpacingElectronVolts))
        {
            return string.Create(CultureInfo.InvariantCulture, $"{ladder.CentralSpacingElectronVolts * 1e3:G10} meV");
        }
        // The rungs localise over the Bloch amplitude Δ/(eF); a stack shorter than that holds no ladder in its middle.
        var band = BandStructure.Compute(structure.Cell, ladder.BandIndex).GetBand(ladder.BandIndex);
        var amplitude = band.WidthElectronVolts / (ladder.FieldVoltsPerMetre * 1e-9);
        var length = ladder.Periods * ladder.PeriodNanometres;
        return string.Create(CultureInfo.InvariantCulture,
            $"not found (no two rungs eFd apart in the middle third: the Bloch amplitude width/eF = {amplitude:G4} nm {(amplitude > length / 3 ? ">" : "<=")} a third of the {length:G6} nm stack; raise --field or --periods)");
    }

    private static double LadderLimit(StructureDefinition structure, int n) =>
        BandStructure.Compute(structure.Cell, n).GetBand(n).GapAboveElectronVolts / (structure.Cell.Period.Nanometres * 1e-9) / VoltsPerMetrePerKilovoltPerCentimetre;

    private static string RenderLadder(StructureDefinition structure, WannierStarkLadder ladder, OutputFormat format)
    {
        bool Middle(Resonance r) => r.EnergyElectronVolts >= ladder.MiddleLowerElectronVolts && r.EnergyElectronVolts <= ladder.MiddleUpperElectronVolts;
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                Common.Units(w, ("energy", "eV"), ("width", "eV"), ("field", "kV/cm"), ("blochFrequency", "Hz"));
                w.WriteNumber("band", ladder.BandIndex);
                w.WriteNumber("periods", ladder.Periods);
                w.Number("field", ladder.FieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre);
                w.Number("bias", ladder.BiasElectronVolts);
                w.Number("spacing", ladder.SpacingElectronVolts);
                w.Number("centralSpacing", ladder.CentralSpacingElectronVolts);
                w.Number("blochFrequency", ladder.BlochFrequencyHertz);
                w.WriteStartArray("rungs");
                foreach (var rung in ladder.Rungs)
                {
                    w.WriteStartObject();
                    w.Number("energy", rung.EnergyElectronVolts);
                    w.Number("energyError", rung.EnergyErrorElectronVolts);
                    w.Number("width", rung.WidthElectronVolts);
                    w.Number("log10PeakTransmission", rung.LogPeakTransmission / Math.Log(10));
                    w.WriteBoolean("middle", Middle(rung));
                    w.WriteEndObject();
                }
                w.WriteEndArray();
                w.WriteString("model", LadderLimits);
            });
        }
        // CSV in the JSON's units at full precision; "middle" marks the rungs of the stack's middle third, where the spacing is eFd.
        var table = new Table(new Column("energy", "eV", Format: "R"), new Column("width", "eV", Format: "G4"), new Column("log10 peak T", Format: "F2"), new Column("middle"));
        foreach (var rung in ladder.Rungs)
        {
            table.Add(rung.EnergyElectronVolts, rung.WidthElectronVolts, rung.LogPeakTransmission / Math.Log(10), Middle(rung));
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        var summary = string.Create(CultureInfo.InvariantCulture,
            $"band {ladder.BandIndex}, {ladder.Periods} periods, F = {ladder.FieldVoltsPerMetre / VoltsPerMetrePerKilovoltPerCentimetre:G8} kV/cm: eFd = {ladder.SpacingElectronVolts * 1e3:G10} meV, central spacing {CentralSpacing(structure, ladder)}, Bloch frequency {ladder.BlochFrequencyHertz * 1e-12:G8} THz\n");
        return Common.TableTitle(structure) + summary + "\n" + table.ToText() + "\n" + LadderLimits + "\n";
    }
}
