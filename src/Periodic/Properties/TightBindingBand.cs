// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Bands;

namespace Periodic.Properties;

/// <summary>
/// The tight-binding view of one band: the cosine series E_n(k) = Σ_{j≥0} t_j cos(j·k·d) (every band of a
/// one-dimensional crystal is even and 2π/d-periodic in k), with the nearest-neighbour hopping and the
/// error of keeping only the first terms. Immutable.
/// </summary>
/// <remarks>
/// <para>Method: E_n is sampled at the M + 1 Bloch phases θ_m = mπ/M and the coefficients are the discrete
/// cosine transform (type I) of the samples, i.e. the trapezoid rule for t_j = (2/π)∫₀^π E(θ) cos(jθ) dθ,
/// which is spectrally accurate for a smooth periodic function (L. N. Trefethen and J. A. C. Weideman,
/// SIAM Rev. 56, 385 (2014)). t_j is the hopping amplitude to the j-th neighbour cell of the Wannier
/// picture: E(k) = Σ_R e^{ikR}·h(R), t_j = 2h(jd) for j ≥ 1 (Ashcroft and Mermin, ch. 10).</para>
/// <para>M doubles from 32 until the coefficients of M and M/2 samples agree to 1e-13 of the band width
/// (or to 1e-13 of |E|, the noise floor of the sampled energies, for very narrow bands), or M reaches 4096; <see cref="AliasingErrorElectronVolts"/> reports that agreement as the coefficient error.
/// Bands touching a closed gap have a kink at the zone point in this reduced-zone series, so their
/// coefficients fall only as 1/j² and the aliasing error stays visible.</para>
/// </remarks>
public sealed class TightBindingBand
{
    private const int FirstSampleCount = 32;
    private const int MaxSampleCount = 4096;
    private const double TargetRelativeAliasing = 1e-13;
    private const double NoiseFloorRelative = 1e-13;

    private readonly double[] _coefficients;
    private readonly double[] _samples;

