// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;

using Periodic.Units;

namespace Periodic.Materials;

/// <summary>
/// Band parameters of one zinc-blende III–V semiconductor (a binary, an alloy at fixed composition,
/// or a custom material): Γ-valley gap with its Varshni temperature law, conduction-band mass,
/// valence-band offset, lattice constant, and, where known, heavy- and light-hole masses.
/// Immutable; every field can be replaced with a <c>With…</c> copy, and <see cref="StatusOf"/> says
/// where each value came from.
/// </summary>
/// <remarks>
/// <para>The built-in binaries carry the recommended values of I. Vurgaftman, J. R. Meyer and
/// L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), <b>recalled from memory</b>, not re-read against
/// the paper (status <see cref="ParameterStatus.FromMemory"/>). Override any value you have a better
/// source for, and confirm design-critical numbers against measurement.</para>
/// <para>Valence-band offsets are on the common absolute scale of that table (eV; InSb's valence-band
/// maximum at 0 eV), taken as independent of temperature; all temperature dependence is in the gap, so
/// the conduction-band edge is E_c(T) = VBO + Eg(T).</para>
/// </remarks>
public sealed class Material
{
    /// <summary>Lowest temperature accepted, K.</summary>
    public const double MinimumTemperatureKelvin = 0.0;

    /// <summary>Highest temperature accepted, K: the Varshni law is a fit to data below roughly this range.</summary>
    public const double MaximumTemperatureKelvin = 1000.0;

    private const string TableSource =
        "I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001); values from memory";

    private static readonly ParameterStatus[] BinaryStatus =
    [
        ParameterStatus.FromMemory, ParameterStatus.FromMemory, ParameterStatus.FromMemory, ParameterStatus.FromMemory,
        ParameterStatus.FromMemory, ParameterStatus.FromMemory, ParameterStatus.Derived, ParameterStatus.Derived,
    ];

    private readonly ParameterStatus[] _status;

    private Material(string name, double gap0, double alpha, double beta, double electronMass, double vbo,
        double latticeNanometres, double? heavyHole, double? lightHole, bool gammaLowest, string source, ParameterStatus[] status)
    {
        Name = name;
        BandGapAtZeroKelvinElectronVolts = gap0;
        VarshniAlphaElectronVoltsPerKelvin = alpha;
        VarshniBetaKelvin = beta;
        ElectronMassElectronMasses = electronMass;
        ValenceBandOffsetElectronVolts = vbo;
        LatticeConstantNanometres = latticeNanometres;
        HeavyHoleMassElectronMasses = heavyHole;
        LightHoleMassElectronMasses = lightHole;
        IsGammaValleyLowest = gammaLowest;
        Source = source;
        _status = status;
    }

    // Binaries: Vurgaftman, Meyer & Ram-Mohan (2001) [from memory]. Hole masses along [001] from the
    // Luttinger parameters of the same table [from memory], m_hh = 1/(γ1 − 2γ2), m_lh = 1/(γ1 + 2γ2)
    // (the standard spherical-axis relations): GaAs γ1 6.98, γ2 2.06; AlAs 3.76, 0.82; InAs 20.0, 8.5;
    // InP 5.08, 1.60; GaSb 13.4, 4.7; AlSb 5.18, 1.19.

    /// <summary>GaAs (direct gap). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material GaAs { get; } = Binary("GaAs", 1.519, 0.5405e-3, 204, 0.067, -0.80, 0.565325, 6.98, 2.06, true, 12.9);

    /// <summary>AlAs (indirect: the X valley lies below Γ; only Γ is modelled). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material AlAs { get; } = Binary("AlAs", 3.099, 0.885e-3, 530, 0.15, -1.33, 0.56611, 3.76, 0.82, false, 10.06);

    /// <summary>InAs (direct gap). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material InAs { get; } = Binary("InAs", 0.417, 0.276e-3, 93, 0.026, -0.59, 0.60583, 20.0, 8.5, true, 15.15);

