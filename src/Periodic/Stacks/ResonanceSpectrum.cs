// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;

namespace Periodic.Stacks;

/// <summary>The transmission peaks of a stack found in an energy window, lowest first, with what the search did.</summary>
public sealed class ResonanceSpectrum
{
    internal ResonanceSpectrum(Resonance[] resonances, double lower, double upper, int evaluations, bool refinementComplete, ResonanceSearchOptions options)
    {
        Resonances = new ReadOnlyCollection<Resonance>(resonances);
        LowerElectronVolts = lower;
        UpperElectronVolts = upper;
        Evaluations = evaluations;
        RefinementComplete = refinementComplete;
        Options = options;
    }

    /// <summary>The peaks, lowest energy first.</summary>
    public IReadOnlyList<Resonance> Resonances { get; }

    /// <summary>Lower end of the window searched (raised to the higher lead band edge if needed), eV.</summary>
    public double LowerElectronVolts { get; }

    /// <summary>Upper end of the window searched, eV.</summary>
    public double UpperElectronVolts { get; }

    /// <summary>Transmission evaluations used.</summary>
    public int Evaluations { get; }

    /// <summary>
    /// True when every sample step ended below <see cref="ResonanceSearchOptions.MaxPhaseStepRadians"/>; false when the
    /// evaluation budget ran out first (a very narrow peak could then be missed).
    /// </summary>
    public bool RefinementComplete { get; }

    /// <summary>The options used.</summary>
    public ResonanceSearchOptions Options { get; }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"{Resonances.Count} transmission peak(s) in [{LowerElectronVolts:G8}, {UpperElectronVolts:G8}] eV, {Evaluations} evaluations{(RefinementComplete ? "" : ", refinement budget exhausted")}");
        foreach (var resonance in Resonances)
        {
            text.AppendLine().Append("  ").Append(resonance);
        }
        return text.ToString();
    }
}
