// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>
/// Sampling and tolerances of the transmission-peak search (<see cref="StackTransmission.FindResonances"/>), validated
/// when created. Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class ResonanceSearchOptions
{
    /// <summary>Default number of points of the initial uniform scan.</summary>
    public const int DefaultScanPoints = 1000;

    /// <summary>Default largest phase step between neighbouring samples, radians (π/4).</summary>
    public const double DefaultMaxPhaseStepRadians = Math.PI / 4;

    /// <summary>Default budget of transmission evaluations.</summary>
    public const int DefaultMaxEvaluations = 400_000;

    /// <summary>Default absolute tolerance of peak energies and half-maximum points, eV.</summary>
    public const double DefaultAbsoluteToleranceElectronVolts = 1e-12;

    private ResonanceSearchOptions(int scanPoints, double maxPhaseStepRadians, int maxEvaluations, double absoluteToleranceElectronVolts)
    {
        ScanPoints = scanPoints;
        MaxPhaseStepRadians = maxPhaseStepRadians;
        MaxEvaluations = maxEvaluations;
        AbsoluteToleranceElectronVolts = absoluteToleranceElectronVolts;
    }

    /// <summary>The defaults: 1000 scan points, 400,000 evaluations at most, π/4 phase step, 1e-12 eV absolute tolerance.</summary>
    public static ResonanceSearchOptions Default { get; } = Create();

    /// <summary>Points of the initial uniform scan.</summary>
    public int ScanPoints { get; }

    /// <summary>
    /// Largest change of the transmission phase arg t (radians) allowed between neighbouring samples;
    /// larger steps are halved. A resonance turns arg t by about π, so it cannot hide between two samples
    /// however narrow it is (unless two resonances fall in one step and their turns cancel).
    /// </summary>
    public double MaxPhaseStepRadians { get; }

    /// <summary>Budget of transmission evaluations for the scan and its refinement.</summary>
    public int MaxEvaluations { get; }

    /// <summary>Absolute tolerance of peak energies and half-maximum points, eV.</summary>
    public double AbsoluteToleranceElectronVolts { get; }

    /// <summary>Creates options; every parameter left out takes its default constant.</summary>
    /// <param name="scanPoints">Points of the initial scan; from 3 to 10,000,000.</param>
    /// <param name="maxPhaseStepRadians">In (0, π): at most this phase change between samples.</param>
    /// <param name="maxEvaluations">Evaluation budget; at least <paramref name="scanPoints"/>.</param>
    /// <param name="absoluteToleranceElectronVolts">In [1e-300, 1] eV.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static ResonanceSearchOptions Create(int scanPoints = DefaultScanPoints, double maxPhaseStepRadians = DefaultMaxPhaseStepRadians,
        int maxEvaluations = DefaultMaxEvaluations, double absoluteToleranceElectronVolts = DefaultAbsoluteToleranceElectronVolts)
    {
        Preconditions.CheckRange(scanPoints, 3, 10_000_000);
        if (!(maxPhaseStepRadians > 0 && maxPhaseStepRadians < Math.PI))
        {
            throw new ArgumentOutOfRangeException(nameof(maxPhaseStepRadians), maxPhaseStepRadians,
                $"maxPhaseStepRadians must lie in (0, pi); got {Preconditions.Format(maxPhaseStepRadians)}.");
        }
        Preconditions.CheckRange(maxEvaluations, scanPoints, int.MaxValue);
        Preconditions.CheckRange(absoluteToleranceElectronVolts, 1e-300, 1.0);
        return new ResonanceSearchOptions(scanPoints, maxPhaseStepRadians, maxEvaluations, absoluteToleranceElectronVolts);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{ScanPoints} scan points, phase step {MaxPhaseStepRadians:G4} rad, max {MaxEvaluations} evaluations, absolute {AbsoluteToleranceElectronVolts:G3} eV");
}
