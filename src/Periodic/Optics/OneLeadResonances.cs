// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Optics;

/// <summary>A quasi-bound state open into one lead only: its energy, the energy's error bound and its width Γ, eV.</summary>
internal readonly record struct OneLeadResonance(double EnergyElectronVolts, double ErrorElectronVolts, double WidthElectronVolts);

/// <summary>
/// The quasi-bound states of a stack whose energies lie between its two lead band edges (under bias, or with leads of different
/// band edges): above the lower edge the state escapes into that lead, below the higher one it decays into the other.
/// </summary>
/// <remarks>
/// <para>Method: the reflection phase. At a real energy E between the edges the solution that decays into the closed lead is
/// unique; carried through the stack (the kernel's exact layers, under bias its Airy layers) it meets the open lead as
/// ψ = A e^{ikx} + B e^{−ikx} with |A| = |B|, the reflection amplitude r = A/B = e^{i(2Φ − π)}, Φ the Prüfer angle of
/// (ψ, (m/k)ψ′/m) at the open interface made continuous by the oscillation count of ψ through the stack (so Φ needs no
/// unwrapping and rises by about π across each resonance). Its energy derivative (the Wigner delay, E. P. Wigner, Phys. Rev.
/// 98, 145 (1955)) is exact from the Wronskian identity (ψ∂_E w − w∂_E ψ)(x) = −(1/C)∫_{−∞}^x ψ² (w = ψ′/m, C = ħ²/2m₀),
/// the integral being the kernel's element integrals plus the closed-form tail:
/// dΦ/dE = [(m/k)N/C + ψw·m²/(2Ck³)]/(ψ² + (m w/k)²). Near an isolated resonance r follows the Breit–Wigner form
/// (E − E_r − iΓ/2)/(E − E_r + iΓ/2) (Landau, Lifshitz, Quantum Mechanics, §134), whose phase slope peaks at E_r with
/// dΦ/dE = 2/Γ; so E_r is the maximum of the delay and Γ = 2/(dΦ/dE)_max, the width of the pole E_r − iΓ/2 to first order
/// in Γ over the level spacing.</para>
/// <para>Search: Φ on a uniform scan, each step bisected until it turns by at most the allowed phase step (a narrow resonance
/// turns it by π between two samples, so none hides); each local maximum of the sampled slope whose neighbourhood turns by at
/// least π/2 is refined by golden-section maximisation of the exact delay (J. Kiefer, Proc. AMS 4, 502 (1953)).</para>
/// </remarks>
internal static class OneLeadResonances
{
    private const int MaxIterations = 200;
    private const double EdgeMargin = 1e-9;

    private readonly record struct Sample(double Energy, double Phase);

    /// <summary>
    /// The resonances of <paramref name="stack"/> under <paramref name="bias"/> between its two lead edges, below
    /// <paramref name="upper"/> eV; none when the edges coincide.
    /// </summary>
    internal static List<OneLeadResonance> Find(LayerStack stack, double bias, long maxElements, double upper, ResonanceSearchOptions options)
    {
        var vLeft = stack.LeftLead.PotentialElectronVolts;
        var vRight = stack.RightLead.PotentialElectronVolts - bias;
        var found = new List<OneLeadResonance>();
        if (vLeft == vRight)
        {
            return found;
        }
        // The search runs with the closed lead on the left. With the right lead closed it runs on the mirror image, whose
        // potential is V′(x′) = V(L − x′) + eU for the mirrored stack under bias −eU [derived from the bias convention: the
        // right lead lowered by eU, the field across the layers]; its energies are the original ones plus eU.
        var closedLeft = vLeft > vRight;
        var profile = closedLeft
            ? new StackProfile(stack, maxElements, nameof(stack), bias, 0)
            : new StackProfile(Mirror(stack), maxElements, nameof(stack), -bias, 0);
        var shift = closedLeft ? 0 : bias;
        var lo = Math.Min(vLeft, vRight) + shift;
        var hi = Math.Min(Math.Max(vLeft, vRight), upper) + shift;
        var span = hi - lo;
        var a = lo + EdgeMargin * span;
        var b = hi - EdgeMargin * span;
        if (!(b > a))
        {
            return found;
        }

        var n = options.ScanPoints;
        var evaluations = 0;
        var samples = new List<Sample>(n);
        Sample Eval(double e)
        {
            evaluations++;
            return new Sample(e, Phase(profile, e, slope: false).Phase);
        }
        void Refine(Sample s, Sample t, int depth)
        {
            var mid = 0.5 * (s.Energy + t.Energy);
            if (Math.Abs(t.Phase - s.Phase) > options.MaxPhaseStepRadians && depth < 60 && evaluations < options.MaxEvaluations
                && mid > s.Energy && mid < t.Energy)
            {
                var m = Eval(mid);
                Refine(s, m, depth + 1);
                Refine(m, t, depth + 1);
                return;
            }
            samples.Add(t);
        }
        var previous = Eval(a);
        samples.Add(previous);
        for (var i = 1; i < n; i++)
        {
            var next = Eval(i == n - 1 ? b : a + (b - a) * i / (n - 1));
            Refine(previous, next, 0);
            previous = next;
        }

        // Slopes of the sampled phase per interval; a resonance is a local maximum whose surroundings (to the neighbouring
        // minima of the slope) turn the phase by at least π/2.
        var m = samples.Count - 1;
        var slopes = new double[m];
        for (var i = 0; i < m; i++)
        {
            slopes[i] = (samples[i + 1].Phase - samples[i].Phase) / (samples[i + 1].Energy - samples[i].Energy);
        }
        // The first and last intervals are left out: towards the closed lead's edge the tail 1/(2κ) makes the delay rise without
        // a peak, and a level turns the phase over several steps, so its peak never sits in an end interval.
        for (var i = 1; i < m - 1; i++)
        {
            if (!(slopes[i] > slopes[i - 1] && slopes[i] >= slopes[i + 1]))
            {
                continue;
            }
            var left = i;
            while (left > 0 && slopes[left - 1] <= slopes[left])
            {
                left--;
            }
            var right = i;
            while (right < m - 1 && slopes[right + 1] <= slopes[right])
            {
                right++;
            }
            if (samples[right + 1].Phase - samples[left].Phase < 0.5 * Math.PI)
            {
                continue;
            }
            var (energy, error, delay) = Maximise(profile, samples[i - 1].Energy, samples[i + 2].Energy,
                options.AbsoluteToleranceElectronVolts);
            // A maximum at an end of its bracket is the rising edge of the window, not a peak.
            var bracketLow = samples[i - 1].Energy;
            var bracketHigh = samples[i + 2].Energy;
            if (delay > 0 && double.IsFinite(delay) && energy - error > bracketLow && energy + error < bracketHigh)
            {
                found.Add(new OneLeadResonance(energy - shift, error, 2 / delay));
            }
        }
        return found;
    }

