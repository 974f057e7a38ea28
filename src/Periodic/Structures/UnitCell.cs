// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// One period of a one-dimensional periodic potential: an ordered, immutable list of elements
/// (layers, delta barriers, smooth segments) that repeats with period <see cref="Period"/>.
/// Thread-safe; cheap to build and to reuse.
/// </summary>
public sealed class UnitCell
{
    private readonly CellElement[] _elements;

    private UnitCell(CellElement[] elements)
    {
        _elements = elements;
        Elements = new ReadOnlyCollection<CellElement>(elements);
        double period = 0, vMin = double.PositiveInfinity, vMax = double.NegativeInfinity, mMin = double.PositiveInfinity;
        foreach (var element in elements)
        {
            period += element.Width.Nanometres;
            if (element is Layer layer)
            {
                vMin = Math.Min(vMin, layer.Potential.ElectronVolts);
                vMax = Math.Max(vMax, layer.Potential.ElectronVolts);
                mMin = Math.Min(mMin, layer.Mass.ElectronMasses);
            }
            else if (element is IPotentialSegment segment)
            {
                vMin = Math.Min(vMin, segment.MinimumPotential.ElectronVolts);
                vMax = Math.Max(vMax, segment.MaximumPotential.ElectronVolts);
                mMin = Math.Min(mMin, segment.MinimumMass.ElectronMasses);
            }
        }
        Period = Length.FromNanometres(period);
        MinimumPotential = Energy.FromElectronVolts(vMin);
        MaximumPotential = Energy.FromElectronVolts(vMax);
        MinimumMass = EffectiveMass.FromElectronMasses(mMin);
    }

    /// <summary>The elements of one period, in order.</summary>
    public IReadOnlyList<CellElement> Elements { get; }

    /// <summary>The period d (sum of element widths).</summary>
    public Length Period { get; }

    /// <summary>Lowest potential energy of any finite-width element (delta wells not included).</summary>
    public Energy MinimumPotential { get; }

    /// <summary>Highest potential energy of any finite-width element (delta barriers not included).</summary>
    public Energy MaximumPotential { get; }

    /// <summary>Smallest band-edge effective mass of any finite-width element.</summary>
    public EffectiveMass MinimumMass { get; }

    /// <summary>Half the zone width, π/d, in 1/nm: the Brillouin-zone boundary.</summary>
    public double ZoneBoundaryPerNanometre => Math.PI / Period.Nanometres;

    internal ReadOnlySpan<CellElement> ElementSpan => _elements;

    /// <summary>
    /// How many identical copies of a shorter period this cell is made of (1 when it is not a repetition): the
    /// largest N such that the elements are N copies of their first n/N, layers and deltas compared by value,
    /// smooth segments by identity.
    /// </summary>
    internal int RepeatCount()
    {
        var n = _elements.Length;
        for (var length = 1; length <= n / 2; length++)
        {
            if (n % length != 0)
            {
                continue;
            }
            var repeats = true;
            for (var i = length; i < n && repeats; i++)
            {
                repeats = SameElement(_elements[i], _elements[i - length]);
            }
            if (repeats)
            {
                return n / length;
            }
        }
        return 1;
    }

    private static bool SameElement(CellElement a, CellElement b) => (a, b) switch
    {
        (Layer x, Layer y) => x.Width == y.Width && x.Potential == y.Potential && x.Mass == y.Mass
            && x.NonParabolicityPerElectronVolt == y.NonParabolicityPerElectronVolt,
        (DeltaBarrier x, DeltaBarrier y) => x.StrengthElectronVoltNanometres == y.StrengthElectronVoltNanometres,
        _ => ReferenceEquals(a, b),
    };