    /// <summary>InP (direct gap). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material InP { get; } = Binary("InP", 1.4236, 0.363e-3, 162, 0.0795, -0.94, 0.58697, 5.08, 1.60, true, 12.5);

    /// <summary>GaSb (direct gap, L valley close above). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material GaSb { get; } = Binary("GaSb", 0.812, 0.417e-3, 140, 0.039, -0.03, 0.60959, 13.4, 4.7, true, 15.7);

    /// <summary>AlSb (indirect: the X valley lies below Γ; only Γ is modelled). Values from memory of Vurgaftman et al. (2001).</summary>
    public static Material AlSb { get; } = Binary("AlSb", 2.386, 0.42e-3, 140, 0.14, -0.41, 0.61355, 5.18, 1.19, false, 12.04);

    /// <summary>The built-in binaries: GaAs, AlAs, InAs, InP, GaSb, AlSb.</summary>
    public static IReadOnlyList<Material> Binaries { get; } =
        new ReadOnlyCollection<Material>([GaAs, AlAs, InAs, InP, GaSb, AlSb]);

    /// <summary>The material's name (for an alloy, its formula with the composition).</summary>
    public string Name { get; }

    /// <summary>Γ-valley band gap at 0 K.</summary>
    public Energy BandGapAtZeroKelvin => Energy.FromElectronVolts(BandGapAtZeroKelvinElectronVolts);

    internal double BandGapAtZeroKelvinElectronVolts { get; }

    /// <summary>Varshni α in eV/K (the table quotes meV/K).</summary>
    public double VarshniAlphaElectronVoltsPerKelvin { get; }

    /// <summary>Varshni β (a temperature).</summary>
    public Temperature VarshniBeta => Temperature.FromKelvin(VarshniBetaKelvin);

    internal double VarshniBetaKelvin { get; }

    /// <summary>Γ-valley conduction-band effective mass at the band edge (taken independent of temperature).</summary>
    public EffectiveMass ElectronMass => EffectiveMass.FromElectronMasses(ElectronMassElectronMasses);

    internal double ElectronMassElectronMasses { get; }

    /// <summary>Valence-band maximum on the absolute scale of the table (taken independent of temperature).</summary>
    public Energy ValenceBandOffset => Energy.FromElectronVolts(ValenceBandOffsetElectronVolts);

    internal double ValenceBandOffsetElectronVolts { get; }

    /// <summary>Cubic lattice constant a.</summary>
    public Length LatticeConstant => Length.FromNanometres(LatticeConstantNanometres);

    internal double LatticeConstantNanometres { get; }

    /// <summary>The thickness of one monolayer along [001], a/2.</summary>
    public Length MonolayerThickness => Length.FromNanometres(MonolayerNanometres);

    internal double MonolayerNanometres => 0.5 * LatticeConstantNanometres;

    /// <summary>Heavy-hole mass along [001]; null when no value is available.</summary>
    public EffectiveMass? HeavyHoleMass => HeavyHoleMassElectronMasses is { } m ? EffectiveMass.FromElectronMasses(m) : null;

    /// <summary>Light-hole mass along [001]; null when no value is available.</summary>
    public EffectiveMass? LightHoleMass => LightHoleMassElectronMasses is { } m ? EffectiveMass.FromElectronMasses(m) : null;

    internal double? HeavyHoleMassElectronMasses { get; }

    internal double? LightHoleMassElectronMasses { get; }

    /// <summary>
    /// Whether the Γ valley is the lowest conduction-band minimum. When false (AlAs, AlSb, Al-rich
    /// AlGaAs) the lowest conduction states lie in the X or L valleys, which this model does not contain.
    /// </summary>
    public bool IsGammaValleyLowest { get; }

    /// <summary>Where the values came from, in words.</summary>
    public string Source { get; }

