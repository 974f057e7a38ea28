// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Transfer;

namespace Periodic.Stacks;

/// <summary>
/// The wavefunction ψ(x) of one bound state, normalised to ∫|ψ|² dx = 1 over the whole line (ψ in
/// nm^(−1/2), x in nm from the left lead's interface), real, and positive in the left lead. Sampling
/// does not allocate; the object is immutable and thread-safe.
/// </summary>
/// <remarks>
/// Method: two-sided shooting. The solution decaying into the left lead is propagated rightwards and the
/// one decaying into the right lead leftwards, each in the direction in which it grows, and the two are
/// joined at the element boundary where the state is largest, so neither carries the exponentially
/// growing error of one-sided shooting through thick barriers (e.g. W. H. Press et al., Numerical
/// Recipes, 3rd ed., §18.1, shooting to a fitting point). Layer integrals of ψ² are closed forms.
/// </remarks>
public sealed class BoundWavefunction
{
    private readonly StackProfile _profile;
    private readonly double _energy;
    private readonly int _match;

    // Per boundary i: the state (u, w) as mantissa × e^log of the piece that covers it, already scaled and normalised.
    private readonly double[] _u;
    private readonly double[] _w;
    private readonly double[] _log;

    internal BoundWavefunction(StackProfile profile, BoundLevel level)
    {
        _profile = profile;
        Level = level;
        var e = level.EnergyElectronVolts;
        _energy = e;
        var n = profile.Count;
        var uL = new double[n + 1];
        var wL = new double[n + 1];
        var lL = new double[n + 1];
        var uR = new double[n + 1];
        var wR = new double[n + 1];
        var lR = new double[n + 1];
        var walls = profile.HardWalls;
        var kappaLeft = profile.LeftDecay(e);
        var kappaRight = profile.RightDecay(e);
        var mLeft = profile.Stack.LeftLead.MassElectronMasses;
        var mRight = profile.RightLead.MassElectronMasses;
        // Between hard walls ψ starts at zero with a unit slope from each end; between leads it decays into them.
        // The matrices of repeated layers are formed once for the energy (the kernel's table in scratch).
        var scratch = new double[profile.ShootingScratchLength];
        profile.Kernel.ShootStates(e, walls ? 0 : 1, walls ? 1 : kappaLeft / mLeft, forward: true, uL, wL, lL, scratch);
        profile.Kernel.ShootStates(e, walls ? 0 : 1, walls ? 1 : -kappaRight / mRight, forward: false, uR, wR, lR, scratch);

        // Join where both pieces are largest: there the eigenfunction itself is largest.
        var mu = walls ? mLeft * StackProfile.WallLengthNanometres : Math.Min(mLeft / kappaLeft, mRight / kappaRight);
        var best = double.NegativeInfinity;
        for (var i = 0; i <= n; i++)
        {
            var score = LogNorm(uL[i], wL[i], mu) + lL[i] + LogNorm(uR[i], wR[i], mu) + lR[i];
            if (score > best)
            {
                best = score;
                _match = i;
            }
        }
        var j = _match;
        var ratio = (uL[j] * uR[j] + mu * mu * wL[j] * wR[j]) / (uR[j] * uR[j] + mu * mu * wR[j] * wR[j]);
        var logLambda = Math.Log(Math.Abs(ratio)) + lL[j] - lR[j];
        var signLambda = Math.Sign(ratio);
        _u = new double[n + 1];
        _w = new double[n + 1];
        _log = new double[n + 1];
        for (var i = 0; i <= n; i++)
        {
            if (i < j || (i == j && j == n))
            {
                _u[i] = uL[i]; _w[i] = wL[i]; _log[i] = lL[i];
            }
            else
            {
                _u[i] = signLambda * uR[i]; _w[i] = signLambda * wR[i]; _log[i] = lR[i] + logLambda;
            }
        }
        // Normalisation: tails in closed form, each layer integrated from the end its piece grows away from.
        ReadOnlySpan<double> integrals = profile.Kernel.FillIntegralClasses(e, scratch) ? scratch : default;
        var logs = new double[n + 2];
        logs[0] = walls ? double.NegativeInfinity : 2 * (Math.Log(Math.Abs(_u[0])) + _log[0]) - Math.Log(2 * kappaLeft);
        logs[n + 1] = walls ? double.NegativeInfinity : 2 * (Math.Log(Math.Abs(_u[n])) + _log[n]) - Math.Log(2 * kappaRight);
        for (var i = 0; i < n; i++)
        {
            if (profile.IsDelta(i))
            {
                logs[i + 1] = double.NegativeInfinity;
                continue;
            }
            if (profile.Kernel.IsSegment(i))
            {
                // A smooth segment: its Magnus steps, integrated from the end its piece grows away from.
                var segment = profile.Kernel.Segment(i);
                logs[i + 1] = i < j
                    ? segment.LogSquareIntegral(e, uL[i], wL[i], fromLeft: true) + 2 * lL[i]
                    : segment.LogSquareIntegral(e, uR[i + 1], wR[i + 1], fromLeft: false) + 2 * (lR[i + 1] + logLambda);
                continue;
            }
            if (!profile.Kernel.IsLayer(i))
            {
                // A layer under bias (linear potential): quadrature of the exactly propagated state.
                logs[i + 1] = i < j
                    ? profile.Kernel.LogLinearLayerIntegral(i, e, uL[i], wL[i], fromLeft: true) + 2 * lL[i]
                    : profile.Kernel.LogLinearLayerIntegral(i, e, uR[i + 1], wR[i + 1], fromLeft: false) + 2 * (lR[i + 1] + logLambda);
                continue;
            }
            profile.Kernel.LayerCoefficients(i, e, out var mass, out _);
            logs[i + 1] = i < j
                ? profile.Kernel.TabledLogLayerIntegral(i, e, uL[i], mass * wL[i], integrals) + 2 * lL[i]
                : profile.Kernel.TabledLogLayerIntegral(i, e, uR[i + 1], -mass * wR[i + 1], integrals) + 2 * (lR[i + 1] + logLambda);
        }
        var max = logs.Max();
        double sum = 0;
        foreach (var value in logs)
        {
            sum += Math.Exp(value - max);
        }
        var logNorm = max + Math.Log(sum);
        var sign = (walls ? _w[0] : _u[0]) < 0 ? -1.0 : 1.0;
        for (var i = 0; i <= n; i++)
        {
            _log[i] -= 0.5 * logNorm;
            _u[i] *= sign;
            _w[i] *= sign;
        }
        _leftPiece = j;
        LeadProbability = walls ? 0 : Math.Exp(logs[0] - logNorm) + Math.Exp(logs[n + 1] - logNorm);
    }

