// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics.Tensors;
using Periodic.Numerics;

namespace Periodic.Transfer;

/// <summary>A real state (ψ, ψ′/m) at the left end (U0, W0) and the right end (U1, W1) of one element, unscaled.</summary>
internal readonly record struct ElementEnds(double U0, double W0, double U1, double W1);

/// <summary>
/// Integrals over one element of the product of two real states a and b: <see cref="Overlap"/> ∫ψ_aψ_b dx,
/// <see cref="LocalMoment"/> ∫y·ψ_aψ_b dx with y measured from the element's left end (so that a caller's origin far away
/// costs no digits), and <see cref="Momentum"/> ∫ψ_a ψ_b′ dx (1/nm·nm⁻¹·nm: dimension of ψ², per nm).
/// </summary>
internal readonly record struct PairMoments(double Overlap, double LocalMoment, double Momentum);

internal sealed partial class CompiledCell
{
    /// <summary>
    /// ∫ψ_aψ_b, ∫yψ_aψ_b and ∫ψ_aψ_b′ over element <paramref name="i"/> for two states of this sequence at energies
    /// <paramref name="ea"/> and <paramref name="eb"/>, each given by its values at both ends of the element.
    /// </summary>
    /// <remarks>
    /// <para>Method: exact identities of the BenDaniel–Duke equation (ψ′ = m·w, w′ = (V − E)ψ/C, C = ħ²/2m₀) for one mass and a
    /// potential V(x) that is constant or linear in the element (a uniform layer, or a layer under a field). With
    /// W = ψ_a w_b − ψ_b w_a and ΔE = E_a − E_b, W′ = ΔE·ψ_aψ_b/C (the Wronskian identity behind the orthogonality of
    /// Sturm–Liouville eigenfunctions, e.g. R. Courant, D. Hilbert, Methods of Mathematical Physics I, ch. V), so
    /// ∫ψ_aψ_b = C[W]/ΔE; G = ((2V − E_a − E_b)/(mΔE))ψ_aψ_b − (2C/ΔE)w_a w_b has G′ = W + (2V′/(mΔE))ψ_aψ_b, so
    /// ∫W = [G] − (2V′/(mΔE))∫ψ_aψ_b and ∫yψ_aψ_b = (C/ΔE)([yW] − ∫W); and ∫ψ_aψ_b′ = m∫ψ_a w_b = ½[ψ_aψ_b] + ½m∫W.
    /// Every integral is then a closed form in the end values: no sampling.</para>
    /// <para>The two divisions by ΔE amplify rounding: the closed form is taken where a first-order bound on its error (machine
    /// epsilon times the terms that cancel, times e^(κw) under a barrier, where the propagation's intermediates exceed the end
    /// values), stays below <see cref="PairAbsoluteTolerance"/> of the states' norms. Elsewhere (close energies, a
    /// non-parabolic layer whose two masses differ, equal energies) the integrals are taken by 20-point Gauss–Legendre
    /// quadrature of the closed-form states on panels of phase or decay exponent at most 3π (<see cref="PairQuadrature"/>),
    /// exact to rounding for these entire functions. A delta barrier has zero width: all three are zero.</para>
    /// </remarks>
    /// <param name="i">The element.</param>
    /// <param name="ea">Energy of state a, eV.</param>
    /// <param name="a">State a at the element's ends.</param>
    /// <param name="eb">Energy of state b, eV.</param>
    /// <param name="b">State b at the element's ends.</param>
    /// <param name="normScale">
    /// The size of ∫ψ_a² and ∫ψ_b² over the whole line (1 for normalised states or states of order one); the closed form is
    /// taken where its estimated rounding error stays below <see cref="PairAbsoluteTolerance"/> of it; 0 forces the quadrature.
    /// </param>
    internal PairMoments PairIntegrals(int i, double ea, in ElementEnds a, double eb, in ElementEnds b, double normScale = 1) =>
        TryPairClosedForm(i, ea, a, eb, b, normScale, out var pair) ? pair : PairQuadrature(this, i, ea, a, this, eb, b);

