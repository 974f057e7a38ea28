// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.CommandLine;
using System.Globalization;
using Periodic.Cli.Commands;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Cli.Physics;

/// <summary>
/// The options that choose a finite stack (<c>levels</c>, <c>resonances</c>): the file's <c>stack</c> as written, or
/// <c>--periods N</c> periods of the cell; <c>--lead-potential</c> and <c>--lead-mass</c> replace both leads' values.
/// </summary>
internal sealed class StackOptions
{
    public Option<int?> Periods { get; } = new("--periods", "-N") { Description = "Use N periods of the cell (1 to 1,000,000) instead of the file's stack." };

    public Option<double?> LeadPotential { get; } = Common.NumberOption("--lead-potential", "eV", "0.3", "Potential of both leads, eV (default: the file's stack, else the first layer's).");

    public Option<double?> LeadMass { get; } = Common.NumberOption("--lead-mass", "m0", "0.067", "Effective mass in both leads, m0 (default: the file's stack, else the first layer's).");

    public void AddTo(Command command)
    {
        command.Options.Add(Periods);
        command.Options.Add(LeadPotential);
        command.Options.Add(LeadMass);
    }

    /// <summary>Checks the options before the file is read (so a bad option is reported first).</summary>
    public void Check(ParseResult result)
    {
        if (result.GetValue(Periods) is { } n)
        {
            Common.CheckCount(n, "--periods", 1_000_000);
        }
        if (result.GetValue(LeadMass) is { } m && !(m > 0))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--lead-mass must be a positive mass in m0; got {m:R}."));
        }
    }

    /// <summary>The stack and a one-line description of where it came from.</summary>
    public (LayerStack Stack, string Description) Build(ParseResult result, StructureDefinition structure) =>
        Choose(structure, result.GetValue(Periods), result.GetValue(LeadPotential), result.GetValue(LeadMass));

    /// <summary>N periods of the cell when <paramref name="periods"/> is given, else the file's stack; the lead options replace both leads' values.</summary>
    public static (LayerStack Stack, string Description) Choose(StructureDefinition structure, int? periods, double? potential, double? mass)
    {
        if (structure.SelfConsistentStack is not null)
        {
            var option = periods is not null ? "--periods" : potential is not null ? "--lead-potential" : mass is not null ? "--lead-mass" : null;
            if (option is not null)
            {
                throw new UsageException($"{option} cannot be combined with the self-consistent stack of a doped file: the space charge is solved for the file's own stack and leads; drop {option}, or add --no-space-charge for the rigid bands.");
            }
            return (structure.Stack!, "the file's stack, self-consistent (with lead buffers)");
        }
        if (periods is { } n)
        {
            var built = TransmissionCommand.BuildStack(structure, n, potential, mass);
            return (built, string.Create(CultureInfo.InvariantCulture, $"{Common.Plural(n, "period")} of the cell"));
        }
        if (structure.Stack is not { } stack)
        {
            throw new UsageException($"give --periods N: {structure.SourceName} has no \"stack\" to take the finite structure from.");
        }
        if (potential is not null || mass is not null)
        {
            static Lead Replace(Lead lead, double? v, double? m) =>
                Lead.Create(Energy.FromElectronVolts(v ?? lead.Potential.ElectronVolts), EffectiveMass.FromElectronMasses(m ?? lead.Mass.ElectronMasses));
            stack = stack.WithLeads(Replace(stack.LeftLead, potential, mass), Replace(stack.RightLead, potential, mass));
        }
        return (stack, "the file's stack");
    }

    /// <summary>
    /// The stack's parts in words, e.g. "2 layers, 10 x cell (2 elements), 1 layer"; a run of sampled segments (a self-consistent
    /// potential) is one entry, "sampled potential 90 nm (32 segments)".
    /// </summary>
    public static string Describe(LayerStack stack)
    {
        var words = new List<string>();
        var parts = stack.Parts;
        for (var i = 0; i < parts.Count; i++)
        {
            var p = parts[i];
            if (p.Element is SampledSegment)
            {
                var run = 0;
                var width = 0.0;
                for (; i < parts.Count && parts[i].Element is SampledSegment; i++, run++)
                {
                    width += parts[i].Thickness.Nanometres;
                }
                i--;
                words.Add(string.Create(CultureInfo.InvariantCulture, $"sampled potential {width:G6} nm ({Common.Plural(run, "segment")})"));
                continue;
            }
            words.Add(p.IsRepeatedCell
                ? string.Create(CultureInfo.InvariantCulture, $"{p.Repetitions} x cell ({Common.Plural(p.Cell!.Elements.Count, "element")})")
                : p.Element is DeltaBarrier ? "delta" : string.Create(CultureInfo.InvariantCulture, $"layer {p.Thickness.Nanometres:G6} nm"));
        }
        return string.Join(", ", words);
    }

    /// <summary>V(x) of the stack as (x, V) corners, layer by layer, x from 0 at the left lead; under a bias the potential falls by eU·x/L.</summary>
    public static (double[] X, double[] V) Profile(LayerStack stack, double bias)
    {
        var xs = new List<double>();
        var vs = new List<double>();
        var length = stack.Thickness.Nanometres;
        double Tilt(double x) => length > 0 ? -bias * x / length : 0;
        var x = 0.0;
        void Add(CellElement element)
        {
            switch (element)
            {
                case Layer layer:
                    xs.Add(x);
                    vs.Add(layer.Potential.ElectronVolts + Tilt(x));
                    x += layer.Width.Nanometres;
                    xs.Add(x);
                    vs.Add(layer.Potential.ElectronVolts + Tilt(x));
                    break;
                case FourierSegment fourier:
                    Sample(fourier.Width.Nanometres, fourier.PotentialAt);
                    break;
                case SampledSegment sampled:
                    Sample(sampled.Width.Nanometres, sampled.PotentialAt);
                    break;
            }
        }
        void Sample(double width, Func<double, double> potential)
        {
            for (var i = 0; i <= 100; i++)
            {
                xs.Add(x + width * i / 100);
                vs.Add(potential(width * i / 100) + Tilt(x + width * i / 100));
            }
            x += width;
        }
        foreach (var part in stack.Parts)
        {
            if (part.Element is { } element)
            {
                Add(element);
                continue;
            }
            // Long repeated parts are drawn at most 200 periods deep (the picture cannot show more).
            for (var r = 0; r < Math.Min(part.Repetitions, 200); r++)
            {
                foreach (var e in part.Cell!.Elements)
                {
                    Add(e);
                }
            }
            x += (part.Repetitions - Math.Min(part.Repetitions, 200)) * part.Cell!.Period.Nanometres;
        }
        return (xs.ToArray(), vs.ToArray());
    }
}
