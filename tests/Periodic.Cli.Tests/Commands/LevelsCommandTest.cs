// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Serialization;
using Periodic.Stacks;
using Xunit.Abstractions;

namespace Periodic.Cli.Tests.Commands;

public sealed class LevelsCommandTest(ITestOutputHelper output)
{
    // ħ²/(2 m_e) in eV nm², from the exact CODATA 2018 h and e and m_e = 9.1093837015e-31 kg (REFERENCES: constants).
    private static readonly double HbarSquaredOverTwoMe =
        Math.Pow(6.62607015e-34 / (2 * Math.PI), 2) / (2 * 9.1093837015e-31) / 1.602176634e-19 * 1e18;

    /// <summary>A finite square well of width <paramref name="width"/> nm and depth <paramref name="depth"/> eV, mass m everywhere.</summary>
    private static string FiniteWell(double width, double depth, double mass) => string.Create(CultureInfo.InvariantCulture, $$"""
        { "name": "finite well", "cell": [ { "width": {{width:R}}, "potential": 0, "mass": {{mass:R}} } ],
          "stack": { "periods": 1, "leads": { "potential": {{depth:R}}, "mass": {{mass:R}} } } }
        """);

    /// <summary>A root of f in [a, b] by bisection to the last bit (f changes sign).</summary>
    private static double Bisect(Func<double, double> f, double a, double b)
    {
        var fa = f(a);
        for (var i = 0; i < 200 && b - a > 2e-16 * Math.Abs(b); i++)
        {
            var m = 0.5 * (a + b);
            var fm = f(m);
            if (Math.Sign(fm) == Math.Sign(fa)) { a = m; fa = fm; } else { b = m; }
        }
        return 0.5 * (a + b);
    }

    /// <summary>
    /// Level energies of the finite square well from Griffiths (Introduction to Quantum Mechanics, 2nd ed., §2.6):
    /// even states z tan z = √(z0² − z²), odd −z cot z = √(z0² − z²), z0 = (L/2)√(2mV0)/ħ, E = ħ²z²/(2m(L/2)²)
    /// above the well bottom. One root per branch (nπ/2, (n+1)π/2) below z0, found by bisection.
    /// </summary>
    private static double[] GriffithsLevels(double width, double depth, double mass)
    {
        var a = width / 2;
        var z0 = a * Math.Sqrt(mass * depth / HbarSquaredOverTwoMe);
        var levels = new List<double>();
        for (var n = 0; n * Math.PI / 2 < z0; n++)
        {
            double lo = n * Math.PI / 2 + 1e-15, hi = Math.Min((n + 1) * Math.PI / 2 - 1e-15, z0);
            // Written without tan/cot poles: even z sin z − √(z0²−z²) cos z, odd −z cos z − √(z0²−z²) sin z.
            Func<double, double> f = n % 2 == 0
                ? z => z * Math.Sin(z) - Math.Sqrt(z0 * z0 - z * z) * Math.Cos(z)
                : z => -z * Math.Cos(z) - Math.Sqrt(z0 * z0 - z * z) * Math.Sin(z);
            if (Math.Sign(f(lo)) == Math.Sign(f(hi)))
            {
                continue; // no root on this branch below z0
            }
            var z = Bisect(f, lo, hi);
            levels.Add(HbarSquaredOverTwoMe * z * z / (mass * a * a));
        }
        return levels.ToArray();
    }

