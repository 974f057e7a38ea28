// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Numerics;

namespace Periodic.Stacks;

/// <summary>
/// Transmission-peak search: a uniform scan refined wherever the phase of t turns by more than the
/// allowed step between samples — judged from the wrapped phase difference and from the phase slope
/// at both ends (a resonance turns it by about π, so no isolated peak hides between samples, and dense
/// peaks are resolved) — then for each
/// local maximum a golden-section maximisation of ln T, Brent roots of T = T_peak/2 for the width, and
/// a Brent root of the central difference ln T(E + h) − ln T(E − h) with Richardson extrapolation in h
/// for the peak energy (R. P. Brent, Algorithms for Minimization without Derivatives, 1973; J. Kiefer,
/// Proc. AMS 4, 502 (1953) for golden section).
/// </summary>
internal static class ResonanceFinder
{
    private const double Ln2 = 0.6931471805599453;
    private const int MaxIterations = 200;
    private const double RelativeTolerance = 4e-16;
    private const double EdgeMargin = 1e-12;

    private readonly record struct Sample(double Energy, double LogT, double Phase, double PhaseSlope, double BlochPhase);

    private struct LevelFunction(StackTransmission transmission, double level) : IRealFunction
    {
        public readonly double Evaluate(double x) => transmission.EvaluateCore(x).LogTransmission - level;
    }

    private struct SlopeFunction(StackTransmission transmission, double step) : IRealFunction
    {
        public readonly double Evaluate(double x) =>
            transmission.EvaluateCore(x + step).LogTransmission - transmission.EvaluateCore(x - step).LogTransmission;
    }

    internal static ResonanceSpectrum Find(StackTransmission transmission, double lower, double upper, ResonanceSearchOptions options,
        CancellationToken cancellationToken = default)
    {
        var edge = Math.Max(transmission.Stack.LeftLead.PotentialElectronVolts, transmission.RightLead.PotentialElectronVolts);
        edge = Math.Max(edge, transmission.LowestValidEnergyElectronVolts);
        // Start just above the higher lead edge (k = 0 there: no current, no peak).
        var lo = Math.Max(lower, edge + EdgeMargin * Math.Max(1, Math.Abs(edge)));
        if (!(lo < upper))
        {
            return new ResonanceSpectrum([], lo, upper, 0, true, options);
        }
        var evaluations = 0;
        var complete = true;
        var n = options.ScanPoints;
        // Step for the phase slope d(arg t)/dE at each sample: far below the scan step.
        var slopeStep = 1e-6 * (upper - lo) / (n - 1);
        Sample Eval(double e)
        {
            cancellationToken.ThrowIfCancellationRequested();
            evaluations += 2;
            var r = transmission.EvaluateCore(e);
            var ahead = transmission.EvaluateCore(e + slopeStep);
            var slope = Math.IEEERemainder(ahead.TransmissionPhase - r.TransmissionPhase, 2 * Math.PI) / slopeStep;
            return new Sample(e, r.LogTransmission, r.TransmissionPhase, slope, transmission.UnfoldedBlochPhase(e));
        }

        var samples = new List<Sample>(n);
        var previous = Eval(lo);
        samples.Add(previous);
        for (var i = 1; i < n; i++)
        {
            var next = Eval(i == n - 1 ? upper : lo + (upper - lo) * i / (n - 1));
            Refine(previous, next, 0);
            previous = next;
        }

        void Refine(Sample a, Sample b, int depth)
        {
            // The turn of arg t across the step: the wrapped difference (catches an isolated narrow peak
            // between the samples) or the slope at either end times the step (catches dense peaks whose
            // turns would wrap to nothing).
            var step = b.Energy - a.Energy;
            // For repeated cells the unfolded Bloch phase N·kd, which is monotonic and needs no unwrapping,
            // bounds how many of their peaks the step can hold.
            var turn = Math.Max(Math.Abs(Math.IEEERemainder(b.Phase - a.Phase, 2 * Math.PI)),
                Math.Max(Math.Max(Math.Abs(a.PhaseSlope), Math.Abs(b.PhaseSlope)) * step, Math.Abs(b.BlochPhase - a.BlochPhase)));
            var mid = 0.5 * (a.Energy + b.Energy);
            if (turn > options.MaxPhaseStepRadians && mid > a.Energy && mid < b.Energy)
            {
                if (evaluations >= options.MaxEvaluations || depth >= 60)
                {
                    complete = false;
                }
                else
                {
                    var m = Eval(mid);
                    Refine(a, m, depth + 1);
                    Refine(m, b, depth + 1);
                    return;
                }
            }
            samples.Add(b);
        }

        var resonances = new List<Resonance>();
        var minimumIndex = 0;
        for (var i = 1; i < samples.Count - 1; i++)
        {
            if (samples[i].LogT < samples[minimumIndex].LogT)
            {
                minimumIndex = i;
            }
            if (!(samples[i].LogT > samples[i - 1].LogT && samples[i].LogT >= samples[i + 1].LogT))
            {
                continue;
            }
            // The minimum sample after this maximum bounds its upper half-maximum search.
            var nextMinimum = i + 1;
            for (var j = i + 1; j < samples.Count; j++)
            {
                if (samples[j].LogT <= samples[nextMinimum].LogT)
                {
                    nextMinimum = j;
                }
                if (j + 1 < samples.Count && samples[j + 1].LogT > samples[j].LogT)
                {
                    break;
                }
            }
            resonances.Add(RefinePeak(transmission, samples[i - 1].Energy, samples[i + 1].Energy,
                samples[minimumIndex].Energy, samples[nextMinimum].Energy, options.AbsoluteToleranceElectronVolts, ref evaluations));
            minimumIndex = i;
        }
        return new ResonanceSpectrum(resonances.ToArray(), lo, upper, evaluations, complete, options);
    }

