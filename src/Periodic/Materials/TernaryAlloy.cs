// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Materials;

/// <summary>
/// A ternary alloy A_xB_{1−x}C between two binaries, with bowing: P(x) = x·P_A + (1 − x)·P_B − x(1 − x)·b.
/// The gap bowing may depend on composition, b_g(x) = b₀ + b₁·x (needed for AlGaAs). Immutable;
/// every bowing parameter and endpoint can be replaced with a <c>With…</c> copy.
/// </summary>
/// <remarks>
/// <para>Interpolation follows I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys. 89,
/// 5815 (2001); the bowing values built in are recalled <b>from memory</b> of that paper. Choices of
/// ours, stated so nothing is hidden: the lattice constant follows Vegard's law (no bowing); the
/// Varshni α and β are interpolated linearly (at 300 K this differs from interpolating the binaries'
/// Eg(T) by well under 1 meV for Al0.3Ga0.7As); the inverse hole masses are interpolated linearly,
/// which is what linear interpolation of the Luttinger parameters γ1, γ2 gives along [001].</para>
/// <para>The Γ valley is the lowest conduction minimum only for x inside
/// [<see cref="DirectCompositionMinimum"/>, <see cref="DirectCompositionMaximum"/>]; outside, the built
/// material reports <see cref="Material.IsGammaValleyLowest"/> = false and the structure builder warns.</para>
/// </remarks>
public sealed class TernaryAlloy
{
    private TernaryAlloy(string name, string formulaA, string formulaB, string anion, Material atOne, Material atZero,
        double gapBowing0, double gapBowing1, double massBowing, double vboBowing, double directMin, double directMax, string source)
    {
        Name = name;
        _formulaA = formulaA;
        _formulaB = formulaB;
        _anion = anion;
        MaterialAtOne = atOne;
        MaterialAtZero = atZero;
        GapBowingElectronVolts = gapBowing0;
        GapBowingSlopeElectronVolts = gapBowing1;
        ElectronMassBowingElectronMasses = massBowing;
        ValenceBandOffsetBowingElectronVolts = vboBowing;
        DirectCompositionMinimum = directMin;
        DirectCompositionMaximum = directMax;
        Source = source;
    }

    private readonly string _formulaA;
    private readonly string _formulaB;
    private readonly string _anion;

    /// <summary>
    /// Al_xGa_{1−x}As (x = Al fraction). Bowing from memory of Vurgaftman et al. (2001): Γ gap
    /// b = −0.127 + 1.310x eV; mass and VBO linear. Γ is the lowest conduction minimum for x below
    /// about 0.45 (M. Levinshtein, S. Rumyantsev and M. Shur (eds.), Handbook Series on
    /// Semiconductor Parameters, vol. 2, World Scientific 1999; crossover value from memory).
    /// </summary>
    public static TernaryAlloy AlGaAs { get; } = new("AlGaAs", "Al", "Ga", "As", Material.AlAs, Material.GaAs,
        -0.127, 1.310, 0, 0, 0, 0.45,
        "Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), bowing from memory; Gamma-X crossover x = 0.45 from memory");

    /// <summary>
    /// In_xGa_{1−x}As (x = In fraction; x = 0.53 is lattice-matched to InP). Bowing from memory of
    /// Vurgaftman et al. (2001): Γ gap 0.477 eV, electron mass 0.0091 m₀, VBO −0.38 eV. Direct for all x.
    /// </summary>
    public static TernaryAlloy InGaAs { get; } = new("InGaAs", "In", "Ga", "As", Material.InAs, Material.GaAs,
        0.477, 0, 0.0091, -0.38, 0, 1,
        "Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), bowing from memory");

    /// <summary>
    /// In_xAl_{1−x}As (x = In fraction; x = 0.52 is lattice-matched to InP). Bowing <b>from memory</b>
    /// of Vurgaftman et al. (2001), less sure than for AlGaAs and InGaAs: Γ gap 0.70 eV, electron mass
    /// 0.049 m₀, VBO −0.64 eV. Γ taken as the lowest conduction minimum for x above about 0.3 (Al-rich
    /// InAlAs is indirect; crossover from memory, uncertain).
    /// </summary>
    public static TernaryAlloy InAlAs { get; } = new("InAlAs", "In", "Al", "As", Material.InAs, Material.AlAs,
        0.70, 0, 0.049, -0.64, 0.3, 1,
        "Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), bowing from memory (less certain); Gamma-X crossover x = 0.3 from memory");

