// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.OpticalLattices;
using Periodic.PlaneWaves;
using Periodic.Tests.TestHelpers;
using Periodic.Units;

namespace Periodic.Tests.OpticalLattices;

public sealed class OpticalLatticeTest
{
    private static readonly Length Wavelength = Length.FromNanometres(1064);

    [Fact]
    public void RecoilEnergy_MatchesDefinitionInSIUnits()
    {
        // E_R = ħ²k_L²/2m = h²/(2mλ²) (REFERENCES.md, derived), from CODATA 2018 h and u in kg (read) and the AME2020
        // mass of 87Rb (from memory); 1e-9: the 3e-10 uncertainty of u in kg against the library's u/m0 route.
        var lattice = OpticalLattice.Create(Wavelength, 10, AtomicSpecies.Find("87Rb"));
        const double h = 6.62607015e-34;
        var m = 86.9091805310 * 1.66053906660e-27;
        var expectedHertz = h / (2 * m * 1064e-9 * 1064e-9);
        Assert.Equal(expectedHertz, OpticalLattice.ToHertz(lattice.RecoilEnergy.ElectronVolts), 1e-9 * expectedHertz);
        // Common practice: E_R/h ≈ 2.03 kHz for 87Rb at 1064 nm.
        Assert.InRange(expectedHertz, 2020, 2040);
        Assert.Equal(1.0, lattice.ToLatticeWavenumbers(Math.PI / lattice.LatticePeriod.Nanometres), 1e-15);
        Assert.Equal(123.0, OpticalLattice.ToHertz(OpticalLattice.FromHertz(123.0).ElectronVolts), 1e-12);
    }

    [Theory]
    [InlineData(4.0)]
    [InlineData(20.0)]
    [InlineData(100.0)]
    public void Cell_BandEdgesAreMathieuValuesShifted(double s)
    {
        // s·E_R·sin²(πx/d) = (s/2)E_R − (s/2)E_R cos(2πx/d); a translation by d/2 turns −cos into cos, so the band
        // edges are E/E_R = s/2 + Mathieu edges at q = s/4 (REFERENCES.md, derived; Abramowitz and Stegun §20.2 via
        // MathieuReference). 1e-12 relative to max(|E|, s E_R): the accuracy goal of the spectral path.
        var lattice = OpticalLattice.Create(Wavelength, s, AtomicSpecies.Find("39K"));
        var bands = SpectralBandStructure.Compute(lattice.Cell, 6);
        var reference = MathieuReference.BandEdges(6, s / 4);
        for (var i = 0; i < 12; i++)
        {
            var band = bands.Bands.GetBand(i / 2 + 1);
            var edge = lattice.ToRecoilEnergies(i % 2 == 0 ? band.BottomElectronVolts : band.TopElectronVolts);
            var expected = s / 2 + reference[i];
            Assert.True(Math.Abs(edge - expected) <= 1e-12 * Math.Max(Math.Abs(expected), s), $"edge {i}: {edge:R} vs {expected:R}");
        }
        Assert.True(bands.Converged);
    }

    [Fact]
    public void Cell_MathieuQ5AndQ25_MatchPublishedTables()
    {
        // q = 5: Abramowitz and Stegun, Table 20.1 (REFERENCES.md, from memory, 8 decimals): a0 −5.80004602,
        // b1 −5.79008060, a1 1.85818754, b2 2.09946045, a2 7.44910974. q = 25: Zhang and Jin (1996), sample output
        // (read): a0 −40.256779547, b1 −40.256778985, a1 −21.314899691, b2 −21.314860622, a2 −3.522164727,
        // b3 −3.520941527. Edges of s·sin² with s = 4q, shifted by s/2; tolerance one unit of the last printed digit.
        Check(5, [-5.80004602, -5.79008060, 1.85818754, 2.09946045, 7.44910974], 1e-8);
        Check(25, [-40.256779547, -40.256778985, -21.314899691, -21.314860622, -3.522164727, -3.520941527], 1e-9);

        static void Check(double q, double[] published, double tolerance)
        {
            var lattice = OpticalLattice.Create(Wavelength, 4 * q, AtomicSpecies.Find("133Cs"));
            var bands = SpectralBandStructure.Compute(lattice.Cell, 3);
            for (var i = 0; i < published.Length; i++)
            {
                var band = bands.Bands.GetBand(i / 2 + 1);
                var edge = lattice.ToRecoilEnergies(i % 2 == 0 ? band.BottomElectronVolts : band.TopElectronVolts) - 2 * q;
                Assert.True(Math.Abs(edge - published[i]) <= tolerance, $"q = {q}, edge {i}: {edge:R} vs {published[i]}");
            }
        }
    }

    [Fact]
    public void WithSecondWave_SameWavelengthAddsDepths()
    {
        // Two standing waves of one wavelength and phase add: s₁ sin² + s₂ sin² = (s₁ + s₂) sin² (exact identity).
        var sum = OpticalLattice.Create(Wavelength, 3, AtomicSpecies.Find("23Na")).WithSecondWave(Wavelength, 4, 0);
        var single = OpticalLattice.Create(Wavelength, 7, AtomicSpecies.Find("23Na"));
        var a = SpectralBandStructure.Compute(sum.Cell, 3).Bands;
        var b = SpectralBandStructure.Compute(single.Cell, 3).Bands;
        for (var n = 1; n <= 3; n++)
        {
            Assert.Equal(b.GetBand(n).BottomElectronVolts, a.GetBand(n).BottomElectronVolts, 1e-13 * single.RecoilEnergy.ElectronVolts * 7);
            Assert.Equal(b.GetBand(n).TopElectronVolts, a.GetBand(n).TopElectronVolts, 1e-13 * single.RecoilEnergy.ElectronVolts * 7);
        }
    }

