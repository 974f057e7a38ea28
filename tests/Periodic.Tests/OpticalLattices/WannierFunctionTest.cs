// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using Periodic.Bands;
using Periodic.OpticalLattices;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.OpticalLattices;

public sealed class WannierFunctionTest(ITestOutputHelper output)
{
    private static readonly Length Wavelength = Length.FromNanometres(1064);

    private static OpticalLattice Lattice(double s) => OpticalLattice.Create(Wavelength, s, AtomicSpecies.Find("87Rb"));

    [Theory]
    [InlineData(1.0, 1)]
    [InlineData(5.0, 1)]
    [InlineData(30.0, 1)]
    [InlineData(5.0, 2)]
    [InlineData(12.0, 3)]
    public void Compute_IsNormalisedAndOrthogonalToItsTranslates(double s, int band)
    {
        // Wannier functions of one band form an orthonormal set (Kohn 1959; common practice, no single source).
        // Checked here from the grid values themselves: ∫w(x)w(x − nd)dx by the trapezoid rule on the periodic
        // supercell, which is exact for the band-limited w up to rounding. 1e-12: the goal; rounding of sums of
        // ~1e4 terms of size ≤ 1 is ~1e-14.
        var w = WannierFunction.Compute(Lattice(s).Cell, band);
        var values = w.Values.ToArray();
        var h = w.PositionsNanometres[1] - w.PositionsNanometres[0];
        var perSite = (int)Math.Round(w.PeriodNanometres / h);
        double norm = 0;
        var overlaps = new double[4];
        for (var p = 0; p < values.Length; p++)
        {
            norm += values[p] * values[p] * h;
            for (var n = 1; n <= 3; n++)
            {
                overlaps[n] += values[p] * values[(p + n * perSite) % values.Length] * h;
            }
        }
        var worst = overlaps.Max(Math.Abs);
        output.WriteLine($"s = {s}, band {band}: |norm − 1| = {Math.Abs(norm - 1):G3}, max overlap {worst:G3}, imaginary max {w.ImaginaryValues.Max(Math.Abs):G3}, tail {w.TailRatio:G3}, k-points {w.KPointCount}");
        Assert.True(Math.Abs(norm - 1) <= 1e-12);
        Assert.True(worst <= 1e-12);
        Assert.True(w.NormalisationError <= 1e-12 && w.MaxTranslateOverlap <= 1e-12);
        // A real potential has real Wannier functions (Marzari and Vanderbilt 1997): the imaginary part is rounding.
        Assert.True(w.ImaginaryValues.Max(Math.Abs) <= 1e-10 * values.Max(Math.Abs));
    }

