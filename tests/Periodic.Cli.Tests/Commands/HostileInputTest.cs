// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;

namespace Periodic.Cli.Tests.Commands;

/// <summary>
/// Hostile and absurd input: every case exits 0, 1 or 2, an error is one line naming the option or the file field
/// with the value and the bound, and nothing is read, computed or held beyond the documented limits (docs/limits.md).
/// </summary>
public sealed class HostileInputTest
{
    private static readonly string Superlattice = ToolRunner.Example("superlattice.json");

    private static void AssertOneLineError(ToolRunner.Run run, params string[] contains)
    {
        Assert.Equal(2, run.ExitCode);
        var lines = run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines);
        Assert.StartsWith("periodic: error: ", lines[0], StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", run.Stderr, StringComparison.Ordinal);
        foreach (var internalName in new[] { "ElectronVolts", "(Parameter", "energyLimit", "Nullable`1", "Sequence contains" })
        {
            Assert.DoesNotContain(internalName, lines[0], StringComparison.Ordinal);
        }
        foreach (var text in contains)
        {
            Assert.Contains(text, lines[0], StringComparison.Ordinal);
        }
    }

    [Fact]
    public void SegmentOnlyCellWithLeads_Runs()
    {
        var file = ToolRunner.TempFile("""{"name":"c","cell":[{"fourier":{"period":"4 nm","cosine":["200 meV"],"mass":0.067}}],"stack":{"periods":5,"leads":{"potential":0,"mass":0.067}}}""");
        var run = ToolRunner.Invoke("transmission", file, "--energies", "0.1,0.3", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        Assert.Equal(5, run.Json().GetProperty("stack").GetProperty("periods").GetInt32());
    }

    [Fact]
    public void SegmentOnlyCellWithoutLeads_NamesTheLeadField()
    {
        var file = ToolRunner.TempFile("""{"name":"c","cell":[{"fourier":{"period":"4 nm","cosine":["200 meV"],"mass":0.067}}],"stack":{"periods":5}}""");
        AssertOneLineError(ToolRunner.Invoke("bands", file), "stack.leftLead", "no uniform layer");
    }

    [Fact]
    public void NumberOptions_GermanCulture_AreReadInvariantly()
    {
        // With ICU globalization on and a German locale, "-0.02" would read as -2 in the current culture.
        var environment = new Dictionary<string, string>
        {
            ["DOTNET_SYSTEM_GLOBALIZATION_INVARIANT"] = "0", ["LANG"] = "de_DE.UTF-8", ["LC_ALL"] = "de_DE.UTF-8",
        };
        var run = ToolRunner.Invoke(environment, "transmission", Superlattice, "--from", "-0.02", "--to", "0.5", "--points", "2", "-N", "2",
            "--lead-potential", "-0.25", "--lead-mass", "0.5", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        Assert.Equal(-0.02, json.GetProperty("points")[0].GetProperty("energy").GetDouble());
        Assert.Equal(0.5, json.GetProperty("points")[1].GetProperty("energy").GetDouble());
        Assert.Equal(-0.25, json.GetProperty("stack").GetProperty("leftLead").GetProperty("potential").GetDouble());
        Assert.Equal(0.5, json.GetProperty("stack").GetProperty("leftLead").GetProperty("mass").GetDouble());
    }

    [Fact]
    public void InvalidUtf8_IsLocated()
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var file = Path.Combine(directory, "bad-utf8.json");
        File.WriteAllBytes(file, [.. Encoding.ASCII.GetBytes("{\"name\":\"a"), 0xFF, .. Encoding.ASCII.GetBytes("\",\"cell\":[{\"width\":1,\"potential\":0,\"mass\":0.067}]}")]);
        AssertOneLineError(ToolRunner.Invoke("bands", file), file + ":1:11:", "invalid UTF-8");
    }

    [Fact]
    public void LoneSurrogate_IsLocated()
    {
        var file = ToolRunner.TempFile("{\"name\":\"a\\ud800\",\n\"cell\":[{\"width\":1,\"potential\":0,\"mass\":0.067}]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), file + ":1:9:", "lone surrogate");
    }

    [Theory]
    [InlineData("\"mass\":1e-300", "cell[0].mass", "0.0001")]
    [InlineData("\"mass\":1e308", "cell[0].mass", "10000000")]
    [InlineData("\"width\":1e308", "cell[0].width", "1000000")]
    [InlineData("\"potential\":1e300", "cell[0].potential", "1000")]
    [InlineData("\"potential\":-1e300", "cell[0].potential", "1000")]
    public void AbsurdMagnitudes_AreRefusedByTheReader(string field, string name, string bound)
    {
        var values = new Dictionary<string, string> { ["width"] = "\"width\":5", ["potential"] = "\"potential\":0", ["mass"] = "\"mass\":0.067" };
        values[field.Split(':')[0].Trim('"')] = field;
        var file = ToolRunner.TempFile("{\"name\":\"a\",\"cell\":[{" + string.Join(',', values.Values) + "}]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), file + ":1:", name, bound, "limits.md");
    }

    [Fact]
    public void ControlCharactersInTheName_AreEscaped()
    {
        var file = ToolRunner.TempFile("{\"name\":\"demo\\u001b[2J\\u0007\",\"cell\":[{\"width\":5,\"potential\":0,\"mass\":0.067}]}");
        var run = ToolRunner.Invoke("bands", file);
        Assert.Equal(0, run.ExitCode);
        Assert.DoesNotContain('\u001b', run.Stdout);
        Assert.DoesNotContain('\u0007', run.Stdout);
        Assert.Contains("demo\\u001B[2J\\u0007", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void PointsZero_StatesTheTrueMinimum() =>
        AssertOneLineError(ToolRunner.Invoke("dispersion", Superlattice, "--points", "0"), "--points must be between 2 and");

    [Fact]
    public void WidthZero_StatesTheTrueMinimum() =>
        AssertOneLineError(ToolRunner.Invoke("plot", Superlattice, "--show", "profile", "--width", "0", "--out", "never.png"), "--width must be between 200 and");

    [Fact]
    public void DosHugeEnergy_NamesTheOptionNotAnotherCommand()
    {
        var run = ToolRunner.Invoke("dos", Superlattice, "--energies", "1e308");
        AssertOneLineError(run, "--energies", "1000 eV");
        Assert.DoesNotContain("more bands", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void DirectoryInput_IsReportedAsADirectory() =>
        AssertOneLineError(ToolRunner.Invoke("bands", Path.GetTempPath()), "is a directory");

    [Fact]
    public void EmptyOut_NamesTheOption() =>
        AssertOneLineError(ToolRunner.Invoke("transmission", Superlattice, "--energies", "0.1", "-N", "2", "--out", ""), "--out", "empty");

    [Fact]
    public void DeviceOfEndlessZeros_IsNotReadWhole()
    {
        if (!File.Exists("/dev/zero"))
        {
            return; // a Unix device; CI runs on Linux
        }
        AssertOneLineError(ToolRunner.Invoke("bands", "/dev/zero"), "/dev/zero", "16777216 bytes");
    }

    [Fact]
    public void FileAboveTheSizeBound_IsRefused()
    {
        var file = ToolRunner.TempFile("{}");
        using (var stream = File.Create(file))
        {
            stream.Write("{\"name\":\"big\",\"description\":\""u8);
            var chunk = Encoding.ASCII.GetBytes(new string('x', 1 << 20));
            for (var i = 0; i < 17; i++)
            {
                stream.Write(chunk);
            }
            stream.Write("\"}"u8);
        }
        AssertOneLineError(ToolRunner.Invoke("bands", file), "16777216 bytes");
    }

    [Fact]
    public void TooManyHarmonics_AreRefusedBeforeWork()
    {
        var cosine = string.Join(',', Enumerable.Repeat("0.001", 4_001));
        var file = ToolRunner.TempFile("{\"name\":\"f\",\"cell\":[{\"fourier\":{\"period\":4,\"cosine\":[" + cosine + "],\"mass\":0.067}}]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), "cell[0].fourier.cosine", "4001", "at most 4000 harmonics");
    }

    [Fact]
    public void TooManySamples_AreRefusedBeforeWork()
    {
        var n = 200_001;
        var positions = string.Join(',', Enumerable.Range(0, n).Select(i => (i * 0.01).ToString("R", CultureInfo.InvariantCulture)));
        var potentials = string.Join(',', Enumerable.Repeat("0", n));
        var file = ToolRunner.TempFile("{\"name\":\"p\",\"cell\":[{\"profile\":{\"positions\":[" + positions + "],\"potentials\":[" + potentials + "],\"mass\":0.067}}]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), "cell[0].profile.positions", "at most 200000 samples");
    }

    [Fact]
    public void TooManyElements_AreRefusedBeforeWork()
    {
        var layers = string.Join(',', Enumerable.Repeat("{\"width\":1,\"potential\":0,\"mass\":0.067}", 100_001));
        var file = ToolRunner.TempFile("{\"name\":\"many\",\"cell\":[" + layers + "]}");
        AssertOneLineError(ToolRunner.Invoke("bands", file), "cell", "100001 elements", "at most 100000");
    }

    [Fact]
    public void DispersionBeyondTheWorkBound_IsRefused() =>
        AssertOneLineError(ToolRunner.Invoke("dispersion", Superlattice, "--count", "1000", "--points", "100000", "--json"), "--count × --points", "10000000");

    [Fact]
    public void CurrentBeyondTheWorkBound_IsRefused() =>
        AssertOneLineError(ToolRunner.Invoke("current", Superlattice, "--bias", "0.05", "-N", "30000", "--fermi-level", "0.02", "--temperature", "77"),
            "(stack elements)² × biases", "30000 periods");

    [Fact]
    public void ProfilePlotOfAManyLayerCellOverManyPeriods_IsRefused()
    {
        var layers = string.Join(',', Enumerable.Range(0, 1000).Select(i => i % 2 == 0 ? "{\"width\":1,\"potential\":0,\"mass\":0.067}" : "{\"width\":1,\"potential\":0.2,\"mass\":0.067}"));
        var file = ToolRunner.TempFile("{\"name\":\"many\",\"cell\":[" + layers + "]}");
        var output = Path.Combine(Path.GetDirectoryName(file)!, "never.png");
        AssertOneLineError(ToolRunner.Invoke("plot", file, "--show", "profile", "--periods", "100000", "--out", output), "--periods", "2000000");
        Assert.False(File.Exists(output));
    }

    [Theory]
    [InlineData("--from", "--from 1e300 --to 1e301 --points 3")]
    [InlineData("--lead-potential", "--energies 0.1 --lead-potential 1e300")]
    [InlineData("--lead-mass", "--energies 0.1 --lead-mass 1e-300")]
    [InlineData("--bias", "--energies 0.1 --bias 1e300")]
    public void AbsurdOptionValues_NameTheOption(string option, string arguments) =>
        AssertOneLineError(ToolRunner.Invoke(["transmission", Superlattice, "-N", "2", .. arguments.Split(' ')]), option, "limits.md");
}
