// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Materials;
using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Serialization;

/// <summary>A structure read from a structure file: its name, optional description and unit cell.</summary>
public sealed partial class StructureDefinition
{
    internal StructureDefinition(string name, string? description, UnitCell cell, string?[] labels, string sourceName, BuiltStructure? materials, LayerStack? stack, Energy stackBias)
    {
        Name = name;
        Description = description;
        Cell = cell;
        Labels = new ReadOnlyCollection<string?>(labels);
        SourceName = sourceName;
        Materials = materials;
        Stack = stack;
        StackBias = stackBias;
    }

    /// <summary>
    /// The same structure as a carrier with in-plane wavevector <paramref name="inPlaneWavevectorPerNanometre"/> (1/nm) sees it:
    /// the cell by <see cref="InPlaneMotion.CellAt(UnitCell, double)"/> and the stack, if any, by <see cref="InPlaneStack.At"/>; its
    /// name says the k∥.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">k∥ is not finite, negative or above <see cref="InPlaneMotion.MaxWavevectorPerNanometre"/>.</exception>
    /// <exception cref="ArgumentException">The structure holds a non-parabolic layer, a function or a sampled segment.</exception>
    public StructureDefinition AtInPlaneWavevector(double inPlaneWavevectorPerNanometre) => new(
        string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{Name} at k∥ = {inPlaneWavevectorPerNanometre:R} /nm"),
        Description, InPlaneMotion.CellAt(Cell, inPlaneWavevectorPerNanometre), [.. Labels], SourceName, Materials,
        Stack is null ? null : InPlaneStack.At(Stack, inPlaneWavevectorPerNanometre), StackBias);

    /// <summary>
    /// The doping of the cell (the layers' <c>donors</c>, <c>acceptors</c>, <c>sheetDonors</c> and <c>permittivity</c> and the
    /// file's <c>temperature</c>), validated; null when no layer is doped. <see cref="Cell"/> stays the rigid cell: solve the doped
    /// cell with <see cref="SpaceChargeSolver"/> and apply the result with <see cref="WithSelfConsistentCell"/>.
    /// </summary>
    public DopedCell? Doping { get; internal init; }

    /// <summary>
    /// The self-consistent solution this structure now carries (from <see cref="WithSelfConsistentCell"/>), or null for the rigid bands.
    /// </summary>
    public SelfConsistentCell? SelfConsistent { get; private init; }

    /// <summary>
    /// The doping of the file's finite stack (<see cref="Stack"/>): repeated cells carry the cell's doping, single layers their own
    /// (<c>donors</c>, <c>acceptors</c>, <c>sheetDonors</c>, <c>permittivity</c> in <c>stack.parts</c>), the leads are undoped; null
    /// when the file has no stack or its stack holds no dopants. Solve it with
    /// <see cref="SpaceChargeSolver.SolveStack(DopedStack, SpaceChargeOptions?, IProgress{SpaceChargeProgress}?, CancellationToken)"/> and apply the
    /// result with <see cref="WithSelfConsistentStack"/>.
    /// </summary>
    public DopedStack? StackDoping { get; internal init; }

    /// <summary>
    /// Why the space charge of the file's doped stack is not solved although its cell's is, or null: a stack of material layers
    /// whose holes would matter (no more donors than acceptors, or an acceptor level), which the finite-stack model, electrons
    /// only, does not take. <see cref="StackDoping"/> is then null; the rigid stack is still available.
    /// </summary>
    public string? StackSpaceChargeRefusal { get; internal init; }

    /// <summary>The self-consistent solution of the file's stack this structure now carries (from <see cref="WithSelfConsistentStack"/>), or null.</summary>
    public SelfConsistentStack? SelfConsistentStack { get; private init; }

