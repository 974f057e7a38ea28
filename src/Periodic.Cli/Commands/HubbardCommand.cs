// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Output;
using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Units;
using ScottPlot;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>hubbard FILE</c>: Wannier functions and Bose–Hubbard parameters (J, U, U/J against the Mott transition, the gap
/// and ħ/gap) of an optical-lattice file, at its depth or over a scan of depths; a plot of w(x) and |w(x)|².
/// </summary>
internal static class HubbardCommand
{
    private const int MaxScanDepths = 2000; // each depth is a full Wannier calculation (≈ 0.1 s): a bound on run time

    public static Command Create()
    {
        var file = Common.FileArgument();
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = new Option<string?>("--out", "-o") { Description = "Write to this file (atomically) instead of standard output." };
        var scattering = new Option<string?>("--scattering-length", "-a")
        {
            Description = "s-wave scattering length: a number in Bohr radii, or with a unit (\"100 a0\", \"5.3 nm\"). Required.",
        };
        var geometry = new Option<string>("--geometry")
        {
            Description = "cubic: a 3D simple-cubic lattice of three equal standing waves (default); tubes: this 1D lattice with transverse harmonic confinement (give --transverse-frequency).",
            DefaultValueFactory = _ => "cubic",
        };
        var transverse = Common.NumberOption("--transverse-frequency", "Hz", "30000", "Transverse trap frequency ω⊥/2π of --geometry tubes, Hz.");
        var bands = new Option<int>("--bands") { Description = "Number of bands to describe, from the lowest (1 to 10); each must be isolated.", DefaultValueFactory = _ => 1 };
        var depths = new Option<string?>("--depths")
        {
            Description = "Depth scan of the lowest band, in recoil energies (above 0, at most 190): FROM:TO:STEP (e.g. 5:30:1) or a list 5,10,20. Replaces the file's depth; not with --bands.",
        };
        var unit = new Option<string>("--unit")
        {
            Description = "Energy unit of the table and CSV: recoil (E_R, default), kHz (E/h) or eV. JSON is always in eV.",
            DefaultValueFactory = _ => "recoil",
        };
        var plot = new Option<string?>("--plot") { Description = "Also draw to this .png or .svg file: w(x) and |w(x)|² of the lowest band, or with --depths J, U, the gap and U/J against the depth." };
        var sites = Common.NumberOption("--sites", "sites", "3", "Half-width of the --plot window in lattice sites (default 3).");
        var command = new Command("hubbard",
            "Wannier functions and Hubbard parameters of an optical lattice: tunnelling J1..J3, on-site integral, U, U/J against the superfluid-Mott transition, the gap to the next band and hbar/gap.");
        command.Arguments.Add(file);
        foreach (var option in new Option[] { scattering, geometry, transverse, bands, depths, unit, plot, sites, json, csv, output })
        {
            command.Options.Add(option);
        }
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var displayUnit = DisplayUnits.ParseLatticeUnit(result.GetValue(unit)!);
            var count = Common.CheckCount(result.GetValue(bands), "--bands", 10);
            var a = ParseScatteringLength(result.GetValue(scattering));
            var confinement = ParseGeometry(result.GetValue(geometry)!, result.GetValue(transverse));
            var scan = result.GetValue(depths) is { } text ? ParseDepths(text) : null;
            var window = result.GetValue(sites) ?? 3;
            if (!(window > 0 && window <= 50))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--sites must be above 0 and at most 50 lattice sites; got {window:R}."));
            }
            if (scan is not null && count > 1)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--bands {count} cannot be combined with --depths: a depth scan describes the lowest band only; leave out --bands, or give one depth in the file."));
            }
            var plotPath = result.GetValue(plot);
            var extension = plotPath is null ? "" : Path.GetExtension(plotPath).ToLowerInvariant();
            if (plotPath is not null && extension is not ".png" and not ".svg")
            {
                throw new UsageException($"--plot {plotPath}: the file name must end in .png or .svg.");
            }
            var structure = Common.Load(result, result.GetValue(file)!);
            var lattice = structure.OpticalLattice ?? throw new UsageException(
                $"{structure.SourceName} does not describe an optical lattice; hubbard needs a file with \"opticalLattice\": {{\"wavelength\": ..., \"depth\": ..., \"species\": ...}} (see docs/cold-atoms.md).");
            foreach (var depth in scan ?? [lattice.DepthInRecoilEnergies])
            {
                CheckTunnellingResolved(depth, scan is null ? "opticalLattice.depth" : "--depths");
            }
            var scanned = scan is null ? null : Scan(lattice, scan, confinement, a);
            var text2 = scanned is null
                ? Render(structure, lattice, Describe(lattice, confinement, a, count), format, displayUnit)
                : RenderScan(structure, lattice, scanned, format, displayUnit);
            if (plotPath is not null)
            {
                // A depth scan is drawn as J, U, gap and U/J against s; a single depth as its Wannier function.
                var picture = scanned is null
                    ? Draw(lattice, HubbardParameters.Compute(lattice, confinement, a).Wannier, window)
                    : DrawScan(structure, lattice, scanned, DisplayUnits.Lattice(lattice, displayUnit));
                PlotCommand.Save(picture, plotPath, extension, 900, 560);
            }
            Common.Emit(text2, result.GetValue(output));
            if (plotPath is not null)
            {
                Console.Error.WriteLine($"wrote {plotPath}");
            }
            return 0;
        });
        return command;
    }

    internal static Length ParseScatteringLength(string? text)
    {
        if (text is null)
        {
            throw new UsageException("--scattering-length is required (e.g. --scattering-length 100 for 100 Bohr radii, or \"5.3 nm\").");
        }
        var trimmed = text.Trim();
        var factor = PhysicalConstants.BohrRadiusNanometres;
        foreach (var (suffix, scale) in new[] { ("a0", PhysicalConstants.BohrRadiusNanometres), ("nm", 1.0) })
        {
            if (trimmed.EndsWith(suffix, StringComparison.OrdinalIgnoreCase))
            {
                trimmed = trimmed[..^suffix.Length].Trim();
                factor = scale;
                break;
            }
        }
        if (!double.TryParse(trimmed, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) || !double.IsFinite(value) || !double.IsFinite(value * factor))
        {
            throw new UsageException($"--scattering-length \"{text}\" is not a finite length; give a number of Bohr radii (100), or \"100 a0\" or \"5.3 nm\".");
        }
        return Length.FromNanometres(value * factor);
    }

    internal static TransverseConfinement ParseGeometry(string text, double? frequency)
    {
        switch (text.ToLowerInvariant())
        {
            case "cubic":
                if (frequency is not null)
                {
                    throw new UsageException("--transverse-frequency applies only to --geometry tubes (a cubic lattice is confined by its own standing waves).");
                }
                return TransverseConfinement.CubicLattice;
            case "tubes":
                if (frequency is not { } f || !(f > 0))
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                        $"--geometry tubes needs --transverse-frequency, a positive frequency in Hz; got {(frequency is null ? "none" : frequency.Value.ToString("R", CultureInfo.InvariantCulture))}."));
                }
                return TransverseConfinement.Harmonic(f);
            default:
                throw new UsageException($"--geometry \"{text}\" is not known; use cubic or tubes.");
        }
    }

    /// <summary>The deepest lattice whose tunnelling is resolved, in recoil energies (see <see cref="CheckTunnellingResolved"/>).</summary>
    internal const double MaxDepth = 190;

    /// <summary>
    /// Refuses a depth at which J is lost in the rounding of the band energies. The deep-lattice form
    /// J/E_R ≈ (4/√π)s^{3/4}e^{−2√s} (an overestimate) falls below 1e-10 near s = 190, where the band lies ≈ 14 E_R up:
    /// J would be known to a few parts in 1e5 at best, and deeper it is rounding noise (negative J, U/J of 1e15) and the
    /// Wannier construction no longer converges.
    /// </summary>
    private static void CheckTunnellingResolved(double depth, string name)
    {
        if (depth > MaxDepth)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{name}: s = {depth:R} E_R is too deep for hubbard (at most {MaxDepth:R} E_R): there J ≈ (4/√π)s^(3/4)e^(-2√s) E_R falls below 1e-10 E_R, lost in the rounding of the band energies."));
        }
    }

    /// <summary>FROM:TO:STEP (ends included) or a comma-separated list, each depth positive.</summary>
    private static double[] ParseDepths(string text)
    {
        var parts = text.Split(':', StringSplitOptions.TrimEntries);
        double[] values;
        if (parts.Length == 3)
        {
            var numbers = parts.Select(p => double.TryParse(p, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && double.IsFinite(v) ? v : double.NaN).ToArray();
            if (numbers.Any(double.IsNaN) || !(numbers[2] > 0) || !(numbers[1] >= numbers[0]))
            {
                throw new UsageException($"--depths \"{text}\": FROM:TO:STEP needs finite numbers with TO ≥ FROM and STEP > 0 (e.g. 5:30:1).");
            }
            var steps = Math.Floor((numbers[1] - numbers[0]) / numbers[2] * (1 + 1e-12)) + 1;
            if (steps > MaxScanDepths)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--depths \"{text}\" asks for {steps:R} depths; at most {MaxScanDepths} per call (each is a full Wannier calculation)."));
            }
            values = Enumerable.Range(0, (int)steps).Select(i => numbers[0] + i * numbers[2]).ToArray();
        }
        else
        {
            var items = text.Split(',', StringSplitOptions.TrimEntries);
            if (items.Length > MaxScanDepths)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--depths lists {items.Length} depths; at most {MaxScanDepths} per call."));
            }
            values = new double[items.Length];
            for (var i = 0; i < items.Length; i++)
            {
                if (!double.TryParse(items[i], NumberStyles.Float, CultureInfo.InvariantCulture, out values[i]) || !double.IsFinite(values[i]))
                {
                    throw new UsageException($"--depths: item {i + 1} \"{items[i]}\" is not a number (depths in recoil energies: FROM:TO:STEP or a list 5,10,20).");
                }
            }
        }
        foreach (var s in values)
        {
            if (!(s > 0))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--depths: every depth must be positive (s > 0, in recoil energies); got {s:R}."));
            }
        }
        return values;
    }

    private static HubbardParameters[] Describe(OpticalLattice lattice, TransverseConfinement confinement, Length a, int count)
    {
        var results = new HubbardParameters[count];
        for (var n = 1; n <= count; n++)
        {
            results[n - 1] = WithOption("--bands", () => HubbardParameters.Compute(lattice, confinement, a, n));
        }
        return results;
    }

    private static IReadOnlyList<HubbardParameters> Scan(OpticalLattice lattice, double[] depths, TransverseConfinement confinement, Length a)
    {
        using var progress = new Progress("hubbard", depths.Length);
        var results = new HubbardParameters[depths.Length];
        for (var i = 0; i < depths.Length; i++)
        {
            var s = depths[i];
            results[i] = WithOption("--depths", () => HubbardParameters.Compute(lattice.WithDepth(s), confinement, a));
            progress.Report(i + 1);
        }
        return results;
    }

    /// <summary>Names the option whose value led to a library argument error (e.g. a band that is not isolated).</summary>
    private static T WithOption<T>(string option, Func<T> action)
    {
        try
        {
            return action();
        }
        catch (ArgumentException e)
        {
            throw new UsageException($"{option}: {Common.Describe(e)}");
        }
    }

    private static (double Factor, string Name) Energy(OpticalLattice lattice, LatticeEnergyUnit unit) => unit switch
    {
        LatticeEnergyUnit.Recoil => (1 / lattice.RecoilEnergy.ElectronVolts, "E_R"),
        LatticeEnergyUnit.Kilohertz => (OpticalLattice.ToHertz(1) / 1e3, "kHz"),
        _ => (1.0, "eV"),
    };

    private static string Header(OpticalLattice lattice, HubbardParameters first)
    {
        var er = lattice.RecoilEnergy.ElectronVolts;
        return string.Create(CultureInfo.InvariantCulture,
            $"{lattice.Species.Name} ({lattice.Species.MassAtomicMassUnits:G10} u) in a {lattice.Wavelength.Nanometres:G8} nm lattice (period {lattice.LatticePeriod.Nanometres:G8} nm), E_R = h x {OpticalLattice.ToHertz(er) / 1e3:G6} kHz = {er:G6} eV\n"
            + $"{first.Confinement}, a_s = {first.ScatteringLengthNanometres:G6} nm ({first.ScatteringLengthNanometres / PhysicalConstants.BohrRadiusNanometres:G6} a0); (U/J)c = {first.CriticalRatio:G4} ({first.CriticalRatioSource})\n");
    }

    private const string Limits =
        "Single atom in a perfect lattice: no harmonic trap envelope; the one-band Hubbard model holds only when the gap is much larger than U and kT. "
        + "(U/J)/(U/J)c is given for the lowest band with repulsive U only (n/a otherwise): the critical value is that band's superfluid-Mott point at unit filling.\n";

    /// <summary>
    /// (U/J)/(U/J)c where it means something: the critical ratios are those of the superfluid–Mott transition of repulsive
    /// bosons in the lowest band at unit filling, so a higher band (whose J alternates in sign) or an attractive U has none.
    /// </summary>
    private static double? MottRatio(HubbardParameters r) => r.BandIndex == 1 && r.InteractionElectronVolts > 0 ? r.RatioToCritical : null;

    /// <summary>Above this |J2/J1| the nearest-neighbour Hubbard model is noted as a rough guide (reached near s = 5 E_R).</summary>
    internal const double NextNearestNote = 0.05;

    /// <summary>Above this U/gap the single-band model is noted as a first estimate.</summary>
    internal const double InteractionGapNote = 0.1;

    /// <summary>
    /// Lines naming the rows (bands or depths) where the table's own numbers leave the model's range: next-nearest
    /// tunnelling that is not negligible (shallow lattices, higher bands), or U not small against the gap above.
    /// </summary>
    private static string ValidityNotes(IReadOnlyList<HubbardParameters> rows, Func<HubbardParameters, string> name)
    {
        var notes = new System.Text.StringBuilder();
        var shallow = rows.Where(r => Math.Abs(r.Wannier.HoppingElectronVolts[1] / r.Wannier.HoppingElectronVolts[0]) > NextNearestNote).ToList();
        if (shallow.Count > 0)
        {
            var worst = shallow.Max(r => Math.Abs(r.Wannier.HoppingElectronVolts[1] / r.Wannier.HoppingElectronVolts[0]));
            notes.Append(string.Create(CultureInfo.InvariantCulture,
                $"Note: |J2/J1| is above {NextNearestNote:R} (up to {worst:G2}) at {string.Join(", ", shallow.Select(name))}: next-nearest tunnelling is not negligible, so a nearest-neighbour Hubbard model (J = J1) is a rough guide there (tight binding needs a deeper lattice, s above about 5 E_R for the lowest band).\n"));
        }
        var strong = rows.Where(r => Math.Abs(r.InteractionElectronVolts / r.GapAboveElectronVolts) > InteractionGapNote).ToList();
        if (strong.Count > 0)
        {
            var worst = strong.Max(r => Math.Abs(r.InteractionElectronVolts / r.GapAboveElectronVolts));
            notes.Append(string.Create(CultureInfo.InvariantCulture,
                $"Note: |U| is above {InteractionGapNote:R} of the gap above (up to {worst:G2} of it) at {string.Join(", ", strong.Select(name))}: the single-band model needs U much smaller than the gap; take these numbers as a first estimate.\n"));
        }
        return notes.ToString();
    }

    public static string Render(StructureDefinition structure, OpticalLattice lattice, HubbardParameters[] results, OutputFormat format, LatticeEnergyUnit unit)
    {
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                WriteLattice(w, lattice, results[0]);
                w.WriteStartArray("bands");
                foreach (var r in results)
                {
                    w.WriteStartObject();
                    w.WriteNumber("index", r.BandIndex);
                    WriteBand(w, r);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var (f, name) = Energy(lattice, unit);
        // The CSV carries the table's units (named in each header) at full round-trip precision; the text table rounds.
        var table = new Table(new Column("band"), new Column("J1", name, Format: "G6"), new Column("J2", name, Format: "G4"), new Column("J3", name, Format: "G4"),
            new Column("int |w|^4 dx", "1/nm", Format: "G8"), new Column("spread", "nm", Format: "G6"), new Column("U", name, Format: "G6"), new Column("U/J", Format: "G6"),
            new Column("(U/J)/(U/J)c", Format: "G4"), new Column("gap above", name, Format: "G6"), new Column("hbar/gap", "ms", Format: "G4"));
        foreach (var r in results)
        {
            var j = r.Wannier.HoppingElectronVolts;
            table.Add(r.BandIndex, j[0] * f, j[1] * f, j[2] * f, r.Wannier.OnSiteIntegralPerNanometre, Math.Sqrt(r.Wannier.SpreadNanometresSquared),
                r.InteractionElectronVolts * f, r.InteractionToTunnellingRatio, MottRatio(r) is { } m ? m : (Cell)(format == OutputFormat.Csv ? "" : "n/a"),
                r.GapAboveElectronVolts * f, r.AdiabaticTimeSeconds * 1e3);
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        return Header(lattice, results[0]) + string.Create(CultureInfo.InvariantCulture, $"depth s = {lattice.DepthInRecoilEnergies:G6} E_R\n\n") + table.ToText() + "\n" + Limits
            + ValidityNotes(results, r => string.Create(CultureInfo.InvariantCulture, $"band {r.BandIndex}"));
    }

    public static string RenderScan(StructureDefinition structure, OpticalLattice lattice, IReadOnlyList<HubbardParameters> results, OutputFormat format, LatticeEnergyUnit unit)
    {
        if (format == OutputFormat.Json)
        {
            return Common.Json(w =>
            {
                Common.StructureHeader(w, structure);
                WriteLattice(w, lattice, results[0]);
                w.WriteStartArray("scan");
                foreach (var r in results)
                {
                    w.WriteStartObject();
                    w.WriteNumber("depth", r.Lattice.DepthInRecoilEnergies);
                    w.WriteNumber("index", r.BandIndex);
                    WriteBand(w, r);
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            });
        }
        var (f, name) = Energy(lattice, unit);
        var table = new Table(new Column("s", "E_R", Format: "G6"), new Column("J", name, Format: "G6"), new Column("U", name, Format: "G6"), new Column("U/J", Format: "G6"),
            new Column("(U/J)/(U/J)c", Format: "G4"), new Column("gap above", name, Format: "G6"), new Column("hbar/gap", "ms", Format: "G4"));
        foreach (var r in results)
        {
            table.Add(r.Lattice.DepthInRecoilEnergies, r.TunnellingElectronVolts * f, r.InteractionElectronVolts * f, r.InteractionToTunnellingRatio,
                MottRatio(r) is { } m ? m : (Cell)(format == OutputFormat.Csv ? "" : "n/a"), r.GapAboveElectronVolts * f, r.AdiabaticTimeSeconds * 1e3);
        }
        if (format == OutputFormat.Csv)
        {
            return table.ToCsv();
        }
        return Header(lattice, results[0]) + "lowest band\n\n" + table.ToText() + "\n" + Limits
            + ValidityNotes(results, r => string.Create(CultureInfo.InvariantCulture, $"s = {r.Lattice.DepthInRecoilEnergies:G6} E_R"));
    }

    private static void WriteLattice(System.Text.Json.Utf8JsonWriter w, OpticalLattice lattice, HubbardParameters first)
    {
        Common.Units(w, ("energy", "eV"), ("wannierIntegral", "1/nm"), ("spread", "nm^2"), ("length", "nm"), ("time", "s"), ("frequency", "Hz"), ("mass", "u"));
        w.WriteNumber("recoilEnergy", lattice.RecoilEnergy.ElectronVolts);
        w.WriteNumber("recoilFrequency", OpticalLattice.ToHertz(lattice.RecoilEnergy.ElectronVolts));
        w.WriteString("species", lattice.Species.Name);
        w.WriteNumber("mass", lattice.Species.MassAtomicMassUnits);
        w.WriteNumber("wavelength", lattice.Wavelength.Nanometres);
        w.WriteNumber("depth", lattice.DepthInRecoilEnergies);
        w.WriteString("geometry", first.Confinement.IsCubicLattice ? "cubic" : "tubes");
        if (!first.Confinement.IsCubicLattice)
        {
            w.WriteNumber("transverseFrequency", first.Confinement.FrequencyHertz);
        }
        w.WriteNumber("scatteringLength", first.ScatteringLengthNanometres);
        w.WriteNumber("criticalRatio", first.CriticalRatio);
        w.WriteString("criticalRatioSource", first.CriticalRatioSource);
    }

    private static void WriteBand(System.Text.Json.Utf8JsonWriter w, HubbardParameters r)
    {
        var wannier = r.Wannier;
        w.WriteStartArray("hopping");
        foreach (var j in wannier.HoppingElectronVolts)
        {
            w.WriteNumberValue(j);
        }
        w.WriteEndArray();
        w.Number("meanEnergy", wannier.MeanEnergyElectronVolts);
        w.Number("wannierIntegral", wannier.OnSiteIntegralPerNanometre);
        w.Number("spread", wannier.SpreadNanometresSquared);
        w.Number("interaction", r.InteractionElectronVolts);
        w.Number("interactionOverTunnelling", r.InteractionToTunnellingRatio);
        if (MottRatio(r) is { } mott)
        {
            w.Number("ratioToCritical", mott);
        }
        else
        {
            w.WriteNull("ratioToCritical");
        }
        w.Number("gapAbove", r.GapAboveElectronVolts);
        w.Number("adiabaticTime", r.AdiabaticTimeSeconds);
        w.WriteStartObject("accuracy");
        w.WriteNumber("kPoints", wannier.KPointCount);
        w.Number("normalisationError", wannier.NormalisationError);
        w.Number("maxTranslateOverlap", wannier.MaxTranslateOverlap);
        w.Number("tailRatio", wannier.TailRatio);
        w.WriteEndObject();
    }

    /// <summary>
    /// A depth scan: J, U and the gap above the band (log scale, left axis, in <paramref name="unit"/>) and U/J (log scale, right
    /// axis) against s, with the superfluid–Mott critical value dashed on the right axis.
    /// </summary>
    private static Plot DrawScan(StructureDefinition structure, OpticalLattice lattice, IReadOnlyList<HubbardParameters> results, EnergyUnit unit)
    {
        var s = results.Select(r => r.Lattice.DepthInRecoilEnergies).ToArray();
        var plot = PlotCommand.NewPlot($"Hubbard parameters against depth: {structure.Name}", "lattice depth s (E_R)", $"J, U, gap above ({unit.Symbol}, log scale)");
        var tickLabels = new ScottPlot.TickGenerators.NumericAutomatic
        {
            // Ticks at log10 values, labelled with the value itself to two digits (0.032, 1, 630).
            LabelFormatter = v => Plain(double.Parse(Math.Pow(10, v).ToString("G2", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture)),
        };
        var rightLabels = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = tickLabels.LabelFormatter };
        plot.Axes.Left.TickGenerator = tickLabels;
        plot.Axes.Right.TickGenerator = rightLabels;
        plot.Axes.Right.Label.Text = "U/J (log scale)";
        plot.Axes.Right.Label.FontSize = 14;
        void Curve(double[] values, string label, Color color, bool right)
        {
            var line = plot.Add.Scatter(s, values.Select(Math.Log10).ToArray());
            line.LegendText = label;
            line.Color = color;
            line.LineWidth = 2;
            line.MarkerSize = s.Length > 60 ? 0 : 5;
            if (right)
            {
                line.Axes.YAxis = plot.Axes.Right;
                line.LinePattern = LinePattern.Dashed;
            }
        }
        Curve([.. results.Select(r => unit.From(r.TunnellingElectronVolts))], "J", Colors.SteelBlue, false);
        Curve([.. results.Select(r => unit.From(r.InteractionElectronVolts))], "U", Colors.DarkOrange, false);
        Curve([.. results.Select(r => unit.From(r.GapAboveElectronVolts))], "gap above", Colors.Gray, false);
        Curve([.. results.Select(r => r.InteractionToTunnellingRatio)], "U/J (right axis)", Colors.DarkRed, true);
        var critical = plot.Add.HorizontalLine(Math.Log10(results[0].CriticalRatio));
        critical.Axes.YAxis = plot.Axes.Right;
        critical.Color = Colors.DarkRed.WithAlpha(0.5);
        critical.LinePattern = LinePattern.Dotted;
        critical.LegendText = string.Create(CultureInfo.InvariantCulture, $"(U/J)c = {results[0].CriticalRatio:G4}");
        plot.ShowLegend(Alignment.UpperLeft);
        return plot;
    }

    /// <summary>A tick value without an exponent where it has at most five digits (1600, 0.0032), else in E notation.</summary>
    private static string Plain(double value) => value is >= 1e-4 and < 1e5
        ? value.ToString("0.#####", CultureInfo.InvariantCulture)
        : value.ToString("G2", CultureInfo.InvariantCulture);

    private static Plot Draw(OpticalLattice lattice, WannierFunction wannier, double sites)
    {
        var d = wannier.PeriodNanometres;
        var (x, w) = wannier.Window(sites);
        var xs = x.Select(v => v / d).ToArray();
        // w in units of 1/√d and |w|² in 1/d, so both are of order one whatever the wavelength.
        var scaled = w.Select(v => v * Math.Sqrt(d)).ToArray();
        var density = w.Select(v => v * v * d).ToArray();
        var plot = PlotCommand.NewPlot(
            string.Create(CultureInfo.InvariantCulture, $"Wannier function, band {wannier.BandIndex}: {lattice.Species.Name}, {lattice.Wavelength.Nanometres:G6} nm, s = {lattice.DepthInRecoilEnergies:G4} E_R"),
            "position x / d (lattice sites)", "w(x) sqrt(d),  |w(x)|^2 d");
        var line = plot.Add.ScatterLine(xs, scaled);
        line.LegendText = "w(x)";
        line.LineWidth = 2;
        var dens = plot.Add.ScatterLine(xs, density);
        dens.LegendText = "|w(x)|^2";
        dens.LineWidth = 2;
        for (var site = -(int)Math.Floor(sites); site <= (int)Math.Floor(sites); site++)
        {
            var marker = plot.Add.VerticalLine(site);
            marker.Color = Colors.Gray.WithAlpha(0.4);
            marker.LinePattern = LinePattern.Dotted;
        }
        plot.ShowLegend(Alignment.UpperRight);
        return plot;
    }
}
