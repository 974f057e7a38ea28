// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using MathNet.Numerics.Integration;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Properties;

/// <summary>
/// Minibands with in-plane motion: E_n(k_z, k∥) for per-layer masses, the miniband edges against k∥ and the in-plane
/// effective mass of each miniband at its bottom. Every energy comes from the exact engine applied to the cell seen at
/// k∥ (<see cref="InPlaneMotion"/>); nothing is expanded in k∥.
/// </summary>
/// <remarks>
/// Model: the single-band envelope-function approximation with BenDaniel–Duke matching; each layer's in-plane
/// dispersion isotropic with its own mass. Non-parabolic layers carry the energy-dependent mass in both the z and the
/// in-plane terms (see <see cref="InPlaneMotion"/>); their energies are found as the fixed point E = E_n(cell frozen at E),
/// by secant steps. Band parameters are uncertain by 10 % or more and strain and band mixing are not modelled: treat the
/// results as a design guide.
/// </remarks>
public static class InPlaneDispersion
{
    private const int MaxFixedPointIterations = 60;

    /// <summary>
    /// The band structure at in-plane wavevector <paramref name="inPlaneWavevectorPerNanometre"/>: the bands of the cell seen
    /// at k∥, so that <see cref="BandStructure.EnergyAt"/> gives E_n(k_z, k∥) and every property derived from it applies.
    /// For cells of parabolic layers, delta barriers and Fourier segments (exact).
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">k∥ or the count is out of range.</exception>
    /// <exception cref="ArgumentException">The cell holds a non-parabolic layer (use <see cref="EdgesAt"/> or
    /// <see cref="EnergyAt"/>, which solve the energy-dependent case) or an element not covered by <see cref="InPlaneMotion"/>.</exception>
    /// <exception cref="BandSearchException">The band search failed.</exception>
    public static BandStructure BandsAt(UnitCell cell, double inPlaneWavevectorPerNanometre, int count, BandSearchOptions? options = null) =>
        BandStructure.Compute(InPlaneMotion.CellAt(cell, inPlaneWavevectorPerNanometre), count, options);

    /// <summary>
    /// E_n(k_z, k∥) in eV for any cell covered by <see cref="InPlaneMotion"/>, non-parabolic layers included (fixed point
    /// of the reference energy, to the band search's accuracy).
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The band index, k_z (outside [−π/d, π/d]) or k∥ is out of range.</exception>
    /// <exception cref="ArgumentException">An element is not covered by <see cref="InPlaneMotion"/>.</exception>
    /// <exception cref="BandSearchException">The band search or the fixed-point iteration failed.</exception>
    public static double EnergyAt(UnitCell cell, int bandIndex, double wavevectorPerNanometre, double inPlaneWavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(cell);
        InPlaneMotion.CheckWavevector(inPlaneWavevectorPerNanometre, nameof(inPlaneWavevectorPerNanometre));
        var flat = BandStructure.Compute(cell, Preconditions.CheckRange(bandIndex, 1, 10000));
        var start = flat.EnergyAt(bandIndex, wavevectorPerNanometre);
        if (InPlaneMotion.IsParabolic(cell))
        {
            return BandsAt(cell, inPlaneWavevectorPerNanometre, bandIndex).EnergyAt(bandIndex, wavevectorPerNanometre);
        }
        return FixedPoint(e => BandStructure.Compute(InPlaneMotion.CellAt(cell, inPlaneWavevectorPerNanometre, e), bandIndex)
            .EnergyAt(bandIndex, wavevectorPerNanometre), start, flat.MaxEdgeErrorElectronVolts, out _);
    }

