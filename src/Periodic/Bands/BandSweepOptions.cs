// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;

namespace Periodic.Bands;

/// <summary>
/// The band search's tolerances and the thread count of a sweep over many cells (<see cref="BandSweep.Compute"/>),
/// validated when created. Every default is a constant here; <see cref="Default"/> uses them all.
/// </summary>
public sealed class BandSweepOptions
{
    /// <summary>Default thread count: −1, all cores.</summary>
    public const int DefaultMaxDegreeOfParallelism = -1;

    private BandSweepOptions(BandSearchOptions? search, int maxDegreeOfParallelism)
    {
        Search = search;
        MaxDegreeOfParallelism = maxDegreeOfParallelism;
    }

    /// <summary>The defaults: each cell's own scaled search tolerances, all cores.</summary>
    public static BandSweepOptions Default { get; } = Create();

    /// <summary>
    /// Tolerances of each cell's band search; when null, each cell gets the defaults scaled to its energy scale, as in
    /// <see cref="BandStructure.Compute(UnitCell, int, BandSearchOptions?)"/>.
    /// </summary>
    public BandSearchOptions? Search { get; }

    /// <summary>Threads to use: −1 for all cores, 1 for serial, or any positive count. The results do not depend on it.</summary>
    public int MaxDegreeOfParallelism { get; }

    /// <summary>Creates options; every parameter left out takes its default.</summary>
    /// <param name="search">Each cell's band-search tolerances (null: scaled to each cell).</param>
    /// <param name="maxDegreeOfParallelism">−1 (all cores) or at least 1.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range (the message names it and the range).</exception>
    public static BandSweepOptions Create(BandSearchOptions? search = null, int maxDegreeOfParallelism = DefaultMaxDegreeOfParallelism)
    {
        if (maxDegreeOfParallelism == 0 || maxDegreeOfParallelism < -1)
        {
            throw new ArgumentOutOfRangeException(nameof(maxDegreeOfParallelism), maxDegreeOfParallelism,
                string.Create(CultureInfo.InvariantCulture, $"maxDegreeOfParallelism must be -1 (all cores) or at least 1; got {maxDegreeOfParallelism}."));
        }
        return new BandSweepOptions(search, maxDegreeOfParallelism);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"search {(Search is null ? "scaled to each cell" : Search.ToString())}, {(MaxDegreeOfParallelism == -1 ? "all cores" : $"{MaxDegreeOfParallelism} thread(s)")}");
}
