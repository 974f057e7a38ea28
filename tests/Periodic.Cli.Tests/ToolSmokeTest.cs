// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Tests;

public sealed class ToolSmokeTest
{
    [Fact]
    public void ToolAssembly_IsBuilt()
    {
        // Replaced by process-level tests of every command when the command-line issue lands.
        Assert.True(File.Exists(Path.Combine(AppContext.BaseDirectory, "Periodic.Cli.dll")));
    }
}
