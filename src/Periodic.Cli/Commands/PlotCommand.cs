// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;
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
    private static readonly string[] Kinds = ["dispersion", "dos", "profile", "transmission", "in-plane"];
    private static readonly Color GapColor = Color.FromHex("#F2C7C7").WithAlpha(0.55);
    private static readonly Color BandColor = Color.FromHex("#9FC5E8").WithAlpha(0.55);
    private static readonly Color LineColor = Color.FromHex("#1F4E79");
    private static readonly Color ProfileColor = Color.FromHex("#404040");

    public static Command Create()
    {
        var file = Common.FileArgument();
        var output = new Option<string>("--out", "-o") { Description = "Image file to write: .png or .svg.", Required = true };
        var show = new Option<string>("--show", "-s")
        {
            Description = "What to draw: dispersion (E(k), gaps shaded), dos, profile (V(x) with the minibands), transmission (T(E), log scale) or in-plane (miniband edges against k∥ up to --in-plane-wavevector, default 1 /nm).",
            DefaultValueFactory = _ => "dispersion",
        };
        show.AcceptOnlyFromAmong(Kinds);
        var count = Common.CountOption(3);
        var periods = new Option<int>("--periods", "-N") { Description = "Periods drawn in the profile (default 3) or stacked for transmission (default 10).", DefaultValueFactory = _ => 0 };
        var grid = new EnergyGridOptions();
        var bias = TransmissionCommand.BiasOption();
        var width = new Option<int>("--width") { Description = "Image width, pixels.", DefaultValueFactory = _ => 900 };
        var height = new Option<int>("--height") { Description = "Image height, pixels.", DefaultValueFactory = _ => 600 };
        var command = new Command("plot", "Draw E(k), the DOS, the potential profile with its minibands, or T(E) to a PNG or SVG file.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        command.Options.Add(inPlane);
        command.Options.Add(output);
        command.Options.Add(show);
        command.Options.Add(count);
        command.Options.Add(periods);
        grid.AddTo(command);
        command.Options.Add(bias);
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
            if (p < 0 || p > 100_000)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--periods must be between 1 and 100000; got {p}."));
            }
            var u = result.GetValue(bias);
            if (u is not null && kind != "transmission")
            {
                throw new UsageException($"--bias applies only to --show transmission; got --show {kind}.");
            }
            var loaded = Common.Load(result.GetValue(file)!);
            var atInPlane = Common.AtInPlaneWavevector(result, inPlane, loaded); // validates --in-plane-wavevector
            var structure = kind == "in-plane" ? loaded : atInPlane; // there it is the end of the k∥ axis
            if (kind == "profile")
            {
                // Two points per layer, 201 per smooth segment and period.
                var perPeriod = structure.Cell.Elements.Sum(e => e is Layer ? 2L : e is DeltaBarrier ? 0L : 201L);
                Limits.CheckWork("--periods × points per period of the profile", Limits.Product(p == 0 ? 3 : p, perPeriod), Limits.MaxProfilePoints,
                    "a picture at most 8000 pixels wide cannot show more points; draw fewer periods");
            }
            var plot = kind switch
            {
                "in-plane" => InPlaneEdges(structure, n, result.GetValue(inPlane) ?? 1.0),
                "dispersion" => Dispersion(structure, n),
                "dos" => Dos(structure, n, energies),
                "profile" => Profile(structure, n, p == 0 ? 3 : p),
                _ => Transmission(structure, n, p == 0 ? structure.Stack?.Parts[0].Repetitions ?? 10 : p, energies, TransmissionCommand.ChooseBias(u, structure)),
            };
            Save(plot, path, extension, w, h);
            Console.Error.WriteLine($"wrote {Common.Printable(path)}");
            return 0;
        });
        return command;
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

    private static void Save(Plot plot, string path, string extension, int width, int height)
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

    private static Plot NewPlot(string title, string xLabel, string yLabel)
    {
        var plot = new Plot();
        plot.Title(title, size: 16);
        plot.XLabel(xLabel, size: 14);
        plot.YLabel(yLabel, size: 14);
        return plot;
    }

    /// <summary>The energy window shown: from the lowest potential to just above the highest band drawn.</summary>
    private static (double Low, double High) EnergyWindow(BandStructure bands)
    {
        var low = Math.Min(bands.Cell.MinimumPotential.ElectronVolts, bands.Bands[0].BottomElectronVolts);
        var high = bands.Bands[^1].TopElectronVolts;
        var margin = 0.08 * (high - low);
        return (low - margin, high + margin);
    }

    private static void ShadeGaps(Plot plot, BandStructure bands, double left, double right, double low, double high)
    {
        var lower = low;
        for (var i = 0; i < bands.Bands.Count; i++)
        {
            var bottom = bands.Bands[i].BottomElectronVolts;
            Shade(plot, left, right, lower, bottom, GapColor);
            lower = bands.Bands[i].TopElectronVolts;
        }
        Shade(plot, left, right, lower, Math.Min(high, bands.Gaps[^1].UpperElectronVolts), GapColor);
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

    private static Plot Dispersion(StructureDefinition structure, int count)
    {
        var bands = Solver.Compute(structure.Cell, count).Bands;
        var (k, e) = DispersionCommand.Compute(bands, 201);
        var zone = Math.PI / bands.PeriodNanometres;
        var (low, high) = EnergyWindow(bands);
        var plot = NewPlot($"E(k): {structure.Name}", "Bloch wavevector k (1/nm)", "Energy E (eV)");
        ShadeGaps(plot, bands, -zone, zone, low, high);
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
        plot.Add.Text("gaps shaded", -0.97 * zone, high - 0.02 * (high - low)).LabelFontSize = 12;
        plot.Axes.SetLimits(-zone * 1.02, zone * 1.02, low, high);
        return plot;
    }

    private static Plot Dos(StructureDefinition structure, int count, double[]? energies)
    {
        var bands = Solver.Compute(structure.Cell, count).Bands;
        var (low, high) = EnergyWindow(bands);
        if (energies is not null)
        {
            low = energies.Min();
            high = energies.Max();
        }
        var plot = NewPlot($"Density of states: {structure.Name}", "DOS g(E) (1/(eV nm), spin included)", "Energy E (eV)");
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
            curves.Add((grid, values.Select(v => v.Dos).ToArray()));
        }
        // The divergences would flatten the picture: cap the axis at 4x the largest band-centre value.
        var cap = 1.0;
        foreach (var band in bands.Bands)
        {
            var centre = DosCommand.Compute(structure, [band.CenterElectronVolts])[0].Dos;
            if (double.IsFinite(centre))
            {
                cap = Math.Max(cap, 4 * centre);
            }
        }
        ShadeGaps(plot, bands, 0, cap * 1.1, low, high);
        foreach (var (e, g) in curves)
        {
            var line = plot.Add.ScatterLine(g.Select(x => Math.Min(x, cap * 1.2)).ToArray(), e);
            line.LineWidth = 2;
            line.Color = LineColor;
        }
        plot.Add.Text("gaps shaded; g diverges at every band edge (axis capped)", 0.02 * cap, high - 0.02 * (high - low)).LabelFontSize = 12;
        plot.Axes.SetLimits(0, cap, low, high);
        return plot;
    }

    private static Plot Transmission(StructureDefinition structure, int count, int periods, double[]? energies, (double ElectronVolts, string Source) bias)
    {
        var bands = Solver.Compute(structure.Cell, count).Bands;
        var (low, high) = EnergyWindow(bands);
        energies ??= Enumerable.Range(0, 3001).Select(i => low + (high - low) * i / 3000.0).ToArray();
        low = energies.Min();
        high = energies.Max();
        var (stack, results) = TransmissionCommand.Compute(structure, periods, energies, null, null, bias);
        // log10 T, with closed leads (T = 0 exactly) left out rather than drawn at -infinity.
        var open = results.Where(r => r.IsOpen && double.IsFinite(r.Log10Transmission)).ToArray();
        var x = open.Select(r => r.EnergyElectronVolts).ToArray();
        var y = open.Select(r => r.Log10Transmission).ToArray();
        var floor = y.Length == 0 ? -10 : Math.Max(Math.Floor(y.Min()) - 0.5, -300);
        var plot = NewPlot(string.Create(CultureInfo.InvariantCulture, $"Transmission of {periods} periods{(bias.ElectronVolts == 0 ? "" : string.Create(CultureInfo.InvariantCulture, $" at eU = {bias.ElectronVolts:G4} eV"))}: {structure.Name}"), "Energy E (eV)", "Transmission T (log scale)");
        foreach (var band in bands.Bands)
        {
            var strip = plot.Add.Rectangle(band.BottomElectronVolts, Math.Max(band.TopElectronVolts, band.BottomElectronVolts + 1e-4 * (high - low)), floor, 0.5);
            strip.FillStyle.Color = BandColor;
            strip.LineStyle.Width = 0;
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
        var note = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"minibands of the infinite crystal shaded; leads V = {lead.Potential.ElectronVolts:G4} eV, m = {lead.Mass.ElectronMasses:G4} m0"),
            high - 0.01 * (high - low), floor + 0.02 * (0.5 - floor));
        note.LabelFontSize = 11;
        note.LabelAlignment = Alignment.LowerRight;
        note.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
        plot.Axes.SetLimits(low, high, floor, 0.5);
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

    private static Plot Profile(StructureDefinition structure, int count, int periods)
    {
        var bands = Solver.Compute(structure.Cell, count).Bands;
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
        var (low, high) = EnergyWindow(bands);
        high = Math.Max(high, cell.MaximumPotential.ElectronVolts + 0.08 * (high - low));
        var plot = NewPlot($"Potential and minibands: {structure.Name}", "Position x (nm)", "Energy (eV)");
        foreach (var band in bands.Bands)
        {
            // A band narrower than the line width is drawn at a visible minimum thickness (its label gives the width).
            Shade(plot, 0, periods * d, band.BottomElectronVolts, Math.Max(band.TopElectronVolts, band.BottomElectronVolts + 0.006 * (high - low)), BandColor.WithAlpha(0.8));
            var label = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"band {band.Index}: {band.WidthElectronVolts * 1e3:G4} meV wide"),
                periods * d * 1.005, 0.5 * (band.BottomElectronVolts + band.TopElectronVolts));
            label.LabelFontSize = 11;
            label.LabelAlignment = Alignment.MiddleLeft;
        }
        var line = plot.Add.ScatterLine(xs.ToArray(), vs.ToArray());
        line.LineWidth = 2.5f;
        line.Color = ProfileColor;
        foreach (var (dx, s) in deltas)
        {
            var spike = plot.Add.VerticalLine(dx);
            spike.Color = s > 0 ? Colors.DarkRed : Colors.DarkGreen;
            spike.LineWidth = 2;
        }
        if (deltas.Count > 0)
        {
            var s0 = deltas[0].S;
            var note = plot.Add.Text(string.Create(CultureInfo.InvariantCulture, $"delta {(s0 > 0 ? "barrier" : "well")} {s0:G4} eV nm"), deltas[0].X + 0.01 * periods * d, low + 0.1 * (high - low));
            note.LabelFontSize = 11;
        }
        plot.Axes.SetLimits(-0.02 * periods * d, periods * d * 1.3, low, high);
        plot.Add.Text("minibands shaded", 0.01 * periods * d, high - 0.02 * (high - low)).LabelFontSize = 12;
        return plot;
    }
}
