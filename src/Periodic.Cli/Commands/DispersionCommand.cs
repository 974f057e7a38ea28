// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using System.Text;
using System.Text.Json;
using Periodic.Bands;
using Periodic.Cli.Output;
using Periodic.Cli.Physics;
using Periodic.Serialization;

namespace Periodic.Cli.Commands;

/// <summary>
/// <c>dispersion FILE</c>: E(k) of the lowest bands on an even k grid from 0 to π/d. The energies come from
/// <see cref="BandStructure.EnergiesAt"/> (the band's Chebyshev inversion on long grids) and are streamed in blocks,
/// so memory does not grow with the number of points.
/// </summary>
internal static class DispersionCommand
{
    /// <summary>Most k points: 10^7 (about 1.5 GB of CSV for 5 bands; time, not memory, is the bound since output is streamed).</summary>
    public const int MaxPoints = 10_000_000;

    private const int Block = 8192;

    public static Command Create()
    {
        var file = Common.FileArgument();
        var count = Common.CountOption(3);
        var points = new Option<int>("--points", "-k") { Description = "Number of k points from 0 to pi/d, ends included (2 to 10,000,000).", DefaultValueFactory = _ => 41 };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var output = Common.OutOption();
        var command = new Command("dispersion", "Tabulate E(k) of the lowest bands over the first Brillouin zone, k from 0 to pi/d.");
        command.Arguments.Add(file);
        var inPlane = Common.InPlaneWavevectorOption();
        var unit = Common.LatticeUnitOption();
        command.Options.Add(inPlane);
        command.Options.Add(count);
        command.Options.Add(unit);
        command.Options.Add(points);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.Options.Add(output);
        command.SetAction(result =>
        {
            var format = Common.Format(result, json, csv);
            var n = Common.CheckCount(result.GetValue(count));
            var k = result.GetValue(points);
            if (k < 2 || k > MaxPoints)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--points must be between 2 and {MaxPoints}; got {k}."));
            }
            Limits.CheckWork("--count × --points", Limits.Product(n, k), Limits.MaxDispersionValues,
                "the output is streamed, but each value costs CPU time and about 25 bytes of output");
            var loaded = Common.Load(result, result.GetValue(file)!);
            var latticeUnit = Common.LatticeUnit(result, unit, loaded);
            var structure = Common.AtInPlaneWavevector(result, inPlane, loaded);
            var solved = Solver.Compute(structure.Cell, n);
            var warnings = structure.Materials is { } built ? Common.ReportWarnings(structure, built.CheckEnergies(solved.Structure.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts }).ToArray())) : [];
            var grid = new Grid(solved.Structure, k);
            Common.Emit(stream => Write(stream, structure, solved, grid, warnings, format, latticeUnit), result.GetValue(output));
            return 0;
        });
        return command;
    }

    /// <summary>The k grid k_i = (π/d)·i/(N − 1), the last point exactly π/d, and the energies of every band on a block of it.</summary>
    public sealed class Grid(BandStructure bands, int points)
    {
        public int Points { get; } = points;

        public double Zone { get; } = Math.PI / bands.PeriodNanometres;

        /// <summary>Whether the energies come from the Chebyshev inversion (long grids) or a root search per point.</summary>
        public bool Fast => Points >= BandStructure.FastPathMinimumPoints;

        /// <summary>Builds the inversions of bands 1…count before blocks are filled in parallel (each is built once).</summary>
        public void Prepare(int count)
        {
            for (var n = 1; Fast && n <= count; n++)
            {
                bands.DispersionOf(n);
            }
        }

        public double K(int i) => i == Points - 1 ? Zone : Zone * i / (Points - 1);

        /// <summary>Fills k[0..] for points start…start+k.Length−1 and the energies of band n (1-based) there.</summary>
        public void Fill(int band, int start, Span<double> k, Span<double> energies)
        {
            for (var i = 0; i < k.Length; i++)
            {
                k[i] = K(start + i);
            }
            // On a long grid every block goes through the inversion. The Bloch cosines come from a scalar loop: a short-lived
            // process pays more for compiling the library's vector cosine than it saves (whole-process measurement,
            // benchmarks/results/2026-12-03-medium/SUMMARY.md); the energies equal EnergiesAtBlochCosines of Math.Cos(k·d).
            if (Fast)
            {
                var d = bands.PeriodNanometres;
                for (var i = 0; i < k.Length; i++)
                {
                    energies[i] = Math.Cos(k[i] * d);
                }
                bands.DispersionOf(band).EnergiesAtBlochCosines(energies, energies);
            }
            else
            {
                bands.EnergiesAt(band, k, energies);
            }
        }
    }

    /// <summary>The whole grid in memory, for the plot and the tests' small grids.</summary>
    public static (double[] K, double[][] E) Compute(BandStructure bands, int points)
    {
        var grid = new Grid(bands, points);
        var k = new double[points];
        var energies = new double[bands.Bands.Count][];
        for (var n = 0; n < energies.Length; n++)
        {
            energies[n] = new double[points];
            grid.Fill(n + 1, 0, k, energies[n]);
        }
        return (k, energies);
    }

    private static void Write(Stream stream, StructureDefinition structure, Periodic.Bands.BandSolution solved, Grid grid, IReadOnlyList<Periodic.Materials.ModelWarning> warnings, OutputFormat format,
        LatticeEnergyUnit latticeUnit)
    {
        var bands = solved.Structure;
        var count = bands.Bands.Count;
        var k = new double[Block];
        var e = new double[count][];
        for (var n = 0; n < count; n++)
        {
            e[n] = new double[Block];
        }
        using var progress = new Progress("dispersion", grid.Points);
        if (format == OutputFormat.Json)
        {
            WriteJson(stream, structure, solved, grid, warnings, k, e[0], progress);
            return;
        }
        if (structure.OpticalLattice is { } lattice)
        {
            // q/k_L and recoil energies; lattice grids are short, so they are computed whole rather than streamed.
            var (kAll, eAll) = Compute(bands, grid.Points);
            LatticeOutput.Dispersion(stream, structure, lattice, kAll, eAll, DisplayUnits.Lattice(lattice, latticeUnit), format);
            return;
        }
        var d = bands.PeriodNanometres;
        if (format == OutputFormat.Csv)
        {
            using (var csv = new CsvWriter(stream))
            {
                csv.Header(new[] { "k (1/nm)", "kd/pi" }.Concat(Enumerable.Range(1, count).Select(n => string.Create(CultureInfo.InvariantCulture, $"E{n} (eV)"))));
            }
            WriteCsvRows(stream, grid, count, d, progress);
            return;
        }
        // Text: the unit and digits follow from the band edges (every E(k) lies between its band's edges).
        var edges = bands.Bands.SelectMany(b => new[] { b.BottomElectronVolts, b.TopElectronVolts }).ToArray();
        var unit = DisplayUnits.Energy(structure, edges);
        var energyFormat = Table.ChooseFormat(edges.Select(unit.From));
        var columns = new List<Column> { new("k", "1/nm", Format: "G8"), new("kd/pi", Format: "F6") };
        columns.AddRange(Enumerable.Range(1, count).Select(n => Column.Energy(string.Create(CultureInfo.InvariantCulture, $"E{n}"), unit) with { Format = energyFormat }));
        using var writer = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16, leaveOpen: true);
        writer.Write(Common.TableTitle(structure, unit));
        writer.Write(Accuracy(solved, grid));
        writer.Write('\n');
        for (var start = 0; start < grid.Points; start += Block)
        {
            var length = Math.Min(Block, grid.Points - start);
            for (var n = 0; n < count; n++)
            {
                grid.Fill(n + 1, start, k.AsSpan(0, length), e[n].AsSpan(0, length));
            }
            var table = new Table([.. columns]);
            for (var i = 0; i < length; i++)
            {
                var row = new Cell[count + 2];
                row[0] = k[i];
                row[1] = k[i] * d / Math.PI;
                for (var n = 0; n < count; n++)
                {
                    row[n + 2] = e[n][i];
                }
                table.Add(row);
            }
            var text = table.ToText();
            // Keep the first block's header and rule lines only.
            writer.Write(start == 0 ? text : text[(text.IndexOf('\n', text.IndexOf('\n') + 1) + 1)..]);
            progress.Report(start + length);
        }
    }

    /// <summary>
    /// The CSV rows, block by block: each core computes and formats whole blocks into its own buffer, and the buffers
    /// are written in order, a few blocks at a time, so memory stays bounded (a few MB) however many points there are.
    /// </summary>
    private static void WriteCsvRows(Stream stream, Grid grid, int count, double period, Progress progress)
    {
        var slots = Math.Max(1, Math.Min(Environment.ProcessorCount, 8)) * 2;
        var buffers = new MemoryStream[slots];
        var workspaces = new (double[] K, double[][] E)[slots];
        for (var s = 0; s < slots; s++)
        {
            buffers[s] = new MemoryStream();
            workspaces[s] = (new double[Block], Enumerable.Range(0, count).Select(_ => new double[Block]).ToArray());
        }
        grid.Prepare(count);
        var blocks = (grid.Points + Block - 1) / Block;
        for (var first = 0; first < blocks; first += slots)
        {
            var batch = Math.Min(slots, blocks - first);
            Parallel.For(0, batch, s =>
            {
                var (k, e) = workspaces[s];
                var start = (first + s) * Block;
                var length = Math.Min(Block, grid.Points - start);
                for (var n = 0; n < count; n++)
                {
                    grid.Fill(n + 1, start, k.AsSpan(0, length), e[n].AsSpan(0, length));
                }
                buffers[s].SetLength(0);
                using var csv = new CsvWriter(buffers[s]);
                FormatRows(csv, k, e, length, period);
            });
            for (var s = 0; s < batch; s++)
            {
                stream.Write(buffers[s].GetBuffer(), 0, (int)buffers[s].Length);
            }
            progress.Report(Math.Min(grid.Points, (first + batch) * Block));
        }
    }

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // see CsvWriter
    private static void FormatRows(CsvWriter csv, double[] k, double[][] e, int length, double period)
    {
        for (var i = 0; i < length; i++)
        {
            csv.Number(k[i]);
            csv.Number(k[i] * period / Math.PI);
            foreach (var band in e)
            {
                csv.Number(band[i]);
            }
            csv.EndRow();
        }
    }

    private static string Accuracy(Periodic.Bands.BandSolution solved, Grid grid)
    {
        var bands = solved.Structure;
        if (!grid.Fast)
        {
            return string.Create(CultureInfo.InvariantCulture, $"E(k) by root search per point; band edges to {solved.MaxEdgeErrorElectronVolts:G3} eV.\n");
        }
        var error = Enumerable.Range(1, bands.Bands.Count).Max(n => bands.DispersionOf(n).ErrorEstimateElectronVolts);
        return string.Create(CultureInfo.InvariantCulture,
            $"E(k) from the Chebyshev inversion of each band: error estimate {error:G3} eV; band edges to {solved.MaxEdgeErrorElectronVolts:G3} eV.\n");
    }

    private static void WriteJson(Stream stream, StructureDefinition structure, Periodic.Bands.BandSolution solved, Grid grid, IReadOnlyList<Periodic.Materials.ModelWarning> warnings,
        double[] k, double[] e, Progress progress)
    {
        var bands = solved.Structure;
        using var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true });
        w.WriteStartObject();
        Common.StructureHeader(w, structure, warnings);
        Common.Units(w, ("wavevector", "1/nm"), ("energy", "eV"), ("period", "nm"), ("errorEstimate", "eV"));
        w.WriteNumber("zoneBoundary", grid.Zone);
        w.WriteStartObject("accuracy");
        w.Number("maxEdgeError", solved.MaxEdgeErrorElectronVolts);
        w.WriteString("method", grid.Fast ? "chebyshev" : "rootSearch");
        w.WriteEndObject();
        w.WriteStartArray("wavevectors");
        for (var start = 0; start < grid.Points; start += Block)
        {
            var length = Math.Min(Block, grid.Points - start);
            for (var i = 0; i < length; i++)
            {
                w.WriteNumberValue(grid.K(start + i));
            }
            w.Flush();
        }
        w.WriteEndArray();
        w.WriteStartArray("bands");
        for (var n = 1; n <= bands.Bands.Count; n++)
        {
            w.WriteStartObject();
            w.WriteNumber("index", n);
            if (grid.Fast)
            {
                w.Number("errorEstimate", bands.DispersionOf(n).ErrorEstimateElectronVolts);
            }
            w.WriteStartArray("energies");
            for (var start = 0; start < grid.Points; start += Block)
            {
                var length = Math.Min(Block, grid.Points - start);
                grid.Fill(n, start, k.AsSpan(0, length), e.AsSpan(0, length));
                for (var i = 0; i < length; i++)
                {
                    w.WriteNumberValue(e[i]);
                }
                w.Flush();
                progress.Report(start + length);
            }
            w.WriteEndArray();
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteEndObject();
        w.Flush();
        stream.WriteByte((byte)'\n');
    }
}
