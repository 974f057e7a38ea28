// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>Sampling and tolerances of the transmission-peak search (<see cref="StackTransmission.FindResonances"/>). Defaults live in <see cref="Default"/>.</summary>
public sealed record ResonanceSearchOptions
{
    /// <summary>The defaults: 1000 scan points, 400,000 evaluations at most, π/4 phase step, 1e-12 eV absolute tolerance.</summary>
    public static ResonanceSearchOptions Default { get; } = new();

    /// <summary>Points of the initial uniform scan (at least 3).</summary>
    public int ScanPoints { get; init; } = 1000;

    /// <summary>
    /// Largest change of the transmission phase arg t (radians) allowed between neighbouring samples;
    /// larger steps are halved. A resonance turns arg t by about π, so it cannot hide between two samples
    /// however narrow it is (unless two resonances fall in one step and their turns cancel).
    /// </summary>
    public double MaxPhaseStepRadians { get; init; } = Math.PI / 4;

    /// <summary>Budget of transmission evaluations for the scan and its refinement.</summary>
    public int MaxEvaluations { get; init; } = 400_000;

    /// <summary>Absolute tolerance of peak energies and half-maximum points, eV.</summary>
    public double AbsoluteToleranceElectronVolts { get; init; } = 1e-12;

    internal void Validate(string paramName)
    {
        if (ScanPoints < 3)
        {
            throw new ArgumentOutOfRangeException(paramName, ScanPoints,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.ScanPoints must be at least 3; got {ScanPoints}."));
        }
        if (!(MaxPhaseStepRadians > 0 && MaxPhaseStepRadians < Math.PI))
        {
            throw new ArgumentOutOfRangeException(paramName, MaxPhaseStepRadians,
                $"{paramName}.MaxPhaseStepRadians must lie in (0, pi); got {Preconditions.Format(MaxPhaseStepRadians)}.");
        }
        if (MaxEvaluations < ScanPoints)
        {
            throw new ArgumentOutOfRangeException(paramName, MaxEvaluations,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.MaxEvaluations must be at least ScanPoints ({ScanPoints}); got {MaxEvaluations}."));
        }
        if (!(AbsoluteToleranceElectronVolts > 0) || !double.IsFinite(AbsoluteToleranceElectronVolts))
        {
            throw new ArgumentOutOfRangeException(paramName, AbsoluteToleranceElectronVolts,
                $"{paramName}.AbsoluteToleranceElectronVolts must be positive and finite; got {Preconditions.Format(AbsoluteToleranceElectronVolts)}.");
        }
    }
}
