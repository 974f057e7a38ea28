// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Structures;

public sealed class UnitCellTest
{
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);

    private static Layer MakeLayer(double w, double v) => Layer.Create(Length.FromNanometres(w), Energy.FromElectronVolts(v), Mass);

    [Fact]
    public void Create_Empty_NamesElements()
    {
        var error = Assert.Throws<ArgumentException>(() => UnitCell.Create());
        Assert.Equal("elements", error.ParamName);
        Assert.Contains("positive width", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_OnlyDeltas_NamesElements()
    {
        var error = Assert.Throws<ArgumentException>(() => UnitCell.Create(DeltaBarrier.Create(0.1), DeltaBarrier.Create(-0.1)));
        Assert.Equal("elements", error.ParamName);
        Assert.Contains("2 element(s)", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Create_NullElement_NamesElementsAndIndex()
    {
        var error = Assert.Throws<ArgumentException>(() => UnitCell.Create(MakeLayer(1, 0), null!));
        Assert.Equal("elements", error.ParamName);
        Assert.Contains("elements[1]", error.Message, StringComparison.Ordinal);
        Assert.Equal("elements", Assert.Throws<ArgumentNullException>(() => UnitCell.Create((IEnumerable<CellElement>)null!)).ParamName);
    }

    [Fact]
    public void FromLayers_Empty_NamesWidths()
    {
        var error = Assert.Throws<ArgumentException>(() => UnitCell.FromLayers([], [], []));
        Assert.Equal("widthsNanometres", error.ParamName);
    }

    [Fact]
    public void FromLayers_LengthMismatch_GivesAllLengths()
    {
        var error = Assert.Throws<ArgumentException>(() => UnitCell.FromLayers([1, 2], [0, 0.3], [0.067]));
        Assert.Equal("potentialsElectronVolts", error.ParamName);
        Assert.Contains("2, 2 and 1", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-2.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void FromLayers_BadWidth_NamesWidthsAndLayerIndex(double w)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => UnitCell.FromLayers([1, 2, w], [0, 0.3, 0], [0.067, 0.09, 0.067]));
        Assert.Equal("widthsNanometres", error.ParamName);
        Assert.Contains("layer 2", error.Message, StringComparison.Ordinal);
        Assert.Contains("width", error.Message, StringComparison.Ordinal);
        Assert.Contains("positive and finite", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.NegativeInfinity)]
    public void FromLayers_BadPotential_NamesPotentialsAndLayerIndex(double v)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => UnitCell.FromLayers([1, 2], [0, v], [0.067, 0.09]));
        Assert.Equal("potentialsElectronVolts", error.ParamName);
        Assert.Contains("layer 1", error.Message, StringComparison.Ordinal);
        Assert.Contains("finite", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-0.067)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void FromLayers_BadMass_NamesMassesAndLayerIndex(double m)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => UnitCell.FromLayers([1, 2], [0, 0.3], [m, 0.09]));
        Assert.Equal("massesElectronMasses", error.ParamName);
        Assert.Contains("layer 0", error.Message, StringComparison.Ordinal);
        Assert.Contains("mass", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Period_IsTheSumOfWidths_DeltasAddNothing()
    {
        var cell = UnitCell.Create(MakeLayer(1.25, 0), DeltaBarrier.Create(0.1), MakeLayer(2.5, 0.3));
        Assert.Equal(3.75, cell.Period.Nanometres);
        Assert.Equal(Math.PI / 3.75, cell.ZoneBoundaryPerNanometre);
        Assert.Equal(0.0, cell.MinimumPotential.ElectronVolts);
        Assert.Equal(0.3, cell.MaximumPotential.ElectronVolts);
    }

    [Fact]
    public void Rotate_ShiftsCyclically_AnyOffset()
    {
        var a = MakeLayer(1, 0);
        var b = DeltaBarrier.Create(0.1);
        var c = MakeLayer(2, 0.3);
        var cell = UnitCell.Create(a, b, c);
        Assert.Equal(new CellElement[] { b, c, a }, cell.Rotate(1).Elements);
        Assert.Equal(new CellElement[] { c, a, b }, cell.Rotate(-1).Elements);
        Assert.Equal(new CellElement[] { b, c, a }, cell.Rotate(7).Elements);
        Assert.Equal(new CellElement[] { c, b, a }, cell.Reverse().Elements);
        Assert.Equal(new CellElement[] { a, b, c }, cell.Elements); // the original is unchanged
    }

    [Fact]
    public void KronigPenney_IsWellThenBarrier()
    {
        var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25), Mass, EffectiveMass.FromElectronMasses(0.092));
        var well = Assert.IsType<Layer>(cell.Elements[0]);
        var barrier = Assert.IsType<Layer>(cell.Elements[1]);
        Assert.Equal(0.0, well.Potential.ElectronVolts);
        Assert.Equal(0.25, barrier.Potential.ElectronVolts);
        Assert.Equal(0.092, barrier.Mass.ElectronMasses);
        Assert.Equal(7.0, cell.Period.Nanometres);
    }
}
