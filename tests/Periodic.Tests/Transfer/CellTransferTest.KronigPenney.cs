// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Transfer;

public sealed partial class CellTransferTest(ITestOutputHelper output)
{
    private const double DoubleEpsilon = 2.220446049250313e-16;

    /// <summary>
    /// Kronig–Penney cells (well a, barrier b, V0, well mass, barrier mass): a GaAs/Al0.3Ga0.7As-like
    /// superlattice (masses 0.067 / 0.092 m0, Vurgaftman et al. 2001 from memory; any values would do),
    /// a strongly unequal-mass cell, a light-well heavy-barrier cell and a thick-barrier cell.
    /// </summary>
    public static TheoryData<double, double, double, double, double> KronigPenneyCells => new()
    {
        { 5.0, 2.0, 0.25, 0.067, 0.092 },
        { 1.0, 0.5, 2.0, 1.0, 0.3 },
        { 0.3, 3.0, 0.1, 0.2, 0.8 },
        { 4.0, 8.0, 0.4, 0.067, 0.09 },
    };

    private static UnitCell KronigPenney(double a, double b, double v0, double mw, double mb) =>
        UnitCell.KronigPenney(Length.FromNanometres(a), Length.FromNanometres(b), Energy.FromElectronVolts(v0),
            EffectiveMass.FromElectronMasses(mw), EffectiveMass.FromElectronMasses(mb));

    /// <summary>Energies from −V0/2 to 4 V0, avoiding the removable singularities of the closed form at 0 and V0.</summary>
    private static IEnumerable<double> ProbeEnergies(double v0, int count)
    {
        for (var i = 0; i < count; i++)
        {
            var e = v0 * (-0.5 + 4.5 * (i + 0.5) / count);
            if (Math.Abs(e) > 1e-6 * v0 && Math.Abs(e - v0) > 1e-6 * v0)
            {
                yield return e;
            }
        }
    }

