// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using Periodic.Structures;

namespace Periodic.Tests.Conventions;

/// <summary>
/// Reflection over the whole public surface of the Periodic assembly: the house rules on immutability,
/// closed hierarchies and printable results (conventions in DEVELOPERS.md; common practice for
/// .NET libraries, no single source).
/// </summary>
public sealed class PublicApiConventionsTest
{
    private static readonly Type[] PublicTypes = typeof(UnitCell).Assembly.GetExportedTypes();

    private static bool IsStatic(Type t) => t.IsAbstract && t.IsSealed;

    [Fact]
    public void ExportedTypes_CoverEveryNamespace()
    {
        // Guards the other checks against passing vacuously (an empty or wrong assembly).
        var namespaces = PublicTypes.Select(t => t.Namespace).Distinct().ToHashSet();
        foreach (var ns in new[] { "Periodic.Units", "Periodic.Structures", "Periodic.Transfer", "Periodic.Bands", "Periodic.Properties", "Periodic.Stacks", "Periodic.Materials" })
        {
            Assert.Contains(ns, namespaces);
        }
    }

    [Fact]
    public void PublicStructs_AreReadonly()
    {
        var offenders = PublicTypes
            .Where(t => t.IsValueType && !t.IsEnum && t.GetCustomAttribute<IsReadOnlyAttribute>() is null)
            .Select(t => t.FullName).ToArray();
        Assert.True(offenders.Length == 0, "not readonly: " + string.Join(", ", offenders));
    }

    [Fact]
    public void PublicClasses_AreSealedStaticOrClosedAbstract()
    {
        // An abstract public class must not be extensible from outside: every constructor is
        // private protected (or private/internal), never public or protected.
        var offenders = new List<string>();
        foreach (var t in PublicTypes.Where(t => t.IsClass))
        {
            if (t.IsSealed || IsStatic(t))
            {
                continue;
            }
            if (t.IsAbstract)
            {
                var open = t.GetConstructors(BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.Instance)
                    .Where(c => c.IsPublic || c.IsFamily || c.IsFamilyOrAssembly);
                if (!open.Any())
                {
                    continue;
                }
            }
            offenders.Add(t.FullName!);
        }
        Assert.True(offenders.Count == 0, "open for derivation: " + string.Join(", ", offenders));
    }

    [Fact]
    public void PublicInterfacesAndDelegates_DoNotExist()
    {
        // Extension points (segment propagators, potential segments) are internal by design (brief:
        // "internal ISegmentPropagator"); anything public here would widen the closed set.
        var offenders = PublicTypes.Where(t => t.IsInterface || typeof(Delegate).IsAssignableFrom(t)).Select(t => t.FullName).ToArray();
        Assert.True(offenders.Length == 0, "public interface/delegate: " + string.Join(", ", offenders));
    }

    [Fact]
    public void ConcreteTypes_OverrideToString()
    {
        // Results are printed in notebooks and the REPL: every instantiable type other than enums
        // and exceptions declares its own ToString (a record's generated one counts: it is declared on the type).
        string[] reported = [];
        var offenders = PublicTypes
            .Where(t => !t.IsEnum && !IsStatic(t) && !t.IsAbstract && !typeof(Exception).IsAssignableFrom(t))
            .Where(t => t.GetMethod("ToString", BindingFlags.Public | BindingFlags.Instance, Type.EmptyTypes)!.DeclaringType != t)
            .Select(t => t.FullName!).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(reported, offenders);
    }