    /// <summary>Creates a cell from its elements in order.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="elements"/> is null.</exception>
    /// <exception cref="ArgumentException">An element is null, or no element has positive width.</exception>
    public static UnitCell Create(IEnumerable<CellElement> elements)
    {
        ArgumentNullException.ThrowIfNull(elements);
        var array = elements.ToArray();
        var hasWidth = false;
        for (var i = 0; i < array.Length; i++)
        {
            if (array[i] is null)
            {
                throw new ArgumentException(
                    string.Create(CultureInfo.InvariantCulture, $"elements[{i}] is null; every element of a cell must be a layer, a delta barrier or a segment."),
                    nameof(elements));
            }
            hasWidth |= array[i].Width.Nanometres > 0;
        }
        if (!hasWidth)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"elements must contain at least one element of positive width (a layer or a segment); got {array.Length} element(s) and none with width."),
                nameof(elements));
        }
        return new UnitCell(array);
    }

    /// <summary>Creates a cell from its elements in order.</summary>
    /// <exception cref="ArgumentException">An element is null, or no element has positive width.</exception>
    public static UnitCell Create(params CellElement[] elements) => Create((IEnumerable<CellElement>)elements);

    /// <summary>
    /// Creates a cell of uniform parabolic layers from parallel arrays, for sweeps over many designs.
    /// </summary>
    /// <param name="widthsNanometres">Layer widths in nm, each positive and finite.</param>
    /// <param name="potentialsElectronVolts">Layer potentials in eV, each finite.</param>
    /// <param name="massesElectronMasses">Layer masses in m₀, each positive and finite.</param>
    /// <exception cref="ArgumentException">The spans differ in length or are empty, or a value breaks its rule (the message names the layer index).</exception>
    public static UnitCell FromLayers(ReadOnlySpan<double> widthsNanometres, ReadOnlySpan<double> potentialsElectronVolts, ReadOnlySpan<double> massesElectronMasses)
    {
        if (widthsNanometres.Length == 0)
        {
            throw new ArgumentException("widthsNanometres must hold at least one layer; got an empty span.", nameof(widthsNanometres));
        }
        if (potentialsElectronVolts.Length != widthsNanometres.Length || massesElectronMasses.Length != widthsNanometres.Length)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"widthsNanometres, potentialsElectronVolts and massesElectronMasses must have the same length; got {widthsNanometres.Length}, {potentialsElectronVolts.Length} and {massesElectronMasses.Length}."),
                nameof(potentialsElectronVolts));
        }
        var layers = new CellElement[widthsNanometres.Length];
        for (var i = 0; i < layers.Length; i++)
        {
            double w = widthsNanometres[i], v = potentialsElectronVolts[i], m = massesElectronMasses[i];
            if (!double.IsFinite(w) || w <= 0)
            {
                throw LayerError(nameof(widthsNanometres), i, "width", w, "nm", "must be positive and finite");
            }
            if (!double.IsFinite(v))
            {
                throw LayerError(nameof(potentialsElectronVolts), i, "potential", v, "eV", "must be finite");
            }
            if (!double.IsFinite(m) || m <= 0)
            {
                throw LayerError(nameof(massesElectronMasses), i, "mass", m, "m0", "must be positive and finite");
            }
            layers[i] = Layer.Create(Length.FromNanometres(w), Energy.FromElectronVolts(v), EffectiveMass.FromElectronMasses(m));
        }
        return new UnitCell(layers);
    }

    private static ArgumentOutOfRangeException LayerError(string paramName, int index, string field, double value, string unit, string rule) =>
        new(paramName, value, string.Create(CultureInfo.InvariantCulture,
            $"layer {index}: {field} {rule}; got {Preconditions.Format(value)} {unit} ({paramName}[{index}])."));

    /// <summary>
    /// The classic two-layer Kronig–Penney cell (R. de L. Kronig and W. G. Penney, Proc. R. Soc. A
    /// 130, 499 (1931)): a well of width a at zero potential, then a barrier of width b and height V₀.
    /// </summary>
    public static UnitCell KronigPenney(Length wellWidth, Length barrierWidth, Energy barrierHeight, EffectiveMass wellMass, EffectiveMass barrierMass) =>
        Create(Layer.Create(wellWidth, default, wellMass), Layer.Create(barrierWidth, barrierHeight, barrierMass));

    /// <summary>The Kronig–Penney cell with the same mass in well and barrier.</summary>
    public static UnitCell KronigPenney(Length wellWidth, Length barrierWidth, Energy barrierHeight, EffectiveMass mass) =>
        KronigPenney(wellWidth, barrierWidth, barrierHeight, mass, mass);

    /// <summary>
    /// The Dirac comb: a delta of strength S (eV·nm) once per period d in a uniform zero-potential
    /// medium of mass m. Its dispersion is cos kd = cos Kd + P·sin(Kd)/(Kd) with P = m·S·d/(2·ħ²/2m₀)
    /// (C. Kittel, Introduction to Solid State Physics, ch. 7).
    /// </summary>
    public static UnitCell DiracComb(Length period, double strengthElectronVoltNanometres, EffectiveMass mass) =>
        Create(DeltaBarrier.Create(strengthElectronVoltNanometres), Layer.Create(period, default, mass));

    /// <summary>A copy of the cell with its elements cyclically shifted by <paramref name="offset"/> places.</summary>
    public UnitCell Rotate(int offset)
    {
        var n = _elements.Length;
        var shift = ((offset % n) + n) % n;
        var rotated = new CellElement[n];
        for (var i = 0; i < n; i++)
        {
            rotated[i] = _elements[(i + shift) % n];
        }
        return new UnitCell(rotated);
    }

    /// <summary>A copy of the cell with the order of its elements reversed (mirror image).</summary>
    public UnitCell Reverse()
    {
        var reversed = (CellElement[])_elements.Clone();
        Array.Reverse(reversed);
        return new UnitCell(reversed);
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"UnitCell: {_elements.Length} element(s), period {Period.Nanometres:G6} nm");
        for (var i = 0; i < _elements.Length; i++)
        {
            text.AppendLine().Append(CultureInfo.InvariantCulture, $"  [{i}] {_elements[i]}");
        }
        return text.ToString();
    }
}
