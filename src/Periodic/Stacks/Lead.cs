// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// A semi-infinite uniform contact region on one side of a <see cref="LayerStack"/>: constant
/// potential energy (its band edge) and a parabolic effective mass. Carriers propagate in the lead
/// only above its band edge, with wavenumber k = √(2m(E − V))/ħ.
/// </summary>
public readonly record struct Lead
{
    private Lead(Energy potential, EffectiveMass mass)
    {
        Potential = potential;
        Mass = mass;
    }

    /// <summary>The band edge (potential energy) of the lead.</summary>
    public Energy Potential { get; }

    /// <summary>The effective mass of the lead (zero only for <c>default</c>, which no API accepts).</summary>
    public EffectiveMass Mass { get; }

    internal double PotentialElectronVolts => Potential.ElectronVolts;

    internal double MassElectronMasses => Mass.ElectronMasses;

    /// <summary>Creates a lead of the given band edge and effective mass.</summary>
    /// <param name="potential">Band edge of the lead.</param>
    /// <param name="mass">Effective mass; must be a created (non-default) mass.</param>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="mass"/> is the default (zero) mass.</exception>
    public static Lead Create(Energy potential, EffectiveMass mass)
    {
        if (!(mass.ElectronMasses > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(mass), mass.ElectronMasses,
                "mass must be positive and finite; got the default (zero) mass. Create it with EffectiveMass.FromElectronMasses.");
        }
        return new Lead(potential, mass);
    }

    /// <summary>A lead of the same material as <paramref name="layer"/> (its potential and band-edge mass).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="layer"/> is null.</exception>
    public static Lead Like(Structures.Layer layer)
    {
        ArgumentNullException.ThrowIfNull(layer);
        return new Lead(layer.Potential, layer.Mass);
    }

    /// <summary>
    /// The wavenumber k (1/nm) at <paramref name="energyElectronVolts"/>: real and positive above the
    /// band edge; zero at or below it (then the lead carries no current, see <see cref="DecayConstantPerNanometre"/>).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public double WavenumberPerNanometre(double energyElectronVolts)
    {
        Preconditions.CheckFinite(energyElectronVolts);
        var excess = energyElectronVolts - PotentialElectronVolts;
        return excess > 0 ? Math.Sqrt(MassElectronMasses * excess / PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2) : 0.0;
    }

    /// <summary>The decay constant κ (1/nm) of the evanescent solution at or below the band edge; zero above it.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public double DecayConstantPerNanometre(double energyElectronVolts)
    {
        Preconditions.CheckFinite(energyElectronVolts);
        var deficit = PotentialElectronVolts - energyElectronVolts;
        return deficit > 0 ? Math.Sqrt(MassElectronMasses * deficit / PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2) : 0.0;
    }

    /// <summary>dκ/dE = −m/(2Cκ) below the band edge (C = ħ²/2m₀), 1/(nm eV): the decay constant's slope for energy derivatives of states.</summary>
    internal double DecayConstantSlope(double energyElectronVolts)
    {
        var kappa = DecayConstantPerNanometre(energyElectronVolts);
        return kappa > 0 ? -MassElectronMasses / (2 * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * kappa) : double.NegativeInfinity;
    }

    internal void Validate(string paramName)
    {
        if (!(MassElectronMasses > 0))
        {
            throw new ArgumentException(
                $"{paramName} is the default Lead (zero mass); create it with Lead.Create(potential, mass).", paramName);
        }
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Lead V = {PotentialElectronVolts:G6} eV, m = {MassElectronMasses:G6} m0");
}