    [Fact]
    public void WithSecondWave_DoubledWavelengthFoldsTheBands()
    {
        // λ₂ = 2λ, s₂ → 0: the cell is two sites; band 1 of one site folds into bands 1 and 2 of the cell, whose
        // outer edges are band 1's and whose gap closes (zone folding, common practice). With s₂ = 0.5 a gap opens.
        var single = OpticalLattice.Create(Wavelength, 6, AtomicSpecies.Find("87Rb"));
        var folded = single.WithSecondWave(Length.FromNanometres(2128), 0, 0.3);
        Assert.Equal(2, folded.PrimaryPeriodsPerCell);
        Assert.Equal(1, folded.SecondaryPeriodsPerCell);
        var one = SpectralBandStructure.Compute(single.Cell, 1).Bands.GetBand(1);
        var two = SpectralBandStructure.Compute(folded.Cell, 2).Bands;
        var scale = 6 * single.RecoilEnergy.ElectronVolts;
        Assert.Equal(one.BottomElectronVolts, two.GetBand(1).BottomElectronVolts, 1e-13 * scale);
        Assert.Equal(one.TopElectronVolts, two.GetBand(2).TopElectronVolts, 1e-13 * scale);
        Assert.True(two.Gaps[0].WidthElectronVolts <= 1e-13 * scale);
        var superlattice = single.WithSecondWave(Length.FromNanometres(2128), 0.5, 0.3);
        Assert.True(SpectralBandStructure.Compute(superlattice.Cell, 2).Bands.Gaps[0].WidthElectronVolts > 1e-4 * scale);
    }

    [Fact]
    public void BadInput_IsRefusedWithTheParameterNamed()
    {
        var rb = AtomicSpecies.Find("Rb87");
        Assert.Equal("87Rb", rb.Name);
        Assert.Equal("depthInRecoilEnergies", Assert.Throws<ArgumentOutOfRangeException>(() => OpticalLattice.Create(Wavelength, 0, rb)).ParamName);
        Assert.Equal("depthInRecoilEnergies", Assert.Throws<ArgumentOutOfRangeException>(() => OpticalLattice.Create(Wavelength, -2, rb)).ParamName);
        Assert.Equal("depthInRecoilEnergies", Assert.Throws<ArgumentOutOfRangeException>(() => OpticalLattice.Create(Wavelength, double.NaN, rb)).ParamName);
        Assert.Equal("wavelength", Assert.Throws<ArgumentOutOfRangeException>(() => OpticalLattice.Create(Length.FromNanometres(-1), 5, rb)).ParamName);
        var unknown = Assert.Throws<ArgumentException>(() => AtomicSpecies.Find("Unobtainium"));
        Assert.Equal("name", unknown.ParamName);
        foreach (var known in AtomicSpecies.Known)
        {
            Assert.Contains(known.Name, unknown.Message, StringComparison.Ordinal);
        }
        var incommensurate = Assert.Throws<ArgumentOutOfRangeException>(() =>
            OpticalLattice.Create(Wavelength, 5, rb).WithSecondWave(Length.FromNanometres(1064 / Math.Sqrt(2)), 1, 0));
        Assert.Equal("wavelength", incommensurate.ParamName);
        Assert.Contains("not commensurate", incommensurate.Message, StringComparison.Ordinal);
        Assert.Throws<ArgumentOutOfRangeException>(() => AtomicSpecies.FromMass(0));
    }

    [Fact]
    public void Known_MassesAreTheAtomicMassTableValues()
    {
        // AME2020 (Wang et al., Chin. Phys. C 45, 030003 (2021)), from memory (REFERENCES.md lists 87Rb 86.909 180 53,
        // 133Cs 132.905 451 96, 6Li 6.015 122 89, 23Na 22.989 769 28, 40K 39.963 998 2 u): agreement to the digits given.
        Assert.Equal(86.90918053, AtomicSpecies.Find("87Rb").MassAtomicMassUnits, 1e-8);
        Assert.Equal(132.90545196, AtomicSpecies.Find("133Cs").MassAtomicMassUnits, 1e-8);
        Assert.Equal(6.01512289, AtomicSpecies.Find("6Li").MassAtomicMassUnits, 1e-8);
        Assert.Equal(22.98976928, AtomicSpecies.Find("23Na").MassAtomicMassUnits, 1e-8);
        Assert.Equal(39.9639982, AtomicSpecies.Find("40K").MassAtomicMassUnits, 1e-7);
        // Mass number within 0.1 u of the mass for every entry (a typo guard).
        foreach (var species in AtomicSpecies.Known)
        {
            var massNumber = int.Parse(new string(species.Name.TakeWhile(char.IsAsciiDigit).ToArray()), System.Globalization.CultureInfo.InvariantCulture);
            Assert.InRange(species.MassAtomicMassUnits, massNumber - 0.1, massNumber + 0.1);
        }
    }
}
