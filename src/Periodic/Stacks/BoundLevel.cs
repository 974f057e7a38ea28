// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Stacks;

/// <summary>One bound state of a stack: energy below both lead band edges, error bound, and its node count.</summary>
public readonly struct BoundLevel
{
    internal BoundLevel(int index, double energy, double error, int iterations, bool isResolved)
    {
        Index = index;
        EnergyElectronVolts = energy;
        ErrorElectronVolts = error;
        Iterations = iterations;
        IsResolved = isResolved;
    }

    /// <summary>0-based index from the ground state up; by the Sturm oscillation theorem it is also the number of nodes of the wavefunction.</summary>
    public int Index { get; }

    /// <summary>The node count of the wavefunction (equal to <see cref="Index"/>).</summary>
    public int NodeCount => Index;

    /// <summary>The level energy, eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>Error bound of <see cref="EnergyElectronVolts"/>, eV (final bracket or last step).</summary>
    public double ErrorElectronVolts { get; }

    /// <summary>Function evaluations used to refine this level.</summary>
    public int Iterations { get; }

    /// <summary>
    /// False when this level lies closer to a neighbour than double precision can separate (e.g. the
    /// tunnel splitting of wells behind very thick barriers); its energy is then shared with that neighbour.
    /// </summary>
    public bool IsResolved { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Level {Index}: {EnergyElectronVolts:G12} eV (± {ErrorElectronVolts:G2}){(IsResolved ? "" : ", not separable from its neighbour")}");
}