    [Fact]
    public void PublicStaticState_IsImmutable()
    {
        // No global settings (house rule 5): no public static field that is not const/readonly and no
        // public static property with a setter.
        var offenders = new List<string>();
        foreach (var t in PublicTypes)
        {
            foreach (var f in t.GetFields(BindingFlags.Public | BindingFlags.Static | BindingFlags.DeclaredOnly))
            {
                if (!f.IsLiteral && !f.IsInitOnly && !t.IsEnum)
                {
                    offenders.Add($"{t.FullName}.{f.Name}");
                }
            }
            foreach (var p in t.GetProperties(BindingFlags.Public | BindingFlags.Static | BindingFlags.DeclaredOnly))
            {
                if (p.SetMethod is { IsPublic: true })
                {
                    offenders.Add($"{t.FullName}.{p.Name}");
                }
            }
        }
        Assert.True(offenders.Count == 0, "mutable static state: " + string.Join(", ", offenders));
    }

    [Fact]
    public void PublicInstanceState_HasNoPublicSetters()
    {
        // Immutable results: instance properties may be init-only (records, with-expressions) but never
        // settable after construction; no public mutable instance fields.
        var offenders = new List<string>();
        foreach (var t in PublicTypes.Where(t => !t.IsEnum && !typeof(Exception).IsAssignableFrom(t)))
        {
            foreach (var p in t.GetProperties(BindingFlags.Public | BindingFlags.Instance | BindingFlags.DeclaredOnly))
            {
                var set = p.SetMethod;
                if (set is { IsPublic: true } && !set.ReturnParameter.GetRequiredCustomModifiers().Contains(typeof(IsExternalInit)))
                {
                    offenders.Add($"{t.FullName}.{p.Name}");
                }
            }
            foreach (var f in t.GetFields(BindingFlags.Public | BindingFlags.Instance | BindingFlags.DeclaredOnly))
            {
                if (!f.IsInitOnly)
                {
                    offenders.Add($"{t.FullName}.{f.Name}");
                }
            }
        }
        Assert.True(offenders.Count == 0, "mutable instance state: " + string.Join(", ", offenders));
    }

    [Fact]
    public void PublicDoubles_NameTheirUnit()
    {
        // House rule 4: a raw double in a public name carries its unit. Dimensionless quantities are
        // listed (ratios, fractions, phases, logarithms, tolerances, traces, matrix entries).
        string[] units =
        [
            "ElectronVolts", "ElectronVolt", "MillielectronVolts", "Nanometres", "Nanometre", "ElectronMasses", "Kelvin", "MetresPerSecond",
            "Seconds", "Joules", "Centimetre", "RecoilEnergies", "PerElectronMass", "Metres", "Angstroms", "Kilograms", "Coulombs", "Radians", "PerKelvin", "Cubic", "AmperesPerSquareMetre",
            "AtomicMassUnits", "Hertz", "BohrRadii", "Sites", "VoltsPerMetre", "Micrometres",
        ];
        string[] dimensionless =
        [
            "Tolerance", "Trace", "Log", "Fraction", "Share", "Mismatch", "Transmission", "Reflection", "Phase",
            "Error", "Entry", "Determinant", "Residual", "M11", "M12", "M21", "M22", "Factor", "Composition", "Minimum", "Maximum", "Probability",
            "Monolayers", "Limit", "Value", "Scale", "Slope", "Curvature", "Strength", "Ratio", "Overlap", "RefractiveIndex", "Permittivity",
        ];
        var offenders = new List<string>();
        foreach (var t in PublicTypes.Where(t => !t.IsEnum))
        {
            foreach (var p in t.GetProperties(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly)
                         .Where(p => p.PropertyType == typeof(double) || p.PropertyType == typeof(double?)))
            {
                if (!units.Any(u => p.Name.Contains(u, StringComparison.Ordinal)) && !dimensionless.Any(u => p.Name.Contains(u, StringComparison.Ordinal)))
                {
                    offenders.Add($"{t.Name}.{p.Name}");
                }
            }
            foreach (var m in t.GetMethods(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly).Where(m => !m.IsSpecialName))
            {
                foreach (var prm in m.GetParameters().Where(p => p.ParameterType == typeof(double)))
                {
                    if (!units.Any(u => prm.Name!.Contains(u, StringComparison.OrdinalIgnoreCase)) && !dimensionless.Any(u => prm.Name!.Contains(u, StringComparison.OrdinalIgnoreCase)))
                    {
                        offenders.Add($"{t.Name}.{m.Name}({prm.Name})");
                    }
                }
            }
        }
        Assert.True(offenders.Count == 0, "double without a unit in its name: " + string.Join(", ", offenders));
    }

