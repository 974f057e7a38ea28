// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests.Commands;

// Pictures of the drift velocity v(F) and of the Wannier–Stark ladder, and their option checks.
public sealed partial class PlotCommandTest
{
    [Theory]
    [InlineData(".png", "drift", "--scattering-time", "0.1")]
    [InlineData(".svg", "drift", "--scattering-time", "0.2", "--temperature", "77", "--max-field", "30")]
    [InlineData(".png", "ladder", "--field", "40")]
    [InlineData(".svg", "ladder", "--field", "40", "--periods", "12")]
    public void Plot_FieldPictures_WriteAnImageWithReadableAxes(string extension, string kind, params string[] options)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, kind + extension);
        var run = ToolRunner.Invoke([.. new[] { "plot", ToolRunner.Example("superlattice.json"), "--show", kind, "--out", target }, .. options]);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var bytes = File.ReadAllBytes(target);
        Assert.True(bytes.Length > 10_000, "an image with axes, labels and data is larger than a blank one");
        if (extension == ".svg")
        {
            var svg = System.Text.Encoding.UTF8.GetString(bytes);
            Assert.Contains(kind == "drift" ? "Electric field F (kV/cm)" : "Position x (nm)", svg, StringComparison.Ordinal);
            Assert.Contains(kind == "drift" ? "Drift velocity v (km/s)" : "Energy (meV)", svg, StringComparison.Ordinal);
            Assert.DoesNotContain("E+0", svg, StringComparison.Ordinal); // no exponent tick labels
        }
        else
        {
            // PNG signature (ISO/IEC 15948 / W3C PNG spec, sec. 5.2).
            Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, bytes[..8]);
        }
        Assert.Equal(2, Directory.GetFiles(directory).Length); // the image and the structure file: no leftovers
    }

    [Theory]
    [InlineData(new[] { "--show", "drift" }, "--scattering-time is required")]
    [InlineData(new[] { "--show", "drift", "--scattering-time", "0" }, "--scattering-time must be from 1e-6 to 1e6 ps; got 0.")]
    [InlineData(new[] { "--show", "drift", "--scattering-time", "0.1", "--max-field", "1e6" }, "--max-field must be above 0 and at most")]
    [InlineData(new[] { "--show", "drift", "--scattering-time", "0.1", "--field", "10" }, "--field applies only to --show ladder; got --show drift.")]
    [InlineData(new[] { "--show", "ladder" }, "--show ladder needs --field F")]
    [InlineData(new[] { "--show", "ladder", "--field", "1e6" }, "--field must be above 0 and at most")]
    [InlineData(new[] { "--show", "ladder", "--field", "40", "--periods", "4" }, "--periods must be between 8 and 400; got 4.")]
    [InlineData(new[] { "--show", "dispersion", "--scattering-time", "0.1" }, "--scattering-time applies only to --show drift; got --show dispersion.")]
    [InlineData(new[] { "--show", "profile", "--band", "2" }, "--band applies only to --show drift and ladder; got --show profile.")]
    public void Plot_FieldPictureBadOption_ExitsTwoWithoutImage(string[] options, string message)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "x.png");
        var run = ToolRunner.Invoke([.. new[] { "plot", ToolRunner.Example("superlattice.json"), "--out", target }, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.Single(run.Stderr.Trim().Split('\n')); // one line
        Assert.False(File.Exists(target));
        Assert.Equal("", run.Stdout);
    }
}
