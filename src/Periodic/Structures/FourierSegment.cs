// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// A smooth potential over one whole period d given by its Fourier series,
/// V(x) = V₀ + Σₙ [aₙ cos(2πnx/d) + bₙ sin(2πnx/d)], n = 1 … N, with a constant effective mass.
/// Covers optical lattices (<see cref="OpticalLattice"/>) and the Mathieu potential (<see cref="Cosine"/>).
/// </summary>
/// <remarks>
/// The transfer layer propagates it with a fourth-order Magnus scheme on <see cref="StepCount"/> equal
/// steps (see <c>CellTransfer</c>); for a stated accuracy use
/// <c>RefinedBandStructure</c>, which halves the steps until the band edges converge.
/// The segment may be combined with layers and other segments in one cell; it then spans d = its
/// <see cref="Width"/>, and the cell period is the sum of all widths.
/// </remarks>
public sealed class FourierSegment : CellElement, IMeshedSegment
{
    /// <summary>Default number of Magnus steps per harmonic (at least <see cref="DefaultMinimumStepCount"/> in all).</summary>
    public const int DefaultStepsPerHarmonic = 32;

    /// <summary>Smallest default number of Magnus steps over the segment.</summary>
    public const int DefaultMinimumStepCount = 64;

    private readonly double _constant;
    private readonly double[] _cosine;
    private readonly double[] _sine;

    private FourierSegment(Length width, double constant, double[] cosine, double[] sine, EffectiveMass mass, int stepCount)
    {
        Width = width;
        _constant = constant;
        Constant = Energy.FromElectronVolts(constant);
        _cosine = cosine;
        _sine = sine;
        CosineElectronVolts = new ReadOnlyCollection<double>(cosine);
        SineElectronVolts = new ReadOnlyCollection<double>(sine);
        Mass = mass;
        StepCount = stepCount;
        var (vMin, vMax) = ScanRange();
        MinimumPotential = Energy.FromElectronVolts(vMin);
        MaximumPotential = Energy.FromElectronVolts(vMax);
        Samples = BuildSamples();
    }

    /// <summary>The length d of the segment (one period of its harmonics).</summary>
    public override Length Width { get; }

    /// <summary>The constant term V₀.</summary>
    public Energy Constant { get; }

    /// <summary>Cosine amplitudes a₁ … a_N, eV (a shorter list than <see cref="SineElectronVolts"/> is padded with zeros).</summary>
    public IReadOnlyList<double> CosineElectronVolts { get; }

    /// <summary>Sine amplitudes b₁ … b_N, eV.</summary>
    public IReadOnlyList<double> SineElectronVolts { get; }

    /// <summary>The constant effective mass.</summary>
    public EffectiveMass Mass { get; }

    /// <summary>Number of equal Magnus steps over the segment.</summary>
    public int StepCount { get; }

    /// <summary>Number of harmonics N (the longer of the two amplitude lists).</summary>
    public int HarmonicCount => Math.Max(_cosine.Length, _sine.Length);

    /// <summary>Lowest value of V(x) (located by a dense scan refined by Newton steps on V′).</summary>
    public Energy MinimumPotential { get; }

    /// <summary>Highest value of V(x) (located like the minimum).</summary>
    public Energy MaximumPotential { get; }

    EffectiveMass IPotentialSegment.MinimumMass => Mass;

    SegmentSamples IMeshedSegment.Samples => Samples;

    internal SegmentSamples Samples { get; }

    /// <summary>The recoil energy E_R = ħ²π²/(2·m·d²) = ħ²k_L²/2m of a lattice of period d = λ/2, k_L = π/d.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The period is not positive, or the mass is the default.</exception>
    public static Energy RecoilEnergy(Length period, EffectiveMass mass)
    {
        CheckPeriod(period);
        SegmentChecks.CheckMass(mass, nameof(mass));
        var k = Math.PI / period.Nanometres;
        return Energy.FromElectronVolts(PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * k * k / mass.ElectronMasses);
    }

    /// <summary>Creates a Fourier-series segment with the default step count.</summary>
    /// <param name="period">The length d of the segment; positive.</param>
    /// <param name="constant">The constant term V₀.</param>
    /// <param name="cosineElectronVolts">a₁ … a_N in eV, finite (may be empty).</param>
    /// <param name="sineElectronVolts">b₁ … b_M in eV, finite (may be empty).</param>
    /// <param name="mass">The constant effective mass.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks the rule given for it (the message names the index).</exception>
    public static FourierSegment Create(Length period, Energy constant, ReadOnlySpan<double> cosineElectronVolts, ReadOnlySpan<double> sineElectronVolts, EffectiveMass mass)
    {
        var harmonics = Math.Max(cosineElectronVolts.Length, sineElectronVolts.Length);
        return Create(period, constant, cosineElectronVolts, sineElectronVolts, mass, DefaultStepCount(harmonics));
    }

