// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck.Xunit;
using Periodic.Bands;
using Periodic.Properties;

namespace Periodic.Tests.Properties;

/// <summary>Invariants of <see cref="BandProperties"/> over random energies and wavevectors (fixed seeds).</summary>
public sealed class BandPropertiesPropertyTest
{
    private static readonly BandProperties Props = BandProperties.Create(BandStructure.Compute(Cells.Mixed(), 4));

    private static double Fraction(int value) => (value & 0x7fffffff) % 100001 / 100000.0;

    private static double EnergyFrom(int value)
    {
        var low = Props.Structure.GetBand(1).BottomElectronVolts - 0.01;
        return low + Fraction(value) * (Props.UpperEnergyLimitElectronVolts - low);
    }

    [Property(Replay = "(1234567,7654321)", MaxTest = 200)]
    public bool IntegratedDensity_IsMonotoneAndDensityNonNegative(int a, int b)
    {
        // N(E) counts states below E, so it never decreases; g = dN/dE ≥ 0 and never NaN (Ashcroft and Mermin ch. 8).
        var e1 = EnergyFrom(a);
        var e2 = EnergyFrom(b);
        var (lo, hi) = e1 <= e2 ? (e1, e2) : (e2, e1);
        var g = Props.DensityOfStatesPerElectronVoltNanometre(lo);
        return Props.IntegratedDensityOfStatesPerNanometre(lo) <= Props.IntegratedDensityOfStatesPerNanometre(hi) && g >= 0 && !double.IsNaN(g);
    }

    [Property(Replay = "(42,4243)", MaxTest = 100)]
    public bool GroupVelocity_IsOddInKAndSignFollowsBandParity(int band, int kValue)
    {
        // E(−k) = E(k) makes v odd; in odd bands E rises from k = 0, in even bands it falls (oscillation order of edges).
        var n = 1 + (band & 0x7fffffff) % 4;
        var k = Fraction(kValue) * Math.PI / Props.PeriodNanometres;
        var plus = Props.GroupVelocityAt(n, k).SlopeElectronVoltNanometres;
        var minus = Props.GroupVelocityAt(n, -k).SlopeElectronVoltNanometres;
        var parityOk = plus == 0 || Math.Sign(plus) == (n % 2 == 1 ? 1 : -1);
        return plus == -minus && parityOk;
    }
}
