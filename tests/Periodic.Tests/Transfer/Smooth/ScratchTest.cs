using Periodic.Bands;
using Periodic.PlaneWaves;
using Periodic.Structures;
using Periodic.Tests.TestSupport;
using Periodic.Units;
using Xunit.Abstractions;

namespace Periodic.Tests.Transfer.Smooth;

public sealed class ScratchTest(ITestOutputHelper output)
{
    [Fact]
    public void Scratch()
    {
        var mass = EffectiveMass.FromElectronMasses(86.909 * 1822.888);
        var d = Length.FromNanometres(532);
        var er = FourierSegment.RecoilEnergy(d, mass).ElectronVolts;
        var seg = FourierSegment.OpticalLattice(d, 1, mass);
        var r = RefinedBandStructure.Compute(UnitCell.Create(seg), 2, 1e-12);
        var pw = PlaneWaveSolver.Create(seg).EnergiesAt(0, 2);
        output.WriteLine(r.ToString());
        output.WriteLine(pw.ToString());
        output.WriteLine($"ref {(MathieuReference.A(0, 0.25) + 0.5) * er:R}, tr {r.Bands.GetBand(1).BottomElectronVolts:R} pw {pw.Energies[0]:R} er {er:R}");
        output.WriteLine($"seg {seg}"); for (var i = 0; i < 4; i++) output.WriteLine($"e{i} {r.EdgeErrorsElectronVolts[i]:G3} {r.Bands.GetBand(i / 2 + 1).BottomErrorElectronVolts:G3} {r.Bands.GetBand(i / 2 + 1).TopErrorElectronVolts:G3} closed {r.Bands.Gaps[i / 2].IsClosed}");
    }
}
