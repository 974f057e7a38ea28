// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

public sealed partial class CellTransferTest
{
    private static CellTransfer SimpleTransfer() =>
        CellTransfer.Create(UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2), Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.067)));

    [Fact]
    public void Create_NullCell_NamesCell()
    {
        Assert.Equal("cell", Assert.Throws<ArgumentNullException>(() => CellTransfer.Create(null!)).ParamName);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void EnergyEntryPoints_NonFinite_NameTheEnergy(double e)
    {
        var transfer = SimpleTransfer();
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transfer.Evaluate(e)).ParamName);
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transfer.Dispersion(e)).ParamName);
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => transfer.CountBandEdgesBelow(e));
        Assert.Equal("energyElectronVolts", error.ParamName);
        Assert.Contains("finite", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Traces_NonFiniteElement_NamesTheSpanAndIndex()
    {
        var transfer = SimpleTransfer();
        var destination = new double[4];
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => transfer.Traces([0.1, 0.2, 0.3, double.NaN], destination));
        Assert.Equal("energiesElectronVolts", error.ParamName);
        Assert.Contains("energiesElectronVolts[3]", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Traces_ShortDestination_GivesBothLengths()
    {
        var transfer = SimpleTransfer();
        var error = Assert.Throws<ArgumentException>(() => transfer.Traces([0.1, 0.2, 0.3], new double[2]));
        Assert.Equal("destination", error.ParamName);
        Assert.Contains("length 2", error.Message, StringComparison.Ordinal);
        Assert.Contains("at least 3", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Traces_LongerDestinationAndOddLengths_FillOnlyThePrefix()
    {
        // House rule for batch APIs: the destination may be longer; lengths 0..N with odd tails work.
        var transfer = SimpleTransfer();
        for (var n = 0; n <= 7; n++)
        {
            var energies = Enumerable.Range(0, n).Select(i => 0.01 + 0.07 * i).ToArray();
            var destination = Enumerable.Repeat(-99.0, n + 3).ToArray();
            transfer.Traces(energies, destination);
            for (var i = 0; i < n; i++)
            {
                Assert.Equal(transfer.Dispersion(energies[i]).Trace, destination[i]);
            }
            Assert.All(destination.Skip(n), x => Assert.Equal(-99.0, x));
        }
    }

    [Fact]
    public void Evaluate_BelowNonParabolicDomain_NamesTheEnergy()
    {
        // m(E) = m(1 + α(E − V)) must stay positive: E > V − 1/α (here 0.3 − 1/0.6 eV).
        var layer = Layer.Create(Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067), 0.6);
        var transfer = CellTransfer.Create(UnitCell.Create(layer));
        Assert.Equal(0.3 - 1 / 0.6, transfer.LowestValidEnergyElectronVolts, 1e-15);
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => transfer.Evaluate(-2.0));
        Assert.Equal("energyElectronVolts", error.ParamName);
        Assert.Contains("must exceed", error.Message, StringComparison.Ordinal);
    }
}