    /// <summary>
    /// The closed form of <see cref="PairIntegrals"/> where it is well conditioned (true), else false and nothing; a delta gives
    /// zeros (true).
    /// </summary>
    internal bool TryPairClosedForm(int i, double ea, in ElementEnds a, double eb, in ElementEnds b, double normScale, out PairMoments pair) =>
        TryPairClosedForm(i, ea, a, eb, b, normScale, double.NaN, out pair);

    /// <summary>
    /// <see cref="TryPairClosedForm(int, double, in ElementEnds, double, in ElementEnds, double, out PairMoments)"/> with the
    /// growth factor <see cref="PairGrowth"/> of the lower of the two energies given (NaN: computed here), so that a caller
    /// pairing many states reuses one per state and element.
    /// </summary>
    internal bool TryPairClosedForm(int i, double ea, in ElementEnds a, double eb, in ElementEnds b, double normScale, double growth, out PairMoments pair)
    {
        pair = default;
        switch (_kinds[i])
        {
            case ElementKind.Delta:
                return true;
            case ElementKind.Layer:
            case ElementKind.LinearLayer:
                break;
            default:
                return false; // a smooth segment: no closed form, its steps are integrated by PairQuadrature
        }
        var at = ElementData.Stride * i;
        var width = _data[at + ElementData.Width];
        var v0 = _data[at + ElementData.Potential];
        var slope = _kinds[i] == ElementKind.LinearLayer ? _data[at + ElementData.PotentialSlope] : 0;
        var v1 = v0 + slope * width;
        var mass = _data[at + ElementData.Mass];
        var de = ea - eb;
        var parabolic = _kinds[i] == ElementKind.LinearLayer || _data[at + ElementData.MassSlope] == 0;
        if (!parabolic || de == 0)
        {
            return false;
        }
        // The end values are consistent to rounding of the largest intermediate of the propagation across the element, which
        // under a barrier exceeds them by up to e^(κw). The growth is at least 1, so a bound already too large without it
        // (close energies) refuses before the exponential is spent.
        var error = ClosedFormError(a, b, de, v0, v1, ea + eb, slope, mass, width);
        var allowed = PairAbsoluteTolerance * normScale;
        if (!(error <= allowed))
        {
            return false;
        }
        if (!((double.IsNaN(growth) ? PairGrowth(i, Math.Min(ea, eb)) : growth) * error <= allowed))
        {
            return false;
        }
        var w0 = a.U0 * b.W0 - b.U0 * a.W0;
        var w1 = a.U1 * b.W1 - b.U1 * a.W1;
        var overlap = C * (w1 - w0) / de;
        var g0 = (2 * v0 - ea - eb) / (mass * de) * (a.U0 * b.U0) - 2 * C / de * (a.W0 * b.W0);
        var g1 = (2 * v1 - ea - eb) / (mass * de) * (a.U1 * b.U1) - 2 * C / de * (a.W1 * b.W1);
        var integralW = g1 - g0 - 2 * slope / (mass * de) * overlap;
        var moment = C / de * (width * w1 - integralW);
        var momentum = 0.5 * (a.U1 * b.U1 - a.U0 * b.U0) + 0.5 * mass * integralW;
        pair = new PairMoments(overlap, moment, momentum);
        return true;
    }

    /// <summary>
    /// e^(κw) of layer <paramref name="i"/> at energy <paramref name="e"/> (κ from the layer's highest potential; 1 where the state
    /// oscillates; capped at e^700): how far the propagation's intermediates across the element can exceed its end values, the
    /// factor on the closed form's rounding. Larger at a lower energy, so a pair takes the value of its lower state.
    /// </summary>
    internal double PairGrowth(int i, double e)
    {
        if (_kinds[i] == ElementKind.Delta)
        {
            return 1;
        }
        var at = ElementData.Stride * i;
        var width = _data[at + ElementData.Width];
        var v0 = _data[at + ElementData.Potential];
        var slope = _kinds[i] == ElementKind.LinearLayer ? _data[at + ElementData.PotentialSlope] : 0;
        var mass = _data[at + ElementData.Mass];
        var exponent = Math.Sqrt(Math.Max(0, mass / C * Math.Max(Math.Max(v0, v0 + slope * width) - e, 0))) * width;
        return Math.Exp(Math.Min(700, exponent));
    }

    /// <summary>Absolute rounding error, relative to the states' norms, below which the closed form is taken whatever ΔE.</summary>
    internal const double PairAbsoluteTolerance = 1e-12;

