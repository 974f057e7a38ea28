// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Cli.Physics;
using Periodic.Properties;
using Periodic.Serialization;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// Evaluates the designs of a sweep: each design is the sweep's structure with its parameter values written in,
/// read by the same structure-file reader as every command (so a design that makes an invalid layer fails the way
/// a file would), and solved by the same band solver as <c>periodic bands</c>.
/// </summary>
internal sealed class SweepRunner(SweepSpec spec)
{
    /// <summary>The columns of a row after the design number, with their units.</summary>
    public IReadOnlyList<(string Name, string Unit)> Columns { get; } = BuildColumns(spec);

    /// <summary>Number of parameter columns at the start of <see cref="Columns"/>.</summary>
    public int ParameterCount => spec.Parameters.Count;

    private static List<(string, string)> BuildColumns(SweepSpec spec)
    {
        var columns = spec.Parameters.Select(p => (p.Field, p.Unit)).ToList();
        for (var n = 1; n <= spec.Bands; n++)
        {
            var band = string.Create(CultureInfo.InvariantCulture, $"band{n}");
            columns.Add((band + ".bottom", "eV"));
            columns.Add((band + ".top", "eV"));
            columns.Add((band + ".width", "eV"));
            columns.Add((band + ".massBottom", "m0"));
            columns.Add((band + ".massTop", "m0"));
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"gap{n}.width"), "eV"));
        }
        return columns;
    }

    /// <summary>Computes design <paramref name="index"/>; a design that cannot be built or solved is a row with its error.</summary>
    public SweepRow Evaluate(int index)
    {
        var values = new double?[Columns.Count];
        Span<double> parameters = stackalloc double[spec.Parameters.Count];
        spec.Plan.Values(index, parameters);
        for (var j = 0; j < parameters.Length; j++)
        {
            values[j] = parameters[j];
        }
        try
        {
            var document = spec.Structure.DeepClone().AsObject();
            for (var j = 0; j < parameters.Length; j++)
            {
                FieldPath.Set(document, spec.Parameters[j].Field, parameters[j]);
            }
            var structure = StructureFile.Parse(Encoding.UTF8.GetBytes(document.ToJsonString()), string.Create(CultureInfo.InvariantCulture, $"design {index}"));
            var solved = Solver.Compute(structure.Cell, spec.Bands, quiet: true);
            var bands = solved.Bands;
            var properties = BandProperties.Create(bands);
            var k = parameters.Length;
            for (var n = 1; n <= spec.Bands; n++)
            {
                var band = bands.Bands[n - 1];
                values[k++] = band.BottomElectronVolts;
                values[k++] = band.TopElectronVolts;
                values[k++] = band.WidthElectronVolts;
                values[k++] = Finite(properties.BottomMass(n).ElectronMasses);
                values[k++] = Finite(properties.TopMass(n).ElectronMasses);
                values[k++] = bands.Gaps[n - 1].WidthElectronVolts;
            }
            var error = solved.Converged ? null : string.Create(CultureInfo.InvariantCulture, $"not converged: edge errors up to {solved.MaxEdgeErrorElectronVolts:G3} eV");
            return new SweepRow(index, values, error);
        }
        catch (Exception e) when (e is StructureFileException or ArgumentException or ArithmeticException or InvalidOperationException
            or Periodic.Bands.BandSearchException)
        {
            return new SweepRow(index, values, OneLine(e.Message));
        }
    }

    // A band so narrow that double precision resolves no curvature has no finite edge mass: an empty cell, not ±∞.
    private static double? Finite(double value) => double.IsFinite(value) ? value : null;

    private static string OneLine(string message) => string.Join(' ', message.Split((char[])['\r', '\n'], StringSplitOptions.RemoveEmptyEntries));
}

/// <summary>One design's result: its number, its parameter and output values (null where none), and its error if it failed.</summary>
internal sealed record SweepRow(int Design, double?[] Values, string? Error);
