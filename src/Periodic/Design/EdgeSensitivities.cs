// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Structures;
using Periodic.Transfer;

namespace Periodic.Design;

/// <summary>A property of one uniform layer that a design can change.</summary>
public enum LayerQuantity
{
    /// <summary>The width, nm: sensitivities in eV/nm.</summary>
    Width,

    /// <summary>The potential energy, eV: sensitivities in eV/eV.</summary>
    Potential,

    /// <summary>The band-edge effective mass, m₀ (a non-parabolicity α held fixed): sensitivities in eV/m₀.</summary>
    Mass,
}

/// <summary>
/// Exact first derivatives of every band edge of a <see cref="BandStructure"/> with respect to the width, potential and
/// mass of each uniform layer of its cell.
/// </summary>
/// <remarks>
/// A band edge is a root of D(E) = ±2, with D = Tr M the dispersion function of the cell. Differentiating
/// D(E(p), p) = ±2 gives dE/dp = −(∂D/∂p)/(∂D/∂E) (implicit function theorem); both partial derivatives are exact:
/// ∂D/∂E is the transfer kernel's energy derivative, ∂D/∂p the trace of the product with the one layer's matrix
/// replaced by its exact parameter derivative. No finite differences are taken. Where a gap is closed (two bands
/// touch, ∂D/∂E = 0 at the shared edge) the edge is not differentiable and the derivative is reported as null.
/// </remarks>
public sealed class EdgeSensitivities
{
    private readonly double?[] _bottoms;
    private readonly double?[] _tops;
    private readonly int _layers;

    private EdgeSensitivities(BandStructure bands, double?[] bottoms, double?[] tops, int layers)
    {
        Bands = bands;
        _bottoms = bottoms;
        _tops = tops;
        _layers = layers;
    }

    /// <summary>The band structure whose edges are differentiated.</summary>
    public BandStructure Bands { get; }

    /// <summary>Computes the derivatives of every edge of <paramref name="bands"/> for every uniform layer of its cell.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="bands"/> is null.</exception>
    public static EdgeSensitivities Compute(BandStructure bands)
    {
        ArgumentNullException.ThrowIfNull(bands);
        var cell = bands.Cell;
        var transfer = CellTransfer.Create(cell);
        var elements = cell.Elements.Count;
        var quantities = Enum.GetValues<LayerQuantity>().Length;
        var bottoms = new double?[bands.Bands.Count * elements * quantities];
        var tops = new double?[bottoms.Length];
        foreach (var band in bands.Bands)
        {
            for (var j = 0; j < elements; j++)
            {
                if (cell.Elements[j] is not Layer)
                {
                    continue;
                }
                for (var q = 0; q < quantities; q++)
                {
                    var at = ((band.Index - 1) * elements + j) * quantities + q;
                    // A closed gap: two bands touch at the shared edge, D meets ±2 with zero slope, and the edge has
                    // no derivative (the two edges cross as the parameter moves).
                    var bottomClosed = band.Index > 1 && bands.Gaps[band.Index - 2].IsClosed;
                    var topClosed = bands.Gaps[band.Index - 1].IsClosed;
                    bottoms[at] = bottomClosed ? null : Derivative(transfer, band.BottomElectronVolts, j, (LayerQuantity)q);
                    tops[at] = topClosed ? null : Derivative(transfer, band.TopElectronVolts, j, (LayerQuantity)q);
                }
            }
        }
        return new EdgeSensitivities(bands, bottoms, tops, elements);
    }

    /// <summary>d(bottom of band <paramref name="bandIndex"/>)/d(<paramref name="quantity"/> of element <paramref name="elementIndex"/>), or null where it does not exist.</summary>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or the element is not a uniform layer.</exception>
    public double? Bottom(int bandIndex, int elementIndex, LayerQuantity quantity) => _bottoms[Index(bandIndex, elementIndex, quantity)];

    /// <summary>d(top of band <paramref name="bandIndex"/>)/d(<paramref name="quantity"/> of element <paramref name="elementIndex"/>), or null where it does not exist.</summary>
    /// <exception cref="ArgumentOutOfRangeException">No such band, or the element is not a uniform layer.</exception>
    public double? Top(int bandIndex, int elementIndex, LayerQuantity quantity) => _tops[Index(bandIndex, elementIndex, quantity)];

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"EdgeSensitivities: {Bands.Bands.Count} band(s) × {_layers} element(s) × width, potential, mass");

    private int Index(int bandIndex, int elementIndex, LayerQuantity quantity)
    {
        Preconditions.CheckRange(bandIndex, 1, Bands.Bands.Count, nameof(bandIndex));
        Preconditions.CheckRange(elementIndex, 0, _layers - 1, nameof(elementIndex));
        if (Bands.Cell.Elements[elementIndex] is not Layer)
        {
            throw new ArgumentOutOfRangeException(nameof(elementIndex), elementIndex,
                string.Create(CultureInfo.InvariantCulture, $"element {elementIndex} is a {Bands.Cell.Elements[elementIndex].GetType().Name}; sensitivities are defined for uniform layers."));
        }
        if (!Enum.IsDefined(quantity))
        {
            throw new ArgumentOutOfRangeException(nameof(quantity), quantity, "quantity must be Width, Potential or Mass.");
        }
        return ((bandIndex - 1) * _layers + elementIndex) * Enum.GetValues<LayerQuantity>().Length + (int)quantity;
    }

    private static double? Derivative(CellTransfer transfer, double edge, int element, LayerQuantity quantity)
    {
        var parameter = quantity switch
        {
            LayerQuantity.Width => LayerParameter.Width,
            LayerQuantity.Potential => LayerParameter.Potential,
            _ => LayerParameter.Mass,
        };
        var dDdp = transfer.TraceParameterDerivative(edge, element, parameter, out _, out var parameterScale);
        var energy = transfer.Dispersion(edge);
        var dDdE = energy.ScaledTraceDerivativePerElectronVolt;
        if (dDdE == 0)
        {
            return null;
        }
        var value = -dDdp / dDdE * Math.Exp(parameterScale - energy.LogScale);
        return double.IsFinite(value) ? value : null;
    }
}
