// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Numerics;
using MathNet.Numerics.IntegralTransforms;
using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Structures;

namespace Periodic.OpticalLattices;

/// <summary>
/// The maximally localised Wannier function of one isolated band of a Fourier-series cell (an optical lattice), on a
/// uniform grid, with its spread, the on-site integral ∫|w|⁴dx and the tunnelling amplitudes J₁, J₂, J₃ of the band.
/// Immutable.
/// </summary>
/// <remarks>
/// <para>Method: the Bloch states of the band at N_k equally spaced wavevectors come from the central equation
/// (<see cref="PlaneWaveSolver"/>, basis size from its convergence test at the zone centre and boundary). Their
/// phases are fixed by parallel transport (each overlap ⟨u_k|u_k+Δk⟩ real and positive) and the Berry phase left over
/// at the closing of the zone is spread evenly over the N_k steps: in one dimension, for one band, this is the gauge
/// that minimises the spread, and the result is Marzari and Vanderbilt's maximally localised Wannier function
/// (N. Marzari, D. Vanderbilt, Phys. Rev. B 56, 12847 (1997)). It is real after one global phase, and for an
/// inversion-symmetric lattice it is Kohn's Wannier function, symmetric or antisymmetric about a site (W. Kohn,
/// Phys. Rev. 115, 809 (1959)). w(x) = (1/N_k) Σ_k ψ_k(x) is a finite Fourier series on the supercell of N_k sites and
/// is evaluated exactly on the grid by one FFT; the grid is fine enough (more than 4× the highest wavenumber) that
/// the trapezoid rule gives ∫|w|²dx and ∫|w|⁴dx exactly up to rounding.</para>
/// <para>N_k starts at 32 and doubles (to at most <see cref="MaxKPointCount"/>) until |w| at the sites half a
/// supercell away is below 1e-13 of its peak, so the periodic images of the supercell change nothing at that level;
/// <see cref="TailRatio"/> reports what was reached.</para>
/// <para>Hopping: E(k) = E₀ − 2 Σₙ Jₙ cos(nkd) is the band's Fourier series, so Jₙ = −(1/N_k) Σ_k E(k) cos(nkd), exact
/// for the discrete mesh up to the aliased J_{N_k−n}, which the tail test makes negligible. J₁ &gt; 0 for the lowest band.</para>
/// </remarks>
public sealed class WannierFunction
{
    /// <summary>Largest number of wavevectors (and of supercell sites).</summary>
    public const int MaxKPointCount = 4096;

    private const double TailTarget = 1e-13;

    private readonly double[] _positions;
    private readonly double[] _real;
    private readonly double[] _imaginary;
    private readonly double[] _hopping;

    private WannierFunction(int bandIndex, double period, int kPoints, double[] positions, double[] real, double[] imaginary, double[] hopping,
        double meanEnergy, double onSite, double centre, double spread, double normError, double overlap, double tail)
    {
        BandIndex = bandIndex;
        PeriodNanometres = period;
        KPointCount = kPoints;
        _positions = positions;
        _real = real;
        _imaginary = imaginary;
        _hopping = hopping;
        PositionsNanometres = new ReadOnlyCollection<double>(positions);
        Values = new ReadOnlyCollection<double>(real);
        ImaginaryValues = new ReadOnlyCollection<double>(imaginary);
        HoppingElectronVolts = new ReadOnlyCollection<double>(hopping);
        MeanEnergyElectronVolts = meanEnergy;
        OnSiteIntegralPerNanometre = onSite;
        CentreNanometres = centre;
        SpreadNanometresSquared = spread;
        NormalisationError = normError;
        MaxTranslateOverlap = overlap;
        TailRatio = tail;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The period d of the cell, nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>Number of wavevectors N_k (the supercell holds as many sites).</summary>
    public int KPointCount { get; }

    /// <summary>Grid positions x, nm, over the whole supercell, centred on the home site: x ∈ [c − N_k d/2, c + N_k d/2).</summary>
    public IReadOnlyList<double> PositionsNanometres { get; }

    /// <summary>w(x) at <see cref="PositionsNanometres"/>, nm^(−1/2) (real after the global phase).</summary>
    public IReadOnlyList<double> Values { get; }

    /// <summary>The imaginary part left after the global phase, nm^(−1/2): rounding only for a real potential.</summary>
    public IReadOnlyList<double> ImaginaryValues { get; }

    /// <summary>The tunnelling amplitudes J₁, J₂, J₃ to the first three neighbours, eV (E(k) = E₀ − 2ΣJₙcos(nkd)).</summary>
    public IReadOnlyList<double> HoppingElectronVolts { get; }

    /// <summary>The band's mean energy E₀ (its on-site energy), eV.</summary>
    public double MeanEnergyElectronVolts { get; }

    /// <summary>The on-site integral ∫|w(x)|⁴dx, 1/nm.</summary>
    public double OnSiteIntegralPerNanometre { get; }

    /// <summary>The centre ⟨x⟩, nm, measured from the start of the cell (in [−d/2, d/2) up to rounding).</summary>
    public double CentreNanometres { get; }

    /// <summary>The spread ⟨x²⟩ − ⟨x⟩², nm².</summary>
    public double SpreadNanometresSquared { get; }

    /// <summary>|∫|w|²dx − 1| on the grid.</summary>
    public double NormalisationError { get; }

    /// <summary>The largest |∫w*(x) w(x − nd) dx| for n = 1 … 3 (zero for exact Wannier functions).</summary>
    public double MaxTranslateOverlap { get; }

    /// <summary>max |w| over the site half a supercell away, relative to max |w|: the size of the periodic images neglected.</summary>
    public double TailRatio { get; }

    /// <summary>Computes the Wannier function of band <paramref name="bandIndex"/> of a cell made of one Fourier segment.</summary>
    /// <param name="cell">One <see cref="FourierSegment"/> (e.g. <see cref="OpticalLattice.Cell"/>).</param>
    /// <param name="bandIndex">The band, 1 to 50; it must be isolated (open gaps below and above).</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentException">The cell is not one Fourier segment, the band index is out of range, or the band is not isolated.</exception>
    public static WannierFunction Compute(UnitCell cell, int bandIndex)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(bandIndex, 1, 50);
        var bands = SpectralBandStructure.Compute(cell, bandIndex);
        CheckIsolated(bands, bandIndex);
        var segment = (FourierSegment)cell.Elements[0];
        var solver = PlaneWaveSolver.Create(segment);
        var cutoff = (bands.BasisSize - 1) / 2;
        for (var kPoints = 32; ; kPoints *= 2)
        {
            var result = Build(solver, bandIndex, cutoff, kPoints);
            if (result.TailRatio <= TailTarget || kPoints >= MaxKPointCount)
            {
                return result;
            }
        }
    }

