// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// A potential profile sampled at increasing positions x₀ &lt; x₁ &lt; … &lt; x_N (for example the output of a
/// Poisson solver), interpolated <b>piecewise linearly</b> between samples; the mass is constant or
/// sampled at the same positions and interpolated the same way.
/// </summary>
/// <remarks>
/// <para>Interpolation order: piecewise-linear interpolation of a smooth profile has error O(h²) in the
/// potential, hence O(h²) in the band energies (h the largest sample spacing); a jump in the profile that
/// falls midway between two samples also gives O(h²), a jump elsewhere O(h). Within each interval the
/// interpolant is linear, so the fourth-order Magnus steps (aligned with the samples, <see cref="StepsPerInterval"/>
/// per interval) solve the interpolated problem to O(h⁴): the energies are those of the stated
/// interpolant to that accuracy, and their distance from the true profile is the interpolation error.</para>
/// <para>The segment spans [x₀, x_N]; its width is x_N − x₀.</para>
/// </remarks>
public sealed class SampledSegment : CellElement, IMeshedSegment
{
    private readonly double[] _positions;
    private readonly double[] _potentials;
    private readonly double[]? _masses;
    private readonly double _constantMass;

    private SampledSegment(double[] positions, double[] potentials, double[]? masses, double constantMass, int stepsPerInterval)
    {
        _positions = positions;
        _potentials = potentials;
        _masses = masses;
        _constantMass = constantMass;
        StepsPerInterval = stepsPerInterval;
        Width = Length.FromNanometres(positions[^1] - positions[0]);
        double vMin = double.PositiveInfinity, vMax = double.NegativeInfinity;
        foreach (var v in potentials)
        {
            vMin = Math.Min(vMin, v);
            vMax = Math.Max(vMax, v);
        }
        MinimumPotential = Energy.FromElectronVolts(vMin);
        MaximumPotential = Energy.FromElectronVolts(vMax);
        MinimumMass = EffectiveMass.FromElectronMasses(masses is null ? constantMass : masses.Min());
        Samples = BuildSamples();
    }

    /// <summary>x_N − x₀.</summary>
    public override Length Width { get; }

    /// <summary>Number of samples.</summary>
    public int SampleCount => _positions.Length;

    /// <summary>Magnus steps in each interval between samples.</summary>
    public int StepsPerInterval { get; }

    /// <summary>Total number of Magnus steps.</summary>
    public int StepCount => (_positions.Length - 1) * StepsPerInterval;

    /// <summary>The interpolation order of the profile: 2 (piecewise linear).</summary>
    public int InterpolationOrder => 2;

    /// <summary>Lowest sample of the potential (the interpolant attains its extremes at samples).</summary>
    public Energy MinimumPotential { get; }

    /// <summary>Highest sample of the potential.</summary>
    public Energy MaximumPotential { get; }

    /// <summary>Smallest mass.</summary>
    public EffectiveMass MinimumMass { get; }

    /// <summary>True when masses were sampled too.</summary>
    public bool HasPositionDependentMass => _masses is not null;

    SegmentSamples IMeshedSegment.Samples => Samples;

    internal SegmentSamples Samples { get; }

    /// <summary>Creates a sampled profile with a constant mass, one Magnus step per interval (see <see cref="WithStepsPerInterval"/>).</summary>
    /// <param name="positionsNanometres">At least two finite positions, strictly increasing.</param>
    /// <param name="potentialsElectronVolts">The potential at each position, finite; same length.</param>
    /// <param name="mass">The constant effective mass.</param>
    /// <exception cref="ArgumentException">Lengths differ or a value breaks its rule (the message names the index).</exception>
    public static SampledSegment Create(ReadOnlySpan<double> positionsNanometres, ReadOnlySpan<double> potentialsElectronVolts, EffectiveMass mass)
    {
        SegmentChecks.CheckMass(mass, nameof(mass));
        var (x, v) = CheckProfile(positionsNanometres, potentialsElectronVolts, 1);
        return new SampledSegment(x, v, null, mass.ElectronMasses, 1);
    }

