// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Numerics;
using Periodic.Properties;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// Intersubband absorption α(ħω) of a stack for light polarised along the growth axis: the lines of an
/// <see cref="IntersubbandSpectrum"/> weighted by the electrons in each level at the temperature, broadened by a
/// Lorentzian or Gaussian of a given FWHM. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Formula (Fermi's golden rule for the field along z; e.g. M. Helm, in Semiconductors and Semimetals vol. 62,
/// 2000): α(ħω)·L = (e²ω/(n c ε₀)) π Σ |z_if|² (n_i − n_f) g(ħω − E_if), with sheet densities n_i from each level's
/// in-plane 2D density of states ⟨m⟩_i m₀/(πħ²) (spin included) and Fermi–Dirac occupation,
/// n_i = (⟨m⟩_i m₀ kT/(πħ²)) ln(1 + e^((E_F − E_i)/kT)); g is the unit-area line shape; L is the stack thickness, so α is
/// the average over the stack. Only bound levels hold electrons: the continuum's share is neglected, which the result
/// warns about when E_F lies within 5 kT of the lead band edge or above it.</para>
/// <para>Depolarisation (plasma) shift, on request: Ẽ² = E²(1 + α_dep), α_dep = 2e²(n_i − n_f)S/(ε ε₀ E),
/// S = ∫(∫_{−∞}^z ψ_iψ_f dz′)² dz (T. Ando, A. B. Fowler, F. Stern, Rev. Mod. Phys. 54, 437 (1982); S. J. Allen, D. C. Tsui,
/// B. Vinter, Solid State Commun. 20, 425 (1976)), each line on its own (no coupling between lines, no exciton-like
/// correction). Bound-to-bound lines only.</para>
/// <para>Not modelled: non-parabolic in-plane dispersion (all in-plane masses equal for a line), many-body shifts other
/// than the depolarisation, scattering-dependent line shapes. The line width is an input, not a prediction.</para>
/// </remarks>
public sealed class AbsorptionSpectrum
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>Fine-structure constant e²/(4πε₀ħc).</summary>
    private const double FineStructure = PhysicalConstants.ElementaryChargeCoulombs * PhysicalConstants.ElementaryChargeCoulombs
        / (4 * Math.PI * PhysicalConstants.VacuumPermittivityFaradsPerMetre * PhysicalConstants.ReducedPlanckJouleSeconds * PhysicalConstants.SpeedOfLightMetresPerSecond);

    private readonly AbsorptionLine[] _lines;
    private readonly double[] _occupations;
    private readonly string[] _warnings;

    private AbsorptionSpectrum(IntersubbandSpectrum spectrum, AbsorptionOptions options, double fermi, double[] occupations, AbsorptionLine[] lines, string[] warnings)
    {
        Spectrum = spectrum;
        Options = options;
        FermiLevelElectronVolts = fermi;
        _occupations = occupations;
        _lines = lines;
        _warnings = warnings;
        Occupations = new ReadOnlyCollection<double>(occupations);
        Lines = new ReadOnlyCollection<AbsorptionLine>(lines);
        Warnings = new ReadOnlyCollection<string>(warnings);
        SheetDensityPerSquareCentimetre = occupations.Sum();
    }

    /// <summary>The levels and transitions this spectrum is built from.</summary>
    public IntersubbandSpectrum Spectrum { get; }

    /// <summary>The conditions.</summary>
    public AbsorptionOptions Options { get; }

    /// <summary>The Fermi level, eV (given, or found from the sheet density).</summary>
    public double FermiLevelElectronVolts { get; }

    /// <summary>Electrons in all bound levels, per cm².</summary>
    public double SheetDensityPerSquareCentimetre { get; }

    /// <summary>Electrons per cm² in each bound level (index 0 = level 1).</summary>
    public IReadOnlyList<double> Occupations { get; }

    /// <summary>The lines: every resolved transition from a bound level, ordered as <see cref="IntersubbandSpectrum.Transitions"/>.</summary>
    public IReadOnlyList<AbsorptionLine> Lines { get; }

    /// <summary>Where the model is stretched (Fermi level near the continuum, lines left out as unresolved). Empty when none.</summary>
    public IReadOnlyList<string> Warnings { get; }

    /// <summary>The length α is averaged over: the stack thickness, nm.</summary>
    public double ThicknessNanometres => Spectrum.Stack.Thickness.Nanometres;

    /// <summary>
    /// Computes the spectrum of <paramref name="spectrum"/> with <paramref name="sheetDensityPerSquareCentimetre"/> electrons
    /// in the whole stack (summed over its levels; the Fermi level follows from it) under <paramref name="options"/>.
    /// </summary>
    /// <param name="spectrum">The levels and transitions.</param>
    /// <param name="sheetDensityPerSquareCentimetre">Electrons per cm², in (0, 1e15].</param>
    /// <param name="options">Temperature, line shape and the rest; null for <see cref="AbsorptionOptions.Default"/>.</param>
    /// <exception cref="ArgumentNullException"><paramref name="spectrum"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The density is out of range.</exception>
    public static AbsorptionSpectrum Compute(IntersubbandSpectrum spectrum, double sheetDensityPerSquareCentimetre, AbsorptionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(spectrum);
        if (!(sheetDensityPerSquareCentimetre > 0 && sheetDensityPerSquareCentimetre <= 1e15))
        {
            throw new ArgumentOutOfRangeException(nameof(sheetDensityPerSquareCentimetre), sheetDensityPerSquareCentimetre,
                $"sheetDensityPerSquareCentimetre must lie in (0, 1e15] per cm²; got {Preconditions.Format(sheetDensityPerSquareCentimetre)}.");
        }
        return ComputeCore(spectrum, sheetDensityPerSquareCentimetre, null, options ?? AbsorptionOptions.Default);
    }

    /// <summary>
    /// Computes the spectrum of <paramref name="spectrum"/> with its levels filled up to <paramref name="fermiLevelElectronVolts"/>
    /// under <paramref name="options"/>.
    /// </summary>
    /// <param name="spectrum">The levels and transitions.</param>
    /// <param name="fermiLevelElectronVolts">The Fermi level, eV on the stack's energy scale; finite.</param>
    /// <param name="options">Temperature, line shape and the rest; null for <see cref="AbsorptionOptions.Default"/>.</param>
    /// <exception cref="ArgumentNullException"><paramref name="spectrum"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The Fermi level is not finite.</exception>
    public static AbsorptionSpectrum ComputeAtFermiLevel(IntersubbandSpectrum spectrum, double fermiLevelElectronVolts, AbsorptionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(spectrum);
        if (!double.IsFinite(fermiLevelElectronVolts))
        {
            throw new ArgumentOutOfRangeException(nameof(fermiLevelElectronVolts), fermiLevelElectronVolts,
                $"fermiLevelElectronVolts must be finite; got {Preconditions.Format(fermiLevelElectronVolts)}.");
        }
        return ComputeCore(spectrum, null, fermiLevelElectronVolts, options ?? AbsorptionOptions.Default);
    }

    private static AbsorptionSpectrum ComputeCore(IntersubbandSpectrum spectrum, double? sheetDensity, double? givenFermiLevel, AbsorptionOptions options)
    {
        var kt = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * options.TemperatureKelvin;
        var nb = spectrum.BoundCount;
        var dos = new double[nb]; // per eV per cm²
        for (var i = 0; i < nb; i++)
        {
            dos[i] = spectrum.Levels[i].MeanMassElectronMasses / (2 * Math.PI * C) * 1e14;
        }
        double Density(double fermi)
        {
            double sum = 0;
            for (var i = 0; i < nb; i++)
            {
                sum += dos[i] * kt * Periodic.Numerics.ElementaryFunctions.Softplus((fermi - spectrum.Levels[i].EnergyElectronVolts) / kt);
            }
            return sum;
        }
        double fermiLevel;
        if (givenFermiLevel is { } given)
        {
            fermiLevel = given;
        }
        else
        {
            var target = sheetDensity!.Value;
            var lo = spectrum.Levels[0].EnergyElectronVolts - 1;
            while (Density(lo) > target)
            {
                lo -= 1;
            }
            var hi = spectrum.Levels[0].EnergyElectronVolts + target / dos.Sum() + 1;
            while (Density(hi) < target)
            {
                hi += 1;
            }
            var function = new DensityFunction(Density, target);
            var root = RootFinding.Brent(ref function, lo, hi, 1e-15, 4e-16, 300);
            fermiLevel = root.Root;
        }
        var occupations = new double[nb];
        for (var i = 0; i < nb; i++)
        {
            occupations[i] = dos[i] * kt * Periodic.Numerics.ElementaryFunctions.Softplus((fermiLevel - spectrum.Levels[i].EnergyElectronVolts) / kt);
        }

        var warnings = new List<string>();
        var edge = spectrum.BoundStates.ContinuumEdgeElectronVolts;
        if (fermiLevel > edge - 5 * kt)
        {
            warnings.Add(fermiLevel > edge
                ? string.Create(CultureInfo.InvariantCulture,
                    $"the Fermi level {fermiLevel:G6} eV lies {fermiLevel - edge:G4} eV above the continuum edge {edge:G6} eV: electrons in the continuum are not counted, so the bound levels hold far fewer electrons than such a Fermi level puts in a real structure.")
                : string.Create(CultureInfo.InvariantCulture,
                    $"the Fermi level {fermiLevel:G6} eV lies within 5 kT of the continuum edge {edge:G6} eV: electrons in the continuum are not counted."));
        }
        var permittivity = options.RelativePermittivity ?? options.RefractiveIndex * options.RefractiveIndex;
        var lines = new List<AbsorptionLine>();
        var unresolved = 0;
        foreach (var transition in spectrum.Transitions)
        {
            if (!transition.IsResolved)
            {
                unresolved++;
                continue;
            }
            var i = transition.From - 1;
            var f = transition.To - 1;
            if (i >= nb)
            {
                continue; // between two quasi-bound levels: neither is occupied in this model
            }
            var difference = occupations[i] - (f < nb ? occupations[f] : 0);
            var bare = transition.EnergyElectronVolts;
            var shift = 0.0;
            if (options.Depolarisation && f < nb && difference != 0)
            {
                var s = DepolarisationLength(spectrum, i, f) * 1e-9; // m
                var alpha = 2 * PhysicalConstants.ElementaryChargeCoulombs * difference * 1e4 * s
                    / (permittivity * PhysicalConstants.VacuumPermittivityFaradsPerMetre * bare);
                shift = bare * Math.Sqrt(1 + alpha) - bare;
            }
            var z = transition.DipoleNanometres;
            var integrated = 4 * Math.PI * Math.PI * FineStructure / options.RefractiveIndex * (bare + shift) * z * z * difference * 1e-14;
            lines.Add(new AbsorptionLine(transition.From, transition.To, bare, shift, difference, z, integrated));
        }
        if (unresolved > 0)
        {
            warnings.Add(string.Create(CultureInfo.InvariantCulture, $"{unresolved} unresolved transition(s) left out (see the transitions' Status)."));
        }
        return new AbsorptionSpectrum(spectrum, options, fermiLevel, occupations, [.. lines], [.. warnings]);
    }

    private readonly struct DensityFunction(Func<double, double> density, double target) : IRealFunction
    {
        public double Evaluate(double x) => density(x) - target;
    }

    /// <summary>
    /// S = ∫F² dz, F(z) = ∫_{−∞}^z ψ_iψ_f, nm: the lead tails in closed form (F = P e^{Kz}/K on the left, −P e^{−K(z−L)}/K on the
    /// right, the total overlap being zero), each element by the kernel (<see cref="Transfer.CompiledCell.CumulativeSquare"/>).
    /// </summary>
    internal static double DepolarisationLength(IntersubbandSpectrum spectrum, int i, int f)
    {
        var a = spectrum.States[i];
        var b = spectrum.States[f];
        var kernel = a.Kernel;
        var n = kernel.Count;
        double kl = a.LeftDecayPerNanometre + b.LeftDecayPerNanometre;
        double kr = a.RightDecayPerNanometre + b.RightDecayPerNanometre;
        var pl = a.Psi[0] * b.Psi[0];
        var pr = a.Psi[n] * b.Psi[n];
        var s = pl * pl / (2 * kl * kl * kl) + pr * pr / (2 * kr * kr * kr);
        var cumulative = pl / kl;
        for (var j = 0; j < n; j++)
        {
            var ends = (a.Ends(j), b.Ends(j));
            s += kernel.CumulativeSquare(j, a.EnergyElectronVolts, ends.Item1, b.EnergyElectronVolts, ends.Item2, cumulative);
            cumulative += kernel.PairIntegrals(j, a.EnergyElectronVolts, ends.Item1, b.EnergyElectronVolts, ends.Item2).Overlap;
        }
        return s;
    }

    /// <summary>α at photon energy <paramref name="photonEnergyElectronVolts"/>, 1/cm, averaged over the stack thickness.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not positive and finite.</exception>
    public double AbsorptionPerCentimetre(double photonEnergyElectronVolts)
    {
        Preconditions.CheckPositiveFinite(photonEnergyElectronVolts);
        return Absorbance(photonEnergyElectronVolts) / (ThicknessNanometres * 1e-7);
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = AbsorptionPerCentimetre(photonEnergiesElectronVolts[i])</c>. Does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException"><paramref name="destinationPerCentimetre"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not positive and finite (the message names its index).</exception>
    public void Evaluate(ReadOnlySpan<double> photonEnergiesElectronVolts, Span<double> destinationPerCentimetre)
    {
        Preconditions.CheckDestination(photonEnergiesElectronVolts.Length, destinationPerCentimetre.Length, nameof(photonEnergiesElectronVolts), nameof(destinationPerCentimetre));
        for (var k = 0; k < photonEnergiesElectronVolts.Length; k++)
        {
            var e = photonEnergiesElectronVolts[k];
            if (!(e > 0 && double.IsFinite(e)))
            {
                throw new ArgumentOutOfRangeException(nameof(photonEnergiesElectronVolts), e, string.Create(CultureInfo.InvariantCulture,
                    $"photonEnergiesElectronVolts[{k}] must be a positive finite energy in eV; got {Preconditions.Format(e)}."));
            }
        }
        for (var k = 0; k < photonEnergiesElectronVolts.Length; k++)
        {
            destinationPerCentimetre[k] = Absorbance(photonEnergiesElectronVolts[k]) / (ThicknessNanometres * 1e-7);
        }
    }

    /// <summary>
    /// The fraction of the light absorbed in one pass through <see cref="AbsorptionOptions.PassRepeats"/> copies of the stack,
    /// 1 − exp(−repeats·αL), for the optical field entirely along the growth axis (an oblique pass needs its own geometric factor).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not positive and finite.</exception>
    public double PassAbsorption(double photonEnergyElectronVolts)
    {
        Preconditions.CheckPositiveFinite(photonEnergyElectronVolts);
        // 1 − e^{−x} = 2 tanh(x/2)/(1 + tanh(x/2)), exact to rounding for every x ≥ 0 (MathNet 5.0's Expm1 was measured
        // 1.3e-7 relative off at x = 0.0625, so it is not used here).
        var t = Math.Tanh(0.5 * Options.PassRepeats * Absorbance(photonEnergyElectronVolts));
        return 2 * t / (1 + t);
    }

    private double Absorbance(double e)
    {
        double sum = 0;
        var width = Options.LinewidthElectronVolts;
        foreach (var line in _lines)
        {
            // ∫αL per line was taken with ω at the centre; α ∝ ω across the line.
            var weight = line.IntegratedAbsorbanceElectronVolts * e / line.EnergyElectronVolts;
            sum += weight * Shape(e - line.EnergyElectronVolts, width, Options.Shape);
        }
        return sum;
    }

    /// <summary>Unit-area line shape of FWHM <paramref name="width"/> at detuning <paramref name="detuning"/>, 1/eV.</summary>
    internal static double Shape(double detuning, double width, LineShape shape)
    {
        if (shape == LineShape.Lorentzian)
        {
            var half = 0.5 * width;
            return half / Math.PI / (detuning * detuning + half * half);
        }
        var sigma = width / (2 * Math.Sqrt(2 * Math.Log(2)));
        return Math.Exp(-0.5 * detuning * detuning / (sigma * sigma)) / (sigma * Math.Sqrt(2 * Math.PI));
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"Absorption at {Options.TemperatureKelvin:G6} K, E_F = {FermiLevelElectronVolts:G8} eV, {SheetDensityPerSquareCentimetre:G4} cm^-2, FWHM {Options.LinewidthElectronVolts * 1000:G4} meV ({Options.Shape})");
        foreach (var line in _lines)
        {
            text.AppendLine().Append("  ").Append(line);
        }
        foreach (var warning in _warnings)
        {
            text.AppendLine().Append("  warning: ").Append(warning);
        }
        return text.ToString();
    }
}
