// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using MathNet.Numerics.Integration;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

/// <summary>The Tsu–Esaki current density (<see cref="StackTransmission.CurrentDensity"/>).</summary>
public sealed class StackTransmissionCurrentTest(ITestOutputHelper output)
{
    private static readonly EffectiveMass GaAs = EffectiveMass.FromElectronMasses(0.067);
    private static readonly Lead Ground = Lead.Create(default, GaAs);

    // CODATA 2018 (exact SI values for e, h, k_B; m_e from CODATA), written out here independently of the library.
    private const double Charge = 1.602176634e-19;
    private const double Hbar = 6.62607015e-34 / (2 * Math.PI);
    private const double ElectronMass = 9.1093837015e-31;
    private const double Boltzmann = 1.380649e-23;

    private static Layer Slab(double widthNm, double potentialEv) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), GaAs);

    /// <summary>
    /// Independent evaluation of the Tsu–Esaki integral: T(E) from the library (checked elsewhere), the supply
    /// function and prefactor written out here, E = a + s² so the √(E − a) edge is smooth, and composite 8-point
    /// Gauss–Legendre (MathNet) on <paramref name="pieces"/> equal pieces in s up to E = μ_max + 60 k_BT.
    /// </summary>
    private static double ReferenceAmperesPerSquareMetre(StackTransmission transmission, double mu, double temperature, int pieces)
    {
        var kT = Boltzmann * temperature / Charge;
        var u = transmission.Bias.ElectronVolts;
        var a = Math.Max(transmission.Stack.LeftLead.PotentialElectronVolts, transmission.RightLead.PotentialElectronVolts);
        var b = Math.Max(a, Math.Max(mu, mu - u)) + 60 * kT;
        double Supply(double e) => Math.Log((1 + Math.Exp((mu - e) / kT)) / (1 + Math.Exp((mu - u - e) / kT)));
        double F(double s) => 2 * s * transmission.Evaluate(a + s * s).Transmission * Supply(a + s * s);
        var top = Math.Sqrt(b - a);
        double integral = 0;
        for (var i = 0; i < pieces; i++)
        {
            integral += GaussLegendreRule.Integrate(F, top * i / pieces, top * (i + 1) / pieces, 8);
        }
        var mass = transmission.Stack.LeftLead.MassElectronMasses * ElectronMass;
        return Charge * mass * Boltzmann * temperature / (2 * Math.PI * Math.PI * Hbar * Hbar * Hbar) * Charge * integral;
    }

    /// <summary>
    /// The linear-response limit of the same integral, J/U as U → 0: d/du of ln[(1 + e^x)/(1 + e^(x−u))] at u = 0 is the
    /// Fermi function 1/(1 + e^(−x)) (differentiate the Tsu–Esaki supply function), so J/U → (e m k_BT/(2π²ħ³))·(1/k_BT)
    /// ∫ T(E) f(E) dE. T(E) from the library at the given (tiny) bias; quadrature as above.
    /// </summary>
    private static double ReferenceConductance(StackTransmission transmission, double mu, double temperature, int pieces)
    {
        var kT = Boltzmann * temperature / Charge;
        var a = Math.Max(transmission.Stack.LeftLead.PotentialElectronVolts, transmission.RightLead.PotentialElectronVolts);
        var b = Math.Max(a, mu) + 60 * kT;
        double F(double s) => 2 * s * transmission.Evaluate(a + s * s).Transmission / (1 + Math.Exp((a + s * s - mu) / kT));
        var top = Math.Sqrt(b - a);
        double integral = 0;
        for (var i = 0; i < pieces; i++)
        {
            integral += GaussLegendreRule.Integrate(F, top * i / pieces, top * (i + 1) / pieces, 8);
        }
        var mass = transmission.Stack.LeftLead.MassElectronMasses * ElectronMass;
        return Charge * mass * Boltzmann * temperature / (2 * Math.PI * Math.PI * Hbar * Hbar * Hbar) * Charge * integral / kT;
    }

    [Theory]
    [InlineData(1e-9)]
    [InlineData(1e-12)]
    public void CurrentDensity_TinyBias_ApproachesTheLinearResponse(double bias)
    {
        // At u = eU/k_BT ~ 1e-10 a difference of two ln(1 + e^x) terms would keep only ~6 digits; the supply function
        // must keep full relative accuracy, so the integral converges to its 1e-6 target with a modest budget. Tolerance:
        // the library's error estimate (≤ 1e-6 relative) plus 1e-7 relative for the O(u) and O(U) differences from the
        // linear limit (u/2 ≤ 2e-8 here) and the reference quadrature (checked against half the pieces).
        var stack = LayerStack.Create(Ground, Ground, Slab(4, 0.25));
        var transmission = StackTransmission.Create(stack, Energy.FromElectronVolts(bias));
        var result = transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(300));
        var conductance = ReferenceConductance(transmission, 0.05, 300, 400);
        var coarse = ReferenceConductance(transmission, 0.05, 300, 200);
        var perBias = result.AmperesPerSquareMetre / bias;
        output.WriteLine($"{result}; J/U {perBias:G12}, linear response {conductance:G12}, relative {Math.Abs(perBias / conductance - 1):E3}");
        Assert.True(Math.Abs(coarse / conductance - 1) < 1e-9);
        Assert.True(result.IsConverged, result.ToString());
        Assert.True(Math.Abs(perBias - conductance) <= result.ErrorEstimateAmperesPerSquareMetre / bias + 1e-7 * conductance,
            $"{perBias} vs {conductance}");
    }

    [Fact]
    public void Prefactor_OverTemperature_IsTheRichardsonConstant()
    {
        // e m₀ k_B²/(2π²ħ³) = 4π e m₀ k_B²/h³ = 1.20173e6 A m⁻² K⁻² (the Richardson constant; e.g. S. M. Sze, Physics of
        // Semiconductor Devices, 3rd ed., §3.2, 120 A cm⁻² K⁻²). Checks the constants this test uses; 1e-5 relative (6 digits quoted).
        var richardson = Charge * ElectronMass * Boltzmann * Boltzmann / (2 * Math.PI * Math.PI * Hbar * Hbar * Hbar);
        Assert.Equal(1.20173e6, richardson, 1.20173e6 * 1e-5);
    }

    [Fact]
    public void CurrentDensity_ZeroBias_IsExactlyZero()
    {
        // No bias, no net supply: ln(1) = 0 for every energy (Tsu and Esaki 1973, eq. for J).
        var stack = LayerStack.Create(Ground, Ground, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3));
        var result = StackTransmission.Create(stack).CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(300));
        Assert.Equal(0.0, result.AmperesPerSquareMetre);
        Assert.True(result.IsConverged);
    }

    [Theory]
    [InlineData(0.1, 300.0, 0.05)]
    [InlineData(0.3, 77.0, 0.02)]
    [InlineData(-0.2, 300.0, 0.01)]
    public void CurrentDensity_SingleBarrier_MatchesIndependentQuadrature(double bias, double temperature, double mu)
    {
        // Same integral by an independent quadrature (above). Tolerance: the library's own error estimate (its target
        // is 1e-6 relative) plus 1e-9 relative for the reference (8-point Gauss–Legendre on 400 pieces of a smooth
        // integrand: converged, checked against 200 pieces below). The estimate must also cover the actual error.
        var stack = LayerStack.Create(Ground, Ground, Slab(4, 0.25));
        var transmission = StackTransmission.Create(stack, Energy.FromElectronVolts(bias));
        var result = transmission.CurrentDensity(Energy.FromElectronVolts(mu), Temperature.FromKelvin(temperature));
        var reference = ReferenceAmperesPerSquareMetre(transmission, mu, temperature, 400);
        var coarse = ReferenceAmperesPerSquareMetre(transmission, mu, temperature, 200);
        var error = Math.Abs(result.AmperesPerSquareMetre - reference);
        output.WriteLine($"{result}; reference {reference:G10} A/m2, actual relative error {error / Math.Abs(reference):E3}, estimate {result.ErrorEstimateAmperesPerSquareMetre / Math.Abs(reference):E3}, reference self-check {Math.Abs(coarse / reference - 1):E3}");
        Assert.True(Math.Abs(coarse / reference - 1) < 1e-9);
        Assert.True(result.IsConverged);
        Assert.Equal(Math.Sign(bias), Math.Sign(result.AmperesPerSquareMetre));
        Assert.True(error <= result.ErrorEstimateAmperesPerSquareMetre + 1e-9 * Math.Abs(reference), $"{error}");
        Assert.True(result.ErrorEstimateAmperesPerSquareMetre <= 1e-6 * Math.Abs(result.AmperesPerSquareMetre));
        Assert.Equal(result.AmperesPerSquareMetre * 1e-4, result.AmperesPerSquareCentimetre);
    }

    [Fact]
    public void CurrentDensity_UnequalLeadMasses_UsesTheLeftLeadMass()
    {
        // The transverse motion is free with the emitting (left) lead's mass (the model stated in the XML docs and
        // stacks.md): with a right lead 1.34 times heavier the result must match the reference built with m_L (one built
        // with m_R would be 34 % higher). Tolerance as in the single-barrier check.
        var heavy = Lead.Create(default, EffectiveMass.FromElectronMasses(0.09));
        var transmission = StackTransmission.Create(LayerStack.Create(Ground, heavy, Slab(4, 0.25)), Energy.FromElectronVolts(0.1));
        var result = transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(300));
        var reference = ReferenceAmperesPerSquareMetre(transmission, 0.05, 300, 400);
        var error = Math.Abs(result.AmperesPerSquareMetre - reference);
        Assert.True(result.IsConverged);
        Assert.True(error <= result.ErrorEstimateAmperesPerSquareMetre + 1e-9 * Math.Abs(reference), $"{error}");
    }

    [Fact]
    public void CurrentDensity_ResonantDoubleBarrier_MatchesIndependentQuadrature()
    {
        // A resonant-tunnelling double barrier at 77 K, its resonance (width ~1 meV) inside the supply window. The
        // reference uses 1000 pieces in s (about 2e-4 eV each, several per resonance width; checked against 500); tolerance as above.
        var stack = LayerStack.Create(Ground, Ground, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3));
        var transmission = StackTransmission.Create(stack, Energy.FromElectronVolts(0.08));
        var result = transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(77));
        var reference = ReferenceAmperesPerSquareMetre(transmission, 0.05, 77, 1000);
        var coarse = ReferenceAmperesPerSquareMetre(transmission, 0.05, 77, 500);
        var error = Math.Abs(result.AmperesPerSquareMetre - reference);
        output.WriteLine($"{result}; reference {reference:G10} A/m2, actual relative error {error / reference:E3}, estimate {result.ErrorEstimateAmperesPerSquareMetre / reference:E3}, reference self-check {Math.Abs(coarse / reference - 1):E3}");
        Assert.True(Math.Abs(coarse / reference - 1) < 1e-9);
        Assert.True(result.IsConverged && result.ResonanceCount >= 1);
        Assert.True(error <= result.ErrorEstimateAmperesPerSquareMetre + 1e-9 * reference, $"{error}");
    }

    [Fact]
    public void CurrentDensity_MirroredStackAndBias_ReversesTheCurrent()
    {
        // Reciprocity (T unchanged by the mirror image, see the bias tests) with equal lead masses: the mirrored device,
        // its energies measured from its own left lead, carries the same electron flux the other way. Tolerance: the
        // two error estimates.
        var stack = LayerStack.Create(Ground, Lead.Create(Energy.FromElectronVolts(0.02), GaAs), Slab(2, 0.2), Slab(5, 0), Slab(3, 0.35));
        var forward = StackTransmission.Create(stack, Energy.FromElectronVolts(0.15)).CurrentDensity(Energy.FromElectronVolts(0.04), Temperature.FromKelvin(150));
        var backward = StackTransmission.Create(stack.Reverse(), Energy.FromElectronVolts(-0.15)).CurrentDensity(Energy.FromElectronVolts(0.04), Temperature.FromKelvin(150));
        var difference = Math.Abs(forward.AmperesPerSquareMetre + backward.AmperesPerSquareMetre);
        output.WriteLine($"{forward}; mirrored {backward}; relative difference {difference / forward.AmperesPerSquareMetre:E3}");
        Assert.True(difference <= forward.ErrorEstimateAmperesPerSquareMetre + backward.ErrorEstimateAmperesPerSquareMetre, $"{difference}");
    }

    [Fact]
    public void CurrentDensity_Validation_NamesTheParameter()
    {
        var transmission = StackTransmission.Create(LayerStack.Create(Ground, Ground, Slab(3, 0.3)), Energy.FromElectronVolts(0.1));
        Assert.Equal("electronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(double.NaN), Temperature.FromKelvin(300))).ParamName);
        var temperature = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(0)));
        Assert.Equal("temperature", temperature.ParamName);
        Assert.Contains("got 0", temperature.Message, StringComparison.Ordinal);
        // Options are validated when created, naming the option, its value and the range.
        var options = Assert.Throws<ArgumentOutOfRangeException>(() => CurrentDensityOptions.Create(relativeTolerance: 0));
        Assert.Equal("relativeTolerance", options.ParamName);
        Assert.Contains("got 0", options.Message, StringComparison.Ordinal);
        Assert.Equal("maxEvaluations", Assert.Throws<ArgumentOutOfRangeException>(() => CurrentDensityOptions.Create(maxEvaluations: 3)).ParamName);
        // Allowed ranges (their limits are public constants): temperature, and the higher Fermi level above the lead edge.
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(0.05))).ParamName);
        var hot = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(1e9)));
        Assert.Equal("temperature", hot.ParamName);
        Assert.Contains("between 0.1 and 1000", hot.Message, StringComparison.Ordinal);
        var high = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(1e9), Temperature.FromKelvin(300)));
        Assert.Equal("fermiLevel", high.ParamName);
        Assert.Contains("more than 20 eV above the higher lead band edge", high.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void CurrentDensityAndPeakSearch_CancelledToken_Throw()
    {
        // Long computations under bias can be cancelled; a token cancelled before the call stops it at the first check.
        var transmission = StackTransmission.Create(LayerStack.Create(Ground, Ground, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3)), Energy.FromElectronVolts(0.08));
        using var source = new CancellationTokenSource();
        source.Cancel();
        Assert.ThrowsAny<OperationCanceledException>(() => transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(77), null, source.Token));
        Assert.ThrowsAny<OperationCanceledException>(() => transmission.FindResonances(0.01, 0.3, null, source.Token));
    }

    [Fact]
    public void CurrentDensity_SmallBudget_SaysNotConverged()
    {
        // A budget of one rule per piece cannot reach 1e-12: the result must say so rather than pretend.
        var transmission = StackTransmission.Create(LayerStack.Create(Ground, Ground, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3)), Energy.FromElectronVolts(0.08));
        var result = transmission.CurrentDensity(Energy.FromElectronVolts(0.05), Temperature.FromKelvin(77), CurrentDensityOptions.Create(relativeTolerance: 1e-12, maxEvaluations: 200));
        Assert.False(result.IsConverged);
        Assert.True(double.IsFinite(result.AmperesPerSquareMetre) && result.ErrorEstimateAmperesPerSquareMetre > 0);
        Assert.Contains("NOT converged", result.ToString(), StringComparison.Ordinal);
    }
}