    /// <summary>
    /// The static (low-frequency) relative permittivity ε_r, for Poisson's equation of doped structures; null when no value is
    /// available. Built-in binaries: GaAs 12.9, AlAs 10.06, InAs 15.15, InP 12.5, GaSb 15.7, AlSb 12.04 (S. Adachi, Properties
    /// of Group-IV, III–V and II–VI Semiconductors, Wiley 2005, ch. 11, <b>from memory</b>); alloys interpolate linearly
    /// between their endpoints. Override it with <see cref="WithStaticRelativePermittivity"/> where you have a better value.
    /// </summary>
    public double? StaticRelativePermittivity { get; private init; }

    /// <summary>A copy with another static relative permittivity (at least 1).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is below 1 or not finite.</exception>
    public Material WithStaticRelativePermittivity(double staticRelativePermittivity) =>
        new(Name, BandGapAtZeroKelvinElectronVolts, VarshniAlphaElectronVoltsPerKelvin, VarshniBetaKelvin, ElectronMassElectronMasses,
            ValenceBandOffsetElectronVolts, LatticeConstantNanometres, HeavyHoleMassElectronMasses, LightHoleMassElectronMasses,
            IsGammaValleyLowest, Source, _status)
        { StaticRelativePermittivity = Preconditions.CheckRange(staticRelativePermittivity, 1.0, 1e4) };

    /// <summary>The same material with the static permittivity an alloy interpolates to (null stays null).</summary>
    internal Material WithInterpolatedPermittivity(double? permittivity) =>
        new(Name, BandGapAtZeroKelvinElectronVolts, VarshniAlphaElectronVoltsPerKelvin, VarshniBetaKelvin, ElectronMassElectronMasses,
            ValenceBandOffsetElectronVolts, LatticeConstantNanometres, HeavyHoleMassElectronMasses, LightHoleMassElectronMasses,
            IsGammaValleyLowest, Source, _status)
        { StaticRelativePermittivity = permittivity };

    /// <summary>Where the value of <paramref name="parameter"/> came from.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="parameter"/> is not a defined value.</exception>
    public ParameterStatus StatusOf(MaterialParameter parameter)
    {
        if (!Enum.IsDefined(parameter))
        {
            throw new ArgumentOutOfRangeException(nameof(parameter), parameter,
                string.Create(CultureInfo.InvariantCulture, $"parameter must be a defined MaterialParameter; got {(int)parameter}."));
        }
        return _status[(int)parameter];
    }

    /// <summary>
    /// The Γ-valley band gap at temperature T by the Varshni law Eg(T) = Eg(0) − αT²/(T + β)
    /// (Y. P. Varshni, Physica 34, 149 (1967)), eV.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">T is outside 0–1000 K, or the law gives a gap that is not positive.</exception>
    public double BandGapElectronVolts(Temperature temperature)
    {
        var temperatureKelvin = temperature.Kelvin;
        CheckTemperature(temperatureKelvin, nameof(temperature));
        var gap = BandGapAtZeroKelvinElectronVolts
            - VarshniAlphaElectronVoltsPerKelvin * temperatureKelvin * temperatureKelvin / (temperatureKelvin + VarshniBetaKelvin);
        if (!(gap > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(temperature), temperatureKelvin,
                $"temperature = {Preconditions.Format(temperatureKelvin)} K gives a band gap of {Preconditions.Format(gap)} eV for {Name}; the Varshni parameters must keep the gap positive.");
        }
        return gap;
    }

    /// <summary>Conduction-band edge (Γ) on the absolute scale, E_c(T) = VBO + Eg(T), eV.</summary>
    /// <exception cref="ArgumentOutOfRangeException">T is outside 0–1000 K, or the gap would not be positive.</exception>
    public double ConductionBandEdgeElectronVolts(Temperature temperature) =>
        ValenceBandOffsetElectronVolts + BandGapElectronVolts(temperature);

    /// <summary>
    /// Two-band Kane non-parabolicity α = 1/Eg(T), 1/eV, for m(E) = m_edge·(1 + (E − E_c)/Eg)
    /// (E. O. Kane, J. Phys. Chem. Solids 1, 249 (1957), lowest order in (E − E_c)/Eg).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">T is outside 0–1000 K, or the gap would not be positive.</exception>
    public double KaneNonParabolicityPerElectronVolt(Temperature temperature) => 1.0 / BandGapElectronVolts(temperature);