    /// <summary>Creates a sampled profile with sampled (position-dependent) masses, interpolated linearly.</summary>
    /// <param name="positionsNanometres">At least two finite positions, strictly increasing.</param>
    /// <param name="potentialsElectronVolts">The potential at each position, finite; same length.</param>
    /// <param name="massesElectronMasses">The mass at each position in m₀, positive and finite; same length.</param>
    /// <exception cref="ArgumentException">Lengths differ or a value breaks its rule (the message names the index).</exception>
    public static SampledSegment Create(ReadOnlySpan<double> positionsNanometres, ReadOnlySpan<double> potentialsElectronVolts, ReadOnlySpan<double> massesElectronMasses)
    {
        var (x, v) = CheckProfile(positionsNanometres, potentialsElectronVolts, 1);
        if (massesElectronMasses.Length != x.Length)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"massesElectronMasses must have the same length as positionsNanometres; got {massesElectronMasses.Length} and {x.Length}."), nameof(massesElectronMasses));
        }
        var m = new double[x.Length];
        for (var i = 0; i < m.Length; i++)
        {
            if (!double.IsFinite(massesElectronMasses[i]) || massesElectronMasses[i] <= 0)
            {
                throw new ArgumentOutOfRangeException(nameof(massesElectronMasses), massesElectronMasses[i], string.Create(CultureInfo.InvariantCulture,
                    $"massesElectronMasses[{i}] must be a positive finite mass in m0; got {Preconditions.Format(massesElectronMasses[i])}."));
            }
            m[i] = massesElectronMasses[i];
        }
        return new SampledSegment(x, v, m, 0, 1);
    }

    /// <summary>A copy with another number of Magnus steps per interval.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The total step count would exceed 4,000,000, or the value is below 1.</exception>
    public SampledSegment WithStepsPerInterval(int stepsPerInterval)
    {
        CheckSteps(stepsPerInterval, _positions.Length - 1);
        return new SampledSegment(_positions, _potentials, _masses, _constantMass, stepsPerInterval);
    }

    CellElement IMeshedSegment.Refined() =>
        2L * StepCount <= SegmentChecks.MaxStepCount ? WithStepsPerInterval(2 * StepsPerInterval) : this;

    /// <summary>The interpolated potential at <paramref name="positionNanometres"/> in [x₀, x_N], eV.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position lies outside the samples.</exception>
    public double PotentialAt(double positionNanometres)
    {
        Preconditions.CheckRange(positionNanometres, _positions[0], _positions[^1]);
        var i = Array.BinarySearch(_positions, positionNanometres);
        if (i >= 0)
        {
            return _potentials[i];
        }
        var upper = ~i;
        var t = (positionNanometres - _positions[upper - 1]) / (_positions[upper] - _positions[upper - 1]);
        return _potentials[upper - 1] + t * (_potentials[upper] - _potentials[upper - 1]);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"SampledSegment {Width.Nanometres:G6} nm, {SampleCount} samples (piecewise linear), V in [{MinimumPotential.ElectronVolts:G6}, {MaximumPotential.ElectronVolts:G6}] eV, ") +
        (HasPositionDependentMass
            ? string.Create(CultureInfo.InvariantCulture, $"m(x) >= {MinimumMass.ElectronMasses:G6} m0")
            : string.Create(CultureInfo.InvariantCulture, $"m = {_constantMass:G6} m0")) +
        string.Create(CultureInfo.InvariantCulture, $", {StepsPerInterval} step(s) per interval");

    private static void CheckSteps(int stepsPerInterval, int intervals)
    {
        if (stepsPerInterval < 1 || (long)stepsPerInterval * intervals > SegmentChecks.MaxStepCount)
        {
            throw new ArgumentOutOfRangeException(nameof(stepsPerInterval), stepsPerInterval, string.Create(CultureInfo.InvariantCulture,
                $"stepsPerInterval must be at least 1 and give at most {SegmentChecks.MaxStepCount} steps over the {intervals} interval(s); got {stepsPerInterval}."));
        }
    }

    private static (double[] Positions, double[] Potentials) CheckProfile(ReadOnlySpan<double> positions, ReadOnlySpan<double> potentials, int stepsPerInterval)
    {
        if (positions.Length < 2)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"positionsNanometres must hold at least 2 samples; got {positions.Length}."), "positionsNanometres");
        }
        if (potentials.Length != positions.Length)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"potentialsElectronVolts must have the same length as positionsNanometres; got {potentials.Length} and {positions.Length}."), "potentialsElectronVolts");
        }
        CheckSteps(stepsPerInterval, positions.Length - 1);
        var x = positions.ToArray();
        var v = potentials.ToArray();
        for (var i = 0; i < x.Length; i++)
        {
            if (!double.IsFinite(x[i]) || (i > 0 && !(x[i] > x[i - 1])))
            {
                var after = i > 0 ? " after " + Preconditions.Format(x[i - 1]) : "";
                throw new ArgumentOutOfRangeException("positionsNanometres", x[i], string.Create(CultureInfo.InvariantCulture,
                    $"positionsNanometres[{i}] must be finite and greater than the sample before it; got {Preconditions.Format(x[i])}{after}."));
            }
            if (!double.IsFinite(v[i]))
            {
                throw new ArgumentOutOfRangeException("potentialsElectronVolts", v[i], string.Create(CultureInfo.InvariantCulture,
                    $"potentialsElectronVolts[{i}] must be a finite energy in eV; got {Preconditions.Format(v[i])}."));
            }
        }
        return (x, v);
    }

    private SegmentSamples BuildSamples()
    {
        var k = StepsPerInterval;
        var n = StepCount;
        var widths = new double[n];
        var v1 = new double[n];
        var v2 = new double[n];
        var m1 = new double[n];
        var m2 = new double[n];
        for (var i = 0; i + 1 < _positions.Length; i++)
        {
            var span = _positions[i + 1] - _positions[i];
            var h = span / k;
            double va = _potentials[i], dv = _potentials[i + 1] - va;
            double ma = _masses?[i] ?? _constantMass, dm = _masses is null ? 0 : _masses[i + 1] - ma;
            for (var s = 0; s < k; s++)
            {
                var j = i * k + s;
                double ta = (s + SegmentSamples.Node1) / k, tb = (s + SegmentSamples.Node2) / k;
                widths[j] = h;
                v1[j] = va + ta * dv;
                v2[j] = va + tb * dv;
                m1[j] = ma + ta * dm;
                m2[j] = ma + tb * dm;
            }
        }
        return new SegmentSamples(widths, v1, v2, m1, m2);
    }
}
