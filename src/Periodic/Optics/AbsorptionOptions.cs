// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Optics;

/// <summary>
/// Conditions of an intersubband absorption spectrum (<see cref="AbsorptionSpectrum.Compute"/>): temperature, the electrons
/// (a sheet density or a Fermi level: exactly one), the line width and shape, the refractive index, the optional
/// depolarisation shift, and how many times the computed stack is repeated in one optical pass.
/// </summary>
public sealed record AbsorptionOptions
{
    /// <summary>Lowest temperature accepted, K.</summary>
    public const double MinTemperatureKelvin = 0.1;

    /// <summary>Highest temperature accepted, K (the band parameters are not meant for more).</summary>
    public const double MaxTemperatureKelvin = 1000;

    /// <summary>Temperature, K (default 77).</summary>
    public double TemperatureKelvin { get; init; } = 77;

    /// <summary>Electrons in the whole computed stack per cm² (sum over its levels); null when <see cref="FermiLevelElectronVolts"/> is given.</summary>
    public double? SheetDensityPerSquareCentimetre { get; init; }

    /// <summary>The Fermi level, eV on the stack's energy scale; null when <see cref="SheetDensityPerSquareCentimetre"/> is given.</summary>
    public double? FermiLevelElectronVolts { get; init; }

    /// <summary>Full width at half maximum of every line, eV (default 0.005; a few meV is typical of GaAs wells).</summary>
    public double LinewidthElectronVolts { get; init; } = 0.005;

    /// <summary>The line shape (default Lorentzian).</summary>
    public LineShape Shape { get; init; } = LineShape.Lorentzian;

    /// <summary>Refractive index n of the medium at the transition (default 3.3, roughly GaAs in the mid-infrared).</summary>
    public double RefractiveIndex { get; init; } = 3.3;

    /// <summary>Include the depolarisation (plasma) shift of each line (default false).</summary>
    public bool Depolarisation { get; init; }

    /// <summary>Relative permittivity screening the depolarisation field; null (default) takes n².</summary>
    public double? RelativePermittivity { get; init; }

    /// <summary>How many copies of the computed stack one optical pass crosses (default 1), for <see cref="AbsorptionSpectrum.PassAbsorption"/>.</summary>
    public int PassRepeats { get; init; } = 1;

    internal void Validate(string paramName)
    {
        if (!(TemperatureKelvin >= MinTemperatureKelvin && TemperatureKelvin <= MaxTemperatureKelvin))
        {
            throw new ArgumentOutOfRangeException(paramName, TemperatureKelvin, string.Create(CultureInfo.InvariantCulture,
                $"{paramName}.TemperatureKelvin must lie in [{MinTemperatureKelvin}, {MaxTemperatureKelvin}] K; got {Preconditions.Format(TemperatureKelvin)}."));
        }
        if ((SheetDensityPerSquareCentimetre is null) == (FermiLevelElectronVolts is null))
        {
            throw new ArgumentException(
                $"{paramName} must give exactly one of SheetDensityPerSquareCentimetre and FermiLevelElectronVolts; got {(SheetDensityPerSquareCentimetre is null ? "neither" : "both")}.",
                paramName);
        }
        if (SheetDensityPerSquareCentimetre is { } density && !(density > 0 && density <= 1e15))
        {
            throw new ArgumentOutOfRangeException(paramName, density,
                $"{paramName}.SheetDensityPerSquareCentimetre must lie in (0, 1e15] per cm²; got {Preconditions.Format(density)}.");
        }
        if (FermiLevelElectronVolts is { } fermi && !double.IsFinite(fermi))
        {
            throw new ArgumentOutOfRangeException(paramName, fermi, $"{paramName}.FermiLevelElectronVolts must be finite; got {Preconditions.Format(fermi)}.");
        }
        if (!(LinewidthElectronVolts > 0 && LinewidthElectronVolts <= 1))
        {
            throw new ArgumentOutOfRangeException(paramName, LinewidthElectronVolts,
                $"{paramName}.LinewidthElectronVolts (FWHM) must lie in (0, 1] eV; got {Preconditions.Format(LinewidthElectronVolts)}.");
        }
        if (!Enum.IsDefined(Shape))
        {
            throw new ArgumentOutOfRangeException(paramName, Shape, $"{paramName}.Shape must be Lorentzian or Gaussian; got {Shape}.");
        }
        if (!(RefractiveIndex >= 1 && RefractiveIndex <= 10))
        {
            throw new ArgumentOutOfRangeException(paramName, RefractiveIndex,
                $"{paramName}.RefractiveIndex must lie in [1, 10]; got {Preconditions.Format(RefractiveIndex)}.");
        }
        if (RelativePermittivity is { } eps && !(eps >= 1 && eps <= 1000))
        {
            throw new ArgumentOutOfRangeException(paramName, eps,
                $"{paramName}.RelativePermittivity must lie in [1, 1000] (or null for n²); got {Preconditions.Format(eps)}.");
        }
        if (PassRepeats < 1 || PassRepeats > 100_000)
        {
            throw new ArgumentOutOfRangeException(paramName, PassRepeats,
                string.Create(CultureInfo.InvariantCulture, $"{paramName}.PassRepeats must lie in [1, 100000]; got {PassRepeats}."));
        }
    }
}