    /// <summary>
    /// A first-order bound on the rounding error of the closed form's three results (the largest of δ∫ψ_aψ_b, δ∫yψ_aψ_b/w and
    /// δ∫ψ_aψ_b′·w): machine epsilon times the magnitudes of the terms that cancel, divided by |ΔE| as the formulas do.
    /// </summary>
    private static double ClosedFormError(in ElementEnds a, in ElementEnds b, double de, double v0, double v1, double sum, double slope, double mass, double width)
    {
        const double epsilon = FloatingPoint.MachineEpsilon;
        var inverse = 1 / Math.Abs(de);
        var wronskians = Math.Abs(a.U0 * b.W0) + Math.Abs(b.U0 * a.W0) + Math.Abs(a.U1 * b.W1) + Math.Abs(b.U1 * a.W1);
        var overlap = epsilon * C * inverse * wronskians;
        var g = Math.Abs(2 * v0 - sum) / mass * inverse * Math.Abs(a.U0 * b.U0) + 2 * C * inverse * Math.Abs(a.W0 * b.W0)
            + Math.Abs(2 * v1 - sum) / mass * inverse * Math.Abs(a.U1 * b.U1) + 2 * C * inverse * Math.Abs(a.W1 * b.W1);
        var integralW = epsilon * g + 2 * Math.Abs(slope) / mass * inverse * overlap;
        var moment = C * inverse * (epsilon * width * (Math.Abs(a.U1 * b.W1) + Math.Abs(b.U1 * a.W1)) + integralW);
        var momentum = epsilon * (Math.Abs(a.U1 * b.U1) + Math.Abs(a.U0 * b.U0)) + 0.5 * mass * integralW;
        return Math.Max(overlap, Math.Max(moment / width, momentum * width));
    }

