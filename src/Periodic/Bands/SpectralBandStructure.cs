// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Bands;

/// <summary>
/// Band structure of a cell that is one Fourier-series segment (an optical lattice, a Mathieu potential, a
/// bichromatic lattice), with its band edges from the central equation: exponentially convergent, to about
/// 1e-14 relative, with an error estimate per edge. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Method: in one dimension band n runs between the n-th Bloch energy at the zone centre and the n-th at the
/// zone boundary (Magnus and Winkler, Hill's Equation, 1966), so the 2·count + 1 edges are the lowest count + 1
/// energies at k = 0 and k = π/d, from <see cref="PlaneWaveSolver"/> (a dense eigensolve refined by a
/// Rayleigh–Ritz step). The plane-wave basis grows until the change of every edge between two sizes is at the
/// rounding level of the energies; the error reported for each edge is the larger of that last change and the
/// rounding level, so it tracks the true error rather than bounding it from far above.</para>
/// <para><see cref="Bands"/> carries these edges; E(k), k(E) and the oscillation count inside it come from the
/// transfer matrix of the same cell on a Magnus mesh four times finer than the segment's own (and finer still for
/// deep lattices, in proportion to √(depth/E_R)), and that
/// count is checked at the middle of every band and gap against the spectral edges.</para>
/// <para>Tolerance: an edge E has converged when its error is at most <see cref="PlaneWaveOptions.RelativeTolerance"/> × max(|E|, S), with
/// S = max(V_max − V_min, ħ²(π/d)²/2m) the cell's energy scale (for an optical lattice S is the larger of the
/// depth and the recoil energy).</para>
/// </remarks>
public sealed class SpectralBandStructure
{
    /// <summary>Most bands the spectral path computes at once (the plane-wave solver returns at most 200 energies per wavevector).</summary>
    public const int MaxBandCount = 199;

    /// <summary>Tolerance at the floor of <see cref="PlaneWaveOptions"/>: the basis grows until the change between sizes is rounding.</summary>
    private static readonly PlaneWaveOptions ToRounding = PlaneWaveOptions.Create(1e-15);

    private readonly double[] _errors;

    private SpectralBandStructure(BandStructure bands, double[] errors, bool converged, double relativeTolerance, int basisSize, double scale)
    {
        Bands = bands;
        _errors = errors;
        EdgeErrorsElectronVolts = new ReadOnlyCollection<double>(errors);
        Converged = converged;
        RelativeTolerance = relativeTolerance;
        BasisSize = basisSize;
        EnergyScaleElectronVolts = scale;
    }

    /// <summary>The band structure, with the spectral edges.</summary>
    public BandStructure Bands { get; }

    /// <summary>Estimated error of each edge, eV: entry 2(n − 1) is the bottom of band n, entry 2n − 1 its top.</summary>
    public IReadOnlyList<double> EdgeErrorsElectronVolts { get; }

    /// <summary>The largest estimated edge error, eV.</summary>
    public double MaxEdgeErrorElectronVolts => _errors.Max();

    /// <summary>The largest estimated edge error relative to max(|E|, <see cref="EnergyScaleElectronVolts"/>).</summary>
    public double MaxRelativeError => Bands.MaxRelativeEdgeError(_errors, EnergyScaleElectronVolts);

    /// <summary>True when every edge met <see cref="RelativeTolerance"/>.</summary>
    public bool Converged { get; }

    /// <summary>The relative tolerance requested.</summary>
    public double RelativeTolerance { get; }

    /// <summary>Number of plane waves in the largest basis used (2N + 1).</summary>
    public int BasisSize { get; }

    /// <summary>The energy scale S of the tolerance test, eV.</summary>
    public double EnergyScaleElectronVolts { get; }

    /// <summary>
    /// The solver choice for band structures: true when <paramref name="cell"/> is a single <see cref="FourierSegment"/>
    /// and <paramref name="count"/> bands fit the spectral path (at most <see cref="MaxBandCount"/>). A band-structure
    /// facade calls this to send pure-Fourier cells here rather than to the step-halving Magnus refinement.
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    public static bool AppliesTo(UnitCell cell, int count)
    {
        ArgumentNullException.ThrowIfNull(cell);
        return cell.Elements.Count == 1 && cell.Elements[0] is FourierSegment && count >= 1 && count <= MaxBandCount;
    }