    [Fact]
    public void Compute_LowestBandIsSymmetricAndCentredOnASite()
    {
        // Kohn (Phys. Rev. 115, 809 (1959)): for an inversion-symmetric lattice the lowest band's Wannier function is
        // even about a site (here x = 0, the potential minimum of s·sin²(πx/d)) and decays exponentially; band 2's is odd.
        // 1e-10 of the peak: rounding of the FFT grid.
        foreach (var band in new[] { 1, 2 })
        {
            var w = WannierFunction.Compute(Lattice(8).Cell, band);
            var values = w.Values.ToArray();
            var middle = values.Length / 2; // x = 0
            var peak = values.Max(Math.Abs);
            var sign = band == 1 ? 1 : -1;
            for (var p = 1; p < middle; p++)
            {
                Assert.True(Math.Abs(values[middle + p] - sign * values[middle - p]) <= 1e-10 * peak);
            }
            Assert.True(Math.Abs(w.CentreNanometres) <= 1e-10 * w.PeriodNanometres);
        }
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(10.0)]
    [InlineData(30.0)]
    public void Compute_HoppingAndOnSiteIntegral_MatchTransferMatrixWannier(double s)
    {
        // Independent second method: Bloch functions and E(k) from the transfer matrix (Magnus steps, 4096 per cell,
        // no plane waves), Kohn's gauge ψ_k(0) real and positive at the site x = 0, w = (1/N_k)Σψ_k, the integral by the
        // trapezoid rule on the supercell. 1e-8 relative is the goal; the Magnus error at 4096 steps is ~1e-12 of E_R
        // and nearly the same at every k, so it drops out of J.
        var lattice = Lattice(s);
        var production = WannierFunction.Compute(lattice.Cell, 1);
        var segment = (FourierSegment)lattice.Cell.Elements[0];
        var structure = BandStructure.Compute(UnitCell.Create(segment.WithStepCount(4096)), 2);
        var d = lattice.LatticePeriod.Nanometres;
        // Enough wavevectors that w has decayed below 1e-12 half a supercell away (it decays faster in deeper lattices).
        var kPoints = s < 5 ? 48 : 24;
        const int perSite = 64;
        var hopping = new double[3];
        var grid = Enumerable.Range(0, kPoints * perSite).Select(p => (p - kPoints * perSite / 2) * d / perSite).ToArray();
        var w = new Complex[grid.Length];
        var psi = new Complex[grid.Length];
        for (var j = 0; j < kPoints; j++)
        {
            var k = (-Math.PI + 2 * Math.PI * (j + 0.5) / kPoints) / d;
            var energy = structure.EnergyAt(1, k);
            for (var n = 1; n <= 3; n++)
            {
                hopping[n - 1] -= energy * Math.Cos(n * k * d) / kPoints;
            }
            BlochFunction.Create(structure, 1, k).Evaluate(grid, psi);
            for (var p = 0; p < grid.Length; p++)
            {
                w[p] += psi[p] / kPoints;
            }
        }
        var h = d / perSite;
        var integral = w.Sum(z => Math.Pow(z.Magnitude, 4)) * h;
        var recoil = lattice.RecoilEnergy.ElectronVolts;
        output.WriteLine($"s = {s}: J1 {production.HoppingElectronVolts[0] / recoil:G12} vs {hopping[0] / recoil:G12} E_R (rel {Rel(production.HoppingElectronVolts[0], hopping[0]):G3}); "
            + $"J2 rel {Rel(production.HoppingElectronVolts[1], hopping[1]):G3}; ∫|w|⁴ {production.OnSiteIntegralPerNanometre:G12} vs {integral:G12} (rel {Rel(production.OnSiteIntegralPerNanometre, integral):G3})");
        Assert.True(Rel(production.HoppingElectronVolts[0], hopping[0]) <= 1e-8);
        Assert.True(Rel(production.OnSiteIntegralPerNanometre, integral) <= 1e-8);
        // J2 is 1e-2 … 1e-4 of J1: compared to 1e-8 of J1.
        Assert.True(Math.Abs(production.HoppingElectronVolts[1] - hopping[1]) <= 1e-8 * hopping[0]);
        Assert.True(hopping[0] > 0 && production.HoppingElectronVolts[0] > 0); // J1 > 0 for the lowest band (sign convention)
    }

    private static double Rel(double a, double b) => Math.Abs(a - b) / Math.Abs(b);

    [Fact]
    public void Compute_DeepLattice_ApproachesAsymptoticHopping()
    {
        // Deep-lattice limit (Zwerger, J. Opt. B 5, S9 (2003); REFERENCES.md, read in secondary texts):
        // J/E_R ≈ (4/√π) s^{3/4} e^{−2√s}, an asymptotic form whose error falls only like 1/√s (about 8 % at s = 40,
        // REFERENCES.md). Checked as a limit: the deviation shrinks with depth and is below 15 % at s = 40.
        var deviations = new[] { 10.0, 20.0, 40.0 }.Select(s =>
        {
            var lattice = Lattice(s);
            var j = lattice.ToRecoilEnergies(WannierFunction.Compute(lattice.Cell, 1).HoppingElectronVolts[0]);
            var asymptotic = 4 / Math.Sqrt(Math.PI) * Math.Pow(s, 0.75) * Math.Exp(-2 * Math.Sqrt(s));
            output.WriteLine($"s = {s}: J = {j:G8} E_R, asymptotic {asymptotic:G8}, ratio {asymptotic / j:G6}");
            return Math.Abs(asymptotic / j - 1);
        }).ToArray();
        Assert.True(deviations[0] > deviations[1] && deviations[1] > deviations[2]);
        Assert.True(deviations[2] < 0.15);
    }

    [Fact]
    public void Compute_OneBandWithClosedGap_IsRefused()
    {
        // λ₂ = 2λ: the cell holds two sites and, with s₂ = 0, the lowest band of one site folds into bands 1 and 2
        // of the cell with the gap between them exactly closed (zone folding; common practice, no single source).
        var folded = Lattice(4).WithSecondWave(Length.FromNanometres(2 * 1064), 0, 0);
        var error = Assert.Throws<ArgumentException>(() => WannierFunction.Compute(folded.Cell, 1));
        Assert.Equal("bandIndex", error.ParamName);
        Assert.Contains("not isolated", error.Message, StringComparison.Ordinal);
    }
}
