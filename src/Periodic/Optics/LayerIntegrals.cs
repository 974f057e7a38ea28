// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;
using Periodic.Properties;
using Periodic.Stacks;

namespace Periodic.Optics;

/// <summary>
/// Layer integrals of products of two envelope functions over a written-out stack: ∫ψ_a ψ_b and
/// ∫z ψ_a ψ_b per layer, on one Gauss–Legendre grid shared by every state of an energy window, plus the
/// exponential tails in the two leads in closed form.
/// </summary>
/// <remarks>
/// <para>This belongs to the layer-integral family of the core propagation kernel (∫ψ², ∫zψ², ∫ψ⁴ per
/// uniform layer); it lives here until that kernel offers products of two states, and should move
/// there then.</para>
/// <para>Method: inside a uniform layer each state is A cos(ky) + B sin(ky)/k (or the cosh/sinh form under a
/// barrier), an entire function, so a product with z is integrated by composite 20-point Gauss–Legendre
/// quadrature (W. H. Press et al., Numerical Recipes, 3rd ed., §4.6). Each layer is cut into pieces over
/// which the product turns or grows by at most θ = (k_a + k_b)·h ≤ 10 radians or e-folds; the
/// 20-point error term (b − a)^41 (20!)^4 / (41 ((40)!)^3) f^(40) is then below 1e-40 of the largest
/// value on the piece, so the result carries only rounding (≈ 1e-16 of ∫|z ψ_a ψ_b|).</para>
/// </remarks>
internal sealed class LayerIntegrals
{
    private const double MaxTurnPerPiece = 10.0;

    private LayerIntegrals(StackProfile profile, double[] positions, double[] weights, int[] layerStart, double origin)
    {
        Profile = profile;
        Positions = positions;
        Weights = weights;
        LayerStart = layerStart;
        OriginNanometres = origin;
    }

    internal StackProfile Profile { get; }

    /// <summary>Quadrature nodes, nm from the left lead's interface.</summary>
    internal double[] Positions { get; }

    /// <summary>Quadrature weights, nm.</summary>
    internal double[] Weights { get; }

    /// <summary>Nodes of element j are LayerStart[j] … LayerStart[j + 1] − 1 (none for a delta barrier).</summary>
    internal int[] LayerStart { get; }

    /// <summary>Where z = 0 for the dipole integrals (the middle of the stack, which keeps rounding of ⟨a|b⟩ ≈ 0 out of ⟨a|z|b⟩).</summary>
    internal double OriginNanometres { get; }

    internal int Count => Positions.Length;

    /// <summary>A grid that integrates products of any two states with energies in [lower, upper] eV.</summary>
    internal static LayerIntegrals Create(StackProfile profile, double lowerElectronVolts, double upperElectronVolts) =>
        Create(profile, [(profile, lowerElectronVolts, upperElectronVolts)]);

