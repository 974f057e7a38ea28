// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Materials;

/// <summary>
/// Band-edge steps from a first material to a second at one temperature, from the valence-band
/// offsets and Varshni gaps of both (unstrained, Γ valley): ΔE_c = E_c2 − E_c1, ΔE_v = E_v2 − E_v1.
/// </summary>
public readonly record struct BandOffset
{
    private readonly string? _firstName;
    private readonly string? _secondName;

    private BandOffset(string first, string second, double temperature, double conduction, double valence, double gapDifference)
    {
        _firstName = first;
        _secondName = second;
        TemperatureKelvin = temperature;
        ConductionElectronVolts = conduction;
        ValenceElectronVolts = valence;
        GapDifferenceElectronVolts = gapDifference;
    }

    /// <summary>Name of the first (reference) material (empty for <c>default</c>).</summary>
    public string FirstName => _firstName ?? string.Empty;

    /// <summary>Name of the second material (empty for <c>default</c>).</summary>
    public string SecondName => _secondName ?? string.Empty;

    /// <summary>Temperature of the gaps, K.</summary>
    public double TemperatureKelvin { get; }

    /// <summary>Conduction-band step E_c(second) − E_c(first), eV.</summary>
    public double ConductionElectronVolts { get; }

    /// <summary>Valence-band step E_v(second) − E_v(first), eV.</summary>
    public double ValenceElectronVolts { get; }

    /// <summary>Gap difference Eg(second) − Eg(first) = ΔE_c − ΔE_v, eV.</summary>
    public double GapDifferenceElectronVolts { get; }

    /// <summary>
    /// Conduction-band share of the gap difference, ΔE_c/ΔEg; zero when the gaps are equal (the share is then undefined).
    /// </summary>
    public double ConductionShare => GapDifferenceElectronVolts == 0 ? 0 : ConductionElectronVolts / GapDifferenceElectronVolts;

    /// <summary>The offsets from <paramref name="first"/> to <paramref name="second"/> at temperature T.</summary>
    /// <exception cref="ArgumentNullException">A material is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">T is outside 0–1000 K, or a gap would not be positive.</exception>
    public static BandOffset Between(Material first, Material second, Temperature temperature)
    {
        ArgumentNullException.ThrowIfNull(first);
        ArgumentNullException.ThrowIfNull(second);
        double g1 = first.BandGapElectronVolts(temperature), g2 = second.BandGapElectronVolts(temperature);
        var valence = second.ValenceBandOffsetElectronVolts - first.ValenceBandOffsetElectronVolts;
        var conduction = (second.ValenceBandOffsetElectronVolts + g2) - (first.ValenceBandOffsetElectronVolts + g1);
        return new BandOffset(first.Name, second.Name, temperature.Kelvin, conduction, valence, g2 - g1);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{FirstName} -> {SecondName} at {TemperatureKelvin:G4} K: dEc = {ConductionElectronVolts * 1e3:F1} meV, dEv = {ValenceElectronVolts * 1e3:F1} meV, dEc/dEg = {ConductionShare:F3}");
}
