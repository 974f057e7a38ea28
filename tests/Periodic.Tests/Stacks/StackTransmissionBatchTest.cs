// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

public sealed class StackTransmissionBatchTest(ITestOutputHelper output)
{
    private static readonly EffectiveMass Mass = EffectiveMass.FromElectronMasses(0.067);
    private static readonly Lead Ground = Lead.Create(default, Mass);

    private static Layer Slab(double widthNm, double potentialEv) =>
        Layer.Create(Length.FromNanometres(widthNm), Energy.FromElectronVolts(potentialEv), Mass);

    private static StackTransmission Superlattice(int periods) =>
        StackTransmission.Create(LayerStack.Periodic(Ground, UnitCell.Create(Slab(4, 0), Slab(2, 0.3)), periods, Ground));

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(7)]
    [InlineData(33)]
    public void Transmissions_MatchSingleEvaluations_ForAnyLengthAndLongerDestination(int length)
    {
        var transmission = Superlattice(20);
        var energies = Enumerable.Range(0, length).Select(i => -0.05 + 0.011 * i).ToArray();
        var destination = Enumerable.Repeat(-7.0, length + 3).ToArray();
        var logs = new double[length + 1];
        transmission.Transmissions(energies, destination);
        transmission.Log10Transmissions(energies, logs);
        for (var i = 0; i < length; i++)
        {
            var single = transmission.Evaluate(energies[i]);
            Assert.Equal(single.Transmission, destination[i]);
            Assert.Equal(single.Log10Transmission, logs[i]);
        }
        Assert.All(destination[length..], v => Assert.Equal(-7.0, v)); // the tail is untouched
    }

    [Fact]
    public void Transmissions_BadInput_NamesParameterAndLengths()
    {
        var transmission = Superlattice(3);
        var shortDestination = Assert.Throws<ArgumentException>(() => transmission.Transmissions(new double[5], new double[4]));
        Assert.Equal("destination", shortDestination.ParamName);
        Assert.Contains("length 4", shortDestination.Message);
        Assert.Contains("at least 5", shortDestination.Message);
        var destination = new double[3];
        var bad = Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Transmissions([0.1, double.PositiveInfinity, 0.2], destination));
        Assert.Equal("energiesElectronVolts", bad.ParamName); // the parameter; the message names the element
        Assert.Contains("energiesElectronVolts[1]", bad.Message);
        Assert.All(destination, v => Assert.Equal(0.0, v)); // no partial output
        Assert.Equal("energyElectronVolts", Assert.Throws<ArgumentOutOfRangeException>(() => transmission.Evaluate(double.NaN)).ParamName);
    }

    [Fact]
    public void Transmissions_Cancelled_ThrowsAndClearsDestination()
    {
        var transmission = Superlattice(50);
        var energies = Enumerable.Range(0, 500).Select(i => 0.001 + 0.001 * i).ToArray();
        var destination = Enumerable.Repeat(5.0, 500).ToArray();
        using var source = new CancellationTokenSource();
        var progress = new CancelAt(200, source);
        Assert.ThrowsAny<OperationCanceledException>(() => transmission.Transmissions(energies, destination, progress, source.Token));
        Assert.All(destination, v => Assert.Equal(0.0, v));
    }

    [Fact]
    public void Transmissions_WithProgress_ReportsMonotonicallyUpToTotal()
    {
        var transmission = Superlattice(10);
        var energies = Enumerable.Range(0, 250).Select(i => 0.001 + 0.002 * i).ToArray();
        var destination = new double[250];
        var reports = new Recorder();
        transmission.Transmissions(energies, destination, reports, CancellationToken.None);
        Assert.NotEmpty(reports.Seen);
        Assert.Equal(new SweepProgress(250, 250), reports.Seen[^1]);
        Assert.True(reports.Seen.Zip(reports.Seen.Skip(1)).All(p => p.Second.Completed > p.First.Completed));
        Assert.Equal(transmission.Evaluate(energies[17]).Transmission, destination[17]);
    }

    [Fact]
    public void Evaluate_MillionPeriodsInAGap_IsFiniteAndMatchesChebyshevDecay()
    {
        // 10^6 periods by repeated squaring (20 squarings). In a gap the Chebyshev form gives
        // ln T_N = −2Nγ + O(1) with γ = Im k·d (Abelès; Yeh ch. 6, from memory); the step from N to 2N
        // must therefore be −2Nγ to within the O(e^{−2Nγ}) corrections. Tolerance: 1e-9 relative of 2Nγ,
        // the rounding of γ itself times N.
        var cell = UnitCell.Create(Slab(4, 0), Slab(2, 0.3));
        var band = Periodic.Bands.BandStructure.Compute(cell, 1).GetBand(1);
        var e = band.TopElectronVolts + 0.5 * band.GapAboveElectronVolts;
        var gamma = CellTransfer.Create(cell).Dispersion(e).Wavevector.ImaginaryPerNanometre * 6.0;
        var million = StackTransmission.Create(LayerStack.Periodic(Ground, cell, 1_000_000, Ground)).Evaluate(e);
        var twoMillion = StackTransmission.Create(LayerStack.Periodic(Ground, cell, 2_000_000, Ground)).Evaluate(e);
        Assert.True(double.IsFinite(million.LogTransmission));
        Assert.Equal(0.0, million.Transmission);
        Assert.Equal(1.0, million.Reflection, 1e-15);
        var step = twoMillion.LogTransmission - million.LogTransmission;
        output.WriteLine($"log10 T(1e6) = {million.Log10Transmission:G10}; relative step error {Math.Abs(step / (-2e6 * gamma) - 1):E3}");
        Assert.Equal(-2 * 1_000_000 * gamma, step, 2e6 * gamma * 1e-9);
    }

    private sealed class CancelAt(int count, CancellationTokenSource source) : IProgress<SweepProgress>
    {
        public void Report(SweepProgress value)
        {
            if (value.Completed >= count)
            {
                source.Cancel();
            }
        }
    }

    private sealed class Recorder : IProgress<SweepProgress>
    {
        public List<SweepProgress> Seen { get; } = [];

        public void Report(SweepProgress value) => Seen.Add(value);
    }
}
