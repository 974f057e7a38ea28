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

/// <summary>
/// A quantity a design aims at, in eV: a band edge, width or gap of the cell; a bound level or a resonance of the stack;
/// or a bound-to-bound transition energy.
/// </summary>
internal sealed partial record DesignQuantity(string Name, int Band, DesignQuantity.Kind What, double TargetElectronVolts, int Upper = 0)
{
    public enum Kind
    {
        Bottom,
        Top,
        Width,
        Gap,
        Level,
        Resonance,
        Transition,
    }

    /// <summary>What a target may be called, for error messages (the bounds are the sweep's: <see cref="SweepSpec.MaximumBands"/>, <see cref="SweepSpec.MaximumStackQuantities"/>).</summary>
    public static readonly string Allowed = string.Create(CultureInfo.InvariantCulture,
        $"bandN.bottom, bandN.top, bandN.width, gapN.width (N from 1 to {SweepSpec.MaximumBands}), levelN, resonanceN (N from 1 to {SweepSpec.MaximumStackQuantities}), transitionI-J (bound levels I < J ≤ {SweepSpec.MaximumStackQuantities})");

    /// <summary>The unit the target was given in where it is a photon wavelength ("µm" or "nm"); null for an energy.</summary>
    public string? WavelengthUnit { get; init; }

    /// <summary>Highest band number a target may name (0 for a stack quantity).</summary>
    public int BandsNeeded => What switch
    {
        Kind.Gap => Band + 1,
        Kind.Bottom or Kind.Top or Kind.Width => Band,
        _ => 0,
    };

    /// <summary>True for a quantity of the finite stack (level, resonance, transition).</summary>
    public bool IsStackQuantity => What is Kind.Level or Kind.Resonance or Kind.Transition;

    public static DesignQuantity? TryParse(string name, double target)
    {
        var stack = StackPattern().Match(name);
        if (stack.Success)
        {
            var n = int.Parse(stack.Groups[2].Value, CultureInfo.InvariantCulture);
            var kind = stack.Groups[1].Value switch { "level" => Kind.Level, "resonance" => Kind.Resonance, _ => Kind.Transition };
            var upper = stack.Groups[3].Success ? int.Parse(stack.Groups[3].Value, CultureInfo.InvariantCulture) : 0;
            var valid = n >= 1 && n <= SweepSpec.MaximumStackQuantities
                && (kind == Kind.Transition ? stack.Groups[3].Success && upper > n && upper <= SweepSpec.MaximumStackQuantities : !stack.Groups[3].Success);
            return valid ? new DesignQuantity(name, n, kind, target, upper) : null;
        }
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
        return what is null || band < 1 || band > SweepSpec.MaximumBands ? null : new DesignQuantity(name, band, what.Value, target);
    }

    /// <summary>The quantity's value in <paramref name="bands"/> (a band quantity).</summary>
    public double Value(BandStructure bands) => What switch
    {
        Kind.Bottom => bands.Bands[Band - 1].BottomElectronVolts,
        Kind.Top => bands.Bands[Band - 1].TopElectronVolts,
        Kind.Width => bands.Bands[Band - 1].WidthElectronVolts,
        _ => bands.Bands[Band].BottomElectronVolts - bands.Bands[Band - 1].TopElectronVolts,
    };

    /// <summary>The quantity's value in a solved design, or null where the stack does not have the level or resonance.</summary>
    public double? Value(DesignSolution solution) => What switch
    {
        Kind.Level => solution.Stack!.Level(Band),
        Kind.Resonance => solution.Stack!.Resonance(Band),
        Kind.Transition => solution.Stack!.Transition(Band, Upper),
        _ => Value(solution.Bands!),
    };

    /// <summary>Why a design has no value of this quantity: fewer levels or resonances than it names.</summary>
    public string Missing => What == Kind.Resonance
        ? string.Create(CultureInfo.InvariantCulture, $"fewer than {Band} resonances below its barrier tops")
        : string.Create(CultureInfo.InvariantCulture, $"fewer than {Math.Max(Band, Upper)} bound levels");

    /// <summary>d(quantity)/d(quantity of a layer) from the exact edge sensitivities, or null where an edge has none.</summary>
    public double? Derivative(EdgeSensitivities exact, int element, LayerQuantity quantity) => What switch
    {
        Kind.Bottom => exact.Bottom(Band, element, quantity),
        Kind.Top => exact.Top(Band, element, quantity),
        Kind.Width => exact.Top(Band, element, quantity) - exact.Bottom(Band, element, quantity),
        _ => exact.Bottom(Band + 1, element, quantity) - exact.Top(Band, element, quantity),
    };

