// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using Periodic.Bands;
using Periodic.Cli;
using Periodic.Cli.Commands;
using Periodic.Serialization;

// Exit codes: 0 success, 1 a computation failed, 2 bad input or usage. Errors are one line on
// stderr; --verbose adds the exception detail.
var verbose = new Option<bool>("--verbose") { Description = "On failure, print the full error detail.", Recursive = true };
// A plain command named "periodic" rather than RootCommand, whose name would be the assembly's (Periodic.Cli).
var root = new Command("periodic", "periodic: bands, dispersion, density of states, transmission, current under bias and plots of one-dimensional periodic structures. "
    + "Without arguments, prints the band table of a built-in example superlattice.");
root.Options.Add(new System.CommandLine.Help.HelpOption());
root.Options.Add(new VersionOption());
root.Options.Add(verbose);
root.Subcommands.Add(BandsCommand.Create());
root.Subcommands.Add(DispersionCommand.Create());
root.Subcommands.Add(DosCommand.Create());
root.Subcommands.Add(TransmissionCommand.Create());
root.Subcommands.Add(CurrentCommand.Create());
root.Subcommands.Add(PlotCommand.Create());
root.Subcommands.Add(TransitionsCommand.Create());
root.Subcommands.Add(AbsorptionCommand.Create());
root.Subcommands.Add(ExampleCommand.Create());
root.SetAction(_ =>
{
    Console.Out.Write(BandsCommand.Render(BuiltInExample.Load(), 4, OutputFormat.Table));
    Console.Out.WriteLine();
    Console.Out.WriteLine("(built-in example; try: periodic example > my.json && periodic bands my.json --json)");
    return 0;
});

var parsed = root.Parse(args);
if (parsed.Errors.Count > 0)
{
    Console.Error.WriteLine($"periodic: error: {OneLine(parsed.Errors[0].Message)} (see periodic --help)");
    return 2;
}
try
{
    return parsed.Invoke(new InvocationConfiguration { EnableDefaultExceptionHandler = false });
}
catch (Exception e)
{
    var code = e switch
    {
        UsageException or StructureFileException or ArgumentException or FileNotFoundException or UnauthorizedAccessException => 2,
        _ => 1,
    };
    var what = e switch
    {
        BandSearchException => "computation failed: ",
        UsageException or StructureFileException or ArgumentException => "",
        IOException or UnauthorizedAccessException => "",
        _ => "computation failed: ",
    };
    Console.Error.WriteLine($"periodic: error: {what}{OneLine(Describe(e))}");
    if (parsed.GetValue(verbose))
    {
        Console.Error.WriteLine(e.ToString());
    }
    return code;
}

static string OneLine(string message) =>
    System.Text.RegularExpressions.Regex.Replace(message.ReplaceLineEndings(" "), @"\s+", " ").Trim();

// ArgumentException appends "(Parameter 'x')" and "Actual value was v."; our messages already say both.
static string Describe(Exception e)
{
    if (e is not ArgumentException argument)
    {
        return e.Message;
    }
    var message = argument.Message;
    var cut = message.IndexOf(" (Parameter '", StringComparison.Ordinal);
    return cut >= 0 ? message[..cut] : message;
}
