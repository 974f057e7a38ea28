// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>Cells shared by the property tests (scenarios of our own; parameters are illustrative, not data).</summary>
internal static class Cells
{
    internal const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    /// <summary>Dirac comb with P = 3π/2, d = 1 nm, m = m0: P = m S d / (2 ħ²/2m0) (Kittel ch. 7 form).</summary>
    internal const double CombP = 3 * Math.PI / 2;

    internal static UnitCell DiracComb(double p = CombP, double period = 1.0, double mass = 1.0) =>
        UnitCell.DiracComb(Length.FromNanometres(period), p * 2 * C / (mass * period), EffectiveMass.FromElectronMasses(mass));

    /// <summary>A uniform medium: the free particle folded into the zone of period d (all gaps closed).</summary>
    internal static UnitCell Free(double period, double mass) =>
        UnitCell.Create(Layer.Create(Length.FromNanometres(period), default, EffectiveMass.FromElectronMasses(mass)));

    /// <summary>A well/barrier superlattice with different masses (BenDaniel–Duke matching matters).</summary>
    internal static UnitCell WellBarrier() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2),
        Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));

    /// <summary>A three-layer cell with a non-parabolic well, a delta barrier and a thick barrier.</summary>
    internal static UnitCell Mixed() => UnitCell.Create(
        Layer.Create(Length.FromNanometres(4), default, EffectiveMass.FromElectronMasses(0.067), 0.64),
        DeltaBarrier.Create(0.05),
        Layer.Create(Length.FromNanometres(1.5), Energy.FromElectronVolts(0.1), EffectiveMass.FromElectronMasses(0.08)),
        Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09)));

    internal static double RelativeError(double actual, double expected) => Math.Abs(actual - expected) / Math.Abs(expected);

    /// <summary>8th-order central first derivative (B. Fornberg, Math. Comp. 51, 699 (1988), coefficients from memory).</summary>
    internal static double FirstDerivative(Func<double, double> f, double x, double h)
    {
        double[] c = [4.0 / 5, -1.0 / 5, 4.0 / 105, -1.0 / 280];
        var sum = 0.0;
        for (var j = 1; j <= 4; j++)
        {
            sum += c[j - 1] * (f(x + j * h) - f(x - j * h));
        }
        return sum / h;
    }

    /// <summary>8th-order central second derivative (Fornberg 1988, coefficients from memory).</summary>
    internal static double SecondDerivative(Func<double, double> f, double x, double h)
    {
        double[] c = [8.0 / 5, -1.0 / 5, 8.0 / 315, -1.0 / 560];
        var f0 = f(x);
        var sum = 0.0;
        for (var j = 1; j <= 4; j++)
        {
            sum += c[j - 1] * (f(x + j * h) - 2 * f0 + f(x - j * h));
        }
        return sum / (h * h);
    }
}
