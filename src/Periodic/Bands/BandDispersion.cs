// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics.Tensors;
using Periodic.Numerics;

namespace Periodic.Bands;

/// <summary>
/// The dispersion E_n(k) of one band, inverted once and stored as piecewise Chebyshev series in
/// x = cos(kd), for fast evaluation on dense k-grids. Immutable and thread-safe; evaluation does not
/// allocate.
/// </summary>
/// <remarks>
/// <para>Method: inside a band D(E) is monotone and D′ ≠ 0 at the edges of an open gap, so E(x), the
/// inverse of x = D(E)/2, is analytic on [−1, 1] and its Chebyshev series converges geometrically
/// (L. N. Trefethen, Approximation Theory and Approximation Practice, SIAM 2013, ch. 7–8). The band's
/// energies are computed by the root search of <see cref="BandStructure.EnergyAt"/> at Chebyshev–Lobatto
/// points x_j = cos(πj/N) of a piece, and interpolated (coefficients by the discrete cosine transform,
/// evaluation by Clenshaw's recurrence). The degree doubles (8, 16, 32, 64) until the interpolant agrees
/// with the root search at the N points midway in angle between the nodes to within the tolerance — that
/// largest observed deviation is <see cref="ErrorEstimateElectronVolts"/>; if degree 64 does not
/// suffice (a nearly closed gap puts a square-root singularity just outside [−1, 1]) the piece is halved,
/// and pieces that stay unresolved after <see cref="MaxSplitDepth"/> halvings (an exactly closed gap), or
/// once <see cref="MaxPieces"/> pieces exist,
/// keep the root search itself (<see cref="RootSearchFraction"/>).</para>
/// <para>The error estimate is a sampled one (common practice in adaptive Chebyshev approximation, no
/// single source): it is the deviation seen at the N midpoints between the N + 1 nodes of each piece, not
/// a proven bound.</para>
/// </remarks>
public sealed class BandDispersion
{
    /// <summary>Largest degree of one piece before it is halved.</summary>
    public const int MaxDegree = 64;

    /// <summary>Largest number of halvings of [−1, 1] before a piece keeps the root search.</summary>
    public const int MaxSplitDepth = 24;

    /// <summary>Largest number of pieces; once reached, unresolved pieces keep the root search.</summary>
    public const int MaxPieces = 256;

    private const double Epsilon = FloatingPoint.MachineEpsilon;

    private readonly BandStructure _bands;
    private readonly double[] _breaks;
    private readonly int[] _offsets;
    private readonly int[] _degrees; // −1: root search on this piece
    private readonly double[] _coefficients;
    private readonly double _period;

    private BandDispersion(BandStructure bands, Band band, double tolerance, List<Piece> pieces, int referenceEvaluations)
    {
        _bands = bands;
        Band = band;
        ToleranceElectronVolts = tolerance;
        ReferenceEvaluations = referenceEvaluations;
        _period = bands.PeriodNanometres;
        _breaks = new double[pieces.Count + 1];
        _offsets = new int[pieces.Count];
        _degrees = new int[pieces.Count];
        var total = 0;
        foreach (var piece in pieces)
        {
            total += piece.Coefficients.Length;
        }
        _coefficients = new double[total];
        var offset = 0;
        double error = 0, fallback = 0;
        for (var i = 0; i < pieces.Count; i++)
        {
            var piece = pieces[i];
            _breaks[i] = piece.Lower;
            _offsets[i] = offset;
            _degrees[i] = piece.Degree;
            piece.Coefficients.CopyTo(_coefficients, offset);
            offset += piece.Coefficients.Length;
            error = Math.Max(error, piece.Error);
            if (piece.Degree < 0)
            {
                fallback += piece.Upper - piece.Lower;
            }
        }
        _breaks[pieces.Count] = 1.0;
        ErrorEstimateElectronVolts = error;
        RootSearchFraction = fallback / 2;
        TermCount = total;
    }

    /// <summary>The band.</summary>
    public Band Band { get; }

