// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using System.Text;
using System.Text.Json;
using Periodic.Cli.Output;
using Periodic.Serialization;
using Periodic.SpaceCharge;

namespace Periodic.Cli.Commands;

internal enum OutputFormat
{
    Table,
    Json,
    Csv,
}

/// <summary>Options and helpers shared by the commands.</summary>
internal static class Common
{
    /// <summary>--verbose on every command: on failure the full error detail; some commands add where the time went.</summary>
    public static Option<bool> Verbose { get; } = new("--verbose") { Description = "On failure, print the full error detail (sweep: also where the time went).", Recursive = true };

    /// <summary>--no-space-charge on every command: a doped structure is computed with its rigid bands (no self-consistent potential).</summary>
    public static Option<bool> NoSpaceCharge { get; } = new("--no-space-charge")
    {
        Description = "For a doped structure file: use the rigid bands of the undoped potential instead of the self-consistent (Schrödinger–Poisson) one.",
        Recursive = true,
    };

    public static Argument<string> FileArgument() => new("file")
    {
        Description = "Structure file (JSON, see docs/structure.schema.json).",
    };

    public static Option<bool> JsonOption() => new("--json") { Description = "Write JSON (camelCase names, a units object)." };

    public static Option<bool> CsvOption() => new("--csv") { Description = "Write CSV (a header row with units)." };

    public static Option<string?> OutOption() => new("--out", "-o") { Description = "Write to this file (atomically: nothing is left behind on failure) instead of stdout." };

    /// <summary>"1 period", "3 periods": no "(s)" plurals in output.</summary>
    public static string Plural(long count, string noun) =>
        string.Create(CultureInfo.InvariantCulture, $"{count} {noun}{(count == 1 ? "" : "s")}");

    public static Option<int> CountOption(int defaultCount) => new("--count", "-n")
    {
        Description = "Number of bands, from the lowest.",
        DefaultValueFactory = _ => defaultCount,
    };

