// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

/// <summary>The trace-only paths <see cref="CellTransfer.TracesVectorized"/> and <see cref="CellTransfer.Trace"/>.</summary>
public sealed class TraceKernelTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    // Demo cells of our own (GaAs-like numbers, not a material model).
    private static UnitCell KronigPenney() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2),
        Energy.FromElectronVolts(0.3), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.088));

    private static UnitCell Graded()
    {
        var layers = new List<CellElement>();
        for (var i = 0; i < 20; i++)
        {
            var v = 0.3 * Math.Sin(Math.PI * i / 20.0);
            layers.Add(Layer.Create(Length.FromNanometres(0.4), Energy.FromElectronVolts(v), EffectiveMass.FromElectronMasses(0.067 + 0.02 * v), 0.5));
        }
        layers.Add(DeltaBarrier.Create(0.05));
        return UnitCell.Create(layers);
    }

    private static UnitCell ThickBarriers()
    {
        var layers = new List<CellElement>();
        for (var i = 0; i < 40; i++)
        {
            layers.Add(Layer.Create(Length.FromNanometres(3), default, EffectiveMass.FromElectronMasses(0.067)));
            layers.Add(Layer.Create(Length.FromNanometres(10), Energy.FromElectronVolts(1.0), EffectiveMass.FromElectronMasses(0.09)));
        }
        return UnitCell.Create(layers);
    }

    // Barriers with κw from about 31 at E = 0 down through 20 (where the kernel switches from cosh/sinh to the
    // scaled form) and 1 (series) to oscillating above 1 eV, so every regime and every switch is crossed.
    private static UnitCell VeryThickBarriers()
    {
        var layers = new List<CellElement>();
        for (var i = 0; i < 3; i++)
        {
            layers.Add(Layer.Create(Length.FromNanometres(4), default, EffectiveMass.FromElectronMasses(0.067)));
            layers.Add(Layer.Create(Length.FromNanometres(20), Energy.FromElectronVolts(1.0), EffectiveMass.FromElectronMasses(0.09)));
        }
        return UnitCell.Create(layers);
    }

    public static TheoryData<string> Cells => new() { "kronig-penney", "graded", "thick", "very-thick" };

    private static UnitCell Build(string name) => name switch
    {
        "kronig-penney" => KronigPenney(),
        "graded" => Graded(),
        "very-thick" => VeryThickBarriers(),
        _ => ThickBarriers(),
    };

    [Theory]
    [MemberData(nameof(Cells))]
    public void Traces_AnyLength_EqualsScalarPathWithinStatedTolerance(string name)
    {
        var cell = Build(name);
        var transfer = CellTransfer.Create(cell);
        // Lengths 0..N with odd tails around the 256-energy chunk.
        foreach (var length in new[] { 0, 1, 3, 255, 256, 257, 1001 })
        {
            var energies = new double[length];
            for (var i = 0; i < length; i++)
            {
                energies[i] = 0.001 + 1.2 * i / Math.Max(1, length - 1); // spans wells, barrier tops and above
            }
            var batch = new double[length + 2];
            batch[length] = 123; // beyond the input: must stay untouched
            transfer.TracesVectorized(energies, batch);
            Assert.Equal(123, batch[length]);
            for (var i = 0; i < length; i++)
            {
                var scalar = transfer.Dispersion(energies[i]);
                var matrix = transfer.Evaluate(energies[i]);
                // Stated tolerance (CellTransfer.TracesVectorized docs): 1e-13 × elements × the largest entry of M,
                // compared in log form so that entries beyond the double range still compare.
                var logScale = Math.Log(Math.Max(2, matrix.Mantissa.MaxAbsEntry)) + matrix.LogScale;
                var logTolerance = Math.Log(1e-13 * cell.Elements.Count) + logScale;
                if (double.IsInfinity(batch[i]))
                {
                    Assert.True(double.IsInfinity(scalar.Trace) || scalar.LogAbsTrace > 700, $"E = {energies[i]}");
                    Assert.Equal(Math.Sign(scalar.ScaledTrace), Math.Sign(batch[i]));
                    continue;
                }
                Assert.False(double.IsNaN(batch[i]));
                var difference = Math.Abs(batch[i] - scalar.Trace);
                Assert.True(difference == 0 || Math.Log(difference) <= logTolerance,
                    $"{name}, E = {energies[i]}: batch {batch[i]:R}, scalar {scalar.Trace:R}");
                // The public scalar trace-only path, same tolerance.
                var traceOnly = Math.Abs(transfer.Trace(energies[i]) - scalar.Trace);
                Assert.True(traceOnly == 0 || Math.Log(traceOnly) <= logTolerance,
                    $"{name}, E = {energies[i]}: Trace {transfer.Trace(energies[i]):R}, scalar {scalar.Trace:R}");
            }
        }
    }

    [FsCheck.Xunit.Property(Replay = "(4242424242,1313131313)", MaxTest = 60)]
    public void Traces_RandomEnergies_BatchEqualsScalar(double[] raw)
    {
        // Property (fixed seed): any set of energies in (0, 1.5] eV, batch and scalar agree to the stated tolerance.
        var energies = raw.Select(x => double.IsFinite(x) ? 0.0005 + 1.5 * (Math.Abs(x) % 1.0) : 0.25).ToArray();
        var transfer = CellTransfer.Create(KronigPenney());
        var batch = new double[energies.Length];
        transfer.TracesVectorized(energies, batch);
        for (var i = 0; i < energies.Length; i++)
        {
            var matrix = transfer.Evaluate(energies[i]);
            var scale = Math.Max(2, matrix.Mantissa.MaxAbsEntry * Math.Exp(matrix.LogScale));
            // Stated tolerance: 1e-13 × elements (2) × the largest entry.
            Assert.True(Math.Abs(batch[i] - transfer.Dispersion(energies[i]).Trace) <= 2e-13 * scale);
        }
    }

    [Fact]
    public void Traces_KronigPenney_MatchesClosedForm()
    {
        // Kronig & Penney, Proc. R. Soc. A 130, 499 (1931) with BenDaniel–Duke matching
        // (Phys. Rev. 152, 683 (1966)); the form below is the one in docs/references.md.
        const double a = 5, b = 2, v0 = 0.3, mw = 0.067, mb = 0.088;
        var transfer = CellTransfer.Create(KronigPenney());
        var energies = new double[997];
        for (var i = 0; i < energies.Length; i++)
        {
            energies[i] = 0.0005 + 0.9 * i / (energies.Length - 1.0);
        }
        var batch = new double[energies.Length];
        transfer.TracesVectorized(energies, batch);
        for (var i = 0; i < energies.Length; i++)
        {
            var e = energies[i];
            var kw = Math.Sqrt(mw * e / C);
            double expected;
            if (e < v0)
            {
                var kappa = Math.Sqrt(mb * (v0 - e) / C);
                var xi = (kappa / mb) / (kw / mw);
                expected = 2 * (Math.Cos(kw * a) * Math.Cosh(kappa * b) + 0.5 * (xi - 1 / xi) * Math.Sin(kw * a) * Math.Sinh(kappa * b));
            }
            else
            {
                var kb = Math.Sqrt(mb * (e - v0) / C);
                var eta = (kb / mb) / (kw / mw);
                expected = 2 * (Math.Cos(kw * a) * Math.Cos(kb * b) - 0.5 * (eta + 1 / eta) * Math.Sin(kw * a) * Math.Sin(kb * b));
            }
            // Tolerance: the terms are O(10) here (κb ≤ 1.7, |ξ − 1/ξ| ≤ 40 near E = 0); both sides round at
            // ~1e-15 of them, and the closed form loses a few more digits to 1/ξ at the lowest energies.
            Assert.Equal(expected, batch[i], 1e-11 * Math.Max(1, Math.Abs(expected)));
            // The scalar trace-only path (one division per layer), same closed form and tolerance.
            Assert.Equal(expected, transfer.Trace(e), 1e-11 * Math.Max(1, Math.Abs(expected)));
        }
    }

    [Fact]
    public void Traces_BadEnergy_ThrowsBeforeWritingAnything()
    {
        var transfer = CellTransfer.Create(KronigPenney());
        var destination = new double[3];
        var exception = Assert.Throws<ArgumentOutOfRangeException>(() => transfer.TracesVectorized([0.1, 0.2, double.NaN], destination));
        Assert.Equal("energiesElectronVolts", exception.ParamName);
        Assert.Contains("energiesElectronVolts[2]", exception.Message);
        Assert.All(destination, value => Assert.Equal(0, value)); // no partial output
    }

    [Fact]
    public void Traces_ShortDestination_NamesDestination()
    {
        var transfer = CellTransfer.Create(KronigPenney());
        var exception = Assert.Throws<ArgumentException>(() => transfer.TracesVectorized([0.1, 0.2], new double[1]));
        Assert.Equal("destination", exception.ParamName);
    }
}
