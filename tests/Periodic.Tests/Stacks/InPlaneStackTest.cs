// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Stacks;

public sealed class InPlaneStackTest
{
    private const double Hbar = 6.62607015e-34 / (2 * Math.PI);
    private const double C = Hbar * Hbar / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18; // ħ²/2m₀, eV nm², CODATA 2018

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.05)]
    public void At_EqualMasses_TransmissionShiftsByInPlaneEnergy(double bias)
    {
        // One mass in every layer and lead: the in-plane motion separates, so T(E + ħ²k∥²/2m; k∥) = T(E; 0) (common
        // practice, no single source), with and without a uniform field.
        var mass = EffectiveMass.FromElectronMasses(0.067);
        var cell = UnitCell.KronigPenney(Length.FromNanometres(4), Length.FromNanometres(2), Energy.FromElectronVolts(0.3), mass);
        var lead = Lead.Create(default, mass);
        var stack = LayerStack.Periodic(lead, cell, 5, lead);
        const double k = 0.5;
        var shift = C * k * k / 0.067;
        var flat = StackTransmission.Create(stack, Energy.FromElectronVolts(bias));
        var moved = StackTransmission.Create(InPlaneStack.At(stack, k), Energy.FromElectronVolts(bias));
        foreach (var e in new[] { 0.05, 0.12, 0.2, 0.35 })
        {
            var expected = flat.Evaluate(e).Transmission;
            var actual = moved.Evaluate(e + shift).Transmission;
            // 1e-9 relative: the shift moves every |E − V| by rounding only, and T is smooth in E (no resonance narrower
            // than 1e-6 eV at these energies for a 5-period stack).
            Assert.Equal(expected, actual, Math.Max(1e-9 * expected, 1e-15));
        }
    }

    [Fact]
    public void At_NonParabolicLayer_ThrowsNamingStack()
    {
        var layer = Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.2), EffectiveMass.FromElectronMasses(0.08), 0.5);
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(0.067));
        var stack = LayerStack.Create(lead, lead, layer);
        var e = Assert.Throws<ArgumentException>(() => InPlaneStack.At(stack, 0.2));
        Assert.Equal("stack", e.ParamName);
    }

    [Fact]
    public void At_NegativeWavevector_ThrowsNamingIt()
    {
        var lead = Lead.Create(default, EffectiveMass.FromElectronMasses(0.067));
        var stack = LayerStack.Create(lead, lead, Layer.Create(Length.FromNanometres(3), Energy.FromElectronVolts(0.2), EffectiveMass.FromElectronMasses(0.08)));
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => InPlaneStack.At(stack, -0.2));
        Assert.Equal("inPlaneWavevectorPerNanometre", e.ParamName);
    }
}
