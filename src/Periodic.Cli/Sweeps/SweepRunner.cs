// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text;
using Periodic.Bands;
using Periodic.Design;
using Periodic.Properties;
using Periodic.OpticalLattices;
using Periodic.Serialization;
using Periodic.Units;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// Evaluates the designs of a sweep: each design is the sweep's structure with its parameter values written in,
/// read by the same structure-file reader as every command (so a design that makes an invalid layer fails the way
/// a file would), and solved by the library's band solver as <c>periodic bands</c> is. With sensitivities on, each band
/// edge's exact derivative with respect to each varied layer field (<see cref="EdgeSensitivities"/>) follows.
/// A doped design (donors or acceptors in its cell or stack) is solved self-consistently first, as every command does,
/// unless <paramref name="rigidBands"/> (--no-space-charge); its sensitivities are refused (they would hold the potential
/// fixed, which a self-consistent design's is not).
/// </summary>
internal sealed class SweepRunner(SweepSpec spec, bool rigidBands = false)
{
    /// <summary>
    /// Set (to any value) to read every design as a document even where <see cref="SweepTemplate"/> applies: the reference
    /// the short way is tested against.
    /// </summary>
    internal const string DocumentPathVariable = "PERIODIC_SWEEP_READ_EVERY_DESIGN";

    // The short way from a design's values to its cell, where the sweep allows it (null: read each design's document).
    private readonly SweepTemplate? _template =
        Environment.GetEnvironmentVariable(DocumentPathVariable) is { Length: > 0 } ? null : SweepTemplate.TryCreate(spec);

    /// <summary>True when designs are built from the structure read once rather than each read as a document.</summary>
    public bool UsesTemplate => _template is not null;

    /// <summary>The columns of a row after the design number, with their units.</summary>
    public IReadOnlyList<(string Name, string Unit)> Columns { get; } = BuildColumns(spec);

    // Per column: whether some row has a value there (see NoteValues); the workers only ever set a flag.
    private readonly bool[] _hasValue = new bool[BuildColumns(spec).Count];

    /// <summary>Number of parameter columns at the start of <see cref="Columns"/>.</summary>
    public int ParameterCount => spec.Parameters.Count;

    // The first sensitivity column (after the parameters, the band columns and the stack and lattice columns).
    private int SensitivityStart => Columns.Count - (spec.Sensitivities
        ? spec.Parameters.Count * (2 * spec.Bands + spec.Outputs.Levels + spec.Outputs.Resonances + spec.Outputs.Transitions.Count)
        : 0);