    /// <summary>Creates a Fourier-series segment with <paramref name="stepCount"/> Magnus steps.</summary>
    /// <param name="period">The length d of the segment; positive.</param>
    /// <param name="constant">The constant term V₀.</param>
    /// <param name="cosineElectronVolts">a₁ … a_N in eV, finite (may be empty).</param>
    /// <param name="sineElectronVolts">b₁ … b_M in eV, finite (may be empty).</param>
    /// <param name="mass">The constant effective mass.</param>
    /// <param name="stepCount">Equal Magnus steps over the segment, 1 to 4,000,000.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks the rule given for it (the message names the index).</exception>
    public static FourierSegment Create(Length period, Energy constant, ReadOnlySpan<double> cosineElectronVolts, ReadOnlySpan<double> sineElectronVolts, EffectiveMass mass, int stepCount)
    {
        CheckPeriod(period);
        SegmentChecks.CheckMass(mass, nameof(mass));
        SegmentChecks.CheckStepCount(stepCount, nameof(stepCount));
        var harmonics = Math.Max(cosineElectronVolts.Length, sineElectronVolts.Length);
        var cosine = new double[harmonics];
        var sine = new double[harmonics];
        CopyChecked(cosineElectronVolts, cosine, nameof(cosineElectronVolts));
        CopyChecked(sineElectronVolts, sine, nameof(sineElectronVolts));
        return new FourierSegment(period, constant.ElectronVolts, cosine, sine, mass, stepCount);
    }

    /// <summary>
    /// The Mathieu potential V(x) = V₀·cos(2πx/d). With E_R = <see cref="RecoilEnergy"/>, a = E/E_R and
    /// q = V₀/(2E_R) the Schrödinger equation becomes Mathieu's ψ″ + (a − 2q cos 2z)ψ = 0, z = πx/d.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The period is not positive, or the mass is the default.</exception>
    public static FourierSegment Cosine(Length period, Energy amplitude, EffectiveMass mass) =>
        Create(period, default, [amplitude.ElectronVolts], [], mass);

    /// <summary>
    /// The optical lattice V(x) = s·E_R·sin²(πx/d) = (s·E_R/2)(1 − cos(2πx/d)), with E_R the
    /// <see cref="RecoilEnergy"/> of period d and mass m.
    /// </summary>
    /// <param name="period">The lattice period d (half the laser wavelength); positive.</param>
    /// <param name="depthInRecoilEnergies">The depth s ≥ 0 in units of E_R, finite.</param>
    /// <param name="mass">The mass of the particle.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks the rule given for it.</exception>
    public static FourierSegment OpticalLattice(Length period, double depthInRecoilEnergies, EffectiveMass mass)
    {
        Preconditions.CheckNonNegativeFinite(depthInRecoilEnergies);
        var recoil = RecoilEnergy(period, mass).ElectronVolts;
        var half = 0.5 * depthInRecoilEnergies * recoil;
        return Create(period, Energy.FromElectronVolts(half), [-half], [], mass);
    }

    /// <summary>A copy with another number of Magnus steps.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="stepCount"/> is outside 1 to 4,000,000.</exception>
    public FourierSegment WithStepCount(int stepCount)
    {
        SegmentChecks.CheckStepCount(stepCount, nameof(stepCount));
        return new FourierSegment(Width, _constant, _cosine, _sine, Mass, stepCount);
    }

    CellElement IMeshedSegment.Refined() => WithStepCount(Math.Min(2 * StepCount, SegmentChecks.MaxStepCount));

    /// <summary>The potential V(x) in eV at <paramref name="positionNanometres"/> from the start of the segment (any finite x; periodic).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position is not finite.</exception>
    public double PotentialAt(double positionNanometres)
    {
        Preconditions.CheckFinite(positionNanometres);
        return Evaluate(positionNanometres, out _, out _);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"FourierSegment {Width.Nanometres:G6} nm, V0 = {Constant.ElectronVolts:G6} eV, {HarmonicCount} harmonic(s), V in [{MinimumPotential.ElectronVolts:G6}, {MaximumPotential.ElectronVolts:G6}] eV, m = {Mass.ElectronMasses:G6} m0, {StepCount} steps");

    private static int DefaultStepCount(int harmonics) => Math.Max(DefaultMinimumStepCount, DefaultStepsPerHarmonic * harmonics);

    private static void CheckPeriod(Length period)
    {
        if (!(period.Nanometres > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(period), period.Nanometres,
                $"period must be positive; got {Preconditions.Format(period.Nanometres)} nm.");
        }
    }

    private static void CopyChecked(ReadOnlySpan<double> source, double[] destination, string paramName)
    {
        for (var i = 0; i < source.Length; i++)
        {
            if (!double.IsFinite(source[i]))
            {
                throw new ArgumentOutOfRangeException(paramName, source[i], string.Create(CultureInfo.InvariantCulture,
                    $"{paramName}[{i}] (harmonic {i + 1}) must be a finite amplitude in eV; got {Preconditions.Format(source[i])}."));
            }
            destination[i] = source[i];
        }
    }

