// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics.Tensors;
using Periodic.Stacks;
using Periodic.Transfer;

namespace Periodic.Optics;

/// <summary>
/// A real state on a compiled stack as the kernel's integrals of pairs of states take it: its energy, (ψ, ψ′/m) at every element
/// boundary (unscaled), and how it continues beyond the two ends: a decaying exponential into each lead (a bound state), or
/// nothing (a state normalised on a finite domain, whose domain ends are the sequence's ends).
/// </summary>
/// <remarks>
/// Every integral over the elements comes from <see cref="CompiledCell.PairIntegrals"/> (closed forms in the end values, or
/// quadrature of the closed-form states where two energies nearly coincide); the lead tails are closed forms here:
/// for ψ = ψ(0)e^{κx}, x &lt; 0, ∫ψ_aψ_b = P/K and ∫xψ_aψ_b = −P/K², P = ψ_a(0)ψ_b(0), K = κ_a + κ_b (and mirrored on the right).
/// </remarks>
internal sealed class KernelState
{
    private KernelState(CompiledCell kernel, double energy, double[] psi, double[] w, double leftDecay, double rightDecay, int join = int.MaxValue)
    {
        // Each element's two ends from one exact propagation at this energy: from its left end before the join of the two shooting
        // pieces, from its right end after it (as the wavefunction itself is represented). The closed forms then integrate exactly the
        // represented function, which the eigenvalue's tolerance and the join's small kink would otherwise spoil.
        var n = kernel.Count;
        _ends = new ElementEnds[n];
        for (var i = 0; i < n; i++)
        {
            if (i < join)
            {
                var (u1, w1) = kernel.Across(i, energy, psi[i], w[i], forward: true);
                _ends[i] = new ElementEnds(psi[i], w[i], u1, w1);
            }
            else
            {
                var (u0, w0) = kernel.Across(i, energy, psi[i + 1], w[i + 1], forward: false);
                _ends[i] = new ElementEnds(u0, w0, psi[i + 1], w[i + 1]);
            }
        }
        _join = join;
        _growth = new double[n];
        for (var i = 0; i < n; i++)
        {
            _growth[i] = kernel.PairGrowth(i, energy);
        }
        Kernel = kernel;
        EnergyElectronVolts = energy;
        Psi = psi;
        DerivativeOverMass = w;
        LeftDecayPerNanometre = leftDecay;
        RightDecayPerNanometre = rightDecay;
    }

    internal CompiledCell Kernel { get; }

    internal double EnergyElectronVolts { get; }

    /// <summary>ψ at each element boundary (Count + 1 entries).</summary>
    internal double[] Psi { get; }

    /// <summary>ψ′/m at each element boundary.</summary>
    internal double[] DerivativeOverMass { get; }

    /// <summary>κ of the decaying tail into the left lead, 1/nm; 0: no tail (the state ends at the domain's end).</summary>
    internal double LeftDecayPerNanometre { get; }

    /// <summary>κ of the decaying tail into the right lead, 1/nm; 0: no tail.</summary>
    internal double RightDecayPerNanometre { get; }

    private readonly ElementEnds[] _ends;

    /// <summary>The kernel's <see cref="CompiledCell.PairGrowth"/> of each element at this state's energy.</summary>
    private readonly double[] _growth;
    private readonly int _join;

    /// <summary>The state at both ends of element <paramref name="i"/>, the two ends joined by one exact propagation.</summary>
    internal ElementEnds Ends(int i) => _ends[i];

    /// <summary>
    /// Quadrature nodes shared by a set of states of one sequence (null: none): where two of them are too close in energy for
    /// the kernel's closed form, the quadrature then reuses each state's node values instead of recomputing them per pair.
    /// </summary>
    internal NodeLayout? Nodes { get; private set; }

    /// <summary>Shares <paramref name="layout"/> (built for an energy window holding this state's energy).</summary>
    internal KernelState WithNodes(NodeLayout layout)
    {
        Nodes = layout;
        return this;
    }

    /// <summary>
    /// Samples element <paramref name="i"/> at the nodes of <see cref="Nodes"/> on first use: ψ_a·weight and ψ_a·weight·x (this
    /// state as the left factor a of a pair; x from the middle of the sequence) and ψ_b, m·ψ′_b/m (as the right factor b).
    /// Idempotent, so a race only repeats the work.
    /// </summary>
    private void EnsureSampled(int i)
    {
        var layout = Nodes!;
        var done = _sampled ??= new bool[Kernel.Count];
        if (done[i] || layout.Panels[i] == 0)
        {
            return;
        }
        var count = layout.Count;
        var psi = _nodePsi ??= new double[count];
        var mw = _nodeMassW ??= new double[count];
        var weighted = _nodeWeighted ??= new double[count];
        var moment = _nodeMoment ??= new double[count];
        var span = new Range(layout.Offsets[i], layout.Offsets[i + 1]);
        Kernel.SampleNodes(i, EnergyElectronVolts, Ends(i), layout.Panels[i], psi.AsSpan(span), mw.AsSpan(span));
        var mass = Kernel.MassAt(i, EnergyElectronVolts);
        var (start, end) = (layout.Offsets[i], layout.Offsets[i + 1]);
        for (var q = start; q < end; q++)
        {
            mw[q] *= mass;
            weighted[q] = layout.Weights[q] * psi[q];
            moment[q] = weighted[q] * layout.Positions[q];
        }
        done[i] = true;
    }

