// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>Random stack parts for property tests (sizes typical of semiconductor heterostructures; demo values, not materials).</summary>
internal static class RandomStacks
{
    internal static double Between(this Random random, double a, double b) => a + (b - a) * random.NextDouble();

    internal static Layer Slab(double widthNm, double potentialEv, double mass) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), EffectiveMass.FromElectronMasses(mass));

    /// <summary>
    /// One to five parts: layers 0.3–8 nm, −0.1…0.8 eV, 0.04–0.15 m₀, a delta (−0.05…0.3 eV·nm) in about one element
    /// of five, and in about one part of three a two-element cell repeated 1 … <paramref name="maxRepeats"/> − 1 times.
    /// </summary>
    internal static List<StackPart> Parts(Random random, int maxRepeats)
    {
        CellElement Element() => random.Next(5) == 0
            ? DeltaBarrier.Create(random.Between(-0.05, 0.3))
            : Slab(random.Between(0.3, 8), random.Between(-0.1, 0.8), random.Between(0.04, 0.15));
        var parts = new List<StackPart>();
        var count = random.Next(1, 6);
        for (var i = 0; i < count; i++)
        {
            if (random.Next(3) == 0)
            {
                var cell = UnitCell.Create(Slab(random.Between(0.5, 6), random.Between(-0.1, 0.2), random.Between(0.04, 0.15)), Element());
                parts.Add(StackPart.Repeat(cell, random.Next(1, maxRepeats)));
            }
            else
            {
                parts.Add(Element());
            }
        }
        return parts;
    }
}