    [Fact]
    public void SpanMethods_TakeInputsFirstAndDestinationLast()
    {
        // Batch API shape (house style, TensorPrimitives): ReadOnlySpan<double> inputs, a Span<double>
        // destination after them, a void return.
        var offenders = new List<string>();
        var count = 0;
        foreach (var t in PublicTypes)
        {
            foreach (var m in t.GetMethods(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly))
            {
                var ps = m.GetParameters();
                var dest = Array.FindIndex(ps, p => p.ParameterType == typeof(Span<double>));
                if (dest < 0)
                {
                    continue;
                }
                count++;
                var input = Array.FindIndex(ps, p => p.ParameterType == typeof(ReadOnlySpan<double>));
                if (m.ReturnType != typeof(void) || input < 0 || input > dest || !ps[dest].Name!.StartsWith("destination", StringComparison.Ordinal))
                {
                    offenders.Add($"{t.Name}.{m.Name}");
                }
            }
        }
        Assert.True(count >= 8, $"expected the batch APIs to be found; found {count}");
        Assert.True(offenders.Count == 0, "batch shape: " + string.Join(", ", offenders));
    }

    [Fact]
    public void TuningKnobs_LiveInOptionsTypes()
    {
        // DEVELOPERS.md, Conventions ("Options"): a tolerance, an iteration or evaluation budget or a thread count is set
        // through a sealed …Options type's validating Create, never as a parameter of the method that uses it.
        string[] knobs = ["Tolerance", "Parallelism", "MaxIterations", "MaxEvaluations", "MaxRefinements"];
        var offenders = new List<string>();
        var optionsTypes = 0;
        foreach (var t in PublicTypes.Where(t => !t.IsEnum))
        {
            var isOptions = t.Name.EndsWith("Options", StringComparison.Ordinal);
            optionsTypes += isOptions ? 1 : 0;
            foreach (var m in t.GetMethods(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly)
                         .Where(m => !m.IsSpecialName && !(isOptions && m.Name == "Create")))
            {
                foreach (var prm in m.GetParameters().Where(p => knobs.Any(k => p.Name!.Contains(k, StringComparison.OrdinalIgnoreCase))))
                {
                    offenders.Add($"{t.Name}.{m.Name}({prm.Name})");
                }
            }
        }
        Assert.True(optionsTypes >= 8, $"expected the options types to be found; found {optionsTypes}");
        Assert.True(offenders.Count == 0, "tuning knob outside an options type: " + string.Join(", ", offenders));
    }

    [Fact]
    public void OptionsTypes_AreValidatedAtCreation()
    {
        // DEVELOPERS.md, Conventions ("Options"): a sealed class, no public constructor, a static Create that validates and
        // a static Default; no settable or init-only property (a value is checked once, where it is made).
        var offenders = new List<string>();
        foreach (var t in PublicTypes.Where(t => t.Name.EndsWith("Options", StringComparison.Ordinal)))
        {
            var create = t.GetMethod("Create", BindingFlags.Public | BindingFlags.Static);
            var defaults = t.GetProperty("Default", BindingFlags.Public | BindingFlags.Static);
            var settable = t.GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.SetMethod is { IsPublic: true });
            if (!t.IsSealed || !t.IsClass || t.GetConstructors().Length > 0 || create?.ReturnType != t || defaults?.PropertyType != t || settable.Any())
            {
                offenders.Add(t.Name);
            }
        }
        Assert.True(offenders.Count == 0, "options type not in the house style: " + string.Join(", ", offenders));
    }
}