    /// <summary>
    /// The edges of bands 1 … <paramref name="count"/> at in-plane wavevector k∥, exact for every cell covered by
    /// <see cref="InPlaneMotion"/> (non-parabolic layers by the fixed point of the reference energy, one per edge).
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">k∥ or the count is out of range.</exception>
    /// <exception cref="ArgumentException">An element is not covered by <see cref="InPlaneMotion"/>.</exception>
    /// <exception cref="BandSearchException">The band search or the fixed-point iteration failed.</exception>
    public static IReadOnlyList<InPlaneBandEdges> EdgesAt(UnitCell cell, int count, double inPlaneWavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(cell);
        InPlaneMotion.CheckWavevector(inPlaneWavevectorPerNanometre, nameof(inPlaneWavevectorPerNanometre));
        Preconditions.CheckRange(count, 1, 10000);
        var k = inPlaneWavevectorPerNanometre;
        var result = new InPlaneBandEdges[count];
        if (InPlaneMotion.IsParabolic(cell))
        {
            var bands = BandsAt(cell, k, count);
            for (var n = 1; n <= count; n++)
            {
                var band = bands.GetBand(n);
                result[n - 1] = new InPlaneBandEdges(n, k, band.BottomElectronVolts, band.TopElectronVolts,
                    band.BottomErrorElectronVolts, band.TopErrorElectronVolts, 0);
            }
            return result;
        }
        var flat = BandStructure.Compute(cell, count);
        for (var n = 1; n <= count; n++)
        {
            var index = n;
            var band = flat.GetBand(n);
            var bottom = FixedPoint(e => BandStructure.Compute(InPlaneMotion.CellAt(cell, k, e), index).GetBand(index).BottomElectronVolts,
                band.BottomElectronVolts, band.BottomErrorElectronVolts, out var i1);
            var top = FixedPoint(e => BandStructure.Compute(InPlaneMotion.CellAt(cell, k, e), index).GetBand(index).TopElectronVolts,
                band.TopElectronVolts, band.TopErrorElectronVolts, out var i2);
            var tolerance = Tolerance(bottom, band.BottomErrorElectronVolts);
            result[n - 1] = new InPlaneBandEdges(n, k, bottom, top, band.BottomErrorElectronVolts + tolerance,
                band.TopErrorElectronVolts + Tolerance(top, band.TopErrorElectronVolts), i1 + i2);
        }
        return result;
    }

    /// <summary>
    /// The in-plane effective mass of band <paramref name="bandIndex"/> at its bottom (k_z at the band's bottom zone point,
    /// k∥ → 0): m∥ = ħ²/(2 dE/d(k∥²)).
    /// </summary>
    /// <remarks>
    /// <para>Parabolic cells: by the Hellmann–Feynman theorem (H. Hellmann, Einführung in die Quantenchemie, 1937;
    /// R. P. Feynman, Phys. Rev. 56, 340 (1939)) applied to the in-plane term ħ²k∥²/2m(z), dE/d(k∥²) = (ħ²/2)⟨1/m⟩ with the
    /// Bloch state's probability in each layer, so 1/m∥ = Σ_layers P_layer/m_layer. The probabilities are integrated from
    /// <see cref="BlochFunction"/> by Gauss–Legendre rules of 32 and 64 points per layer; their difference and the Bloch
    /// function's own error estimate make the reported error.</para>
    /// <para>Cells with non-parabolic layers: the mass in the in-plane term depends on energy, so the theorem picks up the
    /// energy dependence; the slope is then taken from the exact bottoms at k∥² = h and h/2 (h = 1e-3 /nm²) with Richardson
    /// extrapolation, and the change under that extrapolation is the reported error.</para>
    /// </remarks>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    /// <exception cref="ArgumentException">An element is not covered by <see cref="InPlaneMotion"/>, or the Bloch function cannot be built (too opaque barriers).</exception>
    public static InPlaneMass MassAtBottom(BandStructure structure, int bandIndex)
    {
        ArgumentNullException.ThrowIfNull(structure);
        var band = structure.GetBand(bandIndex);
        var cell = structure.Cell;
        InPlaneMotion.CellAt(cell, 0, band.BottomElectronVolts); // validates the elements
        if (!InPlaneMotion.IsParabolic(cell))
        {
            return FiniteDifferenceMass(structure, bandIndex);
        }
        var kz = band.BottomZonePoint == ZonePoint.Center ? 0.0 : Math.PI / structure.PeriodNanometres;
        var bloch = BlochFunction.Create(structure, bandIndex, kz);
        var (coarse, _) = InverseMass(cell, bloch, 32);
        var (fine, norm) = InverseMass(cell, bloch, 64);
        var mass = 1 / fine;
        var relative = Math.Abs(fine - coarse) / fine + bloch.RelativeErrorEstimate + bloch.DiscretisationErrorEstimate + Math.Abs(norm - 1);
        return new InPlaneMass(bandIndex, band.BottomElectronVolts, mass, relative * mass, InPlaneMassMethod.HellmannFeynman);
    }

