// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.Intrinsics;
using Periodic.Numerics;
using Periodic.Stacks;
using Periodic.Transfer;

namespace Periodic.Optics;

/// <summary>
/// A real state on a compiled stack as the kernel's integrals of pairs of states take it: its energy, (ψ, ψ′/m) at every element
/// boundary (unscaled), and how it continues beyond the two ends: a decaying exponential into each lead (a bound state), or
/// nothing (a state normalised on a finite domain, whose domain ends are the sequence's ends).
/// </summary>
/// <remarks>
/// Two ways to integrate over the elements, both exact to rounding: for a single pair, <see cref="CompiledCell.PairIntegrals"/>
/// (closed forms in the end values, or quadrature of the closed-form states where two energies nearly coincide); for a set of
/// states sharing one <see cref="NodeLayout"/> (every pair of a spectrum), each state sampled once at the Gauss–Legendre nodes of
/// every element and each pair three fused dot products over all nodes, which costs a fraction of the per-element closed forms
/// once there are more than a few states. The lead tails are closed forms here:
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

    /// <summary>The kernel's <see cref="CompiledCell.PairGrowth"/> of each element at this state's energy, made on first use.</summary>
    private double[]? _growth;

    private double[] Growth()
    {
        if (_growth is null)
        {
            var growth = new double[Kernel.Count];
            for (var i = 0; i < growth.Length; i++)
            {
                growth[i] = Kernel.PairGrowth(i, EnergyElectronVolts);
            }
            _growth = growth;
        }
        return _growth;
    }
    private readonly int _join;

    /// <summary>The state at both ends of element <paramref name="i"/>, the two ends joined by one exact propagation.</summary>
    internal ElementEnds Ends(int i) => _ends[i];

    /// <summary>
    /// Quadrature nodes shared by a set of states of one sequence (null: none), for <see cref="AllPairs"/>.
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
        double overlap = 0, moment = 0, momentum = 0;
        for (var i = 0; i < kernel.Count; i++)
        {
            if (!ReferenceEquals(a.Kernel, b.Kernel)
                || !kernel.TryPairClosedForm(i, a.EnergyElectronVolts, a.Ends(i), b.EnergyElectronVolts, b.Ends(i), normScale,
                    a.EnergyElectronVolts <= b.EnergyElectronVolts ? a.Growth()[i] : b.Growth()[i], out var pair))
            {
                pair = CompiledCell.PairQuadrature(a.Kernel, i, a.EnergyElectronVolts, a.Ends(i), b.Kernel, b.EnergyElectronVolts, b.Ends(i));
            }
            overlap += pair.Overlap;
            moment += pair.LocalMoment + (kernel.Start(i) - originNanometres) * pair.Overlap;
            momentum += pair.Momentum;
        }
        AddTails(a, b, originNanometres, ref overlap, ref moment, ref momentum);
        return (overlap, moment, momentum);
    }

    /// <summary>The lead tails' closed forms (see the class remarks) added to a pair's three integrals.</summary>
    private static void AddTails(KernelState a, KernelState b, double originNanometres, ref double overlap, ref double moment, ref double momentum)
    {
        var n = a.Kernel.Count;
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
            moment += product / (k * k) + (a.Kernel.Start(n) - originNanometres) * product / k;
            momentum -= b.RightDecayPerNanometre * product / k;
        }
    }

    /// <summary>
    /// ∫xψ_aψ_b (x from the middle of the sequence, nm) and ∫ψ_aψ_b′ (1/nm) of every pair a &lt; b of <paramref name="states"/>,
    /// eigenstates of one sequence sharing one <see cref="NodeLayout"/>, into the upper triangles of <paramref name="moments"/>
    /// and <paramref name="momenta"/>. Each state is sampled once at the nodes of every element but smooth segments, and each
    /// pair is two dot products over all nodes (taken in chunks that stay in cache for all states, so that each node of the
    /// right factor is read once per chunk and left factor), plus its smooth segments by quadrature and its lead tails in closed
    /// form. Distinct eigenstates are orthogonal, so the moment is the dipole whatever the origin.
    /// </summary>
    /// <remarks>
    /// Against the closed forms of <see cref="Pair"/> for every element: the same integrals of the same represented states, exact
    /// to rounding both (the 20-point rule's remainder is below 1e-20 relative on the layout's panels); the closed forms' larger
    /// rounding (they divide by ΔE twice) is the difference, at most 3.4e-10 nm on the dipoles of 50 coupled wells, where
    /// doubling every panel moves the nodes' dipoles by 2.3e-13 nm.
    /// </remarks>
    internal static void AllPairs(KernelState[] states, double[,] moments, double[,] momenta)
    {
        var count = states.Length;
        if (count == 0)
        {
            return;
        }
        var layout = states[0].Nodes ?? throw new ArgumentException("the states share no node layout.", nameof(states));
        var kernel = states[0].Kernel;
        foreach (var state in states)
        {
            if (!ReferenceEquals(state.Nodes, layout) || !ReferenceEquals(state.Kernel, kernel))
            {
                throw new ArgumentException("the states do not share one node layout of one sequence.", nameof(states));
            }
            state.EnsureAllSampled();
        }
        // Chunks of nodes small enough that the right factors (ψ_b and m·ψ_b′/m) of every state stay in half of a 512 KiB cache.
        var chunk = Math.Max(64, Math.Min(layout.Count, 16_384 / Math.Max(1, count)));
        for (var start = 0; start < layout.Count; start += chunk)
        {
            var length = Math.Min(chunk, layout.Count - start);
            for (var a = 0; a < count; a++)
            {
                var momentA = states[a]._nodeMoment.AsSpan(start, length);
                var weightedA = states[a]._nodeWeighted.AsSpan(start, length);
                var b = a + 1;
                for (; b + 3 < count; b += 4)
                {
                    NodeSums4(weightedA, momentA, states, b, start, length, moments, momenta, a);
                }
                for (; b < count; b++)
                {
                    NodeSums(weightedA, momentA, states[b]._nodePsi.AsSpan(start, length), states[b]._nodeMassW.AsSpan(start, length),
                        out var moment, out var momentum);
                    moments[a, b] += moment;
                    momenta[a, b] += momentum;
                }
            }
        }
        var middle = layout.MiddleNanometres;
        for (var a = 0; a < count; a++)
        {
            for (var b = a + 1; b < count; b++)
            {
                double overlap = 0, moment = 0, momentum = 0;
                for (var i = 0; i < kernel.Count; i++)
                {
                    if (kernel.IsSegment(i))
                    {
                        var pair = CompiledCell.PairQuadrature(kernel, i, states[a].EnergyElectronVolts, states[a].Ends(i), kernel,
                            states[b].EnergyElectronVolts, states[b].Ends(i));
                        overlap += pair.Overlap;
                        moment += pair.LocalMoment + (kernel.Start(i) - middle) * pair.Overlap;
                        momentum += pair.Momentum;
                    }
                }
                AddTails(states[a], states[b], middle, ref overlap, ref moment, ref momentum);
                moments[a, b] += moment;
                momenta[a, b] += momentum;
            }
        }
    }

    /// <summary>
    /// <see cref="NodeSums"/> of one left factor a with the four right factors b … b + 3 at once (each node of a loaded once for
    /// four pairs), added to row <paramref name="row"/> of <paramref name="moments"/> and <paramref name="momenta"/>.
    /// </summary>
    private static void NodeSums4(ReadOnlySpan<double> weightedA, ReadOnlySpan<double> momentA, KernelState[] states, int b, int start, int length,
        double[,] moments, double[,] momenta, int row)
    {
        if (Vector256.IsHardwareAccelerated)
        {
            NodeSums4<Lanes256>(weightedA, momentA, states, b, start, length, moments, momenta, row);
        }
        else
        {
            NodeSums4<Lanes128Pair>(weightedA, momentA, states, b, start, length, moments, momenta, row);
        }
    }

    private static void NodeSums4<TLanes>(ReadOnlySpan<double> weightedA, ReadOnlySpan<double> momentA, KernelState[] states, int b, int start,
        int length, double[,] moments, double[,] momenta, int row)
        where TLanes : struct, IFourLanes<TLanes>
    {
        var p0 = states[b]._nodePsi.AsSpan(start, length);
        var p1 = states[b + 1]._nodePsi.AsSpan(start, length);
        var p2 = states[b + 2]._nodePsi.AsSpan(start, length);
        var p3 = states[b + 3]._nodePsi.AsSpan(start, length);
        var d0 = states[b]._nodeMassW.AsSpan(start, length);
        var d1 = states[b + 1]._nodeMassW.AsSpan(start, length);
        var d2 = states[b + 2]._nodeMassW.AsSpan(start, length);
        var d3 = states[b + 3]._nodeMassW.AsSpan(start, length);
        TLanes m0 = default, m1 = default, m2 = default, m3 = default, q0 = default, q1 = default, q2 = default, q3 = default;
        var q = 0;
        for (; q <= length - 4; q += 4)
        {
            var ma = TLanes.Load(momentA, q);
            var wa = TLanes.Load(weightedA, q);
            m0 = TLanes.AddProduct(m0, ma, TLanes.Load(p0, q));
            m1 = TLanes.AddProduct(m1, ma, TLanes.Load(p1, q));
            m2 = TLanes.AddProduct(m2, ma, TLanes.Load(p2, q));
            m3 = TLanes.AddProduct(m3, ma, TLanes.Load(p3, q));
            q0 = TLanes.AddProduct(q0, wa, TLanes.Load(d0, q));
            q1 = TLanes.AddProduct(q1, wa, TLanes.Load(d1, q));
            q2 = TLanes.AddProduct(q2, wa, TLanes.Load(d2, q));
            q3 = TLanes.AddProduct(q3, wa, TLanes.Load(d3, q));
        }
        double s0 = m0.Sum(), s1 = m1.Sum(), s2 = m2.Sum(), s3 = m3.Sum();
        double r0 = q0.Sum(), r1 = q1.Sum(), r2 = q2.Sum(), r3 = q3.Sum();
        for (; q < length; q++)
        {
            s0 += momentA[q] * p0[q];
            s1 += momentA[q] * p1[q];
            s2 += momentA[q] * p2[q];
            s3 += momentA[q] * p3[q];
            r0 += weightedA[q] * d0[q];
            r1 += weightedA[q] * d1[q];
            r2 += weightedA[q] * d2[q];
            r3 += weightedA[q] * d3[q];
        }
        moments[row, b] += s0;
        moments[row, b + 1] += s1;
        moments[row, b + 2] += s2;
        moments[row, b + 3] += s3;
        momenta[row, b] += r0;
        momenta[row, b + 1] += r1;
        momenta[row, b + 2] += r2;
        momenta[row, b + 3] += r3;
    }

    /// <summary>
    /// Σ w·x·ψ_a·ψ_b and Σ w·ψ_a·m·ψ_b′/m over a run of nodes in one pass (two dot products fused, so that each of the four
    /// node arrays is read once).
    /// </summary>
    private static void NodeSums(ReadOnlySpan<double> weightedA, ReadOnlySpan<double> momentA, ReadOnlySpan<double> psiB, ReadOnlySpan<double> massWB,
        out double moment, out double momentum)
    {
        if (Vector256.IsHardwareAccelerated)
        {
            NodeSums<Lanes256>(weightedA, momentA, psiB, massWB, out moment, out momentum);
        }
        else
        {
            NodeSums<Lanes128Pair>(weightedA, momentA, psiB, massWB, out moment, out momentum);
        }
    }

    private static void NodeSums<TLanes>(ReadOnlySpan<double> weightedA, ReadOnlySpan<double> momentA, ReadOnlySpan<double> psiB,
        ReadOnlySpan<double> massWB, out double moment, out double momentum)
        where TLanes : struct, IFourLanes<TLanes>
    {
        var length = weightedA.Length;
        var q = 0;
        TLanes vm = default, vp = default;
        for (; q <= length - 4; q += 4)
        {
            vm = TLanes.AddProduct(vm, TLanes.Load(momentA, q), TLanes.Load(psiB, q));
            vp = TLanes.AddProduct(vp, TLanes.Load(weightedA, q), TLanes.Load(massWB, q));
        }
        moment = vm.Sum();
        momentum = vp.Sum();
        for (; q < length; q++)
        {
            moment += momentA[q] * psiB[q];
            momentum += weightedA[q] * massWB[q];
        }
    }

    /// <summary>Samples every element of <see cref="Nodes"/> (<see cref="EnsureSampled"/>), once.</summary>
    private void EnsureAllSampled()
    {
        if (_allSampled)
        {
            return;
        }
        for (var i = 0; i < Kernel.Count; i++)
        {
            EnsureSampled(i);
        }
        _allSampled = true;
    }

    private bool _allSampled;

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
