// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Structures;
using ScottPlot;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>plot FILE --out PATH</c>: pictures of a structure. Energy is always the vertical axis so the
/// pictures line up: E(k) over the whole first zone with the gaps shaded; the DOS with the gaps
/// shaded; the potential profile over a few periods with the minibands drawn across it; T(E).
/// </summary>
internal static class PlotCommand
{
    private static readonly string[] Kinds = ["dispersion", "dos", "profile", "transmission", "stack", "iv", "in-plane", "drift", "ladder"];
    // Properties, not static fields: a field of a ScottPlot type would load the plotting library whenever the
    // command line is built, slowing every other command's start.
    private static Color GapColor => Color.FromHex("#F2C7C7").WithAlpha(0.55);
    private static Color BandColor => Color.FromHex("#9FC5E8").WithAlpha(0.55);
    private static Color LineColor => Color.FromHex("#1F4E79");
    private static Color ProfileColor => Color.FromHex("#404040");

    public static Command Create()
    {
        var file = Common.FileArgument();
        var output = new Option<string>("--out", "-o") { Description = "Image file to write: .png or .svg.", Required = true };
        var show = new Option<string>("--show", "-s")
        {
            Description = "What to draw: dispersion (E(k), gaps shaded), dos, profile (V(x) of the cell with the minibands), transmission (T(E), log scale), "
                + "stack (the stack's V(x) under the bias, bound states with |psi|^2 and transmission peaks at their energies), iv (current density from 0 to the bias), "
                + "in-plane (miniband edges against k∥ up to --in-plane-wavevector, default 1 /nm), drift (drift velocity against field; needs --scattering-time) "
                + "or ladder (the Wannier-Stark rungs over the tilted miniband; needs --field).",
            DefaultValueFactory = _ => "dispersion",
        };
        show.AcceptOnlyFromAmong(Kinds);
        var count = Common.CountOption(3);
        var periods = new Option<int?>("--periods", "-N") { Description = "Periods drawn in the profile (default 3); for transmission, stack and iv: N periods of the cell instead of the file's stack (default: the file's stack, else 10 periods); for ladder: periods of the biased stack (8 to 400, default 30)." };
        var fermi = Common.NumberOption("--fermi-level", "eV", "0.02", "For iv: Fermi level of the left contact, eV.");
        var temperature = Common.NumberOption("--temperature", "K", "77",
            "For iv: temperature, K (default: the file's temperature for a cell of material layers). For drift: temperature of the occupation, K (default 0).");
        var band = new Option<int?>("--band") { Description = "For drift and ladder: the miniband, from 1 (default 1)." };
        var tau = Common.NumberOption("--scattering-time", "ps", "0.1", "For drift: relaxation time tau, ps (1e-6 to 1e6).");
        var maxField = Common.NumberOption("--max-field", "kV/cm", "20", "For drift: right end of the field axis, kV/cm (default: 4 times the peak field, at most the single-miniband limit).");
        var field = Common.NumberOption("--field", "kV/cm", "10", "For ladder: the uniform field, kV/cm (above 0, eFd at most the gap above the band).");
        var grid = new EnergyGridOptions();
        var bias = TransmissionCommand.BiasOption();
        var width = new Option<int>("--width") { Description = "Image width, pixels.", DefaultValueFactory = _ => 900 };
        var height = new Option<int>("--height") { Description = "Image height, pixels.", DefaultValueFactory = _ => 600 };
        var command = new Command("plot", "Draw a picture to a PNG or SVG file: E(k), the DOS, the potential profile with its minibands, T(E), a stack with its levels, "
            + "the I-V curve, the minibands against k∥, the drift velocity against field or the Wannier-Stark ladder (--show).");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        var unitOption = Common.LatticeUnitOption();
        command.Options.Add(inPlane);
        command.Options.Add(output);
        command.Options.Add(show);
        command.Options.Add(count);
        command.Options.Add(periods);
        grid.AddTo(command);
        command.Options.Add(bias);
        command.Options.Add(fermi);
        command.Options.Add(temperature);
        command.Options.Add(band);
        command.Options.Add(tau);
        command.Options.Add(maxField);
        command.Options.Add(field);
        command.Options.Add(unitOption);
        command.Options.Add(width);
        command.Options.Add(height);
        command.SetAction(result =>
        {
            var path = result.GetValue(output)!;
            var extension = Path.GetExtension(path).ToLowerInvariant();
            if (extension is not (".png" or ".svg"))
            {
                throw new UsageException($"--out must end in .png or .svg; got \"{path}\".");
            }
            var w = Limits.CheckRange("--width", result.GetValue(width), Limits.MinImageWidth, Limits.MaxImageSize, " pixels");
            var h = Limits.CheckRange("--height", result.GetValue(height), Limits.MinImageHeight, Limits.MaxImageSize, " pixels");
            var n = Common.CheckCount(result.GetValue(count), "--count", 50);
            var kind = result.GetValue(show)!;
            var hasGrid = result.GetValue(grid.From) is not null || result.GetValue(grid.Energies) is not null || result.GetValue(grid.Points) is not null || result.GetValue(grid.To) is not null;
            var energies = hasGrid ? grid.Read(result) : null;
            var p = result.GetValue(periods);
            if (p is { } given && (given < 1 || given > 100_000))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--periods must be between 1 and 100000; got {given}."));
            }
            var u = result.GetValue(bias);
            if (u is not null && kind is not ("transmission" or "stack" or "iv"))
            {
                throw new UsageException($"--bias applies only to --show transmission, stack or iv; got --show {kind}.");
            }
            var mu = result.GetValue(fermi);
            var t = result.GetValue(temperature);
            OnlyFor(result, fermi, "--fermi-level", kind, "iv");
            OnlyFor(result, temperature, "--temperature", kind, "iv", "drift");
            OnlyFor(result, band, "--band", kind, "drift", "ladder");
            OnlyFor(result, tau, "--scattering-time", kind, "drift");
            OnlyFor(result, maxField, "--max-field", kind, "drift");
            OnlyFor(result, field, "--field", kind, "ladder");
            var bandIndex = Common.CheckCount(result.GetValue(band) ?? 1, "--band", 100);
            var driftKelvin = kind == "drift" ? FieldCommands.CheckDriftTemperature(t) : 0;
            var scatteringPs = kind == "drift" ? FieldCommands.CheckScatteringTime(result.GetValue(tau)) : 0;
            if (kind == "ladder")
            {
                _ = result.GetValue(field) ?? throw new UsageException("--show ladder needs --field F (kV/cm, e.g. --field 10).");
                Limits.CheckRange("--periods", p ?? 30, Periodic.Stacks.WannierStarkLadder.MinPeriods, FieldCommands.MaxLadderPeriods);
            }
            if (kind == "iv" && t is { } kelvin && !(kelvin >= StackTransmission.MinCurrentTemperatureKelvin && kelvin <= StackTransmission.MaxCurrentTemperatureKelvin))
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--temperature must be between {StackTransmission.MinCurrentTemperatureKelvin} K and {StackTransmission.MaxCurrentTemperatureKelvin} K; got {kelvin:R}."));
            }
            if (kind == "iv" && mu is null)
            {
                throw new UsageException("--show iv needs --fermi-level E (eV, the left contact's Fermi level).");
            }
            // The stack picture of a doped file shows its stack's own space charge (zero bias); the other pictures the cell's.
            var loaded = kind == "stack"
                ? Common.LoadStack(result, result.GetValue(file)!, "plot --show stack", u, usesBias: true)
                : Common.Load(result, result.GetValue(file)!);
            var latticeUnit = Common.LatticeUnit(result, unitOption, loaded);
            var atInPlane = Common.AtInPlaneWavevector(result, inPlane, loaded); // validates --in-plane-wavevector
            var structure = kind == "in-plane" ? loaded : atInPlane; // there it is the end of the k∥ axis
            if (kind == "profile")
            {
                // Two points per layer, 201 per smooth segment and period.
                var perPeriod = structure.Cell.Elements.Sum(e => e is Layer ? 2L : e is DeltaBarrier ? 0L : 201L);
                Limits.CheckWork("--periods × points per period of the profile", Limits.Product(p ?? 3, perPeriod), Limits.MaxProfilePoints,
                    "a picture at most 8000 pixels wide cannot show more points; draw fewer periods");
            }
            var stackPeriods = p ?? (structure.Stack is null ? 10 : null);
            var plot = kind switch
            {
                "in-plane" => InPlaneEdges(structure, n, result.GetValue(inPlane) ?? 1.0),
                "drift" => Drift(structure, FieldCommands.SetUpDrift(structure, bandIndex, scatteringPs, driftKelvin, result.GetValue(maxField))),
                "ladder" => Ladder(structure, FieldCommands.FindLadder(Common.RequireRigid(result, structure, "plot --show ladder"), bandIndex, p ?? 30, result.GetValue(field))),
                "dispersion" => structure.OpticalLattice is { } lattice
                    ? LatticeOutput.DispersionPlot(structure, lattice, n, DisplayUnits.Lattice(lattice, latticeUnit)) : Dispersion(structure, n),
                "dos" => Dos(structure, n, energies, latticeUnit),
                "profile" => Profile(structure, n, p ?? 3, latticeUnit),
                "stack" => Stack(structure, stackPeriods, TransmissionCommand.ChooseBias(u, structure), latticeUnit),
                "iv" => CurrentVoltage(Common.RequireRigid(result, structure, "plot --show iv"), stackPeriods, IvBias(u, structure), mu!.Value,
                    t ?? structure.Materials?.Temperature.Kelvin ?? throw new UsageException("give --temperature K (the structure file has no material temperature).")),
                _ => Transmission(structure, n, stackPeriods, energies, TransmissionCommand.ChooseBias(u, structure), latticeUnit),
            };
            Save(plot, path, extension, w, h);
            Console.Error.WriteLine($"wrote {Common.Printable(path)}");
            return 0;
        });
        return command;
    }

    /// <summary>Refuses an option given with a --show it does not apply to.</summary>
    private static void OnlyFor<T>(ParseResult result, Option<T> option, string name, string kind, params string[] kinds)
    {
        if (result.GetResult(option) is { Implicit: false } && !kinds.Contains(kind))
        {
            throw new UsageException($"{name} applies only to --show {string.Join(" and ", kinds)}; got --show {kind}.");
        }
    }

    /// <summary>The drift velocity v(F) from 0 to <paramref name="setup"/>'s top field, the peak marked, the critical field ħ/(edτ) dashed.</summary>
    private static Plot Drift(StructureDefinition structure, (Periodic.Properties.MinibandDrift Drift, double Top) setup)
    {
        var (drift, top) = setup;
        const double kvPerCm = 1e5; // V/m
        var fields = FieldCommands.Fields(top, 401);
        var metresPerSecond = fields.Select(f => drift.VelocityAt(f * kvPerCm)).ToArray();
        var largest = metresPerSecond.Select(Math.Abs).Max();
        var (symbol, scale) = largest >= 1e3 ? ("km/s", 1e3) : ("m/s", 1.0);
        var v = metresPerSecond.Select(x => x / scale).ToArray();
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture,
            $"Drift velocity, band {drift.BandIndex}, tau = {drift.ScatteringTimeSeconds * 1e12:G4} ps, T = {drift.TemperatureKelvin:G4} K: {structure.Name}"),
            "Electric field F (kV/cm)", $"Drift velocity v ({symbol})");
        var line = plot.Add.ScatterLine(fields, v);
        line.LineWidth = 2.5f;
        line.Color = LineColor;
        double low = Math.Min(0, v.Min()), high = Math.Max(0, v.Max());
        var range = Math.Max(high - low, double.Epsilon);
        var peakField = drift.PeakFieldVoltsPerMetre / kvPerCm;
        var critical = drift.CriticalFieldVoltsPerMetre / kvPerCm;
        if (critical <= top)
        {
            var fc = plot.Add.VerticalLine(critical);
            fc.Color = Colors.Gray;
            fc.LinePattern = LinePattern.Dashed;
        }
        if (peakField <= top)
        {
            var marker = plot.Add.Marker(peakField, drift.PeakVelocityMetresPerSecond / scale);
            marker.Color = Colors.DarkOrange;
            marker.Size = 10;
            var label = plot.Add.Text(string.Create(CultureInfo.InvariantCulture,
                $"peak {drift.PeakVelocityMetresPerSecond / scale:G4} {symbol} at {peakField:G4} kV/cm"), peakField + 0.02 * top, drift.PeakVelocityMetresPerSecond / scale + 0.04 * range);
            label.LabelFontSize = 12;
        }
        var note = plot.Add.Text(string.Create(CultureInfo.InvariantCulture,
            $"dashed: hbar/(e d tau) = {critical:G4} kV/cm (Esaki-Tsu peak of a cosine band)\none miniband, one relaxation time, uniform field, no field domains: a design guide"),
            top * 0.98, low + 0.03 * range);
        note.LabelFontSize = 11;
        note.LabelAlignment = Alignment.LowerRight;
        note.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
        plot.Axes.SetLimits(0, top, low - 0.05 * range, high + 0.15 * range);
        return plot;
    }

    /// <summary>
    /// The Wannier–Stark ladder over the biased stack: V(x) tilted by the field, the miniband tilted with it (shaded), and each rung
    /// drawn at its energy across the Bloch-oscillation amplitude Δ/(eF) around the place where it lies at the band centre.
    /// </summary>
    private static Plot Ladder(StructureDefinition structure, Periodic.Stacks.WannierStarkLadder ladder)
    {
        var cell = structure.Cell;
        var stack = Periodic.Stacks.LayerStack.Periodic(ladder.Lead, cell, ladder.Periods, ladder.Lead);
        var bias = ladder.BiasElectronVolts;
        var (xs, vs) = StackOptions.Profile(stack, bias);
        var length = stack.Thickness.Nanometres;
        var band = BandStructure.Compute(cell, ladder.BandIndex).GetBand(ladder.BandIndex);
        double bottom = band.BottomElectronVolts, top = band.TopElectronVolts;
        var unit = DisplayUnits.Energy(structure, [bottom - bias, top]);
        var span = top - (bottom - bias);
        double low = bottom - bias - 0.12 * span, high = top + 0.2 * span;
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture,
            $"Wannier-Stark ladder, band {ladder.BandIndex}, F = {ladder.FieldVoltsPerMetre / 1e5:G4} kV/cm, {ladder.Periods} periods: {structure.Name}"),
            "Position x (nm)", $"Energy ({unit.Symbol})");
        var strip = plot.Add.Polygon([0, length, length, 0], [unit.From(bottom), unit.From(bottom - bias), unit.From(top - bias), unit.From(top)]);
        strip.FillStyle.Color = BandColor;
        strip.LineStyle.Width = 0;
        var profile = plot.Add.ScatterLine(xs, vs.Select(unit.From).ToArray());
        profile.LineWidth = 1.5f;
        profile.Color = ProfileColor;
        var centre = 0.5 * (bottom + top);
        var extent = band.WidthElectronVolts * length / bias; // Δ/(eF) in nm
        foreach (var rung in ladder.Rungs)
        {
            var e = rung.EnergyElectronVolts;
            var x0 = (centre - e) * length / bias;
            var middle = e >= ladder.MiddleLowerElectronVolts && e <= ladder.MiddleUpperElectronVolts;
            var segment = plot.Add.Line(Math.Max(0, x0 - 0.5 * extent), unit.From(e), Math.Min(length, x0 + 0.5 * extent), unit.From(e));
            segment.LineWidth = middle ? 2.5f : 1.5f;
            segment.Color = middle ? Colors.DarkOrange : LineColor;
        }
        var note = plot.Add.Text(
            $"{Common.Plural(ladder.Rungs.Count, "rung")} (transmission peaks of the biased stack), each drawn over the Bloch amplitude width/eF; orange: middle third\n"
            + string.Create(CultureInfo.InvariantCulture,
                $"eFd = {unit.From(ladder.SpacingElectronVolts):G6} {unit.Symbol}, central spacing {unit.From(ladder.CentralSpacingElectronVolts):G6} {unit.Symbol}, Bloch frequency {ladder.BlochFrequencyHertz * 1e-12:G4} THz; ")
            + "shaded: the miniband tilted by the field; leads (far below) not drawn",
            0.01 * length, unit.From(low) + 0.02 * unit.From(high - low));
        note.LabelFontSize = 11;
        note.LabelAlignment = Alignment.LowerLeft;
        note.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
        plot.Axes.SetLimits(0, length, unit.From(low), unit.From(high));
        return plot;
    }

    /// <summary>Miniband edges against k∥ (exact, per-layer masses), each band shaded between its bottom and top.</summary>
    private static Plot InPlaneEdges(StructureDefinition structure, int count, double maxWavevector)
    {
        if (!(maxWavevector > 0))
        {
            throw new UsageException("--in-plane-wavevector must be above 0 for --show in-plane (it is the right end of the k∥ axis).");
        }
        const int points = 61;
        var ks = new double[points];
        var bottoms = new double[count][];
        var tops = new double[count][];
        for (var n = 0; n < count; n++)
        {
            bottoms[n] = new double[points];
            tops[n] = new double[points];
        }
        for (var i = 0; i < points; i++)
        {
            ks[i] = maxWavevector * i / (points - 1);
            var edges = Periodic.Properties.InPlaneDispersion.EdgesAt(structure.Cell, count, ks[i]);
            for (var n = 0; n < count; n++)
            {
                bottoms[n][i] = edges[n].BottomElectronVolts;
                tops[n][i] = edges[n].TopElectronVolts;
            }
        }
        var plot = NewPlot($"{structure.Name}: miniband edges against k∥", "in-plane wavevector k∥ (1/nm)", "energy (eV)");
        for (var n = 0; n < count; n++)
        {
            var polygon = plot.Add.Polygon(ks.Concat(ks.Reverse()).ToArray(), bottoms[n].Concat(tops[n].Reverse()).ToArray());
            polygon.FillStyle.Color = BandColor;
            polygon.LineStyle.Width = 0;
            foreach (var edge in new[] { bottoms[n], tops[n] })
            {
                var line = plot.Add.ScatterLine(ks, edge);
                line.LineWidth = 2;
                line.Color = LineColor;
            }
        }
        plot.Add.Text("minibands shaded; per-layer in-plane masses", 0.02 * maxWavevector, tops[count - 1].Max()).LabelFontSize = 12;
        return plot;
    }

    /// <summary>The largest bias of the I–V curve: --bias, else the file's stack.bias; it must not be 0.</summary>
    private static double IvBias(double? option, StructureDefinition structure)
    {
        var (u, source) = TransmissionCommand.ChooseBias(option, structure);
        return u != 0 ? u : throw new UsageException($"--show iv draws J from 0 to the bias: give --bias U (eV); {source} is 0.");
    }

    internal static void Save(Plot plot, string path, string extension, int width, int height)
    {
        if (extension == ".svg")
        {
            OutputFile.WriteText(path, plot.GetSvgXml(width, height));
        }
        else
        {
            var bytes = plot.GetImage(width, height).GetImageBytes(ImageFormat.Png);
            OutputFile.WriteAtomically(path, stream => stream.Write(bytes));
        }
    }

    internal static Plot NewPlot(string title, string xLabel, string yLabel)
    {
        var plot = new Plot();
        // Long titles (structure names are free text) are wrapped after the first ": " rather than cut off.
        var colon = title.IndexOf(": ", StringComparison.Ordinal);
        plot.Title(title.Length > 70 && colon > 0 ? title[..colon] + "\n" + title[(colon + 2)..] : title, size: title.Length > 70 ? 13 : 16);
        plot.XLabel(xLabel, size: 14);
        plot.YLabel(yLabel, size: 14);
        return plot;
    }

    /// <summary>The energy window shown: from the lowest potential to just above the highest band drawn.</summary>
    private static (double Low, double High) EnergyWindow(BandStructure bands, EnergyUnit unit)
    {
        var low = unit.From(Math.Min(bands.Cell.MinimumPotential.ElectronVolts, bands.Bands[0].BottomElectronVolts));
        var high = unit.From(bands.Bands[^1].TopElectronVolts);
        var margin = 0.08 * (high - low);
        return (low - margin, high + margin);
    }

    private static void ShadeGaps(Plot plot, (double Bottom, double Top)[] bands, double left, double right, double low, double high)
    {
        var lower = low;
        foreach (var (bottom, top) in bands)
        {
            Shade(plot, left, right, lower, bottom, GapColor);
            lower = top;
        }
        Shade(plot, left, right, lower, high, GapColor);
    }

    private static void Shade(Plot plot, double left, double right, double bottom, double top, Color color)
    {
        if (!(top > bottom))
        {
            return;
        }
        var rectangle = plot.Add.Rectangle(left, right, bottom, top);
        rectangle.FillStyle.Color = color;
        rectangle.LineStyle.Width = 0;
    }

    /// <summary>The energy unit of a plot's energy axis (DisplayUnits: meV for a superlattice, E_R for cold atoms), so ticks are readable at any magnitude.</summary>
    private static EnergyUnit AxisUnit(StructureDefinition structure, BandStructure bands, LatticeEnergyUnit latticeUnit) =>
        DisplayUnits.Energy(structure, bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts }), latticeUnit);

    /// <summary>A copy of <paramref name="bands"/>' edges in <paramref name="unit"/> for drawing.</summary>
    private static (double Bottom, double Top)[] Edges(BandStructure bands, EnergyUnit unit) =>
        bands.Bands.Select(b => (unit.From(b.BottomElectronVolts), unit.From(b.TopElectronVolts))).ToArray();

    private static Plot Dispersion(StructureDefinition structure, int count)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var unit = AxisUnit(structure, bands, LatticeEnergyUnit.Recoil);
        var (k, e) = DispersionCommand.Compute(bands, 201);
        e = e.Select(band => band.Select(unit.From).ToArray()).ToArray();
        var zone = Math.PI / bands.PeriodNanometres;
        var (low, high) = EnergyWindow(bands, unit);
        var plot = NewPlot($"E(k): {structure.Name}", "Bloch wavevector k (1/nm)", $"Energy E ({unit.Symbol})");
        ShadeGaps(plot, Edges(bands, unit), -zone, zone, low, high);
        // Mirror the grid onto [−π/d, 0]: E(−k) = E(k).
        var mirrored = k.Reverse().Select(x => -x).Concat(k.Skip(1)).ToArray();
        for (var n = 0; n < e.Length; n++)
        {
            var values = e[n].Reverse().Concat(e[n].Skip(1)).ToArray();
            var line = plot.Add.ScatterLine(mirrored, values);
            line.LineWidth = 2.5f;
            line.Color = LineColor;
        }
        var edge1 = plot.Add.VerticalLine(-zone);
        var edge2 = plot.Add.VerticalLine(zone);
        edge1.Color = edge2.Color = Colors.Gray;
        edge1.LinePattern = edge2.LinePattern = LinePattern.Dashed;
        plot.Add.Text("shaded: the gaps between the bands drawn" + (unit.Note is { } note ? "\n" + note : ""), -0.97 * zone, high - 0.02 * (high - low)).LabelFontSize = 12;
        plot.Axes.SetLimits(-zone * 1.02, zone * 1.02, low, high);
        return plot;
    }

    private static Plot Dos(StructureDefinition structure, int count, double[]? energies, LatticeEnergyUnit latticeUnit)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var unit = AxisUnit(structure, bands, latticeUnit);
        // An optical lattice: states per site and energy unit, one state per band and site (the library's g counts two
        // spin states per orbital, as for electrons); any other cell: g in 1/(eV nm), spin included.
        var lattice = structure.OpticalLattice;
        var scale = lattice is null ? 1.0 : 0.5 * unit.ElectronVolts * lattice.LatticePeriod.Nanometres;
        var dosLabel = lattice is null ? "DOS g(E) (1/(eV nm), spin included)" : $"DOS per site (1/{unit.Symbol}; one state per band and site)";
        var (low, high) = EnergyWindow(bands, unit);
        if (energies is not null)
        {
            low = unit.From(energies.Min());
            high = unit.From(energies.Max());
        }
        var plot = NewPlot($"Density of states: {structure.Name}", dosLabel, $"Energy E ({unit.Symbol})");
        // One curve per band, so nothing is drawn across a gap. Without a user grid, each band gets
        // Chebyshev-spaced points (dense near its edges, where g has its 1/sqrt(E - E_edge) divergence).
        var curves = new List<(double[] E, double[] G)>();
        foreach (var band in bands.Bands)
        {
            double[] grid;
            if (energies is null)
            {
                const int points = 400;
                grid = Enumerable.Range(1, points).Select(i => band.CenterElectronVolts - 0.5 * band.WidthElectronVolts * Math.Cos(Math.PI * (i - 0.5) / points)).ToArray();
            }
            else
            {
                grid = energies.Where(e => e > band.BottomElectronVolts && e < band.TopElectronVolts).Order().ToArray();
            }
            if (grid.Length == 0)
            {
                continue;
            }
            var values = DosCommand.Compute(structure, grid);
            curves.Add((grid, values.Select(v => scale * v.Dos).ToArray()));
        }
        // The divergences would flatten the picture: cap the axis at 4x the largest band-centre value.
        var cap = lattice is null ? 1.0 : 0.0;
        foreach (var band in bands.Bands)
        {
            var centre = scale * DosCommand.Compute(structure, [band.CenterElectronVolts])[0].Dos;
            if (double.IsFinite(centre))
            {
                cap = Math.Max(cap, 4 * centre);
            }
        }
        ShadeGaps(plot, Edges(bands, unit), 0, cap * 1.1, low, high);
        foreach (var (e, g) in curves)
        {
            var line = plot.Add.ScatterLine(g.Select(x => Math.Min(x, cap * 1.2)).ToArray(), e.Select(unit.From).ToArray());
            line.LineWidth = 2;
            line.Color = LineColor;
        }
        plot.Add.Text("shaded: the gaps between the bands drawn; g diverges at every band edge (axis capped)" + (unit.Note is { } note ? "\n" + note : ""),
            0.02 * cap, high - 0.02 * (high - low)).LabelFontSize = 12;
        plot.Axes.SetLimits(0, cap, low, high);
        return plot;
    }

    private static Plot Transmission(StructureDefinition structure, int count, int? periods, double[]? energies, (double ElectronVolts, string Source) bias,
        LatticeEnergyUnit latticeUnit)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var unit = AxisUnit(structure, bands, latticeUnit);
        var (lowUnit, highUnit) = EnergyWindow(bands, unit);
        energies ??= Enumerable.Range(0, 3001).Select(i => (lowUnit + (highUnit - lowUnit) * i / 3000.0) * unit.ElectronVolts).ToArray();
        // An optical lattice has no uniform layer to take leads from: its leads are free atoms at the lattice's lowest potential
        // (where the light is off, V = 0), with the atom's mass.
        var lattice = structure.Stack is null ? structure.OpticalLattice : null;
        var (layers, source) = StackOptions.Choose(structure, periods, lattice is null ? null : structure.Cell.MinimumPotential.ElectronVolts,
            lattice?.Species.Mass.ElectronMasses);
        var (stack, results) = TransmissionCommand.Compute(layers, energies, bias);
        var low = unit.From(energies.Min());
        var high = unit.From(energies.Max());
        // log10 T, with closed leads (T = 0 exactly) left out rather than drawn at -infinity.
        var open = results.Where(r => r.IsOpen && double.IsFinite(r.Log10Transmission)).ToArray();
        var x = open.Select(r => unit.From(r.EnergyElectronVolts)).ToArray();
        var y = open.Select(r => r.Log10Transmission).ToArray();
        var floor = y.Length == 0 ? -10 : Math.Max(Math.Floor(y.Min()) - 0.5, -300);
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture, $"Transmission of {StackOptions.Describe(layers)}{(bias.ElectronVolts == 0 ? "" : string.Create(CultureInfo.InvariantCulture, $" at eU = {bias.ElectronVolts:G4} eV"))}: {structure.Name}"), $"Energy E ({unit.Symbol})", "Transmission T (log scale)");
        // Minibands belong to an infinite superlattice: shade them only for a stack of repeated cells at zero bias.
        var periodic = layers.Parts.Count == 1 && layers.Parts[0].IsRepeatedCell && bias.ElectronVolts == 0;
        if (periodic)
        {
            foreach (var (bottom, top) in Edges(bands, unit))
            {
                var strip = plot.Add.Rectangle(bottom, Math.Max(top, bottom + 1e-4 * (high - low)), floor, 0.5);
                strip.FillStyle.Color = BandColor;
                strip.LineStyle.Width = 0;
            }
        }
        var line = plot.Add.ScatterLine(x, y.Select(v => Math.Max(v, floor)).ToArray());
        line.LineWidth = 1.5f;
        line.Color = LineColor;
        // Decade ticks labelled as powers of ten.
        var ticks = new ScottPlot.TickGenerators.NumericAutomatic
        {
            IntegerTicksOnly = true,
            LabelFormatter = v => v == 0 ? "1" : string.Create(CultureInfo.InvariantCulture, $"1e{v:0}"),
        };
        plot.Axes.Left.TickGenerator = ticks;
        var lead = stack.Stack.LeftLead;
        var note = plot.Add.Text(string.Create(CultureInfo.InvariantCulture,
            $"{(periodic ? "shaded: minibands of the infinite superlattice of this cell" : "no shading: the stack is not a plain superlattice at zero bias")}; leads V = {unit.From(lead.Potential.ElectronVolts):G4} {unit.Symbol}, m = {(lattice is null ? lead.Mass.ElectronMasses.ToString("G6", CultureInfo.InvariantCulture) + " m0" : "the atom's mass")}")
            + (unit.Note is { } unitNote ? "\n" + unitNote : ""),
            high - 0.01 * (high - low), floor + 0.02 * (0.5 - floor));
        note.LabelFontSize = 11;
        note.LabelAlignment = Alignment.LowerRight;
        note.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
        plot.Axes.SetLimits(low, high, floor, 0.5);
        return plot;
    }

    /// <summary>
    /// The file's stack (or N periods): V(x) under the bias, the bound states at zero bias drawn at their energies with
    /// |ψ|² on top (scaled to a tenth of the potential range), and the transmission peaks as dashed lines across the stack.
    /// </summary>
    private static Plot Stack(StructureDefinition structure, int? periods, (double ElectronVolts, string Source) bias, LatticeEnergyUnit latticeUnit)
    {
        var (layers, source) = StackOptions.Choose(structure, periods, null, null);
        var (xs, vs) = StackOptions.Profile(layers, bias.ElectronVolts);
        var length = layers.Thickness.Nanometres;
        var leftEdge = layers.LeftLead.Potential.ElectronVolts;
        var rightEdge = layers.RightLead.Potential.ElectronVolts - bias.ElectronVolts;
        var all = vs.Append(leftEdge).Append(rightEdge).ToArray();
        double vMin = all.Min(), vMax = all.Max();
        var unit = DisplayUnits.Energy(structure, all, latticeUnit);
        var range = Math.Max(vMax - vMin, 1e-300);
        var margin = 0.2 * length;
        // x from the rigid stack's left interface, as in the JSON and the rigid picture: a self-consistent stack's lead buffers
        // are drawn at negative positions and beyond the stack's thickness.
        var origin = -(structure.SelfConsistentStack?.BufferNanometres ?? 0);
        var x = new List<double> { -margin, 0 };
        var v = new List<double> { leftEdge, leftEdge };
        x.AddRange(xs);
        v.AddRange(vs);
        x.AddRange([length, length + margin]);
        v.AddRange([rightEdge, rightEdge]);
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture, $"{StackOptions.Describe(layers)}{(bias.ElectronVolts == 0 ? "" : $", eU = {bias.ElectronVolts:G4} eV")}: {structure.Name}"),
            "Position x (nm)", $"Energy ({unit.Symbol})");
        var profile = plot.Add.ScatterLine(x.Select(p => p + origin).ToArray(), v.Select(unit.From).ToArray());
        profile.LineWidth = 2.5f;
        profile.Color = ProfileColor;
        var notes = new List<string>();
        if (bias.ElectronVolts == 0)
        {
            var spectrum = LevelsCommand.Find(layers);
            var grid = LevelsCommand.Grid(spectrum, 801, margin);
            var peak = grid.Values.Select(psi => psi.Max(p => p * p)).DefaultIfEmpty(1).Max();
            for (var n = 0; n < spectrum.Levels.Count && n < 40; n++)
            {
                var e = spectrum.Levels[n].EnergyElectronVolts;
                var level = plot.Add.HorizontalLine(unit.From(e));
                level.Color = Colors.Gray;
                level.LinePattern = LinePattern.Dotted;
                var density = grid.Values[n].Select(p => unit.From(e + 0.1 * range * p * p / peak)).ToArray();
                var curve = plot.Add.ScatterLine(grid.Positions.Select(p => p + origin).ToArray(), density);
                curve.Color = LineColor;
                curve.LineWidth = 1.5f;
            }
            notes.Add(string.Create(CultureInfo.InvariantCulture, $"{Common.Plural(spectrum.Levels.Count, "bound state")}: |psi|^2 drawn at its energy"));
        }
        else
        {
            notes.Add("bound states not drawn under bias (the leads are open)");
        }
        var top = vMax + 0.5 * range;
        var transmission = TransmissionCommand.Compile(layers, bias.ElectronVolts, bias.Source);
        var peaks = transmission.FindResonances(vMin, top).Resonances;
        foreach (var r in peaks.Take(40))
        {
            var line = plot.Add.HorizontalLine(unit.From(r.EnergyElectronVolts));
            line.Color = Colors.DarkOrange;
            line.LinePattern = LinePattern.Dashed;
        }
        notes.Add(string.Create(CultureInfo.InvariantCulture, $"{Common.Plural(peaks.Count, "transmission peak")} dashed"));
        if (structure.SelfConsistentStack is { } sc)
        {
            // The Fermi level across the picture and n(z) on a right axis, at the solution's positions (from the rigid stack's
            // left interface, as the picture's).
            var fermi = plot.Add.HorizontalLine(unit.From(sc.FermiLevelElectronVolts));
            fermi.Color = Colors.DarkGreen;
            fermi.LineWidth = 2;
            var nx = sc.PositionsNanometres.ToArray();
            var ny = sc.ElectronDensityPerCubicCentimetre.ToArray();
            // With holes the right axis holds p(z) too, scaled to the larger of the two (a p-type stack may hold no electrons).
            var holes = sc.Input.ValenceBands.Count > 0;
            var py = sc.HoleDensityPerCubicCentimetre.ToArray();
            var largest = Math.Max(ny.Max(), holes ? py.Max() : 0);
            var exponent = (int)Math.Floor(Math.Log10(Math.Max(largest, 1)));
            var scale = Math.Pow(10, exponent);
            var density = plot.Add.ScatterLine(nx, ny.Select(n => n / scale).ToArray());
            density.Color = Colors.SteelBlue;
            density.LineWidth = 1.5f;
            density.Axes.YAxis = plot.Axes.Right;
            if (holes)
            {
                var holeLine = plot.Add.ScatterLine(nx, py.Select(v => v / scale).ToArray());
                holeLine.Color = Colors.Crimson;
                holeLine.LineWidth = 1.5f;
                holeLine.Axes.YAxis = plot.Axes.Right;
            }
            plot.Axes.Right.Label.Text = string.Create(CultureInfo.InvariantCulture, $"{(holes ? "Carrier densities n(z), p(z)" : "Electron density n(z)")} (1e{exponent} cm^-3)");
            plot.Axes.Right.Range.Set(0, 1.1 * Math.Max(largest, 1e-300) / scale);
            plot.Add.Text(string.Create(CultureInfo.InvariantCulture,
                $"self-consistent stack (Hartree, {sc.TemperatureKelvin:G4} K, {sc.BufferNanometres:G4} nm of each lead included); green: Fermi level {unit.From(sc.FermiLevelElectronVolts):G5} {unit.Symbol}; blue: n(z){(holes ? ", red: p(z)" : "")}, right axis"),
                origin - 0.95 * margin, unit.From(vMin - 0.02 * range)).LabelFontSize = 11;
        }
        if (unit.Note is { } unitNote)
        {
            notes.Add(unitNote);
        }
        var text = plot.Add.Text(string.Join("; ", notes), origin - 0.95 * margin, unit.From(top) - 0.02 * unit.From(range));
        text.LabelFontSize = 11;
        plot.Axes.SetLimits(origin - margin, origin + length + margin, unit.From(vMin - 0.08 * range), unit.From(top));
        return plot;
    }

    /// <summary>The current density J(U) from U = 0 to the bias, 41 points: the I–V curve of the stack.</summary>
    private static Plot CurrentVoltage(StructureDefinition structure, int? periods, double bias, double fermiLevel, double kelvin)
    {
        var (layers, _) = StackOptions.Choose(structure, periods, null, null);
        var biases = Enumerable.Range(0, 41).Select(i => bias * i / 40.0).ToArray();
        var rows = CurrentCommand.Compute(layers, biases, fermiLevel, kelvin);
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture, $"I-V at T = {kelvin:G4} K, Fermi level {fermiLevel:G4} eV: {structure.Name}"), "Bias eU (eV)", "Current density J (A/cm2)");
        var line = plot.Add.ScatterLine(biases, rows.Select(r => r.AmperesPerSquareCentimetre).ToArray());
        line.LineWidth = 2f;
        line.Color = LineColor;
        line.MarkerSize = 4;
        var note = plot.Add.Text("Tsu-Esaki: coherent transport, uniform field, no space charge: a design guide", 0.02 * bias, rows.Max(r => r.AmperesPerSquareCentimetre));
        note.LabelFontSize = 11;
        return plot;
    }

    /// <summary>Samples a smooth segment's V(x) (x from the segment start) for the profile picture.</summary>
    private static void Sample(List<double> xs, List<double> vs, double start, double width, Func<double, double> potential)
    {
        const int points = 200;
        for (var i = 0; i <= points; i++)
        {
            var local = width * i / points;
            xs.Add(start + local);
            vs.Add(potential(local));
        }
    }

    private static Plot Profile(StructureDefinition structure, int count, int periods, LatticeEnergyUnit latticeUnit)
    {
        var bands = Solver.Compute(structure.Cell, count).Structure;
        var cell = structure.Cell;
        var d = cell.Period.Nanometres;
        var xs = new List<double>();
        var vs = new List<double>();
        var deltas = new List<(double X, double S)>();
        var x = 0.0;
        for (var p = 0; p < periods; p++)
        {
            foreach (var element in cell.Elements)
            {
                switch (element)
                {
                    case Layer layer:
                        xs.Add(x);
                        vs.Add(layer.Potential.ElectronVolts);
                        x += layer.Width.Nanometres;
                        xs.Add(x);
                        vs.Add(layer.Potential.ElectronVolts);
                        break;
                    case DeltaBarrier delta:
                        deltas.Add((x, delta.StrengthElectronVoltNanometres));
                        break;
                    case FourierSegment fourier:
                        Sample(xs, vs, x, fourier.Width.Nanometres, fourier.PotentialAt);
                        x += fourier.Width.Nanometres;
                        break;
                    case SampledSegment sampled:
                        Sample(xs, vs, x, sampled.Width.Nanometres, sampled.PotentialAt);
                        x += sampled.Width.Nanometres;
                        break;
                }
            }
        }
        var unit = AxisUnit(structure, bands, latticeUnit);
        var (low, high) = EnergyWindow(bands, unit);
        high = Math.Max(high, unit.From(cell.MaximumPotential.ElectronVolts) + 0.08 * (high - low));
        for (var i = 0; i < vs.Count; i++)
        {
            vs[i] = unit.From(vs[i]);
        }
        // An optical lattice is drawn in lattice periods d = lambda/2 (sites at whole numbers), any other cell in nm.
        var site = structure.OpticalLattice?.LatticePeriod.Nanometres ?? 1.0;
        if (structure.OpticalLattice is not null)
        {
            for (var i = 0; i < xs.Count; i++)
            {
                xs[i] /= site;
            }
            d /= site;
        }
        var plot = NewPlot($"Potential and minibands: {structure.Name}", structure.OpticalLattice is null ? "Position x (nm)" : "Position x / d (lattice sites at whole numbers)",
            $"Energy ({unit.Symbol})");
        foreach (var band in bands.Bands)
        {
            // A band narrower than the line width is drawn at a visible minimum thickness (its label gives the width).
            double bottom = unit.From(band.BottomElectronVolts), top = unit.From(band.TopElectronVolts);
            Shade(plot, 0, periods * d, bottom, Math.Max(top, bottom + 0.006 * (high - low)), BandColor.WithAlpha(0.8));
            var label = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"band {band.Index}: {top - bottom:G4} {unit.Symbol} wide"),
                periods * d * 1.005, 0.5 * (bottom + top));
            label.LabelFontSize = 11;
            label.LabelAlignment = Alignment.MiddleLeft;
        }
        var line = plot.Add.ScatterLine(xs.ToArray(), vs.ToArray());
        line.LineWidth = 2.5f;
        line.Color = ProfileColor;
        foreach (var (dx, s) in deltas)
        {
            var spike = plot.Add.VerticalLine(dx / site);
            spike.Color = s > 0 ? Colors.DarkRed : Colors.DarkGreen;
            spike.LineWidth = 2;
        }
        if (deltas.Count > 0)
        {
            var s0 = deltas[0].S;
            var deltaNote = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"delta {(s0 > 0 ? "barrier" : "well")} {s0:G4} eV nm"), deltas[0].X / site + 0.01 * periods * d, low + 0.1 * (high - low));
            deltaNote.LabelFontSize = 11;
        }
        if (structure.SelfConsistent is { } sc)
        {
            // The Fermi level on the energy axis; n(z) on a right axis, repeated over the periods drawn.
            var fermi = plot.Add.HorizontalLine(unit.From(sc.FermiLevelElectronVolts));
            fermi.Color = Colors.DarkOrange;
            fermi.LineWidth = 2;
            fermi.LinePattern = LinePattern.Dashed;
            var fermiLabel = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"Fermi level {unit.From(sc.FermiLevelElectronVolts):G5} {unit.Symbol}"),
                0.01 * periods * d, unit.From(sc.FermiLevelElectronVolts));
            fermiLabel.LabelFontSize = 11;
            fermiLabel.LabelFontColor = Colors.DarkOrange;
            var nx = new List<double>();
            var ny = new List<double>();
            var py = new List<double>();
            for (var p = 0; p < periods; p++)
            {
                for (var i = 0; i < sc.PositionsNanometres.Count; i++)
                {
                    nx.Add(p * d + sc.PositionsNanometres[i]);
                    ny.Add(sc.ElectronDensityPerCubicCentimetre[i]);
                    py.Add(sc.HoleDensityPerCubicCentimetre[i]);
                }
            }
            // With holes the right axis holds p(z) too, scaled to the larger of the two (a p-type cell may hold no electrons).
            var holes = sc.Input.ValenceBands.Count > 0;
            var largest = Math.Max(ny.Max(), holes ? py.Max() : 0);
            var exponent = (int)Math.Floor(Math.Log10(Math.Max(largest, 1)));
            var scale = Math.Pow(10, exponent);
            var density = plot.Add.ScatterLine(nx.ToArray(), ny.Select(v => v / scale).ToArray());
            density.Color = Colors.SteelBlue;
            density.LineWidth = 1.5f;
            density.Axes.YAxis = plot.Axes.Right;
            if (holes)
            {
                var holeLine = plot.Add.ScatterLine(nx.ToArray(), py.Select(v => v / scale).ToArray());
                holeLine.Color = Colors.Crimson;
                holeLine.LineWidth = 1.5f;
                holeLine.Axes.YAxis = plot.Axes.Right;
            }
            plot.Axes.Right.Label.Text = string.Create(CultureInfo.InvariantCulture, $"{(holes ? "Carrier densities n(z), p(z)" : "Electron density n(z)")} (1e{exponent} cm^-3)");
            plot.Axes.Right.Range.Set(0, 1.1 * Math.Max(largest, 1e-300) / scale);
            plot.Add.Text(string.Create(CultureInfo.InvariantCulture,
                $"self-consistent potential (Hartree, {sc.TemperatureKelvin:G4} K); blue: n(z){(holes ? ", red: p(z) (single-band holes)" : "")}, right axis"), 0.01 * periods * d, low + 0.04 * (high - low)).LabelFontSize = 11;
        }
        plot.Axes.SetLimits(-0.02 * periods * d, periods * d * 1.3, low, high);
        plot.Add.Text("shaded: minibands of the infinite superlattice of this cell" + (unit.Note is { } note ? "\n" + note : ""), 0.01 * periods * d, high - 0.02 * (high - low)).LabelFontSize = 12;
        return plot;
    }
}
