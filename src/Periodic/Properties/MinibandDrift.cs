// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Bands;
using Periodic.Units;

namespace Periodic.Properties;

/// <summary>
/// The drift velocity of carriers in one miniband under a uniform electric field F, from the band's true E(k) in the
/// relaxation-time approximation: the Esaki–Tsu negative differential velocity, generalised to any band shape.
/// </summary>
/// <remarks>
/// <para>Method: the band is the cosine series E(k) = Σ_j t_j cos(jkd) (<see cref="TightBindingBand"/>; J_j = −t_j/2 in the
/// convention E = E₀ − Σ 2J_j cos(jkd)). The stationary Boltzmann equation with one relaxation time τ back to the
/// equilibrium occupation f₀, (eF/ħ)∂f/∂k = −(f − f₀)/τ, is solved by f(k) = ∫₀^∞ (ds/τ) e^(−s/τ) f₀(k − eFs/ħ), which gives
/// v_d = Σ_j (2 j d J_j/ħ)·c_j·(jω_Bτ)/(1 + (jω_Bτ)²), ω_B = eFd/ħ, c_j = ⟨cos(jkd)⟩ over f₀. The velocity is the
/// component along the force on the carrier. For a cosine band with every carrier at its bottom (c₁ = 1) this is the
/// Esaki–Tsu result v = (Δd/2ħ)·ω_Bτ/(1 + (ω_Bτ)²) (L. Esaki and R. Tsu, IBM J. Res. Dev. 14, 61 (1970)).</para>
/// <para>Occupation: T = 0 puts every carrier at the band bottom (c_j = cos(j k_b d), Esaki and Tsu's assumption); T &gt; 0 is
/// the non-degenerate Boltzmann occupation f₀ ∝ e^(−E(k)/k_BT), for which the cosine band gives c₁ = I₁(Δ/2k_BT)/I₀(Δ/2k_BT)
/// (A. A. Ignatov and Yu. A. Romanov, Phys. Status Solidi B 73, 327 (1976) [from memory]). A uniformly occupied band
/// (k_BT ≫ Δ) carries no current at all (every c_j → 0).</para>
/// <para>Limits: one miniband (no Zener tunnelling to the next: the field is refused when eFd exceeds the gap above the
/// band), one relaxation time for energy and momentum, no scattering details, no space charge or field domains, a
/// non-degenerate carrier gas. A guide to compare designs; measured velocities depend on the scattering.</para>
/// </remarks>
public sealed class MinibandDrift
{
    private readonly double[] _coefficients;
    private readonly double[] _occupation;
    private readonly double[] _amplitudes; // (−j d t_j/ħ)·c_j in m/s

    private MinibandDrift(int bandIndex, double period, double[] coefficients, double tau, double temperature, double gapAbove)
    {
        BandIndex = bandIndex;
        PeriodNanometres = period;
        ScatteringTimeSeconds = tau;
        TemperatureKelvin = temperature;
        GapAboveElectronVolts = gapAbove;
        _coefficients = coefficients;
        CoefficientsElectronVolts = new ReadOnlyCollection<double>(coefficients);
        _occupation = Occupation(coefficients, temperature);
        OccupationFactors = new ReadOnlyCollection<double>(_occupation);
        _amplitudes = new double[coefficients.Length];
        for (var j = 1; j < coefficients.Length; j++)
        {
            _amplitudes[j] = -j * period * PhysicalConstants.MetresPerNanometre * coefficients[j] / PhysicalConstants.ReducedPlanckElectronVoltSeconds * _occupation[j];
        }
        (PeakFieldVoltsPerMetre, PeakVelocityMetresPerSecond) = FindPeak();
    }