    /// <summary>
    /// The in-plane mass of every band from 1 to <paramref name="count"/> by <see cref="MassAtBottom"/>; also the check
    /// by finite differences is available through <see cref="FiniteDifferenceMass"/>.
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The count exceeds the computed bands.</exception>
    public static IReadOnlyList<InPlaneMass> MassesAtBottom(BandStructure structure, int count)
    {
        ArgumentNullException.ThrowIfNull(structure);
        Preconditions.CheckRange(count, 1, structure.Bands.Count);
        var masses = new InPlaneMass[count];
        for (var n = 1; n <= count; n++)
        {
            masses[n - 1] = MassAtBottom(structure, n);
        }
        return masses;
    }

    /// <summary>
    /// The in-plane mass at the bottom of band <paramref name="bandIndex"/> from the exact bottom energies at k∥² = h and
    /// h/2 (h = 1e-3 /nm²), Richardson-extrapolated to k∥ → 0: an independent route to <see cref="MassAtBottom"/>.
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="structure"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such band.</exception>
    /// <exception cref="ArgumentException">An element is not covered by <see cref="InPlaneMotion"/>.</exception>
    public static InPlaneMass FiniteDifferenceMass(BandStructure structure, int bandIndex)
    {
        ArgumentNullException.ThrowIfNull(structure);
        var band = structure.GetBand(bandIndex);
        const double h = 1e-3;
        var e0 = band.BottomElectronVolts;
        var coarse = (EdgesAt(structure.Cell, bandIndex, Math.Sqrt(h))[bandIndex - 1].BottomElectronVolts - e0) / h;
        var fine = (EdgesAt(structure.Cell, bandIndex, Math.Sqrt(h / 2))[bandIndex - 1].BottomElectronVolts - e0) / (h / 2);
        var slope = 2 * fine - coarse; // dE/d(k∥²), eV nm²
        var mass = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 / slope;
        var error = mass * (Math.Abs(fine - slope) / slope + 2 * (band.BottomErrorElectronVolts + 1e-15 * Math.Abs(e0)) / (h / 2) / slope);
        return new InPlaneMass(bandIndex, e0, mass, error, InPlaneMassMethod.FiniteDifference);
    }

    /// <summary>⟨1/m⟩ (1/m₀) of the Bloch state and its norm, by an n-point Gauss–Legendre rule on each layer.</summary>
    private static (double InverseMass, double Norm) InverseMass(UnitCell cell, BlochFunction bloch, int order)
    {
        double x = 0, inverse = 0, norm = 0;
        var density = new double[order];
        foreach (var element in cell.Elements)
        {
            var width = element.Width.Nanometres;
            double mass;
            switch (element)
            {
                case Layer layer:
                    mass = layer.Mass.ElectronMasses;
                    break;
                case FourierSegment fourier:
                    mass = fourier.Mass.ElectronMasses;
                    break;
                default:
                    x += width;
                    continue;
            }
            var rule = new GaussLegendreRule(x, x + width, order);
            bloch.ProbabilityDensities(rule.Abscissas, density);
            double probability = 0;
            for (var i = 0; i < order; i++)
            {
                probability += rule.Weights[i] * density[i];
            }
            norm += probability;
            inverse += probability / mass;
            x += width;
        }
        return (inverse, norm);
    }

    private static double Tolerance(double energy, double edgeError) => 2 * edgeError + 8 * double.Epsilon + 4e-16 * Math.Abs(energy);

