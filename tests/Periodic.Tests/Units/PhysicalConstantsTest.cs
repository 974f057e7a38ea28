// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Units;

namespace Periodic.Tests.Units;

public sealed class PhysicalConstantsTest
{
    // CODATA 2018 (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021); NIST SP 961): exact h and e,
    // m_e = 9.109 383 7015(28)e-31 kg. Written out here from the published table, not from our code.
    private const double PublishedPlanck = 6.62607015e-34;
    private const double PublishedCharge = 1.602176634e-19;
    private const double PublishedElectronMass = 9.1093837015e-31;
    private const double DoubleEpsilon = 2.220446049250313e-16;

    [Fact]
    public void ExactConstants_MatchCodata2018()
    {
        // Exact in the 2019 SI: the stored doubles must be the nearest doubles to the published decimals.
        Assert.Equal(PublishedPlanck, PhysicalConstants.PlanckJouleSeconds);
        Assert.Equal(PublishedCharge, PhysicalConstants.ElementaryChargeCoulombs);
        Assert.Equal(PublishedElectronMass, PhysicalConstants.ElectronMassKilograms);
        Assert.Equal(1.380649e-23, PhysicalConstants.BoltzmannJoulesPerKelvin); // CODATA 2018, exact
    }

    [Fact]
    public void ReducedPlanck_IsPlanckOverTwoPi_AndRoundsToThePublishedValue()
    {
        // ħ = h/2π; CODATA 2018 publishes ħ = 1.054 571 817...e-34 J s, the exact value truncated to 10
        // significant digits (the "..."): ours must lie within one unit of the 10th digit above it.
        var hbar = PublishedPlanck / (2 * Math.PI);
        double actual = PhysicalConstants.ReducedPlanckJouleSeconds;
        Assert.Equal(hbar, actual, hbar * 2 * DoubleEpsilon);
        var excess = actual - 1.054571817e-34;
        Assert.InRange(excess, 0.0, 1e-43);
    }

    [Fact]
    public void HbarSquaredOverTwoElectronMass_MatchesDerivedCodataValue()
    {
        // docs/references.md [derived]: ħ²/(2 m_e) = 0.038 099 821 16 eV nm² from exact h and e
        // and the CODATA 2018 m_e. The published decimal has 10 significant digits: half a unit in the
        // last place is 5e-12 eV nm², i.e. 1.3e-10 relative.
        Assert.Equal(0.03809982116, PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2, 5e-12);

        // The same quantity computed here in another order of operations: agreement to a few ulps
        // (each of the ~6 operations rounds once, 1/2 ulp each).
        var hbarEvS = PublishedPlanck / PublishedCharge / (2 * Math.PI);
        var massEvS2PerNm2 = PublishedElectronMass / PublishedCharge * 1e-18; // kg → eV s²/nm²
        var expected = hbarEvS * hbarEvS / (2 * massEvS2PerNm2);
        double actual = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
        Assert.Equal(expected, actual, expected * 8 * DoubleEpsilon);

        // Using the rounded published ħ instead would shift the value by about 1.2e-9 relative
        // (docs/references.md): make sure ours is the exact-h value, i.e. not within 1e-10 of that one.
        var roundedHbar = 1.054571817e-34;
        var fromRounded = roundedHbar * roundedHbar / (2 * PublishedElectronMass) / PublishedCharge * 1e18;
        Assert.True(Math.Abs(fromRounded / PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 - 1) > 1e-10);
    }

    [Fact]
    public void DerivedElectronVoltConstants_MatchPublishedValues()
    {
        // CODATA 2018: k_B = 8.617 333 262... e-5 eV/K and ħ = 6.582 119 569... e-16 eV s (exact values,
        // published truncated to 10 digits; from memory, and cross-checked here by the quotient of the
        // exact SI constants). Tolerance: one unit in the 10th digit.
        Assert.Equal(8.617333262e-5, PhysicalConstants.BoltzmannElectronVoltsPerKelvin, 1e-14);
        Assert.Equal(1.380649e-23 / PublishedCharge, PhysicalConstants.BoltzmannElectronVoltsPerKelvin, 8.62e-5 * 2 * DoubleEpsilon);
        Assert.Equal(6.582119569e-16, PhysicalConstants.ReducedPlanckElectronVoltSeconds, 1e-25);
        Assert.Equal(PublishedPlanck / (2 * Math.PI) / PublishedCharge, PhysicalConstants.ReducedPlanckElectronVoltSeconds, 6.6e-16 * 4 * DoubleEpsilon);
    }

    [Fact]
    public void KineticScale_InAngstromUnits_IsTheTradeValue()
    {
        // Common practice, no single source: ħ²/2m₀ ≈ 3.81 eV Å² (the same constant in Å²: × 100).
        Assert.Equal(3.81, PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * 100, 0.005);
    }
}