    /// <summary>Relative lattice mismatch (a − a_substrate)/a_substrate to <paramref name="substrate"/>.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="substrate"/> is null.</exception>
    public double LatticeMismatchTo(Material substrate)
    {
        ArgumentNullException.ThrowIfNull(substrate);
        return (LatticeConstantNanometres - substrate.LatticeConstantNanometres) / substrate.LatticeConstantNanometres;
    }

    /// <summary>Band offsets of <paramref name="other"/> relative to this material at temperature T.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="other"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">T is outside 0–1000 K, or a gap would not be positive.</exception>
    public BandOffset OffsetTo(Material other, Temperature temperature) => BandOffset.Between(this, other, temperature);

    /// <summary>
    /// Creates a custom material. Every value is the caller's (status <see cref="ParameterStatus.CallerSupplied"/>).
    /// </summary>
    /// <param name="name">A non-empty name.</param>
    /// <param name="bandGapAtZeroKelvin">Γ gap at 0 K, positive.</param>
    /// <param name="varshniAlphaElectronVoltsPerKelvin">Varshni α, eV/K, zero or positive.</param>
    /// <param name="varshniBeta">Varshni β, a positive temperature.</param>
    /// <param name="electronMass">Conduction-band mass (not the default 0).</param>
    /// <param name="valenceBandOffset">Valence-band maximum on the absolute scale.</param>
    /// <param name="latticeConstant">Lattice constant, positive.</param>
    /// <param name="heavyHoleMass">Heavy-hole mass, or null if unknown.</param>
    /// <param name="lightHoleMass">Light-hole mass, or null if unknown.</param>
    /// <param name="isGammaValleyLowest">Whether Γ is the lowest conduction minimum.</param>
    /// <exception cref="ArgumentException">A value breaks the rule given for it (the message names it).</exception>
    public static Material Create(string name, Energy bandGapAtZeroKelvin, double varshniAlphaElectronVoltsPerKelvin,
        Temperature varshniBeta, EffectiveMass electronMass, Energy valenceBandOffset,
        Length latticeConstant, EffectiveMass? heavyHoleMass = null, EffectiveMass? lightHoleMass = null,
        bool isGammaValleyLowest = true)
    {
        CheckName(name);
        var status = new ParameterStatus[BinaryStatus.Length];
        Array.Fill(status, ParameterStatus.CallerSupplied);
        status[(int)MaterialParameter.HeavyHoleMass] = heavyHoleMass is null ? ParameterStatus.NotAvailable : ParameterStatus.CallerSupplied;
        status[(int)MaterialParameter.LightHoleMass] = lightHoleMass is null ? ParameterStatus.NotAvailable : ParameterStatus.CallerSupplied;
        return Checked(name, Preconditions.CheckPositiveFinite(bandGapAtZeroKelvin.ElectronVolts, nameof(bandGapAtZeroKelvin)),
            Preconditions.CheckNonNegativeFinite(varshniAlphaElectronVoltsPerKelvin), Preconditions.CheckPositiveFinite(varshniBeta.Kelvin, nameof(varshniBeta)),
            CheckMass(electronMass, nameof(electronMass)), valenceBandOffset.ElectronVolts,
            Preconditions.CheckPositiveFinite(latticeConstant.Nanometres, nameof(latticeConstant)),
            heavyHoleMass is { } hh ? CheckMass(hh, nameof(heavyHoleMass)) : null, lightHoleMass is { } lh ? CheckMass(lh, nameof(lightHoleMass)) : null,
            isGammaValleyLowest, "caller", status);
    }

    /// <summary>A copy with another name (parameters unchanged).</summary>
    /// <exception cref="ArgumentException"><paramref name="name"/> is null, empty or white space.</exception>
    public Material WithName(string name)
    {
        CheckName(name);
        return new Material(name, BandGapAtZeroKelvinElectronVolts, VarshniAlphaElectronVoltsPerKelvin, VarshniBetaKelvin,
            ElectronMassElectronMasses, ValenceBandOffsetElectronVolts, LatticeConstantNanometres, HeavyHoleMassElectronMasses,
            LightHoleMassElectronMasses, IsGammaValleyLowest, Source, _status)
        { StaticRelativePermittivity = StaticRelativePermittivity };
    }