    private bool[]? _sampled;
    private double[]? _nodePsi;
    private double[]? _nodeMassW;
    private double[]? _nodeWeighted;
    private double[]? _nodeMoment;

    /// <summary>A bound state on its own stack, with its tails.</summary>
    internal static KernelState Of(BoundWavefunction wave)
    {
        var profile = wave.Profile;
        var n = profile.Count;
        var psi = new double[n + 1];
        var w = new double[n + 1];
        wave.BoundaryStates(psi, w);
        var e = wave.EnergyElectronVolts;
        return new KernelState(profile.Kernel, e, psi, w, profile.LeftDecay(e), profile.RightDecay(e), wave.JoinIndex);
    }

    /// <summary>
    /// A bound state of <paramref name="wave"/>'s stack on <paramref name="domain"/>: the same stack with one margin layer of each
    /// lead added outside (its tails written into the margins exactly), truncated at the domain's ends.
    /// </summary>
    internal static KernelState OnDomain(BoundWavefunction wave, CompiledCell domain)
    {
        var inner = Of(wave);
        var n = inner.Psi.Length - 1;
        var join = wave.JoinIndex + 1;
        var psi = new double[n + 3];
        var w = new double[n + 3];
        Array.Copy(inner.Psi, 0, psi, 1, n + 1);
        Array.Copy(inner.DerivativeOverMass, 0, w, 1, n + 1);
        var stack = wave.Profile;
        var leftMargin = domain.Boundaries[1];
        var rightMargin = domain.Boundaries[n + 2] - domain.Boundaries[n + 1];
        psi[0] = psi[1] * Math.Exp(-inner.LeftDecayPerNanometre * leftMargin);
        w[0] = inner.LeftDecayPerNanometre / stack.Stack.LeftLead.MassElectronMasses * psi[0];
        psi[n + 2] = psi[n + 1] * Math.Exp(-inner.RightDecayPerNanometre * rightMargin);
        w[n + 2] = -inner.RightDecayPerNanometre / stack.RightLead.MassElectronMasses * psi[n + 2];
        return new KernelState(domain, inner.EnergyElectronVolts, psi, w, 0, 0, join);
    }

    /// <summary>A state on a finite domain (no tails), from its boundary values.</summary>
    internal static KernelState OnDomain(CompiledCell domain, double energy, double[] psi, double[] w) => new(domain, energy, psi, w, 0, 0);

