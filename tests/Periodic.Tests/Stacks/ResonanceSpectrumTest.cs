// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

public sealed class ResonanceSpectrumTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double Mass = 0.067;

    private static Layer Slab(double widthNm, double potentialEv) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(Mass));

    /// <summary>
    /// Resonance condition of a symmetric double barrier (barriers b, height V0, well w), independent of
    /// the library: |t| = 1 exactly when the round trip r_b² e^(2ikw) is real and positive, i.e.
    /// sin(arg r_b + k w) = 0 (Fabry–Pérot condition, derived), with the single-barrier amplitude
    /// r_b = (k² + κ²) sinh κb / ((k² − κ²) sinh κb + 2ikκ cosh κb) from matching ψ and ψ′ at both faces
    /// (any quantum mechanics text; re-derived symbolically for this test).
    /// </summary>
    private static double FabryPerot(double e, double v0, double b, double w)
    {
        var k = Math.Sqrt(Mass * e / C);
        var kappa = Math.Sqrt(Mass * (v0 - e) / C);
        var sh = Math.Sinh(kappa * b);
        var r = (k * k + kappa * kappa) * sh / new Complex((k * k - kappa * kappa) * sh, 2 * k * kappa * Math.Cosh(kappa * b));
        return Math.Sin(r.Phase + k * w);
    }

    [Theory]
    [InlineData(2.0, 6.0)]
    [InlineData(3.0, 10.0)]
    public void FindResonances_SymmetricDoubleBarrier_PeaksAreUnitAtFabryPerotEnergies(double barrier, double well)
    {
        const double v0 = 0.3;
        var stack = LayerStack.Create(Lead.Create(default, EffectiveMass.FromElectronMasses(Mass)), Lead.Create(default, EffectiveMass.FromElectronMasses(Mass)),
            Slab(barrier, v0), Slab(well, 0), Slab(barrier, v0));
        var transmission = StackTransmission.Create(stack);
        var spectrum = transmission.FindResonances(1e-4, v0 - 1e-4);

        // Independent roots: sign changes of the Fabry–Pérot function on a fine grid, polished by
        // MathNet's Brent solver to 1e-14 eV.
        var expected = new List<double>();
        const int grid = 20000;
        for (var i = 0; i < grid; i++)
        {
            double a = 1e-4 + (v0 - 2e-4) * i / grid, b = 1e-4 + (v0 - 2e-4) * (i + 1) / grid;
            if (Math.Sign(FabryPerot(a, v0, barrier, well)) != Math.Sign(FabryPerot(b, v0, barrier, well)))
            {
                expected.Add(MathNet.Numerics.RootFinding.Brent.FindRoot(x => FabryPerot(x, v0, barrier, well), a, b, 1e-14, 200));
            }
        }
        Assert.NotEmpty(expected);
        output.WriteLine(spectrum.ToString());
        output.WriteLine("expected: " + string.Join(", ", expected.Select(x => x.ToString("G15", System.Globalization.CultureInfo.InvariantCulture))));
        Assert.Equal(expected.Count, spectrum.Resonances.Count);
        var worstEnergy = 0.0;
        var worstPeak = 0.0;
        for (var i = 0; i < expected.Count; i++)
        {
            var resonance = spectrum.Resonances[i];
            worstEnergy = Math.Max(worstEnergy, Math.Abs(resonance.EnergyElectronVolts - expected[i]));
            worstPeak = Math.Max(worstPeak, Math.Abs(1 - resonance.PeakTransmission));
            Assert.True(resonance.EnergyErrorElectronVolts < 1e-9);
        }
        output.WriteLine($"{expected.Count} resonances; worst |E - E_FP| = {worstEnergy:E3} eV, worst |1 - T_peak| = {worstPeak:E3}, {spectrum.Evaluations} evaluations");
        // Acceptance: resonance energies agree with the T = 1 points to 1e-9 eV.
        Assert.True(worstEnergy <= 1e-9, $"worst energy error {worstEnergy:E3} eV");
        // T = 1 at each resonance (symmetric double barrier); 1e-9 covers the rounding of T near 1.
        Assert.True(worstPeak <= 1e-9, $"worst |1 - T| {worstPeak:E3}");
    }

    [Theory]
    [InlineData(10)]
    [InlineData(100)]
    public void FindResonances_NPeriods_GivesNMinusOneUnitPeaksPerBandAtKdEqualsMPiOverN(int periods)
    {
        // Chebyshev form 1/T_N = 1 + (1/T_1 − 1)(sin NKd / sin Kd)² (Abelès; Yeh ch. 6, from memory):
        // T_N = 1 exactly where sin NKd = 0 inside a band, i.e. Kd = mπ/N, m = 1 … N − 1, with K from the
        // core's Bloch wavevector. Leads of the well material.
        var cell = UnitCell.Create(Slab(4, 0), Slab(2, 0.3));
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(Mass));
        var band = Periodic.Bands.BandStructure.Compute(cell, 1).GetBand(1);
        var spectrum = StackTransmission.Create(LayerStack.Periodic(lead, cell, periods, lead))
            .FindResonances(band.BottomElectronVolts - 0.01, band.TopElectronVolts + 0.01);
        var inBand = spectrum.Resonances.Where(r => band.Contains(r.EnergyElectronVolts)).ToList();
        output.WriteLine($"N = {periods}: {inBand.Count} peaks in band 1, {spectrum.Evaluations} evaluations, complete {spectrum.RefinementComplete}");
        Assert.True(spectrum.RefinementComplete);
        Assert.Equal(periods - 1, inBand.Count);
        var transfer = Periodic.Transfer.CellTransfer.Create(cell);
        var worst = 0.0;
        foreach (var peak in inBand)
        {
            var kd = transfer.Dispersion(peak.EnergyElectronVolts).Wavevector.PhasePerPeriod;
            var m = kd * periods / Math.PI;
            worst = Math.Max(worst, Math.Abs(m - Math.Round(m)));
            Assert.Equal(1.0, peak.PeakTransmission, 1e-9); // T = 1 up to rounding of T near 1
        }
        output.WriteLine($"worst |NKd/π − m| = {worst:E3}");
        // Tolerance: near a band edge kd = arccos(D/2) is only good to ~√ε ≈ 1e-8 (arccos at ±1), i.e.
        // NKd/π to ~3e-7 at N = 100; 1e-6 covers that, and an energy error of the peak of ~1e-9 eV.
        Assert.True(worst < 1e-6, $"worst {worst:E3}");
    }

    [Fact]
    public void FindResonances_NarrowResonanceBetweenScanPoints_IsFound()
    {
        // Thick barriers make the lowest level's width far below the scan step (20 scan points over
        // 0.3 eV); the phase-step refinement must still find it. The count of peaks must equal the count
        // of Fabry–Pérot roots (see above) below the barrier top.
        const double v0 = 0.3, barrier = 8, well = 6;
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(Mass));
        var stack = LayerStack.Create(lead, lead, Slab(barrier, v0), Slab(well, 0), Slab(barrier, v0));
        var spectrum = StackTransmission.Create(stack).FindResonances(1e-4, v0 - 1e-4, ResonanceSearchOptions.Create(scanPoints: 20));
        var roots = 0;
        for (var i = 0; i < 20000; i++)
        {
            double a = 1e-4 + (v0 - 2e-4) * i / 20000, b = 1e-4 + (v0 - 2e-4) * (i + 1) / 20000;
            roots += Math.Sign(FabryPerot(a, v0, barrier, well)) != Math.Sign(FabryPerot(b, v0, barrier, well)) ? 1 : 0;
        }
        Assert.Equal(roots, spectrum.Resonances.Count);
        Assert.True(spectrum.RefinementComplete);
        // The lowest level is far narrower than the 15 meV scan step.
        Assert.True(spectrum.Resonances[0].WidthElectronVolts < 1e-4);
        output.WriteLine(spectrum.ToString());
    }

    [Fact]
    public void FindResonances_Lifetime_IsHbarOverWidth()
    {
        // τ = ħ/Γ (Breit–Wigner; any QM text), ħ from CODATA 2018 in eV s.
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(Mass));
        var stack = LayerStack.Create(lead, lead, Slab(3, 0.3), Slab(6, 0), Slab(3, 0.3));
        var resonance = StackTransmission.Create(stack).FindResonances(0.001, 0.299).Resonances[0];
        const double hbar = 6.62607015e-34 / (2 * Math.PI) / 1.602176634e-19;
        Assert.Equal(hbar / resonance.WidthElectronVolts, resonance.LifetimeSeconds, resonance.LifetimeSeconds * 1e-15);
    }

    [Fact]
    public void FindResonances_BadWindow_NamesParameter()
    {
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(Mass));
        var transmission = StackTransmission.Create(LayerStack.Create(lead, lead, Slab(3, 0.3)));
        Assert.Equal("upperElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.FindResonances(0.2, 0.1)).ParamName);
        Assert.Equal("lowerElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.FindResonances(double.NaN, 0.1)).ParamName);
        // Options are validated when created, naming the option.
        Assert.Equal("scanPoints", Assert.Throws<ArgumentOutOfRangeException>(() => ResonanceSearchOptions.Create(scanPoints: 2)).ParamName);
        Assert.Equal("maxPhaseStepRadians", Assert.Throws<ArgumentOutOfRangeException>(() => ResonanceSearchOptions.Create(maxPhaseStepRadians: Math.PI)).ParamName);
        Assert.Equal("maxEvaluations", Assert.Throws<ArgumentOutOfRangeException>(() => ResonanceSearchOptions.Create(scanPoints: 100, maxEvaluations: 99)).ParamName);
        Assert.Equal("absoluteToleranceElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => ResonanceSearchOptions.Create(absoluteToleranceElectronVolts: 0)).ParamName);
    }
}