    /// <summary>A copy with another Γ gap at 0 K (positive).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The gap is not positive.</exception>
    public Material WithBandGapAtZeroKelvin(Energy bandGapAtZeroKelvin) =>
        Override(MaterialParameter.BandGapAtZeroKelvin, gap0: Preconditions.CheckPositiveFinite(bandGapAtZeroKelvin.ElectronVolts, nameof(bandGapAtZeroKelvin)));

    /// <summary>A copy with other Varshni coefficients α (eV/K, ≥ 0) and β (a positive temperature).</summary>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule.</exception>
    public Material WithVarshni(double varshniAlphaElectronVoltsPerKelvin, Temperature varshniBeta)
    {
        Preconditions.CheckNonNegativeFinite(varshniAlphaElectronVoltsPerKelvin);
        var beta = Preconditions.CheckPositiveFinite(varshniBeta.Kelvin, nameof(varshniBeta));
        var status = (ParameterStatus[])_status.Clone();
        status[(int)MaterialParameter.VarshniAlpha] = ParameterStatus.CallerSupplied;
        status[(int)MaterialParameter.VarshniBeta] = ParameterStatus.CallerSupplied;
        return new Material(Name, BandGapAtZeroKelvinElectronVolts, varshniAlphaElectronVoltsPerKelvin, beta,
            ElectronMassElectronMasses, ValenceBandOffsetElectronVolts, LatticeConstantNanometres, HeavyHoleMassElectronMasses,
            LightHoleMassElectronMasses, IsGammaValleyLowest, Source, status)
        { StaticRelativePermittivity = StaticRelativePermittivity };
    }

    /// <summary>A copy with another conduction-band mass (not the default 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The mass is the default 0.</exception>
    public Material WithElectronMass(EffectiveMass electronMass) =>
        Override(MaterialParameter.ElectronMass, electronMass: CheckMass(electronMass, nameof(electronMass)));

    /// <summary>A copy with another valence-band offset on the absolute scale.</summary>
    public Material WithValenceBandOffset(Energy valenceBandOffset) =>
        Override(MaterialParameter.ValenceBandOffset, vbo: valenceBandOffset.ElectronVolts);

    /// <summary>A copy with another lattice constant (positive).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The lattice constant is not positive.</exception>
    public Material WithLatticeConstant(Length latticeConstant) =>
        Override(MaterialParameter.LatticeConstant, lattice: Preconditions.CheckPositiveFinite(latticeConstant.Nanometres, nameof(latticeConstant)));

    /// <summary>A copy with another heavy-hole mass (not the default 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The mass is the default 0.</exception>
    public Material WithHeavyHoleMass(EffectiveMass heavyHoleMass) =>
        Override(MaterialParameter.HeavyHoleMass, heavyHole: CheckMass(heavyHoleMass, nameof(heavyHoleMass)));

    /// <summary>A copy with another light-hole mass (not the default 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The mass is the default 0.</exception>
    public Material WithLightHoleMass(EffectiveMass lightHoleMass) =>
        Override(MaterialParameter.LightHoleMass, lightHole: CheckMass(lightHoleMass, nameof(lightHoleMass)));

    /// <summary>The mass in m₀; the default <see cref="EffectiveMass"/> (0) is refused naming <paramref name="paramName"/>.</summary>
    private static double CheckMass(EffectiveMass mass, string paramName) => Preconditions.CheckPositiveFinite(mass.ElectronMasses, paramName);

