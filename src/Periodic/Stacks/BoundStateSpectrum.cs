// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.ObjectModel;
using System.Globalization;
using System.Text;
using Periodic.Numerics;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Stacks;

/// <summary>
/// The bound states of a finite stack: every level below both lead band edges, found with a proof of
/// completeness, and their wavefunctions on request. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Method: the number of levels below an energy E equals the number of zeros, on the whole line,
/// of the solution that decays into the left lead (Sturm oscillation theorem for −C(ψ′/m)′ + Vψ = Eψ;
/// e.g. G. Teschl, Ordinary Differential Equations and Dynamical Systems, AMS 2012, ch. 5; B. Simon,
/// "Sturm oscillation and comparison theorems", in Sturm–Liouville Theory: Past and Present, Birkhäuser
/// 2005). Zeros are counted layer by layer with the core's Prüfer-angle count, and the zero beyond the
/// last interface from the sign of the growing tail. Bisection on this count isolates every level in
/// its own bracket, so none is missed; each is then refined by Newton's method on the coefficient of the growing tail in
/// the right lead, which vanishes exactly once in the bracket, with its exact energy derivative propagated through the
/// stack beside the state, every step safeguarded by the count (a step that leaves the bracket is replaced, and the
/// result is proven by the count within the tolerance; e.g. W. H. Press et al., Numerical Recipes, 3rd ed., §9.4, for
/// the safeguarded Newton step). Under a bias, where the layers' energy derivative is not propagated, Brent's method
/// (R. P. Brent, 1973) on the normalised coefficient takes its place. The matrices of a layer that the stack repeats
/// are formed once per energy and reused for every copy.</para>
/// <para>The count is proven for parabolic layers and for smooth segments (Magnus steps, zeros counted in closed form per
/// step). With non-parabolic masses the equation becomes nonlinear in E and the count is used as it stands. Internally the
/// same search serves a closed box (hard walls at the stack's ends instead of leads), the domain of a finite stack's space
/// charge.</para>
/// </remarks>
public sealed class BoundStateSpectrum
{
    private const double ThresholdMarginElectronVolts = 1e-15;

    private readonly StackProfile _profile;
    private readonly BoundLevel[] _levels;

    private BoundStateSpectrum(StackProfile profile, BoundLevel[] levels, int totalCount, double lower, double upper, BoundStateOptions options)
    {
        _profile = profile;
        _levels = levels;
        Levels = new ReadOnlyCollection<BoundLevel>(levels);
        TotalCount = totalCount;
        LowerBoundElectronVolts = lower;
        ContinuumEdgeElectronVolts = upper;
        Options = options;
    }

    /// <summary>The stack.</summary>
    public LayerStack Stack => _profile.Stack;

    /// <summary>The potential drop eU across the stack the states were found under (zero: flat).</summary>
    public Units.Energy Bias => Units.Energy.FromElectronVolts(_profile.BiasElectronVolts);

    /// <summary>The compiled stack (under its bias).</summary>
    internal StackProfile Profile => _profile;

    /// <summary>The levels found, lowest first (at most <see cref="BoundStateOptions.MaxLevels"/>).</summary>
    public IReadOnlyList<BoundLevel> Levels { get; }

    /// <summary>How many bound states the stack has in all (the oscillation count at the continuum edge).</summary>
    public int TotalCount { get; }

    /// <summary>The energy below which the count proved there is no level, eV.</summary>
    public double LowerBoundElectronVolts { get; }

    /// <summary>The lower of the two lead band edges, eV: above it states are not bound (levels bound by less than 1e-15 eV are not counted).</summary>
    public double ContinuumEdgeElectronVolts { get; }

    /// <summary>The options used.</summary>
    public BoundStateOptions Options { get; }

