// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// A uniform layer: constant potential energy and effective mass over its width. Wavefunctions are
/// matched across interfaces with the BenDaniel–Duke conditions (ψ and ψ′/m continuous;
/// D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966)).
/// </summary>
/// <remarks>
/// An optional non-parabolicity α (1/eV) makes the mass energy dependent,
/// m(E) = m·(1 + α·(E − V)); the two-band Kane form uses α = 1/E_g. With α = 0 (the default) the
/// mass is constant. The single-band envelope-function model behind this type is an approximation:
/// see the accuracy section of the user guide before basing a design decision on it.
/// </remarks>
public sealed class Layer : CellElement
{
    private Layer(Length width, Energy potential, EffectiveMass mass, double nonParabolicityPerElectronVolt)
    {
        Width = width;
        Potential = potential;
        Mass = mass;
        NonParabolicityPerElectronVolt = nonParabolicityPerElectronVolt;
    }

    /// <summary>Thickness of the layer (positive).</summary>
    public override Length Width { get; }

    /// <summary>Potential energy of the carrier in the layer (for electrons, the conduction-band edge).</summary>
    public Energy Potential { get; }

    /// <summary>Effective mass at the band edge of the layer.</summary>
    public EffectiveMass Mass { get; }

    /// <summary>Non-parabolicity α in 1/eV: m(E) = m·(1 + α·(E − V)). Zero for a parabolic band.</summary>
    public double NonParabolicityPerElectronVolt { get; }

    /// <summary>Creates a layer.</summary>
    /// <param name="width">Thickness; must be positive and finite.</param>
    /// <param name="potential">Potential energy in the layer; must be finite.</param>
    /// <param name="mass">Band-edge effective mass; must be a created (non-default) mass.</param>
    /// <param name="nonParabolicityPerElectronVolt">α ≥ 0 in 1/eV (0: parabolic).</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks the rule given for it.</exception>
    public static Layer Create(Length width, Energy potential, EffectiveMass mass, double nonParabolicityPerElectronVolt = 0.0)
    {
        // Length and Energy arithmetic can overflow to infinity; such values are rejected here.
        if (!(width.Nanometres > 0) || double.IsPositiveInfinity(width.Nanometres))
        {
            throw new ArgumentOutOfRangeException(nameof(width), width.Nanometres,
                $"width must be positive and finite; got {Preconditions.Format(width.Nanometres)} nm.");
        }
        if (!double.IsFinite(potential.ElectronVolts))
        {
            throw new ArgumentOutOfRangeException(nameof(potential), potential.ElectronVolts,
                $"potential must be finite; got {Preconditions.Format(potential.ElectronVolts)} eV.");
        }
        if (!(mass.ElectronMasses > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(mass), mass.ElectronMasses,
                "mass must be positive and finite; got the default (zero) mass. Create it with EffectiveMass.FromElectronMasses.");
        }
        Preconditions.CheckNonNegativeFinite(nonParabolicityPerElectronVolt);
        return new Layer(width, potential, mass, nonParabolicityPerElectronVolt);
    }

    /// <summary>
    /// Energies must exceed this bound (eV) for m(E) = m + mα(E − V), evaluated in floating point exactly as
    /// the propagators do, to be positive; −∞ for a parabolic layer. V − 1/α itself may be off by an ulp or
    /// more, which let m(E) round to zero (NaN in the transfer matrix) one ulp above it.
    /// </summary>
    internal double LowestValidEnergyElectronVolts()
    {
        var alpha = NonParabolicityPerElectronVolt;
        if (!(alpha > 0))
        {
            return double.NegativeInfinity;
        }
        double v = Potential.ElectronVolts, m = Mass.ElectronMasses, slope = m * alpha;
        var bound = v - 1.0 / alpha;
        // The computed mass is monotone in E (every rounding step is monotone), so it suffices that the
        // next double above the bound gives a positive mass; widen the step geometrically (few iterations).
        var step = Math.Max(Math.Max(double.Epsilon, Math.BitIncrement(Math.Abs(bound)) - Math.Abs(bound)), Math.BitIncrement(Math.Abs(v)) - Math.Abs(v));
        while (!(m + slope * (Math.BitIncrement(bound) - v) > 0))
        {
            bound += step;
            step *= 2;
        }
        return bound;
    }

    /// <summary>A copy with another width.</summary>
    public Layer WithWidth(Length width) => Create(width, Potential, Mass, NonParabolicityPerElectronVolt);

    /// <summary>A copy with another potential energy.</summary>
    public Layer WithPotential(Energy potential) => Create(Width, potential, Mass, NonParabolicityPerElectronVolt);

    /// <summary>A copy with another band-edge mass.</summary>
    public Layer WithMass(EffectiveMass mass) => Create(Width, Potential, mass, NonParabolicityPerElectronVolt);

    /// <summary>A copy with another non-parabolicity α (1/eV).</summary>
    public Layer WithNonParabolicity(double nonParabolicityPerElectronVolt) => Create(Width, Potential, Mass, nonParabolicityPerElectronVolt);

    /// <inheritdoc />
    public override string ToString()
    {
        var text = string.Create(CultureInfo.InvariantCulture,
            $"Layer {Width.Nanometres:G6} nm, V = {Potential.ElectronVolts:G6} eV, m = {Mass.ElectronMasses:G6} m0");
        return NonParabolicityPerElectronVolt == 0
            ? text
            : text + string.Create(CultureInfo.InvariantCulture, $", alpha = {NonParabolicityPerElectronVolt:G6} /eV");
    }
}
