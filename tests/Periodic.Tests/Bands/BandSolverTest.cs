// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed class BandSolverTest
{
    [Fact]
    public void Compute_LayerCell_IsExactAndMeetsKronigPenney()
    {
        // GaAs/AlGaAs-like Kronig–Penney cell (any values would do): well 5 nm 0.067 m0, barrier 2 nm 0.25 eV 0.092 m0.
        var cell = UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25),
            EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));
        var solution = BandSolver.Compute(cell, 3);
        Assert.Equal(BandSolverMethod.Exact, solution.Method);
        Assert.Null(solution.Refinement);
        Assert.Equal(0, solution.MaxDiscretisationErrorElectronVolts);
        Assert.True(solution.Converged);
        for (var n = 1; n <= 3; n++)
        {
            var band = solution.Structure.GetBand(n);
            foreach (var edge in new[] { band.BottomElectronVolts, band.TopElectronVolts })
            {
                // At an edge cos kd = ±1 (Kronig and Penney 1931, closed form in ClosedForms): |D/2| = 1 to the rounding of
                // the closed form, 1e-9 (the edge error bound ≤ 1e-12 eV times |dD/dE| ≲ 1e3 /eV is far smaller).
                var half = ClosedForms.KronigPenneyHalfTrace(5, 2, 0.25, 0.067, 0.092, edge, out var scale);
                Assert.True(Math.Abs(Math.Abs(half) - 1) <= 1e-9 * Math.Max(1, scale), $"band {n} edge {edge:R}: cos kd = {half:R}");
            }
        }
    }

    [Fact]
    public void Compute_CosineCell_IsSpectralAndMeetsMathieu()
    {
        // V0 cos(2πx/d) maps to Mathieu's equation (a = E/E_R, q = V0/(2E_R)); band n = [a_{n−1}, b_n] E_R
        // (Abramowitz and Stegun §20; values from the independent tridiagonal reference MathieuReference).
        var period = Length.FromNanometres(1);
        var mass = EffectiveMass.FreeElectron;
        var recoil = FourierSegment.RecoilEnergy(period, mass).ElectronVolts;
        const double q = 5;
        var cell = UnitCell.Create(FourierSegment.Cosine(period, Energy.FromElectronVolts(2 * q * recoil), mass));
        var solution = BandSolver.Compute(cell, 2);
        // One Fourier segment: the facade takes the plane-wave (spectral) edges, whose basis truncation is its
        // discretisation error.
        Assert.Equal(BandSolverMethod.Spectral, solution.Method);
        Assert.True(solution.Converged);
        Assert.True(solution.MaxDiscretisationErrorElectronVolts > 0, "a truncated basis has a discretisation error");
        Assert.NotNull(solution.Spectral);
        var reference = MathieuReference.BandEdges(2, q);
        for (var n = 1; n <= 2; n++)
        {
            var band = solution.Structure.GetBand(n);
            // The reported bound covers the true error (plus the reference's rounding, 1e-15 relative).
            Assert.True(Math.Abs(band.BottomElectronVolts - recoil * reference[2 * n - 2]) <= solution.MaxEdgeErrorElectronVolts + 1e-15 * recoil * Math.Abs(reference[2 * n - 2]));
            Assert.True(Math.Abs(band.TopElectronVolts - recoil * reference[2 * n - 1]) <= solution.MaxEdgeErrorElectronVolts + 1e-15 * recoil * Math.Abs(reference[2 * n - 1]));
        }
    }

    [Fact]
    public void Compute_RejectsACountOutOfRange()
    {
        var cell = UnitCell.Create(Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0), EffectiveMass.FreeElectron));
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => BandSolver.Compute(cell, 0));
        Assert.Equal("count", error.ParamName);
    }
}
