// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

public sealed partial class CellTransferTest
{
    /// <summary>Dirac combs (period nm, P, mass m0): the textbook P = 3π/2, a weak comb, a comb of delta wells (P &lt; 0).</summary>
    public static TheoryData<double, double, double> DiracCombs => new()
    {
        { 1.0, 3 * Math.PI / 2, 1.0 },
        { 2.0, 0.4, 0.2 },
        { 0.7, -2.5, 0.067 },
    };

    [Theory]
    [MemberData(nameof(DiracCombs))]
    public void Dispersion_DiracComb_MatchesKittelGriffiths(double d, double p, double m)
    {
        // cos kd = cos Kd + P sin(Kd)/(Kd) (Kittel ch. 7; Griffiths eq. 5.65); K = iκ below zero [derived].
        var strength = ClosedForms.DiracCombStrengthForP(p, d, m);
        var transfer = CellTransfer.Create(UnitCell.DiracComb(Length.FromNanometres(d), strength, EffectiveMass.FromElectronMasses(m)));
        var e1 = ClosedForms.C * Math.PI * Math.PI / (m * d * d); // free-particle zone-boundary energy
        var worst = 0.0;
        for (var i = 0; i < 3000; i++)
        {
            var e = e1 * (-0.8 + 20.0 * (i + 0.5) / 3000);
            var expected = ClosedForms.DiracCombHalfTrace(d, strength, m, e, out var scale);
            var actual = 0.5 * transfer.Dispersion(e).Trace;
            // Phase Kd up to ~15 rad: 64 ε × (1 + Kd) relative to the largest term, as for Kronig–Penney.
            var phase = 1 + Math.Sqrt(m * Math.Abs(e) / ClosedForms.C) * d;
            var error = Math.Abs(actual - expected) / scale;
            worst = Math.Max(worst, error);
            Assert.True(error <= 64 * DoubleEpsilon * phase, $"E = {e:R}: D/2 = {actual:R}, closed form {expected:R}");
        }
        output.WriteLine($"Dirac comb D(E) vs Kittel/Griffiths (d={d}, P={p:G4}, m={m}): worst error {worst:E2} relative to the largest term");
    }
}
