// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.OpticalLattices;

/// <summary>
/// An atom by name and mass, for optical lattices: one of the commonly trapped isotopes in <see cref="Known"/>, or
/// any mass given explicitly with <see cref="FromMass"/>. Immutable.
/// </summary>
/// <remarks>
/// The masses of <see cref="Known"/> are atomic (not nuclear) masses from the Atomic Mass Evaluation AME2020
/// (M. Wang, W. J. Huang, F. G. Kondev, G. Audi, S. Naimi, Chin. Phys. C 45, 030003 (2021)), quoted to 10 or more
/// significant digits and entered from memory of that table: check them against it before relying on the last
/// digits, and give the mass explicitly where it matters. The conversion to electron masses uses CODATA 2018's
/// m_u/m₀ (<see cref="PhysicalConstants.AtomicMassUnitElectronMasses"/>).
/// </remarks>
public sealed class AtomicSpecies
{
    private static readonly AtomicSpecies[] Table =
    [
        new("6Li", 6.0151228874),
        new("7Li", 7.0160034366),
        new("23Na", 22.9897692820),
        new("39K", 38.9637064864),
        new("40K", 39.963998166),
        new("41K", 40.9618252579),
        new("85Rb", 84.9117897379),
        new("87Rb", 86.9091805310),
        new("88Sr", 87.9056122571),
        new("133Cs", 132.9054519610),
        new("174Yb", 173.9388664),
    ];

    private AtomicSpecies(string name, double massAtomicMassUnits)
    {
        Name = name;
        MassAtomicMassUnits = massAtomicMassUnits;
    }

    /// <summary>The commonly trapped isotopes this library knows by name, lightest first.</summary>
    public static IReadOnlyList<AtomicSpecies> Known { get; } = Array.AsReadOnly(Table);

    /// <summary>The isotope's name, mass number first (e.g. "87Rb"), or the name given to an explicit mass.</summary>
    public string Name { get; }

    /// <summary>The atomic mass in unified atomic mass units u.</summary>
    public double MassAtomicMassUnits { get; }

    /// <summary>The mass as an <see cref="EffectiveMass"/> in electron masses (the library's mass unit).</summary>
    public EffectiveMass Mass => EffectiveMass.FromElectronMasses(MassAtomicMassUnits * PhysicalConstants.AtomicMassUnitElectronMasses);

    /// <summary>The known isotope named <paramref name="name"/> (case-insensitive; "Rb87" and "rb-87" are accepted as "87Rb").</summary>
    /// <exception cref="ArgumentNullException"><paramref name="name"/> is null.</exception>
    /// <exception cref="ArgumentException">No known isotope has that name (the message lists those known).</exception>
    public static AtomicSpecies Find(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        var key = Normalise(name);
        foreach (var species in Table)
        {
            if (string.Equals(species.Name, key, StringComparison.OrdinalIgnoreCase))
            {
                return species;
            }
        }
        throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
            $"species \"{name}\" is not known; known species are {KnownNames}, or give the mass in u instead."), nameof(name));
    }

    /// <summary>The names of <see cref="Known"/>, comma-separated.</summary>
    public static string KnownNames => string.Join(", ", Table.Select(s => s.Name));

    /// <summary>An atom of mass <paramref name="massAtomicMassUnits"/> (u), named <paramref name="name"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The mass is not positive and finite.</exception>
    public static AtomicSpecies FromMass(double massAtomicMassUnits, string name = "custom")
    {
        Preconditions.CheckPositiveFinite(massAtomicMassUnits);
        ArgumentNullException.ThrowIfNull(name);
        return new AtomicSpecies(name, massAtomicMassUnits);
    }

    /// <summary>"87Rb", "Rb87", "Rb-87", "rb 87" → "87Rb".</summary>
    private static string Normalise(string name)
    {
        var text = name.Trim().Replace("-", "", StringComparison.Ordinal).Replace(" ", "", StringComparison.Ordinal);
        var digits = new string(text.Where(char.IsAsciiDigit).ToArray());
        var letters = new string(text.Where(char.IsAsciiLetter).ToArray());
        return digits.Length + letters.Length == text.Length && digits.Length > 0 && letters.Length > 0 ? digits + letters : text;
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Name} ({MassAtomicMassUnits:R} u)");
}