    [Theory]
    [MemberData(nameof(KronigPenneyCells))]
    public void Dispersion_KronigPenney_MatchesClosedForm(double a, double b, double v0, double mw, double mb)
    {
        var transfer = CellTransfer.Create(KronigPenney(a, b, v0, mw, mb));
        var worst = 0.0;
        var count = 0;
        foreach (var e in ProbeEnergies(v0, 3000))
        {
            var expected = ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e, out var scale);
            var actual = 0.5 * transfer.Dispersion(e).Trace;
            // Rounding scale of cos kd: the magnitude of the largest term of the closed form. Both sides
            // round the phases k·w (up to ~20 rad here) and the products once or twice: allow 64 ε times the
            // phase-weighted scale, i.e. about 1e-13 relative to the terms.
            var phase = 1 + Math.Sqrt(mw * Math.Abs(e) / ClosedForms.C) * a + Math.Sqrt(mb * Math.Abs(e - v0) / ClosedForms.C) * b;
            var error = Math.Abs(actual - expected) / scale;
            worst = Math.Max(worst, error);
            Assert.True(error <= 64 * DoubleEpsilon * phase, $"E = {e:R}: D/2 = {actual:R}, closed form {expected:R}, relative error {error:E2}");
            count++;
        }
        output.WriteLine($"KP D(E) vs closed form (a={a}, b={b}, V0={v0}, mw={mw}, mb={mb}): {count} energies, worst error {worst:E2} relative to the largest term");
    }

    [Theory]
    [MemberData(nameof(KronigPenneyCells))]
    public void Dispersion_KronigPenneyDerivative_MatchesComplexStepOfClosedForm(double a, double b, double v0, double mw, double mb)
    {
        var transfer = CellTransfer.Create(KronigPenney(a, b, v0, mw, mb));
        var worst = 0.0;
        var count = 0;
        foreach (var e in ProbeEnergies(v0, 1000))
        {
            if (Math.Abs(e) < 1e-3 * v0 || Math.Abs(e - v0) < 1e-3 * v0)
            {
                continue; // dk/dE diverges at the band-edge energies of each layer; the bound below uses it
            }
            var expected = 2 * ClosedForms.ComplexStepDerivative(z => ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, z), e);
            ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e, out var scale);
            var actual = transfer.Dispersion(e).TraceDerivativePerElectronVolt;
            // Scale of dD/dE: the terms times the rate of change of the phases, (a·kw + b·kb)/(2|E − V|) per eV.
            var rate = Math.Sqrt(mw * Math.Abs(e) / ClosedForms.C) * a / (2 * Math.Abs(e))
                + Math.Sqrt(mb * Math.Abs(e - v0) / ClosedForms.C) * b / (2 * Math.Abs(e - v0));
            var derivativeScale = 2 * scale * (rate + 1 / Math.Abs(e) + 1 / Math.Abs(e - v0));
            var error = Math.Abs(actual - expected) / derivativeScale;
            worst = Math.Max(worst, error);
            // The complex step is exact to O(h²) = 1e-40; both sides round a few dozen operations.
            Assert.True(error <= 1e-13, $"E = {e:R}: dD/dE = {actual:R}, complex step {expected:R}, relative error {error:E2}");
            count++;
        }
        output.WriteLine($"KP dD/dE vs complex-step derivative (a={a}, b={b}): {count} energies, worst error {worst:E2} relative to the derivative scale");
    }

    [Fact]
    public void ComplexClosedForm_AgreesWithRealPublishedForms()
    {
        // Self-check of the reference helper: the complex continuation equals both published real forms.
        foreach (var e in new[] { -0.07, 0.031, 0.2, 0.26, 0.9 })
        {
            var real = ClosedForms.KronigPenneyHalfTrace(5, 2, 0.25, 0.067, 0.092, e, out var scale);
            var complex = ClosedForms.KronigPenneyHalfTrace(5, 2, 0.25, 0.067, 0.092, new Complex(e, 0));
            Assert.Equal(real, complex.Real, 1e-13 * scale);
        }
    }

    [Theory]
    [MemberData(nameof(KronigPenneyCells))]
    public void Wavevector_KronigPenney_ReproducesClosedFormInBandsAndGaps(double a, double b, double v0, double mw, double mb)
    {
        // Bloch: cos kd = D/2 with complex k = k_r + iκ: inside a band cos(k_r d) = D/2; in a gap
        // Re k = 0 (D/2 > 1) or π/d (D/2 < −1) and cosh(κd) = |D/2| (Kittel ch. 7, complex k in gaps).
        var transfer = CellTransfer.Create(KronigPenney(a, b, v0, mw, mb));
        var d = a + b;
        var worst = 0.0;
        foreach (var e in ProbeEnergies(v0, 500))
        {
            var expected = ClosedForms.KronigPenneyHalfTrace(a, b, v0, mw, mb, e, out var scale);
            var k = transfer.Dispersion(e).Wavevector;
            Assert.True(double.IsFinite(k.RealPerNanometre) && double.IsFinite(k.ImaginaryPerNanometre));
            Assert.InRange(k.RealPerNanometre, 0, Math.PI / d);
            Assert.True(k.ImaginaryPerNanometre >= 0);
            double reconstructed;
            if (k.IsPropagating)
            {
                reconstructed = Math.Cos(k.RealPerNanometre * d);
            }
            else
            {
                Assert.True(k.RealPerNanometre == 0 || k.RealPerNanometre == Math.PI / d);
                reconstructed = (k.RealPerNanometre == 0 ? 1 : -1) * Math.Cosh(k.ImaginaryPerNanometre * d);
            }
            // Same rounding scale as the D test, plus the rounding of acos/acosh and cos/cosh (a few ε relative).
            var error = Math.Abs(reconstructed - expected) / scale;
            worst = Math.Max(worst, error);
            Assert.True(error <= 1e-12, $"E = {e:R}: k = {k}, cos kd from k = {reconstructed:R}, closed form {expected:R}");
        }
        output.WriteLine($"KP k(E) vs closed form (a={a}, b={b}): worst error {worst:E2}");
    }
}