    /// <summary>A copy that says whether Γ is the lowest conduction minimum.</summary>
    public Material WithGammaValleyLowest(bool isGammaValleyLowest) =>
        new(Name, BandGapAtZeroKelvinElectronVolts, VarshniAlphaElectronVoltsPerKelvin, VarshniBetaKelvin, ElectronMassElectronMasses,
            ValenceBandOffsetElectronVolts, LatticeConstantNanometres, HeavyHoleMassElectronMasses, LightHoleMassElectronMasses,
            isGammaValleyLowest, Source, _status)
        { StaticRelativePermittivity = StaticRelativePermittivity };

    /// <summary>Finds a built-in binary by name (case-insensitive), e.g. "GaAs".</summary>
    /// <exception cref="ArgumentException">No built-in binary has that name.</exception>
    public static Material FromName(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        foreach (var material in Binaries)
        {
            if (string.Equals(material.Name, name.Trim(), StringComparison.OrdinalIgnoreCase))
            {
                return material;
            }
        }
        throw new ArgumentException(
            $"name must be one of GaAs, AlAs, InAs, InP, GaSb, AlSb; got \"{name}\". Use TernaryAlloy for alloys or Material.Create for other materials.",
            nameof(name));
    }

    /// <summary>A multi-line listing of every parameter with its status.</summary>
    public string Describe()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"{Name} ({Source})");
        Line(text, "Eg(0 K)", BandGapAtZeroKelvinElectronVolts.ToString("G6", CultureInfo.InvariantCulture) + " eV", MaterialParameter.BandGapAtZeroKelvin);
        Line(text, "Varshni alpha", (VarshniAlphaElectronVoltsPerKelvin * 1e3).ToString("G6", CultureInfo.InvariantCulture) + " meV/K", MaterialParameter.VarshniAlpha);
        Line(text, "Varshni beta", VarshniBetaKelvin.ToString("G6", CultureInfo.InvariantCulture) + " K", MaterialParameter.VarshniBeta);
        Line(text, "m_e", ElectronMassElectronMasses.ToString("G6", CultureInfo.InvariantCulture) + " m0", MaterialParameter.ElectronMass);
        Line(text, "VBO", ValenceBandOffsetElectronVolts.ToString("G6", CultureInfo.InvariantCulture) + " eV", MaterialParameter.ValenceBandOffset);
        Line(text, "a", (LatticeConstantNanometres * 10).ToString("G6", CultureInfo.InvariantCulture) + " A", MaterialParameter.LatticeConstant);
        Line(text, "m_hh[001]", HeavyHoleMassElectronMasses?.ToString("G4", CultureInfo.InvariantCulture) + " m0", MaterialParameter.HeavyHoleMass);
        Line(text, "m_lh[001]", LightHoleMassElectronMasses?.ToString("G4", CultureInfo.InvariantCulture) + " m0", MaterialParameter.LightHoleMass);
        text.AppendLine().Append(IsGammaValleyLowest ? "  Gamma is the lowest conduction minimum" : "  indirect: X or L lies below Gamma (not modelled)");
        return text.ToString();
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{Name}: Eg(0 K) = {BandGapAtZeroKelvinElectronVolts:G6} eV, m_e = {ElectronMassElectronMasses:G4} m0, VBO = {ValenceBandOffsetElectronVolts:G4} eV, a = {LatticeConstantNanometres * 10:G6} A");

    internal static void CheckTemperature(double temperatureKelvin, string paramName = "temperature")
    {
        if (!(temperatureKelvin >= MinimumTemperatureKelvin && temperatureKelvin <= MaximumTemperatureKelvin))
        {
            throw new ArgumentOutOfRangeException(paramName, temperatureKelvin,
                $"{paramName} must be between 0 and 1000 K (the range where the Varshni law is meant to be used); got {Preconditions.Format(temperatureKelvin)}.");
        }
    }

    internal static Material Derived(string name, double gap0, double alpha, double beta, double electronMass, double vbo,
        double latticeNanometres, double? heavyHole, double? lightHole, bool gammaLowest, string source)
    {
        var status = new ParameterStatus[BinaryStatus.Length];
        Array.Fill(status, ParameterStatus.Derived);
        status[(int)MaterialParameter.HeavyHoleMass] = heavyHole is null ? ParameterStatus.NotAvailable : ParameterStatus.Derived;
        status[(int)MaterialParameter.LightHoleMass] = lightHole is null ? ParameterStatus.NotAvailable : ParameterStatus.Derived;
        return Checked(name, gap0, alpha, beta, electronMass, vbo, latticeNanometres, heavyHole, lightHole, gammaLowest, source, status);
    }

    private static Material Checked(string name, double bandGapAtZeroKelvinElectronVolts, double varshniAlphaElectronVoltsPerKelvin,
        double varshniBetaKelvin, double electronMassElectronMasses, double valenceBandOffsetElectronVolts,
        double latticeConstantNanometres, double? heavyHoleMassElectronMasses, double? lightHoleMassElectronMasses,
        bool isGammaValleyLowest, string source, ParameterStatus[] status)
    {
        Preconditions.CheckPositiveFinite(bandGapAtZeroKelvinElectronVolts);
        Preconditions.CheckNonNegativeFinite(varshniAlphaElectronVoltsPerKelvin);
        Preconditions.CheckPositiveFinite(varshniBetaKelvin);
        Preconditions.CheckPositiveFinite(electronMassElectronMasses);
        Preconditions.CheckFinite(valenceBandOffsetElectronVolts);
        Preconditions.CheckPositiveFinite(latticeConstantNanometres);
        if (heavyHoleMassElectronMasses is { } hh)
        {
            Preconditions.CheckPositiveFinite(hh, nameof(heavyHoleMassElectronMasses));
        }
        if (lightHoleMassElectronMasses is { } lh)
        {
            Preconditions.CheckPositiveFinite(lh, nameof(lightHoleMassElectronMasses));
        }
        return new Material(name, bandGapAtZeroKelvinElectronVolts, varshniAlphaElectronVoltsPerKelvin, varshniBetaKelvin,
            electronMassElectronMasses, valenceBandOffsetElectronVolts, latticeConstantNanometres, heavyHoleMassElectronMasses,
            lightHoleMassElectronMasses, isGammaValleyLowest, source, status);
    }

    private static Material Binary(string name, double gap0, double alpha, double beta, double electronMass, double vbo,
        double latticeNanometres, double gamma1, double gamma2, bool gammaLowest, double permittivity) =>
        new(name, gap0, alpha, beta, electronMass, vbo, latticeNanometres, 1.0 / (gamma1 - 2 * gamma2), 1.0 / (gamma1 + 2 * gamma2),
            gammaLowest, TableSource, BinaryStatus)
        { StaticRelativePermittivity = permittivity };

    private Material Override(MaterialParameter parameter, double? gap0 = null, double? electronMass = null, double? vbo = null,
        double? lattice = null, double? heavyHole = null, double? lightHole = null)
    {
        var status = (ParameterStatus[])_status.Clone();
        status[(int)parameter] = ParameterStatus.CallerSupplied;
        return new Material(Name, gap0 ?? BandGapAtZeroKelvinElectronVolts, VarshniAlphaElectronVoltsPerKelvin, VarshniBetaKelvin,
            electronMass ?? ElectronMassElectronMasses, vbo ?? ValenceBandOffsetElectronVolts, lattice ?? LatticeConstantNanometres,
            heavyHole ?? HeavyHoleMassElectronMasses, lightHole ?? LightHoleMassElectronMasses, IsGammaValleyLowest, Source, status)
        { StaticRelativePermittivity = StaticRelativePermittivity };
    }

    private static void CheckName(string name)
    {
        if (string.IsNullOrWhiteSpace(name))
        {
            throw new ArgumentException($"name must be a non-empty material name; got {(name is null ? "null" : "\"" + name + "\"")}.", nameof(name));
        }
    }

    private void Line(StringBuilder text, string label, string value, MaterialParameter parameter)
    {
        var status = StatusOf(parameter);
        text.AppendLine().Append(CultureInfo.InvariantCulture,
            $"  {label,-14} {(status == ParameterStatus.NotAvailable ? "n/a" : value),-14} [{status}]");
    }
}
