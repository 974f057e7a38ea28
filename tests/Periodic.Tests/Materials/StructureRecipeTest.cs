// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Units;

namespace Periodic.Tests.Materials;

public sealed class StructureRecipeTest
{
    [Fact]
    public void Parse_EngineerNotation()
    {
        var recipe = StructureRecipe.Parse("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K");
        Assert.Equal(77, recipe.Temperature.Kelvin);
        Assert.Equal(2, recipe.Layers.Count);
        Assert.Same(Material.GaAs, recipe.Layers[0].Material);
        Assert.Equal(5, recipe.Layers[0].Width.Nanometres);
        Assert.Equal("Al0.3Ga0.7As", recipe.Layers[1].Material.Name);
        Assert.Equal(2, recipe.Layers[1].Width.Nanometres);
        Assert.Equal(Carrier.Electron, recipe.Carrier);
        Assert.False(recipe.IsNonParabolic);
        Assert.Equal("5 nm GaAs / 2 nm Al0.3Ga0.7As at 77 K, Electron, parabolic", recipe.ToString());
    }

    [Fact]
    public void Parse_AngstromsMonolayersAndShortAlloyNames()
    {
        var recipe = StructureRecipe.Parse("20 A InAs / 4 ML GaSb / 3 nm In0.53GaAs", Temperature.FromKelvin(4.2));
        Assert.Equal(2.0, recipe.Layers[0].Width.Nanometres, 1e-15);
        // One monolayer along [001] is a/2 (zinc-blende geometry); GaSb a = 6.0959 Å from memory of Vurgaftman et al.
        Assert.Equal(4 * 0.60959 / 2, recipe.Layers[1].Width.Nanometres, 1e-15);
        Assert.Equal("In0.53Ga0.47As", recipe.Layers[2].Material.Name);
        Assert.Equal(4.2, recipe.Temperature.Kelvin);
    }

    [Fact]
    public void Parse_BadText_NamesParameter()
    {
        Assert.Equal("text", Assert.Throws<ArgumentException>(() => StructureRecipe.Parse("5 nm GaAs / 2 nm")).ParamName);
        Assert.Equal("text", Assert.Throws<ArgumentException>(() => StructureRecipe.Parse("5 nm GaAs")).ParamName);
        Assert.Equal("temperature", Assert.Throws<ArgumentException>(() => StructureRecipe.Parse("5 nm GaAs at 4 K", Temperature.FromKelvin(10))).ParamName);
        Assert.Equal("name", Assert.Throws<ArgumentException>(() => StructureRecipe.Parse("5 nm Si at 4 K")).ParamName);
        Assert.Equal("name", Assert.Throws<ArgumentException>(() => StructureRecipe.Parse("5 nm Al0.3Ga0.6As at 4 K")).ParamName);
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => StructureRecipe.Parse("5 nm GaAs at 2000 K")).ParamName);
    }

    [Fact]
    public void AddRepeated_ExpandsGroups()
    {
        var well = RecipeLayer.Create(Material.GaAs, Length.FromNanometres(2));
        var barrier = RecipeLayer.FromMonolayers(Material.AlAs, 4);
        var recipe = StructureRecipe.Create(Temperature.FromKelvin(300)).AddRepeated(3, well, barrier).Add(Material.GaAs, Length.FromNanometres(10));
        Assert.Equal(7, recipe.Layers.Count);
        Assert.Same(barrier, recipe.Layers[5]);
        Assert.Equal(3 * (2 + 4 * 0.56611 / 2) + 10, recipe.Build().Cell.Period.Nanometres, 1e-12);
    }

    [Fact]
    public void With_Copies()
    {
        var a = StructureRecipe.Create(Temperature.FromKelvin(10));
        var b = a.WithTemperature(Temperature.FromKelvin(300)).WithPeriods(20).WithNonParabolicity(true).WithSubstrate(Material.InP).WithLimits(ModelLimits.Default.WithMinimumMonolayers(1));
        Assert.Equal(10, a.Temperature.Kelvin);
        Assert.Equal(300, b.Temperature.Kelvin);
        Assert.Equal(20, b.Periods);
        Assert.True(b.IsNonParabolic);
        Assert.Same(Material.InP, b.Substrate);
        Assert.Equal(1, b.Limits.MinimumMonolayers);
    }

    [Fact]
    public void BadArguments_NameTheParameter()
    {
        var r = StructureRecipe.Create(Temperature.FromKelvin(10));
        Assert.Equal("kelvin", Assert.Throws<ArgumentOutOfRangeException>(() => StructureRecipe.Create(Temperature.FromKelvin(-3))).ParamName);
        Assert.Equal("width", Assert.Throws<ArgumentOutOfRangeException>(() => r.Add(Material.GaAs, Length.FromNanometres(0))).ParamName);
        Assert.Equal("material", Assert.Throws<ArgumentNullException>(() => r.Add(null!, Length.FromNanometres(1))).ParamName);
        Assert.Equal("repetitions", Assert.Throws<ArgumentOutOfRangeException>(() => r.AddRepeated(0, RecipeLayer.Create(Material.GaAs, Length.FromNanometres(1)))).ParamName);
        Assert.Equal("layers", Assert.Throws<ArgumentException>(() => r.AddRepeated(2)).ParamName);
        Assert.Equal("periods", Assert.Throws<ArgumentOutOfRangeException>(() => r.WithPeriods(0)).ParamName);
        Assert.Equal("carrier", Assert.Throws<ArgumentOutOfRangeException>(() => r.WithCarrier((Carrier)7)).ParamName);
        Assert.Equal("carrier", Assert.Throws<ArgumentException>(() => r.WithNonParabolicity(true).WithCarrier(Carrier.HeavyHole)).ParamName);
        Assert.Equal("nonParabolic", Assert.Throws<ArgumentException>(() => r.WithCarrier(Carrier.LightHole).WithNonParabolicity(true)).ParamName);
        Assert.Equal("monolayers", Assert.Throws<ArgumentOutOfRangeException>(() => RecipeLayer.FromMonolayers(Material.GaAs, 0)).ParamName);
        Assert.Throws<InvalidOperationException>(() => r.Build());
    }
}
