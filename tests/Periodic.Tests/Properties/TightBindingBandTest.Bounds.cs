// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Properties;
using static Periodic.Tests.TestHelpers.Checks;

namespace Periodic.Tests.Properties;

/// <summary>The tight-binding fit stays within its own error bounds.</summary>
public sealed partial class TightBindingBandTest
{
    [Fact]
    public void TightBindingFit_StaysWithinItsErrorBounds()
    {
        var bands = Fixtures.Bands;
        var kMax = Math.PI / bands.PeriodNanometres;
        for (var n = 1; n <= 2; n++)
        {
            var fit = TightBindingBand.Fit(bands, n);
            Finite(fit.OnSiteEnergyElectronVolts, "E0");
            Finite(fit.NearestNeighbourHoppingElectronVolts, "t");
            var m = fit.CoefficientsElectronVolts.Count - 1;
            foreach (var terms in new[] { 1, Math.Min(3, m), m })
            {
                var bound = fit.TruncationErrorBoundElectronVolts(terms) + fit.AliasingErrorElectronVolts;
                Finite(bound, "bound");
                foreach (var f in new[] { 0.0, 0.3, 0.77, 1.0 })
                {
                    var k = f * kMax;
                    var exact = bands.EnergyAt(n, k);
                    var fitted = fit.EnergyAt(k, terms);
                    Finite(fitted, "fit");
                    // The documented bounds, plus 1e-12 eV of rounding.
                    Assert.True(Math.Abs(fitted - exact) <= bound + 1e-12, $"band {n}, {terms} terms, k = {k}: |{fitted} - {exact}| > {bound}");
                }
            }
            Assert.Equal("terms", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(0.1, m + 1)).ParamName);
            Assert.Equal("terms", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(0.1, -1)).ParamName);
            Assert.Equal("wavevectorPerNanometre", Assert.ThrowsAny<ArgumentException>(() => fit.EnergyAt(double.NaN, 1)).ParamName);
        }
        Assert.Equal("bandIndex", Assert.ThrowsAny<ArgumentException>(() => TightBindingBand.Fit(bands, 5)).ParamName);
    }
}