    private readonly int _leftPiece;

    /// <summary>
    /// The state at every element boundary, unscaled: <paramref name="psi"/>[i] = ψ and <paramref name="derivativeOverMass"/>[i] = ψ′/m
    /// at the left end of element i (index Count: the right end of the stack), for the kernel's integrals of pairs of states.
    /// </summary>
    internal void BoundaryStates(Span<double> psi, Span<double> derivativeOverMass)
    {
        for (var i = 0; i < _u.Length; i++)
        {
            var scale = Math.Exp(_log[i]);
            psi[i] = _u[i] * scale;
            derivativeOverMass[i] = _w[i] * scale;
        }
    }

    /// <summary>Elements before this index are represented from their left end (the left shooting piece), the others from their right end.</summary>
    internal int JoinIndex => _leftPiece;

    /// <summary>The compiled stack the state lives on.</summary>
    internal StackProfile Profile => _profile;

    private static double LogNorm(double u, double w, double mu) => 0.5 * Math.Log(u * u + mu * mu * w * w);

    /// <summary>The level this wavefunction belongs to.</summary>
    public BoundLevel Level { get; }

    /// <summary>The level energy, eV.</summary>
    public double EnergyElectronVolts => _energy;

    /// <summary>Probability of finding the carrier in the two leads (outside the stack), in [0, 1].</summary>
    public double LeadProbability { get; }

    /// <summary>Position of the boundary where the two shooting pieces were joined, nm.</summary>
    public double JoinPositionNanometres => _profile.Boundaries[_match];

    /// <summary>ψ at <paramref name="positionNanometres"/> (nm^(−1/2)); underflows to zero far in the leads.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The position is not finite.</exception>
    public double ValueAt(double positionNanometres)
    {
        Preconditions.CheckFinite(positionNanometres);
        return Value(positionNanometres);
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = ψ(positionsNanometres[i])</c>, for positions in any order.
    /// Does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A position is not finite (the message names its index); destination is then unchanged.</exception>
    public void Evaluate(ReadOnlySpan<double> positionsNanometres, Span<double> destination)
    {
        Preconditions.CheckDestination(positionsNanometres.Length, destination.Length, nameof(positionsNanometres), nameof(destination));
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            if (!double.IsFinite(positionsNanometres[i]))
            {
                var name = string.Create(CultureInfo.InvariantCulture, $"positionsNanometres[{i}]");
                throw new ArgumentOutOfRangeException(nameof(positionsNanometres), positionsNanometres[i],
                    $"{name} must be a finite position in nm; got {Preconditions.Format(positionsNanometres[i])}.");
            }
        }
        for (var i = 0; i < positionsNanometres.Length; i++)
        {
            destination[i] = Value(positionsNanometres[i]);
        }
    }

    private double Value(double x)
    {
        var boundaries = _profile.Boundaries;
        var n = _profile.Count;
        if (_profile.HardWalls && (x <= 0 || x >= boundaries[n]))
        {
            return 0;
        }
        if (x <= 0)
        {
            return _u[0] * Math.Exp(_log[0] + _profile.LeftDecay(_energy) * x);
        }
        if (x >= boundaries[n])
        {
            return _u[n] * Math.Exp(_log[n] - _profile.RightDecay(_energy) * (x - boundaries[n]));
        }
        // The layer containing x: the last boundary at or below x that starts a layer of positive width.
        var i = Array.BinarySearch(boundaries, x);
        i = i >= 0 ? i : ~i - 1;
        while (i < n - 1 && (_profile.IsDelta(i) || boundaries[i + 1] <= x))
        {
            i++;
        }
        while (i > 0 && _profile.IsDelta(i))
        {
            i--;
        }
        if (i < _leftPiece)
        {
            var value = _profile.Kernel.ScaledLayerValue(i, _energy, _u[i], _w[i], x - boundaries[i], out var logScale);
            return value * Math.Exp(_log[i] + logScale);
        }
        else
        {
            var value = _profile.Kernel.ScaledLayerValue(i, _energy, _u[i + 1], _w[i + 1], -(boundaries[i + 1] - x), out var logScale);
            return value * Math.Exp(_log[i + 1] + logScale);
        }
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"Wavefunction of level {Level.Index} at {EnergyElectronVolts:G12} eV, {LeadProbability:P3} in the leads, joined at {JoinPositionNanometres:G6} nm");
}
