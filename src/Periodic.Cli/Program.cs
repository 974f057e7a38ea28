// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using Periodic;
using Periodic.Cli;
using Periodic.Cli.Commands;
using Periodic.Serialization;

// Exit codes: 0 success, 1 a computation failed, 2 bad input or usage. Errors are one line on
// stderr; --verbose adds the exception detail.
var verbose = Common.Verbose;
// A plain command named "periodic" rather than RootCommand, whose name would be the assembly's (Periodic.Cli).
var root = new Command("periodic", "periodic: bands, dispersion, densities of states and carriers, Bloch functions, bound levels, resonances, transmission, current under bias and plots of one-dimensional periodic structures and stacks. "
    + "Without arguments, prints the band table of a built-in example superlattice.");
root.Options.Add(new System.CommandLine.Help.HelpOption());
root.Options.Add(new VersionOption());
root.Options.Add(verbose);
root.Options.Add(Common.NoSpaceCharge);
root.Subcommands.Add(BandsCommand.Create());
root.Subcommands.Add(DispersionCommand.Create());
root.Subcommands.Add(DosCommand.Create());
root.Subcommands.Add(TransmissionCommand.Create());
root.Subcommands.Add(CurrentCommand.Create());
root.Subcommands.Add(LevelsCommand.Create());
root.Subcommands.Add(ResonancesCommand.Create());
root.Subcommands.Add(CarriersCommand.Create());
root.Subcommands.Add(BlochCommand.Create());
root.Subcommands.Add(PlotCommand.Create());
root.Subcommands.Add(SweepCommand.Create());
root.Subcommands.Add(MergeCommand.Create());
root.Subcommands.Add(DesignCommand.Create());
root.Subcommands.Add(HubbardCommand.Create());
root.Subcommands.Add(FieldCommands.Drift());
root.Subcommands.Add(FieldCommands.Ladder());
root.Subcommands.Add(TransitionsCommand.Create());
root.Subcommands.Add(AbsorptionCommand.Create());
root.Subcommands.Add(ExampleCommand.Create());
Common.ParseWholeNumbers(root);
root.SetAction(_ =>
{
    BandsCommand.Write(BuiltInExample.Load(), 4, OutputFormat.Table, null);
    Console.Out.WriteLine();
    Console.Out.WriteLine("(built-in example; try: periodic example > my.json && periodic bands my.json --json)");
    return 0;
});

// An option given an empty value ("--out ''") is named here: the parser would report it as an unknown argument.
for (var i = 0; i + 1 < args.Length; i++)
{
    if (args[i].StartsWith('-') && args[i].Length > 1 && args[i + 1].Length == 0)
    {
        Console.Error.WriteLine($"periodic: error: {Common.Printable(args[i])} needs a value; got an empty string (see periodic --help).");
        return 2;
    }
}
var parsed = root.Parse(args);
if (parsed.Errors.Count > 0)
{
    Console.Error.WriteLine($"periodic: error: {Common.Printable(OneLine(parsed.Errors[0].Message))} (see periodic --help)");
    return 2;
}
try
{
    return parsed.Invoke(new InvocationConfiguration { EnableDefaultExceptionHandler = false });
}
catch (Exception e)
{
    // Bad input (the library's ArgumentException, a bad or missing file, a bad option) is 2; a numerical failure on
    // valid input (PeriodicComputationException and anything unforeseen) is 1.
    var code = e switch
    {
        UsageException or StructureFileException or ArgumentException
            or FileNotFoundException or DirectoryNotFoundException or UnauthorizedAccessException => 2,
        _ => 1,
    };
    var what = e switch
    {
        PeriodicComputationException => "computation failed: ",
        UsageException or StructureFileException or ArgumentException => "",
        IOException or UnauthorizedAccessException => "",
        _ => "computation failed: ",
    };
    Console.Error.WriteLine($"periodic: error: {what}{Common.Printable(OneLine(Describe(e)))}");
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