    /// <summary>d(quantity)/d(quantity of cell element <paramref name="element"/>) in a solved design, or null where none exists.</summary>
    public double? Derivative(DesignSolution solution, int element, LayerQuantity quantity) => What switch
    {
        Kind.Level => solution.Stack!.LevelDerivative(Band, element, quantity),
        Kind.Resonance => solution.Stack!.ResonanceDerivative(Band, element, quantity),
        Kind.Transition => solution.Stack!.TransitionDerivative(Band, Upper, element, quantity),
        _ => Derivative(solution.Edges, element, quantity),
    };

    [GeneratedRegex(@"^(band|gap)(\d{1,2})\.(bottom|top|width)$", RegexOptions.CultureInvariant)]
    private static partial Regex Pattern();

    [GeneratedRegex(@"^(level|resonance|transition)(\d{1,3})(?:-(\d{1,3}))?$", RegexOptions.CultureInvariant)]
    private static partial Regex StackPattern();
}

/// <summary>One design solved for its targets: the band structure if a band quantity is wanted, the stack's levels and resonances if those are.</summary>
internal sealed class DesignSolution(BandStructure? bands, StackQuantities? stack)
{
    private EdgeSensitivities? _edges;

    public BandStructure? Bands { get; } = bands;

    public StackQuantities? Stack { get; } = stack;

    public EdgeSensitivities Edges => _edges ??= EdgeSensitivities.Compute(Bands!);

    public static DesignSolution Solve(StructureDefinition structure, IReadOnlyList<DesignQuantity> targets)
    {
        var bands = targets.Max(t => t.BandsNeeded);
        var levels = targets.Any(t => t.What is DesignQuantity.Kind.Level or DesignQuantity.Kind.Transition);
        var resonances = targets.Any(t => t.What == DesignQuantity.Kind.Resonance);
        return new DesignSolution(bands > 0 ? BandSolver.Compute(structure.Cell, bands).Structure : null,
            levels || resonances ? StackQuantities.Solve(structure, levels, resonances) : null);
    }
}

/// <summary>
/// Solves a structure with given values of its adjustable layer fields and returns the target quantities with their
/// exact derivatives (a Jacobian for the optimiser), reusing the sweep's field paths and the library's solvers.
/// </summary>
internal sealed class DesignModel(JsonObject structure, IReadOnlyList<string> fields, IReadOnlyList<(int Element, LayerQuantity Quantity)> layers,
    IReadOnlyList<DesignQuantity> targets)
{
    /// <summary>
    /// The targets' values and d(value)/d(field) at the given field values; a target the design does not have (fewer
    /// levels or resonances than it names) is NaN, with a zero row of the Jacobian.
    /// </summary>
    public (double[] Values, double[,] Jacobian) Evaluate(ReadOnlySpan<double> parameters)
    {
        var solved = Solve(parameters);
        var values = new double[targets.Count];
        var jacobian = new double[targets.Count, fields.Count];
        for (var i = 0; i < targets.Count; i++)
        {
            if (targets[i].Value(solved) is not { } value)
            {
                values[i] = double.NaN;
                continue;
            }
            values[i] = value;
            for (var j = 0; j < fields.Count; j++)
            {
                jacobian[i, j] = targets[i].Derivative(solved, layers[j].Element, layers[j].Quantity)
                    ?? throw new InvalidOperationException($"{targets[i].Name} has no derivative with respect to {fields[j]} here (a closed gap, levels not separable, or a flat peak).");
            }
        }
        return (values, jacobian);
    }

    /// <summary>The targets' values of the structure with <paramref name="edit"/> applied (for the tolerance table); NaN for a target the design does not have.</summary>
    public double[] Values(ReadOnlySpan<double> parameters, Action<JsonObject>? edit = null)
    {
        var solved = Solve(parameters, edit);
        return targets.Select(t => t.Value(solved) ?? double.NaN).ToArray();
    }

    /// <summary>Each target's derivative with respect to one layer quantity at the given field values (null where none exists).</summary>
    public double?[] Derivatives(ReadOnlySpan<double> parameters, int element, LayerQuantity quantity)
    {
        var solved = Solve(parameters);
        return targets.Select(t => t.Derivative(solved, element, quantity)).ToArray();
    }

    private DesignSolution Solve(ReadOnlySpan<double> parameters, Action<JsonObject>? edit = null)
    {
        var document = structure.DeepClone().AsObject();
        for (var j = 0; j < fields.Count; j++)
        {
            FieldPath.Set(document, fields[j], parameters[j]);
        }
        edit?.Invoke(document);
        var parsed = StructureFile.Parse(Encoding.UTF8.GetBytes(document.ToJsonString()), "design");
        return DesignSolution.Solve(parsed, targets);
    }
}