    /// <summary>V, V′ and V″ at x (nm).</summary>
    private double Evaluate(double x, out double first, out double second)
    {
        var g = 2 * Math.PI / Width.Nanometres;
        double v = _constant, d1 = 0, d2 = 0;
        for (var n = 1; n <= _cosine.Length; n++)
        {
            var (sin, cos) = Math.SinCos(n * g * x);
            double a = _cosine[n - 1], b = _sine[n - 1], ng = n * g;
            v += a * cos + b * sin;
            d1 += ng * (b * cos - a * sin);
            d2 -= ng * ng * (a * cos + b * sin);
        }
        first = d1;
        second = d2;
        return v;
    }

    private (double Min, double Max) ScanRange()
    {
        if (_cosine.Length == 0)
        {
            return (_constant, _constant);
        }
        // A power of two at least 64 samples per harmonic, so the transform takes its radix-2 path.
        var samples = (int)Math.Min(1L << 30, System.Numerics.BitOperations.RoundUpToPowerOf2((uint)Math.Max(256, 64 * _cosine.Length)));
        var d = Width.Nanometres;
        var (values, _) = SampleUniform(samples, 0, 0);
        double min = double.PositiveInfinity, max = double.NegativeInfinity, xMin = 0, xMax = 0;
        for (var i = 0; i < samples; i++)
        {
            var x = d * i / samples;
            var v = values[i];
            if (v < min) { min = v; xMin = x; }
            if (v > max) { max = v; xMax = x; }
        }
        return (Polish(xMin, min, d / samples, true), Polish(xMax, max, d / samples, false));
    }

    /// <summary>
    /// V at the M points x_j = (j + δ)·d/M, j = 0 … M−1, for the two offsets δ = <paramref name="offset1"/> and
    /// <paramref name="offset2"/>, by one inverse discrete Fourier transform (<c>FastFourier</c>: O(M log M) instead of
    /// O(M·N) for direct summation). Harmonic n with c_n = a_n − i·b_n contributes c_n e^{iφ}/2 to bin n mod M and its
    /// conjugate to bin −n mod M (φ = 2πnδ/M), so each offset's transform is real; the second offset's spectrum is
    /// multiplied by i, so the real part of the result holds the first set of values and the imaginary part the second.
    /// </summary>
    private (double[] First, double[] Second) SampleUniform(int m, double offset1, double offset2)
    {
        var bins = new System.Numerics.Complex[m];
        var i = System.Numerics.Complex.ImaginaryOne;
        for (var n = 1; n <= _cosine.Length; n++)
        {
            var c = 0.5 * new System.Numerics.Complex(_cosine[n - 1], -_sine[n - 1]);
            var (sin1, cos1) = Math.SinCos(2 * Math.PI * (n * offset1 / m));
            var (sin2, cos2) = Math.SinCos(2 * Math.PI * (n * offset2 / m));
            var z1 = c * new System.Numerics.Complex(cos1, sin1);
            var z2 = c * new System.Numerics.Complex(cos2, sin2);
            bins[n % m] += z1 + i * z2;
            bins[(m - n % m) % m] += System.Numerics.Complex.Conjugate(z1) + i * System.Numerics.Complex.Conjugate(z2);
        }
        Numerics.FastFourier.InverseUnscaled(bins);
        var first = new double[m];
        var second = new double[m];
        for (var j = 0; j < m; j++)
        {
            first[j] = _constant + bins[j].Real;
            second[j] = _constant + bins[j].Imaginary;
        }
        return (first, second);
    }

    /// <summary>A few Newton steps on V′ = 0 from the best sample, kept within one sample spacing.</summary>
    private double Polish(double x, double best, double spacing, bool minimum)
    {
        var x0 = x;
        for (var iteration = 0; iteration < 8; iteration++)
        {
            Evaluate(x, out var first, out var second);
            if (second == 0 || (minimum ? second < 0 : second > 0))
            {
                break;
            }
            var next = x - first / second;
            if (Math.Abs(next - x0) > spacing)
            {
                break;
            }
            x = next;
            var v = Evaluate(x, out _, out _);
            best = minimum ? Math.Min(best, v) : Math.Max(best, v);
        }
        return best;
    }

    private SegmentSamples BuildSamples()
    {
        var n = StepCount;
        var h = Width.Nanometres / n;
        var widths = new double[n];
        var m = new double[n];
        Array.Fill(widths, h);
        Array.Fill(m, Mass.ElectronMasses);
        var (v1, v2) = SampleUniform(n, SegmentSamples.Node1, SegmentSamples.Node2);
        return new SegmentSamples(widths, v1, v2, m, m);
    }
}
