// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Optics;

/// <summary>
/// Intersubband optics of a stack for light polarised along the growth axis: its levels (bound states, and on request
/// quasi-bound ones from its transmission resonances), the transitions between them with energies, dipoles
/// ⟨i|z|f⟩ and oscillator strengths, and the f-sum rule as a check. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Model: single-band envelope functions with BenDaniel–Duke matching; only the field component along z couples
/// states of one band (common practice, e.g. M. Helm, in Semiconductors and Semimetals vol. 62, 2000). The stack is
/// flat-band, or under a uniform field (<see cref="ComputeUnderBias(LayerStack, Energy, IntersubbandOptions?)"/>: no space charge). Excitonic and many-body effects are not
/// modelled here (see <see cref="AbsorptionSpectrum"/> for the depolarisation shift).</para>
/// <para>Method: the bound states and their wavefunctions come from <see cref="BoundStateSpectrum"/>; the integrals
/// ∫ψ_iψ_f, ∫ψ_i z ψ_f and ∫ψ_iψ_f′ are the propagation kernel's element integrals of pairs of states: closed forms in the
/// states' values at the element ends from the Wronskian identities of the BenDaniel–Duke equation (exact for uniform layers
/// and for layers under a field), with 20-point Gauss–Legendre quadrature of the closed-form states, exact to rounding, only
/// where two energies nearly coincide or a layer is non-parabolic; plus the exponential tails in the leads in closed form.
/// No wavefunction is sampled on a grid. A smooth segment (e.g. a self-consistent potential) has no closed form: its pairs
/// are integrated over each Magnus step's cubic Hermite interpolant by the 8-point Gauss–Legendre rule (the scheme's own
/// O(h⁴) model of the state); quasi-bound levels are not computed for such a stack. Reference mass: f = 2m*ω|z|²/ħ with m* = <see cref="ReferenceMassElectronMasses"/>.</para>
/// </remarks>
public sealed class IntersubbandSpectrum
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly OpticalLevel[] _levels;
    private readonly IntersubbandTransition[] _transitions;
    private readonly double[,] _boundDipoles;
    private readonly double[] _quasiBoundSums;

    private IntersubbandSpectrum(LayerStack stack, double bias, BoundStateSpectrum bound, OpticalLevel[] levels, IntersubbandTransition[] transitions,
        double[,] boundDipoles, double[] quasiBoundSums, double referenceMass, double normError, IntersubbandOptions options,
        BoundWavefunction[] waves, KernelState[] states)
    {
        Waves = waves;
        States = states;
        Stack = stack;
        Bias = Energy.FromElectronVolts(bias);
        BoundStates = bound;
        _levels = levels;
        _transitions = transitions;
        _boundDipoles = boundDipoles;
        _quasiBoundSums = quasiBoundSums;
        Levels = new ReadOnlyCollection<OpticalLevel>(levels);
        Transitions = new ReadOnlyCollection<IntersubbandTransition>(transitions);
        ReferenceMassElectronMasses = referenceMass;
        NormalisationError = normError;
        Options = options;
    }

    /// <summary>The stack.</summary>
    public LayerStack Stack { get; }

    /// <summary>The potential drop eU across the stack (a uniform field; zero for a flat stack).</summary>
    public Energy Bias { get; }

    /// <summary>The bound states the levels come from.</summary>
    public BoundStateSpectrum BoundStates { get; }

    /// <summary>The levels, counted from 1: bound states from the lowest up, then quasi-bound states by energy.</summary>
    public IReadOnlyList<OpticalLevel> Levels { get; }

    /// <summary>Number of bound levels (the first ones of <see cref="Levels"/>).</summary>
    public int BoundCount => _boundDipoles.GetLength(0);

    /// <summary>
    /// Every upward transition from a bound level to any higher level, then (with quasi-bound levels) every upward transition
    /// between two quasi-bound levels; ordered by From, then To.
    /// </summary>
    public IReadOnlyList<IntersubbandTransition> Transitions { get; }

    /// <summary>The mass m* of the oscillator strengths, m0.</summary>
    public double ReferenceMassElectronMasses { get; }

    /// <summary>
    /// Largest |∫ψ² − 1| of the bound states, the element integrals summed independently of the normalisation that made them 1:
    /// the accuracy the integrals reached.
    /// </summary>
    public double NormalisationError { get; }

    /// <summary>The options used.</summary>
    public IntersubbandOptions Options { get; }

    internal BoundWavefunction[] Waves { get; }

    /// <summary>The bound states as the kernel's integrals take them.</summary>
    internal KernelState[] States { get; }

    /// <summary>Computes the levels and every transition of <paramref name="stack"/> (flat, no bias).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentException">The stack has no bound state to start from, or holds smooth segments while
    /// <see cref="IntersubbandOptions.IncludeQuasiBound"/> is set.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static IntersubbandSpectrum Compute(LayerStack stack, IntersubbandOptions? options = null) => ComputeUnderBias(stack, default, options);

    /// <summary>
    /// Computes the levels and every transition of <paramref name="stack"/> under an applied bias <paramref name="bias"/> = eU: a
    /// uniform field across the layers, the right lead's band edge lowered by eU (as
    /// <see cref="StackTransmission.Create(LayerStack, Energy)"/>). States below both lead edges stay bound (the leads are flat);
    /// states above the higher edge are the biased stack's transmission resonances, quasi-bound, each normalised on the stated
    /// finite domain (<see cref="IntersubbandOptions.DomainMarginNanometres"/>) whose convergence is reported per transition.
    /// </summary>
    /// <remarks>
    /// Between the two lead edges a state leaks into the lower lead only; with <see cref="IntersubbandOptions.IncludeQuasiBound"/>
    /// such states are quasi-bound levels too: energy and width Γ from the reflection phase of the open lead (the peak of the
    /// Wigner delay dΦ/dE = 2/Γ), normalised on the same finite domain. The field is that of an ideal capacitor: no space
    /// charge, no self-consistent potential.
    /// </remarks>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentException">As <see cref="Compute(LayerStack, IntersubbandOptions?)"/>, and what
    /// <see cref="StackTransmission.Create(LayerStack, Energy)"/> refuses under a non-zero bias (non-parabolic layers, too many elements).</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option or the bias is out of range.</exception>
    public static IntersubbandSpectrum ComputeUnderBias(LayerStack stack, Energy bias, IntersubbandOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(stack);
        options ??= IntersubbandOptions.Default;
        var drop = bias.ElectronVolts;
        var bound = drop == 0 ? BoundStateSpectrum.Find(stack, options.BoundStates) : BoundStateSpectrum.FindUnderBias(stack, bias, options.BoundStates);
        if (bound.Levels.Count == 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"stack has no bound state below its lead band edge ({bound.ContinuumEdgeElectronVolts:G6} eV{(drop == 0 ? "" : string.Create(CultureInfo.InvariantCulture, $", the lower of the two leads under the bias {drop:G6} eV"))}): intersubband transitions need at least one level to start from."),
                nameof(stack));
        }
        var profile = bound.Profile;
        if (options.IncludeQuasiBound && profile.Kernel.HasSegments)
        {
            throw new ArgumentException("stack holds smooth segments (e.g. a self-consistent potential); quasi-bound levels are computed for uniform layers and delta barriers only: leave IncludeQuasiBound off.", nameof(options));
        }
        var referenceMass = options.ReferenceMassElectronMasses ?? WellMass(profile, stack);
        var nb = bound.Levels.Count;

        // Quasi-bound levels: between the two lead edges (open into the lower lead only; their width from the reflection phase),
        // then the transmission resonances above both edges (their width the peak's FWHM).
        var resonances = new List<(double Energy, double Error, double Width, bool OneLead)>();
        if (options.IncludeQuasiBound)
        {
            var edge = Math.Max(stack.LeftLead.PotentialElectronVolts, profile.RightLead.PotentialElectronVolts);
            var top = Math.Max(edge, profile.Count == 0 ? edge : MaxPotential(profile));
            var upper = options.QuasiBoundUpperElectronVolts ?? top + 0.5 * (top - profile.MinimumPotentialElectronVolts);
            foreach (var r in OneLeadResonances.Find(stack, drop, options.BoundStates.MaxElements, upper, options.Resonances))
            {
                resonances.Add((r.EnergyElectronVolts, r.ErrorElectronVolts, r.WidthElectronVolts, true));
            }
            if (upper > edge)
            {
                var transmission = StackTransmission.Create(stack, bias);
                foreach (var r in transmission.FindResonances(edge, upper, options.Resonances).Resonances)
                {
                    resonances.Add((r.EnergyElectronVolts, r.EnergyErrorElectronVolts, r.WidthElectronVolts, false));
                }
            }
        }

        var waves = new BoundWavefunction[nb];
        var states = new KernelState[nb];
        var levels = new List<OpticalLevel>();
        var normError = 0.0;
        var n = profile.Count;
        var norms = new double[n];
        var layout = new NodeLayout(profile.Kernel, bound.Levels[0].EnergyElectronVolts, bound.Levels[nb - 1].EnergyElectronVolts);
        for (var i = 0; i < nb; i++)
        {
            waves[i] = bound.GetWavefunction(i);
            states[i] = KernelState.Of(waves[i]).WithNodes(layout);
            var e = bound.Levels[i].EnergyElectronVolts;
            states[i].ElementNorms(norms, out var pLeft, out var pRight);
            double norm = pLeft + pRight, mass = pLeft * stack.LeftLead.MassElectronMasses + pRight * profile.RightLead.MassElectronMasses;
            double inverse = pLeft / stack.LeftLead.MassElectronMasses + pRight / profile.RightLead.MassElectronMasses;
            for (var j = 0; j < n; j++)
            {
                if (profile.IsDelta(j))
                {
                    continue;
                }
                var mj = MassAt(profile, j, e);
                norm += norms[j];
                mass += norms[j] * mj;
                inverse += norms[j] / mj;
            }
            normError = Math.Max(normError, Math.Abs(norm - 1));
            levels.Add(new OpticalLevel(i + 1, e, bound.Levels[i].ErrorElectronVolts, false, 0, bound.Levels[i].IsResolved, mass / norm, inverse / norm,
                double.NegativeInfinity, double.PositiveInfinity, waves[i].ValueAt));
        }

        // Bound-to-bound dipoles and momentum forms: Gauss–Legendre over the exact states at the shared nodes, plus the lead tails.
        var parabolic = IsParabolic(profile);
        var dipoles = new double[nb, nb];
        var momentum = new double[nb, nb];
        KernelState.AllPairs(states, dipoles, momentum); // ∫xψ_iψ_f (nm) and ∫ψ_i ψ_f′ (1/nm), i < f
        for (var i = 0; i < nb; i++)
        {
            for (var f = i + 1; f < nb; f++)
            {
                dipoles[f, i] = dipoles[i, f];
            }
        }

        // Quasi-bound levels, each on the domain and on the domain with twice the margin.
        var margin = options.DomainMarginNanometres;
        var domain = resonances.Count > 0 ? QuasiBoundState.DomainOf(stack, drop, margin, options.BoundStates.MaxElements) : null;
        var wide = resonances.Count > 0 ? QuasiBoundState.DomainOf(stack, drop, 2 * margin, options.BoundStates.MaxElements) : null;
        var quasi = new List<(QuasiBoundState State, QuasiBoundState Check, double Energy)>();
        foreach (var resonance in resonances)
        {
            var state = resonance.OneLead
                ? QuasiBoundState.CreateOpenToOneLead(domain!, resonance.Energy, margin)
                : QuasiBoundState.Create(domain!, resonance.Energy, margin);
            var check = resonance.OneLead
                ? QuasiBoundState.CreateOpenToOneLead(wide!, resonance.Energy, 2 * margin)
                : QuasiBoundState.Create(wide!, resonance.Energy, 2 * margin);
            quasi.Add((state, check, resonance.Energy));
            var (mass, inverse) = MassMoments(state);
            levels.Add(new OpticalLevel(nb + quasi.Count, resonance.Energy, resonance.Error, true, resonance.Width,
                true, mass, inverse, state.DomainStartNanometres, state.DomainEndNanometres, state.ValueAt));
        }
        var onDomain = new KernelState[quasi.Count > 0 ? nb : 0];
        var onWide = new KernelState[onDomain.Length];
        for (var i = 0; i < onDomain.Length; i++)
        {
            onDomain[i] = KernelState.OnDomain(waves[i], domain!.Kernel);
            onWide[i] = KernelState.OnDomain(waves[i], wide!.Kernel);
        }

        var transitions = new List<IntersubbandTransition>();
        var quasiSums = new double[nb];
        for (var i = 0; i < nb; i++)
        {
            var ei = bound.Levels[i].EnergyElectronVolts;
            for (var f = i + 1; f < nb; f++)
            {
                var de = bound.Levels[f].EnergyElectronVolts - ei;
                string? problem = null;
                if (!bound.Levels[i].IsResolved || !bound.Levels[f].IsResolved || !(de > 0))
                {
                    problem = "the two levels are closer than double precision separates (e.g. wells behind very thick barriers)";
                }
                var z = dipoles[i, f];
                var strength = referenceMass * de * z * z / C;
                var d = momentum[i, f];
                var strengthP = de > 0 ? 4 * C * d * d / (referenceMass * de) : 0;
                transitions.Add(new IntersubbandTransition(i + 1, f + 1, de, z, strength, strengthP, parabolic, 0, problem));
            }
            for (var r = 0; r < quasi.Count; r++)
            {
                var (state, check, resonance) = quasi[r];
                var de = resonance - ei;
                var z = DomainDipole(onDomain[i], state.State, margin, stack);
                var z2 = DomainDipole(onWide[i], check.State, 2 * margin, stack);
                var change = Math.Abs(Math.Abs(z2) - Math.Abs(z)) / Math.Max(Math.Abs(z), double.Epsilon);
                var problem = !bound.Levels[i].IsResolved ? "the lower level is not separable from its neighbour" : DomainProblem(change, options);
                var strength = referenceMass * de * z * z / C;
                if (problem is null)
                {
                    quasiSums[i] += strength;
                }
                transitions.Add(new IntersubbandTransition(i + 1, nb + r + 1, de, z, strength, 0, false, change, problem));
            }
        }
        // Between two quasi-bound levels (both in the continuum): both on the same domain, checked on twice the margin.
        for (var a = 0; a < quasi.Count; a++)
        {
            for (var b = a + 1; b < quasi.Count; b++)
            {
                var de = quasi[b].Energy - quasi[a].Energy;
                var z = DomainDipole(quasi[a].State.State, quasi[b].State.State, margin, stack);
                var z2 = DomainDipole(quasi[a].Check.State, quasi[b].Check.State, 2 * margin, stack);
                var change = Math.Abs(Math.Abs(z2) - Math.Abs(z)) / Math.Max(Math.Abs(z), double.Epsilon);
                var problem = !(de > 0) ? "the two resonances are not separated" : DomainProblem(change, options);
                transitions.Add(new IntersubbandTransition(nb + a + 1, nb + b + 1, de, z, referenceMass * de * z * z / C, 0, false, change, problem));
            }
        }
        return new IntersubbandSpectrum(stack, drop, bound, [.. levels], [.. transitions], dipoles, quasiSums, referenceMass, normError, options,
            waves, states);
    }

    private static string? DomainProblem(double change, IntersubbandOptions options) => change <= options.DomainTolerance
        ? null
        : string.Create(CultureInfo.InvariantCulture,
            $"the quasi-bound state is not localised: |z| changed by {change:P2} when the normalisation domain's margin was doubled ({options.DomainMarginNanometres:G6} → {2 * options.DomainMarginNanometres:G6} nm); tolerance {options.DomainTolerance:P2}");

    /// <summary>m(E) of layer <paramref name="j"/> (a layer under bias: its constant mass), m₀.</summary>
    private static double MassAt(StackProfile profile, int j, double e) => profile.Kernel.MassAt(j, e);

    private static double WellMass(StackProfile profile, LayerStack stack)
    {
        var best = -1;
        for (var j = 0; j < profile.Count; j++)
        {
            if (!profile.IsDelta(j) && (best < 0 || profile.MinimumPotential(j) < profile.MinimumPotential(best)))
            {
                best = j;
            }
        }
        return best >= 0 ? profile.Mass(best) : stack.LeftLead.MassElectronMasses;
    }

    private static double MaxPotential(StackProfile profile)
    {
        var max = double.NegativeInfinity;
        for (var j = 0; j < profile.Count; j++)
        {
            if (!profile.IsDelta(j))
            {
                max = Math.Max(max, profile.MaximumPotential(j));
            }
        }
        return double.IsFinite(max) ? max : profile.MinimumPotentialElectronVolts;
    }

    private static bool IsParabolic(StackProfile profile)
    {
        for (var j = 0; j < profile.Count; j++)
        {
            if (profile.MassSlope(j) != 0)
            {
                return false;
            }
        }
        return true;
    }

    private static (double Mass, double Inverse) MassMoments(QuasiBoundState state)
    {
        var profile = state.Domain;
        var norms = new double[profile.Count];
        state.State.ElementNorms(norms, out _, out _);
        double mass = 0, inverse = 0;
        for (var j = 0; j < profile.Count; j++)
        {
            if (!profile.IsDelta(j))
            {
                var mj = MassAt(profile, j, state.EnergyElectronVolts);
                mass += norms[j] * mj;
                inverse += norms[j] / mj;
            }
        }
        return (mass, inverse);
    }

    /// <summary>⟨a|z|b⟩ on a quasi-bound state's domain, z from the middle of the stack.</summary>
    private static double DomainDipole(KernelState a, KernelState b, double margin, LayerStack stack) =>
        KernelState.Pair(a, b, margin + 0.5 * stack.Thickness.Nanometres).Moment;

    /// <summary>The transition from level <paramref name="from"/> to level <paramref name="to"/> (both counted from 1, from below to).</summary>
    /// <exception cref="ArgumentOutOfRangeException">A number is out of range, or <paramref name="to"/> is not above <paramref name="from"/>.</exception>
    public IntersubbandTransition Transition(int from, int to)
    {
        Preconditions.CheckRange(from, 1, _levels.Length - 1);
        Preconditions.CheckRange(to, from + 1, _levels.Length);
        foreach (var transition in _transitions)
        {
            if (transition.From == from && transition.To == to)
            {
                return transition;
            }
        }
        throw new InvalidOperationException("transition list is incomplete (internal error).");
    }

    /// <summary>The f-sum rule from bound level <paramref name="from"/> (counted from 1): the sums over the levels found and the exact total.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="from"/> is not a bound level.</exception>
    public SumRuleCheck SumRule(int from)
    {
        Preconditions.CheckRange(from, 1, BoundCount);
        var i = from - 1;
        var ei = _levels[i].EnergyElectronVolts;
        double sum = 0;
        for (var f = 0; f < BoundCount; f++)
        {
            if (f != i)
            {
                var z = _boundDipoles[i, f];
                sum += ReferenceMassElectronMasses * (_levels[f].EnergyElectronVolts - ei) * z * z / C;
            }
        }
        return new SumRuleCheck(from, sum, _quasiBoundSums[i], ReferenceMassElectronMasses * _levels[i].MeanInverseMassPerElectronMass);
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"Intersubband spectrum: {BoundCount} bound and {_levels.Length - BoundCount} quasi-bound level(s), m* = {ReferenceMassElectronMasses:G6} m0, normalisation error {NormalisationError:G2}");
        foreach (var transition in _transitions)
        {
            text.AppendLine().Append("  ").Append(transition);
        }
        return text.ToString();
    }
}