    /// <summary>The alloy's name, e.g. "AlGaAs".</summary>
    public string Name { get; }

    /// <summary>The binary at x = 1 (AlAs for AlGaAs, InAs for InGaAs and InAlAs).</summary>
    public Material MaterialAtOne { get; }

    /// <summary>The binary at x = 0 (GaAs for AlGaAs and InGaAs, AlAs for InAlAs).</summary>
    public Material MaterialAtZero { get; }

    /// <summary>Composition-independent part b₀ of the Γ-gap bowing b_g(x) = b₀ + b₁·x.</summary>
    public Energy GapBowing => Energy.FromElectronVolts(GapBowingElectronVolts);

    /// <summary>Composition slope b₁ of the Γ-gap bowing b_g(x) = b₀ + b₁·x.</summary>
    public Energy GapBowingSlope => Energy.FromElectronVolts(GapBowingSlopeElectronVolts);

    internal double GapBowingElectronVolts { get; }

    internal double GapBowingSlopeElectronVolts { get; }

    /// <summary>Bowing of the conduction-band mass, m₀.</summary>
    public double ElectronMassBowingElectronMasses { get; }

    /// <summary>Bowing of the valence-band offset.</summary>
    public Energy ValenceBandOffsetBowing => Energy.FromElectronVolts(ValenceBandOffsetBowingElectronVolts);

    internal double ValenceBandOffsetBowingElectronVolts { get; }

    /// <summary>Lowest x at which Γ is the lowest conduction minimum.</summary>
    public double DirectCompositionMinimum { get; }

    /// <summary>Highest x at which Γ is the lowest conduction minimum.</summary>
    public double DirectCompositionMaximum { get; }

    /// <summary>Where the bowing values came from, in words.</summary>
    public string Source { get; }

    /// <summary>The alloy at composition x (0 ≤ x ≤ 1), with every parameter interpolated as described on the type.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="composition"/> is outside [0, 1].</exception>
    public Material At(double composition)
    {
        Preconditions.CheckRange(composition, 0.0, 1.0);
        double x = composition, y = 1 - composition, xy = x * y;
        Material a = MaterialAtOne, b = MaterialAtZero;
        var gap = x * a.BandGapAtZeroKelvinElectronVolts + y * b.BandGapAtZeroKelvinElectronVolts
            - xy * (GapBowingElectronVolts + GapBowingSlopeElectronVolts * x);
        var alpha = x * a.VarshniAlphaElectronVoltsPerKelvin + y * b.VarshniAlphaElectronVoltsPerKelvin;
        var beta = x * a.VarshniBetaKelvin + y * b.VarshniBetaKelvin;
        var mass = x * a.ElectronMassElectronMasses + y * b.ElectronMassElectronMasses - xy * ElectronMassBowingElectronMasses;
        var vbo = x * a.ValenceBandOffsetElectronVolts + y * b.ValenceBandOffsetElectronVolts - xy * ValenceBandOffsetBowingElectronVolts;
        var lattice = x * a.LatticeConstantNanometres + y * b.LatticeConstantNanometres;
        double? heavy = InverseInterpolate(x, a.HeavyHoleMassElectronMasses, b.HeavyHoleMassElectronMasses);
        double? light = InverseInterpolate(x, a.LightHoleMassElectronMasses, b.LightHoleMassElectronMasses);
        var direct = x >= DirectCompositionMinimum && x <= DirectCompositionMaximum;
        if (!(gap > 0 && mass > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(composition), composition,
                $"composition = {Preconditions.Format(composition)} gives a gap of {Preconditions.Format(gap)} eV and a mass of {Preconditions.Format(mass)} m0 for {Name}; the bowing parameters must keep both positive.");
        }
        double? permittivity = a.StaticRelativePermittivity is { } ea && b.StaticRelativePermittivity is { } eb ? x * ea + y * eb : null;
        return Material.Derived(FormulaAt(x), gap, alpha, beta, mass, vbo, lattice, heavy, light, direct, Source).WithInterpolatedPermittivity(permittivity);
    }

