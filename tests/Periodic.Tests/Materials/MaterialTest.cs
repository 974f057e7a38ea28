// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Materials;
using Periodic.Units;

namespace Periodic.Tests.Materials;

public sealed class MaterialTest
{
    // Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), as listed in the project's
    // reference file; all values from memory. Columns: Eg Γ 0 K (eV), α (meV/K), β (K), m_e (m0), VBO (eV), a (Å).
    public static TheoryData<string, double, double, double, double, double, double> Table => new()
    {
        { "GaAs", 1.519, 0.5405, 204, 0.067, -0.80, 5.65325 },
        { "AlAs", 3.099, 0.885, 530, 0.15, -1.33, 5.6611 },
        { "InAs", 0.417, 0.276, 93, 0.026, -0.59, 6.0583 },
        { "InP", 1.4236, 0.363, 162, 0.0795, -0.94, 5.8697 },
        { "GaSb", 0.812, 0.417, 140, 0.039, -0.03, 6.0959 },
        { "AlSb", 2.386, 0.42, 140, 0.14, -0.41, 6.1355 },
    };

    [Theory]
    [MemberData(nameof(Table))]
    public void Binaries_MatchPublishedTable(string name, double gap, double alphaMilli, double beta, double mass, double vbo, double latticeAngstrom)
    {
        // Values from memory of Vurgaftman et al. (2001) (see Table above). Tolerance: 1e-12 relative,
        // only unit conversion (meV/K -> eV/K, Å -> nm) separates table and code.
        var m = Material.FromName(name);
        Assert.Equal(gap, m.BandGapAtZeroKelvin.ElectronVolts, 1e-12);
        Assert.Equal(alphaMilli * 1e-3, m.VarshniAlphaElectronVoltsPerKelvin, 1e-15);
        Assert.Equal(beta, m.VarshniBeta.Kelvin, 1e-12);
        Assert.Equal(mass, m.ElectronMassElectronMasses, 1e-12);
        Assert.Equal(vbo, m.ValenceBandOffset.ElectronVolts, 1e-12);
        Assert.Equal(latticeAngstrom / 10, m.LatticeConstant.Nanometres, 1e-12);
        Assert.Equal(latticeAngstrom / 20, m.MonolayerThickness.Nanometres, 1e-12);
        Assert.Equal(ParameterStatus.FromMemory, m.StatusOf(MaterialParameter.BandGapAtZeroKelvin));
        Assert.Equal(ParameterStatus.FromMemory, m.StatusOf(MaterialParameter.ValenceBandOffset));
        Assert.Contains("from memory", m.Source, StringComparison.Ordinal);
    }

