// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

/// <summary>The parallel design sweep.</summary>
public sealed partial class BandSweepTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private static UnitCell[] Cells(int count) => Enumerable.Range(0, count)
        .Select(i => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(1 + 2.0 * i / count),
            Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.088)))
        .ToArray();

    [Fact]
    public void Compute_Parallel_BitwiseEqualToSerialAndToSingleCells()
    {
        var cells = Cells(97);
        var serial = BandSweep.Compute(cells, 4, BandSweepOptions.Create(maxDegreeOfParallelism: 1));
        var parallel = BandSweep.Compute(cells, 4);
        var two = BandSweep.Compute(cells, 4, BandSweepOptions.Create(maxDegreeOfParallelism: 2));
        for (var i = 0; i < cells.Length; i++)
        {
            var single = BandStructure.Compute(cells[i], 4);
            for (var n = 1; n <= 4; n++)
            {
                var expected = single.GetBand(n);
                foreach (var result in new[] { serial[i], parallel[i], two[i] })
                {
                    var band = result.GetBand(n);
                    Assert.Equal(BitConverter.DoubleToInt64Bits(expected.BottomElectronVolts), BitConverter.DoubleToInt64Bits(band.BottomElectronVolts));
                    Assert.Equal(BitConverter.DoubleToInt64Bits(expected.TopElectronVolts), BitConverter.DoubleToInt64Bits(band.TopElectronVolts));
                }
            }
        }
    }

    [Fact]
    public void Compute_DiracCombs_BandTopsAtKdEqualsNPi()
    {
        // Dirac comb cos kd = cos Kd + P sin(Kd)/(Kd) (Kittel ch. 7; Griffiths eq. 5.65): sin(nπ) = 0 makes
        // Kd = nπ a band top for every strength P, so each cell of a sweep over P has tops C(nπ/d)²/m.
        var cells = Enumerable.Range(1, 40).Select(i => UnitCell.DiracComb(Length.FromNanometres(1), 0.01 * i, EffectiveMass.FreeElectron)).ToArray();
        var results = BandSweep.Compute(cells, 3);
        foreach (var result in results)
        {
            for (var n = 1; n <= 3; n++)
            {
                var expected = C * n * n * Math.PI * Math.PI;
                // Tolerance: the default search tolerance is 1e-14 relative; 5e-14 allows for rounding in D.
                Assert.Equal(expected, result.GetBand(n).TopElectronVolts, expected * 5e-14);
            }
        }
    }

    [Fact]
    public void Compute_BadArguments_NameTheParameter()
    {
        var cells = Cells(3);
        Assert.Equal("cells", Assert.Throws<ArgumentNullException>(() => BandSweep.Compute(null!, 1)).ParamName);
        Assert.Equal("cells", Assert.Throws<ArgumentException>(() => BandSweep.Compute([cells[0], null!], 1)).ParamName);
        Assert.Equal("bandCount", Assert.Throws<ArgumentOutOfRangeException>(() => BandSweep.Compute(cells, 0)).ParamName);
        Assert.Equal("maxDegreeOfParallelism", Assert.Throws<ArgumentOutOfRangeException>(() => BandSweep.Compute(cells, 1, BandSweepOptions.Create(maxDegreeOfParallelism: 0))).ParamName);
    }

    [Fact]
    public void Compute_Empty_ReturnsEmpty() => Assert.Empty(BandSweep.Compute([], 2));
}
