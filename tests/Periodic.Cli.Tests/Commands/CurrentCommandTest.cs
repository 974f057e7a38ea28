// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text.Json;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class CurrentCommandTest
{
    // A double-barrier diode (2 nm barriers of 0.3 eV around a 5 nm well) between leads of the well material.
    private const string DoubleBarrier = """
        {"name": "double barrier", "cell": [
          {"width": 2, "potential": 0.3, "mass": 0.067}, {"width": 5, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.3, "mass": 0.067}],
         "stack": {"periods": 1, "leads": {"potential": 0, "mass": 0.067}}}
        """;

    // Asymmetric barriers (2 nm of 0.3 eV, 3 nm of 0.25 eV), and the same cell mirrored.
    private const string Asymmetric = """
        {"name": "asymmetric", "cell": [
          {"width": 2, "potential": 0.3, "mass": 0.067}, {"width": 5, "potential": 0, "mass": 0.067}, {"width": 3, "potential": 0.25, "mass": 0.067}],
         "stack": {"periods": 2, "leads": {"potential": 0, "mass": 0.067}}}
        """;

    private const string Mirrored = """
        {"name": "asymmetric, mirrored", "cell": [
          {"width": 3, "potential": 0.25, "mass": 0.067}, {"width": 5, "potential": 0, "mass": 0.067}, {"width": 2, "potential": 0.3, "mass": 0.067}],
         "stack": {"periods": 2, "leads": {"potential": 0, "mass": 0.067}}}
        """;

    private static JsonElement[] Points(ToolRunner.Run run)
    {
        Assert.True(run.ExitCode == 0, run.Stderr);
        return run.Json().GetProperty("points").EnumerateArray().ToArray();
    }

    [Fact]
    public void Current_Json_MatchesLibraryBitForBit()
    {
        var file = ToolRunner.TempFile(DoubleBarrier);
        var run = ToolRunner.Invoke("current", file, "--bias", "-0.1,0.05,0.2", "--temperature", "77", "--fermi-level", "0.02", "--json");
        var points = Points(run);
        var json = run.Json();
        Assert.Equal(0.02, json.GetProperty("fermiLevel").GetDouble());
        Assert.Equal(77.0, json.GetProperty("temperature").GetDouble());
        Assert.Equal("A/m2", json.GetProperty("units").GetProperty("currentDensity").GetString());
        var stack = StructureFile.Load(file).Stack!;
        var biases = new[] { -0.1, 0.05, 0.2 };
        Assert.Equal(biases.Length, points.Length);
        for (var i = 0; i < biases.Length; i++)
        {
            var expected = StackTransmission.Create(stack, Energy.FromElectronVolts(biases[i])).CurrentDensity(Energy.FromElectronVolts(0.02), Temperature.FromKelvin(77));
            var p = points[i];
            // Shortest round-trip JSON numbers: the same double, not merely close.
            Assert.Equal(biases[i], p.GetProperty("bias").GetDouble());
            Assert.Equal(expected.AmperesPerSquareMetre, p.GetProperty("currentDensity").GetDouble());
            Assert.Equal(expected.AmperesPerSquareCentimetre, p.GetProperty("currentDensityPerCm2").GetDouble());
            Assert.Equal(expected.ErrorEstimateAmperesPerSquareMetre, p.GetProperty("errorEstimate").GetDouble());
            Assert.Equal(expected.IsConverged, p.GetProperty("converged").GetBoolean());
            Assert.Equal(expected.ResonanceCount, p.GetProperty("resonances").GetInt32());
            Assert.Equal(expected.Evaluations, p.GetProperty("evaluations").GetInt32());
        }
    }

    [Fact]
    public void Current_ZeroBias_IsZero()
    {
        // Equal Fermi levels on both sides: the supply function vanishes at every energy, so J = 0
        // (detailed balance; R. Tsu and L. Esaki, Appl. Phys. Lett. 22, 562 (1973)). "-0" is the same bias.
        var points = Points(ToolRunner.Invoke("current", ToolRunner.TempFile(DoubleBarrier), "--bias", "0,-0", "--temperature", "300", "--fermi-level", "0.05", "--json"));
        foreach (var p in points)
        {
            Assert.Equal(0.0, p.GetProperty("bias").GetDouble());
            Assert.Equal(0.0, p.GetProperty("currentDensity").GetDouble());
            Assert.True(p.GetProperty("converged").GetBoolean());
        }
    }

    [Fact]
    public void Current_MirroredStackUnderOppositeBias_FlipsSign()
    {
        // Reciprocity: T(E) is the same in both directions, so mirroring the stack and reversing the bias
        // reverses the current exactly (common practice, no single source). Each value is a quadrature
        // result, so they may differ by at most the sum of the two error estimates.
        const string temperature = "77", fermi = "0.02";
        var forward = Points(ToolRunner.Invoke("current", ToolRunner.TempFile(Asymmetric), "--bias", "0.05,0.1,-0.15", "--temperature", temperature, "--fermi-level", fermi, "--json"));
        var mirrored = Points(ToolRunner.Invoke("current", ToolRunner.TempFile(Mirrored), "--bias", "-0.05,-0.1,0.15", "--temperature", temperature, "--fermi-level", fermi, "--json"));
        // The symmetric stack is its own mirror image: J(-U) = -J(U).
        var symmetric = Points(ToolRunner.Invoke("current", ToolRunner.TempFile(DoubleBarrier), "--bias", "0.1,-0.1", "--temperature", temperature, "--fermi-level", fermi, "--json"));
        var pairs = forward.Zip(mirrored).Append((symmetric[0], symmetric[1]));
        foreach (var (a, b) in pairs)
        {
            var ja = a.GetProperty("currentDensity").GetDouble();
            var jb = b.GetProperty("currentDensity").GetDouble();
            Assert.NotEqual(0.0, ja);
            Assert.Equal(-Math.Sign(ja), Math.Sign(jb));
            var allowed = a.GetProperty("errorEstimate").GetDouble() + b.GetProperty("errorEstimate").GetDouble();
            Assert.True(Math.Abs(ja + jb) <= allowed, $"J = {ja:R} and {jb:R} A/m2 differ in size by more than the error estimates {allowed:R}");
        }
        // Positive bias drives electrons from left to right: J > 0 (the sign convention of the JSON contract).
        Assert.True(symmetric[0].GetProperty("currentDensity").GetDouble() > 0);
    }

    [Fact]
    public void Current_Range_IncludesBothEndsExactly()
    {
        var points = Points(ToolRunner.Invoke("current", ToolRunner.TempFile(DoubleBarrier), "--bias-from", "-0.2", "--bias-to", "0.3", "--bias-points", "3",
            "--temperature", "77", "--fermi-level", "0.02", "--json"));
        Assert.Equal(3, points.Length);
        Assert.Equal(-0.2, points[0].GetProperty("bias").GetDouble());
        Assert.Equal(0.3, points[2].GetProperty("bias").GetDouble());
    }

    [Fact]
    public void Current_CsvAndTable_HaveUnitsInHeaders()
    {
        var file = ToolRunner.TempFile(DoubleBarrier);
        var csv = ToolRunner.Invoke("current", file, "--bias", "0,0.1", "--temperature", "77", "--fermi-level", "0.02", "--csv");
        Assert.True(csv.ExitCode == 0, csv.Stderr);
        var lines = csv.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(3, lines.Length);
        Assert.Equal("bias (eV),J (A/cm2),error (A/cm2),converged,resonances,evaluations", lines[0]);
        Assert.StartsWith("0,0,", lines[1], StringComparison.Ordinal);
        var table = ToolRunner.Invoke("current", file, "--bias", "0.1", "--temperature", "77", "--fermi-level", "0.02");
        Assert.True(table.ExitCode == 0, table.Stderr);
        Assert.Contains("J (A/cm2)", table.Stdout, StringComparison.Ordinal);
        Assert.Contains("no space charge", table.Stdout, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", table.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Current_Out_WritesTheSameTextAsStdout()
    {
        var file = ToolRunner.TempFile(DoubleBarrier);
        var target = Path.Combine(Path.GetDirectoryName(file)!, "iv.csv");
        var args = new[] { "current", file, "--bias", "0,0.1", "--temperature", "77", "--fermi-level", "0.02", "--csv" };
        var toFile = ToolRunner.Invoke(args.Concat(["--out", target]).ToArray());
        Assert.True(toFile.ExitCode == 0, toFile.Stderr);
        Assert.Equal(string.Empty, toFile.Stdout);
        Assert.Equal(ToolRunner.Invoke(args).Stdout, File.ReadAllText(target));
    }

    [Theory]
    [InlineData(new[] { "--bias", "0.1", "--temperature", "-5", "--fermi-level", "0.02" }, new[] { "--temperature", "-5", "between 0.1 K and 1000 K" })]
    [InlineData(new[] { "--bias", "0.1", "--temperature", "warm", "--fermi-level", "0.02" }, new[] { "--temperature", "\"warm\"", "finite number in K" })]
    [InlineData(new[] { "--bias", "0.1,high", "--temperature", "77", "--fermi-level", "0.02" }, new[] { "--bias", "\"high\"", "finite number", "eV" })]
    [InlineData(new[] { "--bias", "0.1", "--temperature", "77", "--fermi-level", "x" }, new[] { "--fermi-level", "\"x\"", "eV" })]
    [InlineData(new[] { "--bias", "0.1", "--bias-from", "0", "--temperature", "77", "--fermi-level", "0.02" }, new[] { "--bias", "--bias-from" })]
    [InlineData(new[] { "--bias-from", "0", "--bias-to", "0.1", "--bias-points", "1", "--temperature", "77", "--fermi-level", "0.02" }, new[] { "--bias-points", "between 2 and 10000", "got 1" })]
    [InlineData(new[] { "--bias", "0.1", "--temperature", "77" }, new[] { "--fermi-level" })]
    [InlineData(new[] { "--temperature", "77", "--fermi-level", "0.02" }, new[] { "--bias" })]
    // 60000 periods of the 2-element cell are 120000 elements under bias, above StackTransmission.MaxBiasedElements (1e5).
    [InlineData(new[] { "--periods", "60000", "--bias", "0.1", "--temperature", "77", "--fermi-level", "0.02" }, new[] { "--bias 0.1 eV", "120000 elements", "at most 50000 periods" })]
    public void Current_BadInput_IsExitCodeTwoNamingOptionValueAndRule(string[] args, string[] contains)
    {
        var run = ToolRunner.Invoke(new[] { "current", ToolRunner.Example("superlattice.json") }.Concat(args).ToArray());
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        var lines = run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines);
        Assert.StartsWith("periodic: error: ", lines[0], StringComparison.Ordinal);
        foreach (var text in contains)
        {
            Assert.Contains(text, lines[0], StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Current_FailingMidSweep_LeavesNoPartialFile()
    {
        // Bias 0 succeeds (no element limit), then 0.1 is refused for 120000 elements: the run fails after
        // computing a row, and neither the old target nor a new one may hold part of the output.
        var file = ToolRunner.Example("superlattice.json");
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}", "placeholder.json"))!;
        var existing = Path.Combine(directory, "old.csv");
        File.WriteAllText(existing, "old content\n");
        var fresh = Path.Combine(directory, "new.csv");
        foreach (var target in new[] { existing, fresh })
        {
            var run = ToolRunner.Invoke("current", file, "--periods", "60000", "--bias", "0,0.1", "--temperature", "77", "--fermi-level", "0.02", "--csv", "--out", target);
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("--bias 0.1 eV", run.Stderr, StringComparison.Ordinal);
        }
        Assert.Equal("old content\n", File.ReadAllText(existing));
        Assert.False(File.Exists(fresh));
        Assert.Equal(new[] { "old.csv", "placeholder.json" }, Directory.GetFiles(directory).Select(Path.GetFileName).Order(StringComparer.Ordinal).ToArray());
    }

    [Fact]
    public void Current_MaterialFile_TakesItsTemperature()
    {
        var file = ToolRunner.Example("gaas-algaas.json");
        var run = ToolRunner.Invoke("current", file, "--periods", "2", "--bias", "0.05", "--fermi-level", "0.01", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal(StructureFile.Load(file).Materials!.Temperature.Kelvin, run.Json().GetProperty("temperature").GetDouble());
        Assert.Equal(string.Create(CultureInfo.InvariantCulture, $"{0.05:R}"), run.Json().GetProperty("points")[0].GetProperty("bias").GetRawText());
    }
}
