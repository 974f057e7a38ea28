// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Optics;
using Periodic.Tests.TestHelpers;
using Periodic.Units;

namespace Periodic.Tests.Optics;

public class InterbandSpectrumTest
{
    [Fact]
    public void Compute_EqualMassWell_MatchesGapPlusFiniteWellLevels()
    {
        // Two custom materials with equal masses for each carrier, so that every band is Griffiths' finite well (§2.6): the
        // e1–hh1 energy must be Eg(T) of the well (Varshni, Physica 34, 149 (1967), written out here) plus the two
        // confinement energies, and ⟨e1|hh1⟩ the closed-form overlap of two even finite-well states.
        var well = Material.Create("W", Energy.FromElectronVolts(1.5), 5e-4, Temperature.FromKelvin(200), EffectiveMass.FromElectronMasses(0.07), Energy.FromElectronVolts(0.0), Length.FromNanometres(0.565), heavyHoleMass: EffectiveMass.FromElectronMasses(0.5), lightHoleMass: EffectiveMass.FromElectronMasses(0.09));
        var barrier = Material.Create("B", Energy.FromElectronVolts(1.9), 5e-4, Temperature.FromKelvin(200), EffectiveMass.FromElectronMasses(0.07), Energy.FromElectronVolts(-0.15), Length.FromNanometres(0.565), heavyHoleMass: EffectiveMass.FromElectronMasses(0.5), lightHoleMass: EffectiveMass.FromElectronMasses(0.09));
        const double width = 8, t = 300;
        var recipe = StructureRecipe.Create(Temperature.FromKelvin(t)).Add(well, Length.FromNanometres(width));
        var spectrum = InterbandSpectrum.Compute(recipe, barrier, barrier);

        var gap = 1.5 - 5e-4 * t * t / (t + 200);
        var depthE = (-0.15 + (1.9 - 5e-4 * t * t / (t + 200))) - gap; // ΔEc = ΔEv-side shift + gap difference
        var electrons = FiniteWellReference.Solve(width, depthE, 0.07);
        var heavy = FiniteWellReference.Solve(width, 0.15, 0.5);
        var e1hh1 = spectrum.Transitions.Single(x => x.Label == "e1-hh1");
        // Energies to 1e-9 relative of the confinement (the level tolerance is 1e-12 eV).
        Assert.Equal(gap + electrons[0].Energy + heavy[0].Energy, e1hh1.EnergyElectronVolts, 1e-10);
        var expected = EvenOverlap(electrons[0], heavy[0], width);
        Assert.Equal(expected, Math.Abs(e1hh1.Overlap), 1e-9);
        // Parity: e1 and hh2 have opposite parity.
        Assert.True(Math.Abs(spectrum.Transitions.Single(x => x.Label == "e1-hh2").Overlap) < 1e-12);
        // The edge is e1–hh1 and its wavelength λ = hc/E (CODATA 2018 h, c, e).
        Assert.Equal("e1-hh1", spectrum.Edge!.Value.Label);
        Assert.Equal(6.62607015e-34 * 299792458 / (e1hh1.EnergyElectronVolts * 1.602176634e-19) * 1e9, e1hh1.WavelengthNanometres, 1e-9);
    }

    /// <summary>∫ψ_aψ_b of two even finite-well states of one width: cos·cos inside, exponential tails outside [derived].</summary>
    private static double EvenOverlap(FiniteWellReference.State a, FiniteWellReference.State b, double width)
    {
        var h = 0.5 * width;
        static double CosCos(double p, double q, double h) =>
            (Math.Abs(p - q) < 1e-12 ? h : Math.Sin((p - q) * h) / (p - q)) + Math.Sin((p + q) * h) / (p + q);
        var inside = CosCos(a.K, b.K, h);
        var outside = 2 * Math.Cos(a.K * h) * Math.Cos(b.K * h) / (a.Kappa + b.Kappa);
        return a.Amplitude * b.Amplitude * (inside + outside);
    }

    [Fact]
    public void Compute_GaAsWellWarmer_EdgeMovesToLongerWavelength()
    {
        // The gap shrinks with temperature (Varshni), so the edge moves to longer wavelength: common practice.
        var barrier = StructureRecipe.ParseMaterial("Al0.3Ga0.7As");
        var cold = InterbandSpectrum.Compute(StructureRecipe.Parse("8 nm GaAs at 4 K"), barrier, barrier);
        var warm = InterbandSpectrum.Compute(StructureRecipe.Parse("8 nm GaAs at 300 K"), barrier, barrier);
        Assert.True(warm.Edge!.Value.WavelengthNanometres > cold.Edge!.Value.WavelengthNanometres);
        // An 8 nm GaAs well emits between the bulk gap (≈ 870 nm at 300 K) and ≈ 800 nm: a plausibility bound.
        Assert.InRange(warm.Edge.Value.WavelengthNanometres, 780, 870);
    }

    [Fact]
    public void Compute_NoHoleMasses_Throws()
    {
        var well = Material.Create("W", Energy.FromElectronVolts(1.5), 5e-4, Temperature.FromKelvin(200), EffectiveMass.FromElectronMasses(0.07), Energy.FromElectronVolts(0.0), Length.FromNanometres(0.565));
        var barrier = Material.Create("B", Energy.FromElectronVolts(1.9), 5e-4, Temperature.FromKelvin(200), EffectiveMass.FromElectronMasses(0.07), Energy.FromElectronVolts(-0.15), Length.FromNanometres(0.565));
        var e = Assert.Throws<ArgumentException>(() => InterbandSpectrum.Compute(StructureRecipe.Create(Temperature.FromKelvin(300)).Add(well, Length.FromNanometres(8)), barrier, barrier));
        Assert.Equal("recipe", e.ParamName);
    }
}
