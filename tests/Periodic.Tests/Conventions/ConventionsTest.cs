// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using Periodic.Units;

namespace Periodic.Tests.Conventions;

/// <summary>Reflection checks of the house conventions over the whole Periodic assembly (STYLE.md).</summary>
public sealed class ConventionsTest
{
    private static readonly Assembly Library = typeof(PhysicalConstants).Assembly;

    private static bool IsCompilerGenerated(MemberInfo member) =>
        member.IsDefined(typeof(CompilerGeneratedAttribute), false) || member.Name.Contains('<', StringComparison.Ordinal);

    [Fact]
    public void PublicStructs_AreReadOnly()
    {
        // Immutable typed results: every public struct is a readonly struct.
        var structs = Library.GetExportedTypes().Where(t => t.IsValueType && !t.IsEnum).ToArray();
        Assert.NotEmpty(structs);
        var mutable = structs.Where(t => !t.IsDefined(typeof(IsReadOnlyAttribute), false)).Select(t => t.FullName).ToArray();
        Assert.True(mutable.Length == 0, "not readonly: " + string.Join(", ", mutable));
    }

    [Fact]
    public void PublicTypes_HaveNoMutableStaticState()
    {
        // Thread-safe by construction: no public static field that is not readonly/const, and no public
        // static property with a public setter.
        var offenders = new List<string>();
        foreach (var type in Library.GetExportedTypes())
        {
            foreach (var field in type.GetFields(BindingFlags.Public | BindingFlags.Static | BindingFlags.DeclaredOnly))
            {
                if (!field.IsInitOnly && !field.IsLiteral && !type.IsEnum)
                {
                    offenders.Add($"{type.FullName}.{field.Name}");
                }
            }
            foreach (var property in type.GetProperties(BindingFlags.Public | BindingFlags.Static | BindingFlags.DeclaredOnly))
            {
                if (property.SetMethod is { IsPublic: true })
                {
                    offenders.Add($"{type.FullName}.{property.Name} (setter)");
                }
            }
        }
        Assert.True(offenders.Count == 0, "mutable public static state: " + string.Join(", ", offenders));
    }

    [Fact]
    public void AllTypes_HaveNoWritableStaticFields()
    {
        // No shared mutable state anywhere, internal types included (compiler-generated caches excepted).
        var offenders = Library.GetTypes()
            .Where(t => !IsCompilerGenerated(t))
            .SelectMany(t => t.GetFields(BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.Static | BindingFlags.DeclaredOnly)
                .Where(f => !f.IsInitOnly && !f.IsLiteral && !t.IsEnum && !IsCompilerGenerated(f))
                .Select(f => $"{t.FullName}.{f.Name}"))
            .ToArray();
        Assert.True(offenders.Length == 0, "writable static fields: " + string.Join(", ", offenders));
    }

    [Fact]
    public void PublicClasses_AreSealedStaticOrAbstract()
    {
        // Closed set of element kinds and immutable results: no public class is open for inheritance by accident.
        var open = Library.GetExportedTypes()
            .Where(t => t.IsClass && !t.IsSealed && !t.IsAbstract)
            .Select(t => t.FullName)
            .ToArray();
        Assert.True(open.Length == 0, "unsealed public classes: " + string.Join(", ", open));
    }
}
