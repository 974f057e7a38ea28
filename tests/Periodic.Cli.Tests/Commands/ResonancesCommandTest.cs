// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using Periodic.Serialization;
using Periodic.Stacks;
using Xunit.Abstractions;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class ResonancesCommandTest(ITestOutputHelper output)
{
    private static readonly double HbarSquaredOverTwoMe =
        Math.Pow(6.62607015e-34 / (2 * Math.PI), 2) / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18; // CODATA 2018, eV nm²

    private const double Barrier = 2.0, Well = 5.0, Height = 0.3, WellMass = 0.067, BarrierMass = 0.092;

    private static string DoubleBarrier() => string.Create(CultureInfo.InvariantCulture, $$"""
        { "name": "double barrier", "cell": [
            { "width": {{Barrier}}, "potential": {{Height}}, "mass": {{BarrierMass}} },
            { "width": {{Well}}, "potential": 0, "mass": {{WellMass}} },
            { "width": {{Barrier}}, "potential": {{Height}}, "mass": {{BarrierMass}} } ],
          "stack": { "periods": 1, "leads": { "potential": 0, "mass": {{WellMass}} } } }
        """);

    /// <summary>
    /// Reflection amplitude r of one rectangular barrier (0 &lt; x &lt; b) for a wave e^{ikx} incident from the well side,
    /// referenced at the barrier's face: the textbook matching of ψ and ψ'/m (BenDaniel & Duke, Phys. Rev. 152, 683 (1966))
    /// at both faces, solved as four linear equations (e.g. Griffiths §2.6 for the equal-mass case).
    /// </summary>
    private static Complex BarrierReflection(double energy)
    {
        var k = Math.Sqrt(WellMass * energy / HbarSquaredOverTwoMe);
        // q: the barrier's wavenumber, imaginary below the top (ψ = A e^{iqx} + B e^{−iqx}).
        var q = Complex.Sqrt(BarrierMass * (energy - Height) / HbarSquaredOverTwoMe);
        Complex i = Complex.ImaginaryOne;
        // Unknowns r, A, B, t: 1 + r = A + B; (ik/mw)(1 − r) = (iq/mb)(A − B);
        // A e^{iqb} + B e^{−iqb} = t e^{ikb}; (iq/mb)(A e^{iqb} − B e^{−iqb}) = (ik/mw) t e^{ikb}.
        // Eliminating t: B e^{−iqb}(q/mb + k/mw) = A e^{iqb}(q/mb − k/mw), so B = ρ A with ρ = e^{2iqb}(q/mb − k/mw)/(q/mb + k/mw).
        var kw = k / WellMass;
        var qb = q / BarrierMass;
        var rho = Complex.Exp(2 * i * q * Barrier) * (qb - kw) / (qb + kw);
        // From the first two: 1 + r = A(1 + ρ), kw(1 − r) = qb A(1 − ρ) → A = 2 kw / (kw(1 + ρ) + qb(1 − ρ)).
        var a = 2 * kw / (kw * (1 + rho) + qb * (1 - rho));
        return a * (1 + rho) - 1;
    }

    /// <summary>
    /// The resonance condition of a symmetric double barrier: the round trip in the well returns in phase,
    /// r² e^{2ikw} = |r|², i.e. sin(kw + arg r) = 0; at those energies T = 1 exactly (resonant tunnelling, any
    /// textbook; REFERENCES: symmetric double barrier).
    /// </summary>
    private static double Condition(double energy)
    {
        var k = Math.Sqrt(WellMass * energy / HbarSquaredOverTwoMe);
        return Math.Sin(k * Well + BarrierReflection(energy).Phase);
    }

    private static double[] ConditionRoots(double from, double to)
    {
        var roots = new List<double>();
        const int scan = 20000;
        var previous = from;
        var fPrevious = Condition(previous);
        for (var j = 1; j <= scan; j++)
        {
            var e = from + (to - from) * j / scan;
            var f = Condition(e);
            if (Math.Sign(f) != Math.Sign(fPrevious))
            {
                double a = previous, b = e, fa = fPrevious;
                for (var it = 0; it < 200 && b - a > 2e-16 * b; it++)
                {
                    var m = 0.5 * (a + b);
                    var fm = Condition(m);
                    if (Math.Sign(fm) == Math.Sign(fa)) { a = m; fa = fm; } else { b = m; }
                }
                // sin also changes sign where kw + arg r jumps across ±π (arg wraps): keep only true zeros.
                var root = 0.5 * (a + b);
                if (Math.Abs(Condition(root)) < 1e-6)
                {
                    roots.Add(root);
                }
            }
            previous = e;
            fPrevious = f;
        }
        return roots.ToArray();
    }

    [Fact]
    public void Resonances_SymmetricDoubleBarrier_MatchResonanceCondition()
    {
        var file = ToolRunner.TempFile(DoubleBarrier());
        var run = ToolRunner.Invoke("resonances", file, "--from", "0.001", "--to", "0.8", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var peaks = run.Json().GetProperty("resonances").EnumerateArray().ToArray();
        var expected = ConditionRoots(0.001, 0.8);
        Assert.True(expected.Length >= 2, $"the condition has {expected.Length} roots");
        Assert.Equal(expected.Length, peaks.Length);
        var worst = 0.0;
        for (var n = 0; n < expected.Length; n++)
        {
            var energy = peaks[n].GetProperty("energy").GetDouble();
            // 1e-9 relative: the acceptance bound (the search converges to 1e-12 eV, the bisection to the last bit).
            Assert.True(Math.Abs(energy - expected[n]) <= 1e-9 * expected[n], $"peak {n + 1}: tool {energy:R} eV, condition {expected[n]:R} eV");
            // T = 1 at a symmetric double barrier's resonance [derived]; 1e-9: rounding of the peak search.
            Assert.Equal(1.0, peaks[n].GetProperty("peakTransmission").GetDouble(), 1e-9);
            worst = Math.Max(worst, Math.Abs(energy - expected[n]) / expected[n]);
            if (peaks[n].GetProperty("width").ValueKind == System.Text.Json.JsonValueKind.Null)
            {
                continue; // the top peak's upper half-maximum lies beyond the window
            }
            // τ = ħ/Γ (Breit–Wigner), ħ in eV s from CODATA 2018.
            var width = peaks[n].GetProperty("width").GetDouble();
            var hbar = 6.62607015e-34 / (2 * Math.PI) / 1.602176634e-19;
            Assert.Equal(hbar / width, peaks[n].GetProperty("lifetime").GetDouble(), 1e-12 * hbar / width);
        }
        output.WriteLine($"{expected.Length} resonances; worst relative deviation from the resonance condition {worst:E2}");
    }

    [Fact]
    public void Resonances_JsonUnderBias_EqualsLibraryBitForBit_AndCsvEqualsJson()
    {
        var file = ToolRunner.Example("double-barrier-diode.json");
        var json = ToolRunner.Invoke("resonances", file, "--from", "0", "--to", "0.6", "--json");
        Assert.True(json.ExitCode == 0, json.Stderr);
        var structure = StructureFile.Load(file);
        var expected = StackTransmission.Create(structure.Stack!, structure.StackBias).FindResonances(0, 0.6).Resonances;
        var peaks = json.Json().GetProperty("resonances").EnumerateArray().ToArray();
        Assert.Equal(0.1, json.Json().GetProperty("stack").GetProperty("bias").GetDouble());
        Assert.Equal(expected.Count, peaks.Length);
        var csv = ToolRunner.Invoke("resonances", file, "--from", "0", "--to", "0.6", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("peak,energy (eV),peak T,width (eV),lifetime (s)", csv[0]);
        for (var n = 0; n < peaks.Length; n++)
        {
            Assert.Equal(expected[n].EnergyElectronVolts, peaks[n].GetProperty("energy").GetDouble());
            Assert.Equal(expected[n].PeakTransmission, peaks[n].GetProperty("peakTransmission").GetDouble());
            var cells = csv[n + 1].Split(',');
            Assert.Equal(expected[n].EnergyElectronVolts, double.Parse(cells[1], CultureInfo.InvariantCulture));
            if (expected[n].HasWidth)
            {
                Assert.Equal(expected[n].WidthElectronVolts, peaks[n].GetProperty("width").GetDouble());
                Assert.Equal(expected[n].WidthElectronVolts, double.Parse(cells[3], CultureInfo.InvariantCulture));
            }
            else
            {
                // No width: null in JSON, an empty cell in CSV (never "inf").
                Assert.Equal(System.Text.Json.JsonValueKind.Null, peaks[n].GetProperty("width").ValueKind);
                Assert.Equal(string.Empty, cells[3]);
            }
        }
    }

    [Theory]
    [InlineData(new[] { "--to", "0.3" }, "give the window: --from E --to E (eV).")]
    [InlineData(new[] { "--from", "0.3", "--to", "0.1" }, "--to must lie above --from; got --from 0.3 and --to 0.1 eV.")]
    [InlineData(new[] { "--from", "a", "--to", "0.1" }, "--from \"a\" is not a number")]
    [InlineData(new[] { "--from", "0", "--to", "0.3", "--bias", "nan" }, "--bias \"nan\" is not a number")]
    public void Resonances_BadOption_ExitsTwoNamingIt(string[] options, string message)
    {
        var file = ToolRunner.TempFile(DoubleBarrier());
        var target = Path.Combine(Path.GetDirectoryName(file)!, "out.csv");
        var run = ToolRunner.Invoke([.. new[] { "resonances", file, "--csv", "--out", target }, .. options]);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.Single(run.Stderr.Trim().Split('\n'));
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Resonances_PeakWithoutHalfMaximum_TableSaysNaForWidthAsForLifetime()
    {
        // Above a single 4.5 nm GaAs well in Al0.25Ga0.75As the first transmission peak reaches T = 1 and T never falls to half on
        // its upper side: no FWHM (JSON null), which the table shows as "n/a", as its note says, not "inf".
        var file = ToolRunner.TempFile("""{"name": "well", "temperature": "77 K", "cell": [{"material": "Al0.25Ga0.75As", "width": "30 nm"}, {"material": "GaAs", "width": "4.5 nm"}, {"material": "Al0.25Ga0.75As", "width": "30 nm"}]}""");
        var json = ToolRunner.Invoke("resonances", file, "--periods", "1", "--from", "0.2", "--to", "0.5", "--json").Json();
        Assert.Equal(System.Text.Json.JsonValueKind.Null, json.GetProperty("resonances")[0].GetProperty("width").ValueKind);
        var table = ToolRunner.Invoke("resonances", file, "--periods", "1", "--from", "0.2", "--to", "0.5");
        Assert.Equal(0, table.ExitCode);
        var row = table.Stdout.Split('\n').Single(l => l.Contains("277.155", StringComparison.Ordinal)); // the peak at 0.277 eV, in meV
        Assert.DoesNotContain("inf", row);
        Assert.Equal(2, row.Split(' ', StringSplitOptions.RemoveEmptyEntries).Count(c => c == "n/a"));
    }
}
