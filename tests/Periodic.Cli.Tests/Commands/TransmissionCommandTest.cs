// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Serialization;
using Periodic.Stacks;
using Periodic.Units;

namespace Periodic.Cli.Tests.Commands;

public sealed class TransmissionCommandTest
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    [Fact]
    public void Transmission_SingleBarrier_MatchesTextbookFormula()
    {
        // One rectangular barrier (height V, width a, same mass m as the leads):
        // T = 1 / (1 + V^2 sinh^2(kappa a) / (4 E (V - E))) below the top, kappa = sqrt(m (V - E) / C);
        // T = 1 / (1 + V^2 sin^2(q a) / (4 E (E - V))) above it, q = sqrt(m (E - V) / C)
        // (D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., problem 2.33 / eq. 2.169).
        const double v = 0.3, a = 1.5, m = 0.067;
        var file = ToolRunner.TempFile(string.Create(CultureInfo.InvariantCulture,
            $$"""{"name": "barrier", "cell": [{"width": {{a}}, "potential": {{v}}, "mass": {{m}}}]}"""));
        var energies = new[] { 0.02, 0.1, 0.2, 0.29, 0.35, 0.6 };
        var run = ToolRunner.Invoke("transmission", file, "--periods", "1", "--lead-potential", "0", "--lead-mass", "0.067",
            "--energies", string.Join(",", energies.Select(e => e.ToString("R", CultureInfo.InvariantCulture))), "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var points = run.Json().GetProperty("points");
        for (var i = 0; i < energies.Length; i++)
        {
            var e = energies[i];
            double expected;
            if (e < v)
            {
                var s = Math.Sinh(Math.Sqrt(m * (v - e) / C) * a);
                expected = 1 / (1 + v * v * s * s / (4 * e * (v - e)));
            }
            else
            {
                var s = Math.Sin(Math.Sqrt(m * (e - v) / C) * a);
                expected = 1 / (1 + v * v * s * s / (4 * e * (e - v)));
            }
            var p = points[i];
            // Closed forms and transfer matrices agree to rounding; 1e-10 relative allows for the
            // cancellation in sinh/sin of modest arguments.
            Assert.Equal(expected, p.GetProperty("transmission").GetDouble(), expected * 1e-10);
            Assert.Equal(1 - expected, p.GetProperty("reflection").GetDouble(), 1e-10);
        }
    }

    [Fact]
    public void Transmission_Json_MatchesLibrary()
    {
        var file = ToolRunner.Example("superlattice.json");
        var run = ToolRunner.Invoke("transmission", file, "--periods", "8", "--from", "0.01", "--to", "0.5", "--points", "25", "--json");
        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var cell = StructureFile.Load(file).Cell;
        // Default leads: the first layer's potential and mass (the 5 nm well: 0 eV, 0.067 m0).
        var lead = Lead.Create(Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067));
        var stack = StackTransmission.Create(LayerStack.Periodic(lead, cell, 8, lead));
        Assert.Equal(0.067, json.GetProperty("stack").GetProperty("leftLead").GetProperty("mass").GetDouble());
        Assert.Equal(56.0, json.GetProperty("stack").GetProperty("thickness").GetDouble());
        foreach (var p in json.GetProperty("points").EnumerateArray())
        {
            var r = stack.Evaluate(p.GetProperty("energy").GetDouble());
            Assert.Equal(r.Transmission, p.GetProperty("transmission").GetDouble()); // round-trip JSON: exact
            Assert.Equal(r.Reflection, p.GetProperty("reflection").GetDouble());
        }
    }

    [Fact]
    public void Transmission_BelowTheLeads_IsZeroAndReportedAsClosed()
    {
        var run = ToolRunner.Invoke("transmission", ToolRunner.Example("superlattice.json"), "--periods", "2", "--energies", "-0.1", "--json");
        Assert.Equal(0, run.ExitCode);
        var p = run.Json().GetProperty("points")[0];
        Assert.Equal(0.0, p.GetProperty("transmission").GetDouble());
        Assert.Equal(1.0, p.GetProperty("reflection").GetDouble());
        Assert.False(p.GetProperty("leadsOpen").GetBoolean());
        Assert.Equal(System.Text.Json.JsonValueKind.Null, p.GetProperty("log10Transmission").ValueKind);
    }

    [Theory]
    [InlineData("--energies", "0.1")]
    [InlineData("--periods", "0", "--energies", "0.1")]
    [InlineData("--periods", "3", "--energies", "0.1", "--lead-mass", "-1")]
    public void Transmission_BadUsage_IsExitCodeTwo(params string[] args)
    {
        var run = ToolRunner.Invoke(new[] { "transmission", ToolRunner.Example("superlattice.json") }.Concat(args).ToArray());
        Assert.Equal(2, run.ExitCode);
        Assert.StartsWith("periodic: error: ", run.Stderr, StringComparison.Ordinal);
        Assert.Single(run.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries));
    }
}

public sealed class TransmissionFromFileStackTest
{
    [Fact]
    public void Transmission_FileStack_GivesPeriodsAndLeads()
    {
        var file = ToolRunner.Example("filter-stack.json");
        var run = ToolRunner.Invoke("transmission", file, "--energies", "0.05,0.1,0.2", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var stack = Periodic.Serialization.StructureFile.Load(file).Stack!;
        Assert.Equal(12, json.GetProperty("stack").GetProperty("periods").GetInt32());
        Assert.Equal(-0.02, json.GetProperty("stack").GetProperty("leftLead").GetProperty("potential").GetDouble(), 1e-17);
        var reference = Periodic.Stacks.StackTransmission.Create(stack);
        foreach (var p in json.GetProperty("points").EnumerateArray())
        {
            Assert.Equal(reference.Evaluate(p.GetProperty("energy").GetDouble()).Transmission, p.GetProperty("transmission").GetDouble());
        }
    }

    [Fact]
    public void Transmission_LeadMassOption_KeepsTheFileLeadPotential()
    {
        // --lead-mass replaces the mass of both of the file's leads and nothing else (docs/cli.md): the file's −20 meV
        // lead edge stays, and T equals the library's for those leads.
        var file = ToolRunner.Example("filter-stack.json");
        var run = ToolRunner.Invoke("transmission", file, "--energies", "0.05,0.1", "--lead-mass", "0.08", "--json");
        Assert.True(run.ExitCode == 0, run.Stderr);
        var json = run.Json();
        var lead = json.GetProperty("stack").GetProperty("leftLead");
        Assert.Equal(-0.02, lead.GetProperty("potential").GetDouble(), 1e-17);
        Assert.Equal(0.08, lead.GetProperty("mass").GetDouble());
        var fileStack = Periodic.Serialization.StructureFile.Load(file).Stack!;
        var mass = Periodic.Units.EffectiveMass.FromElectronMasses(0.08);
        var stack = fileStack.WithLeads(Periodic.Stacks.Lead.Create(Periodic.Units.Energy.FromElectronVolts(fileStack.LeftLead.Potential.ElectronVolts), mass), Periodic.Stacks.Lead.Create(Periodic.Units.Energy.FromElectronVolts(fileStack.RightLead.Potential.ElectronVolts), mass));
        var reference = Periodic.Stacks.StackTransmission.Create(stack);
        foreach (var p in json.GetProperty("points").EnumerateArray())
        {
            Assert.Equal(reference.Evaluate(p.GetProperty("energy").GetDouble()).Transmission, p.GetProperty("transmission").GetDouble());
        }
    }
}
