// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Stacks;

public sealed class LayerStackTest
{
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);
    private static readonly Lead Ground = Lead.Create(default, Mass);

    private static Layer Slab(double widthNm, double potentialEv) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), Mass);

    private static UnitCell Cell() => UnitCell.Create(Slab(4, 0), Slab(2, 0.3));

    [Fact]
    public void Periodic_CountsThicknessAndElements()
    {
        var stack = LayerStack.Periodic(Ground, Cell(), 25, Ground, before: [Slab(3, 0.3)], after: [Slab(4, 0), Slab(3, 0.3)]);
        Assert.Equal(4, stack.Parts.Count);
        Assert.Equal(25 * 6 + 3 + 4 + 3, stack.Thickness.Nanometres, 1e-12);
        Assert.Equal(25 * 2 + 3, stack.ElementCount);
    }

    [Fact]
    public void WithDefect_PlacesDefectBetweenTheRepeatedCells()
    {
        var stack = LayerStack.WithDefect(Ground, Cell(), 3, [Slab(7, 0)], 5, Ground);
        Assert.Equal(3, stack.Parts.Count);
        Assert.Equal(3, stack.Parts[0].Repetitions);
        Assert.False(stack.Parts[1].IsRepeatedCell);
        Assert.Equal(5, stack.Parts[2].Repetitions);
    }

    [Fact]
    public void Reverse_SwapsLeadsAndMirrorsParts()
    {
        var right = Lead.Create(Energy.FromElectronVolts(0.1), EffectiveMass.FromElectronMasses(0.09));
        var stack = LayerStack.Create(Ground, right, Slab(1, 0.2), StackPart.Repeat(Cell(), 2));
        var reversed = stack.Reverse();
        Assert.Equal(right, reversed.LeftLead);
        Assert.Equal(Ground, reversed.RightLead);
        Assert.True(reversed.Parts[0].IsRepeatedCell);
        Assert.Equal(0.3, ((Layer)reversed.Parts[0].Cell!.Elements[0]).Potential.ElectronVolts);
        Assert.Equal(stack.Thickness.Nanometres, reversed.Thickness.Nanometres, 1e-12);
    }

    [Fact]
    public void Create_BadInput_NamesParameterIndexAndRule()
    {
        var nullPart = Assert.Throws<ArgumentException>(() => LayerStack.Create(Ground, [Slab(1, 0), null!], Ground));
        Assert.Equal("parts", nullPart.ParamName);
        Assert.Contains("parts[1]", nullPart.Message);
        Assert.Equal("leftLead", Assert.Throws<ArgumentException>(() => LayerStack.Create(default, Ground)).ParamName);
        Assert.Equal("rightLead", Assert.Throws<ArgumentException>(() => LayerStack.Create(Ground, default(Lead))).ParamName);
        var periods = Assert.Throws<ArgumentOutOfRangeException>(() => LayerStack.Periodic(Ground, Cell(), 0, Ground));
        Assert.Equal("periods", periods.ParamName);
        Assert.Contains("got 0", periods.Message);
        Assert.Equal("repetitions", Assert.Throws<ArgumentOutOfRangeException>(() => StackPart.Repeat(Cell(), -3)).ParamName);
        Assert.Equal("defect", Assert.Throws<ArgumentException>(() => LayerStack.WithDefect(Ground, Cell(), 1, [], 1, Ground)).ParamName);
        Assert.Equal("periodsAfter", Assert.Throws<ArgumentOutOfRangeException>(() => LayerStack.WithDefect(Ground, Cell(), 1, [Slab(1, 0)], -1, Ground)).ParamName);
        var badAfter = Assert.Throws<ArgumentException>(() => LayerStack.Periodic(Ground, Cell(), 2, Ground, after: [Slab(1, 0), null!]));
        Assert.Equal("after", badAfter.ParamName);
        Assert.Contains("after[1]", badAfter.Message);
        Assert.Equal("mass", Assert.Throws<ArgumentOutOfRangeException>(() => Lead.Create(default, default)).ParamName);
    }

    [Fact]
    public void ToString_ListsLeadsAndParts()
    {
        // The library formats with the invariant culture (the test host runs with invariant globalization).
        var text = LayerStack.Periodic(Ground, Cell(), 10, Ground).ToString();
        Assert.Contains("10 x cell of 2 element(s), period 6 nm", text);
        Assert.Contains("left  Lead V = 0 eV, m = 0.067 m0", text);
        Assert.Contains("thickness 60 nm", text);
        var result = StackTransmission.Create(LayerStack.Periodic(Ground, Cell(), 10, Ground)).Evaluate(0.08).ToString();
        Assert.StartsWith("E = 0.08 eV: T = ", result);
        Assert.Contains("log10 T = ", result);
    }
}
