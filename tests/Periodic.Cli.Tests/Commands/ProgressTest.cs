// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;

namespace Periodic.Cli.Tests.Commands;

public sealed class ProgressTest
{
    private static readonly string[] LongRun =
        ["transmission", ToolRunner.Example("superlattice.json"), "--periods", "1000", "--from", "0", "--to", "1", "--points", "20000", "--csv"];

    [Fact]
    public void LongRun_StderrRedirected_ShowsNoProgress()
    {
        var run = ToolRunner.Invoke(new Dictionary<string, string> { ["PERIODIC_PROGRESS_DELAY_MS"] = "0" }, LongRun);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Stderr);
        Assert.Equal(20_001, run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Length);
    }

    [Fact]
    public void LongRun_StderrIsATerminal_ShowsProgress()
    {
        // util-linux `script` gives the tool a pseudo-terminal; it is part of every Linux CI image we use.
        Assert.True(File.Exists("/usr/bin/script"), "this test needs /usr/bin/script (util-linux) to provide a terminal");
        var log = Path.Combine(Path.GetDirectoryName(ToolRunner.TempFile("{}"))!, "typescript");
        // The delay is set to zero so that a short run shows the line on any machine.
        var command = "PERIODIC_PROGRESS_DELAY_MS=0 dotnet exec " + Path.Combine(AppContext.BaseDirectory, "Periodic.Cli.dll") + " "
            + string.Join(' ', LongRun.Select(a => "'" + a + "'")) + " > /dev/null";
        var start = new ProcessStartInfo("/usr/bin/script") { UseShellExecute = false, RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var arg in new[] { "-qec", command, log })
        {
            start.ArgumentList.Add(arg);
        }
        using var process = Process.Start(start)!;
        process.StandardOutput.ReadToEnd();
        Assert.True(process.WaitForExit(60_000));
        Assert.Equal(0, process.ExitCode);
        var text = File.ReadAllText(log);
        Assert.Contains("transmission: ", text, StringComparison.Ordinal);
        Assert.Contains("/20000 (", text, StringComparison.Ordinal);
    }
}
