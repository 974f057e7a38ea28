using Periodic.Bands;
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
        var d = Length.FromNanometres(1);
        var m = EffectiveMass.FreeElectron;
        var er = FourierSegment.RecoilEnergy(d, m).ElectronVolts;
        var q = 0.1;
        var reference = MathieuReference.BandEdges(3, q);
        output.WriteLine($"ref top3 {reference[5] * er:R} a3 {MathieuReference.A(3, q) * er:R}");
        foreach (var steps in new[] { 64, 128, 256, 512, 1024, 4096 })
        {
            var seg = FourierSegment.Cosine(d, Energy.FromElectronVolts(2 * q * er), m).WithStepCount(steps);
            var bs = BandStructure.Compute(UnitCell.Create(seg), 3);
            var b = bs.GetBand(3);
            output.WriteLine($"{steps}: bottom {b.BottomElectronVolts:R} ({b.BottomErrorElectronVolts:G3}) top {b.TopElectronVolts:R} ({b.TopErrorElectronVolts:G3}) gap {b.GapAboveElectronVolts:G4} next {(b.TopElectronVolts + b.GapAboveElectronVolts):R}");
        }
    }
}
public sealed class Scratch2Test(ITestOutputHelper output)
{
    [Fact]
    public void Scratch()
    {
        var d = Length.FromNanometres(1);
        var m = EffectiveMass.FreeElectron;
        var er = FourierSegment.RecoilEnergy(d, m).ElectronVolts;
        var q = 0.1;
        var r = RefinedBandStructure.Compute(UnitCell.Create(FourierSegment.Cosine(d, Energy.FromElectronVolts(2 * q * er), m)), 3, 1e-12);
        output.WriteLine(r.ToString());
        var reference = MathieuReference.BandEdges(3, q);
        for (var i = 0; i < 6; i++)
        {
            var b = r.Bands.GetBand(i / 2 + 1);
            var e = i % 2 == 0 ? b.BottomElectronVolts : b.TopElectronVolts;
            output.WriteLine($"{i}: {e:R} err {r.EdgeErrorsElectronVolts[i]:G3} true {e - reference[i] * er:G3}");
        }
    }
}
