// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Serialization;

namespace Periodic.Cli;

/// <summary>
/// Every bound the tool checks before work starts, in one place (docs/limits.md states each with the measured cost behind
/// it; the structure file's own bounds are <see cref="StructureFileLimits"/>). Commands call these checks right after
/// parsing, so a refused run costs nothing and names the option, the value and the bound.
/// </summary>
internal static class Limits
{
    /// <summary>Energy options (--from, --to, --energies, --fermi-level, --bias, --lead-potential) lie within ±this, eV: the file's potential bound.</summary>
    public const double MaxEnergyElectronVolts = StructureFileLimits.MaxPotentialElectronVolts;

    /// <summary>Fewest points of an evenly spaced grid: both ends.</summary>
    public const int MinGridPoints = 2;

    /// <summary>Most points of an energy grid (--points).</summary>
    public const int MaxGridPoints = 1_000_000;

    /// <summary>
    /// Most E(k) values of one dispersion run (--count × --points): measured 3.2 µs of CPU per value for a two-layer cell,
    /// so 10⁷ values take about half a minute; the output is streamed, so memory does not grow with it.
    /// </summary>
    public const long MaxDispersionValues = 10_000_000;

    /// <summary>
    /// Largest (stack elements)² × biases of one current run. Under bias each evaluation walks every element and the
    /// quadrature needs about 100 evaluations per period (one group per resonance), so one bias costs ≈ 5.8·10⁻⁵ s × elements²
    /// of CPU (measured: 300 periods of a two-layer cell, 21 s per bias). 10⁷ is about ten minutes.
    /// </summary>
    public const long MaxCurrentWork = 10_000_000;

    /// <summary>
    /// Largest --points × stack elements of a transmission run under bias (each energy walks every element; measured
    /// about 1.1 µs per element and energy, so 3·10⁸ is about five minutes).
    /// </summary>
    public const long MaxBiasedTransmissionWork = 300_000_000;

    /// <summary>Most points drawn in a profile plot (--periods × points per period): a picture at most 8,000 pixels wide shows no more.</summary>
    public const long MaxProfilePoints = 2_000_000;

    /// <summary>Smallest image width, pixels.</summary>
    public const int MinImageWidth = 200;

    /// <summary>Smallest image height, pixels.</summary>
    public const int MinImageHeight = 150;

    /// <summary>Largest image width or height, pixels.</summary>
    public const int MaxImageSize = 8000;

    /// <summary>An energy option's value within ±<see cref="MaxEnergyElectronVolts"/>.</summary>
    public static double CheckEnergy(string option, double value)
    {
        if (!(Math.Abs(value) <= MaxEnergyElectronVolts))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{option} must be between -{MaxEnergyElectronVolts} and {MaxEnergyElectronVolts} eV (the range of potentials a structure file may hold; see docs/limits.md); got {value:R}."));
        }
        return value;
    }

    /// <summary>A mass option's value within the structure file's mass bounds.</summary>
    public static double CheckMass(string option, double value)
    {
        if (!(value >= StructureFileLimits.MinMassElectronMasses && value <= StructureFileLimits.MaxMassElectronMasses))
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{option} must be between {StructureFileLimits.MinMassElectronMasses:R} and {StructureFileLimits.MaxMassElectronMasses:R} m0 (see docs/limits.md); got {value:R}."));
        }
        return value;
    }

    /// <summary>An integer option within [<paramref name="minimum"/>, <paramref name="maximum"/>].</summary>
    public static int CheckRange(string option, int value, int minimum, int maximum, string unit = "")
    {
        if (value < minimum || value > maximum)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"{option} must be between {minimum} and {maximum}{unit}; got {value}."));
        }
        return value;
    }

    /// <summary>Refuses a run whose work (a product of option values) exceeds <paramref name="maximum"/>.</summary>
    public static void CheckWork(string product, long work, long maximum, string why)
    {
        if (work > maximum || work < 0)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"{product} = {work} exceeds {maximum}: {why} (see docs/limits.md)."));
        }
    }

    /// <summary>Saturating product, so a bound check cannot overflow.</summary>
    public static long Product(long a, long b) => a != 0 && b > long.MaxValue / a ? long.MaxValue : a * b;
}
