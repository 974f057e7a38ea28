// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Properties;

/// <summary>
/// The Bloch function ψ_nk(x) = e^(ikx)·u_nk(x) of one band and wavevector, normalised over one cell
/// (∫₀^d |ψ|² dx = 1, so ψ is in nm^(−1/2)), evaluated on a caller's grid of positions.
/// Immutable and thread-safe; evaluation does not allocate.
/// </summary>
/// <remarks>
/// <para>Method: the state (ψ, ψ′/m) at the cell origin is the eigenvector of the cell transfer matrix M(E)
/// with eigenvalue e^(ikd) (Bloch's theorem; F. Bloch, Z. Phys. 52, 555 (1929)), E = E_n(k); it is carried
/// through the cell with the closed-form layer matrices and the delta jumps, and ψ inside a layer follows
/// from the layer's state at its left interface. The norm is integrated in closed form per layer.</para>
/// <para>Phase convention: ψ(0) is real and positive at the cell origin x = 0 (the left end of the first
/// element); when |ψ(0)|·√d &lt; 1e-6, ψ′(0)/m is made real and positive instead. Positions outside [0, d]
/// use ψ(x + jd) = e^(ikjd)ψ(x). At a zone point of an open gap ψ is real. At a closed gap the two
/// degenerate states of a zone point are not fixed by k: the lower band gets the standing wave with
/// ψ′(0) = 0, the upper band the one with ψ(0) = 0.</para>
/// <para>Accuracy: relative rounding grows like ε·e^(Σκw) over the evanescent layers of the cell (decay κ,
/// width w: the decaying and growing parts of the state cancel); it is reported as
/// <see cref="RelativeErrorEstimate"/>, and cells where it would exceed 1e-6 (Σκw ≳ 22) are refused. With non-parabolic layers the states of different
/// energies are not orthogonal in the plain inner product (the mass depends on energy).</para>
/// </remarks>
public sealed class BlochFunction
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private readonly double[] _starts;
    private readonly double[] _widths;
    private readonly double[] _s;
    private readonly double[] _masses;
    private readonly Complex[] _u;
    private readonly Complex[] _w;
    private readonly Complex _end;
    private readonly Complex _endW;

    /// <summary>The largest relative rounding error accepted: the amplification e^(Σκw) of evanescent layers times ε.</summary>
    private const double MaxRelativeErrorEstimate = 1e-6;

    private BlochFunction(double errorEstimate, int bandIndex, double k, double energy, double period, double[] starts, double[] widths, double[] s, double[] masses, Complex[] u, Complex[] w, Complex end, Complex endW, Complex origin, Complex originW)
    {
        StateAtOrigin = (origin, originW);
        RelativeErrorEstimate = errorEstimate;
        BandIndex = bandIndex;
        WavevectorPerNanometre = k;
        EnergyElectronVolts = energy;
        PeriodNanometres = period;
        _starts = starts;
        _widths = widths;
        _s = s;
        _masses = masses;
        _u = u;
        _w = w;
        _end = end;
        _endW = endW;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The Bloch wavevector k, 1/nm.</summary>
    public double WavevectorPerNanometre { get; }

    /// <summary>The energy E_n(k), eV.</summary>
    public double EnergyElectronVolts { get; }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>
    /// Estimated relative rounding error of ψ: ε·e^(Σκw) over the evanescent layers of the cell (κ the decay
    /// constant at this energy, w the width), from the forward propagation of the state. At most 1e-6.
    /// </summary>
    public double RelativeErrorEstimate { get; }

    /// <summary>Builds the normalised Bloch function of band <paramref name="bandIndex"/> at <paramref name="wavevectorPerNanometre"/> ∈ [−π/d, π/d].</summary>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or k outside the first zone.</exception>
    /// <exception cref="NotSupportedException">The cell holds an element other than a uniform layer or a delta barrier.</exception>
    /// <exception cref="ArgumentException">The barriers are too opaque at this energy: the estimated relative error
    /// ε·e^(Σκw) would exceed 1e-6 (Σκw ≳ 22), or the transfer matrix exceeds the double range.</exception>
    public static BlochFunction Create(BandStructure structure, int bandIndex, double wavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(structure);
        var energy = structure.EnergyAt(bandIndex, wavevectorPerNanometre); // validates band and k
        var cell = structure.Cell;
        if (!DispersionDerivatives.Supports(cell))
        {
            throw new NotSupportedException("Bloch functions are implemented for cells of uniform layers and delta barriers only.");
        }
        var d = structure.PeriodNanometres;
        var m = structure.Transfer.Evaluate(energy).Matrix;
        if (!double.IsFinite(m.MaxAbsEntry))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"the transfer matrix of the cell at {energy:R} eV exceeds the double range; the Bloch function cannot be propagated through barriers this opaque."), nameof(structure));
        }
        var opacity = 0.0;
        foreach (var element in cell.ElementSpan)
        {
            if (element is Layer barrier && barrier.Potential.ElectronVolts > energy)
            {
                var excess = energy - barrier.Potential.ElectronVolts;
                var mass = barrier.Mass.ElectronMasses * (1 + barrier.NonParabolicityPerElectronVolt * excess);
                opacity += Math.Sqrt(-mass * excess / C) * barrier.Width.Nanometres;
            }
        }
        var errorEstimate = 2.220446049250313e-16 * Math.Exp(opacity);
        if (!(errorEstimate <= MaxRelativeErrorEstimate))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"the barriers of the cell are too opaque at {energy:R} eV for a forward-propagated Bloch function: the summed decay exponent is {opacity:G4}, so the relative rounding error would reach {errorEstimate:G3} (the limit is {MaxRelativeErrorEstimate:G1})."), nameof(structure));
        }
        var lambda = Complex.FromPolarCoordinates(1, wavevectorPerNanometre * d);
        var (u0, w0) = Eigenvector(structure, bandIndex, m, lambda);

        // Propagate through the cell, recording each layer's left-interface state.
        var elements = cell.ElementSpan;
        var layerCount = 0;
        foreach (var element in elements)
        {
            if (element is Layer)
            {
                layerCount++;
            }
        }
        var starts = new double[layerCount];
        var widths = new double[layerCount];
        var s = new double[layerCount];
        var masses = new double[layerCount];
        var us = new Complex[layerCount];
        var ws = new Complex[layerCount];
        Complex u = u0, w = w0;
        double x = 0, norm = 0;
        var index = 0;
        foreach (var element in elements)
        {
            if (element is DeltaBarrier delta)
            {
                w += delta.StrengthElectronVoltNanometres / C * u;
                continue;
            }
            var layer = (Layer)element;
            var excess = energy - layer.Potential.ElectronVolts;
            var mass = layer.Mass.ElectronMasses * (1 + layer.NonParabolicityPerElectronVolt * excess);
            var sl = mass * excess / C;
            var width = layer.Width.Nanometres;
            starts[index] = x;
            widths[index] = width;
            s[index] = sl;
            masses[index] = mass;
            us[index] = u;
            ws[index] = w;
            var (c, sinc) = Functions(sl, width);
            norm += u.Magnitude * u.Magnitude * 0.5 * (width + c * sinc)
                + 2 * mass * (u * Complex.Conjugate(w)).Real * 0.5 * sinc * sinc
                + mass * mass * w.Magnitude * w.Magnitude * IntegralOfSincSquared(sl, width, c, sinc);
            (u, w) = (c * u + mass * sinc * w, -sl / mass * sinc * u + c * w);
            x += width;
            index++;
        }
        // Normalise and fix the phase.
        var scale = 1 / Math.Sqrt(norm);
        var phase = u0.Magnitude * scale * Math.Sqrt(d) >= 1e-6 ? Complex.Conjugate(u0) / u0.Magnitude : Complex.Conjugate(w0) / w0.Magnitude;
        var factor = scale * phase;
        for (var i = 0; i < layerCount; i++)
        {
            us[i] *= factor;
            ws[i] *= factor;
        }
        return new BlochFunction(errorEstimate, bandIndex, wavevectorPerNanometre, energy, d, starts, widths, s, masses, us, ws, u * factor, w * factor, u0 * factor, w0 * factor);
    }

    private static (Complex U, Complex W) Eigenvector(BandStructure structure, int bandIndex, TransferMatrix m, Complex lambda)
    {
        // (M − λ) v = 0: v = (M12, λ − M11) or (λ − M22, M21); take the better conditioned.
        var a = (new Complex(m.M12, 0), lambda - m.M11);
        var b = (lambda - m.M22, new Complex(m.M21, 0));
        var na = a.Item1.Magnitude + a.Item2.Magnitude;
        var nb = b.Item1.Magnitude + b.Item2.Magnitude;
        var threshold = 64 * 2.220446049250313e-16 * (m.MaxAbsEntry + 1);
        if (Math.Max(na, nb) > threshold)
        {
            return na >= nb ? a : b;
        }
        // M = λI: a closed gap at a zone point; split the degenerate pair by parity at the origin.
        var band = structure.GetBand(bandIndex);
        var phase = Math.Abs(lambda.Imaginary) < 0.5 && lambda.Real > 0 ? ZonePoint.Center : ZonePoint.Boundary;
        var isTop = band.TopZonePoint == phase;
        return isTop ? (Complex.One, Complex.Zero) : (Complex.Zero, Complex.One);
    }

    /// <summary>c = cos(√s·t) and S = sin(√s·t)/√s (hyperbolic for s &lt; 0), unscaled.</summary>
    private static (double C, double S) Functions(double s, double t)
    {
        UniformLayerPropagator.Evaluate(s, t, out var c, out var sinc, out _, out _, out var logScale);
        if (logScale != 0)
        {
            var grow = Math.Exp(logScale);
            c *= grow;
            sinc *= grow;
        }
        return (c, sinc);
    }

    /// <summary>∫₀^w S(t)² dt = (w − c S)/(2s), by its power series in z = s w² where that difference cancels.</summary>
    private static double IntegralOfSincSquared(double s, double w, double c, double sinc)
    {
        var z = s * w * w;
        if (Math.Abs(z) >= 1)
        {
            return (w - c * sinc) / (2 * s);
        }
        // S(t)² = t² Σ_j b_j (s t²)^j with b the Cauchy square of (−1)^j/(2j+1)!; integrate term by term.
        const int terms = 20;
        Span<double> a = stackalloc double[terms];
        double factorial = 1;
        for (var j = 0; j < terms; j++)
        {
            if (j > 0)
            {
                factorial *= (2 * j) * (2 * j + 1);
            }
            a[j] = (j % 2 == 0 ? 1 : -1) / factorial;
        }
        double sum = 0, power = 1;
        for (var j = 0; j < terms; j++)
        {
            double b = 0;
            for (var i = 0; i <= j; i++)
            {
                b += a[i] * a[j - i];
            }
            sum += b * power / (2 * j + 3);
            power *= z;
        }
        return w * w * w * sum;
    }

    /// <summary>ψ(x) in nm^(−1/2) at <paramref name="positionNanometres"/> (any real x).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position is not finite.</exception>
    public Complex ValueAt(double positionNanometres)
    {
        Preconditions.CheckFinite(positionNanometres);
        return Value(positionNanometres);
    }

    /// <summary>
    /// Effectively computes <c>ψ(positionsNanometres[i])</c> into <paramref name="destinationReal"/> and
    /// <paramref name="destinationImaginary"/> (nm^(−1/2)); does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">A destination is shorter than the input, or a position is not finite.</exception>
    public void Evaluate(ReadOnlySpan<double> positionsNanometres, Span<double> destinationReal, Span<double> destinationImaginary)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationReal.Length, nameof(positionsNanometres), nameof(destinationReal));
        Preconditions.CheckDestination(positionsNanometres.Length, destinationImaginary.Length, nameof(positionsNanometres), nameof(destinationImaginary));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var value = Value(positionsNanometres[i]);
            destinationReal[i] = value.Real;
            destinationImaginary[i] = value.Imaginary;
        }
    }

    /// <summary>Effectively computes <c>destination[i] = ψ(positionsNanometres[i])</c> (nm^(−1/2)); does not allocate.</summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a position is not finite.</exception>
    public void Evaluate(ReadOnlySpan<double> positionsNanometres, Span<Complex> destination)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destination.Length, nameof(positionsNanometres), nameof(destination));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            destination[i] = Value(positionsNanometres[i]);
        }
    }

    /// <summary>
    /// Effectively computes the cell-periodic part u(x) = e^(−ikx)ψ(x) at each position into
    /// <paramref name="destinationReal"/> and <paramref name="destinationImaginary"/> (nm^(−1/2)); does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException">A destination is shorter than the input, or a position is not finite.</exception>
    public void EvaluatePeriodicPart(ReadOnlySpan<double> positionsNanometres, Span<double> destinationReal, Span<double> destinationImaginary)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationReal.Length, nameof(positionsNanometres), nameof(destinationReal));
        Preconditions.CheckDestination(positionsNanometres.Length, destinationImaginary.Length, nameof(positionsNanometres), nameof(destinationImaginary));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var x = positionsNanometres[i];
            var value = Value(x) * Complex.FromPolarCoordinates(1, -WavevectorPerNanometre * x);
            destinationReal[i] = value.Real;
            destinationImaginary[i] = value.Imaginary;
        }
    }

    /// <summary>Effectively computes <c>destination[i] = |ψ(positionsNanometres[i])|²</c> in 1/nm (periodic in x); does not allocate.</summary>
    /// <exception cref="ArgumentException">The destination is shorter than the input, or a position is not finite.</exception>
    public void ProbabilityDensities(ReadOnlySpan<double> positionsNanometres, Span<double> destinationPerNanometre)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destinationPerNanometre.Length, nameof(positionsNanometres), nameof(destinationPerNanometre));
        CheckPositions(positionsNanometres);
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            var value = Value(positionsNanometres[i]);
            destinationPerNanometre[i] = value.Real * value.Real + value.Imaginary * value.Imaginary;
        }
    }

    private static void CheckPositions(ReadOnlySpan<double> positions)
    {
        for (var i = 0; i < positions.Length; i++)
        {
            if (!double.IsFinite(positions[i]))
            {
                var name = string.Create(CultureInfo.InvariantCulture, $"positionsNanometres[{i}]");
                throw new ArgumentOutOfRangeException("positionsNanometres", positions[i], $"{name} must be a finite position in nm; got {Preconditions.Format(positions[i])}.");
            }
        }
    }

    private Complex Value(double x)
    {
        var d = PeriodNanometres;
        var cells = Math.Floor(x / d);
        var local = x - cells * d;
        if (local >= d)
        {
            local = 0; // rounding at a multiple of d
            cells += 1;
        }
        var value = StateAt(local).Psi;
        return cells == 0 ? value : value * Complex.FromPolarCoordinates(1, WavevectorPerNanometre * d * cells);
    }

    /// <summary>(ψ, ψ′/m) at a position inside the cell, x ∈ [0, d], by propagation from the layer's left interface (no Bloch reduction).</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAt(double x)
    {
        if (_starts.Length == 0)
        {
            return (_end, _endW);
        }
        int lo = 0, hi = _starts.Length - 1;
        while (lo < hi)
        {
            var mid = (lo + hi + 1) >> 1;
            if (_starts[mid] <= x)
            {
                lo = mid;
            }
            else
            {
                hi = mid - 1;
            }
        }
        var t = Math.Clamp(x - _starts[lo], 0, _widths[lo]);
        var (c, sinc) = Functions(_s[lo], t);
        var u = _u[lo];
        var w = _w[lo];
        var mass = _masses[lo];
        return (c * u + mass * sinc * w, -_s[lo] / mass * sinc * u + c * w);
    }

    /// <summary>(ψ, ψ′/m) at the right end of the cell after every element (deltas included): equals e^(ikd) times the state at 0.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtEnd => (_end, _endW);

    /// <summary>(ψ, ψ′/m) at the left end of the cell, before any element.</summary>
    internal (Complex Psi, Complex DerivativeOverMass) StateAtOrigin { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Bloch function: band {BandIndex}, k = {WavevectorPerNanometre:G8} /nm, E = {EnergyElectronVolts:G10} eV, period {PeriodNanometres:G6} nm");
}
