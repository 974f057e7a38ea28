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
    private readonly CompiledCell _compiled;

    private CellTransfer(UnitCell cell)
    {
        Cell = cell;
        _compiled = new CompiledCell(cell.ElementSpan, nameof(cell));
        LowestValidEnergyElectronVolts = _compiled.LowestValidEnergyElectronVolts;
        PeriodNanometres = cell.Period.Nanometres;
    }

    /// <summary>The compiled elements and propagation kernel of the cell.</summary>
    internal CompiledCell Compiled => _compiled;

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
        if (!_compiled.HasSegments)
        {
            return TraceKernel.Trace(_compiled.Kinds, _compiled.Data, energyElectronVolts);
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
        if (_compiled.HasSegments)
        {
            Traces(energiesElectronVolts, destination);
            return;
        }
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            CheckEnergy(energiesElectronVolts[i], i); // all checked before any output is written
        }
        TraceKernel.Traces(_compiled.Kinds, _compiled.Data, energiesElectronVolts, destination);
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

    private int CountDirichletEigenvaluesBelow(double e, out double traceMantissa, out double traceLogScale, out ScaledProduct cellProduct)
    {
        var zeros = _compiled.CountDirichletZeros(e, out cellProduct);
        traceMantissa = cellProduct.TraceMantissa;
        traceLogScale = cellProduct.LogScale;
        return zeros;
    }

    /// <summary>The scaled product over the cell and its exact energy derivative at <paramref name="e"/> (not checked).</summary>
    internal ScaledProduct Accumulate(double e) => _compiled.Accumulate(e);

    /// <summary>
    /// ∂D/∂p at fixed energy for parameter <paramref name="parameter"/> of layer <paramref name="layerIndex"/>, as
    /// mantissa × e^logScale, with D's own mantissa: the numerator of dE/dp = −(∂D/∂p)/(∂D/∂E).
    /// </summary>
    internal double TraceParameterDerivative(double e, int layerIndex, LayerParameter parameter, out double traceMantissa, out double logScale)
    {
        CheckEnergy(e);
        var p = _compiled.AccumulateParameterDerivative(e, layerIndex, parameter);
        traceMantissa = p.TraceMantissa;
        logScale = p.LogScale;
        return p.TraceDerivativeMantissa;
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
        var n = _compiled.Count;
        // 10 doubles per element; on the stack for cells of up to 200 elements (16 KB), so sweeps of small
        // cells do not allocate here.
        var buffer = n <= 200 ? stackalloc double[10 * n] : new double[10 * n];
        var matrices = buffer[..(4 * n)];
        var scales = buffer.Slice(4 * n, n);
        for (var i = 0; i < n; i++)
        {
            var single = ScaledProduct.Identity;
            _compiled.ApplyElement(i, e, ref single);
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
}
