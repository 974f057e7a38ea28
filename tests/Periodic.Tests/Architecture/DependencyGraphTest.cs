// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using NetArchTest.Rules;
using Periodic.Units;

namespace Periodic.Tests.Architecture;

/// <summary>
/// The namespace dependency graph of the library, as a table, checked against the compiled assembly (NetArchTest reads
/// every type reference in the IL, including method bodies). Folders are namespaces are layers; a namespace may use only
/// what its row lists, so a back-edge (a lower layer reaching up) fails here instead of in a review. README's layout
/// table and DEVELOPERS.md describe this same graph; change all three together.
/// </summary>
public sealed class DependencyGraphTest
{
    private const string Root = "Periodic";

    // Layers, bottom up. The root namespace (Preconditions, PeriodicComputationException) may be used by every layer
    // and itself uses none. To add a namespace: one row listing everything it may use, directly or not.
    private static readonly string[] Physics = ["Numerics", "Units", "Structures", "Transfer", "Bands", "Properties", "Stacks"];

    private static readonly Dictionary<string, string[]> MayUse = new()
    {
        ["Numerics"] = [],
        ["Units"] = ["Numerics"],
        ["Structures"] = ["Units", "Numerics"],
        ["Transfer"] = ["Structures", "Units", "Numerics"],
        ["Bands"] = ["PlaneWaves", "Transfer", "Structures", "Units", "Numerics"], // the facade takes Fourier cells' edges from plane waves
        ["Properties"] = ["Bands", "Transfer", "Structures", "Units", "Numerics"],
        ["Stacks"] = ["Bands", "Transfer", "Structures", "Units", "Numerics"],
        ["PlaneWaves"] = ["Structures", "Units", "Numerics"], // an independent second method: no transfer matrices
        ["Materials"] = ["Structures", "Units", "Numerics"],
        ["Serialization"] = ["SpaceCharge", "Stacks", "Properties", "Bands", "PlaneWaves", "Transfer", "Materials", "OpticalLattices", "Structures", "Units", "Numerics"], // doped cells are validated into SpaceCharge.DopedCell
        ["Optics"] = ["Stacks", "Properties", "Bands", "Transfer", "Materials", "Structures", "Units", "Numerics"],
        ["OpticalLattices"] = ["PlaneWaves", "Properties", "Bands", "Transfer", "Structures", "Units", "Numerics"],
        ["SpaceCharge"] = ["Properties", "Stacks", "Bands", "PlaneWaves", "Transfer", "Structures", "Units", "Numerics"], // finite stacks: states of the closed domain
        ["Design"] = [.. Physics, "Materials", "Optics", "OpticalLattices", "SpaceCharge"],
    };

    private static readonly Assembly Library = typeof(Length).Assembly;

    public static TheoryData<string> Layers => [.. MayUse.Keys];

    [Theory]
    [MemberData(nameof(Layers))]
    public void Layer_UsesOnlyTheLayersItsRowAllows(string layer)
    {
        var forbidden = MayUse.Keys.Where(other => other != layer && !MayUse[layer].Contains(other)).Select(Qualified).ToArray();
        var result = Types.InAssembly(Library).That().ResideInNamespace(Qualified(layer))
            .ShouldNot().HaveDependencyOnAny(forbidden).GetResult();
        Assert.True(result.IsSuccessful,
            $"{Qualified(layer)} may use only {string.Join(", ", MayUse[layer])}; these types reach elsewhere: {string.Join(", ", result.FailingTypeNames ?? [])}");
    }

    [Fact]
    public void RootNamespace_UsesNoLayer()
    {
        var result = Types.InAssembly(Library).That().ResideInNamespaceMatching(@"^Periodic$")
            .ShouldNot().HaveDependencyOnAny([.. MayUse.Keys.Select(Qualified)]).GetResult();
        Assert.True(result.IsSuccessful, $"root types reach into a layer: {string.Join(", ", result.FailingTypeNames ?? [])}");
    }

    [Fact]
    public void EveryNamespace_HasARowInTheTable()
    {
        var namespaces = Library.GetTypes().Select(t => t.Namespace).OfType<string>()
            .Where(n => n.StartsWith(Root + ".", StringComparison.Ordinal)).Distinct();
        foreach (var ns in namespaces)
        {
            // Compiler-generated helpers live in their own namespaces (e.g. System.Runtime.CompilerServices): skipped above.
            Assert.True(MayUse.ContainsKey(ns[(Root.Length + 1)..].Split('.')[0]), $"namespace {ns} has no row in the dependency table; add one.");
        }
    }

    [Fact]
    public void Rule_DetectsAKnownEdge()
    {
        // The check must be able to fail: Bands does use Transfer, so a rule forbidding it must report Bands types,
        // and Units does not use Bands.
        var known = Types.InAssembly(Library).That().ResideInNamespace(Qualified("Bands"))
            .ShouldNot().HaveDependencyOn(Qualified("Transfer")).GetResult();
        Assert.False(known.IsSuccessful);
        Assert.Contains(known.FailingTypeNames, name => name.StartsWith("Periodic.Bands.", StringComparison.Ordinal));
        var absent = Types.InAssembly(Library).That().ResideInNamespace(Qualified("Units"))
            .ShouldNot().HaveDependencyOn(Qualified("Bands")).GetResult();
        Assert.True(absent.IsSuccessful);
    }

    [Fact]
    public void Cli_SeesOnlyThePublicApi()
    {
        // The tool is a client like any other: the library grants its internals only to its own tests and benchmarks.
        var friends = Library.GetCustomAttributes<InternalsVisibleToAttribute>().Select(a => a.AssemblyName).Order().ToArray();
        Assert.Equal(["Periodic.Benchmarks", "Periodic.Tests"], friends);
    }

    private static string Qualified(string layer) => Root + "." + layer;
}
