// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Optics;

/// <summary>
/// The Thomas–Reiche–Kuhn f-sum rule from one level, as a check: Σ_f f_if over every other state (downward transitions
/// negative) equals m*⟨i|1/m(z)|i⟩ for the BenDaniel–Duke Hamiltonian (1 for one mass everywhere). The part not found
/// among the levels computed belongs to the continuum.
/// </summary>
/// <remarks>
/// Derivation: Σ_f (E_f − E_i)|z_if|² = ½⟨i|[z, [H, z]]|i⟩ = (ħ²/2m₀)⟨i|1/m(z)|i⟩ (double commutator; e.g. J. J. Sakurai,
/// Modern Quantum Mechanics, for one mass; with a position-dependent mass C. Sirtori et al., Phys. Rev. B 50, 8663 (1994)).
/// </remarks>
public readonly struct SumRuleCheck
{
    internal SumRuleCheck(int from, double bound, double quasiBound, double expected)
    {
        From = from;
        BoundStrength = bound;
        QuasiBoundStrength = quasiBound;
        ExpectedStrength = expected;
    }

    /// <summary>The level the transitions start from (counted from 1).</summary>
    public int From { get; }

    /// <summary>Σ f over the other bound levels (downward ones negative).</summary>
    public double BoundStrength { get; }

    /// <summary>Σ f over the resolved quasi-bound levels (0 when none were computed).</summary>
    public double QuasiBoundStrength { get; }

    /// <summary>The exact total over all states, m*⟨1/m(z)⟩.</summary>
    public double ExpectedStrength { get; }

    /// <summary>ExpectedStrength − BoundStrength − QuasiBoundStrength: the share of the continuum not represented by the levels computed.</summary>
    public double MissingStrength => ExpectedStrength - BoundStrength - QuasiBoundStrength;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"f-sum from level {From}: bound {BoundStrength:G8} + quasi-bound {QuasiBoundStrength:G8} of {ExpectedStrength:G8} (continuum {MissingStrength:G4})");
}