    /// <summary>Refuses a band whose gap below or above is not resolved: its Wannier function would not be localised.</summary>
    internal static void CheckIsolated(SpectralBandStructure bands, int bandIndex)
    {
        var structure = bands.Bands;
        var scale = bands.EnergyScaleElectronVolts;
        var above = structure.Gaps[bandIndex - 1];
        var below = bandIndex > 1 ? structure.Gaps[bandIndex - 2] : (Bands.Gap?)null;
        foreach (var gap in new[] { below, above })
        {
            // A gap of 1e-10 S or less is below what the basis and double rounding resolve for this purpose (the
            // Wannier function would decay over more than 1e5 sites).
            if (gap is { } g && (g.IsClosed || g.WidthElectronVolts <= 1e-10 * scale))
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"band {bandIndex} is not isolated: the gap between bands {g.Index} and {g.Index + 1} is {g.WidthElectronVolts:G3} eV ({g.WidthElectronVolts / scale:G3} of the energy scale), closed or below 1e-10 of it, so no localised Wannier function of that band alone exists; choose another band or a deeper lattice."),
                    "bandIndex");
            }
        }
    }

    private static WannierFunction Build(PlaneWaveSolver solver, int band, int cutoff, int kPoints)
    {
        var d = solver.PeriodNanometres;
        var size = 2 * cutoff + 1;
        var energies = new double[kPoints];
        var states = new Complex[kPoints][];
        for (var j = 0; j < kPoints; j++)
        {
            var k = -Math.PI / d + 2 * Math.PI * j / (kPoints * d);
            var (e, v) = solver.Solve(k, cutoff, band, true);
            energies[j] = e[band - 1];
            states[j] = v![band - 1];
        }
        // Parallel transport: ⟨u_{j−1}|u_j⟩ real and positive.
        for (var j = 1; j < kPoints; j++)
        {
            var overlap = Overlap(states[j - 1], states[j], 0);
            Scale(states[j], Complex.Conjugate(overlap) / overlap.Magnitude);
        }
        // Closing the loop: u at k + 2π/d has the coefficients of u at k shifted by one plane wave.
        var closing = Overlap(states[kPoints - 1], states[0], 1);
        var berry = closing.Phase;
        for (var j = 1; j < kPoints; j++)
        {
            Scale(states[j], Complex.FromPolarCoordinates(1, berry * j / kPoints));
        }
        // w(x) on the supercell L = N_k d: the plane wave k_j + nG has wavenumber (2π/L)·m, m = j − N_k/2 + n·N_k.
        var maxM = kPoints * (cutoff + 1);
        var points = 1;
        while (points <= 4 * maxM)
        {
            points *= 2;
        }
        var spectrum = new Complex[points];
        var norm = 1.0 / (kPoints * Math.Sqrt(d));
        for (var j = 0; j < kPoints; j++)
        {
            for (var i = 0; i < size; i++)
            {
                var m = j - kPoints / 2 + (i - cutoff) * kPoints;
                spectrum[((m % points) + points) % points] += states[j][i] * norm;
            }
        }
        Fourier.Inverse(spectrum, FourierOptions.NoScaling);
        var length = kPoints * d;
        var h = length / points;
        var perSite = points / kPoints;
        // Roll the home site (the one holding the centre) to the middle of the grid and fix the global phase.
        var centreIndex = CircularCentre(spectrum, points);
        var home = (int)Math.Floor((double)centreIndex / perSite + 0.5);
        var shift = ((home * perSite - points / 2) % points + points) % points;
        var rolled = new Complex[points];
        for (var p = 0; p < points; p++)
        {
            rolled[p] = spectrum[(p + shift) % points];
        }
        var square = Complex.Zero;
        foreach (var value in rolled)
        {
            square += value * value;
        }
        var phase = Complex.FromPolarCoordinates(1, -0.5 * square.Phase);
        var positions = new double[points];
        var real = new double[points];
        var imaginary = new double[points];
        double sum2 = 0, sum4 = 0, first = 0, peak = 0;
        for (var p = 0; p < points; p++)
        {
            var value = rolled[p] * phase;
            positions[p] = (p - points / 2) * h;
            real[p] = value.Real;
            imaginary[p] = value.Imaginary;
            var density = value.Real * value.Real + value.Imaginary * value.Imaginary;
            sum2 += density;
            sum4 += density * density;
            first += positions[p] * density;
            peak = Math.Max(peak, Math.Sqrt(density));
        }
        var centre = first * h;
        double second = 0;
        for (var p = 0; p < points; p++)
        {
            var density = real[p] * real[p] + imaginary[p] * imaginary[p];
            second += (positions[p] - centre) * (positions[p] - centre) * density;
        }
        var overlapMax = 0.0;
        for (var n = 1; n <= Math.Min(3, kPoints - 1); n++)
        {
            var sum = Complex.Zero;
            for (var p = 0; p < points; p++)
            {
                sum += Complex.Conjugate(rolled[p]) * rolled[(p - n * perSite + points) % points];
            }
            overlapMax = Math.Max(overlapMax, (sum * h).Magnitude);
        }
        var tail = 0.0;
        for (var p = 0; p < perSite; p++)
        {
            tail = Math.Max(tail, rolled[p].Magnitude); // the site at the edge of the supercell, half of it away
        }
        var hopping = new double[3];
        var mean = energies.Average();
        for (var n = 1; n <= 3; n++)
        {
            var sum = 0.0;
            for (var j = 0; j < kPoints; j++)
            {
                var kd = -Math.PI + 2 * Math.PI * j / kPoints;
                sum += energies[j] * Math.Cos(n * kd);
            }
            hopping[n - 1] = -sum / kPoints;
        }
        return new WannierFunction(band, d, kPoints, positions, real, imaginary, hopping, mean, sum4 * h, centre, second * h,
            Math.Abs(sum2 * h - 1), overlapMax, tail / peak);
    }

    /// <summary>⟨a|b⟩ with b's plane waves shifted by <paramref name="shift"/> (b at k + shift·G).</summary>
    private static Complex Overlap(Complex[] a, Complex[] b, int shift)
    {
        var sum = Complex.Zero;
        for (var i = 0; i < a.Length; i++)
        {
            var other = i + shift;
            if (other < b.Length)
            {
                sum += Complex.Conjugate(a[i]) * b[other];
            }
        }
        return sum;
    }

    private static void Scale(Complex[] values, Complex factor)
    {
        for (var i = 0; i < values.Length; i++)
        {
            values[i] *= factor;
        }
    }

    /// <summary>The grid index of the circular mean of |w|² (the centre on the periodic supercell).</summary>
    private static int CircularCentre(Complex[] values, int points)
    {
        var sum = Complex.Zero;
        for (var p = 0; p < points; p++)
        {
            var density = values[p].Magnitude * values[p].Magnitude;
            sum += density * Complex.FromPolarCoordinates(1, 2 * Math.PI * p / points);
        }
        var angle = sum.Phase < 0 ? sum.Phase + 2 * Math.PI : sum.Phase;
        return (int)Math.Round(angle / (2 * Math.PI) * points) % points;
    }

    /// <summary>A copy of the grid restricted to |x − centre| ≤ <paramref name="sites"/>·d (for tables and plots).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="sites"/> is not positive and finite.</exception>
    public (double[] PositionsNanometres, double[] Values) Window(double sites)
    {
        Preconditions.CheckPositiveFinite(sites);
        var half = sites * PeriodNanometres;
        var chosen = Enumerable.Range(0, _positions.Length).Where(p => Math.Abs(_positions[p]) <= half).ToArray();
        return (chosen.Select(p => _positions[p]).ToArray(), chosen.Select(p => _real[p]).ToArray());
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"WannierFunction band {BandIndex}: J = [{_hopping[0]:G6}, {_hopping[1]:G6}, {_hopping[2]:G6}] eV, ∫|w|⁴ = {OnSiteIntegralPerNanometre:G8} /nm, spread {SpreadNanometresSquared:G6} nm², {KPointCount} k-points");
}
