// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Optics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Design;

/// <summary>
/// Exact first derivatives of the bound-state levels, transmission resonances and intersubband transition energies of a
/// <see cref="LayerStack"/> with respect to the width, potential or band-edge mass of one of its layers, from the transfer
/// matrices (implicit differentiation of each energy's defining condition), not finite differences.
/// </summary>
/// <remarks>
/// <para>A layer is named by the <see cref="Layer"/> object the stack was built from: the derivative is taken with respect
/// to a change of that layer wherever it occurs (a layer of a repeated cell occurs once per repetition, and all change
/// together, as when the stack is rebuilt from the changed layer). Leads are not layers and stay fixed.</para>
/// <para><b>Levels.</b> A bound state is a root of F(E, p) = ℓᵀ·M(E, p)·r = 0, where M is the transfer matrix of the
/// written-out stack in the (ψ, ψ′/m) basis, r = (1, κ_L/m_L) starts the solution that decays into the left lead and
/// ℓ = (1, m_R/κ_R) picks the coefficient of the solution that grows into the right lead (the condition
/// <see cref="BoundStateSpectrum"/> solves). dE/dp = −(∂F/∂p)/(∂F/∂E) (implicit function theorem), with ∂M/∂E and
/// ∂M/∂p from the transfer kernel's exact layer derivatives and the leads' κ(E) differentiated in closed form.</para>
/// <para><b>Resonances.</b> The library's resonance energy is the maximum of the transmission T(E)
/// (<see cref="StackTransmission.FindResonances(double, double, ResonanceSearchOptions?, CancellationToken)"/>), a root of
/// ∂lnT/∂E = 0; so dE/dp = −(∂²lnT/∂E∂p)/(∂²lnT/∂E²). With q = k/m in each lead,
/// T = 4q_Lq_R/[(q_R·M11 + q_L·M22)² + (q_Lq_R·M12 − M21)²] (current conservation across the stack's transfer matrix,
/// e.g. D. J. Griffiths and C. A. Steinke, Am. J. Phys. 69, 137 (2001)), and the second derivatives come from a product of
/// matrices whose entries carry (E, p) jets (forward-mode automatic differentiation). At zero bias only.</para>
/// <para><b>Transitions.</b> E_to − E_from differentiated term by term: a bound level by the level rule, a quasi-bound
/// level (a transmission peak) by the resonance rule.</para>
/// <para><b>Accuracy.</b> The derivatives are exact up to rounding in the transfer products: a few ulps of the largest
/// partial product, which for a resonance behind thick barriers (κ·w of several units per barrier) grows like
/// e^(Σκw) relative to the O(1) transmission and can cost digits; levels do not suffer this (both partial derivatives are
/// of the growing size). Where the energy's defining condition is degenerate (a level not separated from its neighbour,
/// a peak with zero curvature) the derivative is reported as null.</para>
/// </remarks>
public static class StackSensitivities
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>
    /// d(energy of bound level <paramref name="levelIndex"/>)/d(<paramref name="quantity"/> of <paramref name="layer"/>), in eV
    /// per nm, eV per eV or eV per m₀; null where the level has no derivative (not separated from its neighbour).
    /// </summary>
    /// <param name="spectrum">The bound states of the stack.</param>
    /// <param name="levelIndex">0-based index of the level (as in <see cref="BoundStateSpectrum.Levels"/>).</param>
    /// <param name="layer">A layer of the stack (the object it was built from).</param>
    /// <param name="quantity">Width, potential or mass.</param>
    /// <exception cref="ArgumentNullException"><paramref name="spectrum"/> or <paramref name="layer"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">No such level, or <paramref name="quantity"/> is not defined.</exception>
    /// <exception cref="ArgumentException"><paramref name="layer"/> does not occur in the stack.</exception>
    public static double? OfLevel(BoundStateSpectrum spectrum, int levelIndex, Layer layer, LayerQuantity quantity)
    {
        ArgumentNullException.ThrowIfNull(spectrum);
        ArgumentNullException.ThrowIfNull(layer);
        Preconditions.CheckRange(levelIndex, 0, spectrum.Levels.Count - 1, nameof(levelIndex));
        var parameter = ToParameter(quantity);
        var occurrences = Occurrences(spectrum.Profile, layer);
        var level = spectrum.Levels[levelIndex];
        return level.IsResolved ? LevelCore(spectrum.Profile, level.EnergyElectronVolts, occurrences, parameter) : null;
    }

    /// <summary>
    /// d(energy of <paramref name="resonance"/>)/d(<paramref name="quantity"/> of <paramref name="layer"/>), in eV per nm,
    /// eV per eV or eV per m₀; null where the peak has no derivative (zero curvature of ln T).
    /// </summary>
    /// <param name="transmission">The stack's transmission at zero bias, whose <see cref="StackTransmission.FindResonances(double, double, ResonanceSearchOptions?, CancellationToken)"/> found the resonance.</param>
    /// <param name="resonance">The resonance.</param>
    /// <param name="layer">A layer of the stack (the object it was built from).</param>
    /// <param name="quantity">Width, potential or mass.</param>
    /// <exception cref="ArgumentNullException"><paramref name="transmission"/> or <paramref name="layer"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="quantity"/> is not defined, or the resonance lies at or
    /// below a lead band edge (no resonance of this stack).</exception>
    /// <exception cref="ArgumentException">The transmission is under bias; the stack holds a smooth segment or more than
    /// <see cref="BoundStateOptions.DefaultMaxElements"/> elements written out; or <paramref name="layer"/> does not occur in it.</exception>
    public static double? OfResonance(StackTransmission transmission, Resonance resonance, Layer layer, LayerQuantity quantity)
    {
        ArgumentNullException.ThrowIfNull(transmission);
        ArgumentNullException.ThrowIfNull(layer);
        if (transmission.Bias.ElectronVolts != 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"transmission is under a bias of {transmission.Bias.ElectronVolts:G6} eV; resonance sensitivities are computed at zero bias."), nameof(transmission));
        }
        var parameter = ToParameter(quantity);
        var profile = new StackProfile(transmission.Stack, BoundStateOptions.DefaultMaxElements, nameof(transmission));
        var occurrences = Occurrences(profile, layer);
        return ResonanceCore(profile, CheckAboveLeads(transmission.Stack, resonance.EnergyElectronVolts, nameof(resonance)), occurrences, parameter);
    }

    /// <summary>
    /// d(energy of <paramref name="transition"/>)/d(<paramref name="quantity"/> of <paramref name="layer"/>): the derivative of
    /// the upper level's energy minus that of the lower, each by the level rule (bound) or the resonance rule
    /// (quasi-bound); null where either has none. A quasi-bound level between the two lead edges (open into the lower lead
    /// only, <see cref="IntersubbandOptions.IncludeQuasiBound"/>) transmits nothing, so it has no peak and its transitions
    /// no derivative here: null.
    /// </summary>
    /// <param name="spectrum">The intersubband spectrum the transition belongs to.</param>
    /// <param name="transition">One of <see cref="IntersubbandSpectrum.Transitions"/>.</param>
    /// <param name="layer">A layer of the stack (the object it was built from).</param>
    /// <param name="quantity">Width, potential or mass.</param>
    /// <exception cref="ArgumentNullException"><paramref name="spectrum"/> or <paramref name="layer"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The transition names a level the spectrum does not have, or
    /// <paramref name="quantity"/> is not defined.</exception>
    /// <exception cref="ArgumentException"><paramref name="layer"/> does not occur in the stack.</exception>
    public static double? OfTransition(IntersubbandSpectrum spectrum, IntersubbandTransition transition, Layer layer, LayerQuantity quantity)
    {
        ArgumentNullException.ThrowIfNull(spectrum);
        ArgumentNullException.ThrowIfNull(layer);
        Preconditions.CheckRange(transition.From, 1, spectrum.Levels.Count, nameof(transition));
        Preconditions.CheckRange(transition.To, 1, spectrum.Levels.Count, nameof(transition));
        var parameter = ToParameter(quantity);
        var profile = spectrum.BoundStates.Profile;
        var occurrences = Occurrences(profile, layer);
        var upper = OpticalLevelDerivative(spectrum, spectrum.Levels[transition.To - 1], occurrences, parameter);
        var lower = OpticalLevelDerivative(spectrum, spectrum.Levels[transition.From - 1], occurrences, parameter);
        return upper - lower;
    }

    private static double? OpticalLevelDerivative(IntersubbandSpectrum spectrum, OpticalLevel level, int[] occurrences, LayerParameter parameter)
    {
        if (!level.IsQuasiBound)
        {
            var bound = spectrum.BoundStates.Levels[level.Number - 1];
            return bound.IsResolved ? LevelCore(spectrum.BoundStates.Profile, bound.EnergyElectronVolts, occurrences, parameter) : null;
        }
        return ResonanceCore(spectrum.BoundStates.Profile, level.EnergyElectronVolts, occurrences, parameter);
    }

    /// <summary>dE/dp of the bound level at <paramref name="e"/>: −(ℓᵀ·∂M/∂p·r)/(∂(ℓᵀ·M·r)/∂E).</summary>
    internal static double? LevelCore(StackProfile profile, double e, int[] occurrences, LayerParameter parameter)
    {
        var stack = profile.Stack;
        double mL = stack.LeftLead.MassElectronMasses, mR = stack.RightLead.MassElectronMasses;
        double kL = profile.LeftDecay(e), kR = profile.RightDecay(e);
        if (!(kL > 0 && kR > 0))
        {
            return null;
        }
        // r = (1, a), ℓ = (1, b); κ = √(m(V − E)/C) gives dκ/dE = −m/(2Cκ).
        double a = kL / mL, da = -1 / (2 * C * kL);
        double b = mR / kR, db = mR * mR / (2 * C * kR * kR * kR);
        var energy = profile.Kernel.Accumulate(e);
        var byParameter = profile.Kernel.AccumulateParameterDerivative(e, occurrences, parameter);
        var dFdE = energy.D11 + energy.D12 * a + energy.P12 * da
            + b * (energy.D21 + energy.D22 * a + energy.P22 * da)
            + db * (energy.P21 + energy.P22 * a);
        var dFdp = byParameter.D11 + byParameter.D12 * a + b * (byParameter.D21 + byParameter.D22 * a);
        if (dFdE == 0)
        {
            return null;
        }
        var value = -dFdp / dFdE * Math.Exp(byParameter.LogScale - energy.LogScale);
        return double.IsFinite(value) ? value : null;
    }

    /// <summary>dE/dp of the transmission peak at <paramref name="e"/>: −(∂²lnT/∂E∂p)/(∂²lnT/∂E²).</summary>
    internal static double? ResonanceCore(StackProfile profile, double e, int[] occurrences, LayerParameter parameter)
    {
        var product = profile.Kernel.AccumulateSecondOrder(e, occurrences, parameter);
        // Bring the largest entry to order one (a power of two, exact) so that the squares below cannot overflow.
        var max = Math.Max(Math.Max(product.P11.MaxAbs, product.P12.MaxAbs), Math.Max(product.P21.MaxAbs, product.P22.MaxAbs));
        var exponent = max > 0 ? -Math.ILogB(max) : 0;
        var (m11, m12, m21, m22) = (product.P11.ScaleB(exponent), product.P12.ScaleB(exponent), product.P21.ScaleB(exponent), product.P22.ScaleB(exponent));
        var qL = LeadJet(profile.Stack.LeftLead, e);
        var qR = LeadJet(profile.Stack.RightLead, e);
        var x = qR * m11 + qL * m22;
        var y = qL * qR * m12 - m21;
        // ln T = ln 4 + ln q_L + ln q_R − ln(x² + y²) (the scale factor of M only adds a constant).
        var logT = qL.Log() + qR.Log() - (x * x + y * y).Log();
        if (!(logT.EE < 0))
        {
            return null;
        }
        var value = -logT.EP / logT.EE;
        return double.IsFinite(value) ? value : null;
    }

    /// <summary>q = k/m = √((E − V)/(m·C)) of a lead and its energy derivatives (q′ = 1/(2mCq), q″ = −q′²/q).</summary>
    private static ParameterJet LeadJet(Lead lead, double e)
    {
        var m = lead.MassElectronMasses;
        var q = Math.Sqrt((e - lead.PotentialElectronVolts) / (m * C));
        var dq = 1 / (2 * m * C * q);
        return new ParameterJet(q, dq, -dq * dq / q, 0, 0);
    }

    private static double CheckAboveLeads(LayerStack stack, double e, string paramName)
    {
        var edge = Math.Max(stack.LeftLead.PotentialElectronVolts, stack.RightLead.PotentialElectronVolts);
        if (!(e > edge) || !double.IsFinite(e))
        {
            throw new ArgumentOutOfRangeException(paramName, e, string.Create(CultureInfo.InvariantCulture,
                $"a resonance lies above both lead band edges ({edge:G6} eV); got {e:G6} eV."));
        }
        return e;
    }

    /// <summary>The written-out indices at which <paramref name="layer"/> occurs (reference identity), increasing.</summary>
    private static int[] Occurrences(StackProfile profile, Layer layer)
    {
        var found = new List<int>();
        for (var i = 0; i < profile.Elements.Length; i++)
        {
            if (ReferenceEquals(profile.Elements[i], layer))
            {
                found.Add(i);
            }
        }
        return found.Count > 0 ? [.. found]
            : throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"layer {layer} does not occur in the stack; pass one of the Layer objects the stack was built from."), nameof(layer));
    }

    private static LayerParameter ToParameter(LayerQuantity quantity) => quantity switch
    {
        LayerQuantity.Width => LayerParameter.Width,
        LayerQuantity.Potential => LayerParameter.Potential,
        LayerQuantity.Mass => LayerParameter.Mass,
        _ => throw new ArgumentOutOfRangeException(nameof(quantity), quantity, "quantity must be Width, Potential or Mass."),
    };
}