    [Fact]
    public void BandGap_GaAsRoomTemperature_MatchesHandbookValue()
    {
        // GaAs Eg(300 K) ≈ 1.422–1.424 eV is the well-known room-temperature handbook value (common
        // practice, no single source). Varshni law with Vurgaftman's GaAs values (from memory):
        // 1.519 − 0.5405e-3·300²/(300 + 204) = 1.42248 eV. Tolerance 2 meV: the spread of quoted values.
        Assert.Equal(1.519 - 0.5405e-3 * 300 * 300 / (300 + 204), Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(300)), 1e-12);
        Assert.Equal(1.423, Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(300)), 0.002);
    }

    [Fact]
    public void BandGap_GaAsLiquidNitrogen_MatchesHandbookValue()
    {
        // GaAs Eg(77 K) ≈ 1.508 eV (common practice, no single source; from memory). Tolerance 2 meV.
        Assert.Equal(1.508, Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(77)), 0.002);
    }

    [Fact]
    public void BandGap_ZeroKelvin_IsTableValue()
    {
        // Varshni law Eg(T) = Eg(0) − αT²/(T + β) (Varshni, Physica 34, 149 (1967)) gives Eg(0) at T = 0 exactly.
        foreach (var m in Material.Binaries)
        {
            Assert.Equal(m.BandGapAtZeroKelvin.ElectronVolts, m.BandGapElectronVolts(Temperature.FromKelvin(0)));
        }
    }

    [Fact]
    public void ConductionBandEdge_IsVboPlusGap()
    {
        // E_c = VBO + Eg(T) (the convention of Vurgaftman et al. 2001: VBO independent of T). Exact up to one rounding.
        var m = Material.InAs;
        Assert.Equal(m.ValenceBandOffset.ElectronVolts + m.BandGapElectronVolts(Temperature.FromKelvin(150)), m.ConductionBandEdgeElectronVolts(Temperature.FromKelvin(150)), 1e-15);
    }

    [Fact]
    public void HoleMasses_FollowLuttingerRelations()
    {
        // m_hh[001] = 1/(γ1 − 2γ2), m_lh[001] = 1/(γ1 + 2γ2) (standard relations of the Luttinger model);
        // GaAs γ1 = 6.98, γ2 = 2.06 from memory of Vurgaftman et al. (2001). Tolerance 1e-12 (one division).
        Assert.Equal(1 / (6.98 - 2 * 2.06), Material.GaAs.HeavyHoleMassElectronMasses!.Value, 1e-12);
        Assert.Equal(1 / (6.98 + 2 * 2.06), Material.GaAs.LightHoleMassElectronMasses!.Value, 1e-12);
        // Commonly quoted GaAs [001] masses ≈ 0.35 and ≈ 0.09 m0 (common practice; from memory); 0.01 m0 spread.
        Assert.Equal(0.35, Material.GaAs.HeavyHoleMassElectronMasses!.Value, 0.01);
        Assert.Equal(0.09, Material.GaAs.LightHoleMassElectronMasses!.Value, 0.01);
        Assert.Equal(ParameterStatus.Derived, Material.GaAs.StatusOf(MaterialParameter.HeavyHoleMass));
    }

    [Fact]
    public void With_OverridesOneFieldAndMarksIt()
    {
        var custom = Material.GaAs.WithElectronMass(EffectiveMass.FromElectronMasses(0.0665));
        Assert.Equal(0.0665, custom.ElectronMassElectronMasses);
        Assert.Equal(ParameterStatus.CallerSupplied, custom.StatusOf(MaterialParameter.ElectronMass));
        Assert.Equal(ParameterStatus.FromMemory, custom.StatusOf(MaterialParameter.BandGapAtZeroKelvin));
        Assert.Equal(Material.GaAs.BandGapAtZeroKelvin.ElectronVolts, custom.BandGapAtZeroKelvin.ElectronVolts);
        Assert.Equal(0.067, Material.GaAs.ElectronMassElectronMasses); // the original is unchanged

        var v = Material.GaAs.WithElectronMass(EffectiveMass.FromElectronMasses(0.0665)).WithVarshni(0.5e-3, Temperature.FromKelvin(200)).WithValenceBandOffset(Energy.FromElectronVolts(-0.8)).WithLatticeConstant(Length.FromNanometres(0.5653))
            .WithBandGapAtZeroKelvin(Energy.FromElectronVolts(1.52)).WithHeavyHoleMass(EffectiveMass.FromElectronMasses(0.5)).WithLightHoleMass(EffectiveMass.FromElectronMasses(0.08)).WithName("my GaAs");
        Assert.Equal("my GaAs", v.Name);
        Assert.Equal(1.52 - 0.5e-3 * 100 * 100 / 300, v.BandGapElectronVolts(Temperature.FromKelvin(100)), 1e-15);
        foreach (var p in Enum.GetValues<MaterialParameter>())
        {
            Assert.Equal(ParameterStatus.CallerSupplied, v.StatusOf(p));
        }
    }

    [Fact]
    public void Create_CustomMaterial_AllCallerSupplied()
    {
        var m = Material.Create("X", Energy.FromElectronVolts(1.0), 0.4e-3, Temperature.FromKelvin(100), EffectiveMass.FromElectronMasses(0.05), Energy.FromElectronVolts(-0.5), Length.FromNanometres(0.6));
        Assert.Equal(ParameterStatus.CallerSupplied, m.StatusOf(MaterialParameter.ElectronMass));
        Assert.Equal(ParameterStatus.NotAvailable, m.StatusOf(MaterialParameter.HeavyHoleMass));
        Assert.Null(m.HeavyHoleMassElectronMasses);
        Assert.Contains("n/a", m.Describe(), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_BadValues_NameTheParameter()
    {
        // Typed values that a type admits but a material does not: a zero gap, the default (zero) mass, a negative
        // lattice constant, a zero Varshni β. Non-finite values cannot be built into the types at all.
        var gap = Energy.FromElectronVolts(1);
        var beta = Temperature.FromKelvin(100);
        var mass = EffectiveMass.FromElectronMasses(0.05);
        var vbo = Energy.FromElectronVolts(0);
        var a = Length.FromNanometres(0.6);
        Assert.Equal("bandGapAtZeroKelvin",
            Assert.Throws<ArgumentOutOfRangeException>(() => Material.Create("X", Energy.FromElectronVolts(0), 0, beta, mass, vbo, a)).ParamName);
        Assert.Equal("electronMass",
            Assert.Throws<ArgumentOutOfRangeException>(() => Material.Create("X", gap, 0, beta, default, vbo, a)).ParamName);
        Assert.Equal("heavyHoleMass",
            Assert.Throws<ArgumentOutOfRangeException>(() => Material.Create("X", gap, 0, beta, mass, vbo, a, default(EffectiveMass))).ParamName);
        Assert.Equal("latticeConstant",
            Assert.Throws<ArgumentOutOfRangeException>(() => Material.Create("X", gap, 0, beta, mass, vbo, Length.FromNanometres(-1))).ParamName);
        Assert.Equal("name", Assert.Throws<ArgumentException>(() => Material.Create(" ", gap, 0, beta, mass, vbo, a)).ParamName);
        Assert.Equal("varshniBeta", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.WithVarshni(1e-4, Temperature.FromKelvin(0))).ParamName);
        Assert.Equal("latticeConstant", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.WithLatticeConstant(Length.FromNanometres(-1))).ParamName);
        Assert.Equal("electronMass", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.WithElectronMass(default)).ParamName);
    }

    [Fact]
    public void BandGap_BadTemperature_NamesTheParameter()
    {
        Assert.Equal("kelvin", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(-1))).ParamName);
        Assert.Equal("kelvin", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(double.NaN))).ParamName);
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => Material.GaAs.BandGapElectronVolts(Temperature.FromKelvin(1001))).ParamName);
        // A custom law that closes the gap is refused rather than returning a negative gap.
        var closing = Material.Create("X", Energy.FromElectronVolts(0.1), 1e-3, Temperature.FromKelvin(10), EffectiveMass.FromElectronMasses(0.05), Energy.FromElectronVolts(0), Length.FromNanometres(0.6));
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => closing.BandGapElectronVolts(Temperature.FromKelvin(300))).ParamName);
    }

    [Fact]
    public void FromName_UnknownName_Throws()
    {
        Assert.Same(Material.GaSb, Material.FromName("gasb"));
        Assert.Equal("name", Assert.Throws<ArgumentException>(() => Material.FromName("Si")).ParamName);
    }

    [Fact]
    public void Directness_AlAsAndAlSbIndirect()
    {
        // AlAs and AlSb are indirect-gap semiconductors, the others direct (common practice, no single source).
        Assert.False(Material.AlAs.IsGammaValleyLowest);
        Assert.False(Material.AlSb.IsGammaValleyLowest);
        Assert.True(Material.GaAs.IsGammaValleyLowest && Material.InAs.IsGammaValleyLowest && Material.InP.IsGammaValleyLowest && Material.GaSb.IsGammaValleyLowest);
    }

    [Fact]
    public void ToStringAndDescribe_AreReadable()
    {
        Assert.StartsWith("GaAs: Eg(0 K) = 1.519 eV", Material.GaAs.ToString(), StringComparison.Ordinal);
        var text = Material.GaAs.Describe();
        Assert.Contains("[FromMemory]", text, StringComparison.Ordinal);
        Assert.Contains("0.5405 meV/K", text, StringComparison.Ordinal);
    }
}