    /// <summary>
    /// An optional number with a unit fixed by the option (e.g. eV, K). Parsed here rather than by the parser's default,
    /// so that a bad value is reported with the option, the text given and what is allowed.
    /// </summary>
    public static Option<double?> NumberOption(string name, string unit, string example, string description) => new(name)
    {
        Description = description,
        CustomParser = argument =>
        {
            var text = argument.Tokens.Count > 0 ? argument.Tokens[0].Value : string.Empty;
            if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) && double.IsFinite(value))
            {
                return value + 0.0; // -0 becomes 0, so "-0" is written as 0
            }
            argument.AddError($"{name} \"{text}\" is not a number; give a finite number in {unit} (e.g. {name} {example}).");
            return null;
        },
    };

    /// <summary>
    /// Gives every whole-number option of <paramref name="command"/> and its subcommands (<c>--threads</c>, <c>--periods</c>,
    /// <c>--points</c>, …) that has no parser of its own one that reports a bad value with the option and the text given,
    /// rather than the parser's default message (which names a .NET type). Ranges are checked where the value is used.
    /// </summary>
    public static void ParseWholeNumbers(Command command)
    {
        foreach (var option in command.Options)
        {
            switch (option)
            {
                case Option<int> whole when whole.CustomParser is null:
                    whole.CustomParser = argument => WholeNumber(argument, whole.Name, whole.DefaultValueFactory) ?? 0;
                    break;
                case Option<int?> optional when optional.CustomParser is null:
                    optional.CustomParser = argument => WholeNumber(argument, optional.Name, optional.DefaultValueFactory);
                    break;
            }
        }
        foreach (var subcommand in command.Subcommands)
        {
            ParseWholeNumbers(subcommand);
        }
    }

    private static int? WholeNumber<T>(System.CommandLine.Parsing.ArgumentResult argument, string name, Func<System.CommandLine.Parsing.ArgumentResult, T>? fallback)
    {
        if (argument.Tokens.Count == 0)
        {
            return fallback is null ? null : fallback(argument) is int value ? value : null;
        }
        var text = argument.Tokens[0].Value;
        if (int.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var number))
        {
            return number;
        }
        argument.AddError($"{name} {Output.Printable.Quote(text)} is not a whole number.");
        return null;
    }

    /// <summary>The in-plane wavevector k∥ (1/nm) shared by the commands that take it.</summary>
    public static Option<double?> InPlaneWavevectorOption() => NumberOption("--in-plane-wavevector", "1/nm", "0.3",
        "In-plane wavevector k∥, 1/nm (default 0): every layer and lead is seen with its potential raised by ħ²k∥²/2m of its own mass, "
        + "so energies are total energies E(k_z, k∥). Parabolic layers, delta barriers and Fourier segments.");

    /// <summary><c>--unit</c>: the energy unit an optical-lattice file is shown in (tables, CSV, pictures; never JSON).</summary>
    public static Option<string?> LatticeUnitOption() => new("--unit")
    {
        Description = "For an optical-lattice file: energy unit of tables, CSV and pictures: recoil (E_R, the default), kHz (E/h) or eV. "
            + "JSON is always in eV and 1/nm; other files choose eV, meV, ... by magnitude.",
    };

    /// <summary>The unit <paramref name="option"/> asks for; refused for a file that is not an optical lattice.</summary>
    public static LatticeEnergyUnit LatticeUnit(ParseResult result, Option<string?> option, StructureDefinition structure)
    {
        if (result.GetValue(option) is not { } text)
        {
            return LatticeEnergyUnit.Recoil;
        }
        var unit = DisplayUnits.ParseLatticeUnit(text);
        if (structure.OpticalLattice is null)
        {
            throw new UsageException($"--unit applies only to an optical-lattice file (\"opticalLattice\" instead of \"cell\"); {Printable(structure.SourceName)} is a cell, "
                + "whose tables choose eV, meV, µeV, ... by magnitude (CSV and JSON in eV).");
        }
        return unit;
    }

    /// <summary>The structure at the in-plane wavevector given by <paramref name="option"/> (unchanged without it).</summary>
    public static StructureDefinition AtInPlaneWavevector(ParseResult result, Option<double?> option, StructureDefinition structure)
    {
        if (result.GetValue(option) is not { } k)
        {
            return structure;
        }
        if ((structure.SelfConsistent is not null || structure.SelfConsistentStack is not null) && k != 0)
        {
            throw new UsageException("--in-plane-wavevector cannot be combined with the self-consistent potential of a doped structure (its sampled potential has no in-plane form here); add --no-space-charge for the rigid bands.");
        }
        if (!(k >= 0 && k <= Periodic.Structures.InPlaneMotion.MaxWavevectorPerNanometre))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"--in-plane-wavevector must be from 0 to {Periodic.Structures.InPlaneMotion.MaxWavevectorPerNanometre} 1/nm (|k∥|, not negative); got {k:R}."));
        }
        try
        {
            return structure.AtInPlaneWavevector(k);
        }
        catch (ArgumentException e)
        {
            throw new UsageException($"--in-plane-wavevector: {Describe(e)}");
        }
    }

    /// <summary>The message of a library argument error without the runtime's "(Parameter 'x')" suffix.</summary>
    public static string Describe(ArgumentException e)
    {
        var cut = e.Message.IndexOf(" (Parameter '", StringComparison.Ordinal);
        return cut >= 0 ? e.Message[..cut] : e.Message;
    }

    public static OutputFormat Format(ParseResult result, Option<bool> json, Option<bool> csv)
    {
        var isJson = result.GetValue(json);
        var isCsv = result.GetValue(csv);
        if (isJson && isCsv)
        {
            throw new UsageException("--json and --csv cannot be used together; choose one.");
        }
        return isJson ? OutputFormat.Json : isCsv ? OutputFormat.Csv : OutputFormat.Table;
    }

    public static int CheckCount(int count, string option = "--count", int maximum = 1000)
    {
        if (count < 1 || count > maximum)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{option} must be between 1 and {maximum}; got {count}."));
        }
        return count;
    }

    /// <summary>
    /// Reads a structure file; a doped one is solved self-consistently (Schrödinger–Poisson, <see cref="SpaceChargeSolver"/>)
    /// unless --no-space-charge is given, and every command then works on the self-consistent cell.
    /// </summary>
    public static StructureDefinition Load(ParseResult result, string path)
    {
        var structure = Load(path);
        if (structure.Doping is not { } doped || result.GetValue(NoSpaceCharge))
        {
            return structure;
        }
        return structure.WithSelfConsistentCell(SolveCell(doped));
    }

    /// <summary>
    /// The periodic (superlattice) space-charge solution of a doped cell; where its Bloch states cannot be built (barriers so thick
    /// that the wells are isolated), the failure says how to model isolated doped wells instead (exit 1 still).
    /// </summary>
    private static SelfConsistentCell SolveCell(DopedCell doped)
    {
        try
        {
            return SpaceChargeSolver.Solve(doped);
        }
        catch (PrecisionLimitException e) when (e.Message.Contains("too opaque", StringComparison.Ordinal))
        {
            throw new PrecisionLimitException(
                $"the doped cell is solved as a superlattice (periodic space charge), and {e.Message.TrimEnd('.')}. The wells are too far apart for minibands: for isolated doped wells give the file a \"stack\" (periods and leads; it is solved between its leads), or add --no-space-charge.", e);
        }
    }

    /// <summary>
    /// For the finite-stack commands at zero bias (levels, resonances, transmission, transitions, absorption): a doped file is solved self-consistently
    /// unless --no-space-charge is given. A file whose stack holds dopants gets its stack solved between its leads
    /// (<see cref="SpaceChargeSolver.SolveStack(DopedStack, SpaceChargeOptions?, IProgress{SpaceChargeProgress}?, CancellationToken)"/>);
    /// a doped cell without such a stack gets the periodic solution, repeated in the stacks built from it. A non-zero
    /// <c>stack.bias</c> is refused: space charge under bias is not modelled.
    /// </summary>
    /// <param name="result">The parsed command line.</param>
    /// <param name="path">The structure file.</param>
    /// <param name="command">The command, for messages.</param>
    /// <param name="biasOption">The command's --bias, if it has one and it was given (it overrides the file's stack.bias).</param>
    /// <param name="usesBias">False for a command that computes at zero bias whatever the file says (levels).</param>
    public static StructureDefinition LoadStack(ParseResult result, string path, string command, double? biasOption, bool usesBias)
    {
        var structure = Load(path);
        if (result.GetValue(NoSpaceCharge) || (structure.Doping is null && structure.StackDoping is null && structure.StackSpaceChargeRefusal is null))
        {
            return structure;
        }
        if (usesBias)
        {
            var (bias, source) = biasOption is { } u ? (u, "--bias") : (structure.StackBias.ElectronVolts, $"stack.bias of {Printable(structure.SourceName)}");
            if (bias != 0)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"{command}: {source} is {bias:R} eV, but the space charge of a doped structure is solved at zero bias only (bias with space charge is not modelled); give a bias of 0 eV, or add --no-space-charge for the rigid bands under bias."));
            }
        }
        if (structure.StackSpaceChargeRefusal is { } refusal)
        {
            throw new UsageException($"{command}: {Printable(refusal)}");
        }
        return structure.StackDoping is { } stack
            ? structure.WithSelfConsistentStack(SpaceChargeSolver.SolveStack(stack))
            : structure.WithSelfConsistentCell(SolveCell(structure.Doping!));
    }

    /// <summary>True when the structure's doping (of its cell or of its stack) asks for a self-consistent potential, i.e. without --no-space-charge.</summary>
    private static bool IsSelfConsistent(ParseResult result, StructureDefinition structure) =>
        !result.GetValue(NoSpaceCharge) && (structure.Doping is not null || structure.StackDoping is not null || structure.SelfConsistent is not null || structure.SelfConsistentStack is not null);

    /// <summary>
    /// Refuses the self-consistent potential of a doped structure for <paramref name="command"/>, which works under bias
    /// (current, ladder) or needs what a sampled potential does not offer: space charge under bias is not modelled.
    /// </summary>
    public static StructureDefinition RequireRigid(ParseResult result, StructureDefinition structure, string command) => !IsSelfConsistent(result, structure)
        ? structure
        : throw new UsageException($"{command} does not take the self-consistent potential of a doped structure: it works under bias, and space charge under bias is not modelled (the self-consistent potential is that of zero bias); add --no-space-charge for the rigid bands.");

    /// <summary>
    /// The <c>selfConsistent</c> object: how the space-charge iteration ended, μ, the Hartree potential and n(z) on the grid; for
    /// a cell its occupied minibands, for a finite stack its occupied states and lead buffers.
    /// </summary>
    public static void SelfConsistentObject(Utf8JsonWriter writer, SelfConsistentSolution solution)
    {
        var stack = solution as SelfConsistentStack;
        writer.WriteStartObject("selfConsistent");
        writer.WriteBoolean("converged", true); // an unconverged iteration throws (exit 1) and writes nothing
        writer.WriteNumber("iterations", solution.Iterations);
        writer.WriteNumber("fermiLevel", solution.FermiLevelElectronVolts);
        writer.WriteNumber("neutralityError", solution.NeutralityError);
        writer.WriteNumber("residual", solution.ResidualElectronVolts);
        writer.WriteNumber("tolerance", solution.Options.ToleranceElectronVolts);
        writer.WriteNumber("temperature", solution.TemperatureKelvin);
        if (stack is not null)
        {
            writer.WriteNumber("occupiedStates", stack.OccupiedStates);
        }
        else if (solution is SelfConsistentCell cell)
        {
            writer.WriteNumber("occupiedBands", cell.OccupiedBands);
        }
        var valence = (solution as SelfConsistentCell)?.Input.ValenceBands ?? [];
        if (valence.Count > 0)
        {
            // Each valence band whose holes are carriers: its name, its edge on the energy scale of the bands, the hole minibands summed.
            var cellSolution = (SelfConsistentCell)solution;
            writer.WriteStartArray("valenceBands");
            for (var b = 0; b < valence.Count; b++)
            {
                writer.WriteStartObject();
                writer.WriteString("name", valence[b].Name);
                writer.WriteNumber("edge", valence[b].EdgeElectronVolts);
                writer.WriteNumber("occupiedBands", cellSolution.OccupiedValenceBands[b]);
                writer.WriteEndObject();
            }
            writer.WriteEndArray();
        }
        var stackValence = stack?.Input.ValenceBands ?? [];
        if (stackValence.Count > 0)
        {
            // Each valence band whose holes are carriers of the stack: its name and its edge on the energy scale of the levels.
            writer.WriteStartArray("valenceBands");
            foreach (var band in stackValence)
            {
                writer.WriteStartObject();
                writer.WriteString("name", band.Name);
                writer.WriteNumber("edge", band.EdgeElectronVolts);
                writer.WriteEndObject();
            }
            writer.WriteEndArray();
        }
        var holes = valence.Count > 0 || stackValence.Count > 0;
        writer.WriteNumber("gridSpacing", solution.Options.MaxGridSpacingNanometres);
        if (stack is not null)
        {
            writer.WriteNumber("leadBuffer", stack.BufferNanometres);
        }
        writer.WriteString("model", stack is not null
            ? stackValence.Count > 0
                ? "Hartree (Schrödinger–Poisson) electrons and holes of the finite stack between undoped leads at zero bias at one Fermi level: states of the closed domain (stack and lead buffers, hard walls at their outer ends), holes of each valence band in a single parabolic band (no heavy/light-hole mixing, no split-off band, no strain), dopants fully ionised unless a level is given, no field through the ends, neutral domain; no exchange-correlation or bias"
                : "Hartree (Schrödinger–Poisson) electrons of the finite stack between undoped leads at zero bias: states of the closed domain (stack and lead buffers, hard walls at their outer ends), no field through the ends, neutral domain; no holes, exchange-correlation or bias"
            : valence.Count > 0
            ? "Hartree (Schrödinger–Poisson) electrons and holes of the cell's minibands at one Fermi level, holes of each valence band in a single parabolic band (no heavy/light-hole mixing, no split-off band, no strain), dopants fully ionised unless a level is given, periodic boundary conditions; no exchange-correlation or bias"
            : "Hartree (Schrödinger–Poisson) electrons of the cell's minibands, fully ionised dopants, periodic boundary conditions; no holes, exchange-correlation or bias");
        Samples(writer, "hartree", solution.PositionsNanometres, solution.HartreeElectronVolts);
        Samples(writer, "electronDensity", solution.PositionsNanometres, solution.ElectronDensityPerCubicCentimetre);
        if (holes)
        {
            Samples(writer, "holeDensity", solution.PositionsNanometres, solution.HoleDensityPerCubicCentimetre);
        }
        var units = new List<(string Name, string Unit)> { ("fermiLevel", "eV"), ("residual", "eV"), ("tolerance", "eV"), ("temperature", "K"), ("gridSpacing", "nm") };
        units.AddRange(stack is not null ? [("leadBuffer", "nm"), ("positions", "nm from the rigid stack's left interface")] : [("positions", "nm")]);
        units.AddRange([("hartree", "eV"), ("electronDensity", "cm^-3")]);
        if (holes)
        {
            units.AddRange([("holeDensity", "cm^-3"), ("edge", "eV")]);
        }
        Units(writer, [.. units]);
        writer.WriteEndObject();
    }

    private static void Samples(Utf8JsonWriter writer, string name, IReadOnlyList<double> positions, IReadOnlyList<double> values)
    {
        writer.WriteStartObject(name);
        writer.WriteStartArray("positions");
        foreach (var x in positions)
        {
            writer.WriteNumberValue(x);
        }
        writer.WriteEndArray();
        writer.WriteStartArray("values");
        foreach (var v in values)
        {
            writer.WriteNumberValue(v);
        }
        writer.WriteEndArray();
        writer.WriteEndObject();
    }

    /// <summary>
    /// An energy in meV with three decimals; a value that rounds to zero prints as 0.000, not -0.000 (the sign of a
    /// round-off below a µeV says nothing).
    /// </summary>
    private static string MilliElectronVolts(double electronVolts) =>
        (Math.Round(electronVolts * 1e3, 3) + 0.0).ToString("F3", CultureInfo.InvariantCulture);

    /// <summary>One line under a text table's title for a self-consistent structure; empty otherwise.</summary>
    public static string SelfConsistentLine(StructureDefinition structure) => structure.SelfConsistentStack is { } stack
        ? string.Create(CultureInfo.InvariantCulture,
            $"Self-consistent (Schrödinger–Poisson) stack at zero bias, {stack.TemperatureKelvin:G6} K: Fermi level {stack.FermiLevelElectronVolts:F6} eV, {Plural(stack.Iterations, "iteration")}, residual {stack.ResidualElectronVolts:G2} eV, neutrality error {stack.NeutralityError:G2}, Hartree potential from {MilliElectronVolts(stack.HartreeElectronVolts.Min())} to {MilliElectronVolts(stack.HartreeElectronVolts.Max())} meV; the stack includes {stack.BufferNanometres:G4} nm of each lead (--no-space-charge: rigid stack)\n")
            + (stack.Input.ValenceBands.Count == 0 ? "" : string.Create(CultureInfo.InvariantCulture,
                $"Carriers: electrons up to {stack.ElectronDensityPerCubicCentimetre.Max():G4} cm^-3, holes ({string.Join(", ", stack.Input.ValenceBands.Select(b => b.Name))}; single parabolic bands, no band mixing or strain) up to {stack.HoleDensityPerCubicCentimetre.Max():G4} cm^-3\n"))
        : structure.SelfConsistent is { } sc
        ? string.Create(CultureInfo.InvariantCulture,
            $"Self-consistent (Schrödinger–Poisson) potential at {sc.TemperatureKelvin:G6} K: Fermi level {sc.FermiLevelElectronVolts:F6} eV, {Plural(sc.Iterations, "iteration")}, residual {sc.ResidualElectronVolts:G2} eV, neutrality error {sc.NeutralityError:G2}, Hartree potential from {MilliElectronVolts(sc.HartreeElectronVolts.Min())} to {MilliElectronVolts(sc.HartreeElectronVolts.Max())} meV (--no-space-charge: rigid bands)\n")
            + (sc.Input.ValenceBands.Count == 0 ? "" : string.Create(CultureInfo.InvariantCulture,
                $"Carriers: electrons up to {sc.ElectronDensityPerCubicCentimetre.Max():G4} cm^-3, holes ({string.Join(", ", sc.Input.ValenceBands.Select(b => b.Name))}; single parabolic bands, no band mixing or strain) up to {sc.HoleDensityPerCubicCentimetre.Max():G4} cm^-3\n"))
        : structure.Doping is not null ? "Doped structure computed with its rigid bands (--no-space-charge).\n" : "";

    public static StructureDefinition Load(string path)
    {
        if (Directory.Exists(path))
        {
            throw new UsageException($"structure file {Printable(path)} is a directory; give a structure file (JSON).");
        }
        if (!File.Exists(path))
        {
            throw new UsageException($"structure file {Printable(path)} does not exist.");
        }
        OutputFile.RegisterInput(path);
        var structure = StructureFile.Load(path);
        if (structure.Materials is { } built)
        {
            foreach (var warning in built.Warnings)
            {
                Console.Error.WriteLine($"periodic: warning: {Printable(path)}: {Printable(warning.Message)}");
            }
        }
        return structure;
    }

    /// <summary>Text from a file or the command line as it may be printed (<see cref="Output.Printable.Escape"/>).</summary>
    public static string Printable(string text) => Output.Printable.Escape(text);

    /// <summary>
    /// Streams output to stdout, or atomically to <paramref name="outPath"/> (a failure part-way leaves no file).
    /// </summary>
    public static void Emit(Action<Stream> write, string? outPath)
    {
        if (outPath is null)
        {
            Console.Out.Flush();
            using var stdout = Console.OpenStandardOutput();
            write(stdout);
            stdout.Flush();
        }
        else
        {
            OutputFile.WriteAtomically(outPath, write);
        }
    }

    /// <summary>Writes a table as CSV or text (after <paramref name="title"/>), to stdout or <paramref name="outPath"/>.</summary>
    public static void EmitTable(Table table, OutputFormat format, string title, string? outPath)
    {
        if (format == OutputFormat.Csv)
        {
            Emit(table.WriteCsv, outPath);
        }
        else
        {
            Emit(title + "\n" + table.ToText(), outPath);
        }
    }

    /// <summary>
    /// The model's warnings about results (e.g. a band far above a well's edge, where the single-band model is poor):
    /// each on stderr, and returned for the JSON output. Null or empty for a cell not built from materials.
    /// </summary>
    public static IReadOnlyList<Periodic.Materials.ModelWarning> ReportWarnings(StructureDefinition structure, IReadOnlyList<Periodic.Materials.ModelWarning>? warnings)
    {
        if (warnings is null)
        {
            return [];
        }
        foreach (var message in GroupedMessages(warnings))
        {
            Console.Error.WriteLine($"periodic: warning: {structure.SourceName}: {message}");
        }
        return warnings;
    }

    /// <summary>
    /// One sentence per kind and layer, with how many more results it covers: a scan over many energies (transmission,
    /// dos) would otherwise repeat the same warning for every point beyond the limit (870,000 times for 10⁶ energies).
    /// Used for stderr and for the JSON's <c>warnings</c>.
    /// </summary>
    public static IEnumerable<string> GroupedMessages(IEnumerable<Periodic.Materials.ModelWarning> warnings)
    {
        foreach (var group in warnings.GroupBy(w => (w.Kind, w.LayerIndex)))
        {
            var count = group.Count();
            var message = group.First().Message;
            yield return count > 1
                ? string.Create(CultureInfo.InvariantCulture, $"{message.TrimEnd('.')} ({count - 1} more results beyond it in the same layer).")
                : message;
        }
    }

    /// <summary>Model warnings for a set of result energies (band edges, levels, peaks) of a material cell; empty otherwise.</summary>
    public static IReadOnlyList<Periodic.Materials.ModelWarning> CheckEnergies(StructureDefinition structure, ReadOnlySpan<double> energiesElectronVolts) =>
        structure.Materials is { } built ? ReportWarnings(structure, built.CheckEnergies(energiesElectronVolts)) : [];

    /// <summary>Writes the finished text to stdout, or atomically to <paramref name="outPath"/>.</summary>
    public static void Emit(string text, string? outPath)
    {
        if (outPath is null)
        {
            Console.Out.Write(text);
            Console.Out.Flush();
        }
        else
        {
            OutputFile.WriteText(outPath, text);
        }
    }

    public static string Json(Action<Utf8JsonWriter> body)
    {
        using var buffer = new MemoryStream();
        using (var writer = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
        {
            writer.WriteStartObject();
            body(writer);
            writer.WriteEndObject();
        }
        return Encoding.UTF8.GetString(buffer.ToArray()) + "\n";
    }

    /// <summary>JSON has no infinity or NaN: such values are written as null.</summary>
    public static void Number(this Utf8JsonWriter writer, string name, double value)
    {
        if (double.IsFinite(value))
        {
            writer.WriteNumber(name, value);
        }
        else
        {
            writer.WriteNull(name);
        }
    }

    public static void StructureHeader(Utf8JsonWriter writer, StructureDefinition structure) =>
        StructureHeader(writer, structure, []);

    /// <summary>
    /// The <c>structure</c> object: name, source, period, elements; for a material cell its temperature, reference
    /// energy, the derived <c>layers</c> (material, width nm, potential eV, mass m0, nonParabolicity 1/eV, bandGap eV,
    /// latticeMismatch) and the model warnings (the structure's and <paramref name="resultWarnings"/>), one per kind and layer with the count of results it covers.
    /// </summary>
    public static void StructureHeader(Utf8JsonWriter writer, StructureDefinition structure, IReadOnlyList<Periodic.Materials.ModelWarning> resultWarnings)
    {
        writer.WriteStartObject("structure");
        writer.WriteString("name", structure.Name);
        writer.WriteString("source", structure.SourceName);
        writer.WriteNumber("period", structure.Cell.Period.Nanometres);
        writer.WriteNumber("elements", structure.Cell.Elements.Count);
        if (structure.Materials is { } built)
        {
            writer.WriteNumber("temperature", built.Temperature.Kelvin);
            writer.WriteNumber("referenceEnergy", built.ReferenceElectronVolts);
            writer.WriteStartArray("warnings");
            foreach (var message in GroupedMessages(built.Warnings.Concat(resultWarnings)))
            {
                writer.WriteStringValue(message);
            }
            writer.WriteEndArray();
            writer.WriteStartArray("layers");
            foreach (var layer in built.Layers)
            {
                writer.WriteStartObject();
                writer.WriteNumber("index", layer.Index);
                if (structure.Labels[layer.Index] is { } label)
                {
                    writer.WriteString("label", label);
                }
                writer.WriteString("material", layer.Material.Name);
                writer.WriteNumber("width", layer.WidthNanometres);
                writer.WriteNumber("potential", layer.PotentialElectronVolts);
                writer.WriteNumber("mass", layer.MassElectronMasses);
                writer.WriteNumber("nonParabolicity", layer.NonParabolicityPerElectronVolt);
                writer.WriteNumber("bandGap", layer.BandGapElectronVolts);
                writer.WriteNumber("latticeMismatch", layer.LatticeMismatch);
                writer.WriteEndObject();
            }
            writer.WriteEndArray();
        }
        writer.WriteEndObject();
        if (((SelfConsistentSolution?)structure.SelfConsistentStack ?? structure.SelfConsistent) is { } solution)
        {
            SelfConsistentObject(writer, solution);
        }
    }

    /// <summary>
    /// For a cell of material layers: the derived layer table (what the material model made of each layer), printed under
    /// every text table so the numbers can be traced to their inputs; empty otherwise.
    /// </summary>
    public static string LayerTable(StructureDefinition structure)
    {
        if (structure.Materials is not { } built)
        {
            return string.Empty;
        }
        var table = new Table(new Column("layer"), new Column("label"), new Column("material"), new Column("width", "nm"), new Column("V", "eV"),
            new Column("m*", "m0"), new Column("alpha", "1/eV"), new Column("Eg", "eV"), new Column("mismatch"));
        foreach (var layer in built.Layers)
        {
            table.Add(layer.Index, structure.Labels[layer.Index] ?? "", layer.Material.Name, layer.WidthNanometres, layer.PotentialElectronVolts,
                layer.MassElectronMasses, layer.NonParabolicityPerElectronVolt, layer.BandGapElectronVolts, layer.LatticeMismatch);
        }
        return string.Create(CultureInfo.InvariantCulture,
            $"\nLayers from the material table at T = {built.Temperature.Kelvin:G6} K, carrier {built.Carrier} (potentials relative to {built.ReferenceElectronVolts:G6} eV; alpha: non-parabolicity; mismatch: to the substrate):\n")
            + table.ToText();
    }

    /// <summary>The stack's two leads as <c>leftLead</c> and <c>rightLead</c> objects (<c>potential</c> in eV, <c>mass</c> in m0), as given (unshifted by a bias).</summary>
    public static void Leads(Utf8JsonWriter writer, Periodic.Stacks.LayerStack stack)
    {
        foreach (var (name, lead) in new[] { ("leftLead", stack.LeftLead), ("rightLead", stack.RightLead) })
        {
            writer.WriteStartObject(name);
            writer.WriteNumber("potential", lead.Potential.ElectronVolts);
            writer.WriteNumber("mass", lead.Mass.ElectronMasses);
            writer.WriteEndObject();
        }
    }

    /// <summary>
    /// The <c>stack</c> object: <c>source</c>, <c>periods</c> (a stack of one repeated cell), <c>thickness</c> (nm),
    /// <c>elements</c> (written out), <c>bias</c> (eV, when given) and the two leads.
    /// </summary>
    public static void StackObject(Utf8JsonWriter writer, Periodic.Stacks.LayerStack stack, string source, double? bias = null)
    {
        writer.WriteStartObject("stack");
        writer.WriteString("source", source);
        if (stack.Parts.Count == 1 && stack.Parts[0].IsRepeatedCell)
        {
            writer.WriteNumber("periods", stack.Parts[0].Repetitions);
        }
        writer.WriteNumber("thickness", stack.Thickness.Nanometres);
        writer.WriteNumber("elements", stack.ElementCount);
        if (bias is { } u)
        {
            writer.WriteNumber("bias", u);
        }
        Leads(writer, stack);
        writer.WriteEndObject();
    }

    public static void Units(Utf8JsonWriter writer, params (string Name, string Unit)[] units)
    {
        writer.WriteStartObject("units");
        foreach (var (name, unit) in units)
        {
            writer.WriteString(name, unit);
        }
        writer.WriteEndObject();
    }

    /// <summary>The title of a text table: the structure's name, period and elements, the note of an unusual energy unit, the layer table of a material cell.</summary>
    public static string TableTitle(StructureDefinition structure, EnergyUnit? unit = null) =>
        string.Create(CultureInfo.InvariantCulture, $"{Printable(structure.Name)}  (period {structure.Cell.Period.Nanometres:G6} nm, {Plural(structure.Cell.Elements.Count, "element")})\n")
        + SelfConsistentLine(structure)
        + (unit?.Note is { } note ? note + "\n" : "")
        + LayerTable(structure);
}