    private TightBindingBand(int bandIndex, double period, double[] coefficients, double[] samples, double aliasing)
    {
        BandIndex = bandIndex;
        PeriodNanometres = period;
        _coefficients = coefficients;
        _samples = samples;
        CoefficientsElectronVolts = new ReadOnlyCollection<double>(coefficients);
        AliasingErrorElectronVolts = aliasing;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>t_0 … t_M in eV: E(k) = Σ_j t_j cos(j k d).</summary>
    public IReadOnlyList<double> CoefficientsElectronVolts { get; }

    /// <summary>The number M of sample intervals used (M + 1 energies on [0, π/d]).</summary>
    public int SampleCount => _samples.Length - 1;

    /// <summary>t_0, the band's mean energy over the zone (the on-site energy of the Wannier picture), eV.</summary>
    public double OnSiteEnergyElectronVolts => _coefficients[0];

    /// <summary>
    /// The nearest-neighbour hopping J = −t_1/2 in eV, in the convention E ≈ ε₀ − 2J cos(kd): positive for a band
    /// with its bottom at the zone centre (odd bands), negative for even bands.
    /// </summary>
    public double NearestNeighbourHoppingElectronVolts => -0.5 * _coefficients[1];

    /// <summary>Estimated error of each coefficient from the finite sampling (the change from M/2 to M samples), eV.</summary>
    public double AliasingErrorElectronVolts { get; }

    /// <summary>Computes the cosine series of band <paramref name="bandIndex"/> of <paramref name="structure"/>.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    public static TightBindingBand Fit(BandStructure structure, int bandIndex)
    {
        ArgumentNullException.ThrowIfNull(structure);
        structure.GetBand(bandIndex); // validates the index
        var band = structure.GetBand(bandIndex);
        var d = structure.PeriodNanometres;
        // Stop at 1e-13 of the width, or at the noise floor of the sampled E(k) (the band search resolves
        // energies to about 1e-14 of |E|; 1e-13 of |E| leaves room for the transform's own rounding).
        var target = Math.Max(TargetRelativeAliasing * band.WidthElectronVolts,
            NoiseFloorRelative * Math.Max(Math.Abs(band.BottomElectronVolts), Math.Abs(band.TopElectronVolts)));
        target = Math.Max(target, 1e-300);
        var m = FirstSampleCount;
        var samples = Sample(structure, bandIndex, m, null);
        var coefficients = Transform(samples);
        while (true)
        {
            var finer = Sample(structure, bandIndex, 2 * m, samples);
            var next = Transform(finer);
            var aliasing = 0.0;
            for (var j = 0; j < coefficients.Length - 1; j++)
            {
                aliasing = Math.Max(aliasing, Math.Abs(next[j] - coefficients[j]));
            }
            for (var j = coefficients.Length - 1; j < next.Length; j++)
            {
                aliasing = Math.Max(aliasing, Math.Abs(next[j])); // new terms: not resolved by the coarser grid
            }
            m *= 2;
            samples = finer;
            coefficients = next;
            if (aliasing <= target || m >= MaxSampleCount)
            {
                return new TightBindingBand(bandIndex, d, coefficients, samples, aliasing);
            }
        }
    }

    /// <summary>E at θ_i = iπ/M, reusing every other sample of a grid of M/2.</summary>
    private static double[] Sample(BandStructure structure, int bandIndex, int m, double[]? coarse)
    {
        var d = structure.PeriodNanometres;
        var values = new double[m + 1];
        for (var i = 0; i <= m; i++)
        {
            values[i] = coarse is not null && i % 2 == 0
                ? coarse[i / 2]
                : structure.EnergyAt(bandIndex, Math.Min(i * Math.PI / m, Math.PI) / d);
        }
        return values;
    }

    /// <summary>DCT-I: t_j = (2/M) Σ″ E_i cos(jiπ/M), with t_0 and t_M halved, so E(θ_i) = Σ_j t_j cos(jθ_i).</summary>
    private static double[] Transform(double[] samples)
    {
        var m = samples.Length - 1;
        var table = new double[2 * m];
        for (var r = 0; r < 2 * m; r++)
        {
            table[r] = Math.Cos(r * Math.PI / m);
        }
        var t = new double[m + 1];
        for (var j = 0; j <= m; j++)
        {
            var sum = 0.5 * (samples[0] + samples[m] * table[(j * m) % (2 * m)]);
            for (var i = 1; i < m; i++)
            {
                sum += samples[i] * table[(int)((long)j * i % (2 * m))];
            }
            t[j] = 2.0 / m * sum * (j == 0 || j == m ? 0.5 : 1.0);
        }
        return t;
    }

    /// <summary>
    /// The truncated series Σ_{j=0}^{terms} t_j cos(j k d) at <paramref name="wavevectorPerNanometre"/>, eV.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="terms"/> is outside 0 … M, or k is not finite.</exception>
    public double EnergyAt(double wavevectorPerNanometre, int terms)
    {
        Preconditions.CheckFinite(wavevectorPerNanometre);
        Preconditions.CheckRange(terms, 0, SampleCount);
        var theta = wavevectorPerNanometre * PeriodNanometres;
        var sum = 0.0;
        for (var j = 0; j <= terms; j++)
        {
            sum += _coefficients[j] * Math.Cos(j * theta);
        }
        return sum;
    }

    /// <summary>
    /// A bound on the error of keeping t_0 … t_terms: Σ_{j&gt;terms} |t_j| plus the aliasing error, eV. The error
    /// is at most this for every k (|cos| ≤ 1).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="terms"/> is outside 0 … M.</exception>
    public double TruncationErrorBoundElectronVolts(int terms)
    {
        Preconditions.CheckRange(terms, 0, SampleCount);
        var sum = AliasingErrorElectronVolts;
        for (var j = terms + 1; j < _coefficients.Length; j++)
        {
            sum += Math.Abs(_coefficients[j]);
        }
        return sum;
    }

    /// <summary>
    /// The largest deviation |E(k) − Σ_{j≤terms} t_j cos(jkd)| over the M + 1 sampled wavevectors, eV (a measured
    /// value, at most <see cref="TruncationErrorBoundElectronVolts"/> up to aliasing).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="terms"/> is outside 0 … M.</exception>
    public double TruncationErrorElectronVolts(int terms)
    {
        Preconditions.CheckRange(terms, 0, SampleCount);
        var m = SampleCount;
        var worst = 0.0;
        for (var i = 0; i <= m; i++)
        {
            var theta = i * Math.PI / m;
            var sum = 0.0;
            for (var j = 0; j <= terms; j++)
            {
                sum += _coefficients[j] * Math.Cos(j * theta);
            }
            worst = Math.Max(worst, Math.Abs(_samples[i] - sum));
        }
        return worst;
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"Tight-binding band {BandIndex}: eps0 = {OnSiteEnergyElectronVolts:G10} eV, J = {NearestNeighbourHoppingElectronVolts:G8} eV, {SampleCount} samples, aliasing {AliasingErrorElectronVolts:G2} eV");
        for (var j = 1; j <= Math.Min(4, SampleCount); j++)
        {
            text.Append(CultureInfo.InvariantCulture, $"; t{j} = {_coefficients[j]:G6}");
        }
        return text.ToString();
    }
}
