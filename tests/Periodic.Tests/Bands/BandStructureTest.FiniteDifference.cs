// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;

namespace Periodic.Tests.Bands;

public sealed partial class BandStructureTest
{
    /// <summary>A random cell of 2–4 layers (and sometimes a delta) whose widths are multiples of 0.25 nm, from a fixed seed.</summary>
    private static ElementSpec[] RandomGridCell(Random random)
    {
        var elements = new List<ElementSpec>();
        var layers = random.Next(2, 5);
        for (var i = 0; i < layers; i++)
        {
            if (random.Next(4) == 0)
            {
                elements.Add(new ElementSpec(true, 0, 0, 0, Math.Round(random.NextDouble() * 0.2 - 0.1, 3)));
            }
            elements.Add(new ElementSpec(false, 0.25 * random.Next(1, 9), Math.Round(random.NextDouble() * 0.5, 3), Math.Round(0.05 + random.NextDouble(), 3), 0));
        }
        return elements.ToArray();
    }

    [Fact]
    public void FiniteDifference_RandomCells_EigenvalueCountEqualsOscillationCount()
    {
        // Periodic eigenvalues are the k = 0 edges and antiperiodic ones the k = π/d edges (Magnus & Winkler,
        // Hill's Equation; docs/references.md), so #(periodic below E) + #(antiperiodic below E) = number of band
        // edges below E. Counted here with an independent finite-difference Hamiltonian (MathNet EVD).
        // Energies are taken midway between consecutive FD eigenvalues, only where both neighbours are
        // farther away than 10× the FD error estimated by Richardson (|λ_h − λ_2h|/3 for a second-order scheme).
        const int cells = 16, edgesChecked = 10;
        var random = new Random(20261201);
        var checks = 0;
        for (var trial = 0; trial < cells; trial++)
        {
            var spec = RandomGridCell(random);
            var cell = new CellSpec(spec, []).Build();
            var transfer = Periodic.Transfer.CellTransfer.Create(cell);
            var units = (int)Math.Round(spec.Sum(e => e.WidthNanometres) / 0.25);
            var refine = Math.Max(1, 80 / units); // about 160 nodes on the fine grid: fast, and the FD error is estimated anyway
            var fine = 0.25 / (2 * refine);
            var coarse = 0.25 / refine;
            var fd = Merge(FiniteDifference.Eigenvalues(spec, fine, false), FiniteDifference.Eigenvalues(spec, fine, true), edgesChecked + 1);
            var fdCoarse = Merge(FiniteDifference.Eigenvalues(spec, coarse, false), FiniteDifference.Eigenvalues(spec, coarse, true), edgesChecked + 1);
            for (var i = 0; i < edgesChecked; i++)
            {
                var error = Math.Max(Math.Abs(fd[i] - fdCoarse[i]), Math.Abs(fd[i + 1] - fdCoarse[i + 1])) / 3;
                if (fd[i + 1] - fd[i] <= 20 * error)
                {
                    continue; // a closed or nearly closed gap: the FD cannot place E between the edges reliably
                }
                var e = 0.5 * (fd[i] + fd[i + 1]);
                Assert.True(transfer.CountBandEdgesBelow(e) == i + 1,
                    $"{new CellSpec(spec, [])}: at E = {e:R} eV the FD counts {i + 1} edges below, the oscillation count {transfer.CountBandEdgesBelow(e)}");
                checks++;
            }
        }
        Assert.True(checks > cells * edgesChecked / 2, $"only {checks} energies were far enough from FD eigenvalues to check");
        output.WriteLine($"FD eigenvalue count vs oscillation count: {cells} random cells, {checks} energies, all equal");

        static double[] Merge(double[] periodic, double[] antiperiodic, int count) =>
            periodic.Take(count).Concat(antiperiodic.Take(count)).Order().Take(count).ToArray();
    }

    [Fact]
    public void FiniteDifference_Eigenvalues_ConvergeToBandEdgesAtSecondOrder()
    {
        // The FD periodic/antiperiodic eigenvalues approach the k = 0 / k = π/d band edges with error ∝ h²
        // (second-order scheme): halving h divides the error by ≈ 4, and one Richardson step
        // (4λ_{h/2} − λ_h)/3 removes the h² term.
        var spec = new[]
        {
            new ElementSpec(false, 2.0, 0.0, 0.067, 0),
            new ElementSpec(false, 1.5, 0.3, 0.092, 0),
            new ElementSpec(true, 0, 0, 0, 0.02),
            new ElementSpec(false, 0.5, 0.1, 0.08, 0),
        };
        var bands = BandStructure.Compute(new CellSpec(spec, []).Build(), 3);
        var edges = Edges(bands).Take(6).ToArray();
        var worstRichardson = 0.0;
        var worstRatio = double.PositiveInfinity;
        var worstFine = 0.0;
        double[] EdgesAt(double h) =>
            FiniteDifference.Eigenvalues(spec, h, false).Take(6).Concat(FiniteDifference.Eigenvalues(spec, h, true).Take(6)).Order().Take(6).ToArray();
        var e1 = EdgesAt(0.025);
        var e2 = EdgesAt(0.0125);
        for (var i = 0; i < edges.Length; i++)
        {
            var error1 = Math.Abs(e1[i] - edges[i]);
            var error2 = Math.Abs(e2[i] - edges[i]);
            var ratio = error1 / error2;
            var richardson = Math.Abs((4 * e2[i] - e1[i]) / 3 - edges[i]) / edges[i];
            worstRatio = Math.Min(worstRatio, ratio);
            worstFine = Math.Max(worstFine, error2 / edges[i]);
            worstRichardson = Math.Max(worstRichardson, richardson);
            // Observed order between 1.6 and 2.4 (ratio 3 to 5.3): second order with interfaces on nodes.
            Assert.InRange(ratio, 3.0, 5.3);
            // h = 0.0125 nm, edges up to k ≈ 3π/d: (kh)²/12 ≈ 1e-5 relative at h, the Richardson remainder
            // O(h⁴) and interface terms stay far below 1e-5.
            Assert.True(error2 / edges[i] < 1e-4, $"edge {i}: FD {e2[i]:R}, band finder {edges[i]:R}");
            Assert.True(richardson < 1e-5, $"edge {i}: Richardson {(4 * e2[i] - e1[i]) / 3:R}, band finder {edges[i]:R}");
        }
        output.WriteLine($"FD convergence: worst relative error at h = 0.0125 nm {worstFine:E2}, worst error ratio for h/2 {worstRatio:F3} (4 = second order), worst Richardson-extrapolated relative error {worstRichardson:E2}");
    }
}
