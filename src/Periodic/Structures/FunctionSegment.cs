// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// A smooth segment of given width whose potential V(x) (and optionally mass m(x)) is a function
/// supplied by the caller, x in nm measured from the start of the segment.
/// </summary>
/// <remarks>
/// <para>The functions are called only while the segment is created (or re-created by
/// <see cref="WithStepCount"/>): at the two Gauss–Legendre nodes of each of the <see cref="StepCount"/>
/// equal Magnus steps, and on a 1,024-interval scan for the range. The values are stored; the segment
/// is then immutable and thread-safe whatever the delegates do. They should be smooth: the Magnus scheme
/// reaches its fourth order only where V and m have continuous derivatives; put a kink or jump at a
/// segment boundary instead (a cell may hold several segments and layers).</para>
/// <para>A position-dependent mass m(x) enters with BenDaniel–Duke ordering, −C(ψ′/m)′ + Vψ = Eψ. It must not
/// depend on energy.</para>
/// </remarks>
public sealed class FunctionSegment : CellElement, IMeshedSegment
{
    /// <summary>Default number of Magnus steps.</summary>
    public const int DefaultStepCount = 256;

    private const int RangeScanIntervals = 1024;

    private readonly Func<double, double> _potential;
    private readonly Func<double, double>? _mass;
    private readonly double _constantMass;

    private FunctionSegment(Length width, Func<double, double> potential, Func<double, double>? mass, double constantMass, int stepCount)
    {
        Width = width;
        _potential = potential;
        _mass = mass;
        _constantMass = constantMass;
        StepCount = stepCount;
        Samples = BuildSamples(out var vMin, out var vMax, out var mMin);
        MinimumPotential = Energy.FromElectronVolts(vMin);
        MaximumPotential = Energy.FromElectronVolts(vMax);
        MinimumMass = EffectiveMass.FromElectronMasses(mMin);
    }

    /// <summary>The width of the segment.</summary>
    public override Length Width { get; }

    /// <summary>Number of equal Magnus steps over the segment.</summary>
    public int StepCount { get; }

    /// <summary>True when the mass varies with position (a mass function was given).</summary>
    public bool HasPositionDependentMass => _mass is not null;

    /// <summary>Lowest potential seen at the scan and quadrature points.</summary>
    public Energy MinimumPotential { get; }

    /// <summary>Highest potential seen at the scan and quadrature points.</summary>
    public Energy MaximumPotential { get; }

    /// <summary>Smallest mass seen at the scan and quadrature points.</summary>
    public EffectiveMass MinimumMass { get; }

    SegmentSamples IMeshedSegment.Samples => Samples;

    internal SegmentSamples Samples { get; }

    /// <summary>Creates a segment with potential <paramref name="potentialElectronVolts"/>(x) and a constant mass.</summary>
    /// <param name="width">Width; positive.</param>
    /// <param name="potentialElectronVolts">V(x) in eV for x in [0, width] nm; must return finite values.</param>
    /// <param name="mass">The constant effective mass.</param>
    /// <param name="stepCount">Equal Magnus steps, 1 to 4,000,000.</param>
    /// <exception cref="ArgumentNullException">The function is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule, or the function returns a non-finite value (the message gives x).</exception>
    public static FunctionSegment Create(Length width, Func<double, double> potentialElectronVolts, EffectiveMass mass, int stepCount)
    {
        CheckWidth(width);
        ArgumentNullException.ThrowIfNull(potentialElectronVolts);
        SegmentChecks.CheckMass(mass, nameof(mass));
        SegmentChecks.CheckStepCount(stepCount, nameof(stepCount));
        return new FunctionSegment(width, potentialElectronVolts, null, mass.ElectronMasses, stepCount);
    }

    /// <summary>Creates a segment with potential V(x) and position-dependent mass m(x).</summary>
    /// <param name="width">Width; positive.</param>
    /// <param name="potentialElectronVolts">V(x) in eV for x in [0, width] nm; must return finite values.</param>
    /// <param name="massElectronMasses">m(x) in m₀; must return positive finite values.</param>
    /// <param name="stepCount">Equal Magnus steps, 1 to 4,000,000.</param>
    /// <exception cref="ArgumentNullException">A function is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule, or a function returns a bad value (the message gives x).</exception>
    public static FunctionSegment Create(Length width, Func<double, double> potentialElectronVolts, Func<double, double> massElectronMasses, int stepCount)
    {
        CheckWidth(width);
        ArgumentNullException.ThrowIfNull(potentialElectronVolts);
        ArgumentNullException.ThrowIfNull(massElectronMasses);
        SegmentChecks.CheckStepCount(stepCount, nameof(stepCount));
        return new FunctionSegment(width, potentialElectronVolts, massElectronMasses, 0, stepCount);
    }

