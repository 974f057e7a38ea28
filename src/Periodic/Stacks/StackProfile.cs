// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Stacks;

/// <summary>
/// A stack written out element by element (repeated cells expanded), for the bound-state count and the
/// wavefunctions: the stack's leads and the compiled elements of the propagation kernel (<see cref="CompiledCell"/>),
/// which propagates states in both directions with a zero count and integrates them over layers.
/// </summary>
internal sealed class StackProfile
{
    internal StackProfile(LayerStack stack, long maxElements, string paramName)
        : this(stack, maxElements, paramName, 0, 0)
    {
    }

    /// <summary>
    /// The stack under a bias <paramref name="biasElectronVolts"/> = eU (as <see cref="StackTransmission.Create(LayerStack, Units.Energy)"/>:
    /// a uniform field across the layers, the right lead lowered by eU), the field acting on all elements but the first and last
    /// <paramref name="marginElements"/> (margins of lead material that a caller added outside the stack); bias 0 is the flat stack.
    /// </summary>
    internal StackProfile(LayerStack stack, long maxElements, string paramName, double biasElectronVolts, int marginElements)
    {
        Stack = stack;
        if (stack.ElementCount > maxElements)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"{paramName} has {stack.ElementCount} elements when its repeated cells are written out; bound states are computed for at most {maxElements}."),
                paramName);
        }
        var n = (int)stack.ElementCount;
        var written = new CellElement[n];
        var i = 0;
        double vMin = Math.Min(stack.LeftLead.PotentialElectronVolts, stack.RightLead.PotentialElectronVolts);
        var deltaWellStrength = 0.0;
        foreach (var part in stack.PartSpan)
        {
            var elements = part.Cell is null ? [part.Element!] : part.Cell.Elements.ToArray();
            for (var r = 0; r < part.Repetitions; r++)
            {
                foreach (var element in elements)
                {
                    switch (element)
                    {
                        case Layer layer:
                            vMin = Math.Min(vMin, layer.Potential.ElectronVolts);
                            break;
                        case DeltaBarrier delta:
                            deltaWellStrength += Math.Max(0, -delta.StrengthElectronVoltNanometres);
                            break;
                        case IPotentialSegment segment when biasElectronVolts == 0:
                            // A smooth segment (e.g. a self-consistent potential): the Magnus steps of the kernel count its zeros exactly
                            // for the sampled problem, so the oscillation count holds as for layers.
                            vMin = Math.Min(vMin, segment.MinimumPotential.ElectronVolts);
                            break;
                        default:
                            throw new ArgumentException(
                                string.Create(CultureInfo.InvariantCulture, $"stack element {i} is of unsupported type {element.GetType().Name}."),
                                paramName);
                    }
                    written[i++] = element;
                }
            }
        }
        Elements = written;
        if (biasElectronVolts == 0)
        {
            Kernel = new CompiledCell(written, paramName);
            RightLead = stack.RightLead;
        }
        else
        {
            double inside = 0;
            for (var j = marginElements; j < n - marginElements; j++)
            {
                inside += written[j] is Layer layer ? layer.Width.Nanometres : 0;
            }
            Kernel = new CompiledCell(written, biasElectronVolts / inside, marginElements, n - 1 - marginElements, paramName);
            RightLead = Lead.Create(Units.Energy.FromElectronVolts(stack.RightLead.PotentialElectronVolts - biasElectronVolts), stack.RightLead.Mass);
            vMin = Math.Min(stack.LeftLead.PotentialElectronVolts, RightLead.PotentialElectronVolts);
            for (var j = 0; j < n; j++)
            {
                if (Kernel.IsDelta(j))
                {
                    continue;
                }
                var (width, potential, _, _) = Kernel.LayerData(j);
                var slope = Kernel.LinearLayerData(j, out _, out _, out var s, out _) ? s : 0;
                vMin = Math.Min(vMin, Math.Min(potential, potential + slope * width));
            }
        }
        BiasElectronVolts = biasElectronVolts;
        MinimumPotentialElectronVolts = vMin;
        DeltaWellStrengthElectronVoltNanometres = deltaWellStrength;
    }

    /// <summary>
    /// The stack between hard walls at its two ends (ψ = 0 at x = 0 and at its thickness) instead of its leads: a closed box,
    /// whose every state is bound (the leads' band edges play no part). Zero bias only.
    /// </summary>
    internal StackProfile(LayerStack stack, long maxElements, string paramName, bool hardWalls)
        : this(stack, maxElements, paramName, 0, 0)
    {
        HardWalls = hardWalls;
    }

    /// <summary>True for a closed box (<see cref="StackProfile(LayerStack, long, string, bool)"/>): ψ vanishes at both ends.</summary>
    internal bool HardWalls { get; }



    internal LayerStack Stack { get; }

    /// <summary>The stack's elements written out, in order (element i of <see cref="Kernel"/> is Elements[i]).</summary>
    internal CellElement[] Elements { get; }

    /// <summary>The right lead as the states see it: the stack's, lowered by the bias.</summary>
    internal Lead RightLead { get; }

    /// <summary>The potential drop eU across the stack, eV (0: flat).</summary>
    internal double BiasElectronVolts { get; }

    /// <summary>The compiled elements and the propagation kernel over them.</summary>
    internal CompiledCell Kernel { get; }

    internal int Count => Kernel.Count;

    /// <summary>Boundaries[i] = left end of element i; Boundaries[Count] = thickness.</summary>
    internal double[] Boundaries => Kernel.Boundaries;

    internal bool IsDelta(int i) => Kernel.IsDelta(i);

    internal double MinimumPotentialElectronVolts { get; }

    internal double LowestValidEnergyElectronVolts => Kernel.LowestValidEnergyElectronVolts;

    /// <summary>Sum of the strengths of the delta wells (eV nm, ≥ 0).</summary>
    internal double DeltaWellStrengthElectronVoltNanometres { get; }

    internal double LeftDecay(double e) => Stack.LeftLead.DecayConstantPerNanometre(e);

    internal double RightDecay(double e) => RightLead.DecayConstantPerNanometre(e);

    /// <summary>
    /// Number of bound states strictly below <paramref name="e"/> (e below both lead edges): the zeros on the
    /// whole line of the solution that decays into the left lead (Sturm oscillation theorem).
    /// </summary>
    internal int CountBelow(double e, out double mismatch) => CountBelow(e, out mismatch, default);

    /// <summary>
    /// As <see cref="CountBelow(double, out double)"/>, with <paramref name="scratch"/> (<see cref="ShootingScratchLength"/>
    /// doubles, or fewer to step element by element) for the kernel's per-energy table of repeated layers; the same numbers.
    /// </summary>
    internal int CountBelow(double e, out double mismatch, Span<double> scratch)
    {
        if (HardWalls)
        {
            return CountBelowInBox(e, out mismatch, scratch);
        }
        var mLeft = Stack.LeftLead.MassElectronMasses;
        double u = 1, w = LeftDecay(e) / mLeft, log = 0;
        var zeros = Kernel.Shoot(e, ref u, ref w, ref log, scratch);
        // In the right lead ψ = A e^{κ(x−L)} + B e^{−κ(x−L)}; it has one more zero iff u(L) and A have opposite signs.
        var tail = RightLead.MassElectronMasses * w / RightDecay(e);
        var growing = u + tail;
        if (u * growing < 0)
        {
            zeros++;
        }
        var scale = Math.Max(Math.Abs(u), Math.Abs(tail));
        mismatch = scale > 0 && double.IsFinite(scale) ? (u / scale + tail / scale) / Math.Sqrt((u / scale) * (u / scale) + (tail / scale) * (tail / scale)) : 0.0;
        return zeros;
    }

    /// <summary>Scratch doubles for <see cref="CountBelow(double, out double, Span{double})"/> and <see cref="CountBelow(double, Span{double}, out double, out double)"/>.</summary>
    internal int ShootingScratchLength => Kernel.ShootingScratchLength;

    /// <summary>True when <see cref="CountBelow(double, Span{double}, out double, out double)"/> applies (no bias).</summary>
    internal bool HasEnergyDerivative => Kernel.HasEnergyDerivative;

    /// <summary>
    /// As <see cref="CountBelow(double, out double, Span{double})"/>, with the coefficient A of the growing tail in the right lead
    /// of the solution that decays into the left one (between hard walls: ψ(L)), which vanishes exactly at the levels and is
    /// smooth in E, and its exact energy derivative: <paramref name="mismatch"/> = A/s and <paramref name="slope"/> = (dA/dE)/s
    /// (1/eV) for some s &gt; 0 that changes with the energy, so only their ratio, the Newton step −A/A′, is meaningful.
    /// </summary>
    internal int CountBelow(double e, Span<double> scratch, out double mismatch, out double slope)
    {
        double u, w, du, dw, log = 0;
        int zeros;
        double growing, growingSlope;
        if (HardWalls)
        {
            (u, w, du, dw) = (0, 1, 0, 0);
            zeros = Kernel.ShootWithDerivative(e, ref u, ref w, ref du, ref dw, ref log, scratch);
            if (u == 0)
            {
                zeros--; // the far wall itself is not in the open interval
            }
            (growing, growingSlope) = (u, du);
        }
        else
        {
            var leftLead = Stack.LeftLead;
            var mLeft = leftLead.MassElectronMasses;
            (u, w, du, dw) = (1, LeftDecay(e) / mLeft, 0, leftLead.DecayConstantSlope(e) / mLeft);
            zeros = Kernel.ShootWithDerivative(e, ref u, ref w, ref du, ref dw, ref log, scratch);
            var mRight = RightLead.MassElectronMasses;
            var kappa = RightDecay(e);
            var tail = mRight * w / kappa;
            var dtail = mRight * dw / kappa - tail * RightLead.DecayConstantSlope(e) / kappa;
            if (u * (u + tail) < 0)
            {
                zeros++;
            }
            (growing, growingSlope) = (u + tail, du + dtail);
        }
        // Only the ratio matters (both carry the pass's scale e^log): bring them to order one.
        var size = Math.Max(Math.Abs(growing), Math.Abs(growingSlope));
        (mismatch, slope) = size > 0 && double.IsFinite(size) ? (growing / size, growingSlope / size) : (0.0, double.NaN);
        return zeros;
    }

    /// <summary>
    /// Number of states of the closed box strictly below <paramref name="e"/>: the zeros in (0, L) of the solution with ψ(0) = 0
    /// (Sturm oscillation theorem for Dirichlet conditions; G. Teschl, Ordinary Differential Equations and Dynamical Systems,
    /// AMS 2012, ch. 5). The mismatch is ψ(L) over the size of the state there, which changes sign at each level.
    /// </summary>
    private int CountBelowInBox(double e, out double mismatch, Span<double> scratch)
    {
        double u = 0, w = 1, log = 0;
        var zeros = Kernel.Shoot(e, ref u, ref w, ref log, scratch);
        if (u == 0)
        {
            zeros--; // the far wall itself is not in the open interval
        }
        var scale = Stack.LeftLead.MassElectronMasses * WallLengthNanometres;
        var size = Math.Sqrt(u * u + scale * scale * w * w);
        mismatch = size > 0 && double.IsFinite(size) ? u / size : 0.0;
        return zeros;
    }

    /// <summary>A length (nm) that makes m·ψ′/m comparable with ψ in the closed box's mismatch and join: any fixed scale works.</summary>
    internal const double WallLengthNanometres = 1;
}