    private static List<(string, string)> BuildColumns(SweepSpec spec)
    {
        var columns = spec.Parameters.Select(p => (p.Field, p.Unit)).ToList();
        for (var n = 1; n <= spec.Bands; n++)
        {
            var band = string.Create(CultureInfo.InvariantCulture, $"band{n}");
            columns.Add((band + ".bottom", "eV"));
            columns.Add((band + ".top", "eV"));
            columns.Add((band + ".width", "eV"));
            columns.Add((band + ".massBottom", "m0"));
            columns.Add((band + ".massTop", "m0"));
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"gap{n}.width"), "eV"));
        }
        var outputs = spec.Outputs;
        for (var n = 1; n <= outputs.Levels; n++)
        {
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"level{n}"), "eV"));
        }
        for (var n = 1; n <= outputs.Resonances; n++)
        {
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"resonance{n}"), "eV"));
        }
        foreach (var (from, to) in outputs.Transitions)
        {
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"transition{from}-{to}.energy"), "eV"));
            columns.Add((string.Create(CultureInfo.InvariantCulture, $"transition{from}-{to}.wavelength"), "um"));
        }
        if (outputs.Hubbard is not null)
        {
            columns.Add(("hubbard.tunnelling", "eV"));
            columns.Add(("hubbard.interaction", "eV"));
            columns.Add(("hubbard.ratio", "1"));
        }
        if (spec.Sensitivities)
        {
            for (var n = 1; n <= spec.Bands; n++)
            {
                foreach (var parameter in spec.Parameters)
                {
                    var per = "eV/" + parameter.Unit;
                    columns.Add((string.Create(CultureInfo.InvariantCulture, $"dBand{n}.bottom/d{parameter.Field}"), per));
                    columns.Add((string.Create(CultureInfo.InvariantCulture, $"dBand{n}.top/d{parameter.Field}"), per));
                }
            }
            var stackNames = Enumerable.Range(1, outputs.Levels).Select(n => string.Create(CultureInfo.InvariantCulture, $"dLevel{n}"))
                .Concat(Enumerable.Range(1, outputs.Resonances).Select(n => string.Create(CultureInfo.InvariantCulture, $"dResonance{n}")))
                .Concat(outputs.Transitions.Select(t => string.Create(CultureInfo.InvariantCulture, $"dTransition{t.From}-{t.To}")));
            foreach (var name in stackNames)
            {
                foreach (var parameter in spec.Parameters)
                {
                    columns.Add((name + "/d" + parameter.Field, "eV/" + parameter.Unit));
                }
            }
        }
        return columns;
    }

    /// <summary>
    /// Computes design <paramref name="index"/> into <paramref name="values"/> (one per column, null where none; a buffer the
    /// caller reuses); returns the design's error, or null when it has none (a design that cannot be built or solved is a
    /// row with its error).
    /// </summary>
    public string? Evaluate(int index, double?[] values)
    {
        var error = EvaluateDesign(index, values);
        NoteValues(values);
        return error;
    }

    /// <summary>Records which columns of <paramref name="values"/> hold a value (a row computed, or resumed from the journal).</summary>
    public void NoteValues(ReadOnlySpan<double?> values)
    {
        for (var j = ParameterCount; j < values.Length; j++)
        {
            // Written only the first time: the flags are shared by the workers, and a flag once set stays set.
            if (!_hasValue[j] && values[j] is not null)
            {
                _hasValue[j] = true;
            }
        }
    }

    /// <summary>True when some row noted so far (<see cref="NoteValues"/>) has a value in column <paramref name="column"/>.</summary>
    public bool HasValue(int column) => column < ParameterCount || _hasValue[column];

    private string? EvaluateDesign(int index, double?[] values)
    {
        Array.Clear(values);
        Span<double> parameters = stackalloc double[spec.Parameters.Count];
        spec.Plan.Values(index, parameters);
        for (var j = 0; j < parameters.Length; j++)
        {
            values[j] = parameters[j];
        }
        try
        {
            if (_template?.TryBuild(parameters) is { } cell)
            {
                // Bands only (the template's condition): the same cell as the document would give, solved the same way.
                return EvaluateBands(cell, values, parameters.Length, SensitivityStart);
            }
            var document = spec.Structure.DeepClone().AsObject();
            for (var j = 0; j < parameters.Length; j++)
            {
                FieldPath.Set(document, spec.Parameters[j].Field, parameters[j]);
            }
            var structure = StructureFile.Parse(Encoding.UTF8.GetBytes(document.ToJsonString()), string.Create(CultureInfo.InvariantCulture, $"design {index}"));
            var outputs = spec.Outputs;
            var needsStack = outputs.NeedsLevels || outputs.Resonances > 0;
            // As the commands load a doped file: the bands of the self-consistent cell, the stack quantities of the
            // self-consistent stack (or of the self-consistent cell repeated, when the stack itself holds no dopants).
            var cellNeeded = spec.Bands > 0 || (needsStack && structure.StackDoping is null && structure.StackSpaceChargeRefusal is null);
            var cellView = rigidBands || structure.Doping is null || !cellNeeded ? structure : SelfConsistentCell(structure);
            var k = parameters.Length;
            string? error = null;
            if (spec.Bands > 0)
            {
                error = EvaluateBands(cellView.Cell, values, k, SensitivityStart);
                k += 6 * spec.Bands;
            }
            var stackView = !needsStack || rigidBands ? structure : SelfConsistentStack(structure, cellView);
            var stack = needsStack ? StackQuantities.Solve(stackView, outputs.NeedsLevels, outputs.Resonances > 0) : null;
            for (var n = 1; n <= outputs.Levels; n++)
            {
                values[k++] = stack!.Level(n);
            }
            for (var n = 1; n <= outputs.Resonances; n++)
            {
                values[k++] = stack!.Resonance(n);
            }
            foreach (var (from, to) in outputs.Transitions)
            {
                var energy = stack!.Transition(from, to);
                values[k++] = energy;
                values[k++] = energy > 0 ? PhysicalConstants.PhotonEnergyWavelengthElectronVoltNanometres / energy / 1000 : null;
            }
            if (outputs.Hubbard is { } hubbard)
            {
                var lattice = structure.OpticalLattice ?? throw new ArgumentException("the structure is not an optical-lattice file.");
                if (lattice.DepthInRecoilEnergies > Commands.HubbardCommand.MaxDepth)
                {
                    // As periodic hubbard: deeper, J is rounding noise and the Wannier construction may not finish.
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"opticalLattice.depth: s = {lattice.DepthInRecoilEnergies:R} E_R is too deep for outputs.hubbard (at most {Commands.HubbardCommand.MaxDepth:R} E_R): J falls below 1e-10 E_R, lost in the rounding of the band energies."));
                }
                var model = HubbardParameters.Compute(lattice, hubbard.Confinement, hubbard.ScatteringLength);
                values[k++] = model.TunnellingElectronVolts;
                values[k++] = model.InteractionElectronVolts;
                values[k++] = model.InteractionToTunnellingRatio;
            }
            if (spec.Sensitivities)
            {
                k += 2 * spec.Bands * spec.Parameters.Count; // filled by EvaluateBands
                for (var n = 1; n <= outputs.Levels; n++)
                {
                    foreach (var (element, quantity) in spec.SensitivityTargets)
                    {
                        values[k++] = stack!.LevelDerivative(n, element, quantity);
                    }
                }
                for (var n = 1; n <= outputs.Resonances; n++)
                {
                    foreach (var (element, quantity) in spec.SensitivityTargets)
                    {
                        values[k++] = stack!.ResonanceDerivative(n, element, quantity);
                    }
                }
                foreach (var (from, to) in outputs.Transitions)
                {
                    foreach (var (element, quantity) in spec.SensitivityTargets)
                    {
                        values[k++] = stack!.TransitionDerivative(from, to, element, quantity);
                    }
                }
            }
            return error;
        }
        catch (StructureFileException e) when (e.LineNumber > 0)
        {
            // The position is inside the design's document, which the user never sees: the design and the field say where.
            return OneLine(e.Field.Length == 0 ? $"{e.SourceName}: {e.Problem}" : $"{e.SourceName}: {e.Field}: {e.Problem}");
        }
        catch (Exception e) when (e is StructureFileException or ArgumentException or ArithmeticException or InvalidOperationException
            or PeriodicComputationException or UsageException)
        {
            return OneLine(e.Message);
        }
    }

    /// <summary>
    /// True when the sweep's own structure (before any parameter is written in) is doped and will be solved self-consistently,
    /// i.e. without --no-space-charge.
    /// </summary>
    public bool SolvesSpaceCharge => !rigidBands && IsDoped;

    /// <summary>
    /// True when the sweep's own structure is doped (in its cell or stack): only then does --no-space-charge change the rows.
    /// </summary>
    public bool IsDoped => StructureFile.Parse(Encoding.UTF8.GetBytes(spec.Structure.ToJsonString()), "structure") is var s
        && (s.Doping is not null || s.StackDoping is not null || s.StackSpaceChargeRefusal is not null);

    /// <summary>The design with its doped periodic cell solved self-consistently (as the cell commands load it).</summary>
    private StructureDefinition SelfConsistentCell(StructureDefinition structure)
    {
        RefuseSensitivities();
        return structure.WithSelfConsistentCell(Periodic.SpaceCharge.SpaceChargeSolver.Solve(structure.Doping!));
    }

    /// <summary>
    /// The design for its stack quantities, as the stack commands load it: its doped stack solved between its leads at zero bias
    /// only; a stack without dopants of its own takes <paramref name="cellView"/> (the self-consistent cell repeated, or the
    /// undoped design itself).
    /// </summary>
    private StructureDefinition SelfConsistentStack(StructureDefinition structure, StructureDefinition cellView)
    {
        if (structure.StackSpaceChargeRefusal is { } refusal)
        {
            throw new ArgumentException(refusal);
        }
        if (structure.StackDoping is null && structure.Doping is null)
        {
            return structure;
        }
        RefuseSensitivities();
        if (structure.StackBias.ElectronVolts != 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"stack.bias is {structure.StackBias.ElectronVolts:R} eV, but the space charge of a doped stack is solved at zero bias only (bias with space charge is not modelled); run with --no-space-charge for the rigid bands under bias."));
        }
        if (structure.StackDoping is null)
        {
            return cellView;
        }
        return structure.WithSelfConsistentStack(Periodic.SpaceCharge.SpaceChargeSolver.SolveStack(structure.StackDoping!));
    }

    private void RefuseSensitivities()
    {
        if (spec.Sensitivities)
        {
            throw new ArgumentException("sensitivities of a doped design are not computed: the exact derivatives hold the potential fixed, and the self-consistent potential moves with every parameter; run with --no-space-charge for the rigid bands' derivatives.");
        }
    }

    /// <summary>Band edges, widths, masses and gaps from column <paramref name="k"/> on, and (with sensitivities) the edge derivatives in their own columns.</summary>
    private string? EvaluateBands(Periodic.Structures.UnitCell cell, double?[] values, int k, int sensitivity)
    {
        {
            var solved = BandSolver.Compute(cell, spec.Bands);
            var bands = solved.Structure;
            var properties = BandProperties.Create(bands);
            for (var n = 1; n <= spec.Bands; n++)
            {
                var band = bands.Bands[n - 1];
                values[k++] = band.BottomElectronVolts;
                values[k++] = band.TopElectronVolts;
                values[k++] = band.WidthElectronVolts;
                values[k++] = Finite(properties.BottomMass(n).ElectronMasses);
                values[k++] = Finite(properties.TopMass(n).ElectronMasses);
                values[k++] = bands.Gaps[n - 1].WidthElectronVolts;
            }
            if (spec.Sensitivities)
            {
                var exact = EdgeSensitivities.Compute(bands);
                for (var n = 1; n <= spec.Bands; n++)
                {
                    foreach (var (element, quantity) in spec.SensitivityTargets)
                    {
                        values[sensitivity++] = exact.Bottom(n, element, quantity);
                        values[sensitivity++] = exact.Top(n, element, quantity);
                    }
                }
            }
            return solved.Converged ? null : string.Create(CultureInfo.InvariantCulture, $"not converged: edge errors up to {solved.MaxEdgeErrorElectronVolts:G3} eV");
        }
    }

    // A band so narrow that double precision resolves no curvature has no finite edge mass: an empty cell, not ±∞.
    private static double? Finite(double value) => double.IsFinite(value) ? value : null;

    private static string OneLine(string message) => string.Join(' ', message.Split((char[])['\r', '\n'], StringSplitOptions.RemoveEmptyEntries));
}

/// <summary>One design's result: its number, its parameter and output values (null where none), and its error if it failed.</summary>
internal sealed record SweepRow(int Design, double?[] Values, string? Error);
