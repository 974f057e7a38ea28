// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Transfer;
using static Periodic.Tests.TestHelpers.Checks;

namespace Periodic.Tests.Transfer;

/// <summary>Vectorised traces of random cells: never NaN, close to the scalar ones.</summary>
public sealed partial class CellTransferTest
{
    [Fact]
    public void VectorisedTraces_RandomCells_NeverNaNAndCloseToScalar()
    {
        var points = 0;
        var destination = new double[5];
        RandomCells.Check(RandomCells.Cells(6, 5), 600, 0x5EED_0009UL, spec =>
        {
            var transfer = CellTransfer.Create(spec.Build());
            transfer.TracesVectorized(spec.EnergiesElectronVolts, destination);
            for (var i = 0; i < 5; i++)
            {
                var e = spec.EnergiesElectronVolts[i];
                Assert.False(double.IsNaN(destination[i]), $"NaN at {e}");
                var m = transfer.Evaluate(e);
                var scale = Math.Exp(Math.Log(m.Mantissa.MaxAbsEntry) + m.LogScale);
                // Documented agreement: 1e-13 × elements × max|M(E)|.
                if (double.IsFinite(scale))
                {
                    Assert.Equal(transfer.Trace(e), destination[i], 1e-13 * spec.Elements.Length * scale + 1e-300);
                }
                points++;
            }
        });
        output.WriteLine($"vectorised traces: {points} energies");
    }
}
