// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest(ITestOutputHelper output)
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    [Fact]
    public void DiracComb_BandTopsAtKdEqualsNPi()
    {
        // Dirac comb cos kd = cos Kd + P sin(Kd)/(Kd) (Kittel, ch. 7; Griffiths eq. 5.65):
        // sin(nπ) = 0 makes Kd = nπ a band top exactly, for any P; here P = 3π/2, d = 1 nm, m = m0.
        const double p = 3 * Math.PI / 2;
        var strength = p * 2 * C / 1.0; // P = m S d / (2 ħ²/2m0) with d = 1 nm, m = 1
        var bands = BandStructure.Compute(UnitCell.DiracComb(Length.FromNanometres(1), strength, EffectiveMass.FreeElectron), 5);
        for (var n = 1; n <= 5; n++)
        {
            var expected = C * n * n * Math.PI * Math.PI;
            // Tolerance: the default search tolerance is 1e-14 relative; allow 5e-14 for rounding in D.
            Assert.Equal(expected, bands.GetBand(n).TopElectronVolts, expected * 5e-14);
        }
    }
}