    /// <summary>
    /// The same structure with the self-consistent stack of <paramref name="solution"/> in place of the rigid <see cref="Stack"/>
    /// (lead buffers included, see <see cref="SelfConsistentStack.Stack"/>); the cell stays as it is. The stack's bias must be zero.
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="solution"/> is null.</exception>
    /// <exception cref="ArgumentException">The solution belongs to another stack than this structure's <see cref="StackDoping"/>.</exception>
    public StructureDefinition WithSelfConsistentStack(SelfConsistentStack solution)
    {
        ArgumentNullException.ThrowIfNull(solution);
        if (StackDoping is null || !ReferenceEquals(solution.Input.Stack, Stack))
        {
            throw new ArgumentException("solution must solve this structure's own doped stack (StructureDefinition.StackDoping).", nameof(solution));
        }
        return new StructureDefinition(Name, Description, Cell, [.. Labels], SourceName, Materials, solution.Stack, StackBias)
        {
            Doping = Doping,
            StackDoping = StackDoping,
            SelfConsistent = SelfConsistent,
            SelfConsistentStack = solution,
        };
    }

    /// <summary>
    /// The same structure with the self-consistent cell of <paramref name="solution"/> in place of the rigid cell: the cell, and in
    /// a finite stack every repeated period of the file's cell (single layers and the leads stay as given; the stack's own space
    /// charge, its ends and the leads' Fermi level are not solved).
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="solution"/> is null.</exception>
    /// <exception cref="ArgumentException">The solution belongs to another cell than this structure's doping.</exception>
    public StructureDefinition WithSelfConsistentCell(SelfConsistentCell solution)
    {
        ArgumentNullException.ThrowIfNull(solution);
        if (Doping is null || !ReferenceEquals(solution.Input.Cell, Cell))
        {
            throw new ArgumentException("solution must solve this structure's own doped cell (StructureDefinition.Doping).", nameof(solution));
        }
        LayerStack? stack = null;
        if (Stack is { } rigid)
        {
            var parts = rigid.Parts.Select(p => p.Cell is { } c && ReferenceEquals(c, Cell) ? StackPart.Repeat(solution.Cell, p.Repetitions) : p);
            stack = LayerStack.Create(rigid.LeftLead, parts, rigid.RightLead);
        }
        return new StructureDefinition(Name, Description, solution.Cell, [.. Labels], SourceName, Materials, stack, StackBias)
        {
            Doping = Doping,
            SelfConsistent = solution,
            StackSpaceChargeRefusal = StackSpaceChargeRefusal,
        };
    }

    /// <summary>
    /// The finite stack the file describes (its <c>stack</c> field: N periods of the cell between two leads),
    /// or null when the file describes only the infinite crystal.
    /// </summary>
    public LayerStack? Stack { get; }

    /// <summary>
    /// The bias eU across <see cref="Stack"/> (the stack's <c>bias</c> field; positive: the right lead's band edge
    /// lies lower), for <see cref="StackTransmission.Create(LayerStack, Energy)"/>; zero when the file gives none or
    /// has no stack. A non-zero value has been checked to be allowed for the stack.
    /// </summary>
    public Energy StackBias { get; }

    /// <summary>
    /// For a cell of material layers: the structure built from the material table, with its validity
    /// <see cref="BuiltStructure.Warnings"/> and the reference energy of the potentials; null for a cell given by
    /// explicit potentials and masses.
    /// </summary>
    public BuiltStructure? Materials { get; }

    /// <summary>The structure's name (the file's <c>name</c> field).</summary>
    public string Name { get; }

    /// <summary>The free-text description, or null when the file has none.</summary>
    public string? Description { get; }

    /// <summary>The unit cell.</summary>
    public UnitCell Cell { get; }

    /// <summary>The <c>label</c> of each cell element (null where none was given), in cell order.</summary>
    public IReadOnlyList<string?> Labels { get; }

    /// <summary>Where the structure was read from (file path or source name).</summary>
    public string SourceName { get; }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"Structure \"{Name}\" from {SourceName}");
        if (Description is not null)
        {
            text.AppendLine().Append("  ").Append(Description);
        }
        text.AppendLine().Append(Cell);
        return text.ToString();
    }
}
