// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Runtime.CompilerServices;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>
/// The Bloch-condition transfer matrix of one unit cell, compiled once from a <see cref="UnitCell"/>
/// and evaluated at any real energy. Immutable and thread-safe; evaluation does not allocate.
/// </summary>
/// <remarks>
/// <para>Method: each uniform layer contributes the closed-form matrix of −(ħ²/2m₀)(ψ′/m)′ + Vψ = Eψ in
/// the (ψ, ψ′/m) basis (BenDaniel–Duke matching); each delta contributes a jump of ψ′/m. The exact
/// energy derivative dM/dE is carried alongside by the product rule. The product is held as a mantissa
/// times e^LogScale: evanescent layers are divided by their growing exponential e^(κw) analytically and
/// the running product is renormalised by powers of two, so that no entry overflows, whatever the barrier
/// thickness or number of layers. D itself is limited by cancellation when a period holds several thick
/// barriers (its rounding grows like e^(Σκw)); the band finder's error bounds account for it (docs/core.md).</para>
/// <para>The Bloch condition for the infinite crystal is cos(kd) = D(E)/2 with D = Tr M
/// (F. Bloch, Z. Phys. 52, 555 (1929); Kronig and Penney 1931).</para>
/// </remarks>
public sealed class CellTransfer
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;

    // Packed element data: a kind per element and ElementData.Stride doubles per element in one array
    // (one allocation, and the numbers of an element side by side); propagators only for smooth segments.
    private readonly ElementKind[] _kinds;
    private readonly double[] _data;
    private readonly ISegmentPropagator?[]? _segments;

    private CellTransfer(UnitCell cell)
    {
        Cell = cell;
        var elements = cell.ElementSpan;
        var n = elements.Length;
        _kinds = new ElementKind[n];
        _data = new double[ElementData.Stride * n];
        var domain = double.NegativeInfinity;
        for (var i = 0; i < n; i++)
        {
            switch (elements[i])
            {
                case Layer layer:
                    _kinds[i] = ElementKind.Layer;
                    ElementData.StoreLayer(_data, i, layer.Width.Nanometres, layer.Potential.ElectronVolts,
                        layer.Mass.ElectronMasses, layer.Mass.ElectronMasses * layer.NonParabolicityPerElectronVolt);
                    domain = Math.Max(domain, layer.LowestValidEnergyElectronVolts());
                    break;
                case DeltaBarrier delta:
                    _kinds[i] = ElementKind.Delta;
                    _data[ElementData.Stride * i + ElementData.Jump] = delta.StrengthElectronVoltNanometres / C;
                    break;
                case IMeshedSegment smooth:
                    _kinds[i] = ElementKind.Segment;
                    _segments ??= new ISegmentPropagator?[n];
                    _segments[i] = new MagnusSegmentPropagator(smooth.Mesh);
                    break;
                default:
                    throw new ArgumentException(
                        string.Create(CultureInfo.InvariantCulture, $"cell element {i} is of unsupported type {elements[i].GetType().Name}."),
                        nameof(cell));
            }
        }
        LowestValidEnergyElectronVolts = domain;
        PeriodNanometres = cell.Period.Nanometres;
    }

    /// <summary>The cell this transfer matrix describes.</summary>
    public UnitCell Cell { get; }

    /// <summary>The period d in nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>
    /// Energies must exceed this bound (eV) so that every non-parabolic mass m(E) = m(1 + α(E − V))
    /// stays positive; −∞ for a cell of parabolic layers.
    /// </summary>
    public double LowestValidEnergyElectronVolts { get; }

    /// <summary>One line: element count, period and the lowest valid energy (culture-invariant).</summary>
    public override string ToString() => double.IsNegativeInfinity(LowestValidEnergyElectronVolts)
        ? string.Create(CultureInfo.InvariantCulture, $"CellTransfer: {Cell.Elements.Count} element(s), period {PeriodNanometres:G6} nm")
        : string.Create(CultureInfo.InvariantCulture, $"CellTransfer: {Cell.Elements.Count} element(s), period {PeriodNanometres:G6} nm, energies above {LowestValidEnergyElectronVolts:G6} eV");

    /// <summary>Compiles the transfer matrix of <paramref name="cell"/>.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    public static CellTransfer Create(UnitCell cell)
    {
        ArgumentNullException.ThrowIfNull(cell);
        return new CellTransfer(cell);
    }

    /// <summary>
    /// The transfer matrix of the whole cell and its exact energy derivative at
    /// <paramref name="energyElectronVolts"/>, in scaled form.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, or not above <see cref="LowestValidEnergyElectronVolts"/>.</exception>
    public ScaledTransferMatrix Evaluate(double energyElectronVolts)
    {
        CheckEnergy(energyElectronVolts);
        var product = Accumulate(energyElectronVolts);
        return new ScaledTransferMatrix(energyElectronVolts,
            new TransferMatrix(product.P11, product.P12, product.P21, product.P22),
            new TransferMatrix(product.D11, product.D12, product.D21, product.D22),
            product.LogScale);
    }

    /// <summary>The dispersion function D(E) = Tr M(E) and its exact derivative at one energy.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, or not above <see cref="LowestValidEnergyElectronVolts"/>.</exception>
    public DispersionValue Dispersion(double energyElectronVolts)
    {
        CheckEnergy(energyElectronVolts);
        var p = Accumulate(energyElectronVolts);
        return new DispersionValue(energyElectronVolts, p.P11 + p.P22, p.D11 + p.D22, p.LogScale, PeriodNanometres);
    }

    /// <summary>
    /// D(E) = Tr M alone (no derivative) at one energy, from the trace-only product for cells of layers and
    /// deltas; ±∞ beyond the double range, never NaN. Agrees with <see cref="Dispersion"/>'s
    /// <see cref="DispersionValue.Trace"/> to rounding (a few ulps of the largest entry of M per element).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, or not above <see cref="LowestValidEnergyElectronVolts"/>.</exception>
    public double Trace(double energyElectronVolts)
    {
        CheckEnergy(energyElectronVolts);
        if (_segments is null)
        {
            return TraceKernel.Trace(_kinds, _data, energyElectronVolts);
        }
        var p = Accumulate(energyElectronVolts);
        var mantissa = p.P11 + p.P22;
        return mantissa == 0 ? 0 : mantissa * Math.Exp(p.LogScale);
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = D(energiesElectronVolts[i])</c> = Tr M, bitwise equal to
    /// <see cref="Dispersion"/>'s <see cref="DispersionValue.Trace"/>; a value beyond the double range is
    /// returned as ±∞ (never NaN). Does not allocate. Every energy is checked before anything is written.
    /// For speed when the last bits do not matter, see <see cref="TracesVectorized"/>.
    /// </summary>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not finite or not above <see cref="LowestValidEnergyElectronVolts"/> (the message names its index); destination is then unchanged.</exception>
    public void Traces(ReadOnlySpan<double> energiesElectronVolts, Span<double> destination)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            CheckEnergy(energiesElectronVolts[i], i); // all checked before any output is written
        }
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            var p = Accumulate(energiesElectronVolts[i]);
            destination[i] = (p.P11 + p.P22) * Math.Exp(p.LogScale);
        }
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = D(energiesElectronVolts[i])</c> = Tr M without the energy
    /// derivative, vectorised across energies for cells of layers and deltas (SIMD lanes of
    /// <see cref="System.Numerics.Vector{T}"/>, several energies per instruction, the product kept in registers);
    /// cells with smooth segments take the exact path <see cref="Traces"/>. ±∞ beyond the double range, never NaN.
    /// Does not allocate. Every energy is checked before anything is written.
    /// </summary>
    /// <remarks>Agrees with <see cref="Traces"/> to within 1e-13 × (number of elements) × the largest entry
    /// of M(E): the vectorised sin, cos and exp differ from the scalar ones by a few ulps, which the product
    /// carries. Where D is much smaller than the entries it cancels from (deep in a band of a thick-barrier
    /// cell) only this bound on the difference applies, not a relative one.</remarks>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not finite or not above <see cref="LowestValidEnergyElectronVolts"/>.</exception>
    public void TracesVectorized(ReadOnlySpan<double> energiesElectronVolts, Span<double> destination)
    {
        if (_segments is not null)
        {
            Traces(energiesElectronVolts, destination);
            return;
        }
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            CheckEnergy(energiesElectronVolts[i], i); // all checked before any output is written
        }
        TraceKernel.Traces(_kinds, _data, energiesElectronVolts, destination);
    }

    /// <summary>
    /// How many band edges of the infinite crystal lie below <paramref name="energyElectronVolts"/>,
    /// from oscillation theory alone (no scan): the Dirichlet eigenvalue count of the cell, from a
    /// Prüfer-angle zero count, combined with the sign of D(E).
    /// </summary>
    /// <remarks>
    /// The n-th Dirichlet eigenvalue of one cell lies in the closure of the n-th gap, and the sign of
    /// D alternates from gap to gap (W. Magnus and S. Winkler, Hill's Equation, 1966; M. S. P.
    /// Eastham, The Spectral Theory of Periodic Differential Equations, 1973). Inside a band the count
    /// is odd (2n + 1 in band n + 1), inside a gap even. Exactly at an edge either neighbouring count
    /// may be returned.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, or not above <see cref="LowestValidEnergyElectronVolts"/>.</exception>
    public int CountBandEdgesBelow(double energyElectronVolts)
    {
        CheckEnergy(energyElectronVolts);
        var dirichlet = CountDirichletEigenvaluesBelow(energyElectronVolts, out var traceMantissa, out var traceLogScale, out var product);
        var halfTraceMagnitude = Math.Abs(traceMantissa) * 0.5;
        var inBand = halfTraceMagnitude < Math.Exp(-traceLogScale);
        // Near M = ±I (a narrow gap) decide |D| < 2 from det(M ∓ I), which resolves gaps the trace cannot.
        var target = traceMantissa >= 0 ? 2.0 : -2.0;
        if (traceLogScale < 700 && product.TryShiftedTrace(Math.Exp(traceLogScale), target, out var shifted, out _))
        {
            inBand = target > 0 ? shifted < 0 : shifted > 0;
        }
        if (inBand)
        {
            return 2 * dirichlet + 1;
        }
        // In gap j the trace has sign (-1)^j; the Dirichlet count there is j or j - 1.
        var gapParity = traceMantissa >= 0 ? 0 : 1;
        var gap = (dirichlet & 1) == gapParity ? dirichlet : dirichlet + 1;
        return 2 * gap;
    }

    /// <summary>
    /// Number of eigenvalues below E of the cell with ψ = 0 at both ends, from the zeros in (0, d) of the
    /// solution with ψ(0) = 0 (Sturm oscillation theorem). Also returns the scaled trace at E.
    /// </summary>
    internal int CountDirichletEigenvaluesBelow(double e, out double traceMantissa, out double traceLogScale) =>
        CountDirichletEigenvaluesBelow(e, out traceMantissa, out traceLogScale, out _);

    private int CountDirichletEigenvaluesBelow(double e, out double traceMantissa, out double traceLogScale, out Product cellProduct)
    {
        // The state vector (u, w) = (ψ, ψ'/m) from (0, 1); zeros of u are counted per element.
        double u = 0, w = 1;
        var zeros = 0;
        var product = new Product();
        product.Reset();
        for (var i = 0; i < _kinds.Length; i++)
        {
            switch (_kinds[i])
            {
                case ElementKind.Layer:
                {
                    LayerMatrix(i, e, out var m11, out var m12, out var m21, out var m22, out var d11, out var d12, out var d21, out var d22, out var l, out var s, out var mass);
                    var u1 = m11 * u + m12 * w;
                    var w1 = m21 * u + m22 * w;
                    zeros += LayerZeros(u, w, u1, w1, s, _data[ElementData.Stride * i + ElementData.Width], mass);
                    u = u1;
                    w = w1;
                    product.ApplyLeft(m11, m12, m21, m22, d11, d12, d21, d22, l);
                    break;
                }
                case ElementKind.Delta:
                {
                    var jump = _data[ElementData.Stride * i + ElementData.Jump];
                    w += jump * u;
                    product.ApplyLeft(1, 0, jump, 1, 0, 0, 0, 0, 0);
                    break;
                }
                default:
                    zeros += _segments![i]!.PropagateCounting(e, ref u, ref w, ref product);
                    break;
            }
            RenormaliseVector(ref u, ref w);
        }
        if (u == 0)
        {
            zeros--; // the far end itself is not in the open interval (0, d)
        }
        traceMantissa = product.P11 + product.P22;
        traceLogScale = product.LogScale;
        cellProduct = product;
        return zeros;
    }

    /// <summary>
    /// Zeros of ψ in (0, width] of a uniform layer with wavenumber squared <paramref name="s"/> and mass
    /// <paramref name="mass"/>, given the state (u, w) at its start and (u1, w1) at its end (a zero at the far
    /// end counts, one at the start does not).
    /// </summary>
    internal static int LayerZeros(double u, double w, double u1, double w1, double s, double width, double mass)
    {
        var theta = s > 0 ? Math.Sqrt(s) * width : 0;
        if (theta < Math.PI)
        {
            // At most one zero in (0, w]: a sign change of u (a zero at the far end counts).
            return u != 0 && (u1 == 0 || (u1 < 0) != (u < 0)) ? 1 : 0;
        }
        var k = Math.Sqrt(s);
        var phi0 = Math.Atan2(u, mass * w / k);
        var phiEnd = Math.Atan2(u1, mass * w1 / k);
        var turns = Math.Round((phi0 + theta - phiEnd) / (2 * Math.PI));
        return FloorQuadrant(u1, w1) + 2 * (int)turns - FloorQuadrant(u, w);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int FloorQuadrant(double u, double w) => u < 0 ? -1 : u > 0 ? 0 : w >= 0 ? 0 : 1;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void RenormaliseVector(ref double u, ref double w)
    {
        var max = Math.Max(Math.Abs(u), Math.Abs(w));
        if (max > RenormaliseAbove || max < RenormaliseBelow)
        {
            var exponent = Math.ILogB(max);
            u = Math.ScaleB(u, -exponent);
            w = Math.ScaleB(w, -exponent);
        }
    }

    internal Product Accumulate(double e)
    {
        var product = new Product();
        product.Reset();
        for (var i = 0; i < _kinds.Length; i++)
        {
            ApplyElement(i, e, ref product);
        }
        return product;
    }

    /// <summary>
    /// ln of the rounding amplification of D = Tr M at energy <paramref name="e"/>: the largest
    /// tr(|M_n⋯M_{j+1}|·|M_j⋯M_1|) over the element boundaries j (entrywise absolute values). The rounding error of the
    /// product is a few ulps of this (forward error analysis of a matrix product; N. J. Higham, Accuracy
    /// and Stability of Numerical Algorithms, 2nd ed., §3.5). It exceeds ‖M‖ greatly in a cell with several
    /// thick barriers, whose partial products grow like e^(Σκw) and cancel back to an O(1) trace in a band.
    /// For error bounds only: it takes logarithms (and allocates for cells of over 200 elements), so it stays off the hot path.
    /// </summary>
    internal double LogRoundingAmplification(double e)
    {
        var n = _kinds.Length;
        // 10 doubles per element; on the stack for cells of up to 200 elements (16 KB), so sweeps of small
        // cells do not allocate here.
        var buffer = n <= 200 ? stackalloc double[10 * n] : new double[10 * n];
        var matrices = buffer[..(4 * n)];
        var scales = buffer.Slice(4 * n, n);
        for (var i = 0; i < n; i++)
        {
            var single = new Product();
            single.Reset();
            ApplyElement(i, e, ref single);
            matrices[4 * i + 0] = single.P11; matrices[4 * i + 1] = single.P12; matrices[4 * i + 2] = single.P21; matrices[4 * i + 3] = single.P22;
            scales[i] = single.LogScale;
        }
        // Forward: R_j = M_j⋯M_0 (normalised mantissas and their log scales); backward: L_j = M_{n-1}⋯M_{j+1}.
        var right = buffer.Slice(5 * n, 4 * n);
        var rightScale = buffer.Slice(9 * n, n);
        double r11 = 1, r12 = 0, r21 = 0, r22 = 1, rScale = 0;
        for (var i = 0; i < n; i++)
        {
            double a11 = matrices[4 * i + 0], a12 = matrices[4 * i + 1], a21 = matrices[4 * i + 2], a22 = matrices[4 * i + 3];
            (r11, r12, r21, r22) = (a11 * r11 + a12 * r21, a11 * r12 + a12 * r22, a21 * r11 + a22 * r21, a21 * r12 + a22 * r22);
            rScale += scales[i];
            LogNormalised(ref r11, ref r12, ref r21, ref r22, ref rScale);
            right[4 * i + 0] = r11; right[4 * i + 1] = r12; right[4 * i + 2] = r21; right[4 * i + 3] = r22;
            rightScale[i] = rScale;
        }
        // The trace's rounding at boundary j is governed by tr(|L_j|·|R_j|) = Σ |L_ak|·|R_ka|, which is
        // dimensionless (the entries of M carry different units, so a max-entry norm would not be).
        var peak = Math.Log(Math.Abs(right[4 * (n - 1) + 0]) + Math.Abs(right[4 * (n - 1) + 3])) + rightScale[n - 1];
        double l11 = 1, l12 = 0, l21 = 0, l22 = 1, lScale = 0;
        for (var i = n - 1; i >= 1; i--)
        {
            double a11 = matrices[4 * i + 0], a12 = matrices[4 * i + 1], a21 = matrices[4 * i + 2], a22 = matrices[4 * i + 3];
            (l11, l12, l21, l22) = (l11 * a11 + l12 * a21, l11 * a12 + l12 * a22, l21 * a11 + l22 * a21, l21 * a12 + l22 * a22);
            lScale += scales[i];
            LogNormalised(ref l11, ref l12, ref l21, ref l22, ref lScale);
            var j = i - 1;
            var sum = Math.Abs(l11) * Math.Abs(right[4 * j + 0]) + Math.Abs(l12) * Math.Abs(right[4 * j + 2])
                + Math.Abs(l21) * Math.Abs(right[4 * j + 1]) + Math.Abs(l22) * Math.Abs(right[4 * j + 3]);
            if (sum > 0)
            {
                peak = Math.Max(peak, Math.Log(sum) + lScale + rightScale[j]);
            }
        }
        return peak;
    }

    private static double LogNormalised(ref double m11, ref double m12, ref double m21, ref double m22, ref double logScale)
    {
        var largest = Math.Max(Math.Max(Math.Abs(m11), Math.Abs(m12)), Math.Max(Math.Abs(m21), Math.Abs(m22)));
        if (!(largest > 0))
        {
            return logScale;
        }
        var exponent = Math.ILogB(largest);
        m11 = Math.ScaleB(m11, -exponent); m12 = Math.ScaleB(m12, -exponent);
        m21 = Math.ScaleB(m21, -exponent); m22 = Math.ScaleB(m22, -exponent);
        logScale += exponent * Math.Log(2.0);
        return Math.Log(Math.Max(Math.Max(Math.Abs(m11), Math.Abs(m12)), Math.Max(Math.Abs(m21), Math.Abs(m22)))) + logScale;
    }

    /// <summary>Applies element <paramref name="i"/> (matrix and energy derivative) to the running product.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void ApplyElement(int i, double e, ref Product product)
    {
        switch (_kinds[i])
        {
            case ElementKind.Layer:
                LayerMatrix(i, e, out var m11, out var m12, out var m21, out var m22, out var d11, out var d12, out var d21, out var d22, out var l, out _, out _);
                product.ApplyLeft(m11, m12, m21, m22, d11, d12, d21, d22, l);
                break;
            case ElementKind.Delta:
                product.ApplyLeft(1, 0, _data[ElementData.Stride * i + ElementData.Jump], 1, 0, 0, 0, 0, 0);
                break;
            default:
                _segments![i]!.Propagate(e, ref product);
                break;
        }
    }

    /// <summary>Scaled matrix and exact energy derivative of uniform layer <paramref name="i"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void LayerMatrix(int i, double e, out double m11, out double m12, out double m21, out double m22,
        out double d11, out double d12, out double d21, out double d22, out double logScale, out double s, out double mass)
    {
        var at = ElementData.Stride * i;
        var excess = e - _data[at + ElementData.Potential];
        var slope = _data[at + ElementData.MassSlope];
        mass = _data[at + ElementData.Mass] + slope * excess;
        s = mass * excess / C;
        var dsde = (mass + slope * excess) / C;
        var width = _data[at + ElementData.Width];
        UniformLayerPropagator.Evaluate(s, width, out var c, out var sinc, out var dcds, out var dSds, out logScale);
        // M = [[c, m S], [-(s/m) S, c]]; dM/dE = (ds/dE) dM/ds + (dm/dE) dM/dm.
        m11 = c;
        m22 = c;
        m12 = mass * sinc;
        m21 = -s * sinc / mass;
        d11 = dsde * dcds;
        d22 = d11;
        d12 = dsde * mass * dSds + slope * sinc;
        d21 = -dsde * (sinc + s * dSds) / mass + slope * s * sinc / (mass * mass);
    }

    private void CheckEnergy(double energyElectronVolts, int index = -1)
    {
        if (double.IsFinite(energyElectronVolts) && energyElectronVolts > LowestValidEnergyElectronVolts)
        {
            return;
        }
        // ParamName is the real parameter; the message names the element of a span.
        var paramName = index < 0 ? "energyElectronVolts" : "energiesElectronVolts";
        var name = index < 0 ? paramName : string.Create(CultureInfo.InvariantCulture, $"energiesElectronVolts[{index}]");
        if (!double.IsFinite(energyElectronVolts))
        {
            throw new ArgumentOutOfRangeException(paramName, energyElectronVolts,
                $"{name} must be a finite energy in eV; got {Preconditions.Format(energyElectronVolts)}.");
        }
        throw new ArgumentOutOfRangeException(paramName, energyElectronVolts,
            $"{name} must exceed {Preconditions.Format(LowestValidEnergyElectronVolts)} eV, below which a non-parabolic mass m(E) = m(1 + a(E - V)) would not be positive; got {Preconditions.Format(energyElectronVolts)}.");
    }

    /// <summary>
    /// Running product P = M_n ⋯ M_1 and its energy derivative, as mantissas times e^LogScale.
    /// A mutable accumulator used only on the stack of one evaluation.
    /// </summary>
    internal struct Product
    {
        internal double P11, P12, P21, P22, D11, D12, D21, D22, LogScale;

        /// <summary>
        /// Near M = ±I (the edges of a narrow gap) D ∓ 2 is a difference of nearly equal numbers with an error
        /// ε|M| that moves an edge by ε|M|/|D′|, and |D′| shrinks with the gap. Since det M = 1,
        /// D ∓ 2 = ∓det(M ∓ I) exactly; the determinant of the small matrix N = M ∓ I has an error of only
        /// ε|N|, which keeps the edges of a narrow gap as accurate as those of a wide one.
        /// Used when |N11|, |N22| and √|N12·N21| are at most 1e-3: there the trace would lose more than three digits; elsewhere it is as good.
        /// </summary>
        internal readonly bool TryShiftedTrace(double scale, double target, out double value, out double derivative)
        {
            var sign = target > 0 ? 1.0 : -1.0;
            double n11 = P11 * scale - sign, n22 = P22 * scale - sign, n12 = P12 * scale, n21 = P21 * scale;
            // M12 and M21 carry reciprocal units (mass × length and its inverse): compare their geometric mean.
            if (Math.Max(Math.Max(Math.Abs(n11), Math.Abs(n22)), Math.Sqrt(Math.Abs(n12 * n21))) > 1e-3)
            {
                value = 0;
                derivative = 0;
                return false;
            }
            double d11 = D11 * scale, d12 = D12 * scale, d21 = D21 * scale, d22 = D22 * scale;
            value = -sign * (n11 * n22 - n12 * n21);
            derivative = -sign * (d11 * n22 + n11 * d22 - d12 * n21 - n12 * d21);
            return true;
        }

        internal void Reset()
        {
            P11 = 1; P12 = 0; P21 = 0; P22 = 1;
            D11 = 0; D12 = 0; D21 = 0; D22 = 0;
            LogScale = 0;
        }

        /// <summary>P ← M·P, dP ← dM·P + M·dP, with M and dM scaled by e^logScale.</summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        internal void ApplyLeft(double m11, double m12, double m21, double m22, double d11, double d12, double d21, double d22, double logScale)
        {
            var q11 = m11 * P11 + m12 * P21;
            var q12 = m11 * P12 + m12 * P22;
            var q21 = m21 * P11 + m22 * P21;
            var q22 = m21 * P12 + m22 * P22;
            var e11 = d11 * P11 + d12 * P21 + m11 * D11 + m12 * D21;
            var e12 = d11 * P12 + d12 * P22 + m11 * D12 + m12 * D22;
            var e21 = d21 * P11 + d22 * P21 + m21 * D11 + m22 * D21;
            var e22 = d21 * P12 + d22 * P22 + m21 * D12 + m22 * D22;
            P11 = q11; P12 = q12; P21 = q21; P22 = q22;
            D11 = e11; D12 = e12; D21 = e21; D22 = e22;
            LogScale += logScale;
            var max = Math.Max(Math.Max(Math.Max(Math.Abs(q11), Math.Abs(q12)), Math.Max(Math.Abs(q21), Math.Abs(q22))),
                               Math.Max(Math.Max(Math.Abs(e11), Math.Abs(e12)), Math.Max(Math.Abs(e21), Math.Abs(e22))));
            if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
            {
                // Powers of two rescale exactly, without rounding.
                var exponent = Math.ILogB(max);
                P11 = Math.ScaleB(P11, -exponent); P12 = Math.ScaleB(P12, -exponent);
                P21 = Math.ScaleB(P21, -exponent); P22 = Math.ScaleB(P22, -exponent);
                D11 = Math.ScaleB(D11, -exponent); D12 = Math.ScaleB(D12, -exponent);
                D21 = Math.ScaleB(D21, -exponent); D22 = Math.ScaleB(D22, -exponent);
                LogScale += exponent * Math.Log(2.0);
            }
        }
    }
}

