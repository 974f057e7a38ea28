// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using FsCheck;
using FsCheck.Fluent;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    /// <summary>Size of the reference suite: ten thousand random two-layer cells per run.</summary>
    private const int ReferenceSuiteCells = 10_000;

    [Fact]
    public void Compute_TenThousandKronigPenneyCells_MatchTheClosedForm()
    {
        // Independent reference: the Kronig–Penney dispersion relation with BenDaniel–Duke matching
        // (Kronig & Penney, Proc. R. Soc. A 130, 499 (1931); BenDaniel & Duke, Phys. Rev. 152, 683 (1966)), written out in
        // ClosedForms without the library. For each random cell (well 0.5–20 nm, barrier 0.2–10 nm, height 0.01–1 eV,
        // masses 0.03–1 m0; fixed seed) the first three bands must
        //  (a) have edges where the closed form's half trace D = ±1, with D = +1 at the bottom of band 1 and the pattern
        //      +1, −1 | −1, +1 | +1, −1 of a symmetric cell (Bloch phase 0 or π at the edges: Kohn, Phys. Rev. 115, 809 (1959));
        //  (b) be the only energies with |D| ≤ 1 below the top of band 3: on a 64-point grid, |D| ≤ 1 exactly inside a band
        //      (the band count by the closed form, a second method for the oscillation count).
        // Tolerances: D at an edge within 1e-7 × the closed form's term scale (the edge error bound, at most ~1e-12 eV,
        // times dD/dE, with margin for the closed form's own rounding); grid points within 1e-9 eV of an edge are skipped.
        var gen =
            from a in Gen.Choose(50, 2000)
            from b in Gen.Choose(20, 1000)
            from v in Gen.Choose(10, 1000)
            from mw in Gen.Choose(3, 100)
            from mb in Gen.Choose(3, 100)
            select (A: a * 0.01, B: b * 0.01, V: v * 0.001, Mw: mw * 0.01, Mb: mb * 0.01);
        var ran = 0;
        var worst = 0.0;
        var config = Config.QuickThrowOnFailure.WithMaxTest(ReferenceSuiteCells).WithReplay(20261203UL, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), p =>
        {
            Interlocked.Increment(ref ran);
            var cell = UnitCell.KronigPenney(Length.FromNanometres(p.A), Length.FromNanometres(p.B), Energy.FromElectronVolts(p.V),
                EffectiveMass.FromElectronMasses(p.Mw), EffectiveMass.FromElectronMasses(p.Mb));
            var bands = BandStructure.Compute(cell, 3).Bands;
            double D(double e, out double scale) => ClosedForms.KronigPenneyHalfTrace(p.A, p.B, p.V, p.Mw, p.Mb, e, out scale);
            var expected = new[] { 1.0, -1.0, -1.0, 1.0, 1.0, -1.0 };
            var edges = new List<double>();
            for (var n = 0; n < 3; n++)
            {
                edges.Add(bands[n].BottomElectronVolts);
                edges.Add(bands[n].TopElectronVolts);
            }
            for (var i = 0; i < edges.Count; i++)
            {
                var e = edges[i];
                if (e == 0 || e == p.V)
                {
                    continue; // removable singularities of the closed form
                }
                var d = D(e, out var scale);
                var deviation = Math.Abs(d - expected[i]) / Math.Max(1, scale);
                worst = Math.Max(worst, deviation);
                Assert.True(deviation <= 1e-7, $"cell {p}: edge {i} at {e:R} eV has D = {d:R}, expected {expected[i]}");
            }
            var top = edges[^1];
            var bottom = Math.Min(0, edges[0]) - 0.01;
            for (var j = 1; j < 64; j++)
            {
                var e = bottom + (top - bottom) * j / 64.0;
                if (e == 0 || e == p.V || edges.Any(x => Math.Abs(x - e) < 1e-9))
                {
                    continue;
                }
                var inside = Enumerable.Range(0, 3).Any(n => e >= bands[n].BottomElectronVolts && e <= bands[n].TopElectronVolts);
                var allowed = Math.Abs(D(e, out _)) <= 1;
                Assert.True(inside == allowed, $"cell {p}: at {e:R} eV the closed form says {(allowed ? "band" : "gap")}, the finder {(inside ? "band" : "gap")}");
            }
        }));
        Assert.Equal(ReferenceSuiteCells, ran);
        output.WriteLine($"reference suite: {ran} Kronig-Penney cells, worst scaled |D - (+-1)| at an edge {worst:E2}");
    }
}
