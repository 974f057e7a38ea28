// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using Periodic.Stacks;

namespace Periodic.Tests.Stacks;

/// <summary>House conventions (STYLE.md) checked by reflection over the public types of Periodic.Stacks.</summary>
public sealed class StacksConventionsTest
{
    private static IEnumerable<Type> PublicTypes() =>
        typeof(LayerStack).Assembly.GetExportedTypes().Where(t => t.Namespace == "Periodic.Stacks");

    [Fact]
    public void PublicStructs_AreReadOnly()
    {
        var structs = PublicTypes().Where(t => t.IsValueType && !t.IsEnum).ToList();
        Assert.NotEmpty(structs);
        Assert.All(structs, t => Assert.True(t.GetCustomAttribute<IsReadOnlyAttribute>() is not null, $"{t.Name} is not readonly"));
    }

    [Fact]
    public void PublicClasses_AreSealedAndOverrideToString()
    {
        var types = PublicTypes().Where(t => !t.IsEnum && !t.IsInterface).ToList();
        Assert.All(types.Where(t => t.IsClass), t => Assert.True(t.IsSealed, $"{t.Name} is not sealed"));
        // Static classes (abstract and sealed in IL) have no instances to print.
        Assert.All(types.Where(t => !t.Name.EndsWith("Options", StringComparison.Ordinal) && !(t.IsAbstract && t.IsSealed)),
            t => Assert.True(t.GetMethod("ToString", Type.EmptyTypes)!.DeclaringType == t, $"{t.Name} does not override ToString"));
    }
}
