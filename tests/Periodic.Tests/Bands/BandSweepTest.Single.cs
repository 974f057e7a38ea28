// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Bands;

/// <summary>A sweep gives what single computations give.</summary>
public sealed partial class BandSweepTest
{
    [Fact]
    public void BandSweep_MatchesSingleComputations()
    {
        var cells = Enumerable.Range(0, 6).Select(i => UnitCell.KronigPenney(Length.FromNanometres(3 + i), Length.FromNanometres(2), Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067))).ToArray();
        var swept = BandSweep.Compute(cells, 2, BandSweepOptions.Create(maxDegreeOfParallelism: 2));
        Assert.Equal(cells.Length, swept.Length);
        for (var i = 0; i < cells.Length; i++)
        {
            var single = BandStructure.Compute(cells[i], 2);
            Assert.Equal(single.GetBand(2).TopElectronVolts, swept[i].GetBand(2).TopElectronVolts); // same algorithm, same inputs: identical
        }
        Assert.Equal("bandCount", Assert.ThrowsAny<ArgumentException>(() => BandSweep.Compute(cells, 0)).ParamName);
    }
}
