// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Tests.TestHelpers;

/// <summary>Files of the repository that tests read (the example structure files under docs/).</summary>
internal static class Repository
{
    public static string Root { get; } = FindRoot();

    public static string ExampleStructures => Path.Combine(Root, "docs", "examples", "structures");

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