    /// <summary>Computes the lowest <paramref name="count"/> bands of a cell made of one Fourier-series segment.</summary>
    /// <param name="cell">A cell for which <see cref="AppliesTo"/> is true.</param>
    /// <param name="count">Number of bands, 1 to <see cref="MaxBandCount"/>.</param>
    /// <param name="options">The relative tolerance <see cref="Converged"/> reports on (<see cref="PlaneWaveOptions.Default"/>, 1e-12, when
    /// null); the edges themselves are always computed to the rounding level.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentException">The cell is not one Fourier segment, or a value lies outside its range.</exception>
    /// <exception cref="BandSearchException">The oscillation count disagrees with the spectral edges.</exception>
    public static SpectralBandStructure Compute(UnitCell cell, int count, PlaneWaveOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(cell);
        Preconditions.CheckRange(count, 1, MaxBandCount);
        var relativeTolerance = (options ?? PlaneWaveOptions.Default).RelativeTolerance;
        if (cell.Elements.Count != 1 || cell.Elements[0] is not FourierSegment segment)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"cell must be a single Fourier-series segment for the spectral path; got {cell.Elements.Count} element(s) starting with {cell.Elements[0].GetType().Name}."), nameof(cell));
        }
        var solver = PlaneWaveSolver.Create(segment);
        var boundary = Math.PI / solver.PeriodNanometres;
        // Tolerance at the floor, so the basis grows until the change between sizes is rounding: the last change then
        // measures the error of the larger basis instead of overstating it by the factor of one enlargement.
        var centre = solver.EnergiesAt(0, count + 1, ToRounding);
        var edge = solver.EnergiesAt(boundary, count + 1, ToRounding);
        var edges = new double[2 * count + 1];
        var errors = new double[2 * count + 1];
        for (var i = 0; i <= 2 * count; i++)
        {
            // Band n = i/2 + 1 (bottom, even i) or (i + 1)/2 (top, odd i); odd bands start at the centre.
            var band = i % 2 == 0 ? i / 2 + 1 : (i + 1) / 2;
            var atCentre = (band % 2 == 1) == (i % 2 == 0);
            var spectrum = atCentre ? centre : edge;
            edges[i] = spectrum.EnergiesElectronVolts[band - 1];
            errors[i] = spectrum.EstimatedErrorsElectronVolts[band - 1];
        }
        var scale = solver.EnergyScaleElectronVolts;
        var converged = true;
        for (var i = 0; i < 2 * count; i++)
        {
            converged &= errors[i] <= relativeTolerance * Math.Max(Math.Abs(edges[i]), scale);
        }
        // The transfer matrix serves E(k) and the count check inside narrow deep-lattice bands: its Magnus error must stay
        // well below their widths, so the mesh follows the local wavenumber √(depth/E_R)·π/d as well as the harmonics.
        var recoil = FourierSegment.RecoilEnergy(segment.Width, segment.Mass).ElectronVolts;
        var spread = segment.MaximumPotential.ElectronVolts - segment.MinimumPotential.ElectronVolts;
        var steps = 4.0 * segment.StepCount * Math.Max(1, Math.Sqrt(spread / recoil) / 2);
        var fine = UnitCell.Create(segment.WithStepCount((int)Math.Min(steps, 4_000_000)));
        var bands = BandStructure.FromEdges(CellTransfer.Create(fine), edges, errors);
        return new SpectralBandStructure(bands, errors[..(2 * count)], converged, relativeTolerance, Math.Max(centre.BasisSize, edge.BasisSize), scale);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"SpectralBandStructure: {Bands.Bands.Count} band(s), basis {BasisSize} plane waves, max edge error {MaxEdgeErrorElectronVolts:G3} eV{(Converged ? "" : " (NOT converged)")}");
}