    /// <summary>A copy with another Γ-gap bowing b_g(x) = b₀ + b₁·x (either may be negative).</summary>
    /// <param name="gapBowing">b₀.</param>
    /// <param name="gapBowingSlope">b₁ (default 0: a composition-independent bowing).</param>
    public TernaryAlloy WithGapBowing(Energy gapBowing, Energy gapBowingSlope = default) =>
        new(Name, _formulaA, _formulaB, _anion, MaterialAtOne, MaterialAtZero, gapBowing.ElectronVolts,
            gapBowingSlope.ElectronVolts, ElectronMassBowingElectronMasses, ValenceBandOffsetBowingElectronVolts,
            DirectCompositionMinimum, DirectCompositionMaximum, Source + "; gap bowing from caller");

    /// <summary>A copy with another electron-mass bowing, m₀.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is not finite.</exception>
    public TernaryAlloy WithElectronMassBowing(double electronMassBowingElectronMasses) =>
        new(Name, _formulaA, _formulaB, _anion, MaterialAtOne, MaterialAtZero, GapBowingElectronVolts, GapBowingSlopeElectronVolts,
            Preconditions.CheckFinite(electronMassBowingElectronMasses), ValenceBandOffsetBowingElectronVolts,
            DirectCompositionMinimum, DirectCompositionMaximum, Source + "; mass bowing from caller");

    /// <summary>A copy with another valence-band-offset bowing (it may be negative).</summary>
    public TernaryAlloy WithValenceBandOffsetBowing(Energy valenceBandOffsetBowing) =>
        new(Name, _formulaA, _formulaB, _anion, MaterialAtOne, MaterialAtZero, GapBowingElectronVolts, GapBowingSlopeElectronVolts,
            ElectronMassBowingElectronMasses, valenceBandOffsetBowing.ElectronVolts,
            DirectCompositionMinimum, DirectCompositionMaximum, Source + "; VBO bowing from caller");

    /// <summary>A copy with other endpoint binaries (for example with an overridden parameter).</summary>
    /// <exception cref="ArgumentNullException">An endpoint is null.</exception>
    public TernaryAlloy WithEndpoints(Material materialAtOne, Material materialAtZero)
    {
        ArgumentNullException.ThrowIfNull(materialAtOne);
        ArgumentNullException.ThrowIfNull(materialAtZero);
        return new(Name, _formulaA, _formulaB, _anion, materialAtOne, materialAtZero, GapBowingElectronVolts, GapBowingSlopeElectronVolts,
            ElectronMassBowingElectronMasses, ValenceBandOffsetBowingElectronVolts, DirectCompositionMinimum, DirectCompositionMaximum,
            Source + "; endpoints from caller");
    }

    /// <summary>A copy with another composition range [minimum, maximum] in which Γ is the lowest conduction minimum.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A bound is outside [0, 1], or minimum exceeds maximum.</exception>
    public TernaryAlloy WithDirectCompositionRange(double minimum, double maximum)
    {
        Preconditions.CheckRange(minimum, 0.0, 1.0);
        Preconditions.CheckRange(maximum, minimum, 1.0);
        return new(Name, _formulaA, _formulaB, _anion, MaterialAtOne, MaterialAtZero, GapBowingElectronVolts, GapBowingSlopeElectronVolts,
            ElectronMassBowingElectronMasses, ValenceBandOffsetBowingElectronVolts, minimum, maximum, Source);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{_formulaA}x{_formulaB}(1-x){_anion}: gap bowing {GapBowingElectronVolts:G4} + {GapBowingSlopeElectronVolts:G4} x eV, mass bowing {ElectronMassBowingElectronMasses:G4} m0, VBO bowing {ValenceBandOffsetBowingElectronVolts:G4} eV");

    private string FormulaAt(double x) =>
        string.Create(CultureInfo.InvariantCulture, $"{_formulaA}{x:0.####}{_formulaB}{1 - x:0.####}{_anion}");

    private static double? InverseInterpolate(double x, double? a, double? b) =>
        a is { } ma && b is { } mb ? 1.0 / (x / ma + (1 - x) / mb) : null;
}
