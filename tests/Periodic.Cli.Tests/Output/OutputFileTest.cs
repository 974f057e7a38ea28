// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;

namespace Periodic.Cli.Tests.Output;

/// <summary>
/// What <c>--out</c> may and may not do to the file system. These run the real tool on real file-system objects;
/// device and FIFO cases use nodes made in a private temporary folder, never the system's own <c>/dev</c> entries.
/// </summary>
public sealed class OutputFileTest
{
    private static readonly string Structure = ToolRunner.Example("superlattice.json");

    private static ToolRunner.Run Dispersion(string outPath) =>
        ToolRunner.Invoke("dispersion", Structure, "--count", "2", "--points", "5", "--json", "--out", outPath);

    private static string NewFolder()
    {
        var folder = Path.Combine(Path.GetTempPath(), "periodic-out-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        return folder;
    }

    private static string[] Temporaries(string folder) =>
        Directory.GetFiles(folder, "*.tmp", SearchOption.TopDirectoryOnly);

    private static string FileType(string path)
    {
        // stat(1) reports the type the kernel sees; .NET itself calls devices and FIFOs ordinary files.
        var start = new ProcessStartInfo("stat", ["-c", "%F", path]) { RedirectStandardOutput = true };
        using var process = Process.Start(start)!;
        var type = process.StandardOutput.ReadToEnd().Trim();
        process.WaitForExit();
        return type;
    }

    private static void Run(string program, params string[] args)
    {
        using var process = Process.Start(new ProcessStartInfo(program, args))!;
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"{program} {string.Join(' ', args)} failed");
    }

    [Fact]
    public void Out_NewFile_WritesOutputAndLeavesNoTemporary()
    {
        var folder = NewFolder();
        var path = Path.Combine(folder, "result.json");
        var run = Dispersion(path);
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("\"bands\"", File.ReadAllText(path));
        Assert.Empty(Temporaries(folder));
    }

    [Fact]
    public void Out_CharacterDevice_IsWrittenNotReplaced()
    {
        if (!OperatingSystem.IsLinux() || Environment.UserName != "root")
        {
            return; // mknod needs root; CI runs as root, where the replacement bug bit.
        }
        var folder = NewFolder();
        var device = Path.Combine(folder, "null");
        Run("mknod", device, "c", "1", "3"); // the null device's numbers on Linux (devices.txt of the kernel docs)
        var run = Dispersion(device);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal("character special file", FileType(device));
        Assert.Empty(Temporaries(folder));
    }

    [Fact]
    public async Task Out_Fifo_IsWrittenAsAStream()
    {
        if (OperatingSystem.IsWindows())
        {
            return;
        }
        var folder = NewFolder();
        var fifo = Path.Combine(folder, "pipe");
        Run("mkfifo", fifo);
        // Opening a FIFO for reading waits for the writer; read it on another thread while the tool writes.
        var reader = Task.Run(() => File.ReadAllText(fifo));
        var run = Dispersion(fifo);
        Assert.Equal(0, run.ExitCode);
        var text = await reader.WaitAsync(TimeSpan.FromSeconds(60));
        Assert.Contains("\"bands\"", text);
        Assert.Equal("fifo", FileType(fifo));
        Assert.Empty(Temporaries(folder));
    }

    [Fact]
    public void Out_SymbolicLink_ReplacesTheTargetAndKeepsTheLink()
    {
        var folder = NewFolder();
        var target = Path.Combine(folder, "target.json");
        File.WriteAllText(target, "old");
        var link = Path.Combine(folder, "link.json");
        File.CreateSymbolicLink(link, target);
        var run = Dispersion(link);
        Assert.Equal(0, run.ExitCode);
        Assert.NotNull(new FileInfo(link).LinkTarget);
        Assert.Contains("\"bands\"", File.ReadAllText(target));
        Assert.Empty(Temporaries(folder));
    }

    [Fact]
    public void Out_ReadOnlyFile_IsRefusedAndLeftAlone()
    {
        if (OperatingSystem.IsWindows())
        {
            return;
        }
        var folder = NewFolder();
        var path = Path.Combine(folder, "frozen.json");
        File.WriteAllText(path, "keep");
        File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.GroupRead | UnixFileMode.OtherRead);
        var run = Dispersion(path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--out", run.Stderr);
        Assert.Contains("read-only", run.Stderr);
        Assert.Equal("keep", File.ReadAllText(path));
        Assert.True(new FileInfo(path).IsReadOnly);
    }

