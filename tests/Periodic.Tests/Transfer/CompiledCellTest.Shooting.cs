// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Tests.Transfer;

/// <summary>
/// The whole-sequence shooting passes (<c>Shoot</c>, <c>ShootWithDerivative</c>, <c>ShootStates</c>) are a fast specialisation
/// of the element steps: the matrices of repeated layers are formed once per energy and the zeros of a layer are chosen by the
/// parity of the Prüfer quadrant. These tests pin them to the general kernel (house rule: a specialisation is pinned to it).
/// </summary>
public sealed partial class CompiledCellTest
{
    /// <summary>
    /// A stack-like sequence with repeated layers of every kind the table distinguishes: an 8 nm well, a 10 nm barrier (κw up to
    /// about 7, formed directly), a 30 nm barrier (κw &gt; 20, scaled), a 25 nm well whose phase spans several half turns at the
    /// higher energies, a delta, and one layer that occurs once (outside the table's classes only if none repeats it).
    /// </summary>
    private static CompiledCell RepeatedSequence()
    {
        var well = Layer.Create(Length.FromNanometres(8), default, EffectiveMass.FromElectronMasses(0.067));
        var barrier = Layer.Create(Length.FromNanometres(10), Energy.FromElectronVolts(0.26), EffectiveMass.FromElectronMasses(0.092));
        var thick = Layer.Create(Length.FromNanometres(30), Energy.FromElectronVolts(0.26), EffectiveMass.FromElectronMasses(0.092));
        var wide = Layer.Create(Length.FromNanometres(25), Energy.FromElectronVolts(-0.05), EffectiveMass.FromElectronMasses(0.067));
        var delta = DeltaBarrier.Create(0.02);
        var elements = new List<CellElement>();
        for (var r = 0; r < 12; r++)
        {
            elements.AddRange([well, barrier, wide, delta, barrier, well, thick]);
        }
        elements.Add(Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.1), EffectiveMass.FromElectronMasses(0.08)));
        return new CompiledCell(elements.ToArray(), "elements");
    }

    /// <summary>Energies below, inside and above the barriers, where the wide well holds 0 to about 5 half turns.</summary>
    public static TheoryData<double> ShootingEnergies => new() { -0.03, 0.0123, 0.0424, 0.1634, 0.2599, 0.31, 0.9 };

    [Theory]
    [MemberData(nameof(ShootingEnergies))]
    public void Shoot_RepeatedLayers_GivesTheStateAndZerosOfTheElementSteps(double e)
    {
        var cell = RepeatedSequence();
        var scratch = new double[cell.ShootingScratchLength];
        Assert.True(scratch.Length > 0); // the sequence repeats its layers, so the table is in use
        foreach (var (u0, w0) in new[] { (1.0, 0.3), (0.0, 1.0), (-0.7, 2.0) })
        {
            double u = u0, w = w0, log = 0;
            var zeros = 0;
            for (var i = 0; i < cell.Count; i++)
            {
                zeros += cell.StepForward(i, e, ref u, ref w, ref log);
            }
            double us = u0, ws = w0, logs = 0;
            var shot = cell.Shoot(e, ref us, ref ws, ref logs, scratch);
            // Bit for bit: the table holds the very numbers StepForward forms, and the parity rule picks the same zero count.
            Assert.Equal(zeros, shot);
            Assert.Equal(u, us);
            Assert.Equal(w, ws);
            Assert.Equal(log, logs);
        }
    }

    [Theory]
    [MemberData(nameof(ShootingEnergies))]
    public void ShootWithDerivative_MatchesTheProductDerivativeAndCountsAsShoot(double e)
    {
        var cell = RepeatedSequence();
        var scratch = new double[cell.ShootingScratchLength];
        const double u0 = 1, w0 = 0.3;
        double u = u0, w = w0, du = 0, dw = 0, log = 0;
        var zeros = cell.ShootWithDerivative(e, ref u, ref w, ref du, ref dw, ref log, scratch);
        double us = u0, ws = w0, logs = 0;
        // Same values, so the same state and count as the pass without derivative.
        Assert.Equal(cell.Shoot(e, ref us, ref ws, ref logs, scratch), zeros);
        Assert.Equal(us, u);
        Assert.Equal(ws, w);

        // The kernel's product with its exact energy derivative (Accumulate) is an independent route to dψ/dE at the end.
        var product = cell.Accumulate(e);
        var psi = product.P11 * u0 + product.P12 * w0;
        var dpsi = product.D11 * u0 + product.D12 * w0;
        var dphi = product.D21 * u0 + product.D22 * w0;
        var phi = product.P21 * u0 + product.P22 * w0;
        // Logarithmic derivatives compared on the larger of the two components: both routes round differently in 85
        // elements with growth up to e^20 per barrier, so 1e-8 relative leaves room for that and fails on any wrong term.
        if (Math.Abs(psi) * 1e-3 > Math.Abs(phi))
        {
            Assert.Equal(dpsi / psi, du / u, Math.Abs(dpsi / psi) * 1e-8 + 1e-6);
        }
        else
        {
            Assert.Equal(dphi / phi, dw / w, Math.Abs(dphi / phi) * 1e-8 + 1e-6);
        }
    }

    [Theory]
    [MemberData(nameof(ShootingEnergies))]
    public void ShootWithDerivative_MatchesACentralDifference(double e)
    {
        // Outside help: the five-point difference f′ ≈ (8[f(x+h) − f(x−h)] − [f(x+2h) − f(x−2h)])/(12h) of the shot state, whose
        // truncation h⁴f⁽⁵⁾/30 is negligible at h = 1e-8 eV even though ψ grows as e^(Σκw) (d ln ψ/dE up to ~2e3/eV through
        // 600 nm of barrier) and whose rounding, ~1e-13·|ψ|/h, stays near 1e-5 of |ψ|: 1e-4 of max(|ψ′|, |ψ|) separates a
        // right derivative from a wrong one.
        var cell = RepeatedSequence();
        var scratch = new double[cell.ShootingScratchLength];
        const double h = 1e-8;
        double u = 1, w = 0.3, du = 0, dw = 0, log = 0;
        cell.ShootWithDerivative(e, ref u, ref w, ref du, ref dw, ref log, scratch);
        double Psi(double energy)
        {
            double us = 1, ws = 0.3, logs = 0;
            cell.Shoot(energy, ref us, ref ws, ref logs, scratch);
            return us * Math.Exp(logs - log);
        }
        var difference = (8 * (Psi(e + h) - Psi(e - h)) - (Psi(e + 2 * h) - Psi(e - 2 * h))) / (12 * h);
        Assert.Equal(difference, du, Math.Max(Math.Abs(du), Math.Abs(u)) * 1e-4);
    }

    [Theory]
    [MemberData(nameof(ShootingEnergies))]
    public void ShootStates_MatchesTheElementStepsBothWays(double e)
    {
        var cell = RepeatedSequence();
        var scratch = new double[cell.ShootingScratchLength];
        var n = cell.Count;
        double[] us = new double[n + 1], ws = new double[n + 1], logs = new double[n + 1];
        cell.ShootStates(e, 1, 0.3, forward: true, us, ws, logs, scratch);
        double u = 1, w = 0.3, log = 0;
        for (var i = 0; i < n; i++)
        {
            cell.StepForward(i, e, ref u, ref w, ref log);
            Assert.Equal(u, us[i + 1]);
            Assert.Equal(w, ws[i + 1]);
            Assert.Equal(log, logs[i + 1]);
        }
        cell.ShootStates(e, 1, -0.3, forward: false, us, ws, logs, scratch);
        (u, w, log) = (1, -0.3, 0);
        for (var i = n - 1; i >= 0; i--)
        {
            cell.StepBackward(i, e, ref u, ref w, ref log);
            Assert.Equal(u, us[i]);
            Assert.Equal(w, ws[i]);
            Assert.Equal(log, logs[i]);
        }
    }

    [Theory]
    [MemberData(nameof(ShootingEnergies))]
    public void TabledLogLayerIntegral_EqualsTheLayerIntegral(double e)
    {
        var cell = RepeatedSequence();
        var scratch = new double[cell.ShootingScratchLength];
        Assert.True(cell.FillIntegralClasses(e, scratch));
        for (var i = 0; i < cell.Count; i++)
        {
            if (!cell.IsLayer(i))
            {
                continue;
            }
            // The same closed form from the same numbers: equal to the last bit.
            Assert.Equal(cell.LogLayerIntegral(i, e, 0.8, -1.3), cell.TabledLogLayerIntegral(i, e, 0.8, -1.3, scratch));
        }
    }

    [Fact]
    public void ShootingScratchLength_DistinctLayers_IsZeroAndShootStepsElementByElement()
    {
        // No layer repeats: a table would cost as much as it saves, so none is built and the passes step element by element.
        var layers = Enumerable.Range(1, 6).Select(k => (CellElement)Layer.Create(Length.FromNanometres(k), Energy.FromElectronVolts(0.01 * k),
            EffectiveMass.FromElectronMasses(0.067))).ToArray();
        var cell = new CompiledCell(layers, "elements");
        Assert.Equal(0, cell.ShootingScratchLength);
        double u = 1, w = 0, log = 0, us = 1, ws = 0, logs = 0;
        var zeros = 0;
        for (var i = 0; i < cell.Count; i++)
        {
            zeros += cell.StepForward(i, 0.2, ref u, ref w, ref log);
        }
        Assert.Equal(zeros, cell.Shoot(0.2, ref us, ref ws, ref logs, new double[8]));
        Assert.Equal(u, us);
    }
}
