// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using Periodic.Materials;

namespace Periodic.Tests.Materials;

public sealed class MaterialsConventionsTest
{
    private static readonly Type[] PublicTypes = typeof(Material).Assembly.GetExportedTypes()
        .Where(t => t.Namespace == "Periodic.Materials").ToArray();

    [Fact]
    public void PublicTypes_AreSealedClassesReadonlyStructsOrEnums()
    {
        // House style: immutable results, thread-safe by construction.
        Assert.NotEmpty(PublicTypes);
        foreach (var type in PublicTypes)
        {
            if (type.IsEnum)
            {
                continue;
            }
            if (type.IsValueType)
            {
                Assert.True(type.GetCustomAttribute<IsReadOnlyAttribute>() is not null, $"{type.Name} must be a readonly struct");
            }
            else
            {
                Assert.True(type.IsSealed || (type.IsAbstract && type.IsSealed), $"{type.Name} must be sealed or static");
                Assert.DoesNotContain(type.GetProperties(BindingFlags.Public | BindingFlags.Instance), p => p.SetMethod?.IsPublic == true);
            }
        }
    }

    [Fact]
    public void PublicClassesAndStructs_OverrideToString()
    {
        foreach (var type in PublicTypes.Where(t => !t.IsEnum && !(t.IsAbstract && t.IsSealed)))
        {
            Assert.True(type.GetMethod("ToString", Type.EmptyTypes)!.DeclaringType == type, $"{type.Name} must override ToString");
        }
    }
}
