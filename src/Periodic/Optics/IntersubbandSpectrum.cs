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
/// flat-band: a field is modelled by the caller as a staircase of thin layers. Excitonic and many-body effects are not
/// modelled here (see <see cref="AbsorptionSpectrum"/> for the depolarisation shift).</para>
/// <para>Method: the bound states and their wavefunctions come from <see cref="BoundStateSpectrum"/>; the integrals
/// ∫ψ_i z ψ_f are composite Gauss–Legendre sums per layer that are exact to rounding for these entire functions,
/// plus the exponential tails in the leads in closed form. The momentum form uses the exact identity
/// ∫ψ_iψ_f′ = ½Σ_j m_j ∫_j G, G(z) = (E_i − E_f)/(ħ²/2m₀)·∫_{−∞}^z ψ_iψ_f, so it needs only the same layer
/// integrals. Reference mass: f = 2m*ω|z|²/ħ with m* = <see cref="ReferenceMassElectronMasses"/>.</para>
/// </remarks>
public sealed class IntersubbandSpectrum
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly OpticalLevel[] _levels;
    private readonly IntersubbandTransition[] _transitions;
    private readonly double[,] _boundDipoles;
    private readonly double[] _quasiBoundSums;

    private IntersubbandSpectrum(LayerStack stack, BoundStateSpectrum bound, OpticalLevel[] levels, IntersubbandTransition[] transitions,
        double[,] boundDipoles, double[] quasiBoundSums, double referenceMass, double normError, IntersubbandOptions options,
        LayerIntegrals grid, BoundWavefunction[] waves, double[][] samples)
    {
        Grid = grid;
        Waves = waves;
        Samples = samples;
        Stack = stack;
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

    /// <summary>The bound states the levels come from.</summary>
    public BoundStateSpectrum BoundStates { get; }

    /// <summary>The levels, counted from 1: bound states from the lowest up, then quasi-bound states by energy.</summary>
    public IReadOnlyList<OpticalLevel> Levels { get; }

    /// <summary>Number of bound levels (the first ones of <see cref="Levels"/>).</summary>
    public int BoundCount => _boundDipoles.GetLength(0);

    /// <summary>Every upward transition from a bound level to any higher level, ordered by From, then To.</summary>
    public IReadOnlyList<IntersubbandTransition> Transitions { get; }

    /// <summary>The mass m* of the oscillator strengths, m0.</summary>
    public double ReferenceMassElectronMasses { get; }

    /// <summary>Largest |∫ψ² − 1| of the bound states on the quadrature grid: the accuracy the integrals reached.</summary>
    public double NormalisationError { get; }

    /// <summary>The options used.</summary>
    public IntersubbandOptions Options { get; }

    internal LayerIntegrals Grid { get; }

    internal BoundWavefunction[] Waves { get; }

    /// <summary>Bound-state wavefunctions on <see cref="Grid"/>.</summary>
    internal double[][] Samples { get; }

    /// <summary>Computes the levels and every transition of <paramref name="stack"/>.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentException">The stack has no bound state to start from, holds an element other than layers and delta
    /// barriers, or needs more than <see cref="IntersubbandOptions.MaxSamples"/> wavefunction samples.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static IntersubbandSpectrum Compute(LayerStack stack, IntersubbandOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(stack);
        options ??= IntersubbandOptions.Default;
        options.Validate(nameof(options));
        var bound = BoundStateSpectrum.Find(stack, options.BoundStates);
        if (bound.Levels.Count == 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"stack has no bound state below its lead band edge ({bound.ContinuumEdgeElectronVolts:G6} eV): intersubband transitions need at least one level to start from."),
                nameof(stack));
        }
        var profile = new StackProfile(stack, options.BoundStates.MaxElements, nameof(stack));
        var referenceMass = options.ReferenceMassElectronMasses ?? WellMass(profile, stack);
        var nb = bound.Levels.Count;

        // Quasi-bound energies first: the grid must resolve the highest state.
        var resonances = new List<Resonance>();
        if (options.IncludeQuasiBound)
        {
            var edge = Math.Max(stack.LeftLead.PotentialElectronVolts, stack.RightLead.PotentialElectronVolts);
            var top = Math.Max(edge, profile.Count == 0 ? edge : MaxPotential(profile));
            var upper = options.QuasiBoundUpperElectronVolts ?? top + 0.5 * (top - profile.MinimumPotentialElectronVolts);
            if (upper > edge)
            {
                var transmission = StackTransmission.Create(stack);
                resonances.AddRange(transmission.FindResonances(edge, upper, options.Resonances).Resonances);
            }
        }
        var lowest = bound.Levels[0].EnergyElectronVolts;
        var highest = bound.Levels[nb - 1].EnergyElectronVolts;
        var grid = LayerIntegrals.Create(profile, lowest, highest);
        if ((long)nb * grid.Count > IntersubbandOptions.MaxSamples)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"stack needs {nb} levels × {grid.Count} quadrature nodes = {(long)nb * grid.Count} wavefunction samples; at most {IntersubbandOptions.MaxSamples} are held at once (memory). Compute fewer levels (options.BoundStates.MaxLevels) or a thinner stack."),
                nameof(stack));
        }

        var waves = new BoundWavefunction[nb];
        var samples = new double[nb][];
        var left = new double[nb];
        var right = new double[nb];
        var kappaLeft = new double[nb];
        var kappaRight = new double[nb];
        var levels = new List<OpticalLevel>();
        var normError = 0.0;
        var n = profile.Count;
        for (var i = 0; i < nb; i++)
        {
            waves[i] = bound.GetWavefunction(i);
            samples[i] = new double[grid.Count];
            grid.Sample(waves[i], samples[i], out left[i], out right[i]);
            var e = bound.Levels[i].EnergyElectronVolts;
            kappaLeft[i] = stack.LeftLead.DecayConstantPerNanometre(e);
            kappaRight[i] = stack.RightLead.DecayConstantPerNanometre(e);
            grid.LeftTail(left[i], kappaLeft[i], left[i], kappaLeft[i], out var pLeft, out _);
            grid.RightTail(right[i], kappaRight[i], right[i], kappaRight[i], out var pRight, out _);
            double norm = pLeft + pRight, mass = pLeft * stack.LeftLead.MassElectronMasses + pRight * stack.RightLead.MassElectronMasses;
            double inverse = pLeft / stack.LeftLead.MassElectronMasses + pRight / stack.RightLead.MassElectronMasses;
            for (var j = 0; j < n; j++)
            {
                double p = 0;
                for (var q = grid.LayerStart[j]; q < grid.LayerStart[j + 1]; q++)
                {
                    p += grid.Weights[q] * samples[i][q] * samples[i][q];
                }
                profile.Kernel.LayerCoefficients(j, e, out var mj, out _);
                norm += p;
                mass += p * mj;
                inverse += p / mj;
            }
            normError = Math.Max(normError, Math.Abs(norm - 1));
            var wave = waves[i];
            levels.Add(new OpticalLevel(i + 1, e, bound.Levels[i].ErrorElectronVolts, false, 0, bound.Levels[i].IsResolved, mass / norm, inverse / norm,
                double.NegativeInfinity, double.PositiveInfinity, wave.ValueAt));
        }

        // Bound-to-bound dipoles and momentum forms.
        var parabolic = IsParabolic(profile);
        var dipoles = new double[nb, nb];
        var momentum = new double[nb, nb];
        var overlap = new double[n];
        var moment = new double[n];
        for (var i = 0; i < nb; i++)
        {
            for (var f = i + 1; f < nb; f++)
            {
                grid.PerLayer(samples[i], samples[f], overlap, moment);
                grid.LeftTail(left[i], kappaLeft[i], left[f], kappaLeft[f], out var oLeft, out var zLeft);
                grid.RightTail(right[i], kappaRight[i], right[f], kappaRight[f], out var oRight, out var zRight);
                var z = zLeft + zRight;
                // Σ_j m_j ∫_j F, F(x) = ∫_{−∞}^x ψ_iψ_f, in coordinates measured from the grid's origin.
                var origin = grid.OriginNanometres;
                var cumulative = oLeft;
                var weighted = stack.LeftLead.MassElectronMasses * ((0 - origin) * cumulative - zLeft);
                for (var j = 0; j < n; j++)
                {
                    z += moment[j];
                    var a = profile.Boundaries[j] - origin;
                    var b = profile.Boundaries[j + 1] - origin;
                    var next = cumulative + overlap[j];
                    weighted += profile.Mass(j) * (b * next - a * cumulative - moment[j]);
                    cumulative = next;
                }
                weighted += stack.RightLead.MassElectronMasses * (-(profile.Boundaries[n] - origin) * cumulative - zRight);
                dipoles[i, f] = dipoles[f, i] = z;
                var de = bound.Levels[f].EnergyElectronVolts - bound.Levels[i].EnergyElectronVolts;
                momentum[i, f] = 0.5 * (-de / C) * weighted; // ∫ψ_i ψ_f′, 1/nm
            }
        }

        // Quasi-bound levels.
        var quasi = new List<(QuasiBoundState State, QuasiBoundState Check, Resonance Resonance)>();
        foreach (var resonance in resonances)
        {
            var state = QuasiBoundState.Create(stack, resonance.EnergyElectronVolts, options.DomainMarginNanometres, lowest, options.BoundStates.MaxElements);
            var check = QuasiBoundState.Create(stack, resonance.EnergyElectronVolts, 2 * options.DomainMarginNanometres, lowest, options.BoundStates.MaxElements);
            quasi.Add((state, check, resonance));
            var (mass, inverse) = MassMoments(state, stack);
            levels.Add(new OpticalLevel(nb + quasi.Count, resonance.EnergyElectronVolts, resonance.EnergyErrorElectronVolts, true, resonance.WidthElectronVolts,
                true, mass, inverse, state.DomainStartNanometres, state.DomainEndNanometres, state.ValueAt));
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
                var de = resonance.EnergyElectronVolts - ei;
                var z = DomainDipole(waves[i], state, stack);
                var z2 = DomainDipole(waves[i], check, stack);
                var change = Math.Abs(Math.Abs(z2) - Math.Abs(z)) / Math.Max(Math.Abs(z), double.Epsilon);
                string? problem = null;
                if (!bound.Levels[i].IsResolved)
                {
                    problem = "the lower level is not separable from its neighbour";
                }
                else if (!(change <= options.DomainTolerance))
                {
                    problem = string.Create(CultureInfo.InvariantCulture,
                        $"the quasi-bound state is not localised: |z| changed by {change:P2} when the normalisation domain's margin was doubled ({options.DomainMarginNanometres:G6} → {2 * options.DomainMarginNanometres:G6} nm); tolerance {options.DomainTolerance:P2}");
                }
                var strength = referenceMass * de * z * z / C;
                if (problem is null)
                {
                    quasiSums[i] += strength;
                }
                transitions.Add(new IntersubbandTransition(i + 1, nb + r + 1, de, z, strength, 0, false, change, problem));
            }
        }
        return new IntersubbandSpectrum(stack, bound, [.. levels], [.. transitions], dipoles, quasiSums, referenceMass, normError, options,
            grid, waves, samples);
    }

    private static double WellMass(StackProfile profile, LayerStack stack)
    {
        var best = -1;
        for (var j = 0; j < profile.Count; j++)
        {
            if (!profile.IsDelta(j) && (best < 0 || profile.Potential(j) < profile.Potential(best)))
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
                max = Math.Max(max, profile.Potential(j));
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

    private static (double Mass, double Inverse) MassMoments(QuasiBoundState state, LayerStack stack)
    {
        var grid = state.Grid;
        var profile = grid.Profile;
        double mass = 0, inverse = 0;
        for (var j = 0; j < profile.Count; j++)
        {
            double p = 0;
            for (var q = grid.LayerStart[j]; q < grid.LayerStart[j + 1]; q++)
            {
                p += grid.Weights[q] * state.Samples[q] * state.Samples[q];
            }
            profile.Kernel.LayerCoefficients(j, state.EnergyElectronVolts, out var mj, out _);
            mass += p * mj;
            inverse += p / mj;
        }
        return (mass, inverse);
    }

    /// <summary>⟨bound|z|quasi-bound⟩ on the quasi-bound state's domain, z from the middle of the stack.</summary>
    private static double DomainDipole(BoundWavefunction wave, QuasiBoundState state, LayerStack stack)
    {
        var grid = state.Grid;
        var positions = new double[grid.Count];
        for (var q = 0; q < positions.Length; q++)
        {
            positions[q] = grid.Positions[q] - state.MarginNanometres;
        }
        var values = new double[grid.Count];
        wave.Evaluate(positions, values);
        var middle = 0.5 * stack.Thickness.Nanometres;
        double z = 0;
        for (var q = 0; q < positions.Length; q++)
        {
            z += grid.Weights[q] * (positions[q] - middle) * values[q] * state.Samples[q];
        }
        return z;
    }

    /// <summary>The transition from level <paramref name="from"/> to level <paramref name="to"/> (both counted from 1, from below to).</summary>
    /// <exception cref="ArgumentOutOfRangeException">A number is out of range, <paramref name="from"/> is not a bound level, or <paramref name="to"/> is not above it.</exception>
    public IntersubbandTransition Transition(int from, int to)
    {
        Preconditions.CheckRange(from, 1, BoundCount);
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
