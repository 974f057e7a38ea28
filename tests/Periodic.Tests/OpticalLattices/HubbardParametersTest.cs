// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.OpticalLattices;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.OpticalLattices;

public sealed class HubbardParametersTest(ITestOutputHelper output)
{
    private static readonly Length Wavelength = Length.FromNanometres(1064);

    private static OpticalLattice Lattice(double s) => OpticalLattice.Create(Wavelength, s, AtomicSpecies.Find("87Rb"));

    [Fact]
    public void Compute_CubicLattice_ApproachesHarmonicLimitFromBelow()
    {
        // Harmonic approximation of the Wannier function (Bloch, Dalibard, Zwerger, RMP 80, 885 (2008); REFERENCES.md,
        // from memory): U/E_R ≈ √(8/π) k_L a_s s^{3/4} for a cubic lattice of equal depths. It is a limit: the
        // Gaussian is too narrow at moderate depth, so the harmonic U is high (tens of percent near s = 10,
        // REFERENCES.md); the deviation must shrink with depth and stay between 0 and 50 %.
        var a = HubbardParameters.BohrRadii(100);
        double previous = double.PositiveInfinity;
        foreach (var s in new[] { 8.0, 16.0, 32.0 })
        {
            var lattice = Lattice(s);
            var hubbard = HubbardParameters.Compute(lattice, TransverseConfinement.CubicLattice, a);
            var u = lattice.ToRecoilEnergies(hubbard.InteractionElectronVolts);
            var harmonic = Math.Sqrt(8 / Math.PI) * lattice.LatticeWavenumberPerNanometre * a.Nanometres * Math.Pow(s, 0.75);
            var deviation = harmonic / u - 1;
            output.WriteLine($"s = {s}: U = {u:G8} E_R, harmonic {harmonic:G8}, high by {deviation:P2}; U/J = {hubbard.InteractionToTunnellingRatio:G6}");
            Assert.InRange(deviation, 0, 0.5);
            Assert.True(deviation < previous);
            previous = deviation;
        }
    }

    [Fact]
    public void Compute_Interaction_FollowsContactFormulas()
    {
        // Contact interaction g = 4πħ²a_s/m (REFERENCES.md, derived): U_3D = g(∫|w|⁴)³, U_tube = g∫|w|⁴/(2πa⊥²),
        // a⊥² = ħ/(mω⊥). Computed here from CODATA constants and the species mass independently of the library's
        // ħ²/2m₀ constant; 1e-12 relative: rounding of a few products.
        var lattice = Lattice(12);
        var a = Length.FromNanometres(5.3);
        var cubic = HubbardParameters.Compute(lattice, TransverseConfinement.CubicLattice, a);
        var tube = HubbardParameters.Compute(lattice, TransverseConfinement.Harmonic(30e3), a);
        const double hbar = 6.62607015e-34 / (2 * Math.PI); // CODATA 2018, exact h
        var m = 86.9091805310 * 1.66053906660e-27; // AME2020 (from memory) × CODATA 2018 u in kg (read)
        var g = 4 * Math.PI * hbar * hbar * 5.3e-9 / m; // J m³
        var integral = cubic.Wannier.OnSiteIntegralPerNanometre * 1e9; // 1/m
        var expectedCubic = g * Math.Pow(integral, 3) / 1.602176634e-19;
        var aPerpSquared = hbar / (m * 2 * Math.PI * 30e3);
        var expectedTube = g * integral / (2 * Math.PI * aPerpSquared) / 1.602176634e-19;
        // u in kg = 1.66053906660e-27 carries a 3e-10 relative uncertainty (CODATA 2018): 1e-9 tolerance.
        Assert.Equal(expectedCubic, cubic.InteractionElectronVolts, 1e-9 * expectedCubic);
        Assert.Equal(expectedTube, tube.InteractionElectronVolts, 1e-9 * expectedTube);
        Assert.Equal(cubic.TunnellingElectronVolts, tube.TunnellingElectronVolts);
        Assert.Equal(HubbardParameters.CriticalRatioCubic, cubic.CriticalRatio);
        Assert.Equal(HubbardParameters.CriticalRatioOneDimensional, tube.CriticalRatio);
        // Adiabaticity time ħ/gap (common practice, no single source).
        Assert.Equal(hbar / (cubic.GapAboveElectronVolts * 1.602176634e-19), cubic.AdiabaticTimeSeconds, 1e-12 * cubic.AdiabaticTimeSeconds);
    }

    [Fact]
    public void Scan_MatchesSingleComputationsAndUOverJGrows()
    {
        // U/J grows with depth (J falls exponentially, U rises as s^{3/4}: common practice, no single source); the
        // scan is the single computation repeated, so equal to the last bit.
        var lattice = Lattice(5);
        var a = HubbardParameters.BohrRadii(100);
        var scan = HubbardParameters.Scan(lattice, [5.0, 10.0, 15.0], TransverseConfinement.CubicLattice, a);
        Assert.Equal(3, scan.Count);
        Assert.True(scan[0].InteractionToTunnellingRatio < scan[1].InteractionToTunnellingRatio && scan[1].InteractionToTunnellingRatio < scan[2].InteractionToTunnellingRatio);
        var single = HubbardParameters.Compute(lattice.WithDepth(10), TransverseConfinement.CubicLattice, a);
        Assert.Equal(single.InteractionElectronVolts, scan[1].InteractionElectronVolts);
        // The 3D transition of 87Rb at 1064 nm with a_s ≈ 100 a0 lies between s = 10 and 15 (common practice:
        // measured near 13 E_R, Greiner et al., Nature 415, 39 (2002), from memory).
        Assert.True(scan[1].RatioToCritical < 1 && scan[2].RatioToCritical > 1);
    }

    [Fact]
    public void Compute_BadInput_NamesTheParameter()
    {
        var lattice = Lattice(10);
        Assert.Equal("scatteringLength", Assert.Throws<ArgumentOutOfRangeException>(() =>
            HubbardParameters.Compute(lattice, TransverseConfinement.CubicLattice, 2 * Length.FromNanometres(double.MaxValue))).ParamName);
        Assert.Throws<ArgumentOutOfRangeException>(() => TransverseConfinement.Harmonic(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => TransverseConfinement.Harmonic(double.NaN));
        var scan = Assert.Throws<ArgumentOutOfRangeException>(() =>
            HubbardParameters.Scan(lattice, [5.0, -1.0], TransverseConfinement.CubicLattice, HubbardParameters.BohrRadii(100)));
        Assert.Contains("depthsInRecoilEnergies[1]", scan.Message, StringComparison.Ordinal);
    }
}
