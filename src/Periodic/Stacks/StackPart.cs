// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// One part of a <see cref="LayerStack"/> between its leads: either a single element (a layer or a
/// delta barrier) or a unit cell repeated a given number of times. Immutable.
/// </summary>
public sealed class StackPart
{
    private StackPart(CellElement? element, UnitCell? cell, int repetitions)
    {
        Element = element;
        Cell = cell;
        Repetitions = repetitions;
    }

    /// <summary>The single element of this part, or null when the part is a repeated cell.</summary>
    public CellElement? Element { get; }

    /// <summary>The repeated cell of this part, or null when the part is a single element.</summary>
    public UnitCell? Cell { get; }

    /// <summary>How many times <see cref="Cell"/> repeats (1 for a single element).</summary>
    public int Repetitions { get; }

    /// <summary>True when this part is a repeated unit cell.</summary>
    public bool IsRepeatedCell => Cell is not null;

    /// <summary>Thickness of the part.</summary>
    public Length Thickness => Cell is null ? Element!.Width : Length.FromNanometres(Repetitions * Cell.Period.Nanometres);

    /// <summary>Number of elements the part holds when written out one by one.</summary>
    public long ElementCount => Cell is null ? 1 : (long)Repetitions * Cell.Elements.Count;

    /// <summary>A part holding one layer or delta barrier.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="element"/> is null.</exception>
    public static StackPart Single(CellElement element)
    {
        ArgumentNullException.ThrowIfNull(element);
        return new StackPart(element, null, 1);
    }

    /// <summary>A part holding <paramref name="repetitions"/> consecutive copies of <paramref name="cell"/>.</summary>
    /// <param name="cell">The cell to repeat.</param>
    /// <param name="repetitions">Number of periods, 1 to <see cref="LayerStack.MaxRepetitions"/>.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="repetitions"/> is outside 1 to <see cref="LayerStack.MaxRepetitions"/>.</exception>
    public static StackPart Repeat(UnitCell cell, int repetitions)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(repetitions, 1, LayerStack.MaxRepetitions);
        return new StackPart(null, cell, repetitions);
    }

    /// <summary>Implicit conversion of a layer or delta to a single-element part.</summary>
    public static implicit operator StackPart(CellElement element) => Single(element);

    /// <inheritdoc />
    public override string ToString() => Cell is null
        ? Element!.ToString()!
        : string.Create(CultureInfo.InvariantCulture,
            $"{Repetitions} x cell of {Cell.Elements.Count} element(s), period {Cell.Period.Nanometres:G6} nm");
}
