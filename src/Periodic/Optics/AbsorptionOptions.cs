// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Optics;

/// <summary>
/// Conditions of an intersubband absorption spectrum (<see cref="AbsorptionSpectrum.Compute"/>,
/// <see cref="AbsorptionSpectrum.ComputeAtFermiLevel"/>): temperature, the line width and shape, the refractive index, the
/// optional depolarisation shift, and how many times the computed stack is repeated in one optical pass. Validated when
/// created; every default is a constant here and <see cref="Default"/> uses them all. The electrons (a sheet density or a
/// Fermi level) are an argument of the computation, not an option.
/// </summary>
public sealed class AbsorptionOptions
{
    /// <summary>Lowest temperature accepted, K.</summary>
    public const double MinTemperatureKelvin = 0.1;

    /// <summary>Highest temperature accepted, K (the band parameters are not meant for more).</summary>
    public const double MaxTemperatureKelvin = 1000;

    /// <summary>Default temperature, K.</summary>
    public const double DefaultTemperatureKelvin = 77;

    /// <summary>Default full width at half maximum, eV (a few meV is typical of GaAs wells).</summary>
    public const double DefaultLinewidthElectronVolts = 0.005;

    /// <summary>Default refractive index (roughly GaAs in the mid-infrared).</summary>
    public const double DefaultRefractiveIndex = 3.3;

    private AbsorptionOptions(double temperature, double linewidth, LineShape shape, double refractiveIndex, bool depolarisation, double? permittivity, int passRepeats)
    {
        TemperatureKelvin = temperature;
        LinewidthElectronVolts = linewidth;
        Shape = shape;
        RefractiveIndex = refractiveIndex;
        Depolarisation = depolarisation;
        RelativePermittivity = permittivity;
        PassRepeats = passRepeats;
    }

    /// <summary>The defaults: 77 K, 5 meV Lorentzian lines, n = 3.3, no depolarisation shift, one pass through one stack.</summary>
    public static AbsorptionOptions Default { get; } = Create();

    /// <summary>Temperature, K (default 77).</summary>
    public double TemperatureKelvin { get; }

    /// <summary>Full width at half maximum of every line, eV (default 0.005).</summary>
    public double LinewidthElectronVolts { get; }

    /// <summary>The line shape (default Lorentzian).</summary>
    public LineShape Shape { get; }

    /// <summary>Refractive index n of the medium at the transition (default 3.3).</summary>
    public double RefractiveIndex { get; }

    /// <summary>Include the depolarisation (plasma) shift of each line (default false).</summary>
    public bool Depolarisation { get; }

    /// <summary>Relative permittivity screening the depolarisation field; null (default) takes n².</summary>
    public double? RelativePermittivity { get; }

    /// <summary>How many copies of the computed stack one optical pass crosses (default 1), for <see cref="AbsorptionSpectrum.PassAbsorption"/>.</summary>
    public int PassRepeats { get; }

    /// <summary>Creates options; every parameter left out takes its default.</summary>
    /// <param name="temperatureKelvin">In [<see cref="MinTemperatureKelvin"/>, <see cref="MaxTemperatureKelvin"/>] K.</param>
    /// <param name="linewidthElectronVolts">Full width at half maximum, in (0, 1] eV.</param>
    /// <param name="shape">Lorentzian or Gaussian.</param>
    /// <param name="refractiveIndex">In [1, 10].</param>
    /// <param name="depolarisation">Include the depolarisation shift.</param>
    /// <param name="relativePermittivity">In [1, 1000]; null takes n².</param>
    /// <param name="passRepeats">In [1, 100000].</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static AbsorptionOptions Create(double temperatureKelvin = DefaultTemperatureKelvin, double linewidthElectronVolts = DefaultLinewidthElectronVolts,
        LineShape shape = LineShape.Lorentzian, double refractiveIndex = DefaultRefractiveIndex, bool depolarisation = false, double? relativePermittivity = null,
        int passRepeats = 1)
    {
        if (!(temperatureKelvin >= MinTemperatureKelvin && temperatureKelvin <= MaxTemperatureKelvin))
        {
            throw new ArgumentOutOfRangeException(nameof(temperatureKelvin), temperatureKelvin, string.Create(CultureInfo.InvariantCulture,
                $"temperatureKelvin must lie in [{MinTemperatureKelvin}, {MaxTemperatureKelvin}] K; got {Preconditions.Format(temperatureKelvin)}."));
        }
        if (!(linewidthElectronVolts > 0 && linewidthElectronVolts <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(linewidthElectronVolts), linewidthElectronVolts,
                $"linewidthElectronVolts (FWHM) must lie in (0, 1] eV; got {Preconditions.Format(linewidthElectronVolts)}.");
        }
        if (!Enum.IsDefined(shape))
        {
            throw new ArgumentOutOfRangeException(nameof(shape), shape, $"shape must be Lorentzian or Gaussian; got {shape}.");
        }
        if (!(refractiveIndex >= 1 && refractiveIndex <= 10))
        {
            throw new ArgumentOutOfRangeException(nameof(refractiveIndex), refractiveIndex,
                $"refractiveIndex must lie in [1, 10]; got {Preconditions.Format(refractiveIndex)}.");
        }
        if (relativePermittivity is { } eps && !(eps >= 1 && eps <= 1000))
        {
            throw new ArgumentOutOfRangeException(nameof(relativePermittivity), eps,
                $"relativePermittivity must lie in [1, 1000] (or null for n²); got {Preconditions.Format(eps)}.");
        }
        if (passRepeats < 1 || passRepeats > 100_000)
        {
            throw new ArgumentOutOfRangeException(nameof(passRepeats), passRepeats,
                string.Create(CultureInfo.InvariantCulture, $"passRepeats must lie in [1, 100000]; got {passRepeats}."));
        }
        return new AbsorptionOptions(temperatureKelvin, linewidthElectronVolts, shape, refractiveIndex, depolarisation, relativePermittivity, passRepeats);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{TemperatureKelvin:G6} K, FWHM {LinewidthElectronVolts * 1000:G4} meV {Shape}, n = {RefractiveIndex:G4}{(Depolarisation ? ", depolarisation shift" : "")}, {PassRepeats} pass(es)");
}
