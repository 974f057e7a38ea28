// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;

namespace Periodic.Cli.Commands;

/// <summary><c>transmission FILE --periods N</c>: T(E) and R(E) of a finite stack of N cells between leads.</summary>
internal static class TransmissionCommand
{
    public static Command Create()
    {
        var file = Common.FileArgument();
        var periods = new Option<int>("--periods", "-N") { Description = "Number of unit cells in the finite stack (1 to 100,000).", Required = true };
        var grid = new EnergyGridOptions();
        var leadPotential = new Option<double?>("--lead-potential") { Description = "Potential of both leads, eV (default: the first layer's)." };
        var leadMass = new Option<double?>("--lead-mass") { Description = "Effective mass in both leads, m0 (default: the first layer's)." };
        var json = Common.JsonOption();
        var csv = Common.CsvOption();
        var command = new Command("transmission", "Transmission and reflection of a finite stack of N periods between two uniform leads.");
        command.Arguments.Add(file);
        command.Options.Add(periods);
        grid.AddTo(command);
        command.Options.Add(leadPotential);
        command.Options.Add(leadMass);
        command.Options.Add(json);
        command.Options.Add(csv);
        command.SetAction(int (result) =>
        {
            Common.Format(result, json, csv);
            grid.Read(result);
            Common.Load(result.GetValue(file)!);
            throw new NotSupportedException("transmission needs the finite-stack layer of the library, which this build does not include yet.");
        });
        return command;
    }
}