    private static Resonance RefinePeak(StackTransmission transmission, double a, double b, double lowerMinimum, double upperMinimum,
        double tolerance, ref int evaluations)
    {
        // Golden-section maximisation of ln T over the bracket of three samples.
        const double invPhi = 0.6180339887498949;
        double x1 = b - invPhi * (b - a), x2 = a + invPhi * (b - a);
        double f1 = transmission.EvaluateCore(x1).LogTransmission, f2 = transmission.EvaluateCore(x2).LogTransmission;
        evaluations += 2;
        for (var iteration = 0; iteration < MaxIterations && b - a > Math.Max(tolerance, RelativeTolerance * Math.Abs(x1)); iteration++)
        {
            if (f1 > f2)
            {
                b = x2; x2 = x1; f2 = f1;
                x1 = b - invPhi * (b - a);
                f1 = transmission.EvaluateCore(x1).LogTransmission;
            }
            else
            {
                a = x1; x1 = x2; f1 = f2;
                x2 = a + invPhi * (b - a);
                f2 = transmission.EvaluateCore(x2).LogTransmission;
            }
            evaluations++;
        }
        var peak = f1 > f2 ? x1 : x2;
        var logPeak = Math.Max(f1, f2);

        // Half-maximum points, each bracketed between the peak and the neighbouring minimum sample.
        var level = new LevelFunction(transmission, logPeak - Ln2);
        double lowerHalf = double.NegativeInfinity, upperHalf = double.PositiveInfinity;
        if (lowerMinimum < peak && level.Evaluate(lowerMinimum) < 0)
        {
            var root = RootFinding.Brent(ref level, lowerMinimum, peak, tolerance, RelativeTolerance, MaxIterations);
            evaluations += root.Iterations + 2;
            if (root.Status == RootStatus.Converged)
            {
                lowerHalf = root.Root;
            }
        }
        if (upperMinimum > peak && level.Evaluate(upperMinimum) < 0)
        {
            var root = RootFinding.Brent(ref level, peak, upperMinimum, tolerance, RelativeTolerance, MaxIterations);
            evaluations += root.Iterations + 2;
            if (root.Status == RootStatus.Converged)
            {
                upperHalf = root.Root;
            }
        }

        // The peak as the root of the symmetric difference, at steps h, h/2 and h/4 (Richardson: the bias is O(h²)).
        var scale = double.IsFinite(lowerHalf) && double.IsFinite(upperHalf)
            ? Math.Min(peak - lowerHalf, upperHalf - peak)
            : Math.Max(Math.Min(peak - lowerMinimum, upperMinimum - peak), 1e-9 * Math.Max(1, Math.Abs(peak)));
        var energy = peak;
        var error = Math.Max(tolerance, 0.5 * (b - a));
        var h = 2e-3 * scale;
        var coarse = PeakRoot(transmission, peak, h, 0.25 * scale, tolerance, ref evaluations);
        var fine = PeakRoot(transmission, peak, 0.5 * h, 0.25 * scale, tolerance, ref evaluations);
        var finest = PeakRoot(transmission, peak, 0.25 * h, 0.25 * scale, tolerance, ref evaluations);
        if (coarse.HasValue && fine.HasValue && finest.HasValue)
        {
            // Two Richardson estimates; their difference bounds the error of the better one.
            var first = (4 * fine.Value - coarse.Value) / 3;
            var second = (4 * finest.Value - fine.Value) / 3;
            energy = second;
            error = Math.Max(tolerance, Math.Abs(second - first));
            var refined = transmission.EvaluateCore(energy).LogTransmission;
            evaluations++;
            if (refined >= logPeak - 1e-12)
            {
                logPeak = Math.Max(logPeak, refined);
            }
            else
            {
                energy = peak; // the difference root is not a better maximum: keep the golden-section one
                error = Math.Max(tolerance, 0.5 * (b - a));
            }
        }
        return new Resonance(energy, error, logPeak, lowerHalf, upperHalf);
    }

    private static double? PeakRoot(StackTransmission transmission, double peak, double step, double halfWidth, double tolerance, ref int evaluations)
    {
        var slope = new SlopeFunction(transmission, step);
        var root = RootFinding.Brent(ref slope, peak - halfWidth, peak + halfWidth, tolerance, RelativeTolerance, MaxIterations);
        evaluations += 2 * (root.Iterations + 2);
        return root.Status == RootStatus.Converged ? root.Root : null;
    }
}