    /// <summary>Golden-section maximisation of the exact delay dΦ/dE on [a, b]: the peak, its error bound and the delay there.</summary>
    private static (double Energy, double Error, double Delay) Maximise(StackProfile profile, double a, double b, double tolerance)
    {
        const double invPhi = 0.6180339887498949;
        double x1 = b - invPhi * (b - a), x2 = a + invPhi * (b - a);
        double f1 = Phase(profile, x1, slope: true).Slope, f2 = Phase(profile, x2, slope: true).Slope;
        for (var iteration = 0; iteration < MaxIterations && b - a > Math.Max(tolerance, 4e-16 * Math.Abs(x1)); iteration++)
        {
            if (f1 > f2)
            {
                b = x2; x2 = x1; f2 = f1;
                x1 = b - invPhi * (b - a);
                f1 = Phase(profile, x1, slope: true).Slope;
            }
            else
            {
                a = x1; x1 = x2; f1 = f2;
                x2 = a + invPhi * (b - a);
                f2 = Phase(profile, x2, slope: true).Slope;
            }
        }
        var delay = Math.Max(f1, f2);
        // Near the flat top the comparisons see rounding (relative 1e-13 of the delay, a conservative allowance for the element
        // integrals) once the Lorentzian falls by less: |E − E_r| ≲ (Γ/2)·√(1e-13); that, or the final bracket, bounds the error.
        var error = Math.Max(0.5 * (b - a), Math.Max(tolerance, 2e-7 / delay));
        return (f1 > f2 ? x1 : x2, error, delay);
    }

    /// <summary>
    /// The continuous Prüfer angle Φ at the open (right) interface of the solution decaying into the closed (left) lead, and on
    /// request its exact energy derivative, 1/eV.
    /// </summary>
    internal static (double Phase, double Slope) Phase(StackProfile profile, double e, bool slope)
    {
        const double c = Units.PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
        var kernel = profile.Kernel;
        var closed = profile.Stack.LeftLead;
        var open = profile.RightLead;
        var kappa = closed.DecayConstantPerNanometre(e);
        double u = 1, w = kappa / closed.MassElectronMasses, log = 0;
        var zeros = 0;
        // ∫_{−∞}^{x} ψ², in units of e^{2·log} at the current log.
        var norm = slope ? 0.5 / kappa : 0;
        for (var i = 0; i < kernel.Count; i++)
        {
            if (slope && !kernel.IsDelta(i))
            {
                norm += kernel.SquareIntegral(i, e, new ElementEnds(u, w, 0, 0), fromLeft: true);
            }
            var before = log;
            zeros += kernel.StepForward(i, e, ref u, ref w, ref log);
            if (slope && log != before)
            {
                norm *= Math.Exp(2 * (before - log));
            }
        }
        var k = open.WavenumberPerNanometre(e);
        var m = open.MassElectronMasses;
        var q = m * w / k;
        var angle = Math.Atan2(u, q);
        if (angle < 0)
        {
            angle += Math.PI;
        }
        if (angle >= Math.PI)
        {
            angle -= Math.PI;
        }
        var phase = Math.PI * zeros + angle;
        if (!slope)
        {
            return (phase, 0);
        }
        var derivative = (m / k * norm / c + u * w * m * m / (2 * c * k * k * k)) / (u * u + q * q);
        return (phase, derivative);
    }

    /// <summary>The stack mirrored (x → L − x): parts and the elements of each repeated cell in reverse order, leads swapped.</summary>
    private static LayerStack Mirror(LayerStack stack)
    {
        var parts = new List<StackPart>();
        for (var p = stack.Parts.Count - 1; p >= 0; p--)
        {
            var part = stack.Parts[p];
            parts.Add(part.Cell is { } cell
                ? StackPart.Repeat(UnitCell.Create(cell.Elements.Reverse()), part.Repetitions)
                : StackPart.Single(part.Element!));
        }
        return LayerStack.Create(stack.RightLead, parts, stack.LeftLead);
    }
}