    /// <summary>Finds every bound state of <paramref name="stack"/> (energies below both lead band edges).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <remarks>
    /// Smooth segments (sampled or function potentials, e.g. a self-consistent potential) are propagated by the kernel's
    /// fourth-order Magnus steps, whose zeros are counted exactly for the stepped problem, so the count's proof holds for the
    /// discretised potential; wavefunctions inside a segment are the cubic Hermite interpolants of its steps (O(h⁴)).
    /// </remarks>
    /// <exception cref="ArgumentException">The stack has more written-out elements than <see cref="BoundStateOptions.MaxElements"/>.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static BoundStateSpectrum Find(LayerStack stack, BoundStateOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(stack);
        options ??= BoundStateOptions.Default;
        return Find(new StackProfile(stack, options.MaxElements, nameof(stack)), options);
    }

    /// <summary>
    /// Finds every bound state of <paramref name="stack"/> under an applied bias (as <see cref="StackTransmission.Create(LayerStack, Units.Energy)"/>:
    /// a uniform field across the layers, the right lead's band edge lowered by <paramref name="bias"/> = eU): the states below
    /// both lead band edges, which stay bound because the leads are flat. States above the lower edge can leak into that lead:
    /// they are resonances (<see cref="StackTransmission.FindResonances"/>), not bound states.
    /// </summary>
    /// <remarks>
    /// Each layer under the field is propagated exactly (Airy functions or the sublayer power series of the linear-potential
    /// propagator) and its zeros of ψ are counted on sublayers short enough to hold at most one (Sturm comparison), so the
    /// count, and with it the guarantee that no level is missed, holds as at zero bias. No space charge is modelled: the field
    /// is that of an ideal capacitor.
    /// </remarks>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentException">As <see cref="Find(LayerStack, BoundStateOptions?)"/>, and under a non-zero bias what
    /// <see cref="StackTransmission.Create(LayerStack, Units.Energy)"/> refuses (a non-parabolic layer, too many elements).</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option or the bias is out of range.</exception>
    public static BoundStateSpectrum FindUnderBias(LayerStack stack, Units.Energy bias, BoundStateOptions? options = null)
    {
        StackTransmission.CheckBias(stack, bias);
        options ??= BoundStateOptions.Default;
        return Find(new StackProfile(stack, options.MaxElements, nameof(stack), bias.ElectronVolts, 0), options);
    }

    internal static BoundStateSpectrum Find(StackProfile profile, BoundStateOptions options) =>
        Find(profile, Math.Min(profile.Stack.LeftLead.PotentialElectronVolts, profile.RightLead.PotentialElectronVolts), options);

    /// <summary>
    /// Every state of a closed box (<see cref="StackProfile.HardWalls"/>) below <paramref name="ceilingElectronVolts"/>, with
    /// the same proof of completeness (the Dirichlet oscillation count) and refinement as between leads.
    /// </summary>
    internal static BoundStateSpectrum FindInBox(StackProfile profile, double ceilingElectronVolts, BoundStateOptions options) =>
        Find(profile, ceilingElectronVolts, options);

    private static BoundStateSpectrum Find(StackProfile profile, double edge, BoundStateOptions options)
    {
        // Binding energies below 1e-15 eV (relative to max(1, |edge|)) are not resolvable: the count stops there.
        var top = edge - ThresholdMarginElectronVolts * Math.Max(1, Math.Abs(edge));
        var lowestValid = profile.LowestValidEnergyElectronVolts;
        var search = new Search(profile, options);

        // A floor with no level below: the lowest potential, lowered further for delta wells until the count is zero.
        var margin = Math.Max(1e-3, Math.Abs(edge - profile.MinimumPotentialElectronVolts));
        var bottom = profile.MinimumPotentialElectronVolts - margin;
        var guard = 0;
        while (bottom > lowestValid && search.Count(bottom, out _) > 0 && guard++ < 200)
        {
            margin *= 2;
            bottom = profile.MinimumPotentialElectronVolts - margin;
        }
        if (bottom <= lowestValid)
        {
            bottom = Math.BitIncrement(lowestValid);
        }
        if (!(bottom < top))
        {
            return new BoundStateSpectrum(profile, [], 0, bottom, edge, options);
        }
        var countBottom = search.Count(bottom, out var mismatchBottom);
        var total = search.Count(top, out var mismatchTop);
        search.Isolate(new Probe(bottom, countBottom, mismatchBottom), new Probe(top, total, mismatchTop));
        var levels = search.Levels;
        levels.Sort((x, y) => x.Index.CompareTo(y.Index));
        return new BoundStateSpectrum(profile, levels.ToArray(), total, bottom, edge, options);
    }

    /// <summary>An energy where the count was taken: the count below it and the normalised mismatch there.</summary>
    private readonly record struct Probe(double Energy, int Count, double Mismatch);

    private struct Mismatch(StackProfile profile, double[] scratch) : IRealFunction
    {
        public readonly double Evaluate(double x)
        {
            profile.CountBelow(x, out var g, scratch);
            return g;
        }
    }

    /// <summary>One search: the stack, the options, the kernel's scratch (allocated once, reused by every evaluation) and the levels found.</summary>
    private sealed class Search(StackProfile profile, BoundStateOptions options)
    {
        /// <summary>Newton steps per level before the search falls back to bisection on the count.</summary>
        private const int MaxNewtonSteps = 100;

        private readonly double[] _scratch = new double[profile.ShootingScratchLength];

        internal List<BoundLevel> Levels { get; } = [];

        internal int Count(double e, out double mismatch) => profile.CountBelow(e, out mismatch, _scratch);

        internal void Isolate(Probe lower, Probe upper)
        {
            if (upper.Count <= lower.Count || lower.Count >= options.MaxLevels)
            {
                return;
            }
            double a = lower.Energy, b = upper.Energy;
            var tolerance = Math.Max(options.AbsoluteToleranceElectronVolts, options.RelativeTolerance * Math.Max(Math.Abs(a), Math.Abs(b)));
            if (upper.Count - lower.Count == 1)
            {
                Levels.Add(profile.HasEnergyDerivative ? RefineNewton(lower, upper, tolerance) : RefineBrent(a, b, lower.Count, tolerance));
                return;
            }
            var mid = 0.5 * (a + b);
            if (b - a <= tolerance || mid <= a || mid >= b)
            {
                // Levels closer than the tolerance: report them together, flagged.
                for (var n = lower.Count; n < upper.Count && n < options.MaxLevels; n++)
                {
                    Levels.Add(new BoundLevel(n, mid, 0.5 * (b - a), 0, false));
                }
                return;
            }
            var countMid = Count(mid, out var mismatchMid);
            var middle = new Probe(mid, countMid, mismatchMid);
            Isolate(lower, middle);
            Isolate(middle, upper);
        }

        /// <summary>
        /// Newton's method on the coefficient of the growing tail with its exact energy derivative, safeguarded by the count:
        /// every evaluation also counts, and so narrows the bracket [lower, upper] that holds exactly this level; a step that
        /// leaves it is replaced by Newton's step from the bracket's other end, else by bisection. Once a step is within the
        /// tolerance, the point it came from bounds the level on one side and a count at the tolerance beyond the new estimate
        /// on the other, so the level is proven within the tolerance; where rounding makes the count disagree (a tolerance at
        /// the limit of double precision), bisection on the count finishes.
        /// </summary>
        private BoundLevel RefineNewton(Probe lower, Probe upper, double tolerance)
        {
            var index = lower.Count;
            double lo = lower.Energy, hi = upper.Energy;
            // Start from the regula falsi point of the normalised mismatch, kept off the ends of the bracket.
            var fraction = lower.Mismatch / (lower.Mismatch - upper.Mismatch);
            var x = lo + (double.IsFinite(fraction) ? Math.Clamp(fraction, 0.1, 0.9) : 0.5) * (hi - lo);
            var evaluations = 0;
            // Newton's step from the bracket's ends where an evaluation with the derivative set them (NaN: not yet).
            double stepLo = double.NaN, stepHi = double.NaN;
            while (evaluations < MaxNewtonSteps && hi - lo > tolerance)
            {
                var count = profile.CountBelow(x, _scratch, out var mismatch, out var slope);
                evaluations++;
                var next = x - mismatch / slope;
                if (count <= index)
                {
                    (lo, stepLo) = (x, next);
                }
                else
                {
                    (hi, stepHi) = (x, next);
                }
                if (!(next > lo && next < hi))
                {
                    var other = x == lo ? stepHi : stepLo;
                    x = other > lo && other < hi ? other : 0.5 * (lo + hi);
                    continue;
                }
                var step = Math.Abs(next - x);
                if (step <= tolerance)
                {
                    // x bounds the level on its side, within the tolerance of next; a count proves the other side.
                    var beyond = next > x ? next + tolerance : next - tolerance;
                    var error = Math.Max(step, FloatingPoint.MachineEpsilon * Math.Abs(next));
                    if (next > x ? hi <= beyond : lo >= beyond)
                    {
                        return new BoundLevel(index, next, error, evaluations, true);
                    }
                    evaluations++;
                    if (Count(beyond, out _) <= index)
                    {
                        lo = beyond;
                    }
                    else
                    {
                        hi = beyond;
                    }
                    if (lo <= next && next <= hi)
                    {
                        return new BoundLevel(index, next, error, evaluations, true);
                    }
                    // Rounding moves the count's step past the estimate: look for it at doubling distances, then bisect.
                    for (var reach = 2 * tolerance; next > x ? next + reach < hi : next - reach > lo; reach *= 2)
                    {
                        var probe = next > x ? next + reach : next - reach;
                        evaluations++;
                        var above = Count(probe, out _) > index;
                        if (above)
                        {
                            hi = probe;
                        }
                        else
                        {
                            lo = probe;
                        }
                        if (above == next > x)
                        {
                            break;
                        }
                    }
                    break;
                }
                x = next;
            }
            return Bisect(lo, hi, index, tolerance, evaluations);
        }

        private BoundLevel RefineBrent(double a, double b, int index, double tolerance)
        {
            var function = new Mismatch(profile, _scratch);
            var root = RootFinding.Brent(ref function, a, b, options.AbsoluteToleranceElectronVolts, options.RelativeTolerance, 300);
            var checkLower = Math.Max(a, Math.Min(root.Lower, root.Root - tolerance));
            var checkUpper = Math.Min(b, Math.Max(root.Upper, root.Root + tolerance));
            var iterations = 0;
            if (root.Status == RootStatus.Converged && Count(checkLower, out _) <= index && Count(checkUpper, out _) >= index + 1)
            {
                if (root.ErrorBound <= tolerance)
                {
                    return new BoundLevel(index, root.Root, root.ErrorBound, root.Iterations, true);
                }
                // A converged step larger than the tolerance (an exact zero hit early): finish on the count.
                a = checkLower;
                b = checkUpper;
                iterations = root.Iterations;
            }
            return Bisect(a, b, index, tolerance, iterations);
        }

        /// <summary>Bisection on the count alone (always converges, guaranteed bracket).</summary>
        private BoundLevel Bisect(double a, double b, int index, double tolerance, int iterations)
        {
            while (b - a > tolerance && iterations < 2000)
            {
                var mid = 0.5 * (a + b);
                if (mid <= a || mid >= b)
                {
                    break;
                }
                if (Count(mid, out _) <= index)
                {
                    a = mid;
                }
                else
                {
                    b = mid;
                }
                iterations++;
            }
            return new BoundLevel(index, 0.5 * (a + b), 0.5 * (b - a), iterations, true);
        }
    }

    /// <summary>
    /// The number of bound states strictly below <paramref name="energyElectronVolts"/>, from the oscillation
    /// count alone (no search). Energies at or above <see cref="ContinuumEdgeElectronVolts"/> give <see cref="TotalCount"/>.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite.</exception>
    public int CountBelow(double energyElectronVolts)
    {
        Preconditions.CheckFinite(energyElectronVolts);
        if (energyElectronVolts >= ContinuumEdgeElectronVolts - ThresholdMarginElectronVolts * Math.Max(1, Math.Abs(ContinuumEdgeElectronVolts)))
        {
            return TotalCount;
        }
        if (energyElectronVolts <= LowerBoundElectronVolts)
        {
            return 0;
        }
        return _profile.CountBelow(energyElectronVolts, out _);
    }

    /// <summary>
    /// The levels that lie inside a gap (minigap) of the infinite crystal of <paramref name="cell"/>: states
    /// localised by a defect or at a surface, which cannot belong to any miniband. Uses the core dispersion
    /// |Tr M(E)| &gt; 2 (Bloch condition).
    /// </summary>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    public IReadOnlyList<BoundLevel> LevelsInGapsOf(UnitCell cell)
    {
        ArgumentNullException.ThrowIfNull(cell);
        var transfer = CellTransfer.Create(cell);
        var result = new List<BoundLevel>();
        foreach (var level in _levels)
        {
            if (level.EnergyElectronVolts > transfer.LowestValidEnergyElectronVolts && !transfer.Dispersion(level.EnergyElectronVolts).IsInBand)
            {
                result.Add(level);
            }
        }
        return result.AsReadOnly();
    }

    /// <summary>The normalised wavefunction of level <paramref name="index"/> (0-based), ready to be sampled on any grid.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="index"/> is not the index of a level found.</exception>
    public BoundWavefunction GetWavefunction(int index)
    {
        Preconditions.CheckRange(index, 0, _levels.Length - 1);
        return new BoundWavefunction(_profile, _levels[index]);
    }

    /// <inheritdoc />
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture,
            $"{TotalCount} bound state(s) below {ContinuumEdgeElectronVolts:G8} eV (none below {LowerBoundElectronVolts:G8} eV)");
        foreach (var level in _levels)
        {
            text.AppendLine().Append("  ").Append(level);
        }
        return text.ToString();
    }
}