    /// <summary>The fixed point E = f(E) by secant steps on f(E) − E from <paramref name="start"/>.</summary>
    private static double FixedPoint(Func<double, double> f, double start, double edgeError, out int iterations)
    {
        double x0 = start, g0 = f(x0) - x0;
        double x1 = x0 + g0, g1 = f(x1) - x1;
        for (iterations = 2; iterations < MaxFixedPointIterations; iterations++)
        {
            if (Math.Abs(g1) <= Tolerance(x1, edgeError))
            {
                return x1 + g1;
            }
            var slope = (g1 - g0) / (x1 - x0);
            var next = double.IsFinite(slope) && slope != 0 ? x1 - g1 / slope : x1 + g1;
            (x0, g0) = (x1, g1);
            x1 = next;
            g1 = f(x1) - x1;
        }
        throw new BandSearchException(string.Create(CultureInfo.InvariantCulture,
            $"the energy with in-plane motion in a non-parabolic cell did not settle within {MaxFixedPointIterations} iterations (last change {g1:R} eV near {x1:R} eV)."));
    }
}

/// <summary>How an in-plane mass was obtained.</summary>
public enum InPlaneMassMethod
{
    /// <summary>Hellmann–Feynman: 1/m∥ = ⟨1/m⟩ over the Bloch state at the band bottom (parabolic layers).</summary>
    HellmannFeynman,

    /// <summary>Richardson-extrapolated finite difference of the exact bottom energy in k∥².</summary>
    FiniteDifference,
}

/// <summary>The in-plane effective mass of one miniband at its bottom.</summary>
public readonly record struct InPlaneMass
{
    internal InPlaneMass(int bandIndex, double energy, double mass, double error, InPlaneMassMethod method)
    {
        BandIndex = bandIndex;
        BottomEnergyElectronVolts = energy;
        ElectronMasses = mass;
        ErrorEstimateElectronMasses = error;
        Method = method;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>The band's bottom at k∥ = 0, eV.</summary>
    public double BottomEnergyElectronVolts { get; }

    /// <summary>m∥ = ħ²/(2 dE/d(k∥²)) at the band bottom, in electron masses.</summary>
    public double ElectronMasses { get; }

    /// <summary>Estimated error of <see cref="ElectronMasses"/>, electron masses.</summary>
    public double ErrorEstimateElectronMasses { get; }

    /// <summary>How the mass was obtained.</summary>
    public InPlaneMassMethod Method { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Band {BandIndex}: in-plane mass {ElectronMasses:G8} m0 (± {ErrorEstimateElectronMasses:G2}, {Method}) at E = {BottomEnergyElectronVolts:G10} eV");
}

/// <summary>The edges of one miniband at one in-plane wavevector.</summary>
public readonly record struct InPlaneBandEdges
{
    internal InPlaneBandEdges(int bandIndex, double k, double bottom, double top, double bottomError, double topError, int iterations)
    {
        BandIndex = bandIndex;
        InPlaneWavevectorPerNanometre = k;
        BottomElectronVolts = bottom;
        TopElectronVolts = top;
        BottomErrorElectronVolts = bottomError;
        TopErrorElectronVolts = topError;
        FixedPointIterations = iterations;
    }

    /// <summary>The band, from 1.</summary>
    public int BandIndex { get; }

    /// <summary>|k∥|, 1/nm.</summary>
    public double InPlaneWavevectorPerNanometre { get; }

    /// <summary>The band's lowest energy at this k∥ (total energy, eV).</summary>
    public double BottomElectronVolts { get; }

    /// <summary>The band's highest energy at this k∥ (total energy, eV).</summary>
    public double TopElectronVolts { get; }

    /// <summary>Error bound of the bottom, eV.</summary>
    public double BottomErrorElectronVolts { get; }

    /// <summary>Error bound of the top, eV.</summary>
    public double TopErrorElectronVolts { get; }

    /// <summary>Band searches spent on the fixed point of the reference energy (0 for a parabolic cell).</summary>
    public int FixedPointIterations { get; }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Band {BandIndex} at k∥ = {InPlaneWavevectorPerNanometre:G6} /nm: {BottomElectronVolts:G10} … {TopElectronVolts:G10} eV");
}