    /// <summary>
    /// ∫ψ_aψ_b, ∫(x − origin)ψ_aψ_b and ∫ψ_aψ_b′ over the whole line (tails included) for two states on sequences with the same
    /// element boundaries; x from the start of the sequence. <paramref name="normScale"/>: the size of the two states' norms
    /// (1: normalised or of order one), against which the kernel judges its closed form's rounding.
    /// </summary>
    internal static (double Overlap, double Moment, double Momentum) Pair(KernelState a, KernelState b, double originNanometres, double normScale = 1)
    {
        var kernel = a.Kernel;
        var n = kernel.Count;
        double overlap = 0, moment = 0, momentum = 0;
        // Elements where the closed form is ill conditioned and both states share node samples: consecutive ones are summed as
        // one run of Gauss–Legendre nodes (three dot products).
        var shared = a.Nodes is { } layout && ReferenceEquals(layout, b.Nodes) && ReferenceEquals(a.Kernel, b.Kernel) ? a.Nodes : null;
        var run = -1;
        void Flush(int end)
        {
            if (run < 0)
            {
                return;
            }
            var span = new Range(shared!.Offsets[run], shared.Offsets[end]);
            var weighted = a._nodeWeighted.AsSpan(span);
            var psiB = b._nodePsi.AsSpan(span);
            var runOverlap = TensorPrimitives.Dot<double>(weighted, psiB);
            overlap += runOverlap;
            moment += TensorPrimitives.Dot<double>(a._nodeMoment.AsSpan(span), psiB) + (shared.MiddleNanometres - originNanometres) * runOverlap;
            momentum += TensorPrimitives.Dot<double>(weighted, b._nodeMassW.AsSpan(span));
            run = -1;
        }
        for (var i = 0; i < n; i++)
        {
            PairMoments pair;
            if (!ReferenceEquals(a.Kernel, b.Kernel))
            {
                pair = CompiledCell.PairQuadrature(a.Kernel, i, a.EnergyElectronVolts, a.Ends(i), b.Kernel, b.EnergyElectronVolts, b.Ends(i));
            }
            else if (!kernel.TryPairClosedForm(i, a.EnergyElectronVolts, a.Ends(i), b.EnergyElectronVolts, b.Ends(i), normScale,
                a.EnergyElectronVolts <= b.EnergyElectronVolts ? a._growth[i] : b._growth[i], out pair))
            {
                if (!kernel.IsSegment(i) && shared is not null)
                {
                    a.EnsureSampled(i);
                    b.EnsureSampled(i);
                    if (run < 0)
                    {
                        run = i;
                    }
                    continue;
                }
                pair = CompiledCell.PairQuadrature(kernel, i, a.EnergyElectronVolts, a.Ends(i), kernel, b.EnergyElectronVolts, b.Ends(i));
            }
            Flush(i);
            overlap += pair.Overlap;
            moment += pair.LocalMoment + (kernel.Start(i) - originNanometres) * pair.Overlap;
            momentum += pair.Momentum;
        }
        Flush(n);
        if (a.LeftDecayPerNanometre > 0 && b.LeftDecayPerNanometre > 0)
        {
            var product = a.Psi[0] * b.Psi[0];
            var k = a.LeftDecayPerNanometre + b.LeftDecayPerNanometre;
            overlap += product / k;
            moment += -product / (k * k) - originNanometres * product / k;
            momentum += b.LeftDecayPerNanometre * product / k;
        }
        if (a.RightDecayPerNanometre > 0 && b.RightDecayPerNanometre > 0)
        {
            var product = a.Psi[n] * b.Psi[n];
            var k = a.RightDecayPerNanometre + b.RightDecayPerNanometre;
            overlap += product / k;
            moment += product / (k * k) + (kernel.Start(n) - originNanometres) * product / k;
            momentum -= b.RightDecayPerNanometre * product / k;
        }
        return (overlap, moment, momentum);
    }

    /// <summary>∫ψ² over each element (<paramref name="destination"/>, Count entries) and over the two tails.</summary>
    internal void ElementNorms(Span<double> destination, out double leftTail, out double rightTail)
    {
        for (var i = 0; i < Kernel.Count; i++)
        {
            destination[i] = Kernel.SquareIntegral(i, EnergyElectronVolts, Ends(i), fromLeft: i < _join);
        }
        leftTail = LeftDecayPerNanometre > 0 ? Psi[0] * Psi[0] / (2 * LeftDecayPerNanometre) : 0;
        rightTail = RightDecayPerNanometre > 0 ? Psi[^1] * Psi[^1] / (2 * RightDecayPerNanometre) : 0;
    }
}

/// <summary>
/// Per element of one sequence: the quadrature panels for an energy window, where each element's nodes start, and every node's
/// Gauss–Legendre weight and position (from the middle of the sequence).
/// </summary>
internal sealed class NodeLayout
{
    internal NodeLayout(CompiledCell kernel, double lowerElectronVolts, double upperElectronVolts)
    {
        var rule = Numerics.GaussLegendre.Twenty;
        Panels = new int[kernel.Count];
        Offsets = new int[kernel.Count + 1];
        for (var i = 0; i < kernel.Count; i++)
        {
            Panels[i] = kernel.Panels(i, lowerElectronVolts, upperElectronVolts);
            Offsets[i + 1] = Offsets[i] + Panels[i] * rule.Order;
        }
        MiddleNanometres = 0.5 * kernel.Boundaries[kernel.Count];
        Weights = new double[Count];
        Positions = new double[Count];
        for (var i = 0; i < kernel.Count; i++)
        {
            if (Panels[i] == 0)
            {
                continue;
            }
            var h = kernel.LayerData(i).Width / Panels[i];
            var q = Offsets[i];
            for (var p = 0; p < Panels[i]; p++)
            {
                for (var g = 0; g < rule.Order; g++, q++)
                {
                    Weights[q] = 0.5 * h * rule.Weights[g];
                    Positions[q] = kernel.Start(i) - MiddleNanometres + (p + 0.5 + 0.5 * rule.Nodes[g]) * h;
                }
            }
        }
    }

    internal int[] Panels { get; }

    internal int[] Offsets { get; }

    internal int Count => Offsets[^1];

    /// <summary>Half the sequence's length, nm: the origin of <see cref="Positions"/>.</summary>
    internal double MiddleNanometres { get; }

    /// <summary>The quadrature weight of each node, nm.</summary>
    internal double[] Weights { get; }

    /// <summary>Each node's position from the middle of the sequence, nm.</summary>
    internal double[] Positions { get; }
}
