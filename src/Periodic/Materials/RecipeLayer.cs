// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Materials;

/// <summary>One layer of a <see cref="StructureRecipe"/>: a material and a thickness.</summary>
public sealed class RecipeLayer
{
    private RecipeLayer(Material material, Length width)
    {
        Material = material;
        Width = width;
    }

    /// <summary>The layer's material.</summary>
    public Material Material { get; }

    /// <summary>The layer's thickness (positive).</summary>
    public Length Width { get; }

    /// <summary>Creates a layer of <paramref name="material"/> with thickness <paramref name="width"/>.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="material"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="width"/> is not positive.</exception>
    public static RecipeLayer Create(Material material, Length width)
    {
        ArgumentNullException.ThrowIfNull(material);
        if (!(width.Nanometres > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(width), width.Nanometres,
                $"width must be positive; got {Preconditions.Format(width.Nanometres)} nm.");
        }
        return new RecipeLayer(material, width);
    }

    /// <summary>Creates a layer of a whole number of monolayers (a/2 of the material each).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="material"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="monolayers"/> is less than 1.</exception>
    public static RecipeLayer FromMonolayers(Material material, int monolayers)
    {
        ArgumentNullException.ThrowIfNull(material);
        Preconditions.CheckPositive(monolayers);
        return new RecipeLayer(material, Length.FromNanometres(monolayers * material.MonolayerNanometres));
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Width.Nanometres:G6} nm {Material.Name}");
}