    /// <summary>
    /// The integrals of <see cref="PairIntegrals"/> by quadrature over element <paramref name="i"/>, for state a of
    /// <paramref name="kernelA"/> and state b of <paramref name="kernelB"/> (two sequences with the same element boundaries,
    /// e.g. electrons and holes of one structure, or the same sequence twice).
    /// </summary>
    /// <remarks>
    /// 20-point Gauss–Legendre (W. H. Press et al., Numerical Recipes, 3rd ed., §4.6) on panels with √|s|·h ≤ π for both
    /// states (<see cref="Panels"/>), the states evaluated in closed form at each node by
    /// <see cref="StateInside"/> (<see cref="SampleNodes"/>, <see cref="NodePair"/>).
    /// </remarks>
    internal static PairMoments PairQuadrature(CompiledCell kernelA, int i, double ea, in ElementEnds a, CompiledCell kernelB, double eb, in ElementEnds b)
    {
        if (kernelA._kinds[i] == ElementKind.Delta)
        {
            return default;
        }
        if (kernelA._kinds[i] == ElementKind.Segment || kernelB._kinds[i] == ElementKind.Segment)
        {
            if (kernelA._kinds[i] != kernelB._kinds[i])
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"element {i} is a smooth segment in one sequence and not in the other; integrals of pairs need the same kind of element."), nameof(i));
            }
            return kernelB._segments![i]!.PairIntegrals(kernelA._segments![i]!, ea, a, eb, b);
        }
        var panels = Math.Max(kernelA.Panels(i, ea, ea), kernelB.Panels(i, eb, eb));
        var count = panels * GaussLegendre.Twenty.Order;
        Span<double> psiA = count <= 512 ? stackalloc double[count] : new double[count];
        Span<double> psiB = count <= 512 ? stackalloc double[count] : new double[count];
        Span<double> wB = count <= 512 ? stackalloc double[count] : new double[count];
        kernelA.SampleNodes(i, ea, a, panels, psiA, default);
        kernelB.SampleNodes(i, eb, b, panels, psiB, wB);
        return kernelB.NodePair(i, eb, panels, psiA, psiB, wB);
    }

    /// <summary>
    /// Panels of the quadrature over element <paramref name="i"/> for states with energies in [<paramref name="lower"/>,
    /// <paramref name="upper"/>]: √|s|·h ≤ 3π for every one of them (|s| is largest at an end of the window), so a product of two
    /// turns or grows by at most αh = 6π per panel. The 20-point rule's error is h(αh)^40(20!)⁴/(41·(40!)³) times the size of the
    /// integrand (the Gauss–Legendre remainder, e.g. Abramowitz and Stegun 25.4.30): 1.6e-21 relative at αh = 6π, far below
    /// rounding; 0 for a delta and for a smooth segment (integrated over its own Magnus steps instead).
    /// </summary>
    internal int Panels(int i, double lower, double upper) => _kinds[i] is ElementKind.Delta or ElementKind.Segment
        ? 0
        : (int)Math.Clamp(Math.Ceiling(Math.Max(Reach(i, lower), Reach(i, upper)) / (3 * Math.PI)), 1, int.MaxValue / 2);

    /// <summary>
    /// ψ (and ψ′/m where <paramref name="derivativeOverMass"/> is not empty) of a state at the 20 Gauss–Legendre nodes of each of
    /// <paramref name="panels"/> equal panels of element <paramref name="i"/>, by <see cref="StateInside"/>.
    /// </summary>
    internal void SampleNodes(int i, double e, in ElementEnds ends, int panels, Span<double> psi, Span<double> derivativeOverMass)
    {
        var rule = GaussLegendre.Twenty;
        var width = _data[ElementData.Stride * i + ElementData.Width];
        var h = width / panels;
        if (_kinds[i] == ElementKind.Layer)
        {
            LayerCoefficients(i, e, out var mass, out var s);
            var z = s * width * width;
            if (z <= -1 && Math.Sqrt(-s) * width < 700)
            {
                SampleBarrier(Math.Sqrt(-s), width, mass, ends, panels, psi, derivativeOverMass);
                return;
            }
            if (z >= 1)
            {
                SampleWell(Math.Sqrt(s), width, mass, ends, panels, psi, derivativeOverMass);
                return;
            }
        }
        var q = 0;
        for (var p = 0; p < panels; p++)
        {
            for (var g = 0; g < rule.Order; g++, q++)
            {
                StateInside(i, e, ends, (p + 0.5 + 0.5 * rule.Nodes[g]) * h, out psi[q], out var w);
                if (!derivativeOverMass.IsEmpty)
                {
                    derivativeOverMass[q] = w;
                }
            }
        }
    }

    /// <summary>The offsets from the element's left end of the 20 Gauss–Legendre nodes of each of <paramref name="panels"/> equal panels.</summary>
    private static void NodeOffsets(double width, int panels, Span<double> destination)
    {
        var rule = GaussLegendre.Twenty;
        var h = width / panels;
        var q = 0;
        for (var p = 0; p < panels; p++)
        {
            for (var g = 0; g < rule.Order; g++, q++)
            {
                destination[q] = (p + 0.5 + 0.5 * rule.Nodes[g]) * h;
            }
        }
    }

    /// <summary>
    /// <see cref="SampleNodes"/> in an oscillating uniform layer (kw ≥ 1): ψ(y) = ψ(0)·cos ky + (m·w(0)/k)·sin ky and
    /// ψ′/m = −(k/m)·ψ(0)·sin ky + w(0)·cos ky (<see cref="LayerStateAt"/> written out). The nodes of a panel lie in pairs
    /// y = c ± d about its middle c, and every panel has the same offsets d, so the sines and cosines come from the angle-addition
    /// formulas with one sine and cosine per panel and one per offset: about half a sine and cosine per node.
    /// </summary>
    private static void SampleWell(double k, double width, double mass, in ElementEnds ends, int panels, Span<double> psi, Span<double> derivativeOverMass)
    {
        var rule = GaussLegendre.Twenty;
        var order = rule.Order;
        var half = order / 2; // the 20-point rule has no node at the middle; Nodes[order − 1 − g] = −Nodes[g]
        var h = width / panels;
        Span<double> sinD = stackalloc double[half];
        Span<double> cosD = stackalloc double[half];
        for (var g = 0; g < half; g++)
        {
            (sinD[g], cosD[g]) = Math.SinCos(k * 0.5 * h * rule.Nodes[order - 1 - g]);
        }
        double u = ends.U0, b = mass * ends.W0 / k, c = -k / mass * ends.U0, w = ends.W0;
        var withDerivative = !derivativeOverMass.IsEmpty;
        for (var p = 0; p < panels; p++)
        {
            var (sinC, cosC) = Math.SinCos(k * (p + 0.5) * h);
            var at = p * order;
            for (var g = 0; g < half; g++)
            {
                // Node order − 1 − g at c + d, node g at c − d.
                var cosPlus = cosC * cosD[g] - sinC * sinD[g];
                var sinPlus = sinC * cosD[g] + cosC * sinD[g];
                var cosMinus = cosC * cosD[g] + sinC * sinD[g];
                var sinMinus = sinC * cosD[g] - cosC * sinD[g];
                psi[at + order - 1 - g] = u * cosPlus + b * sinPlus;
                psi[at + g] = u * cosMinus + b * sinMinus;
                if (withDerivative)
                {
                    derivativeOverMass[at + order - 1 - g] = c * sinPlus + w * cosPlus;
                    derivativeOverMass[at + g] = c * sinMinus + w * cosMinus;
                }
            }
        }
    }

    /// <summary>
    /// <see cref="SampleNodes"/> under a uniform barrier (κw ≥ 1): the two-sided form of <see cref="StateInside"/>,
    /// ψ(y) = [ψ(0)·sinh κ(w − y) + ψ(w)·sinh κy]/sinh κw, written in the decaying exponentials a = e^{−κy}, b = e^{−κ(w − y)},
    /// D = e^{−κw} = ab: sinh κ(w − y)/sinh κw = (a − Db)/(1 − D²), sinh κy/sinh κw = (b − Da)/(1 − D²), and the cosh
    /// ratios with + (two exponentials per node, all nodes at once by the vectorised <see cref="TensorPrimitives.Exp{T}(ReadOnlySpan{T}, Span{T})"/>,
    /// instead of three hyperbolic evaluations; no weight exceeds one).
    /// </summary>
    private static void SampleBarrier(double kappa, double width, double mass, in ElementEnds ends, int panels, Span<double> psi, Span<double> derivativeOverMass)
    {
        var count = panels * GaussLegendre.Twenty.Order;
        var rented = count > 256 ? System.Buffers.ArrayPool<double>.Shared.Rent(2 * count) : null;
        Span<double> buffer = rented is null ? stackalloc double[2 * count] : rented.AsSpan(0, 2 * count);
        var a = buffer[..count];
        var b = buffer.Slice(count, count);
        NodeOffsets(width, panels, a);
        TensorPrimitives.Subtract(width, a, b);
        TensorPrimitives.Multiply(a, -kappa, a);
        TensorPrimitives.Multiply(b, -kappa, b);
        TensorPrimitives.Exp<double>(a, a);
        TensorPrimitives.Exp<double>(b, b);
        var d = Math.Exp(-kappa * width);
        var inverse = 1 / (1 - d * d);
        for (var q = 0; q < count; q++)
        {
            psi[q] = (ends.U0 * (a[q] - d * b[q]) + ends.U1 * (b[q] - d * a[q])) * inverse;
        }
        if (!derivativeOverMass.IsEmpty)
        {
            for (var q = 0; q < count; q++)
            {
                derivativeOverMass[q] = kappa / mass * (-ends.U0 * (a[q] + d * b[q]) + ends.U1 * (b[q] + d * a[q])) * inverse;
            }
        }
        if (rented is not null)
        {
            System.Buffers.ArrayPool<double>.Shared.Return(rented);
        }
    }

    /// <summary>
    /// The integrals of a pair from its samples at the nodes of <see cref="SampleNodes"/> (state b, of energy <paramref name="eb"/>,
    /// of this sequence, for the mass in ψ_b′ = m·w_b).
    /// </summary>
    internal PairMoments NodePair(int i, double eb, int panels, ReadOnlySpan<double> psiA, ReadOnlySpan<double> psiB, ReadOnlySpan<double> wB)
    {
        var rule = GaussLegendre.Twenty;
        var h = _data[ElementData.Stride * i + ElementData.Width] / panels;
        var mass = MassAt(i, eb);
        double overlap = 0, moment = 0, momentum = 0;
        var q = 0;
        for (var p = 0; p < panels; p++)
        {
            for (var g = 0; g < rule.Order; g++, q++)
            {
                var weight = 0.5 * h * rule.Weights[g];
                var product = weight * psiA[q] * psiB[q];
                overlap += product;
                moment += product * (p + 0.5 + 0.5 * rule.Nodes[g]) * h;
                momentum += weight * psiA[q] * mass * wB[q];
            }
        }
        return new PairMoments(overlap, moment, momentum);
    }

    /// <summary>
    /// ∫ over element <paramref name="i"/> of F(y)², F(y) = <paramref name="start"/> + ∫₀^y ψ_aψ_b: the inner integral in closed
    /// form (<see cref="PairIntegrals"/>'s Wronskian) where the energies are well separated, else by a nested quadrature; the
    /// outer by the panels of <see cref="PairQuadrature"/>. F is an entire function, so the result is exact to rounding.
    /// </summary>
    internal double CumulativeSquare(int i, double ea, in ElementEnds a, double eb, in ElementEnds b, double start)
    {
        if (_kinds[i] == ElementKind.Delta)
        {
            return 0;
        }
        if (_kinds[i] == ElementKind.Segment)
        {
            return _segments![i]!.CumulativeSquare(ea, a, eb, b, start);
        }
        var width = _data[ElementData.Stride * i + ElementData.Width];
        var de = ea - eb;
        var closed = TryPairClosedForm(i, ea, a, eb, b, 1, out _);
        var wronskian0 = a.U0 * b.W0 - b.U0 * a.W0;
        var panels = (int)Math.Clamp(Math.Ceiling(Math.Max(Reach(i, ea), Reach(i, eb)) / (0.5 * Math.PI)), 1, int.MaxValue / 2);
        var h = width / panels;
        var rule = GaussLegendre.Twenty;
        double sum = 0, panelStart = start;
        for (var p = 0; p < panels; p++)
        {
            var y0 = p * h;
            for (var g = 0; g < rule.Order; g++)
            {
                var y = y0 + 0.5 * h * (1 + rule.Nodes[g]);
                double f;
                if (closed)
                {
                    StateInside(i, ea, a, y, out var psiA, out var wA);
                    StateInside(i, eb, b, y, out var psiB, out var wB);
                    f = start + C * (psiA * wB - psiB * wA - wronskian0) / de;
                }
                else
                {
                    double inner = 0;
                    for (var r = 0; r < rule.Order; r++)
                    {
                        var x = y0 + 0.5 * (y - y0) * (1 + rule.Nodes[r]);
                        StateInside(i, ea, a, x, out var psiA, out _);
                        StateInside(i, eb, b, x, out var psiB, out _);
                        inner += 0.5 * (y - y0) * rule.Weights[r] * psiA * psiB;
                    }
                    f = panelStart + inner;
                }
                sum += 0.5 * h * rule.Weights[g] * f * f;
            }
            if (!closed)
            {
                for (var r = 0; r < rule.Order; r++)
                {
                    var x = y0 + 0.5 * h * (1 + rule.Nodes[r]);
                    StateInside(i, ea, a, x, out var psiA, out _);
                    StateInside(i, eb, b, x, out var psiB, out _);
                    panelStart += 0.5 * h * rule.Weights[r] * psiA * psiB;
                }
            }
        }
        return sum;
    }

    /// <summary>
    /// (ψ, ψ′/m) at offset <paramref name="y"/> inside element <paramref name="i"/> of the state with end values
    /// <paramref name="ends"/> at energy <paramref name="e"/>, unscaled, evaluated stably: in an oscillating uniform layer from
    /// the left end; under a uniform barrier from both end values, ψ(y) = [ψ(0)·S(w − y) + ψ(w)·S(y)]/S(w), S = sinh(κy)/κ,
    /// whose weights never exceed one (no growing solution is amplified); in a linear layer from the nearer end.
    /// </summary>
    internal void StateInside(int i, double e, in ElementEnds ends, double y, out double psi, out double derivativeOverMass)
    {
        var at = ElementData.Stride * i;
        var width = _data[at + ElementData.Width];
        if (_kinds[i] == ElementKind.LinearLayer)
        {
            double v0 = _data[at + ElementData.Potential], slope = _data[at + ElementData.PotentialSlope], mass = _data[at + ElementData.Mass];
            if (y <= 0.5 * width)
            {
                LinearLayerPropagator.Evaluate(e, v0, slope, y, mass, out var m11, out var m12, out var m21, out var m22, out var logScale);
                var grow = Math.Exp(logScale);
                psi = (m11 * ends.U0 + m12 * ends.W0) * grow;
                derivativeOverMass = (m21 * ends.U0 + m22 * ends.W0) * grow;
            }
            else
            {
                LinearLayerPropagator.Evaluate(e, v0 + slope * y, slope, width - y, mass, out var m11, out var m12, out var m21, out var m22, out var logScale);
                var grow = Math.Exp(logScale);
                psi = (m22 * ends.U1 - m12 * ends.W1) * grow;
                derivativeOverMass = (-m21 * ends.U1 + m11 * ends.W1) * grow;
            }
            return;
        }
        LayerCoefficients(i, e, out var m, out var s);
        if (s >= 0 || s * width * width > -1)
        {
            (psi, derivativeOverMass) = LayerStateAt(i, e, ends.U0, ends.W0, y);
            return;
        }
        UniformLayerPropagator.Values(s, width, out _, out var sWidth, out var lWidth);
        UniformLayerPropagator.Values(s, y, out var cY, out var sY, out var lY);
        UniformLayerPropagator.Values(s, width - y, out var cRest, out var sRest, out var lRest);
        var toRight = Math.Exp(lY - lWidth) / sWidth;
        var toLeft = Math.Exp(lRest - lWidth) / sWidth;
        psi = ends.U0 * sRest * toLeft + ends.U1 * sY * toRight;
        derivativeOverMass = (-ends.U0 * cRest * toLeft + ends.U1 * cY * toRight) / m;
    }

    /// <summary>
    /// ln ∫ψ² over linear layer <paramref name="i"/> for the state (u, w) given at its left end (<paramref name="fromLeft"/>)
    /// or its right end; 20-point Gauss–Legendre on panels of at most a quarter wave or decay length, the state carried exactly
    /// from node to node away from that end (so the cost grows with the layer's phase, not its square), summed in logarithms so
    /// that nothing overflows.
    /// </summary>
    internal double LogLinearLayerIntegral(int i, double e, double u, double w, bool fromLeft)
    {
        var at = ElementData.Stride * i;
        double width = _data[at + ElementData.Width], v0 = _data[at + ElementData.Potential], slope = _data[at + ElementData.PotentialSlope], mass = _data[at + ElementData.Mass];
        var panels = (int)Math.Clamp(Math.Ceiling(Reach(i, e) / (0.5 * Math.PI)), 1, int.MaxValue / 2);
        var h = width / panels;
        var rule = GaussLegendre.Twenty;
        var count = panels * rule.Order;
        var logs = new double[count];
        double log = 0, position = fromLeft ? 0 : width;
        for (var q = 0; q < count; q++)
        {
            // Nodes in the order of travel: ascending from the left end, descending from the right end.
            var index = fromLeft ? q : count - 1 - q;
            var p = index / rule.Order;
            var g = index % rule.Order;
            var y = (p + 0.5 + 0.5 * rule.Nodes[g]) * h;
            var from = Math.Min(position, y);
            LinearLayerPropagator.Evaluate(e, v0 + slope * from, slope, Math.Abs(y - position), mass, out var m11, out var m12, out var m21, out var m22, out var logScale);
            (u, w) = fromLeft ? (m11 * u + m12 * w, m21 * u + m22 * w) : (m22 * u - m12 * w, -m21 * u + m11 * w);
            log += logScale;
            ScaledProduct.Renormalise(ref u, ref w, ref log);
            position = y;
            logs[q] = u == 0 ? double.NegativeInfinity : Math.Log(0.5 * h * rule.Weights[g] * u * u) + 2 * log;
        }
        var max = logs.Max();
        if (double.IsNegativeInfinity(max))
        {
            return max;
        }
        double sum = 0;
        foreach (var l in logs)
        {
            sum += Math.Exp(l - max);
        }
        return max + Math.Log(sum);
    }

    /// <summary>
    /// ∫ψ² over element <paramref name="i"/> for the state with end values <paramref name="ends"/> at <paramref name="e"/>, taken
    /// from the end the state was propagated from (<paramref name="fromLeft"/>: the left one), whose values represent it
    /// exactly: in closed form for a uniform layer (<see cref="LogLayerIntegral"/>), by quadrature for a linear one
    /// (<see cref="LogLinearLayerIntegral"/>); zero for a delta.
    /// </summary>
    internal double SquareIntegral(int i, double e, in ElementEnds ends, bool fromLeft)
    {
        switch (_kinds[i])
        {
            case ElementKind.Delta:
                return 0;
            case ElementKind.Layer:
            {
                LayerCoefficients(i, e, out var mass, out _);
                return fromLeft
                    ? Math.Exp(LogLayerIntegral(i, e, ends.U0, mass * ends.W0))
                    : Math.Exp(LogLayerIntegral(i, e, ends.U1, -mass * ends.W1));
            }
            case ElementKind.LinearLayer:
                return fromLeft
                    ? Math.Exp(LogLinearLayerIntegral(i, e, ends.U0, ends.W0, fromLeft: true))
                    : Math.Exp(LogLinearLayerIntegral(i, e, ends.U1, ends.W1, fromLeft: false));
            default:
                return Math.Exp(fromLeft
                    ? _segments![i]!.LogSquareIntegral(e, ends.U0, ends.W0, fromLeft: true)
                    : _segments![i]!.LogSquareIntegral(e, ends.U1, ends.W1, fromLeft: false));
        }
    }

    /// <summary>
    /// The state across element <paramref name="i"/>, unscaled: from (u, w) at its left end to its right end
    /// (<paramref name="forward"/>), or from its right end to its left end. A delta applies its jump of ψ′/m.
    /// </summary>
    internal (double U, double W) Across(int i, double e, double u, double w, bool forward)
    {
        switch (_kinds[i])
        {
            case ElementKind.Delta:
                return forward ? (u, w + DeltaJump(i) * u) : (u, w - DeltaJump(i) * u);
            case ElementKind.Layer:
            {
                var width = _data[ElementData.Stride * i + ElementData.Width];
                return LayerStateAt(i, e, u, w, forward ? width : -width);
            }
            case ElementKind.LinearLayer:
            {
                ElementMatrix(i, e, out var m11, out var m12, out var m21, out var m22, out var logScale);
                var grow = Math.Exp(logScale);
                return forward ? ((m11 * u + m12 * w) * grow, (m21 * u + m22 * w) * grow) : ((m22 * u - m12 * w) * grow, (-m21 * u + m11 * w) * grow);
            }
            default:
            {
                // A smooth segment: its Magnus steps, renormalised on the way and scaled back (segments are short enough
                // that the unscaled end values stay in range for the normalised states the optics carry).
                double log = 0;
                _segments![i]!.PropagateState(e, ref u, ref w, ref log, forward);
                var grow = Math.Exp(log);
                return (u * grow, w * grow);
            }
        }
    }

    /// <summary>The largest √|s|·w over element <paramref name="i"/> at energy <paramref name="e"/> (phase or decay exponent across it).</summary>
    private double Reach(int i, double e)
    {
        var at = ElementData.Stride * i;
        var width = _data[at + ElementData.Width];
        if (_kinds[i] == ElementKind.LinearLayer)
        {
            var scale = _data[at + ElementData.Mass] / C;
            var v0 = _data[at + ElementData.Potential];
            var v1 = v0 + _data[at + ElementData.PotentialSlope] * width;
            return Math.Sqrt(scale * Math.Max(Math.Abs(v0 - e), Math.Abs(v1 - e))) * width;
        }
        LayerCoefficients(i, e, out _, out var s);
        return Math.Sqrt(Math.Abs(s)) * width;
    }

    /// <summary>The mass m(E) of layer <paramref name="i"/> (a linear layer's constant mass; a smooth segment's mean mass), m₀.</summary>
    internal double MassAt(int i, double e)
    {
        if (_kinds[i] == ElementKind.LinearLayer)
        {
            return _data[ElementData.Stride * i + ElementData.Mass];
        }
        if (_kinds[i] == ElementKind.Segment)
        {
            return _segments![i]!.MeanMass;
        }
        LayerCoefficients(i, e, out var mass, out _);
        return mass;
    }
}
