// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;

using Periodic.Cli.Commands;

namespace Periodic.Cli.Physics;

/// <summary>
/// The per-energy quantities the tool reports, all taken from the library: the density of states
/// and dE/dk from <see cref="BandProperties"/>, Re k and Im k from <see cref="BandStructure.WavevectorAt"/>.
/// </summary>
internal static class PointQuantities
{
    public readonly record struct Values(double Energy, double Dos, double Wavevector, double Decay, double Slope);

    /// <summary>Band properties valid up to (and beyond) <paramref name="highestEnergyElectronVolts"/>.</summary>
    public static BandProperties PropertiesUpTo(UnitCell cell, double highestEnergyElectronVolts)
    {
        try
        {
            return BandProperties.Create(Solver.ComputeBelow(cell, highestEnergyElectronVolts).Structure);
        }
        catch (ArgumentOutOfRangeException e)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"the highest energy asked for ({highestEnergyElectronVolts:R} eV, --to or --energies) lies above more bands than are computed at once (at most 10000): {Common.Describe(e).Replace("energyLimit", "the energy", StringComparison.Ordinal)} Choose a lower energy."));
        }
    }

    public static Values At(BandProperties properties, double energyElectronVolts)
    {
        var k = properties.Structure.WavevectorAt(energyElectronVolts);
        var dos = properties.DensityOfStatesPerElectronVoltNanometre(energyElectronVolts);
        // dE/dk is defined only inside a band; the contract reports 0 in a gap.
        var slope = k.IsPropagating ? properties.GroupVelocityAtEnergy(energyElectronVolts).SlopeElectronVoltNanometres : 0.0;
        return new Values(energyElectronVolts, dos, k.RealPerNanometre, k.ImaginaryPerNanometre, slope);
    }
}
