// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Units;

namespace Periodic.Tests.Materials;

public sealed class BandOffsetTest
{
    [Theory]
    [InlineData(0.1, 0.0)]
    [InlineData(0.2, 77.0)]
    [InlineData(0.3, 77.0)]
    [InlineData(0.3, 300.0)]
    [InlineData(0.4, 300.0)]
    public void GaAsAlGaAs_ConductionShare_InCommonPracticeRange(double x, double temperatureKelvin)
    {
        // GaAs/AlxGa1-xAs (direct range x < 0.45): ΔEc/ΔEg ≈ 0.60–0.67 (common practice, no single source).
        var offset = BandOffset.Between(Material.GaAs, TernaryAlloy.AlGaAs.At(x), Temperature.FromKelvin(temperatureKelvin));
        Assert.InRange(offset.ConductionShare, 0.60, 0.67);
        Assert.True(offset.ConductionElectronVolts > 0 && offset.ValenceElectronVolts < 0); // type I
    }

    [Fact]
    public void Between_StepsAddUpToGapDifference()
    {
        // ΔEc − ΔEv = ΔEg by definition (E_c = E_v + Eg); tolerance 1e-15 eV (two roundings).
        var o = Material.InP.OffsetTo(TernaryAlloy.InGaAs.At(0.53), Temperature.FromKelvin(300));
        Assert.Equal(o.GapDifferenceElectronVolts, o.ConductionElectronVolts - o.ValenceElectronVolts, 1e-14);
        var back = BandOffset.Between(TernaryAlloy.InGaAs.At(0.53), Material.InP, Temperature.FromKelvin(300));
        Assert.Equal(-o.ConductionElectronVolts, back.ConductionElectronVolts, 1e-15);
    }

    [Fact]
    public void InGaAsInAlAs_LatticeMatched_ConductionStep()
    {
        // In0.53Ga0.47As/In0.52Al0.48As on InP: ΔEc ≈ 0.50–0.52 eV (common practice, no single source;
        // from memory). Tolerance 0.03 eV around 0.51: quoted range plus uncertainty of bowings from memory.
        var o = BandOffset.Between(TernaryAlloy.InGaAs.At(0.53), TernaryAlloy.InAlAs.At(0.52), Temperature.FromKelvin(77));
        Assert.Equal(0.51, o.ConductionElectronVolts, 0.03);
    }

    [Fact]
    public void GaSbInAs_BrokenGap()
    {
        // InAs/GaSb is the textbook broken-gap (type III) pair: the InAs conduction edge lies below the
        // GaSb valence edge, by about 0.1–0.15 eV (common practice, no single source; from memory).
        var o = BandOffset.Between(Material.InAs, Material.GaSb, Temperature.FromKelvin(0));
        var overlap = Material.GaSb.ValenceBandOffset.ElectronVolts - Material.InAs.ConductionBandEdgeElectronVolts(Temperature.FromKelvin(0));
        Assert.InRange(overlap, 0.10, 0.20);
        Assert.True(o.ValenceElectronVolts > Material.InAs.BandGapElectronVolts(Temperature.FromKelvin(0)));
    }

    [Fact]
    public void ToString_IsReadable()
    {
        var text = BandOffset.Between(Material.GaAs, TernaryAlloy.AlGaAs.At(0.3), Temperature.FromKelvin(77)).ToString();
        Assert.StartsWith("GaAs -> Al0.3Ga0.7As at 77 K: dEc = ", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Between_Null_Throws()
    {
        Assert.Equal("second", Assert.Throws<ArgumentNullException>(() => BandOffset.Between(Material.GaAs, null!, Temperature.FromKelvin(0))).ParamName);
    }
}
