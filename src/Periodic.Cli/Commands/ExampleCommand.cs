// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;

namespace Periodic.Cli.Commands;

/// <summary><c>example</c>: prints the built-in structure file, a starting point for your own.</summary>
internal static class ExampleCommand
{
    public static Command Create()
    {
        var command = new Command("example", "Print the built-in example structure file (JSON) to start your own from.");
        command.SetAction(_ =>
        {
            Console.Out.WriteLine(BuiltInExample.Json);
            return 0;
        });
        return command;
    }
}
