// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests.Commands;

public sealed partial class PlotCommandTest
{
    [Theory]
    [InlineData("dispersion", "superlattice.json", ".png")]
    [InlineData("dos", "delta-comb.json", ".png")]
    [InlineData("profile", "superlattice.json", ".svg")]
    [InlineData("transmission", "gaas-algaas.json", ".png")]
    [InlineData("in-plane", "superlattice.json", ".png")]
    [InlineData("stack", "defect-superlattice.json", ".svg")]
    [InlineData("stack", "double-barrier-diode.json", ".png", "--bias", "0.1")]
    [InlineData("iv", "double-barrier-diode.json", ".png", "--fermi-level", "0.02", "--temperature", "77")]
    public void Plot_WritesAnImage(string kind, string example, string extension, params string[] options)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, kind + extension);
        var run = ToolRunner.Invoke([.. new[] { "plot", ToolRunner.Example(example), "--show", kind, "--out", target }, .. options]);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var bytes = File.ReadAllBytes(target);
        if (extension == ".png")
        {
            // PNG signature (ISO/IEC 15948 / W3C PNG spec, sec. 5.2).
            Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, bytes[..8]);
        }
        else
        {
            Assert.Contains("<svg", System.Text.Encoding.UTF8.GetString(bytes), StringComparison.Ordinal);
        }
        Assert.True(bytes.Length > 10_000, "an image with axes, labels and data is larger than a blank one");
        Assert.Equal(2, Directory.GetFiles(directory).Length); // the image and the structure file: no leftovers
    }

    [Fact]
    public void Plot_Stack_DrawsLevelsAndPeaksAndSaysWhatIsShaded()
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "stack.svg");
        var run = ToolRunner.Invoke("plot", ToolRunner.Example("defect-superlattice.json"), "--show", "stack", "--out", target);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var svg = File.ReadAllText(target);
        Assert.Contains("bound states: |psi|^2 drawn at its energy", svg, StringComparison.Ordinal);
        Assert.Contains("transmission peak", svg, StringComparison.Ordinal);
        Assert.Contains("Energy (meV)", svg, StringComparison.Ordinal);
        // A stack that is not a plain superlattice: transmission is drawn without minibands, and the picture says so.
        var t = Path.Combine(directory, "t.svg");
        Assert.Equal(0, ToolRunner.Invoke("plot", ToolRunner.Example("defect-superlattice.json"), "--show", "transmission", "--out", t).ExitCode);
        Assert.Contains("no shading: the stack is not a plain superlattice", File.ReadAllText(t), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(new[] { "--show", "iv" }, "--show iv needs --fermi-level E")]
    [InlineData(new[] { "--show", "dos", "--fermi-level", "0.1" }, "--fermi-level applies only to --show iv; got --show dos.")]
    [InlineData(new[] { "--show", "iv", "--fermi-level", "0.1", "--temperature", "0" }, "--temperature must be between 0.1 K and 1000 K; got 0.")]
    [InlineData(new[] { "--show", "profile", "--periods", "0" }, "--periods must be between 1 and 100000; got 0.")]
    public void Plot_BadOption_ExitsTwoWithoutImage(string[] options, string message)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "x.png");
        var run = ToolRunner.Invoke([.. new[] { "plot", ToolRunner.Example("double-barrier-diode.json"), "--out", target }, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Plot_ColdAtomDispersion_AxisInRecoilEnergies()
    {
        // ⁸⁷Rb (86.909 u; u/m_e = 1822.888, CODATA 2018) in a 266 nm period lattice: bands near 1e-10 eV.
        var mass = 86.909180 * 1822.888486;
        var layers = string.Join(",", Enumerable.Range(0, 16).Select(i => string.Create(System.Globalization.CultureInfo.InvariantCulture,
            $"{{\"width\": {266.0 / 16:R}, \"potential\": {1.7e-10 * Math.Pow(Math.Sin(Math.PI * (i + 0.5) / 16), 2):R}, \"mass\": {mass:R}}}")));
        var file = ToolRunner.TempFile($"{{\"name\": \"rb\", \"cell\": [{layers}]}}");
        var target = Path.Combine(Path.GetDirectoryName(file)!, "rb.svg");
        var run = ToolRunner.Invoke("plot", file, "--out", target);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var svg = File.ReadAllText(target);
        Assert.Contains("Energy E (E_R)", svg, StringComparison.Ordinal);
        Assert.DoesNotContain("1E-10", svg, StringComparison.Ordinal); // ticks in E_R, not eV
    }
}
