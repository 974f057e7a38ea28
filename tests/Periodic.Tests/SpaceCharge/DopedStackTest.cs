// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.SpaceCharge;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.SpaceCharge;

public sealed class DopedStackTest
{
    private static readonly Lead Barrier = Lead.Create(Energy.FromElectronVolts(0.25), EffectiveMass.FromElectronMasses(0.092));

    private static Layer L(double width, double potential, double mass) =>
        Layer.Create(Length.FromNanometres(width), Energy.FromElectronVolts(potential), EffectiveMass.FromElectronMasses(mass));

    private static LayerStack Stack => LayerStack.Create(Barrier, Barrier, L(5, 0.25, 0.092), L(8, 0, 0.067));

    [Fact]
    public void Create_CountsNetDonorsOfEveryRepetition()
    {
        // Net donors per area: 1e18 cm⁻³ over 2 nm (2e11 cm⁻²) plus a 1e11 cm⁻² sheet, per period, times 3 periods (1 cm⁻² = 1e-14 nm⁻²).
        var cell = UnitCell.Create(L(2, 0.25, 0.092), L(8, 0, 0.067));
        var doped = DopedStack.Create(LayerStack.Periodic(Barrier, cell, 3, Barrier),
            [[LayerDoping.Create(1e18, 0, 12.2, 1e11), LayerDoping.Undoped(12.9)]], Temperature.FromKelvin(300), 12.2, 12.2);
        Assert.Equal(3 * 3e11 * 1e-14, doped.NetDonorsPerSquareNanometre, 1e-12 * 3 * 3e11 * 1e-14);
    }

    [Fact]
    public void Create_BadInput_NamesParameter()
    {
        var good = new IReadOnlyList<LayerDoping>[] { [LayerDoping.Create(1e18, 0, 12.2)], [LayerDoping.Undoped(12.9)] };
        var t = Temperature.FromKelvin(300);
        Assert.Equal("partDoping", Assert.Throws<ArgumentException>(() => DopedStack.Create(Stack, [good[0]], t, 12, 12)).ParamName);
        Assert.Equal("partDoping", Assert.Throws<ArgumentException>(() =>
            DopedStack.Create(Stack, [[LayerDoping.Create(0, 1e18, 12.2)], good[1]], t, 12, 12)).ParamName); // no valence band: holes are not modelled
        Assert.Equal("temperature", Assert.Throws<ArgumentOutOfRangeException>(() => DopedStack.Create(Stack, good, Temperature.FromKelvin(0), 12, 12)).ParamName);
        Assert.Equal("leftLeadRelativePermittivity", Assert.Throws<ArgumentOutOfRangeException>(() => DopedStack.Create(Stack, good, t, 0, 12)).ParamName);
        Assert.Equal("rightLeadRelativePermittivity", Assert.Throws<ArgumentOutOfRangeException>(() => DopedStack.Create(Stack, good, t, 12, double.NaN)).ParamName);
        // An acceptor level needs a valence band, which this stack is not given.
        var level = LayerDoping.Create(2e18, 1e18, 12.2).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(0.026));
        var error = Assert.Throws<ArgumentException>(() => DopedStack.Create(Stack, [[level], good[1]], t, 12, 12));
        Assert.Equal("partDoping", error.ParamName);
        Assert.Contains("acceptor level", error.Message);
        var delta = LayerStack.Create(Barrier, Barrier, L(5, 0, 0.067), DeltaBarrier.Create(0.1));
        Assert.Equal("partDoping", Assert.Throws<ArgumentException>(() =>
            DopedStack.Create(delta, [[LayerDoping.Create(1e18, 0, 12.9)], [LayerDoping.Create(1e18, 0, 12)]], t, 12, 12)).ParamName);
    }

    [Fact]
    public void Create_WithValenceBand_TakesPTypeAndRefusesAMismatchedHoleStack()
    {
        var t = Temperature.FromKelvin(300);
        var holeLead = Lead.Create(Energy.FromElectronVolts(0.15), EffectiveMass.FromElectronMasses(0.55));
        var band = StackValenceBand.Create(LayerStack.Create(holeLead, holeLead, L(5, 0.15, 0.55), L(8, 0, 0.5)), Energy.FromElectronVolts(-1.5), "heavy holes");
        var level = LayerDoping.Create(0, 1e18, 12.2).WithAcceptorIonisationEnergy(Energy.FromElectronVolts(0.026));
        var doped = DopedStack.Create(Stack, [[level], [LayerDoping.Undoped(12.9)]], t, 12, 12, [band]);
        Assert.Equal(-1e18 * 5e-7 * 1e-14, doped.NetDonorsPerSquareNanometre, 1e-12 * 5e11 * 1e-14); // 1 cm⁻² = 1e-14 nm⁻²; 1e-12: rounding of the sum
        Assert.Single(doped.ValenceBands);
        // A hole stack of another width, or of another part count, is refused naming valenceBands.
        var wide = StackValenceBand.Create(LayerStack.Create(holeLead, holeLead, L(6, 0.15, 0.55), L(8, 0, 0.5)), Energy.FromElectronVolts(-1.5), "heavy holes");
        var short1 = StackValenceBand.Create(LayerStack.Create(holeLead, holeLead, L(13, 0.15, 0.55)), Energy.FromElectronVolts(-1.5), "heavy holes");
        foreach (var bad in new[] { wide, short1 })
        {
            var error = Assert.Throws<ArgumentException>(() => DopedStack.Create(Stack, [[level], [LayerDoping.Undoped(12.9)]], t, 12, 12, [bad]));
            Assert.Equal("valenceBands", error.ParamName);
        }
    }
}
