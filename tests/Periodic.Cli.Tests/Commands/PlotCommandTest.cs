// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests.Commands;

public sealed class PlotCommandTest
{
    [Theory]
    [InlineData("dispersion", "superlattice.json", ".png")]
    [InlineData("dos", "delta-comb.json", ".png")]
    [InlineData("profile", "superlattice.json", ".svg")]
    [InlineData("transmission", "gaas-algaas.json", ".png")]
    [InlineData("in-plane", "superlattice.json", ".png")]
    public void Plot_WritesAnImage(string kind, string example, string extension)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, kind + extension);
        var run = ToolRunner.Invoke("plot", ToolRunner.Example(example), "--show", kind, "--out", target);
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
}
