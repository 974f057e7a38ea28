// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.PlaneWaves;

public sealed class PlaneWaveSolverTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private static readonly Length Period = Length.FromNanometres(1);
    private static readonly double Recoil = FourierSegment.RecoilEnergy(Period, EffectiveMass.FreeElectron).ElectronVolts;

    [Fact]
    public void EnergiesAt_FreeParticle_IsFoldedParabola()
    {
        // Free-particle limit (docs/references.md): V = 0 gives E = C(k + G)²/m folded into the zone, exactly
        // (the matrix is diagonal). 1e-14 relative: rounding of the scaled eigensolve.
        var solver = PlaneWaveSolver.Create(Period, default, [0.0], [], EffectiveMass.FromElectronMasses(0.5));
        const double k = 1.1;
        var result = solver.EnergiesAt(k, 5);
        var expected = Enumerable.Range(-5, 11).Select(n => C * Math.Pow(k + 2 * Math.PI * n, 2) / 0.5).OrderBy(e => e).Take(5).ToArray();
        for (var i = 0; i < 5; i++)
        {
            Assert.Equal(expected[i], result.EnergiesElectronVolts[i], 1e-14 * expected[i]);
        }
        Assert.True(result.Converged);
    }

    [Fact]
    public void EnergiesAt_MathieuQ25_MatchesZhangJin()
    {
        // Zhang & Jin (1996) sample output, q = 25 [read]; zone centre gives a0 (band 1 bottom) and b2, a2;
        // the zone boundary b1, a1, b3. 1e-9 relative (the table's 9 decimals at |a| ≥ 3.5).
        var solver = PlaneWaveSolver.Create(FourierSegment.Cosine(Period, Energy.FromElectronVolts(50 * Recoil), EffectiveMass.FreeElectron));
        Assert.True(solver.IsRealSymmetric);
        var centre = solver.EnergiesAt(0, 3);
        var boundary = solver.EnergiesAt(Math.PI, 3);
        AssertRelative(-40.256779547, centre.EnergiesElectronVolts[0] / Recoil, 1e-9);
        AssertRelative(-21.314860622, centre.EnergiesElectronVolts[1] / Recoil, 1e-9);
        AssertRelative(-3.522164727, centre.EnergiesElectronVolts[2] / Recoil, 1e-9);
        AssertRelative(-40.256778985, boundary.EnergiesElectronVolts[0] / Recoil, 1e-9);
        AssertRelative(-21.314899691, boundary.EnergiesElectronVolts[1] / Recoil, 1e-9);
        AssertRelative(-3.520941527, boundary.EnergiesElectronVolts[2] / Recoil, 1e-9);
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(5.0)]
    [InlineData(25.0)]
    public void EnergiesAt_ReportedErrorBoundsTrueError(double q)
    {
        // Independent tridiagonal Mathieu reference (exact to rounding): the reported estimate must bound the
        // true error, with 1e-15 E_R slack for the reference's own rounding.
        var solver = PlaneWaveSolver.Create(FourierSegment.Cosine(Period, Energy.FromElectronVolts(2 * q * Recoil), EffectiveMass.FreeElectron));
        var centre = solver.EnergiesAt(0, 3, PlaneWaveOptions.Create(1e-10));
        double[] reference = [MathieuReference.A(0, q), MathieuReference.B(2, q), MathieuReference.A(2, q)];
        Assert.True(centre.BasisSize > 0);
        for (var i = 0; i < 3; i++)
        {
            var error = Math.Abs(centre.EnergiesElectronVolts[i] - reference[i] * Recoil);
            Assert.True(error <= centre.EstimatedErrorsElectronVolts[i] + 1e-15 * Recoil * Math.Max(1, Math.Abs(reference[i])),
                $"q = {q}, level {i}: true {error:G3} eV, reported {centre.EstimatedErrorsElectronVolts[i]:G3} eV");
        }
    }

    [Fact]
    public void EnergiesAt_SineLattice_UsesHermitianPathAndMatchesCosine()
    {
        // V0 sin(2πx/d) is a translated V0 cos(2πx/d): same energies at every k (exact symmetry). The sine form
        // makes the matrix complex Hermitian; agreement to 1e-11 relative to E_R (both converged to 1e-12).
        var cosine = PlaneWaveSolver.Create(Period, default, [0.7], [], EffectiveMass.FreeElectron);
        var sine = PlaneWaveSolver.Create(Period, default, [], [0.7], EffectiveMass.FreeElectron);
        Assert.False(sine.IsRealSymmetric);
        var a = cosine.EnergiesAt(1.3, 4);
        var b = sine.EnergiesAt(1.3, 4);
        for (var i = 0; i < 4; i++)
        {
            Assert.Equal(a.EnergiesElectronVolts[i], b.EnergiesElectronVolts[i], 1e-11 * Recoil);
        }
    }

    [Fact]
    public void EnergiesAt_IsPeriodicInK()
    {
        // Bloch energies are periodic in k with period 2π/d (Bloch's theorem); 1e-11 E_R for the basis truncation,
        // which is not symmetric under the shift.
        var solver = PlaneWaveSolver.Create(Period, Energy.FromElectronVolts(0.1), [0.4], [0.2], EffectiveMass.FreeElectron);
        var a = solver.EnergiesAt(0.4, 3);
        var b = solver.EnergiesAt(0.4 + 2 * Math.PI, 3);
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(a.EnergiesElectronVolts[i], b.EnergiesElectronVolts[i], 1e-11 * Recoil);
        }
    }

    [Fact]
    public void BadInput_NamesTheParameter()
    {
        var solver = PlaneWaveSolver.Create(Period, default, [0.4], [], EffectiveMass.FreeElectron);
        Assert.Equal("wavevectorPerNanometre", Assert.Throws<ArgumentOutOfRangeException>(() => solver.EnergiesAt(double.NaN, 2)).ParamName);
        Assert.Equal("bandCount", Assert.Throws<ArgumentOutOfRangeException>(() => solver.EnergiesAt(0, 0)).ParamName);
        Assert.Equal("relativeTolerance", Assert.Throws<ArgumentOutOfRangeException>(() => solver.EnergiesAt(0, 2, PlaneWaveOptions.Create(0.5))).ParamName);
        Assert.Equal("segment", Assert.Throws<ArgumentNullException>(() => PlaneWaveSolver.Create(null!)).ParamName);
        Assert.Equal("inverseMassConstantPerElectronMass", Assert.Throws<ArgumentOutOfRangeException>(
            () => PlaneWaveSolver.CreateWithInverseMass(Period, default, [0.4], [], 1.0, [2.0], [])).ParamName);
        Assert.Equal("inverseMassCosinePerElectronMass", Assert.Throws<ArgumentOutOfRangeException>(
            () => PlaneWaveSolver.CreateWithInverseMass(Period, default, [0.4], [], 1.0, [double.NaN], [])).ParamName);
        Assert.Contains("basis", solver.EnergiesAt(0, 2).ToString(), StringComparison.Ordinal);
    }

    private static void AssertRelative(double expected, double actual, double relative) =>
        Assert.True(Math.Abs(actual - expected) <= relative * Math.Abs(expected),
            $"expected {expected:R}, got {actual:R} (relative {Math.Abs(actual - expected) / Math.Abs(expected):G3})");
}