/// <summary>The kind of one packed cell element.</summary>
internal enum ElementKind : byte
{
    Layer,
    Delta,
    Segment,
}

/// <summary>
/// Layout of the packed per-element numbers of <see cref="CellTransfer"/>: <see cref="Stride"/> doubles per
/// element. A layer stores width (nm), potential (eV), band-edge mass (m0), mass slope dm/dE (m0/eV) and,
/// for the trace-only kernel, m/C and 1/m (C = ħ²/2m0 in eV·nm²); a delta stores its jump of ψ′/m
/// (strength / C) in <see cref="Jump"/>.
/// </summary>
internal static class ElementData
{
    internal const int Stride = 6;
    internal const int Width = 0;
    internal const int Potential = 1;
    internal const int Mass = 2;
    internal const int MassSlope = 3;
    internal const int MassOverC = 4;
    internal const int InverseMass = 5;
    internal const int Jump = 0;

    internal static void StoreLayer(double[] data, int index, double width, double potential, double mass, double massSlope)
    {
        var at = Stride * index;
        data[at + Width] = width;
        data[at + Potential] = potential;
        data[at + Mass] = mass;
        data[at + MassSlope] = massSlope;
        data[at + MassOverC] = mass / PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
        data[at + InverseMass] = 1 / mass;
    }
}

/// <summary>Propagation through one smooth segment at a given energy (an extension point for non-uniform potentials).</summary>
internal interface ISegmentPropagator
{
    /// <summary>Applies the segment's scaled matrix and energy derivative to the running product.</summary>
    void Propagate(double energyElectronVolts, ref CellTransfer.Product product);

    /// <summary>As <see cref="Propagate"/>, and also propagates the state (u, w) = (ψ, ψ′/m), returning the number of zeros of ψ inside the segment (its far end included).</summary>
    int PropagateCounting(double energyElectronVolts, ref double u, ref double w, ref CellTransfer.Product product);
}
