// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using Periodic.Properties;

namespace Periodic.Tests.Properties;

/// <summary>House conventions for the public types of Periodic.Properties (common practice, no single source).</summary>
public sealed class PropertiesConventionsTest
{
    private static readonly Type[] PublicTypes = typeof(BandProperties).Assembly.GetExportedTypes()
        .Where(t => t.Namespace == "Periodic.Properties").ToArray();

    [Fact]
    public void PublicStructs_AreReadonlyAndPrintable()
    {
        var structs = PublicTypes.Where(t => t.IsValueType && !t.IsEnum).ToArray();
        Assert.NotEmpty(structs);
        foreach (var type in structs)
        {
            Assert.True(type.GetCustomAttribute<IsReadOnlyAttribute>() is not null, $"{type.Name} must be a readonly struct");
            Assert.Equal(type, type.GetMethod("ToString", Type.EmptyTypes)!.DeclaringType);
        }
    }

    [Fact]
    public void PublicClasses_AreSealedAndPrintable()
    {
        // Static classes (abstract and sealed in IL) have no instances to print.
        foreach (var type in PublicTypes.Where(t => t.IsClass && !(t.IsAbstract && t.IsSealed)))
        {
            Assert.True(type.IsSealed, $"{type.Name} must be sealed");
            Assert.Equal(type, type.GetMethod("ToString", Type.EmptyTypes)!.DeclaringType);
        }
    }

    [Fact]
    public void PublicDoubles_NameTheirUnit()
    {
        // Units in every public name of a raw double (house rule); dimensionless ratios are named as such.
        string[] units = ["ElectronVolts", "Nanometre", "Nanometres", "ElectronMasses", "Kelvin", "MetresPerSecond", "Centimetre", "Estimate", "Residual", "Seconds", "VoltsPerMetre", "Relative"];
        foreach (var type in PublicTypes)
        {
            foreach (var property in type.GetProperties().Where(p => p.PropertyType == typeof(double)))
            {
                Assert.True(units.Any(u => property.Name.Contains(u, StringComparison.Ordinal)), $"{type.Name}.{property.Name} does not name its unit");
            }
        }
    }
}