    [Fact]
    public void Out_ExistingFile_KeepsItsPermissions()
    {
        if (OperatingSystem.IsWindows())
        {
            return;
        }
        var folder = NewFolder();
        var path = Path.Combine(folder, "private.json");
        File.WriteAllText(path, "old");
        var owner = UnixFileMode.UserRead | UnixFileMode.UserWrite;
        File.SetUnixFileMode(path, owner);
        Assert.Equal(0, Dispersion(path).ExitCode);
        Assert.Equal(owner, File.GetUnixFileMode(path));
        Assert.Contains("\"bands\"", File.ReadAllText(path));
    }

    [Fact]
    public void Out_InputFile_IsRefusedDirectlyThroughALinkAndThroughAHardLink()
    {
        var folder = NewFolder();
        var input = Path.Combine(folder, "cell.json");
        File.Copy(Structure, input);
        var original = File.ReadAllText(input);
        var link = Path.Combine(folder, "alias.json");
        File.CreateSymbolicLink(link, input);
        var hard = Path.Combine(folder, "hard.json");
        if (!OperatingSystem.IsWindows())
        {
            Run("ln", input, hard);
        }
        foreach (var output in OperatingSystem.IsWindows() ? new[] { input, link } : [input, link, hard])
        {
            var run = ToolRunner.Invoke("dispersion", input, "--count", "1", "--points", "3", "--json", "--out", output);
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("--out", run.Stderr);
            Assert.Contains("input file", run.Stderr);
            Assert.Equal(original, File.ReadAllText(input));
        }
    }

    [Fact]
    public void Out_Directory_IsRefusedNamingTheOption()
    {
        var folder = NewFolder();
        var run = Dispersion(folder);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--out", run.Stderr);
        Assert.Contains("is a directory", run.Stderr);
    }

    [Fact]
    public void Out_MissingFolder_IsRefusedNamingTheTarget()
    {
        var folder = NewFolder();
        var path = Path.Combine(folder, "no-such-folder", "x.json");
        var run = Dispersion(path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--out", run.Stderr);
        Assert.Contains("does not exist", run.Stderr);
    }

    [Fact]
    public void Out_Empty_NamesTheOption()
    {
        var run = Dispersion("");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--out needs a", run.Stderr);
        Assert.Contains("empty", run.Stderr);
    }

    [Fact]
    public void Out_WriteFailure_NamesTheTargetNotATemporary()
    {
        if (!OperatingSystem.IsLinux() || Environment.UserName != "root")
        {
            return; // mknod needs root.
        }
        var folder = NewFolder();
        var full = Path.Combine(folder, "full");
        Run("mknod", full, "c", "1", "7"); // the "full" device (always ENOSPC) on Linux, kernel devices.txt
        var run = Dispersion(full);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("cannot write --out", run.Stderr);
        Assert.Contains(full, run.Stderr);
        Assert.DoesNotContain(".tmp", run.Stderr);
        Assert.Empty(Temporaries(folder));
    }

    [Fact]
    public void Out_TerminatedWhileWriting_LeavesNoTemporaryFile()
    {
        if (OperatingSystem.IsWindows())
        {
            return; // SIGTERM is a POSIX signal.
        }
        var folder = NewFolder();
        var path = Path.Combine(folder, "long.csv");
        // A long streamed output: the temporary file exists for seconds while the rows are written.
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var arg in new[] { "exec", Path.Combine(AppContext.BaseDirectory, "Periodic.Cli.dll"), "dispersion", Structure, "--count", "5", "--points", "10000000", "--csv", "--out", path })
        {
            start.ArgumentList.Add(arg);
        }
        using var process = Process.Start(start)!;
        var clock = Stopwatch.StartNew();
        while (!process.HasExited && Temporaries(folder).Length == 0 && clock.Elapsed < TimeSpan.FromSeconds(60))
        {
            Thread.Sleep(10);
        }
        Assert.False(process.HasExited, "the run ended before its temporary file could be seen");
        Assert.NotEmpty(Temporaries(folder));
        Run("kill", "-TERM", process.Id.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Assert.True(process.WaitForExit(30_000), "the tool did not stop on SIGTERM");
        Assert.Empty(Temporaries(folder));
        Assert.False(File.Exists(path), "a terminated run must not leave a partial output");
    }
}
