// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Materials;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Conventions;

/// <summary>
/// Bad input across the public API: an ArgumentException-family error that names the parameter,
/// quotes the bad value and says what is allowed (house rule; common practice, no single source).
/// </summary>
public sealed class ValidationTest
{
    private static readonly double[] NonFinite = [double.NaN, double.PositiveInfinity, double.NegativeInfinity];

    /// <summary>Asserts the exception type family, the parameter name, and that the message quotes the value.</summary>
    private static void AssertRejects(Action call, string paramName, double value)
    {
        var ex = Assert.ThrowsAny<ArgumentException>(call);
        Assert.Equal(paramName, ex.ParamName);
        var quoted = value.ToString("R", CultureInfo.InvariantCulture);
        Assert.True(ex.Message.Contains(quoted, StringComparison.Ordinal) || ex.Message.Contains(quoted.Replace("E+", "E", StringComparison.Ordinal), StringComparison.Ordinal),
            $"message of {paramName} should quote {quoted}: {ex.Message}");
    }

    private static void AssertRejects(Action call, string paramName, int value) => AssertRejects(call, paramName, (double)value);

    public static TheoryData<double> NonFiniteValues => [.. NonFinite];

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Units_RejectNonFinite(double bad)
    {
        AssertRejects(() => Energy.FromElectronVolts(bad), "electronVolts", bad);
        AssertRejects(() => Energy.FromMillielectronVolts(bad), "millielectronVolts", bad);
        AssertRejects(() => Energy.FromJoules(bad), "joules", bad);
        AssertRejects(() => Length.FromNanometres(bad), "nanometres", bad);
        AssertRejects(() => Length.FromAngstroms(bad), "angstroms", bad);
        AssertRejects(() => EffectiveMass.FromElectronMasses(bad), "electronMasses", bad);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-0.067)]
    public void EffectiveMass_RejectsNonPositive(double bad) =>
        AssertRejects(() => EffectiveMass.FromElectronMasses(bad), "electronMasses", bad);

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Structures_RejectNonFinite(double bad)
    {
        AssertRejects(() => DeltaBarrier.Create(bad), "strengthElectronVoltNanometres", bad);
        AssertRejects(() => Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.1), bad), "nonParabolicityPerElectronVolt", bad);
        AssertRejects(() => UnitCell.FromLayers([1.0, bad], [0.0, 0.1], [0.1, 0.1]), "widthsNanometres", bad);
        AssertRejects(() => UnitCell.FromLayers([1.0, 2.0], [0.0, bad], [0.1, 0.1]), "potentialsElectronVolts", bad);
        AssertRejects(() => UnitCell.FromLayers([1.0, 2.0], [0.0, 0.1], [bad, 0.1]), "massesElectronMasses", bad);
    }

    [Fact]
    public void Layer_RejectsNonPositiveWidthNegativeAlphaAndDefaultMass()
    {
        AssertRejects(() => Layer.Create(Length.FromNanometres(0), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.1)), "width", 0.0);
        AssertRejects(() => Layer.Create(Length.FromNanometres(-1), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.1)), "width", -1.0);
        AssertRejects(() => Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.1), -0.5), "nonParabolicityPerElectronVolt", -0.5);
        var ex = Assert.ThrowsAny<ArgumentException>(() => Layer.Create(Length.FromNanometres(1), Energy.FromElectronVolts(0), default));
        Assert.Equal("mass", ex.ParamName);
    }

    [Fact]
    public void UnitCell_RejectsMismatchedAndEmptySpans()
    {
        var ex = Assert.ThrowsAny<ArgumentException>(() => UnitCell.FromLayers([1.0, 2.0], [0.0], [0.1, 0.1]));
        Assert.Contains("2", ex.Message, StringComparison.Ordinal);
        Assert.Contains("1", ex.Message, StringComparison.Ordinal);
        Assert.Equal("widthsNanometres", Assert.ThrowsAny<ArgumentException>(() => UnitCell.FromLayers([], [], [])).ParamName);
        Assert.Equal("elements", Assert.ThrowsAny<ArgumentException>(() => UnitCell.Create()).ParamName);
        Assert.Equal("elements", Assert.ThrowsAny<ArgumentException>(() => UnitCell.Create(Fixtures.Well, null!)).ParamName);
    }

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Transfer_RejectsNonFiniteEnergy(double bad)
    {
        AssertRejects(() => Fixtures.Transfer.Evaluate(bad), "energyElectronVolts", bad);
        AssertRejects(() => Fixtures.Transfer.Dispersion(bad), "energyElectronVolts", bad);
        AssertRejects(() => Fixtures.Transfer.CountBandEdgesBelow(bad), "energyElectronVolts", bad);
        AssertRejects(() => Fixtures.Transfer.Trace(bad), "energyElectronVolts", bad);
        AssertRejects(() => Fixtures.Transfer.TracesVectorized([0.1, bad], new double[2]), "energiesElectronVolts", bad);
        var destination = new double[3];
        AssertRejects(() => Fixtures.Transfer.Traces([0.1, bad, 0.2], destination), "energiesElectronVolts", bad);
        Assert.Contains("[1]", Assert.ThrowsAny<ArgumentException>(() => Fixtures.Transfer.Traces([0.1, bad, 0.2], destination)).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Transfer_RejectsEnergyAtOrBelowNonParabolicFloor()
    {
        // m(E) = m(1 + α(E − V)) vanishes at E = V − 1/α = −1 eV here; that energy and below are outside the model.
        var cell = UnitCell.Create(Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067), 1.0),
            Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.09)));
        var transfer = CellTransfer.Create(cell);
        Assert.Equal(-1.0, transfer.LowestValidEnergyElectronVolts, 12); // 1e-12: the bound is V − 1/α = −1 exactly up to rounding
        AssertRejects(() => transfer.Evaluate(transfer.LowestValidEnergyElectronVolts), "energyElectronVolts", transfer.LowestValidEnergyElectronVolts);
        AssertRejects(() => transfer.Dispersion(-2), "energyElectronVolts", -2.0);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-1)]
    [InlineData(10001)]
    public void BandStructure_RejectsBandCount(int bad) =>
        AssertRejects(() => BandStructure.Compute(Fixtures.Cell, bad), "count", bad);

    [Theory]
    [InlineData(0)]
    [InlineData(-1)]
    [InlineData(5)]
    public void BandStructure_RejectsBandIndex(int bad)
    {
        AssertRejects(() => Fixtures.Bands.GetBand(bad), "bandIndex", bad);
        AssertRejects(() => Fixtures.Bands.EnergyAt(bad, 0), "bandIndex", bad);
        AssertRejects(() => Fixtures.Bands.EnergiesAt(bad, [0.0], new double[1]), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.GroupVelocityAt(bad, 0), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.BottomMass(bad), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.TopMass(bad), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.CurvatureMassElectronMasses(bad, 0), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.SlopesAt(bad, [0.0], new double[1]), "bandIndex", bad);
        AssertRejects(() => Fixtures.Properties.GroupVelocitiesAt(bad, [0.0], new double[1]), "bandIndex", bad);
    }

    [Fact]
    public void Bands_RejectWavevectorOutsideZoneOrNonFinite()
    {
        var kMax = Math.PI / Fixtures.Cell.Period.Nanometres;
        foreach (var bad in NonFinite.Append(1.01 * kMax).Append(-1.01 * kMax))
        {
            AssertRejects(() => Fixtures.Bands.EnergyAt(1, bad), "wavevectorPerNanometre", bad);
            AssertRejects(() => Fixtures.Bands.EnergiesAt(1, [0.0, bad], new double[2]), "wavevectorsPerNanometre", bad);
            AssertRejects(() => Fixtures.Properties.GroupVelocityAt(1, bad), "wavevectorPerNanometre", bad);
            AssertRejects(() => Fixtures.Properties.CurvatureMassElectronMasses(1, bad), "wavevectorPerNanometre", bad);
            AssertRejects(() => Fixtures.Properties.SlopesAt(1, [0.0, bad], new double[2]), "wavevectorsPerNanometre", bad);
            AssertRejects(() => Fixtures.Properties.GroupVelocitiesAt(1, [0.0, bad], new double[2]), "wavevectorsPerNanometre", bad);
            AssertRejects(() => Fixtures.Dispersion.EnergyAt(bad), "wavevectorPerNanometre", bad);
            AssertRejects(() => Fixtures.Dispersion.EnergiesAt([0.0, bad], new double[2]), "wavevectorsPerNanometre", bad);
        }
    }

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Bands_RejectNonFiniteEnergy(double bad)
    {
        AssertRejects(() => Fixtures.Bands.WavevectorAt(bad), "energyElectronVolts", bad);
        AssertRejects(() => Fixtures.Bands.BandIndexAt(bad), "energyElectronVolts", bad);
    }

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Properties_RejectNonFiniteEnergy(double bad)
    {
        var p = Fixtures.Properties;
        AssertRejects(() => p.DensityOfStatesPerElectronVoltNanometre(bad), "energyElectronVolts", bad);
        AssertRejects(() => p.IntegratedDensityOfStatesPerNanometre(bad), "energyElectronVolts", bad);
        AssertRejects(() => p.GroupVelocityAtEnergy(bad), "energyElectronVolts", bad);
        AssertRejects(() => p.SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre(bad, EffectiveMass.FromElectronMasses(0.067)), "energyElectronVolts", bad);
        AssertRejects(() => p.DensitiesOfStates([0.05, bad], new double[2]), "energiesElectronVolts", bad);
        AssertRejects(() => p.IntegratedDensitiesOfStates([0.05, bad], new double[2]), "energiesElectronVolts", bad);
        AssertRejects(() => p.SuperlatticeDensitiesOfStates([0.05, bad], EffectiveMass.FromElectronMasses(0.067), new double[2]), "energiesElectronVolts", bad);
    }

    [Fact]
    public void Properties_RejectEnergyAboveComputedBandsAndInGap()
    {
        var p = Fixtures.Properties;
        var above = p.UpperEnergyLimitElectronVolts + 0.01;
        AssertRejects(() => p.DensityOfStatesPerElectronVoltNanometre(above), "energyElectronVolts", above);
        AssertRejects(() => p.IntegratedDensityOfStatesPerNanometre(above), "energyElectronVolts", above);
        var gap = Fixtures.Bands.Gaps[0];
        var inGap = 0.5 * (gap.LowerElectronVolts + gap.UpperElectronVolts);
        AssertRejects(() => p.GroupVelocityAtEnergy(inGap), "energyElectronVolts", inGap);
    }

    [Fact]
    public void Properties_RejectDefaultInPlaneMass()
    {
        var ex = Assert.ThrowsAny<ArgumentException>(() => Fixtures.Properties.SuperlatticeDensityOfStatesPerElectronVoltCubicNanometre(0.05, default));
        Assert.Equal("inPlaneMass", ex.ParamName);
    }

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Stacks_RejectNonFinite(double bad)
    {
        var t = Fixtures.Transmission;
        AssertRejects(() => t.Evaluate(bad), "energyElectronVolts", bad);
        AssertRejects(() => t.FindResonances(bad, 1.0), "lowerElectronVolts", bad);
        AssertRejects(() => t.FindResonances(0.3, bad), "upperElectronVolts", bad);
        var psi = Fixtures.Bound.GetWavefunction(0);
        AssertRejects(() => psi.ValueAt(bad), "positionNanometres", bad);
        AssertRejects(() => Fixtures.Bound.CountBelow(bad), "energyElectronVolts", bad);
    }

    [Fact]
    public void Stacks_RejectBadCountsAndLeads()
    {
        AssertRejects(() => LayerStack.Periodic(Fixtures.BarrierLead, Fixtures.Cell, 0, Fixtures.BarrierLead), "periods", 0);
        AssertRejects(() => StackPart.Repeat(Fixtures.Cell, -3), "repetitions", -3);
        AssertRejects(() => LayerStack.WithDefect(Fixtures.BarrierLead, Fixtures.Cell, -1, [Fixtures.Well], 2, Fixtures.BarrierLead), "periodsBefore", -1);
        Assert.Equal("leftLead", Assert.ThrowsAny<ArgumentException>(() => LayerStack.Periodic(default, Fixtures.Cell, 2, Fixtures.BarrierLead)).ParamName);
        Assert.Equal("rightLead", Assert.ThrowsAny<ArgumentException>(() => LayerStack.Periodic(Fixtures.BarrierLead, Fixtures.Cell, 2, default)).ParamName);
        Assert.Equal("mass", Assert.ThrowsAny<ArgumentException>(() => Lead.Create(Energy.FromElectronVolts(0), default)).ParamName);
        AssertRejects(() => Fixtures.Bound.GetWavefunction(Fixtures.Bound.Levels.Count), "index", Fixtures.Bound.Levels.Count);
        AssertRejects(() => Fixtures.Bound.GetWavefunction(-1), "index", -1);
        AssertRejects(() => Fixtures.Transmission.FindResonances(0.5, 0.4), "upperElectronVolts", 0.4);
    }

    [Theory]
    [InlineData(-1.0)]
    [InlineData(1000.5)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Materials_RejectTemperatureOutsideRange(double bad)
    {
        // A temperature is typed: negative and non-finite values are refused where it is made (Temperature.FromKelvin);
        // the materials refuse what a Temperature can hold but the Varshni law is not meant for (above 1000 K).
        if (!(bad >= 0 && double.IsFinite(bad)))
        {
            AssertRejects(() => Temperature.FromKelvin(bad), "kelvin", bad);
            return;
        }
        var t = Temperature.FromKelvin(bad);
        AssertRejects(() => Material.GaAs.BandGapElectronVolts(t), "temperature", bad);
        AssertRejects(() => Material.GaAs.ConductionBandEdgeElectronVolts(t), "temperature", bad);
        AssertRejects(() => Material.GaAs.KaneNonParabolicityPerElectronVolt(t), "temperature", bad);
        AssertRejects(() => Material.GaAs.OffsetTo(Material.AlAs, t), "temperature", bad);
        AssertRejects(() => BandOffset.Between(Material.GaAs, Material.AlAs, t), "temperature", bad);
        AssertRejects(() => StructureRecipe.Create(t), "temperature", bad);
        AssertRejects(() => StructureRecipe.Create(Temperature.FromKelvin(300)).WithTemperature(t), "temperature", bad);
    }

    [Theory]
    [InlineData(-0.01)]
    [InlineData(1.01)]
    [InlineData(double.NaN)]
    public void Materials_RejectCompositionOutsideUnitInterval(double bad) =>
        AssertRejects(() => TernaryAlloy.AlGaAs.At(bad), "composition", bad);

    [Theory]
    [MemberData(nameof(NonFiniteValues))]
    public void Materials_RejectNonFiniteParameters(double bad)
    {
        var m = Material.GaAs;
        // Material takes typed values: a non-finite one is refused where it is made, naming the factory's parameter.
        AssertRejects(() => m.WithElectronMass(EffectiveMass.FromElectronMasses(bad)), "electronMasses", bad);
        AssertRejects(() => m.WithBandGapAtZeroKelvin(Energy.FromElectronVolts(bad)), "electronVolts", bad);
        AssertRejects(() => m.WithLatticeConstant(Length.FromNanometres(bad)), "nanometres", bad);
        AssertRejects(() => m.WithVarshni(bad, Temperature.FromKelvin(204)), "varshniAlphaElectronVoltsPerKelvin", bad);
        AssertRejects(() => m.WithVarshni(5.4e-4, Temperature.FromKelvin(bad)), "kelvin", bad);
        AssertRejects(() => TernaryAlloy.AlGaAs.WithGapBowing(Energy.FromElectronVolts(bad)), "electronVolts", bad);
        AssertRejects(() => TernaryAlloy.AlGaAs.WithElectronMassBowing(bad), "electronMassBowingElectronMasses", bad);
        AssertRejects(() => TernaryAlloy.AlGaAs.WithValenceBandOffsetBowing(Energy.FromElectronVolts(bad)), "electronVolts", bad);
        AssertRejects(() => ModelLimits.Default.WithMaximumLatticeMismatch(bad), "maximumLatticeMismatch", bad);
        AssertRejects(() => ModelLimits.Default.WithMinimumMonolayers(bad), "minimumMonolayers", bad);
        AssertRejects(() => ModelLimits.Default.WithMaximumEnergyFractions(bad, 0.5), "maximumParabolicEnergyFraction", bad);
        AssertRejects(() => ModelLimits.Default.WithMaximumEnergyFractions(0.1, bad), "maximumKaneEnergyFraction", bad);
    }

    [Fact]
    public void Materials_RejectBadCountsAndWidths()
    {
        AssertRejects(() => RecipeLayer.FromMonolayers(Material.GaAs, 0), "monolayers", 0);
        AssertRejects(() => RecipeLayer.Create(Material.GaAs, Length.FromNanometres(-1)), "width", -1.0);
        AssertRejects(() => StructureRecipe.Create(Temperature.FromKelvin(300)).WithPeriods(0), "periods", 0);
        AssertRejects(() => StructureRecipe.Create(Temperature.FromKelvin(300)).AddRepeated(0, RecipeLayer.FromMonolayers(Material.GaAs, 3)), "repetitions", 0);
        var built = StructureRecipe.Create(Temperature.FromKelvin(300)).Add(Material.GaAs, Length.FromNanometres(5)).Add(TernaryAlloy.AlGaAs.At(0.3), Length.FromNanometres(2)).Build();
        AssertRejects(() => built.ToAbsoluteElectronVolts(double.NaN), "energyElectronVolts", double.NaN);
        AssertRejects(() => built.CheckEnergies([0.1, double.NaN]), "energiesElectronVolts", double.NaN);
        AssertRejects(() => built.LayerOf(Material.GaAs, Length.FromNanometres(-1)), "width", -1.0);
    }

    [Fact]
    public void Options_RejectOutOfRange()
    {
        AssertRejects(() => BandSearchOptions.Create(relativeTolerance: double.NaN), "relativeTolerance", double.NaN);
        AssertRejects(() => BandSearchOptions.Create(relativeTolerance: -1), "relativeTolerance", -1.0);
        AssertRejects(() => BandSearchOptions.Create(absoluteToleranceElectronVolts: double.PositiveInfinity), "absoluteToleranceElectronVolts", double.PositiveInfinity);
        AssertRejects(() => BandSearchOptions.Create(maxIterations: 0), "maxIterations", 0);
        AssertRejects(() => BoundStateOptions.Create(maxLevels: 0), "maxLevels", 0);
        AssertRejects(() => BoundStateOptions.Create(absoluteToleranceElectronVolts: double.NaN), "absoluteToleranceElectronVolts", double.NaN);
        AssertRejects(() => BoundStateOptions.Create(relativeTolerance: -1), "relativeTolerance", -1.0);
        AssertRejects(() => BoundStateOptions.Create(maxElements: 0), "maxElements", 0);
        AssertRejects(() => ResonanceSearchOptions.Create(scanPoints: 1), "scanPoints", 1);
        AssertRejects(() => CurrentDensityOptions.Create(relativeTolerance: double.NaN), "relativeTolerance", double.NaN);
        AssertRejects(() => Periodic.PlaneWaves.PlaneWaveOptions.Create(relativeTolerance: double.NaN), "relativeTolerance", double.NaN);
        AssertRejects(() => Periodic.PlaneWaves.PlaneWaveOptions.Create(relativeTolerance: 1e-16), "relativeTolerance", 1e-16);
        AssertRejects(() => BandDispersionOptions.Create(absoluteToleranceElectronVolts: 0), "absoluteToleranceElectronVolts", 0.0);
        AssertRejects(() => BandDispersionOptions.Create(absoluteToleranceElectronVolts: 1e-2), "absoluteToleranceElectronVolts", 1e-2);
        AssertRejects(() => Periodic.Properties.FermiLevelOptions.Create(absoluteToleranceElectronVolts: double.PositiveInfinity), "absoluteToleranceElectronVolts", double.PositiveInfinity);
        AssertRejects(() => BandSweepOptions.Create(maxDegreeOfParallelism: -2), "maxDegreeOfParallelism", -2);
        AssertRejects(() => BandSweepOptions.Create(maxDegreeOfParallelism: 0), "maxDegreeOfParallelism", 0);
    }

}