    /// <summary>The band, from 1 (0 for a band given by its coefficients).</summary>
    public int BandIndex { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>The relaxation time τ, s.</summary>
    public double ScatteringTimeSeconds { get; }

    /// <summary>The temperature of the occupation, K (0: every carrier at the band bottom).</summary>
    public double TemperatureKelvin { get; }

    /// <summary>The gap above the band, eV (+∞ when not known): fields with eFd beyond it are refused.</summary>
    public double GapAboveElectronVolts { get; }

    /// <summary>t_0, t_1, … in eV: E(k) = Σ_j t_j cos(jkd).</summary>
    public IReadOnlyList<double> CoefficientsElectronVolts { get; }

    /// <summary>c_j = ⟨cos(jkd)⟩ over the equilibrium occupation (c_0 = 1).</summary>
    public IReadOnlyList<double> OccupationFactors { get; }

    /// <summary>The field of the largest drift velocity, V/m.</summary>
    public double PeakFieldVoltsPerMetre { get; }

    /// <summary>The largest drift velocity, m/s.</summary>
    public double PeakVelocityMetresPerSecond { get; }

    /// <summary>The Esaki–Tsu critical field F_c = ħ/(e d τ), where ω_Bτ = 1 (the peak of a cosine band), V/m.</summary>
    public double CriticalFieldVoltsPerMetre => PhysicalConstants.ReducedPlanckElectronVoltSeconds / (PeriodNanometres * PhysicalConstants.MetresPerNanometre * ScatteringTimeSeconds);

    /// <summary>The largest field accepted, V/m: eFd equal to the gap above the band (+∞ when no gap is known).</summary>
    public double MaxFieldVoltsPerMetre => GapAboveElectronVolts / (PeriodNanometres * PhysicalConstants.MetresPerNanometre);

    /// <summary>The drift of band <paramref name="bandIndex"/> of <paramref name="structure"/>.</summary>
    /// <param name="structure">The band structure (its band above must be computed too, for the gap).</param>
    /// <param name="bandIndex">The band, from 1.</param>
    /// <param name="scatteringTimeSeconds">τ &gt; 0, s (typically 0.01–1 ps).</param>
    /// <param name="temperature">T, at most 10,000 K (the default 0 K: carriers at the band bottom, the Esaki–Tsu assumption).</param>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or τ or T out of range.</exception>
    public static MinibandDrift Create(BandStructure structure, int bandIndex, double scatteringTimeSeconds, Temperature temperature = default)
    {
        ArgumentNullException.ThrowIfNull(structure);
        var band = structure.GetBand(bandIndex);
        var temperatureKelvin = CheckArguments(scatteringTimeSeconds, temperature);
        var fit = TightBindingBand.Fit(structure, bandIndex);
        return new MinibandDrift(bandIndex, structure.PeriodNanometres, [.. fit.CoefficientsElectronVolts], scatteringTimeSeconds, temperatureKelvin, band.GapAboveElectronVolts);
    }

    /// <summary>The drift of a band given by its cosine series E(k) = Σ_j t_j cos(jkd) (no gap above is known).</summary>
    /// <param name="coefficientsElectronVolts">t_0, t_1, … in eV; at least two, all finite.</param>
    /// <param name="period">The period d; positive.</param>
    /// <param name="scatteringTimeSeconds">τ &gt; 0, s.</param>
    /// <param name="temperature">T, at most 10,000 K (default 0 K).</param>
    /// <exception cref="ArgumentException">Fewer than two coefficients, or one is not finite.</exception>
    /// <exception cref="ArgumentOutOfRangeException">d, τ or T out of range.</exception>
    public static MinibandDrift FromCosineSeries(ReadOnlySpan<double> coefficientsElectronVolts, Length period, double scatteringTimeSeconds, Temperature temperature = default)
    {
        if (coefficientsElectronVolts.Length < 2)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"coefficientsElectronVolts must hold t_0 and at least t_1; got {coefficientsElectronVolts.Length} value(s)."), nameof(coefficientsElectronVolts));
        }
        for (var j = 0; j < coefficientsElectronVolts.Length; j++)
        {
            if (!double.IsFinite(coefficientsElectronVolts[j]))
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"coefficientsElectronVolts[{j}] must be finite; got {Preconditions.Format(coefficientsElectronVolts[j])}."), nameof(coefficientsElectronVolts));
            }
        }
        var periodNanometres = Preconditions.CheckPositiveFinite(period.Nanometres, nameof(period));
        var temperatureKelvin = CheckArguments(scatteringTimeSeconds, temperature);
        return new MinibandDrift(0, periodNanometres, coefficientsElectronVolts.ToArray(), scatteringTimeSeconds, temperatureKelvin, double.PositiveInfinity);
    }

    private static double CheckArguments(double tau, Temperature temperature)
    {
        Preconditions.CheckRange(tau, 1e-18, 1e-6, "scatteringTimeSeconds");
        return Preconditions.CheckRange(temperature.Kelvin, 0, 1e4, nameof(temperature));
    }

    /// <summary>The Bloch angular frequency ω_B = eFd/ħ at field F, rad/s (the Bloch frequency is eFd/h = ω_B/2π).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The field is out of range (see <see cref="VelocityAt"/>).</exception>
    public double BlochAngularFrequencyAt(double fieldVoltsPerMetre) =>
        CheckField(fieldVoltsPerMetre) * PeriodNanometres * PhysicalConstants.MetresPerNanometre / PhysicalConstants.ReducedPlanckElectronVoltSeconds;

    /// <summary>The drift velocity at field F (V/m), m/s, along the force on the carrier.</summary>
    /// <exception cref="ArgumentOutOfRangeException">F is not finite, negative (give |F|; the velocity follows the force), or eFd exceeds the gap above the band.</exception>
    public double VelocityAt(double fieldVoltsPerMetre)
    {
        var x = BlochAngularFrequencyAt(fieldVoltsPerMetre) * ScatteringTimeSeconds;
        return Velocity(x);
    }

    /// <summary>Effectively computes <c>destination[i] = VelocityAt(fieldsVoltsPerMetre[i])</c> in m/s; does not allocate.</summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a field is out of range.</exception>
    public void VelocitiesAt(ReadOnlySpan<double> fieldsVoltsPerMetre, Span<double> destinationMetresPerSecond)
    {
        Preconditions.CheckDestination(fieldsVoltsPerMetre.Length, destinationMetresPerSecond.Length, nameof(fieldsVoltsPerMetre), nameof(destinationMetresPerSecond));
        for (var i = 0; i < fieldsVoltsPerMetre.Length; i++)
        {
            // All fields are checked before any is written, so a bad one leaves the destination untouched.
            var field = fieldsVoltsPerMetre[i];
            if (!(field >= 0) || double.IsPositiveInfinity(field) || field > MaxFieldVoltsPerMetre)
            {
                throw new ArgumentOutOfRangeException(nameof(fieldsVoltsPerMetre), field, string.Create(CultureInfo.InvariantCulture,
                    $"fieldsVoltsPerMetre[{i}] must be from 0 to {Preconditions.Format(MaxFieldVoltsPerMetre)} V/m (finite, |F|); got {Preconditions.Format(field)}."));
            }
        }
        for (var i = 0; i < fieldsVoltsPerMetre.Length; i++)
        {
            destinationMetresPerSecond[i] = VelocityAt(fieldsVoltsPerMetre[i]);
        }
    }

    /// <summary>The current density e·n·v_d at field F for a carrier density n (1/cm³), A/m².</summary>
    /// <exception cref="ArgumentOutOfRangeException">The field is out of range, or the density is negative or not finite.</exception>
    public double CurrentDensityAmperesPerSquareMetreAt(double fieldVoltsPerMetre, double densityPerCubicCentimetre)
    {
        Preconditions.CheckNonNegativeFinite(densityPerCubicCentimetre);
        return PhysicalConstants.ElementaryChargeCoulombs * densityPerCubicCentimetre * 1e6 * VelocityAt(fieldVoltsPerMetre);
    }

    private double CheckField(double field)
    {
        if (!(field >= 0) || double.IsPositiveInfinity(field) || field > MaxFieldVoltsPerMetre)
        {
            var limit = double.IsFinite(MaxFieldVoltsPerMetre)
                ? string.Create(CultureInfo.InvariantCulture, $" to {Preconditions.Format(MaxFieldVoltsPerMetre)} V/m (eFd up to the {Preconditions.Format(GapAboveElectronVolts)} eV gap above the band; beyond it Zener tunnelling to the next band breaks the single-miniband model)")
                : " and finite";
            throw new ArgumentOutOfRangeException("fieldVoltsPerMetre", field,
                $"fieldVoltsPerMetre must be from 0{limit}; got {Preconditions.Format(field)} (give |F|: the velocity is along the force).");
        }
        return field;
    }

    private double Velocity(double x)
    {
        double sum = 0;
        for (var j = _amplitudes.Length - 1; j >= 1; j--)
        {
            var jx = j * x;
            sum += _amplitudes[j] * jx / (1 + jx * jx);
        }
        return sum;
    }

    /// <summary>c_j = ⟨cos jθ⟩ over f₀ ∝ e^(−(E(θ) − E_min)/k_BT) by the trapezoid rule on [0, π] (spectral for a periodic integrand), or the bottom's cos(jθ_b) at T = 0.</summary>
    private static double[] Occupation(double[] t, double temperature)
    {
        var c = new double[t.Length];
        var kT = temperature * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;
        if (kT == 0)
        {
            double e0 = 0, eb = 0;
            for (var j = 0; j < t.Length; j++)
            {
                e0 += t[j];
                eb += (j % 2 == 0 ? 1 : -1) * t[j];
            }
            var bottomAtBoundary = eb < e0;
            for (var j = 0; j < t.Length; j++)
            {
                c[j] = bottomAtBoundary && j % 2 == 1 ? -1 : 1;
            }
            return c;
        }
        double[]? previous = null;
        for (var m = Math.Max(256, 4 * t.Length); m <= 1 << 20; m *= 2)
        {
            var energies = new double[m + 1];
            var lowest = double.PositiveInfinity;
            for (var i = 0; i <= m; i++)
            {
                var theta = Math.PI * i / m;
                double e = 0;
                for (var j = 0; j < t.Length; j++)
                {
                    e += t[j] * Math.Cos(j * theta);
                }
                energies[i] = e;
                lowest = Math.Min(lowest, e);
            }
            var current = new double[t.Length];
            double norm = 0;
            for (var i = 0; i <= m; i++)
            {
                var w = Math.Exp(-(energies[i] - lowest) / kT) * (i == 0 || i == m ? 0.5 : 1);
                norm += w;
                for (var j = 0; j < t.Length; j++)
                {
                    current[j] += w * Math.Cos(j * Math.PI * i / m);
                }
            }
            for (var j = 0; j < t.Length; j++)
            {
                current[j] /= norm;
            }
            if (previous is not null && current.Zip(previous).All(p => Math.Abs(p.First - p.Second) <= 1e-15))
            {
                return current;
            }
            previous = current;
        }
        return previous!;
    }

    /// <summary>The maximum of v over ω_Bτ: a logarithmic scan, then golden-section search (J. Kiefer, Proc. AMS 4, 502 (1953)).</summary>
    private (double Field, double Velocity) FindPeak()
    {
        var fieldPerX = 1 / (PeriodNanometres * PhysicalConstants.MetresPerNanometre / PhysicalConstants.ReducedPlanckElectronVoltSeconds * ScatteringTimeSeconds);
        var maxX = double.IsFinite(MaxFieldVoltsPerMetre) ? MaxFieldVoltsPerMetre / fieldPerX : 1e4;
        double bestX = 0, best = 0;
        const int points = 400;
        for (var i = 0; i <= points; i++)
        {
            var x = maxX * Math.Pow(1e-8, 1 - (double)i / points);
            var v = Math.Abs(Velocity(x));
            if (v > best)
            {
                (best, bestX) = (v, x);
            }
        }
        if (best == 0)
        {
            return (0, 0);
        }
        double a = bestX / Math.Pow(1e-8, -1.0 / points), b = Math.Min(maxX, bestX * Math.Pow(1e-8, -1.0 / points));
        var golden = (Math.Sqrt(5) - 1) / 2;
        for (var iteration = 0; iteration < 200 && b - a > 1e-15 * b; iteration++)
        {
            double x1 = b - golden * (b - a), x2 = a + golden * (b - a);
            if (Math.Abs(Velocity(x1)) >= Math.Abs(Velocity(x2)))
            {
                b = x2;
            }
            else
            {
                a = x1;
            }
        }
        var peak = 0.5 * (a + b);
        return (peak * fieldPerX, Velocity(peak));
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Miniband drift (band {BandIndex}, d = {PeriodNanometres:G6} nm, tau = {ScatteringTimeSeconds:G4} s, T = {TemperatureKelvin:G4} K): peak {PeakVelocityMetresPerSecond:G6} m/s at {PeakFieldVoltsPerMetre:G6} V/m");
}
