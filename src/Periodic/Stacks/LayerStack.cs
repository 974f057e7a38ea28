// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// A finite one-dimensional structure between two semi-infinite leads: left lead, an ordered list of
/// parts (single layers, delta barriers, repeated unit cells), right lead. The leads may differ in
/// band edge and mass. Positions run from x = 0 at the left lead's interface to
/// x = <see cref="Thickness"/> at the right lead's. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// The model is the single-band envelope-function approximation with BenDaniel–Duke matching
/// (D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966)). Band offsets and masses are uncertain
/// inputs: confirm design-critical numbers against measurement.
/// </remarks>
public sealed class LayerStack
{
    /// <summary>The largest repetition count of one part (2^30).</summary>
    public const int MaxRepetitions = 1 << 30;

    private readonly StackPart[] _parts;

    private LayerStack(Lead left, StackPart[] parts, Lead right)
    {
        LeftLead = left;
        RightLead = right;
        _parts = parts;
        Parts = new ReadOnlyCollection<StackPart>(parts);
        double thickness = 0;
        long count = 0;
        foreach (var part in parts)
        {
            thickness += part.Thickness.Nanometres;
            count += part.ElementCount;
        }
        Thickness = Length.FromNanometres(thickness);
        ElementCount = count;
    }

    /// <summary>The lead on the left (x &lt; 0), from which the incident wave comes.</summary>
    public Lead LeftLead { get; }

    /// <summary>The lead on the right (x &gt; <see cref="Thickness"/>).</summary>
    public Lead RightLead { get; }

    /// <summary>The parts between the leads, left to right.</summary>
    public IReadOnlyList<StackPart> Parts { get; }

    /// <summary>The thickness of the stack between the two leads.</summary>
    public Length Thickness { get; }

    /// <summary>Number of elements between the leads when every repeated cell is written out.</summary>
    public long ElementCount { get; }

    internal ReadOnlySpan<StackPart> PartSpan => _parts;

    /// <summary>Creates a stack from its leads and its parts in order (the list may be empty: a bare lead junction).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="parts"/> is null.</exception>
    /// <exception cref="ArgumentException">A lead is the default value, or a part is null (the message names its index).</exception>
    public static LayerStack Create(Lead leftLead, IEnumerable<StackPart> parts, Lead rightLead)
    {
        ArgumentNullException.ThrowIfNull(parts);
        leftLead.Validate(nameof(leftLead));
        rightLead.Validate(nameof(rightLead));
        var array = parts.ToArray();
        for (var i = 0; i < array.Length; i++)
        {
            if (array[i] is null)
            {
                throw new ArgumentException(
                    string.Create(CultureInfo.InvariantCulture, $"parts[{i}] is null; every part must be a single element or a repeated cell."),
                    nameof(parts));
            }
        }
        return new LayerStack(leftLead, array, rightLead);
    }

    /// <summary>Creates a stack from its leads and its parts in order.</summary>
    /// <exception cref="ArgumentException">A lead is the default value, or a part is null.</exception>
    public static LayerStack Create(Lead leftLead, Lead rightLead, params StackPart[] parts) =>
        Create(leftLead, (IEnumerable<StackPart>)parts, rightLead);

    /// <summary>
    /// <paramref name="periods"/> repetitions of <paramref name="cell"/> between two leads, with optional
    /// extra elements before and after (cap layers, contact barriers).
    /// </summary>
    /// <param name="leftLead">The left lead.</param>
    /// <param name="cell">The repeated cell.</param>
    /// <param name="periods">Number of periods, 1 to <see cref="MaxRepetitions"/>.</param>
    /// <param name="rightLead">The right lead.</param>
    /// <param name="before">Elements between the left lead and the first period (may be null).</param>
    /// <param name="after">Elements between the last period and the right lead (may be null).</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="periods"/> is outside 1 to <see cref="MaxRepetitions"/>.</exception>
    /// <exception cref="ArgumentException">A lead is the default value, or an extra element is null.</exception>
    public static LayerStack Periodic(Lead leftLead, UnitCell cell, int periods, Lead rightLead,
        IEnumerable<CellElement>? before = null, IEnumerable<CellElement>? after = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(periods, 1, MaxRepetitions);
        var parts = new List<StackPart>();
        AddElements(parts, before, nameof(before));
        parts.Add(StackPart.Repeat(cell, periods));
        AddElements(parts, after, nameof(after));
        return Create(leftLead, parts, rightLead);
    }

    /// <summary>
    /// A periodic stack with a defect: <paramref name="periodsBefore"/> periods of <paramref name="cell"/>,
    /// then the <paramref name="defect"/> elements, then <paramref name="periodsAfter"/> periods.
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> or <paramref name="defect"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A period count is outside 0 to <see cref="MaxRepetitions"/>.</exception>
    /// <exception cref="ArgumentException">A lead is the default value, a defect element is null, or the defect is empty.</exception>
    public static LayerStack WithDefect(Lead leftLead, UnitCell cell, int periodsBefore, IEnumerable<CellElement> defect, int periodsAfter, Lead rightLead)
    {
        ArgumentNullException.ThrowIfNull(cell);
        ArgumentNullException.ThrowIfNull(defect);
        Preconditions.CheckRange(periodsBefore, 0, MaxRepetitions);
        Preconditions.CheckRange(periodsAfter, 0, MaxRepetitions);
        var parts = new List<StackPart>();
        if (periodsBefore > 0)
        {
            parts.Add(StackPart.Repeat(cell, periodsBefore));
        }
        var before = parts.Count;
        AddElements(parts, defect, nameof(defect));
        if (parts.Count == before)
        {
            throw new ArgumentException("defect must hold at least one element; got none.", nameof(defect));
        }
        if (periodsAfter > 0)
        {
            parts.Add(StackPart.Repeat(cell, periodsAfter));
        }
        return Create(leftLead, parts, rightLead);
    }

    private static void AddElements(List<StackPart> parts, IEnumerable<CellElement>? elements, string paramName)
    {
        if (elements is null)
        {
            return;
        }
        var i = 0;
        foreach (var element in elements)
        {
            if (element is null)
            {
                throw new ArgumentException(
                    string.Create(CultureInfo.InvariantCulture, $"{paramName}[{i}] is null; every element must be a layer or a delta barrier."),
                    paramName);
            }
            parts.Add(StackPart.Single(element));
            i++;
        }
    }

    /// <summary>The mirror image: parts in reverse order, every repeated cell reversed, leads swapped.</summary>
    public LayerStack Reverse()
    {
        var reversed = new StackPart[_parts.Length];
        for (var i = 0; i < _parts.Length; i++)
        {
            var part = _parts[_parts.Length - 1 - i];
            reversed[i] = part.Cell is null ? part : StackPart.Repeat(part.Cell.Reverse(), part.Repetitions);
        }
        return new LayerStack(RightLead, reversed, LeftLead);
    }

    /// <summary>A copy with other leads.</summary>
    /// <exception cref="ArgumentException">A lead is the default value.</exception>
    public LayerStack WithLeads(Lead leftLead, Lead rightLead) => Create(leftLead, _parts, rightLead);

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"LayerStack: {_parts.Length} part(s), {ElementCount} element(s), thickness {Thickness.Nanometres:G6} nm");
        text.AppendLine().Append("  left  ").Append(LeftLead);
        for (var i = 0; i < _parts.Length; i++)
        {
            text.AppendLine().Append(CultureInfo.InvariantCulture, $"  [{i}] {_parts[i]}");
        }
        text.AppendLine().Append("  right ").Append(RightLead);
        return text.ToString();
    }
}
