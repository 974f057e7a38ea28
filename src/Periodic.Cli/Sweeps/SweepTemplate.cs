// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;
using Periodic.Serialization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// The short way from a design's values to its cell, for the common sweep: a cell of layers and deltas given by numbers
/// (no materials, doping, finite stack or optical lattice), parameters that are the width, potential, mass or
/// non-parabolicity of a uniform layer or the strength of a delta, and only band outputs. The structure is read once;
/// each design copies the parsed elements and rebuilds the varied ones with its values, as the structure reader builds
/// them from a document with those numbers written in (the same factories on the same doubles: the same cell, bit for
/// bit). A value the reader would refuse is not built here: the caller then reads the design's document, so that the
/// row carries the reader's own error.
/// </summary>
internal sealed partial class SweepTemplate
{
    private enum Quantity
    {
        Width,
        Potential,
        Mass,
        NonParabolicity,
        Delta,
    }

    private readonly CellElement[] _elements;
    private readonly (int Element, Quantity Quantity)[] _targets;

    private SweepTemplate(CellElement[] elements, (int, Quantity)[] targets)
    {
        _elements = elements;
        _targets = targets;
    }

    /// <summary>The template of <paramref name="spec"/>, or null when its designs must each be read as a document.</summary>
    public static SweepTemplate? TryCreate(SweepSpec spec)
    {
        var outputs = spec.Outputs;
        if (outputs.NeedsLevels || outputs.Resonances > 0 || outputs.Hubbard is not null || spec.Bands == 0)
        {
            return null;
        }
        // Fields beyond the cell (a stack, a temperature, a lattice) are read against the design's cell: not here.
        foreach (var (name, _) in spec.Structure)
        {
            if (name is not ("$schema" or "name" or "description" or "cell"))
            {
                return null;
            }
        }
        StructureDefinition structure;
        try
        {
            structure = StructureFile.Parse(Encoding.UTF8.GetBytes(spec.Structure.ToJsonString()), spec.StructureSource);
        }
        catch (StructureFileException)
        {
            return null; // each design's document says what is wrong (a parameter may replace the faulty value)
        }
        if (structure.Materials is not null || structure.Doping is not null || structure.Stack is not null || structure.OpticalLattice is not null)
        {
            return null;
        }
        var elements = structure.Cell.Elements.ToArray();
        var targets = new (int, Quantity)[spec.Parameters.Count];
        for (var j = 0; j < targets.Length; j++)
        {
            var match = CellField().Match(spec.Parameters[j].Field);
            if (!match.Success || !int.TryParse(match.Groups[1].Value, NumberStyles.None, CultureInfo.InvariantCulture, out var element) || element >= elements.Length)
            {
                return null;
            }
            var quantity = match.Groups[2].Value switch
            {
                "width" => Quantity.Width,
                "potential" => Quantity.Potential,
                "mass" => Quantity.Mass,
                "nonParabolicity" => Quantity.NonParabolicity,
                _ => Quantity.Delta,
            };
            if ((quantity == Quantity.Delta) != (elements[element] is DeltaBarrier) || (quantity != Quantity.Delta && elements[element] is not Layer))
            {
                return null;
            }
            targets[j] = (element, quantity);
        }
        return new SweepTemplate(elements, targets);
    }

    /// <summary>
    /// The cell of the design with <paramref name="values"/> (in parameter order), or null when a value is one the structure
    /// reader refuses (outside <see cref="StructureFileLimits"/> or the factories' rules).
    /// </summary>
    public UnitCell? TryBuild(ReadOnlySpan<double> values)
    {
        var elements = (CellElement[])_elements.Clone();
        for (var j = 0; j < _targets.Length; j++)
        {
            var (element, quantity) = _targets[j];
            var value = values[j];
            // A document holds -0 as written and reads it back so; the factories below see the same sign either way, but
            // a negative zero is rare enough to leave to the document.
            if ((value == 0 && double.IsNegative(value)) || !Accepted(quantity, value))
            {
                return null;
            }
            try
            {
                elements[element] = quantity switch
                {
                    Quantity.Width => ((Layer)elements[element]).WithWidth(Length.FromNanometres(value)),
                    Quantity.Potential => ((Layer)elements[element]).WithPotential(Energy.FromElectronVolts(value)),
                    Quantity.Mass => ((Layer)elements[element]).WithMass(EffectiveMass.FromElectronMasses(value)),
                    Quantity.NonParabolicity => ((Layer)elements[element]).WithNonParabolicity(value),
                    _ => DeltaBarrier.Create(value),
                };
            }
            catch (ArgumentException)
            {
                return null;
            }
        }
        try
        {
            return UnitCell.Create(elements);
        }
        catch (ArgumentException)
        {
            return null;
        }
    }

    /// <summary>
    /// True when the structure reader takes <paramref name="value"/> for the field (its physical range and sign rules, in
    /// <see cref="StructureFileLimits"/>). Never wider than the reader: a value outside goes to the document, which words the error.
    /// </summary>
    private static bool Accepted(Quantity quantity, double value) => quantity switch
    {
        Quantity.Width => value >= StructureFileLimits.MinWidthNanometres && value <= StructureFileLimits.MaxWidthNanometres,
        Quantity.Potential => Math.Abs(value) <= StructureFileLimits.MaxPotentialElectronVolts,
        Quantity.Mass => value >= StructureFileLimits.MinMassElectronMasses && value <= StructureFileLimits.MaxMassElectronMasses,
        Quantity.NonParabolicity => value >= 0 && value <= StructureFileLimits.MaxNonParabolicityPerElectronVolt,
        _ => Math.Abs(value) <= StructureFileLimits.MaxDeltaStrengthElectronVoltNanometres,
    };

    [GeneratedRegex(@"^cell\[(\d{1,6})\]\.(width|potential|mass|nonParabolicity|delta)$", RegexOptions.CultureInvariant)]
    private static partial Regex CellField();
}
