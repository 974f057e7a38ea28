// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Optics;

/// <summary>
/// One level of an <see cref="IntersubbandSpectrum"/>: a bound state of the stack, or a quasi-bound state taken from a
/// transmission resonance above the lead band edges. Immutable and thread-safe.
/// </summary>
public sealed class OpticalLevel
{
    private readonly Func<double, double> _value;

    internal OpticalLevel(int number, double energy, double error, bool isQuasiBound, double width, bool isResolved,
        double meanMass, double inverseMass, double domainStart, double domainEnd, Func<double, double> value)
    {
        Number = number;
        EnergyElectronVolts = energy;
        ErrorElectronVolts = error;
        IsQuasiBound = isQuasiBound;
        WidthElectronVolts = width;
        IsResolved = isResolved;
        MeanMassElectronMasses = meanMass;
        MeanInverseMassPerElectronMass = inverseMass;
        DomainStartNanometres = domainStart;
        DomainEndNanometres = domainEnd;
        _value = value;
    }

    /// <summary>Position in the list, counted from 1 upwards in energy (bound states first, then quasi-bound ones).</summary>
    public int Number { get; }

    /// <summary>Energy, eV (a quasi-bound state: the energy of its transmission peak, or of its reflection-phase slope's peak).</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>Error bound of <see cref="EnergyElectronVolts"/>, eV.</summary>
    public double ErrorElectronVolts { get; }

    /// <summary>
    /// True for a quasi-bound state: above both lead band edges (a transmission resonance), or between them (open into the lower
    /// lead only, from the reflection phase).
    /// </summary>
    public bool IsQuasiBound { get; }

    /// <summary>
    /// The quasi-bound state's width Γ, eV: the transmission peak's full width at half maximum above both lead edges (+∞ when the
    /// peak has no half-maximum width), 2/(dΦ/dE) at the peak of the reflection phase's slope between them; 0 for a bound state.
    /// </summary>
    public double WidthElectronVolts { get; }

    /// <summary>False when the level could not be separated from a neighbour (see <see cref="Stacks.BoundLevel.IsResolved"/>).</summary>
    public bool IsResolved { get; }

    /// <summary>⟨m(z)⟩ = Σ m_j P_j, the probability-weighted band-edge mass, m0: the in-plane mass of this level's 2D density of states.</summary>
    public double MeanMassElectronMasses { get; }

    /// <summary>⟨1/m(z)⟩ in 1/m0: the f-sum rule's total is the reference mass times this (see <see cref="IntersubbandSpectrum.SumRule"/>).</summary>
    public double MeanInverseMassPerElectronMass { get; }

    /// <summary>Left end of the domain the state is normalised on, nm (−∞ for a bound state: the whole line).</summary>
    public double DomainStartNanometres { get; }

    /// <summary>Right end of the domain the state is normalised on, nm (+∞ for a bound state).</summary>
    public double DomainEndNanometres { get; }

    /// <summary>ψ at <paramref name="positionNanometres"/>, nm^(−1/2), real; a quasi-bound state is zero outside its domain.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position is not finite.</exception>
    public double WavefunctionAt(double positionNanometres)
    {
        Preconditions.CheckFinite(positionNanometres);
        return _value(positionNanometres);
    }

    /// <inheritdoc />
    public override string ToString() => IsQuasiBound
        ? string.Create(CultureInfo.InvariantCulture, $"Level {Number} (quasi-bound): {EnergyElectronVolts:G10} eV, width {WidthElectronVolts:G4} eV, normalised on [{DomainStartNanometres:G6}, {DomainEndNanometres:G6}] nm")
        : string.Create(CultureInfo.InvariantCulture, $"Level {Number}: {EnergyElectronVolts:G12} eV (± {ErrorElectronVolts:G2}), <m> = {MeanMassElectronMasses:G6} m0{(IsResolved ? "" : ", not separable from its neighbour")}");
}