    /// <summary>Creates a segment with a constant mass and <see cref="DefaultStepCount"/> steps.</summary>
    /// <exception cref="ArgumentNullException">The function is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule, or the function returns a non-finite value.</exception>
    public static FunctionSegment Create(Length width, Func<double, double> potentialElectronVolts, EffectiveMass mass) =>
        Create(width, potentialElectronVolts, mass, DefaultStepCount);

    /// <summary>Creates a segment with a position-dependent mass and <see cref="DefaultStepCount"/> steps.</summary>
    /// <exception cref="ArgumentNullException">A function is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule, or a function returns a bad value.</exception>
    public static FunctionSegment Create(Length width, Func<double, double> potentialElectronVolts, Func<double, double> massElectronMasses) =>
        Create(width, potentialElectronVolts, massElectronMasses, DefaultStepCount);

    /// <summary>A copy with another number of Magnus steps (the functions are sampled again).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="stepCount"/> is outside 1 to 4,000,000.</exception>
    public FunctionSegment WithStepCount(int stepCount)
    {
        SegmentChecks.CheckStepCount(stepCount, nameof(stepCount));
        return new FunctionSegment(Width, _potential, _mass, _constantMass, stepCount);
    }

    CellElement IMeshedSegment.Refined() => WithStepCount(Math.Min(2 * StepCount, SegmentChecks.MaxStepCount));

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"FunctionSegment {Width.Nanometres:G6} nm, V in [{MinimumPotential.ElectronVolts:G6}, {MaximumPotential.ElectronVolts:G6}] eV, ") +
        (HasPositionDependentMass
            ? string.Create(CultureInfo.InvariantCulture, $"m(x) >= {MinimumMass.ElectronMasses:G6} m0")
            : string.Create(CultureInfo.InvariantCulture, $"m = {_constantMass:G6} m0")) +
        string.Create(CultureInfo.InvariantCulture, $", {StepCount} steps");

    private static void CheckWidth(Length width)
    {
        if (!(width.Nanometres > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(width), width.Nanometres,
                $"width must be positive; got {Preconditions.Format(width.Nanometres)} nm.");
        }
    }

    private double Potential(double x)
    {
        var v = _potential(x);
        if (!double.IsFinite(v))
        {
            throw new ArgumentOutOfRangeException("potentialElectronVolts", v,
                $"potentialElectronVolts must return a finite energy in eV; returned {Preconditions.Format(v)} at x = {Preconditions.Format(x)} nm.");
        }
        return v;
    }

    private double MassAt(double x)
    {
        if (_mass is null)
        {
            return _constantMass;
        }
        var m = _mass(x);
        if (!double.IsFinite(m) || m <= 0)
        {
            throw new ArgumentOutOfRangeException("massElectronMasses", m,
                $"massElectronMasses must return a positive finite mass in m0; returned {Preconditions.Format(m)} at x = {Preconditions.Format(x)} nm.");
        }
        return m;
    }

    private SegmentSamples BuildSamples(out double vMin, out double vMax, out double mMin)
    {
        var n = StepCount;
        var d = Width.Nanometres;
        var h = d / n;
        var widths = new double[n];
        var v1 = new double[n];
        var v2 = new double[n];
        var m1 = new double[n];
        var m2 = new double[n];
        vMin = double.PositiveInfinity;
        vMax = double.NegativeInfinity;
        mMin = double.PositiveInfinity;
        for (var j = 0; j < n; j++)
        {
            widths[j] = h;
            double xa = (j + SegmentSamples.Node1) * h, xb = (j + SegmentSamples.Node2) * h;
            v1[j] = Potential(xa);
            v2[j] = Potential(xb);
            m1[j] = MassAt(xa);
            m2[j] = MassAt(xb);
            vMin = Math.Min(vMin, Math.Min(v1[j], v2[j]));
            vMax = Math.Max(vMax, Math.Max(v1[j], v2[j]));
            mMin = Math.Min(mMin, Math.Min(m1[j], m2[j]));
        }
        for (var i = 0; i <= RangeScanIntervals; i++)
        {
            var x = d * i / RangeScanIntervals;
            var v = Potential(x);
            vMin = Math.Min(vMin, v);
            vMax = Math.Max(vMax, v);
            mMin = Math.Min(mMin, MassAt(x));
        }
        return new SegmentSamples(widths, v1, v2, m1, m2);
    }
}
