// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Bands;
using Periodic.Design;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Tests.Design;

public sealed class EdgeSensitivitiesTest
{
    private static UnitCell Cell(double[] widths, double[] potentials, double[] masses) =>
        UnitCell.Create(widths.Select((w, i) => (CellElement)Layer.Create(Length.FromNanometres(w), Energy.FromElectronVolts(potentials[i]),
            EffectiveMass.FromElectronMasses(masses[i]))).ToArray());

    /// <summary>
    /// Central differences with one Richardson step (Richardson 1911; Press et al., Numerical Recipes, 3rd ed., §5.7 —
    /// docs/references.md): the step-h and step-h/2 differences combined as (4·D(h/2) − D(h))/3 cancel the h² error.
    /// </summary>
    private static double Richardson(Func<double, double> edge, double p, double h)
    {
        double Central(double step) => (edge(p + step) - edge(p - step)) / (2 * step);
        return (4 * Central(h / 2) - Central(h)) / 3;
    }

    public static TheoryData<int, int, LayerQuantity> Cases()
    {
        var data = new TheoryData<int, int, LayerQuantity>();
        foreach (var band in new[] { 1, 2, 3 })
        {
            foreach (var element in new[] { 0, 1, 2 })
            {
                foreach (var quantity in Enum.GetValues<LayerQuantity>())
                {
                    data.Add(band, element, quantity);
                }
            }
        }
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Derivatives_MatchRichardsonExtrapolatedDifferences(int band, int element, LayerQuantity quantity)
    {
        // A three-layer cell with unequal masses and a step, so no derivative vanishes by symmetry.
        double[] widths = [5.0, 2.0, 3.0], potentials = [0.0, 0.25, 0.08], masses = [0.067, 0.092, 0.075];
        var exact = EdgeSensitivities.Compute(BandStructure.Compute(Cell(widths, potentials, masses), 3));
        double Edge(double value, bool bottom)
        {
            double[] w = [.. widths], v = [.. potentials], m = [.. masses];
            (quantity switch { LayerQuantity.Width => w, LayerQuantity.Potential => v, _ => m })[element] = value;
            var b = BandStructure.Compute(Cell(w, v, m), 3).Bands[band - 1];
            return bottom ? b.BottomElectronVolts : b.TopElectronVolts;
        }
        var p = quantity switch { LayerQuantity.Width => widths[element], LayerQuantity.Potential => potentials[element], _ => masses[element] };
        // Steps ~1e-3 of the parameter's scale: the edges are found to ~1e-15 eV, so rounding in the differences stays
        // ~1e-12 of the derivative, and the Richardson remainder (h⁴ terms) ~1e-12 as well.
        var h = quantity == LayerQuantity.Potential ? 1e-3 : 1e-3 * p;
        foreach (var bottom in new[] { true, false })
        {
            var numeric = Richardson(x => Edge(x, bottom), p, h);
            var analytic = (bottom ? exact.Bottom(band, element, quantity) : exact.Top(band, element, quantity))!.Value;
            // The acceptance bound of the design-loop checks: 1e-7 relative (or 1e-9 eV/unit where the derivative is tiny).
            Assert.True(Math.Abs(analytic - numeric) <= 1e-7 * Math.Abs(numeric) + 1e-9,
                $"band {band} {(bottom ? "bottom" : "top")}, element {element}, {quantity}: exact {analytic:R}, differences {numeric:R}");
        }
    }

    [Fact]
    public void PotentialDerivatives_SumToOne()
    {
        // Raising every potential by the same δ shifts every level by exactly δ (a constant in the Hamiltonian; common
        // practice, no single source): the potential derivatives over all layers sum to 1 for every edge.
        var exact = EdgeSensitivities.Compute(BandStructure.Compute(Cell([5.0, 2.0, 3.0], [0.0, 0.25, 0.08], [0.067, 0.092, 0.075]), 3));
        for (var band = 1; band <= 3; band++)
        {
            var bottom = Enumerable.Range(0, 3).Sum(j => exact.Bottom(band, j, LayerQuantity.Potential)!.Value);
            var top = Enumerable.Range(0, 3).Sum(j => exact.Top(band, j, LayerQuantity.Potential)!.Value);
            Assert.Equal(1.0, bottom, 1e-12);
            Assert.Equal(1.0, top, 1e-12);
        }
    }

    [Fact]
    public void EmptyLattice_ClosedGapsHaveNoDerivative()
    {
        // A uniform medium split into two equal layers: every gap is closed (free-particle limit, Ashcroft & Mermin
        // ch. 9 — docs/references.md), so the touching edges are not differentiable and are reported as null.
        var exact = EdgeSensitivities.Compute(BandStructure.Compute(Cell([3.0, 3.0], [0.1, 0.1], [0.067, 0.067]), 2));
        Assert.Null(exact.Top(1, 0, LayerQuantity.Width));
        Assert.Null(exact.Bottom(2, 1, LayerQuantity.Potential));
        Assert.NotNull(exact.Bottom(1, 0, LayerQuantity.Width));
    }

    [Fact]
    public void Delta_IsNotALayer()
    {
        var cell = UnitCell.Create([Layer.Create(Length.FromNanometres(4), Energy.FromElectronVolts(0), EffectiveMass.FromElectronMasses(0.067)),
            DeltaBarrier.Create(0.2)]);
        var exact = EdgeSensitivities.Compute(BandStructure.Compute(cell, 1));
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => exact.Bottom(1, 1, LayerQuantity.Width));
        Assert.Equal("elementIndex", e.ParamName);
    }
}
