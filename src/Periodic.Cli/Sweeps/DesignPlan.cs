// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Text.Json.Nodes;

namespace Periodic.Cli.Sweeps;

/// <summary>
/// Which parameter values design number i takes: a full grid (the last parameter varies fastest) or a seeded
/// quasi-random set that fills the parameter box evenly (a Halton sequence with a seeded Cranley–Patterson shift).
/// </summary>
/// <remarks>
/// The quasi-random design is the Halton sequence (J. H. Halton, Numer. Math. 2, 84 (1960)): coordinate j of point i
/// is the radical inverse of i in the j-th prime base, counting from i = 0 so that the first b^m points of base b are
/// exactly the multiples of b^-m (the origin is no corner once shifted). Each coordinate is then shifted by a seeded random
/// amount modulo 1 (R. Cranley and T. N. L. Patterson, SIAM J. Numer. Anal. 13, 904 (1976)), so different seeds give
/// different, equally even designs. No quasi-random package is served by the registry this project builds from, and
/// the definition is a few lines, so it lives here (tested against its definition and its stratification property).
/// </remarks>
internal sealed class DesignPlan
{
    /// <summary>Most quasi-random dimensions: the Halton sequence in high prime bases fills the box poorly.</summary>
    public const int MaximumQuasiRandomParameters = 12;

    private static readonly int[] Primes = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37];

    private readonly IReadOnlyList<SweepParameter> _parameters;
    private readonly int[] _gridSizes;
    private readonly double[] _shifts;

    private DesignPlan(IReadOnlyList<SweepParameter> parameters, bool quasiRandom, int count, int seed, int[] gridSizes, double[] shifts)
    {
        _parameters = parameters;
        IsQuasiRandom = quasiRandom;
        Count = count;
        Seed = seed;
        _gridSizes = gridSizes;
        _shifts = shifts;
    }

    /// <summary>True for a quasi-random design, false for a grid.</summary>
    public bool IsQuasiRandom { get; }

    /// <summary>Number of designs.</summary>
    public int Count { get; }

    /// <summary>The seed of a quasi-random design (0 for a grid).</summary>
    public int Seed { get; }

    /// <summary>Writes the parameter values of design <paramref name="index"/> into <paramref name="values"/>.</summary>
    public void Values(int index, Span<double> values)
    {
        if (IsQuasiRandom)
        {
            for (var j = 0; j < _parameters.Count; j++)
            {
                var u = RadicalInverse(index, Primes[j]) + _shifts[j];
                u -= Math.Floor(u);
                var (from, to) = _parameters[j].Range!.Value;
                values[j] = from + (to - from) * u;
            }
            return;
        }
        var rest = index;
        for (var j = _parameters.Count - 1; j >= 0; j--)
        {
            var k = rest % _gridSizes[j];
            rest /= _gridSizes[j];
            values[j] = GridValue(_parameters[j], k);
        }
    }

    /// <summary>The radical inverse of <paramref name="n"/> in <paramref name="radix"/>: its digits mirrored about the point.</summary>
    public static double RadicalInverse(int n, int radix)
    {
        double inverse = 0, scale = 1.0 / radix;
        while (n > 0)
        {
            inverse += (n % radix) * scale;
            n /= radix;
            scale /= radix;
        }
        return inverse;
    }

    private static double GridValue(SweepParameter parameter, int k)
    {
        if (parameter.Values is { } list)
        {
            return list[k];
        }
        var (from, to) = parameter.Range!.Value;
        var n = parameter.Count!.Value;
        // Ends exact, interior points by the same affine formula as the tool's energy grids.
        return k == n - 1 ? to : from + (to - from) * k / (n - 1);
    }

    /// <summary>Reads <c>"design"</c>: absent or "grid", or {"quasiRandom": N, "seed": S}.</summary>
    public static DesignPlan Read(string path, JsonNode? node, IReadOnlyList<SweepParameter> parameters)
    {
        if (node is null || (node is JsonValue v && v.TryGetValue<string>(out var word) && word == "grid"))
        {
            var sizes = new int[parameters.Count];
            long total = 1;
            for (var j = 0; j < parameters.Count; j++)
            {
                var p = parameters[j];
                sizes[j] = p.Values?.Length ?? p.Count
                    ?? throw SweepSpec.Bad(path, string.Create(CultureInfo.InvariantCulture, $"parameters[{j}].count"), "is required for a range in a grid design (or give \"values\").");
                total *= sizes[j];
                if (total > SweepSpec.MaximumDesigns)
                {
                    throw SweepSpec.Bad(path, "parameters", string.Create(CultureInfo.InvariantCulture,
                        $"make a grid of more than {SweepSpec.MaximumDesigns} designs; split the sweep or use a quasi-random design."));
                }
            }
            return new DesignPlan(parameters, false, (int)total, 0, sizes, []);
        }
        if (node is not JsonObject obj)
        {
            throw SweepSpec.Bad(path, "design", $"must be \"grid\" or {{\"quasiRandom\": N, \"seed\": S}}; got {node.ToJsonString()}.");
        }
        foreach (var (name, _) in obj)
        {
            if (name is not ("quasiRandom" or "seed"))
            {
                throw SweepSpec.Bad(path, $"design.{name}", "is not a design field; allowed: quasiRandom, seed.");
            }
        }
        var count = obj["quasiRandom"] is JsonValue c && c.TryGetValue<int>(out var n) && n is >= 1 and <= SweepSpec.MaximumDesigns ? n
            : throw SweepSpec.Bad(path, "design.quasiRandom", string.Create(CultureInfo.InvariantCulture, $"must be a whole number of designs from 1 to {SweepSpec.MaximumDesigns}."));
        var seed = obj["seed"] is JsonValue s && s.TryGetValue<int>(out var seedValue) && seedValue >= 0 ? seedValue
            : throw SweepSpec.Bad(path, "design.seed", "is required for a quasi-random design: a whole number ≥ 0 (the same seed gives the same designs).");
        if (parameters.Count > MaximumQuasiRandomParameters)
        {
            throw SweepSpec.Bad(path, "parameters", string.Create(CultureInfo.InvariantCulture, $"vary {parameters.Count} fields; a quasi-random design takes at most {MaximumQuasiRandomParameters}."));
        }
        for (var j = 0; j < parameters.Count; j++)
        {
            if (parameters[j].Range is null)
            {
                throw SweepSpec.Bad(path, string.Create(CultureInfo.InvariantCulture, $"parameters[{j}]"), "needs \"from\" and \"to\" in a quasi-random design (a list of values has no box to fill).");
            }
        }
        var shifts = new double[parameters.Count];
        var state = (ulong)seed;
        for (var j = 0; j < shifts.Length; j++)
        {
            shifts[j] = (SplitMix64(ref state) >> 11) * (1.0 / (1UL << 53));
        }
        return new DesignPlan(parameters, true, count, seed, [], shifts);
    }

    /// <summary>SplitMix64 (G. Steele, D. Lea, C. Flood, OOPSLA 2014): a fixed, documented generator, so a seed gives the same design on every .NET version.</summary>
    private static ulong SplitMix64(ref ulong state)
    {
        var z = state += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
