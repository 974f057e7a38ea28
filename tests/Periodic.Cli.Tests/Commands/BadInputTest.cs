// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests.Commands;

public sealed class BadInputTest
{
    private static void AssertOneLineError(ToolRunner.Run run, int exitCode, params string[] contains)
    {
        Assert.Equal(exitCode, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        var lines = run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines);
        Assert.StartsWith("periodic: error: ", lines[0], StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", run.Stderr, StringComparison.Ordinal); // no stack trace
        foreach (var text in contains)
        {
            Assert.Contains(text, lines[0], StringComparison.Ordinal);
        }
    }

    [Fact]
    public void BadUnit_NamesFileLineColumnAndField()
    {
        var file = ToolRunner.TempFile("{\"name\": \"x\",\n  \"cell\": [\n    {\"width\": \"5 nm\", \"potential\": \"2 volts\", \"mass\": 0.067}\n  ]\n}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), 2, file + ":3:36: cell[0].potential: unknown unit \"volts\"");
    }

    [Fact]
    public void SyntaxError_NamesFileLineAndColumn()
    {
        var file = ToolRunner.TempFile("{\"name\": \"x\",\n  \"cell\": [ {\"width\": 5,, } ]\n}");
        AssertOneLineError(ToolRunner.Invoke("dos", file, "--energies", "0.1"), 2, file + ":2:", "invalid JSON");
    }

    [Fact]
    public void MissingFile_IsNamed()
    {
        AssertOneLineError(ToolRunner.Invoke("bands", "no-such-file.json"), 2, "no-such-file.json", "does not exist");
    }

    [Theory]
    [InlineData("bands", "--count", "0")]
    [InlineData("bands", "--count", "many")]
    [InlineData("bands", "--json", "--csv")]
    [InlineData("dos")]
    [InlineData("dos", "--from", "0.3", "--to", "0.1", "--points", "5")]
    [InlineData("dos", "--energies", "0.1,abc")]
    [InlineData("dos", "--energies", "0.1", "--points", "3")]
    [InlineData("dispersion", "--points", "1")]
    [InlineData("plot", "--out", "picture.gif")]
    [InlineData("plot", "--out", "x.png", "--show", "sideways")]
    [InlineData("frobnicate")]
    [InlineData("bands", "--no-such-option")]
    public void Usage_IsExitCodeTwoWithOneLine(params string[] args)
    {
        var withFile = args.Length > 0 && args[0] is "bands" or "dos" or "dispersion" or "plot"
            ? new[] { args[0], ToolRunner.Example("superlattice.json") }.Concat(args[1..]).ToArray()
            : args;
        AssertOneLineError(ToolRunner.Invoke(withFile), 2);
    }

    [Fact]
    public void EnergyOutsideModel_IsExitCodeTwoNamingTheValue()
    {
        // The non-parabolic example has m(E) > 0 only above V - 1/alpha; -5 eV is below that.
        AssertOneLineError(ToolRunner.Invoke("dos", ToolRunner.Example("nonparabolic.json"), "--energies", "-5"), 2, "-5");
    }

    [Fact]
    public void ComputationFailure_IsExitCodeOneNotBadInput()
    {
        // Three copies of a 6 nm well / 20 nm barrier period: Σκw ≈ 42, so the folded gaps (exactly closed, by zone
        // folding; common practice, e.g. Ashcroft & Mermin ch. 8) lie below double-precision resolution and the band
        // finder's own oscillation-count check refuses (docs/core.md). Valid input, numerical limit: exit 1, not 2.
        var cell = string.Join(",\n", Enumerable.Repeat(
            "{\"width\": \"6 nm\", \"potential\": 0, \"mass\": 0.067}, {\"width\": \"20 nm\", \"potential\": \"0.25 eV\", \"mass\": 0.092}", 3));
        var file = ToolRunner.TempFile("{\"name\": \"three copies\", \"cell\": [\n" + cell + "\n]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file, "--count", "3"), 1, "computation failed: ", "Compute the bands of the shorter period");
    }

    [Fact]
    public void LibraryArgumentError_IsExitCodeTwoWithoutComputationPrefix()
    {
        // A mass of zero is refused by the library (ArgumentException naming the value): bad input, exit 2.
        var file = ToolRunner.TempFile("{\"name\": \"x\", \"cell\": [ {\"width\": 5, \"potential\": 0, \"mass\": 0.067} ]}");
        var run = ToolRunner.Invoke("transmission", file, "--periods", "2", "--lead-mass", "0", "--energies", "0.1");
        AssertOneLineError(run, 2, "--lead-mass");
        Assert.DoesNotContain("computation failed", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void MissingDirectory_IsExitCodeTwo()
    {
        AssertOneLineError(ToolRunner.Invoke("bands", Path.Combine("no-such-directory", "x.json")), 2, "no-such-directory");
    }

    [Fact]
    public void Verbose_AddsDetail()
    {
        var run = ToolRunner.Invoke("dos", ToolRunner.Example("nonparabolic.json"), "--energies", "-5", "--verbose");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("   at ", run.Stderr, StringComparison.Ordinal);
    }
}