/// <summary>An energy grid given either as --from/--to/--points or as --energies e1,e2,….</summary>
internal sealed class EnergyGridOptions
{
    public Option<double?> From { get; } = Common.NumberOption("--from", "eV", "0", "Lowest energy of the grid, eV.");

    public Option<double?> To { get; } = Common.NumberOption("--to", "eV", "0.5", "Highest energy of the grid, eV.");

    public Option<int?> Points { get; } = new("--points") { Description = "Number of grid points (2 to 1,000,000), evenly spaced, ends included." };

    public Option<string?> Energies { get; } = new("--energies") { Description = "Comma-separated list of energies, eV (instead of --from/--to/--points)." };

    public void AddTo(Command command)
    {
        command.Options.Add(From);
        command.Options.Add(To);
        command.Options.Add(Points);
        command.Options.Add(Energies);
    }

    public double[] Read(ParseResult result)
    {
        var list = result.GetValue(Energies);
        double? from = result.GetValue(From), to = result.GetValue(To);
        int? points = result.GetValue(Points);
        if (list is not null)
        {
            if (from is not null || to is not null || points is not null)
            {
                throw new UsageException("give either --energies or --from/--to/--points, not both.");
            }
            var parts = list.Split(',', StringSplitOptions.TrimEntries);
            var energies = new double[parts.Length];
            for (var i = 0; i < parts.Length; i++)
            {
                if (!double.TryParse(parts[i], NumberStyles.Float, CultureInfo.InvariantCulture, out energies[i]) || !double.IsFinite(energies[i]))
                {
                    throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                        $"--energies: item {i + 1} \"{parts[i]}\" is not a finite number (energies in eV, separated by commas)."));
                }
            }
            foreach (var energy in energies)
            {
                Limits.CheckEnergy("--energies", energy);
            }
            return energies;
        }
        if (from is null || to is null || points is null)
        {
            var missing = string.Join(" and ", new[] { from is null ? "--from" : null, to is null ? "--to" : null, points is null ? "--points" : null }.OfType<string>());
            throw new UsageException(from is null && to is null && points is null
                ? "give the energies: --from E --to E --points N, or --energies e1,e2,... (eV)."
                : $"{missing} missing: give all of --from E --to E --points N, or --energies e1,e2,... (eV).");
        }
        if (!double.IsFinite(from.Value) || !double.IsFinite(to.Value) || !(to.Value > from.Value))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"--to must be a finite energy above --from; got --from {from.Value:R} and --to {to.Value:R} eV."));
        }
        Limits.CheckEnergy("--from", from.Value);
        Limits.CheckEnergy("--to", to.Value);
        Limits.CheckRange("--points", points.Value, Limits.MinGridPoints, Limits.MaxGridPoints);
        var grid = new double[points.Value];
        for (var i = 0; i < grid.Length; i++)
        {
            var t = (double)i / (grid.Length - 1);
            grid[i] = i == grid.Length - 1 ? to.Value : from.Value * (1 - t) + to.Value * t;
        }
        return grid;
    }
}
