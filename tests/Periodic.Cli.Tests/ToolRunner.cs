// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;
using System.Text.Json;

namespace Periodic.Cli.Tests;

/// <summary>Runs the built tool as a separate process, the way users and scripts run it.</summary>
internal static class ToolRunner
{
    public sealed record Run(int ExitCode, string Stdout, string Stderr)
    {
        public JsonElement Json() => JsonDocument.Parse(Stdout).RootElement;
    }

    public static string RepositoryRoot { get; } = FindRoot();

    public static string Example(string name) => Path.Combine(RepositoryRoot, "docs", "examples", "structures", name);

    public static Run Invoke(params string[] args) => Invoke(new Dictionary<string, string>(), args);

    public static Run Invoke(IReadOnlyDictionary<string, string> environment, params string[] args)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = RepositoryRoot,
        };
        foreach (var (name, value) in environment)
        {
            start.Environment[name] = value;
        }
        start.ArgumentList.Add("exec");
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "Periodic.Cli.dll"));
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(60_000))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException("the tool did not finish within 60 s: " + string.Join(' ', args));
        }
        return new Run(process.ExitCode, stdout.Result, stderr.Result);
    }

    /// <summary>Writes <paramref name="json"/> to a fresh temporary file and returns its path.</summary>
    public static string TempFile(string json, string name = "structure.json")
    {
        var directory = Path.Combine(Path.GetTempPath(), "periodic-cli-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(directory);
        var path = Path.Combine(directory, name);
        File.WriteAllText(path, json);
        return path;
    }

    private static string FindRoot()
    {
        var directory = new DirectoryInfo(AppContext.BaseDirectory);
        while (directory is not null && !File.Exists(Path.Combine(directory.FullName, "Periodic.sln")))
        {
            directory = directory.Parent;
        }
        return directory?.FullName ?? throw new InvalidOperationException("repository root (Periodic.sln) not found above " + AppContext.BaseDirectory);
    }
}
