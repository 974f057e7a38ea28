// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Stacks;

public sealed class WannierStarkLadderTest(ITestOutputHelper output)
{
    private static UnitCell Cell() => UnitCell.KronigPenney(Length.FromNanometres(5), Length.FromNanometres(2),
        Energy.FromElectronVolts(0.4), EffectiveMass.FromElectronMasses(0.067), EffectiveMass.FromElectronMasses(0.092));

    [Fact]
    public void Find_LongSuperlattice_SpacingIsEFdInTheMiddle()
    {
        // Wannier–Stark ladder: E_j = E_c − eFd·j (G. H. Wannier, Phys. Rev. 117, 432 (1960)); an exact consequence of the
        // translation x → x + d, E → E − eFd of the infinite biased lattice, so the rungs far from the contacts are spaced
        // eFd up to exponentially small end effects.
        const double field = 1e6; // eFd = 7 meV for d = 7 nm
        var ladder = WannierStarkLadder.Find(Cell(), 1, 30, field);
        output.WriteLine(ladder.ToString());
        foreach (var rung in ladder.Rungs)
        {
            output.WriteLine($"  {rung.EnergyElectronVolts:R} eV (± {rung.EnergyErrorElectronVolts:E1}), width {rung.WidthElectronVolts:E3} eV, ln T {rung.LogPeakTransmission:F1}");
        }
        output.WriteLine($"middle spacings: {string.Join(", ", ladder.MiddleSpacingsElectronVolts.Select(s => s.ToString("R")))}; largest relative deviation {ladder.LargestRelativeSpacingError:E2}");
        Assert.NotEmpty(ladder.MiddleSpacingsElectronVolts);
        var central = Math.Abs(ladder.CentralSpacingElectronVolts - ladder.SpacingElectronVolts) / ladder.SpacingElectronVolts;
        output.WriteLine($"central spacing {ladder.CentralSpacingElectronVolts:R} eV, relative deviation {central:E2}");
        Assert.True(central < 1e-8, $"central deviation {central:E3}");
        // 1e-8 relative: the acceptance bound; rung energies are located to ~1e-12 eV against a spacing of 1.4e-2 eV.
        Assert.True(ladder.LargestRelativeSpacingError < 1e-8, $"largest deviation {ladder.LargestRelativeSpacingError:E3}");
        // Bloch frequency eFd/h (derived; h exact in CODATA 2018).
        Assert.Equal(field * 7e-9 * 1.602176634e-19 / 6.62607015e-34, ladder.BlochFrequencyHertz, 1e-3);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-1e6)]
    [InlineData(double.NaN)]
    [InlineData(1e9)]
    public void Find_BadField_ThrowsNamingIt(double field)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => WannierStarkLadder.Find(Cell(), 1, 20, field));
        Assert.Equal("fieldVoltsPerMetre", e.ParamName);
    }

    [Fact]
    public void Find_TooManyPeriods_ThrowsNamingThem()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => WannierStarkLadder.Find(Cell(), 1, 60_000, 1e6));
        Assert.Equal("periods", e.ParamName);
    }
}
