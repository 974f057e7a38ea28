// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using Periodic.Bands;
using Periodic.Design;
using Periodic.Serialization;

namespace Periodic.Cli.Sweeps;

/// <summary>A band quantity a design aims at: an edge, a width or a gap, in eV.</summary>
internal sealed partial record DesignQuantity(string Name, int Band, DesignQuantity.Kind What, double TargetElectronVolts)
{
    public enum Kind
    {
        Bottom,
        Top,
        Width,
        Gap,
    }

    /// <summary>Highest band number a target may name.</summary>
    public int BandsNeeded => What == Kind.Gap ? Band + 1 : Band;

    public static DesignQuantity? TryParse(string name, double target)
    {
        var match = Pattern().Match(name);
        if (!match.Success)
        {
            return null;
        }
        var band = int.Parse(match.Groups[2].Value, CultureInfo.InvariantCulture);
        var what = (match.Groups[1].Value, match.Groups[3].Value) switch
        {
            ("band", "bottom") => Kind.Bottom,
            ("band", "top") => Kind.Top,
            ("band", "width") => Kind.Width,
            ("gap", "width") => Kind.Gap,
            _ => (Kind?)null,
        };
        return what is null || band < 1 || band > 50 ? null : new DesignQuantity(name, band, what.Value, target);
    }

    /// <summary>The quantity's value in <paramref name="bands"/>.</summary>
    public double Value(BandStructure bands) => What switch
    {
        Kind.Bottom => bands.Bands[Band - 1].BottomElectronVolts,
        Kind.Top => bands.Bands[Band - 1].TopElectronVolts,
        Kind.Width => bands.Bands[Band - 1].WidthElectronVolts,
        _ => bands.Bands[Band].BottomElectronVolts - bands.Bands[Band - 1].TopElectronVolts,
    };

    /// <summary>d(quantity)/d(quantity of a layer) from the exact edge sensitivities, or null where an edge has none.</summary>
    public double? Derivative(EdgeSensitivities exact, int element, LayerQuantity quantity) => What switch
    {
        Kind.Bottom => exact.Bottom(Band, element, quantity),
        Kind.Top => exact.Top(Band, element, quantity),
        Kind.Width => exact.Top(Band, element, quantity) - exact.Bottom(Band, element, quantity),
        _ => exact.Bottom(Band + 1, element, quantity) - exact.Top(Band, element, quantity),
    };

    [GeneratedRegex(@"^(band|gap)(\d{1,2})\.(bottom|top|width)$", RegexOptions.CultureInvariant)]
    private static partial Regex Pattern();
}

/// <summary>
/// Solves a structure with given values of its adjustable layer fields and returns the target quantities with their
/// exact derivatives (a Jacobian for the optimiser), reusing the sweep's field paths and the library's band solver.
/// </summary>
internal sealed class DesignModel(JsonObject structure, IReadOnlyList<string> fields, IReadOnlyList<(int Element, LayerQuantity Quantity)> layers,
    IReadOnlyList<DesignQuantity> targets)
{
    private readonly int _bands = targets.Max(t => t.BandsNeeded);

    /// <summary>The targets' values and d(value)/d(field) at the given field values.</summary>
    public (double[] Values, double[,] Jacobian) Evaluate(ReadOnlySpan<double> parameters)
    {
        var bands = Solve(parameters);
        var exact = EdgeSensitivities.Compute(bands);
        var values = new double[targets.Count];
        var jacobian = new double[targets.Count, fields.Count];
        for (var i = 0; i < targets.Count; i++)
        {
            values[i] = targets[i].Value(bands);
            for (var j = 0; j < fields.Count; j++)
            {
                jacobian[i, j] = targets[i].Derivative(exact, layers[j].Element, layers[j].Quantity)
                    ?? throw new InvalidOperationException($"{targets[i].Name} has no derivative with respect to {fields[j]} here (a gap is closed).");
            }
        }
        return (values, jacobian);
    }

    /// <summary>The targets' values of the structure with <paramref name="edit"/> applied (for the tolerance table).</summary>
    public double[] Values(ReadOnlySpan<double> parameters, Action<JsonObject>? edit = null)
    {
        var bands = Solve(parameters, edit);
        return targets.Select(t => t.Value(bands)).ToArray();
    }

    private BandStructure Solve(ReadOnlySpan<double> parameters, Action<JsonObject>? edit = null)
    {
        var document = structure.DeepClone().AsObject();
        for (var j = 0; j < fields.Count; j++)
        {
            FieldPath.Set(document, fields[j], parameters[j]);
        }
        edit?.Invoke(document);
        var parsed = StructureFile.Parse(Encoding.UTF8.GetBytes(document.ToJsonString()), "design");
        return BandSolver.Compute(parsed.Cell, _bands).Structure;
    }
}
