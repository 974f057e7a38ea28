// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Transfer;

namespace Periodic.Bands;

public sealed partial class BandStructure
{
    /// <summary>
    /// A band structure whose edges were computed by another method (the plane-wave path for Fourier-series cells),
    /// with <paramref name="transfer"/> serving E(k), k(E) and the oscillation count. Edge i (0 … 2·count) is the
    /// bottom of band i/2 + 1 for even i and the top of band (i + 1)/2 for odd i; the extra last edge is the
    /// bottom of band count + 1. The oscillation count is checked at the middle of every resolved band and gap,
    /// so edges that disagree with the transfer matrix fail as they would from the edge finder.
    /// </summary>
    /// <exception cref="BandSearchException">The edges are out of order by more than their errors, or an oscillation count disagrees.</exception>
    internal static BandStructure FromEdges(CellTransfer transfer, ReadOnlySpan<double> edges, ReadOnlySpan<double> errors)
    {
        var count = (edges.Length - 1) / 2;
        var e = edges.ToArray();
        var err = errors.ToArray();
        for (var i = 0; i + 1 < e.Length; i++)
        {
            if (e[i + 1] >= e[i])
            {
                continue;
            }
            // Two edges in the wrong order by less than their errors: a band or gap narrower than the rounding
            // level. They are one edge within that level; say so in the error rather than report a negative width.
            if (e[i] - e[i + 1] > err[i] + err[i + 1])
            {
                throw new BandSearchException(FormattableString.Invariant(
                    $"the spectral band edges {i} and {i + 1} are out of order ({e[i]:R} > {e[i + 1]:R} eV) by more than their errors."));
            }
            var middle = 0.5 * (e[i] + e[i + 1]);
            var error = Math.Max(err[i], err[i + 1]) + 0.5 * (e[i] - e[i + 1]);
            e[i] = e[i + 1] = middle;
            err[i] = err[i + 1] = error;
        }
        var bands = new Band[count];
        var gaps = new Gap[count];
        for (var n = 1; n <= count; n++)
        {
            double bottom = e[2 * n - 2], top = e[2 * n - 1], next = e[2 * n];
            var closed = next - top <= err[2 * n - 1] + err[2 * n];
            bands[n - 1] = new Band(n, bottom, top, err[2 * n - 2], err[2 * n - 1], next - top);
            gaps[n - 1] = new Gap(n, top, next, closed);
        }
        var checks = Reconcile(transfer, bands, gaps);
        return new BandStructure(transfer, bands, gaps, DefaultOptionsFor(transfer), checks);
    }

    /// <summary>
    /// The largest of <paramref name="edgeErrors"/> relative to max(|E|, <paramref name="scale"/>): entry 2(n − 1) is the
    /// error of band n's bottom, entry 2n − 1 of its top (the layout of the refined and spectral results).
    /// </summary>
    internal double MaxRelativeEdgeError(IReadOnlyList<double> edgeErrors, double scale)
    {
        var max = 0.0;
        for (var i = 0; i < edgeErrors.Count; i++)
        {
            var band = _bands[i / 2];
            var e = i % 2 == 0 ? band.BottomElectronVolts : band.TopElectronVolts;
            max = Math.Max(max, edgeErrors[i] / Math.Max(Math.Abs(e), scale));
        }
        return max;
    }
}
