// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Runtime.CompilerServices;
using Periodic.Numerics;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Transfer;

/// <summary>A layer parameter with respect to which the kernel differentiates the transfer matrix.</summary>
internal enum LayerParameter
{
    /// <summary>The width w, nm.</summary>
    Width,

    /// <summary>The potential V, eV.</summary>
    Potential,

    /// <summary>The band-edge mass m, m₀ (the non-parabolicity α is held fixed, so the slope m·α scales with it).</summary>
    Mass,
}

/// <summary>Integrals of a real state over one element: ∫ψ² dx, ∫x·ψ² dx (x from the start of the compiled sequence) and ∫ψ⁴ dx.</summary>
internal readonly record struct ElementMoments(double Norm, double FirstMoment, double Quartic);

/// <summary>
/// The one compiled representation of a sequence of cell elements (a unit cell, a part of a stack, or a whole stack written
/// out) and the propagation kernel over it: transfer products with the exact energy derivative or the derivative with
/// respect to one layer's width, potential or mass; state propagation (ψ, ψ′/m) forwards and backwards with a count of the
/// zeros of ψ; single-element matrices; integrals of states over elements. Immutable after construction and thread-safe;
/// evaluation does not allocate.
/// </summary>
/// <remarks>
/// <para>Layers use the closed form of <see cref="UniformLayerPropagator"/> in the (ψ, ψ′/m) basis (BenDaniel–Duke
/// matching), deltas a jump of ψ′/m, smooth segments the fourth-order Magnus steps of <see cref="MagnusSegmentPropagator"/>.
/// Products and states are held as mantissas times e^log and renormalised by exact powers of two, so that no barrier
/// overflows.</para>
/// <para>Zero counts: the Sturm oscillation theorem counts eigenvalues by the zeros of ψ; per layer the zeros in (0, w] come
/// from the Prüfer phase (<see cref="LayerZeros"/>), per Magnus step in closed form.</para>
/// </remarks>
internal sealed partial class CompiledCell
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly ElementKind[] _kinds;
    private readonly double[] _data;
    private readonly MagnusSegmentPropagator?[]? _segments;

    // Element boundaries, built on first use: the band-structure paths never need them, so a cell compiled for bands
    // (a sweep compiles thousands) does not pay for them. Idempotent, so a race only builds the same array twice.
    private double[]? _starts;

    /// <summary>Compiles <paramref name="elements"/>; an unsupported element kind is an <see cref="ArgumentException"/> naming <paramref name="paramName"/>.</summary>
    internal CompiledCell(ReadOnlySpan<CellElement> elements, string paramName)
    {
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
                    _segments ??= new MagnusSegmentPropagator?[n];
                    _segments[i] = new MagnusSegmentPropagator(SegmentMesh.Of(smooth));
                    _data[ElementData.Stride * i + ElementData.Width] = elements[i].Width.Nanometres;
                    break;
                default:
                    throw new ArgumentException(
                        string.Create(CultureInfo.InvariantCulture, $"element {i} is of unsupported type {elements[i].GetType().Name}."),
                        paramName);
            }
        }
        LowestValidEnergyElectronVolts = domain;
    }

    /// <summary>
    /// Compiles <paramref name="elements"/> under a uniform field: every layer gets the potential V(x) = V − field·x (x from the
    /// start of the sequence), propagated exactly by <see cref="LinearLayerPropagator"/> (Airy functions or a sublayer series);
    /// deltas keep their strength. Parabolic layers and deltas only (the caller checks). Such a compiled sequence offers
    /// <see cref="ElementMatrix"/>, state propagation (<see cref="StepForward"/> with its zero count, <see cref="StepBackward"/>,
    /// <see cref="ScaledLayerValue"/>) and the integrals of states (<see cref="LogLinearLayerIntegral"/>, <see cref="PairIntegrals"/>).
    /// </summary>
    internal CompiledCell(ReadOnlySpan<CellElement> elements, double fieldElectronVoltsPerNanometre, string paramName)
        : this(elements, fieldElectronVoltsPerNanometre, 0, elements.Length - 1, paramName)
    {
    }

    /// <summary>
    /// As <see cref="CompiledCell(ReadOnlySpan{CellElement}, double, string)"/> with the field acting on elements
    /// <paramref name="first"/> … <paramref name="last"/> only: V(x) = V − field·(x − x_first) there, the elements before
    /// unchanged, the layers after lowered by the whole drop (flat); a stack between flat leads with a margin of each lead.
    /// </summary>
    internal CompiledCell(ReadOnlySpan<CellElement> elements, double fieldElectronVoltsPerNanometre, int first, int last, string paramName)
        : this(elements, paramName)
    {
        var origin = Boundaries[Math.Min(first, _kinds.Length)];
        var drop = fieldElectronVoltsPerNanometre * (Boundaries[Math.Min(last + 1, _kinds.Length)] - origin);
        for (var i = first; i < _kinds.Length; i++)
        {
            if (_kinds[i] != ElementKind.Layer)
            {
                continue;
            }
            var at = ElementData.Stride * i;
            if (i > last)
            {
                _data[at + ElementData.Potential] -= drop;
                continue;
            }
            _kinds[i] = ElementKind.LinearLayer;
            _data[at + ElementData.Potential] -= fieldElectronVoltsPerNanometre * (Boundaries[i] - origin);
            _data[at + ElementData.PotentialSlope] = -fieldElectronVoltsPerNanometre;
        }
        IsBiased = true;
    }

    /// <summary>True when layers carry a linear potential (no transfer products with derivatives, no trace-only kernel).</summary>
    internal bool IsBiased { get; }

    /// <summary>Number of elements.</summary>
    internal int Count => _kinds.Length;

    /// <summary>True when some element is a smooth segment (no trace-only fast path).</summary>
    internal bool HasSegments => _segments is not null;

    /// <summary>Packed kinds for the trace-only kernel.</summary>
    internal ElementKind[] Kinds => _kinds;

    /// <summary>Packed numbers for the trace-only kernel (<see cref="ElementData"/>).</summary>
    internal double[] Data => _data;

    /// <summary>Energies must exceed this bound (eV) so that every non-parabolic mass stays positive; −∞ for parabolic layers.</summary>
    internal double LowestValidEnergyElectronVolts { get; }

    /// <summary>Position of the left end of element <paramref name="i"/> (nm from the start); Start(Count) is the total thickness.</summary>
    internal double Start(int i) => Boundaries[i];

    /// <summary>The element boundaries: Boundaries[i] = left end of element i, Boundaries[Count] = thickness.</summary>
    internal double[] Boundaries => _starts ??= BuildBoundaries();

    private double[] BuildBoundaries()
    {
        var n = _kinds.Length;
        var starts = new double[n + 1];
        double x = 0;
        for (var i = 0; i < n; i++)
        {
            starts[i] = x;
            x += _kinds[i] == ElementKind.Delta ? 0 : _data[ElementData.Stride * i + ElementData.Width];
        }
        starts[n] = x;
        return starts;
    }

    /// <summary>True when element <paramref name="i"/> is a delta barrier.</summary>
    internal bool IsDelta(int i) => _kinds[i] == ElementKind.Delta;

    /// <summary>Width (nm), potential at the left end (eV), potential slope (eV/nm) and mass (m₀) of linear layer <paramref name="i"/>; false for a delta.</summary>
    internal bool LinearLayerData(int i, out double width, out double potentialAtLeft, out double slope, out double mass)
    {
        var at = ElementData.Stride * i;
        (width, potentialAtLeft, slope, mass) = (_data[at + ElementData.Width], _data[at + ElementData.Potential], _data[at + ElementData.PotentialSlope], _data[at + ElementData.Mass]);
        return _kinds[i] == ElementKind.LinearLayer;
    }

    /// <summary>True when element <paramref name="i"/> is a uniform layer.</summary>
    internal bool IsLayer(int i) => _kinds[i] == ElementKind.Layer;

    /// <summary>True when element <paramref name="i"/> is a smooth segment (Magnus steps).</summary>
    internal bool IsSegment(int i) => _kinds[i] == ElementKind.Segment;

    /// <summary>The Magnus propagator of segment <paramref name="i"/>.</summary>
    internal MagnusSegmentPropagator Segment(int i) => _segments![i]!;

    /// <summary>Width (nm), potential (eV), band-edge mass (m₀) and mass slope (m₀/eV) of layer <paramref name="i"/>.</summary>
    internal (double Width, double Potential, double Mass, double MassSlope) LayerData(int i)
    {
        var at = ElementData.Stride * i;
        return (_data[at + ElementData.Width], _data[at + ElementData.Potential], _data[at + ElementData.Mass], _data[at + ElementData.MassSlope]);
    }

    /// <summary>The jump of ψ′/m of delta <paramref name="i"/>, 1/nm (strength/C).</summary>
    internal double DeltaJump(int i) => _data[ElementData.Stride * i + ElementData.Jump];

    /// <summary>m(E) and s = m(E)(E − V)/C of layer <paramref name="i"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void LayerCoefficients(int i, double e, out double mass, out double s)
    {
        var at = ElementData.Stride * i;
        var excess = e - _data[at + ElementData.Potential];
        mass = _data[at + ElementData.Mass] + _data[at + ElementData.MassSlope] * excess;
        s = mass * excess / C;
    }

    /// <summary>The running product over all elements and its exact energy derivative.</summary>
    internal ScaledProduct Accumulate(double e)
    {
        var product = ScaledProduct.Identity;
        for (var i = 0; i < _kinds.Length; i++)
        {
            ApplyElement(i, e, ref product);
        }
        return product;
    }

    /// <summary>Applies element <paramref name="i"/> (matrix and energy derivative) to the running product.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void ApplyElement(int i, double e, ref ScaledProduct product)
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

    /// <summary>
    /// The matrix of element <paramref name="i"/> alone at <paramref name="e"/>, divided by e^logScale, without a derivative
    /// (for scattering matrices); a segment's is the product over its steps.
    /// </summary>
    internal void ElementMatrix(int i, double e, out double m11, out double m12, out double m21, out double m22, out double logScale)
    {
        switch (_kinds[i])
        {
            case ElementKind.Layer:
            {
                LayerCoefficients(i, e, out var mass, out var s);
                UniformLayerPropagator.Values(s, _data[ElementData.Stride * i + ElementData.Width], out var c, out var sinc, out logScale);
                m11 = c;
                m22 = c;
                m12 = mass * sinc;
                m21 = -(s / mass) * sinc;
                return;
            }
            case ElementKind.Delta:
                (m11, m12, m21, m22, logScale) = (1, 0, _data[ElementData.Stride * i + ElementData.Jump], 1, 0);
                return;
            case ElementKind.LinearLayer:
            {
                var at = ElementData.Stride * i;
                LinearLayerPropagator.Evaluate(e, _data[at + ElementData.Potential], _data[at + ElementData.PotentialSlope], _data[at + ElementData.Width],
                    _data[at + ElementData.Mass], out m11, out m12, out m21, out m22, out logScale);
                return;
            }
            default:
            {
                var product = ScaledProduct.Identity;
                _segments![i]!.Propagate(e, ref product);
                (m11, m12, m21, m22, logScale) = (product.P11, product.P12, product.P21, product.P22, product.LogScale);
                return;
            }
        }
    }

    /// <summary>Scaled matrix and exact energy derivative of uniform layer <paramref name="i"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void LayerMatrix(int i, double e, out double m11, out double m12, out double m21, out double m22,
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

    /// <summary>
    /// The product over all elements with, in its derivative part, d/dp of the product for parameter <paramref name="parameter"/>
    /// of layer <paramref name="layerIndex"/> (every other element enters unchanged): Tr of it is ∂D/∂p at fixed energy, the
    /// numerator of the sensitivity dE/dp = −(∂D/∂p)/(∂D/∂E) of a band edge or level.
    /// </summary>
    internal ScaledProduct AccumulateParameterDerivative(double e, int layerIndex, LayerParameter parameter)
    {
        CheckLayers([layerIndex], nameof(layerIndex));
        return AccumulateParameterDerivative(e, [layerIndex], parameter);
    }

    /// <summary>
    /// The product over all elements with, in its derivative part, d/dp of the product when one parameter p sets
    /// <paramref name="parameter"/> of every layer in <paramref name="layerIndices"/> at once (a layer of a repeated cell
    /// occurs once per repetition): by the product rule the sum of the one-layer derivatives.
    /// </summary>
    internal ScaledProduct AccumulateParameterDerivative(double e, ReadOnlySpan<int> layerIndices, LayerParameter parameter)
    {
        CheckLayers(layerIndices, nameof(layerIndices));
        var product = ScaledProduct.Identity;
        var next = 0;
        for (var i = 0; i < _kinds.Length; i++)
        {
            if (next < layerIndices.Length && layerIndices[next] == i)
            {
                next++;
                LayerParameterMatrix(i, e, parameter, out var m11, out var m12, out var m21, out var m22, out var d11, out var d12, out var d21, out var d22, out var logScale);
                product.ApplyLeft(m11, m12, m21, m22, d11, d12, d21, d22, logScale);
                continue;
            }
            ElementMatrix(i, e, out var a11, out var a12, out var a21, out var a22, out var l);
            product.ApplyLeft(a11, a12, a21, a22, 0, 0, 0, 0, l);
        }
        return product;
    }

    /// <summary>
    /// The product over all elements with every entry a jet in the energy and one parameter p that sets
    /// <paramref name="parameter"/> of every layer in <paramref name="layerIndices"/>: P, ∂P/∂E, ∂²P/∂E², ∂P/∂p and ∂²P/∂E∂p
    /// exactly (for the stationary points of the transmission, whose implicit derivative needs the second order).
    /// Uniform layers and deltas only.
    /// </summary>
    internal SecondOrderProduct AccumulateSecondOrder(double e, ReadOnlySpan<int> layerIndices, LayerParameter parameter)
    {
        CheckLayers(layerIndices, nameof(layerIndices));
        ParameterJet p11 = ParameterJet.Constant(1), p12 = default, p21 = default, p22 = ParameterJet.Constant(1);
        double logScale = 0;
        var next = 0;
        for (var i = 0; i < _kinds.Length; i++)
        {
            ParameterJet m11, m12, m21, m22;
            var l = 0.0;
            switch (_kinds[i])
            {
                case ElementKind.Layer:
                {
                    var varied = next < layerIndices.Length && layerIndices[next] == i;
                    if (varied)
                    {
                        next++;
                    }
                    var at = ElementData.Stride * i;
                    LayerJets.Evaluate(e, _data[at + ElementData.Width], _data[at + ElementData.Potential], _data[at + ElementData.Mass],
                        _data[at + ElementData.MassSlope], varied, parameter, out m11, out m12, out m21, out m22, out l);
                    break;
                }
                case ElementKind.Delta:
                    (m11, m12, m21, m22) = (ParameterJet.Constant(1), default, ParameterJet.Constant(DeltaJump(i)), ParameterJet.Constant(1));
                    break;
                default:
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                        $"element {i} is not a uniform layer or a delta; second-order parameter derivatives are defined for those."), nameof(e));
            }
            JetMatrix.ApplyLeft(m11, m12, m21, m22, l, ref p11, ref p12, ref p21, ref p22, ref logScale);
        }
        return new SecondOrderProduct(p11, p12, p21, p22, logScale);
    }

    /// <summary>Throws unless <paramref name="layerIndices"/> are increasing indices of uniform layers.</summary>
    internal void CheckLayers(ReadOnlySpan<int> layerIndices, string paramName)
    {
        for (var k = 0; k < layerIndices.Length; k++)
        {
            var i = layerIndices[k];
            if (i < 0 || i >= _kinds.Length || _kinds[i] != ElementKind.Layer || (k > 0 && i <= layerIndices[k - 1]))
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"element {i} is not a uniform layer (or the indices are not increasing); parameter derivatives are defined for layers."), paramName);
            }
        }
    }

    /// <summary>
    /// Scaled matrix of uniform layer <paramref name="i"/> and its exact derivative with respect to its width, potential or
    /// band-edge mass at fixed energy (the same scale factor e^logScale for both).
    /// </summary>
    internal void LayerParameterMatrix(int i, double e, LayerParameter parameter, out double m11, out double m12, out double m21, out double m22,
        out double d11, out double d12, out double d21, out double d22, out double logScale)
    {
        LayerMatrix(i, e, out m11, out m12, out m21, out m22, out d11, out d12, out d21, out d22, out logScale, out var s, out var mass);
        var at = ElementData.Stride * i;
        var width = _data[at + ElementData.Width];
        switch (parameter)
        {
            case LayerParameter.Width:
                // dc/dw = −s·S, dS/dw = c (the same scale factor as M itself).
                d11 = -s * m12 / mass;
                d22 = d11;
                d12 = mass * m11;
                d21 = -(s / mass) * m11;
                break;
            case LayerParameter.Potential:
                // E and V enter only through E − V.
                (d11, d12, d21, d22) = (-d11, -d12, -d21, -d22);
                break;
            default:
            {
                // m = m₀(1 + α(E − V)): dm/dm₀ = m/m₀, ds/dm₀ = s/m₀; M12 = m·S, M21 = −(s/m)·S.
                var m0 = _data[at + ElementData.Mass];
                UniformLayerPropagator.Evaluate(s, width, out _, out var sinc, out var dcds, out var dSds, out _);
                var dsdp = s / m0;
                var dmdp = mass / m0;
                d11 = dsdp * dcds;
                d22 = d11;
                d12 = dsdp * mass * dSds + dmdp * sinc;
                d21 = -dsdp * (sinc + s * dSds) / mass + dmdp * s * sinc / (mass * mass);
                break;
            }
        }
    }

    /// <summary>
    /// Number of zeros in (0, L) of the solution with ψ(0) = 0 (the Dirichlet eigenvalue count below E by the Sturm
    /// oscillation theorem), with the product over all elements in the same pass.
    /// </summary>
    internal int CountDirichletZeros(double e, out ScaledProduct cellProduct)
    {
        // The state vector (u, w) = (ψ, ψ'/m) from (0, 1); zeros of u are counted per element.
        double u = 0, w = 1, ignored = 0;
        var zeros = 0;
        var product = ScaledProduct.Identity;
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
            ScaledProduct.Renormalise(ref u, ref w, ref ignored);
        }
        if (u == 0)
        {
            zeros--; // the far end itself is not in the open interval (0, L)
        }
        cellProduct = product;
        return zeros;
    }

    /// <summary>Propagates (u, w)·e^log across element <paramref name="i"/>, left to right; returns the zeros of ψ in (x_i, x_{i+1}].</summary>
    internal int StepForward(int i, double e, ref double u, ref double w, ref double log)
    {
        int zeros;
        switch (_kinds[i])
        {
            case ElementKind.Delta:
                w += DeltaJump(i) * u;
                return 0;
            case ElementKind.Layer:
            {
                LayerCoefficients(i, e, out var mass, out var s);
                var width = _data[ElementData.Stride * i + ElementData.Width];
                UniformLayerPropagator.Values(s, width, out var c, out var sinc, out var logScale);
                var u1 = c * u + mass * sinc * w;
                var w1 = -(s / mass) * sinc * u + c * w;
                zeros = LayerZeros(u, w, u1, w1, s, width, mass);
                u = u1;
                w = w1;
                log += logScale;
                break;
            }
            case ElementKind.LinearLayer:
            {
                var at = ElementData.Stride * i;
                zeros = LinearLayerPropagator.PropagateCounting(e, _data[at + ElementData.Potential], _data[at + ElementData.PotentialSlope],
                    _data[at + ElementData.Width], _data[at + ElementData.Mass], ref u, ref w, ref log);
                break;
            }
            default:
                zeros = _segments![i]!.PropagateState(e, ref u, ref w, ref log, forward: true);
                break;
        }
        ScaledProduct.Renormalise(ref u, ref w, ref log);
        return zeros;
    }

    /// <summary>Propagates (u, w)·e^log across element <paramref name="i"/>, right to left (the inverse matrix).</summary>
    internal void StepBackward(int i, double e, ref double u, ref double w, ref double log)
    {
        switch (_kinds[i])
        {
            case ElementKind.Delta:
                w -= DeltaJump(i) * u;
                return;
            case ElementKind.Layer:
            {
                LayerCoefficients(i, e, out var mass, out var s);
                UniformLayerPropagator.Values(s, _data[ElementData.Stride * i + ElementData.Width], out var c, out var sinc, out var logScale);
                var u0 = c * u - mass * sinc * w;
                var w0 = (s / mass) * sinc * u + c * w;
                u = u0;
                w = w0;
                log += logScale;
                break;
            }
            case ElementKind.LinearLayer:
            {
                // The inverse of a unimodular matrix is its adjugate.
                ElementMatrix(i, e, out var m11, out var m12, out var m21, out var m22, out var logScale);
                var u0 = m22 * u - m12 * w;
                var w0 = -m21 * u + m11 * w;
                u = u0;
                w = w0;
                log += logScale;
                break;
            }
            default:
                _segments![i]!.PropagateState(e, ref u, ref w, ref log, forward: false);
                break;
        }
        ScaledProduct.Renormalise(ref u, ref w, ref log);
    }

    /// <summary>
    /// ψ at offset <paramref name="t"/> from the left end of layer <paramref name="i"/> (t ≥ 0, forwards) for the state
    /// (u, w) there, or (t &lt; 0) at distance −t before its right end for the state there (backwards); divided by e^logScale.
    /// </summary>
    internal double ScaledLayerValue(int i, double e, double u, double w, double t, out double logScale)
    {
        if (_kinds[i] == ElementKind.Segment)
        {
            return _segments![i]!.ScaledValue(e, u, w, t, out logScale);
        }
        if (_kinds[i] == ElementKind.LinearLayer)
        {
            var at = ElementData.Stride * i;
            double v0 = _data[at + ElementData.Potential], slope = _data[at + ElementData.PotentialSlope], width = _data[at + ElementData.Width];
            var start = t >= 0 ? 0 : width + t;
            LinearLayerPropagator.Evaluate(e, v0 + slope * start, slope, Math.Abs(t), _data[at + ElementData.Mass],
                out var m11, out var m12, out _, out var m22, out logScale);
            return t >= 0 ? m11 * u + m12 * w : m22 * u - m12 * w;
        }
        LayerCoefficients(i, e, out var mass, out var s);
        UniformLayerPropagator.Values(s, Math.Abs(t), out var c, out var sinc, out logScale);
        return t >= 0 ? c * u + mass * sinc * w : c * u - mass * sinc * w;
    }

    /// <summary>
    /// (ψ, ψ′/m) at offset <paramref name="t"/> inside layer <paramref name="i"/> from the state (u, w) at its left end, unscaled;
    /// a negative t propagates backwards (the layer matrix M(−t) is M(t)⁻¹, c being even and S odd in t).
    /// </summary>
    internal (double Psi, double DerivativeOverMass) LayerStateAt(int i, double e, double u, double w, double t)
    {
        LayerCoefficients(i, e, out var mass, out var s);
        UniformLayerPropagator.UnscaledValues(s, t, out var c, out var sinc);
        return (c * u + mass * sinc * w, -(s / mass) * sinc * u + c * w);
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

    /// <summary>
    /// ln ∫ψ² over layer <paramref name="i"/> for ψ = a·c(y) + b·S(y), y measured from the end the state is given at (b = m·ψ′/m
    /// there, pointing into the layer); in closed form, with thick barriers in decaying exponentials so nothing overflows.
    /// </summary>
    internal double LogLayerIntegral(int i, double e, double a, double b) => TabledLogLayerIntegral(i, e, a, b, default);

    /// <summary>
    /// Propagates the real state (u₀, w₀) = (ψ, ψ′/m) at the start through every element at energy <paramref name="e"/>,
    /// writing the state at each boundary (<paramref name="psi"/>, <paramref name="derivativeOverMass"/>: Count + 1 entries)
    /// and the integrals of each element (<paramref name="moments"/>: Count entries; zero for deltas). Unscaled: for states that
    /// stay inside the double range (bound states and Bloch functions normalised to order one).
    /// </summary>
    /// <remarks>
    /// Layers: Gauss–Legendre (20 points) on panels of at most a quarter wave or a quarter decay length (√|s|·h ≤ π/2), so that
    /// ψ⁴, whose frequency is 4√s, is integrated to rounding. Magnus steps: the 8-point rule on the cubic Hermite interpolant of
    /// the step (exact for its fourth power), the scheme's own O(h⁴) model of ψ inside a step.
    /// </remarks>
    internal void Propagate(double e, double u0, double w0, Span<double> psi, Span<double> derivativeOverMass, Span<ElementMoments> moments)
    {
        var n = _kinds.Length;
        Preconditions.CheckDestination(n + 1, psi.Length, nameof(e), nameof(psi));
        Preconditions.CheckDestination(n + 1, derivativeOverMass.Length, nameof(e), nameof(derivativeOverMass));
        Preconditions.CheckDestination(n, moments.Length, nameof(e), nameof(moments));
        double u = u0, w = w0;
        psi[0] = u;
        derivativeOverMass[0] = w;
        for (var i = 0; i < n; i++)
        {
            switch (_kinds[i])
            {
                case ElementKind.Delta:
                    w += DeltaJump(i) * u;
                    moments[i] = default;
                    break;
                case ElementKind.Layer:
                    moments[i] = LayerMoments(i, e, u, w);
                    (u, w) = LayerStateAt(i, e, u, w, _data[ElementData.Stride * i + ElementData.Width]);
                    break;
                default:
                    moments[i] = _segments![i]!.PropagateWithMoments(e, ref u, ref w, Start(i));
                    break;
            }
            psi[i + 1] = u;
            derivativeOverMass[i + 1] = w;
        }
    }

    private ElementMoments LayerMoments(int i, double e, double u, double w)
    {
        LayerCoefficients(i, e, out var mass, out var s);
        var width = _data[ElementData.Stride * i + ElementData.Width];
        var panels = (int)Math.Clamp(Math.Ceiling(Math.Sqrt(Math.Abs(s)) * width / (0.5 * Math.PI)), 1, int.MaxValue / 2);
        var h = width / panels;
        var rule = GaussLegendre.Twenty;
        double norm = 0, first = 0, quartic = 0;
        for (var p = 0; p < panels; p++)
        {
            for (var g = 0; g < rule.Order; g++)
            {
                var t = (p + 0.5 + 0.5 * rule.Nodes[g]) * h;
                UniformLayerPropagator.UnscaledValues(s, t, out var c, out var sinc);
                var value = c * u + mass * sinc * w;
                var square = value * value;
                var weight = 0.5 * h * rule.Weights[g];
                norm += weight * square;
                first += weight * (Start(i) + t) * square;
                quartic += weight * square * square;
            }
        }
        return new ElementMoments(norm, first, quartic);
    }
}

/// <summary>The kind of one packed cell element.</summary>
internal enum ElementKind : byte
{
    Layer,
    Delta,
    Segment,

    /// <summary>A layer with a linear potential (a stack under bias).</summary>
    LinearLayer,
}

/// <summary>
/// Layout of the packed per-element numbers of <see cref="CompiledCell"/>: <see cref="Stride"/> doubles per
/// element. Every element of positive width stores its width (nm) in <see cref="Width"/>; a layer also stores potential (eV), band-edge mass (m0), mass slope dm/dE (m0/eV) and,
/// for the trace-only kernel, m/C and 1/m (C = ħ²/2m0 in eV·nm²); a linear layer (under bias) its potential
/// slope in <see cref="PotentialSlope"/> instead of m/C; a delta stores its jump of ψ′/m (strength / C) in <see cref="Jump"/>.
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

    /// <summary>The potential slope dV/dx (eV/nm) of a linear layer, in the slot the trace-only kernel's m/C takes in a uniform one.</summary>
    internal const int PotentialSlope = 4;

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
