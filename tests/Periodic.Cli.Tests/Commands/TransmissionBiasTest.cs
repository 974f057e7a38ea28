// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class TransmissionBiasTest
{
    private const string BiasedFile = """
        {"name": "biased filter", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": "15 Å", "potential": "300 meV", "mass": 0.092}],
         "stack": {"periods": 6, "leads": {"potential": "-20 meV", "mass": 0.067}, "bias": "50 meV"}}
        """;

    [Fact]
    public void Transmission_BiasOption_JsonMatchesLibraryAndStatesTheBias()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("transmission", file, "--periods", "4", "--bias", "0.08", "--from", "0.01", "--to", "0.5", "--points", "13", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.Equal(0.08, json.GetProperty("stack").GetProperty("bias").GetDouble());
        Assert.Equal("eV", json.GetProperty("units").GetProperty("bias").GetString());
        // Default leads: the first layer (0 eV, 0.067 m0).
        var lead = Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067));
        var reference = StackTransmission.Create(LayerStack.Periodic(lead, StructureFile.Load(file).Cell, 4, lead), Energy.FromElectronVolts(0.08));
        foreach (var p in json.GetProperty("points").EnumerateArray())
        {
            var r = reference.Evaluate(p.GetProperty("energy").GetDouble());
            Assert.Equal(r.Transmission, p.GetProperty("transmission").GetDouble()); // round-trip JSON: exact
            Assert.Equal(r.Reflection, p.GetProperty("reflection").GetDouble());
        }
    }

    [Fact]
    public void Transmission_FileBias_IsUsedUnlessTheOptionOverridesIt()
    {
        var file = ToolRunner.TempFile(BiasedFile);
        var structure = StructureFile.Load(file);
        var fromFile = ToolRunner.Invoke("transmission", file, "--energies", "0.05,0.12", "--json");
        var overridden = ToolRunner.Invoke("transmission", file, "--energies", "0.05,0.12", "--bias", "0", "--json");
        Assert.True(fromFile.ExitCode == 0 && overridden.ExitCode == 0, fromFile.Stderr + overridden.Stderr);
        Assert.Equal(0.05, fromFile.Json().GetProperty("stack").GetProperty("bias").GetDouble(), 1e-17); // 50 meV, one rounding
        Assert.Equal(0.0, overridden.Json().GetProperty("stack").GetProperty("bias").GetDouble());
        var biased = StackTransmission.Create(structure.Stack!, structure.StackBias);
        var unbiased = StackTransmission.Create(structure.Stack!);
        var a = fromFile.Json().GetProperty("points").EnumerateArray().ToArray();
        var b = overridden.Json().GetProperty("points").EnumerateArray().ToArray();
        for (var i = 0; i < a.Length; i++)
        {
            var e = a[i].GetProperty("energy").GetDouble();
            Assert.Equal(biased.Evaluate(e).Transmission, a[i].GetProperty("transmission").GetDouble());
            Assert.Equal(unbiased.Evaluate(e).Transmission, b[i].GetProperty("transmission").GetDouble());
            Assert.NotEqual(a[i].GetProperty("transmission").GetDouble(), b[i].GetProperty("transmission").GetDouble());
        }
    }

    [Theory]
    [InlineData(new[] { "--bias", "abc" }, new[] { "--bias", "\"abc\"", "finite number in eV" })]
    // 60000 periods of the 2-element cell are 120000 elements under bias, above StackTransmission.MaxBiasedElements (1e5).
    [InlineData(new[] { "--periods", "60000", "--bias", "0.1" }, new[] { "--bias 0.1 eV", "120000 elements", "at most 50000 periods" })]
    public void Transmission_BadBias_IsExitCodeTwoNamingOptionValueAndRule(string[] args, string[] contains)
    {
        var run = ToolRunner.Invoke(new[] { "transmission", ToolRunner.Example("superlattice.json"), "--energies", "0.1" }.Concat(args).ToArray());
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        var lines = run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines);
        foreach (var text in contains)
        {
            Assert.Contains(text, lines[0], StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Transmission_FileBiasOnTooLargeStack_NamesTheField()
    {
        var file = ToolRunner.TempFile("""
            {"name": "long", "cell": [{"width": 4, "potential": 0, "mass": 0.067}, {"width": 1.5, "potential": 0.3, "mass": 0.092}],
             "stack": {"periods": 100000, "bias": "0.1 eV"}}
            """);
        var run = ToolRunner.Invoke("transmission", file, "--energies", "0.1");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("stack.bias", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("100000", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Plot_TransmissionUnderBias_WritesThePicture()
    {
        var target = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}", "placeholder.json"))!, "t.svg");
        var run = ToolRunner.Invoke("plot", ToolRunner.TempFile(BiasedFile), "--show", "transmission", "--bias", "-0.05", "--points", "200", "--from", "0", "--to", "0.4", "--out", target);
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Contains("eU = -0.05 eV", File.ReadAllText(target), StringComparison.Ordinal);
        var misuse = ToolRunner.Invoke("plot", ToolRunner.TempFile(BiasedFile), "--show", "dos", "--bias", "0.1", "--out", target);
        Assert.Equal(2, misuse.ExitCode);
        Assert.Contains("--bias applies only to --show transmission", misuse.Stderr, StringComparison.Ordinal);
    }
}