    /// <summary>
    /// A grid on the geometry of <paramref name="profile"/> that integrates products of states of several profiles with the
    /// same element boundaries (electrons and holes of one structure), each over its own energy window.
    /// </summary>
    internal static LayerIntegrals Create(StackProfile profile, IReadOnlyList<(StackProfile Profile, double Lower, double Upper)> windows)
    {
        var rule = GaussLegendre.Twenty;
        var n = profile.Count;
        var pieces = new int[n];
        var total = 0;
        for (var j = 0; j < n; j++)
        {
            if (profile.IsDelta(j) || profile.Width(j) <= 0)
            {
                continue;
            }
            // The product of two states turns at most by the sum of their two largest wavenumbers.
            var largest = new List<double>();
            foreach (var (other, lower, upper) in windows)
            {
                other.Kernel.LayerCoefficients(j, lower, out _, out var sLow);
                other.Kernel.LayerCoefficients(j, upper, out _, out var sHigh);
                largest.Add(Math.Sqrt(Math.Max(Math.Abs(sLow), Math.Abs(sHigh))));
            }
            largest.Sort();
            var turn = (largest[^1] + largest[Math.Max(0, largest.Count - 2)]) * profile.Width(j);
            pieces[j] = Math.Max(1, (int)Math.Ceiling(turn / MaxTurnPerPiece));
            total += pieces[j] * rule.Nodes.Length;
        }
        var positions = new double[total];
        var weights = new double[total];
        var layerStart = new int[n + 1];
        var q = 0;
        for (var j = 0; j < n; j++)
        {
            layerStart[j] = q;
            var h = pieces[j] == 0 ? 0 : profile.Width(j) / pieces[j];
            for (var p = 0; p < pieces[j]; p++)
            {
                var a = profile.Boundaries[j] + p * h;
                for (var r = 0; r < rule.Nodes.Length; r++)
                {
                    positions[q] = a + 0.5 * h * (rule.Nodes[r] + 1);
                    weights[q] = 0.5 * h * rule.Weights[r];
                    q++;
                }
            }
        }
        layerStart[n] = q;
        return new LayerIntegrals(profile, positions, weights, layerStart, 0.5 * profile.Boundaries[n]);
    }

    /// <summary>Samples a bound state on the grid; also returns ψ at the two lead interfaces.</summary>
    internal void Sample(BoundWavefunction state, Span<double> destination, out double atLeft, out double atRight)
    {
        state.Evaluate(Positions, destination);
        atLeft = state.ValueAt(0);
        atRight = state.ValueAt(Profile.Boundaries[^1]);
    }

    /// <summary>Per element j: overlap[j] = ∫ψ_a ψ_b and moment[j] = ∫(z − origin) ψ_a ψ_b over the element.</summary>
    internal void PerLayer(ReadOnlySpan<double> a, ReadOnlySpan<double> b, Span<double> overlap, Span<double> moment)
    {
        for (var j = 0; j < LayerStart.Length - 1; j++)
        {
            double o = 0, m = 0;
            for (var q = LayerStart[j]; q < LayerStart[j + 1]; q++)
            {
                var p = Weights[q] * a[q] * b[q];
                o += p;
                m += p * (Positions[q] - OriginNanometres);
            }
            overlap[j] = o;
            moment[j] = m;
        }
    }

    /// <summary>∫ψ_a ψ_b and ∫(z − origin) ψ_a ψ_b over the whole stack (leads excluded).</summary>
    internal void Inside(ReadOnlySpan<double> a, ReadOnlySpan<double> b, out double overlap, out double moment)
    {
        double o = 0, m = 0;
        for (var q = 0; q < Positions.Length; q++)
        {
            var p = Weights[q] * a[q] * b[q];
            o += p;
            m += p * (Positions[q] - OriginNanometres);
        }
        overlap = o;
        moment = m;
    }

    /// <summary>
    /// The left-lead tail, x &lt; 0, of two decaying states ψ = ψ(0)e^{κx}: ∫ = P/K, ∫(x − origin) = −P/K² − origin·P/K, P = ψ_a(0)ψ_b(0), K = κ_a + κ_b.
    /// </summary>
    internal void LeftTail(double psiA, double kappaA, double psiB, double kappaB, out double overlap, out double moment)
    {
        var product = psiA * psiB;
        var k = kappaA + kappaB;
        overlap = product / k;
        moment = -product / (k * k) - OriginNanometres * overlap;
    }

    /// <summary>The right-lead tail, x &gt; L, of two decaying states ψ = ψ(L)e^{−κ(x−L)}: ∫ = P/K, ∫(x − origin) = P/K² + (L − origin)P/K.</summary>
    internal void RightTail(double psiA, double kappaA, double psiB, double kappaB, out double overlap, out double moment)
    {
        var product = psiA * psiB;
        var k = kappaA + kappaB;
        overlap = product / k;
        moment = product / (k * k) + (Profile.Boundaries[^1] - OriginNanometres) * overlap;
    }
}
