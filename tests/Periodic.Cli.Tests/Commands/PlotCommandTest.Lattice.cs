// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests.Commands;

// Pictures of an optical-lattice file: energies in recoil energies (or --unit), positions in lattice periods, DOS per site.
public sealed partial class PlotCommandTest
{
    [Theory]
    [InlineData("dos", null, "Energy E (E_R)", "DOS per site (1/E_R")]
    [InlineData("profile", null, "Energy (E_R)", "Position x / d")]
    [InlineData("transmission", null, "Energy E (E_R)", "Transmission T")]
    [InlineData("dispersion", null, "energy E (E_R)", "quasimomentum q / k_L")]
    [InlineData("dos", "eV", "Energy E (eV)", "DOS per site (1/eV")]
    [InlineData("profile", "kHz", "Energy (kHz)", "Position x / d")]
    [InlineData("transmission", "eV", "Energy E (eV)", "Transmission T")]
    [InlineData("dispersion", "kHz", "energy E (kHz)", "quasimomentum q / k_L")]
    public void Plot_LatticeFile_AxesInLatticeUnits(string kind, string? unit, string energyAxis, string otherAxis)
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, kind + ".svg");
        string[] args = ["plot", ToolRunner.Example("rubidium-lattice.json"), "--show", kind, "--out", target];
        var run = ToolRunner.Invoke(unit is null ? args : [.. args, "--unit", unit]);
        Assert.True(run.ExitCode == 0, run.Stderr);
        var svg = File.ReadAllText(target);
        Assert.Contains(energyAxis, svg, StringComparison.Ordinal);
        Assert.Contains(otherAxis, svg, StringComparison.Ordinal);
        Assert.DoesNotContain("(nm)", svg, StringComparison.Ordinal); // lengths in lattice periods, wavevectors in k_L
        Assert.DoesNotContain("1/(eV nm)", svg, StringComparison.Ordinal);
    }

    [Fact]
    public void Plot_UnitOnCellFile_ExitsTwoWithoutImage()
    {
        var directory = Path.GetDirectoryName(ToolRunner.TempFile("{}"))!;
        var target = Path.Combine(directory, "x.png");
        var run = ToolRunner.Invoke("plot", ToolRunner.Example("superlattice.json"), "--unit", "eV", "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--unit applies only to an optical-lattice file", run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }
}