    /// <summary>
    /// The tolerance the series were built to, eV: the requested one, raised if need be to 64 ε·|E|max
    /// (rounding) and to 4 × the root search's own tolerance (<see cref="BandStructure.Options"/>), |E|max
    /// being the larger magnitude of the band's edges.
    /// </summary>
    public double ToleranceElectronVolts { get; }

    /// <summary>Largest deviation from the root search observed at the check points of every piece, eV (0 where the root search is kept).</summary>
    public double ErrorEstimateElectronVolts { get; }

    /// <summary>Number of pieces of [−1, 1] in x = cos kd.</summary>
    public int PieceCount => _degrees.Length;

    /// <summary>Total number of Chebyshev coefficients stored.</summary>
    public int TermCount { get; }

    /// <summary>Fraction of the x = cos kd range where no series converged and the root search is used (0 for most bands).</summary>
    public double RootSearchFraction { get; }

    /// <summary>How many root searches building the series took.</summary>
    public int ReferenceEvaluations { get; }

    /// <summary>Inverts band <paramref name="bandIndex"/> of <paramref name="bands"/>.</summary>
    /// <param name="bands">The band structure.</param>
    /// <param name="bandIndex">1-based band index, a band that <paramref name="bands"/> holds.</param>
    /// <param name="options">The target accuracy (<see cref="BandDispersionOptions.Default"/>, 1e-13 eV, when null).</param>
    /// <exception cref="ArgumentNullException"><paramref name="bands"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    public static BandDispersion Create(BandStructure bands, int bandIndex, BandDispersionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(bands);
        var band = bands.GetBand(bandIndex);
        return CreateCore(bands, bandIndex, band, (options ?? BandDispersionOptions.Default).AbsoluteToleranceElectronVolts);
    }

    /// <summary>
    /// Inverts band <paramref name="bandIndex"/> to the accuracy of the structure's own root search (no
    /// requested tolerance, so cells whose energies lie far below 1 eV, cold atoms at 1e-11 eV, keep their
    /// relative accuracy): the default path of <see cref="BandStructure.EnergiesAt"/>.
    /// </summary>
    internal static BandDispersion CreateAtSearchAccuracy(BandStructure bands, int bandIndex) =>
        CreateCore(bands, bandIndex, bands.GetBand(bandIndex), 0.0);

    private static BandDispersion CreateCore(BandStructure bands, int bandIndex, Band band, double absoluteToleranceElectronVolts)
    {
        // Never ask the series to be better than the root search that supplies its nodes (its options'
        // tolerances), nor than rounding: otherwise noise in the nodes would force endless splitting.
        var magnitude = Math.Max(Math.Abs(band.BottomElectronVolts), Math.Abs(band.TopElectronVolts));
        var options = bands.Options;
        var tolerance = Math.Max(absoluteToleranceElectronVolts, Math.Max(64 * Epsilon * magnitude,
            4 * (options.RelativeTolerance * magnitude + options.AbsoluteToleranceElectronVolts)));
        var pieces = new List<Piece>();
        var builder = new Builder(bands, bandIndex, tolerance);
        if (band.WidthElectronVolts == 0)
        {
            pieces.Add(new Piece(-1, 1, 0, [band.BottomElectronVolts], 0));
        }
        else
        {
            builder.Build(-1, 1, 0, pieces);
        }
        return new BandDispersion(bands, band, tolerance, pieces, builder.Evaluations);
    }

    /// <summary>E_n(k), eV, at Bloch wavevector <paramref name="wavevectorPerNanometre"/> in the first zone [−π/d, π/d].</summary>
    /// <exception cref="ArgumentOutOfRangeException">k is not finite or lies outside the first zone.</exception>
    public double EnergyAt(double wavevectorPerNanometre)
    {
        var phase = Math.Abs(wavevectorPerNanometre) * _period;
        if (!(phase <= MaxPhase))
        {
            throw ZoneError(nameof(wavevectorPerNanometre), nameof(wavevectorPerNanometre), wavevectorPerNanometre);
        }
        return EnergyAtCosine(Math.Cos(phase));
    }

    /// <summary>
    /// Effectively computes <c>destinationElectronVolts[i] = E_n(wavevectorsPerNanometre[i])</c> in eV. Does not
    /// allocate; every wavevector is checked before anything is written; in place when both spans start
    /// at the same address.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a wavevector is outside the first zone.</exception>
    public void EnergiesAt(ReadOnlySpan<double> wavevectorsPerNanometre, Span<double> destinationElectronVolts)
    {
        Preconditions.CheckDestination(wavevectorsPerNanometre.Length, destinationElectronVolts.Length, nameof(wavevectorsPerNanometre), nameof(destinationElectronVolts));
        if (wavevectorsPerNanometre.Length == 0)
        {
            return;
        }
        // Every wavevector is checked before anything is written (no partial output on a bad element).
        for (var j = 0; j < wavevectorsPerNanometre.Length; j++)
        {
            var k = wavevectorsPerNanometre[j];
            if (!(Math.Abs(k) * _period <= MaxPhase))
            {
                throw ZoneError(nameof(wavevectorsPerNanometre), string.Create(CultureInfo.InvariantCulture, $"wavevectorsPerNanometre[{j}]"), k);
            }
        }
        var output = destinationElectronVolts[..wavevectorsPerNanometre.Length];
        // x = cos(|k| d), vectorised; cos is even, so |k| is not needed. (A short-lived process that evaluates few points pays
        // more for compiling the vector kernel than it saves: it may form the cosines itself and call EnergiesAtBlochCosines.)
        TensorPrimitives.Multiply(wavevectorsPerNanometre, _period, output);
        TensorPrimitives.Cos(output, output);
        EnergiesAtCosinesInPlace(output);
    }

    /// <summary>
    /// Effectively computes <c>destinationElectronVolts[i] = E_n(k)</c> at the Bloch cosines <c>blochCosines[i] = cos(k·d)</c>
    /// (the dispersion relation's own variable: D(E) = 2 cos kd), for callers that already hold them, e.g. a scalar loop of
    /// <see cref="Math.Cos"/> in a short-lived process that should not compile the vector kernels <see cref="EnergiesAt"/>
    /// uses. Bitwise equal to <see cref="EnergiesAt"/> where the cosines are bitwise equal. Does not allocate; every cosine is
    /// checked before anything is written; in place when both spans start at the same address.
    /// </summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a cosine is not a finite number in [−1, 1].</exception>
    public void EnergiesAtBlochCosines(ReadOnlySpan<double> blochCosines, Span<double> destinationElectronVolts)
    {
        Preconditions.CheckDestination(blochCosines.Length, destinationElectronVolts.Length, nameof(blochCosines), nameof(destinationElectronVolts));
        for (var j = 0; j < blochCosines.Length; j++)
        {
            var x = blochCosines[j];
            if (!(Math.Abs(x) <= 1))
            {
                throw new ArgumentOutOfRangeException(nameof(blochCosines), x,
                    string.Create(CultureInfo.InvariantCulture, $"blochCosines[{j}] must be cos(k·d), a finite number in [-1, 1]; got {Preconditions.Format(x)}."));
            }
        }
        var output = destinationElectronVolts[..blochCosines.Length];
        blochCosines.CopyTo(output);
        EnergiesAtCosinesInPlace(output);
    }

    /// <summary>Replaces each Bloch cosine x = cos(kd) of <paramref name="output"/> by E_n at it.</summary>
    private void EnergiesAtCosinesInPlace(Span<double> output)
    {
        // Four points per step when they share a piece: their Clenshaw recurrences are independent
        // chains, which the processor overlaps (one chain alone is latency bound). The vector cosine may exceed 1 by an ulp.
        var i = 0;
        for (; i + 3 < output.Length; i += 4)
        {
            double x0 = Math.Clamp(output[i], -1.0, 1.0), x1 = Math.Clamp(output[i + 1], -1.0, 1.0);
            double x2 = Math.Clamp(output[i + 2], -1.0, 1.0), x3 = Math.Clamp(output[i + 3], -1.0, 1.0);
            var p0 = PieceOf(x0);
            if (_degrees[p0] > 0 && PieceOf(x1) == p0 && PieceOf(x2) == p0 && PieceOf(x3) == p0)
            {
                double a = _breaks[p0], scale = 2 / (_breaks[p0 + 1] - a), shift = scale * a + 1;
                ClenshawQuad(_offsets[p0], _degrees[p0],
                    Math.Clamp(scale * x0 - shift, -1.0, 1.0), Math.Clamp(scale * x1 - shift, -1.0, 1.0),
                    Math.Clamp(scale * x2 - shift, -1.0, 1.0), Math.Clamp(scale * x3 - shift, -1.0, 1.0),
                    output.Slice(i, 4));
            }
            else
            {
                output[i] = EnergyAtCosine(x0);
                output[i + 1] = EnergyAtCosine(x1);
                output[i + 2] = EnergyAtCosine(x2);
                output[i + 3] = EnergyAtCosine(x3);
            }
        }
        for (; i < output.Length; i++)
        {
            output[i] = EnergyAtCosine(Math.Clamp(output[i], -1.0, 1.0));
        }
    }

    private double MaxPhase => Math.PI * (1 + 8 * Epsilon);

    // ParamName is the real parameter; the message names the element of a span.
    private ArgumentOutOfRangeException ZoneError(string paramName, string name, double k) =>
        new(paramName, k, $"{name} must be a finite wavevector in the first Brillouin zone [-pi/d, pi/d] = [-{Preconditions.Format(Math.PI / _period)}, {Preconditions.Format(Math.PI / _period)}] 1/nm; got {Preconditions.Format(k)}.");

    private double EnergyAtCosine(double x) => EnergyInPiece(PieceOf(x), x);

    private int PieceOf(double x)
    {
        int low = 0, high = _degrees.Length - 1;
        while (low < high)
        {
            var mid = (low + high + 1) >> 1;
            if (x >= _breaks[mid])
            {
                low = mid;
            }
            else
            {
                high = mid - 1;
            }
        }
        return low;
    }

    private double EnergyInPiece(int piece, double x)
    {
        var degree = _degrees[piece];
        if (degree < 0)
        {
            return _bands.EnergyAt(Band.Index, Math.Acos(x) / _period);
        }
        double a = _breaks[piece], b = _breaks[piece + 1];
        var t = degree == 0 ? 0 : Math.Clamp((2 * x - a - b) / (b - a), -1.0, 1.0);
        return Clenshaw(_offsets[piece], degree, t);
    }

    private double Clenshaw(int offset, int degree, double t)
    {
        var c = _coefficients.AsSpan(offset, degree + 1);
        double b1 = 0, b2 = 0;
        var twoT = 2 * t;
        for (var k = degree; k >= 1; k--)
        {
            var b0 = c[k] + twoT * b1 - b2;
            b2 = b1;
            b1 = b0;
        }
        return c[0] + t * b1 - b2;
    }

    /// <summary>Clenshaw's recurrence for four arguments at once (per argument the arithmetic of <see cref="Clenshaw"/>).</summary>
    private void ClenshawQuad(int offset, int degree, double t0, double t1, double t2, double t3, Span<double> destination)
    {
        var c = _coefficients.AsSpan(offset, degree + 1);
        double a1 = 0, a2 = 0, b1 = 0, b2 = 0, c1 = 0, c2 = 0, d1 = 0, d2 = 0;
        double u0 = 2 * t0, u1 = 2 * t1, u2 = 2 * t2, u3 = 2 * t3;
        for (var k = degree; k >= 1; k--)
        {
            var ck = c[k];
            var a0 = ck + u0 * a1 - a2;
            var b0 = ck + u1 * b1 - b2;
            var c0 = ck + u2 * c1 - c2;
            var d0 = ck + u3 * d1 - d2;
            a2 = a1; a1 = a0;
            b2 = b1; b1 = b0;
            c2 = c1; c1 = c0;
            d2 = d1; d1 = d0;
        }
        destination[0] = c[0] + t0 * a1 - a2;
        destination[1] = c[0] + t1 * b1 - b2;
        destination[2] = c[0] + t2 * c1 - c2;
        destination[3] = c[0] + t3 * d1 - d2;
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"BandDispersion band {Band.Index}: {PieceCount} piece(s), {TermCount} terms, error estimate {ErrorEstimateElectronVolts:G3} eV (tolerance {ToleranceElectronVolts:G3} eV){(RootSearchFraction > 0 ? string.Create(CultureInfo.InvariantCulture, $", root search on {RootSearchFraction:P3} of cos kd") : "")}");

    private sealed record Piece(double Lower, double Upper, int Degree, double[] Coefficients, double Error);

    private sealed class Builder(BandStructure bands, int bandIndex, double tolerance)
    {
        private readonly double _period = bands.PeriodNanometres;

        internal int Evaluations { get; private set; }

        private double Reference(double x)
        {
            Evaluations++;
            return bands.EnergyAt(bandIndex, Math.Acos(Math.Clamp(x, -1.0, 1.0)) / _period);
        }

        internal void Build(double a, double b, int depth, List<Piece> pieces)
        {
            double mid = 0.5 * (a + b), half = 0.5 * (b - a);
            var degree = 8;
            var values = new double[degree + 1];
            for (var j = 0; j <= degree; j++)
            {
                values[j] = j == 0 ? Reference(b) : j == degree ? Reference(a) : Reference(mid + half * Math.Cos(Math.PI * j / degree));
            }
            var previous = double.PositiveInfinity;
            while (true)
            {
                var coefficients = Coefficients(values);
                // Check points: cos(π(j + ½)/N), the new nodes of degree 2N.
                var doubled = new double[2 * degree + 1];
                var error = 0.0;
                for (var j = 0; j < degree; j++)
                {
                    var t = Math.Cos(Math.PI * (j + 0.5) / degree);
                    var reference = Reference(mid + half * t);
                    doubled[2 * j] = values[j];
                    doubled[2 * j + 1] = reference;
                    error = Math.Max(error, Math.Abs(Evaluate(coefficients, t) - reference));
                }
                doubled[2 * degree] = values[degree];
                if (error <= tolerance)
                {
                    pieces.Add(new Piece(a, b, degree, coefficients, error));
                    return;
                }
                // Geometric convergence predicts the next error as error²/previous; when even that misses
                // the tolerance by far, halving the piece is cheaper than doubling the degree.
                if (degree >= MaxDegree || (previous < double.PositiveInfinity && error * error / previous > 100 * tolerance))
                {
                    break;
                }
                previous = error;
                degree *= 2;
                values = doubled;
            }
            if (depth >= MaxSplitDepth || pieces.Count + depth >= MaxPieces)
            {
                pieces.Add(new Piece(a, b, -1, [], 0));
                return;
            }
            Build(a, mid, depth + 1, pieces);
            Build(mid, b, depth + 1, pieces);
        }

        /// <summary>Chebyshev coefficients of the interpolant through values at t_j = cos(πj/N) (DCT-I).</summary>
        private static double[] Coefficients(double[] values)
        {
            var n = values.Length - 1;
            var c = new double[n + 1];
            for (var k = 0; k <= n; k++)
            {
                var sum = 0.0;
                for (var j = 0; j <= n; j++)
                {
                    var weight = j == 0 || j == n ? 0.5 : 1.0;
                    sum += weight * values[j] * Math.Cos(Math.PI * ((long)j * k % (2 * n)) / n);
                }
                c[k] = 2.0 / n * sum * (k == 0 || k == n ? 0.5 : 1.0);
            }
            return c;
        }

        private static double Evaluate(double[] c, double t)
        {
            double b1 = 0, b2 = 0;
            for (var k = c.Length - 1; k >= 1; k--)
            {
                var b0 = c[k] + 2 * t * b1 - b2;
                b2 = b1;
                b1 = b0;
            }
            return c[0] + t * b1 - b2;
        }
    }
}