    [Theory]
    [InlineData(1.0, 2.0, 1.0)] // Griffiths-type worked example: levels near 0.23, 0.89, 1.81 eV
    [InlineData(10.0, 0.3, 0.067)] // a GaAs-like well, many levels
    public void Levels_FiniteSquareWell_MatchesTranscendentalEquations(double width, double depth, double mass)
    {
        var file = ToolRunner.TempFile(FiniteWell(width, depth, mass));
        var run = ToolRunner.Invoke("levels", file, "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var got = run.Json().GetProperty("levels").EnumerateArray().Select(l => l.GetProperty("energy").GetDouble()).ToArray();
        var expected = GriffithsLevels(width, depth, mass);
        Assert.Equal(expected.Length, got.Length);
        var worst = expected.Select((e, i) => Math.Abs(got[i] - e) / e).Max();
        output.WriteLine($"{expected.Length} levels; worst relative deviation from the transcendental equations {worst:E2}");
        for (var i = 0; i < expected.Length; i++)
        {
            // 1e-9 relative: the acceptance bound; the library converges to 1e-12 eV and the bisection to the last bit.
            Assert.True(Math.Abs(got[i] - expected[i]) <= 1e-9 * expected[i], $"level {i + 1}: tool {got[i]:R} eV, Griffiths {expected[i]:R} eV");
        }
        if (width == 1.0)
        {
            // The textbook answer to two digits (REFERENCES: finite square well worked example).
            Assert.Equal(new[] { 0.23, 0.89, 1.81 }, got.Select(e => Math.Round(e, 2)).ToArray());
        }
    }

    [Fact]
    public void Levels_Json_EqualsLibraryBitForBit()
    {
        var file = ToolRunner.Example("double-barrier-diode.json");
        var run = ToolRunner.Invoke("levels", file, "--lead-potential", "0.3", "--wavefunctions", "--grid-points", "7", "--margin", "2", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var stack = StructureFile.Load(file).Stack!;
        stack = stack.WithLeads(Lead.Create(Units.Energy.FromElectronVolts(0.3), stack.LeftLead.Mass),
            Lead.Create(Units.Energy.FromElectronVolts(0.3), stack.RightLead.Mass));
        var spectrum = BoundStateSpectrum.Find(stack);
        var levels = json.GetProperty("levels").EnumerateArray().ToArray();
        Assert.Equal(spectrum.Levels.Count, levels.Length);
        Assert.Equal(spectrum.TotalCount, json.GetProperty("totalCount").GetInt32());
        var x = json.GetProperty("wavefunctions").GetProperty("positions").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        Assert.Equal(-2.0, x[0]);
        Assert.Equal(stack.Thickness.Nanometres + 2, x[^1]);
        for (var n = 0; n < levels.Length; n++)
        {
            Assert.Equal(n + 1, levels[n].GetProperty("index").GetInt32());
            Assert.Equal(spectrum.Levels[n].EnergyElectronVolts, levels[n].GetProperty("energy").GetDouble());
            Assert.Equal(spectrum.Levels[n].ErrorElectronVolts, levels[n].GetProperty("error").GetDouble());
            Assert.Equal(n, levels[n].GetProperty("nodes").GetInt32());
            var psi = new double[x.Length];
            spectrum.GetWavefunction(n).Evaluate(x, psi);
            Assert.Equal(psi, json.GetProperty("wavefunctions").GetProperty("values")[n].EnumerateArray().Select(v => v.GetDouble()).ToArray());
        }
    }

    [Fact]
    public void Levels_CsvWavefunctions_EqualJsonBitForBit()
    {
        var file = ToolRunner.TempFile(FiniteWell(5, 0.3, 0.067));
        var json = ToolRunner.Invoke("levels", file, "--wavefunctions", "--grid-points", "11", "--json").Json().GetProperty("wavefunctions");
        var csv = ToolRunner.Invoke("levels", file, "--wavefunctions", "--grid-points", "11", "--csv").Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("x (nm),psi1 (nm^-1/2)", csv[0], StringComparison.Ordinal);
        Assert.Equal(12, csv.Length);
        for (var i = 1; i < csv.Length; i++)
        {
            var cells = csv[i].Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray();
            Assert.Equal(json.GetProperty("positions")[i - 1].GetDouble(), cells[0]);
            for (var n = 1; n < cells.Length; n++)
            {
                Assert.Equal(json.GetProperty("values")[n - 1][i - 1].GetDouble(), cells[n]);
            }
        }
    }

    [Fact]
    public void Levels_TableAndOut_WriteTheSameLevels()
    {
        var file = ToolRunner.TempFile(FiniteWell(5, 0.3, 0.067));
        var target = Path.Combine(Path.GetDirectoryName(file)!, "levels.txt");
        var run = ToolRunner.Invoke("levels", file, "--out", target);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Stdout);
        var text = File.ReadAllText(target);
        Assert.Contains("energy (meV)", text, StringComparison.Ordinal);
        Assert.DoesNotContain("(s)", text, StringComparison.Ordinal);
        Assert.Equal(ToolRunner.Invoke("levels", file).Stdout, text);
    }

    [Theory]
    [InlineData("--grid-points", "1", "--grid-points must be between 2 and 1000000; got 1.")]
    [InlineData("--margin", "-1", "--margin must be between 0 and 1e6 nm; got -1.")]
    [InlineData("--periods", "0", "--periods must be between 1 and 1000000; got 0.")]
    [InlineData("--lead-mass", "0", "--lead-mass must be a positive mass in m0; got 0.")]
    [InlineData("--lead-potential", "x", "--lead-potential \"x\" is not a number")]
    public void Levels_BadOption_ExitsTwoNamingIt(string option, string value, string message)
    {
        var file = ToolRunner.TempFile(FiniteWell(5, 0.3, 0.067));
        var target = Path.Combine(Path.GetDirectoryName(file)!, "out.json");
        var run = ToolRunner.Invoke("levels", file, option, value, "--json", "--out", target);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains(message, run.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    [Fact]
    public void Levels_NoStackAndNoPeriods_ExitsTwo()
    {
        var run = ToolRunner.Invoke("levels", ToolRunner.Example("superlattice.json"));
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("give --periods N", run.Stderr, StringComparison.Ordinal);
    }
}
