// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using FsCheck;
using FsCheck.Fluent;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>One element of a randomly drawn cell: a layer (width, potential, mass) or a delta (strength).</summary>
internal sealed record ElementSpec(bool IsDelta, double WidthNanometres, double PotentialElectronVolts, double MassElectronMasses, double StrengthElectronVoltNanometres)
{
    internal CellElement Build() => IsDelta
        ? DeltaBarrier.Create(StrengthElectronVoltNanometres)
        : Layer.Create(Length.FromNanometres(WidthNanometres), Energy.FromElectronVolts(PotentialElectronVolts), EffectiveMass.FromElectronMasses(MassElectronMasses));

    /// <summary>Lengths × s, energies × 1/s², delta strengths (eV·nm) × 1/s; masses unchanged.</summary>
    internal ElementSpec Scaled(double s) =>
        new(IsDelta, WidthNanometres * s, PotentialElectronVolts / (s * s), MassElectronMasses, StrengthElectronVoltNanometres / s);

    public override string ToString() => IsDelta
        ? string.Create(CultureInfo.InvariantCulture, $"delta({StrengthElectronVoltNanometres:R})")
        : string.Create(CultureInfo.InvariantCulture, $"layer({WidthNanometres:R} nm, {PotentialElectronVolts:R} eV, {MassElectronMasses:R} m0)");
}

/// <summary>A randomly drawn cell with a few probe energies.</summary>
internal sealed record CellSpec(ElementSpec[] Elements, double[] EnergiesElectronVolts)
{
    internal UnitCell Build() => UnitCell.Create(Elements.Select(e => e.Build()).ToArray());

    internal double MinimumPotential => Elements.Where(e => !e.IsDelta).Min(e => e.PotentialElectronVolts);

    internal double MaximumPotential => Elements.Where(e => !e.IsDelta).Max(e => e.PotentialElectronVolts);

    public override string ToString() =>
        "[" + string.Join(", ", Elements.Select(e => e.ToString())) + "] at E = " +
        string.Join(", ", EnergiesElectronVolts.Select(e => e.ToString("R", CultureInfo.InvariantCulture)));
}

/// <summary>FsCheck generators of random cells (sizes typical of semiconductor superlattices).</summary>
internal static class RandomCells
{
    /// <summary>Layers 0.01–2 nm wide, −0.3…0.7 eV, 0.05–1.5 m₀; deltas ±0.1 eV·nm in about one element of seven.</summary>
    internal static Gen<ElementSpec> Element { get; } =
        from kind in Gen.Choose(0, 6)
        from w in Gen.Choose(1, 200)
        from v in Gen.Choose(-300, 700)
        from m in Gen.Choose(5, 150)
        from s in Gen.Choose(-50, 50)
        select kind == 0
            ? new ElementSpec(true, 0, 0, 0, s * 0.002)
            : new ElementSpec(false, w * 0.01, v * 0.001, m * 0.01, 0);

    /// <summary>Cells of 1 to <paramref name="maxElements"/> elements, at least one of them a layer, with <paramref name="energies"/> probe energies from 0.2 eV below the lowest layer potential to 1 eV above the highest.</summary>
    internal static Gen<CellSpec> Cells(int maxElements, int energies) =>
        from n in Gen.Choose(1, maxElements)
        from elements in Gen.ArrayOf(Element, n)
        from first in Element.Where(e => !e.IsDelta)
        from fractions in Gen.ArrayOf(Gen.Choose(0, 1_000_000), energies)
        let cellElements = elements.Any(e => !e.IsDelta) ? elements : elements.Prepend(first).ToArray()
        let vMin = cellElements.Where(e => !e.IsDelta).Min(e => e.PotentialElectronVolts) - 0.2
        let vMax = cellElements.Where(e => !e.IsDelta).Max(e => e.PotentialElectronVolts) + 1.0
        select new CellSpec(cellElements, fractions.Select(f => vMin + (vMax - vMin) * (f + 0.5) / 1_000_001.0).ToArray());

    /// <summary>
    /// Runs <paramref name="property"/> on <paramref name="count"/> cells from <paramref name="gen"/> with a
    /// fixed FsCheck replay seed (reproducible runs); returns how many cells ran.
    /// </summary>
    internal static int Check(Gen<CellSpec> gen, int count, ulong seed, Action<CellSpec> property)
    {
        var ran = 0;
        var config = Config.QuickThrowOnFailure.WithMaxTest(count).WithReplay(seed, 0x9E3779B97F4A7C15UL).WithQuietOnSuccess(true);
        FsCheck.Check.One(config, Prop.ForAll(Arb.From(gen), (CellSpec spec) =>
        {
            Interlocked.Increment(ref ran);
            property(spec);
        }));
        return ran;
    }
}
