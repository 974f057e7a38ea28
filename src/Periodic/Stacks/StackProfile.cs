// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// A stack written out element by element (repeated cells expanded), for the bound-state count and the
/// wavefunctions: packed element data, positions of the element boundaries, and state propagation in
/// both directions with a zero count, built on the core layer propagator.
/// </summary>
internal sealed class StackProfile
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double RenormaliseAbove = 1e120;
    private const double RenormaliseBelow = 1e-120;

    internal readonly bool[] IsDelta;
    internal readonly double[] Widths;
    internal readonly double[] Potentials;
    internal readonly double[] Masses;
    internal readonly double[] MassSlopes;
    internal readonly double[] DeltaJumps;
    internal readonly double[] Boundaries; // Boundaries[i] = left end of element i; Boundaries[n] = thickness

    internal StackProfile(LayerStack stack, long maxElements, string paramName)
    {
        Stack = stack;
        if (stack.ElementCount > maxElements)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"{paramName} has {stack.ElementCount} elements when its repeated cells are written out; bound states are computed for at most {maxElements}."),
                paramName);
        }
        var n = (int)stack.ElementCount;
        IsDelta = new bool[n];
        Widths = new double[n];
        Potentials = new double[n];
        Masses = new double[n];
        MassSlopes = new double[n];
        DeltaJumps = new double[n];
        Boundaries = new double[n + 1];
        var i = 0;
        double x = 0, vMin = Math.Min(stack.LeftLead.PotentialElectronVolts, stack.RightLead.PotentialElectronVolts);
        var lowest = double.NegativeInfinity;
        var deltaWellStrength = 0.0;
        foreach (var part in stack.PartSpan)
        {
            var elements = part.Cell is null ? [part.Element!] : part.Cell.Elements.ToArray();
            for (var r = 0; r < part.Repetitions; r++)
            {
                foreach (var element in elements)
                {
                    Boundaries[i] = x;
                    switch (element)
                    {
                        case Layer layer:
                            Widths[i] = layer.Width.Nanometres;
                            Potentials[i] = layer.Potential.ElectronVolts;
                            Masses[i] = layer.Mass.ElectronMasses;
                            MassSlopes[i] = layer.Mass.ElectronMasses * layer.NonParabolicityPerElectronVolt;
                            vMin = Math.Min(vMin, Potentials[i]);
                            lowest = Math.Max(lowest, layer.LowestValidEnergyElectronVolts());
                            break;
                        case DeltaBarrier delta:
                            IsDelta[i] = true;
                            DeltaJumps[i] = delta.StrengthElectronVoltNanometres / C;
                            deltaWellStrength += Math.Max(0, -delta.StrengthElectronVoltNanometres);
                            break;
                        default:
                            throw new ArgumentException(
                                string.Create(CultureInfo.InvariantCulture, $"stack element {i} is of unsupported type {element.GetType().Name}."),
                                paramName);
                    }
                    x += Widths[i];
                    i++;
                }
            }
        }
        Boundaries[n] = x;
        MinimumPotentialElectronVolts = vMin;
        LowestValidEnergyElectronVolts = lowest;
        DeltaWellStrengthElectronVoltNanometres = deltaWellStrength;
    }

    internal LayerStack Stack { get; }

    internal int Count => Widths.Length;

    internal double MinimumPotentialElectronVolts { get; }

    internal double LowestValidEnergyElectronVolts { get; }

    /// <summary>Sum of the strengths of the delta wells (eV nm, ≥ 0).</summary>
    internal double DeltaWellStrengthElectronVoltNanometres { get; }

    /// <summary>m(E) and s = m(E)(E − V)/C of layer <paramref name="i"/>.</summary>
    internal void LayerCoefficients(int i, double e, out double mass, out double s)
    {
        var excess = e - Potentials[i];
        mass = Masses[i] + MassSlopes[i] * excess;
        s = mass * excess / C;
    }

    /// <summary>Propagates (u, w)·e^log across element i, left to right; returns the zeros of ψ in (x_i, x_{i+1}].</summary>
    internal int StepForward(int i, double e, ref double u, ref double w, ref double log)
    {
        if (IsDelta[i])
        {
            w += DeltaJumps[i] * u;
            return 0;
        }
        LayerCoefficients(i, e, out var mass, out var s);
        UniformLayerPropagator.Values(s, Widths[i], out var c, out var sinc, out var logScale);
        var u1 = c * u + mass * sinc * w;
        var w1 = -(s / mass) * sinc * u + c * w;
        var zeros = CellTransfer.LayerZeros(u, w, u1, w1, s, Widths[i], mass);
        u = u1;
        w = w1;
        log += logScale;
        Renormalise(ref u, ref w, ref log);
        return zeros;
    }

    /// <summary>Propagates (u, w)·e^log across element i, right to left (the inverse matrix).</summary>
    internal void StepBackward(int i, double e, ref double u, ref double w, ref double log)
    {
        if (IsDelta[i])
        {
            w -= DeltaJumps[i] * u;
            return;
        }
        LayerCoefficients(i, e, out var mass, out var s);
        UniformLayerPropagator.Values(s, Widths[i], out var c, out var sinc, out var logScale);
        var u0 = c * u - mass * sinc * w;
        var w0 = (s / mass) * sinc * u + c * w;
        u = u0;
        w = w0;
        log += logScale;
        Renormalise(ref u, ref w, ref log);
    }

    private static void Renormalise(ref double u, ref double w, ref double log)
    {
        var max = Math.Max(Math.Abs(u), Math.Abs(w));
        if (max > RenormaliseAbove || (max < RenormaliseBelow && max > 0))
        {
            var exponent = Math.ILogB(max);
            u = Math.ScaleB(u, -exponent);
            w = Math.ScaleB(w, -exponent);
            log += exponent * Math.Log(2.0);
        }
    }

    internal double LeftDecay(double e) => Stack.LeftLead.DecayConstantPerNanometre(e);

    internal double RightDecay(double e) => Stack.RightLead.DecayConstantPerNanometre(e);

    /// <summary>
    /// Number of bound states strictly below <paramref name="e"/> (e below both lead edges): the zeros on the
    /// whole line of the solution that decays into the left lead (Sturm oscillation theorem).
    /// </summary>
    internal int CountBelow(double e, out double mismatch)
    {
        var mLeft = Stack.LeftLead.MassElectronMasses;
        double u = 1, w = LeftDecay(e) / mLeft, log = 0;
        var zeros = 0;
        for (var i = 0; i < Widths.Length; i++)
        {
            zeros += StepForward(i, e, ref u, ref w, ref log);
        }
        // In the right lead ψ = A e^{κ(x−L)} + B e^{−κ(x−L)}; it has one more zero iff u(L) and A have opposite signs.
        var tail = Stack.RightLead.MassElectronMasses * w / RightDecay(e);
        var growing = u + tail;
        if (u * growing < 0)
        {
            zeros++;
        }
        var scale = Math.Max(Math.Abs(u), Math.Abs(tail));
        mismatch = scale > 0 && double.IsFinite(scale) ? (u / scale + tail / scale) / Math.Sqrt((u / scale) * (u / scale) + (tail / scale) * (tail / scale)) : 0.0;
        return zeros;
    }

    /// <summary>∫ψ² over layer i (log), for ψ = A c(y) + B S(y), y measured from the end the state is given at.</summary>
    internal double LogLayerIntegral(int i, double e, double a, double b)
    {
        LayerCoefficients(i, e, out _, out var s);
        var width = Widths[i];
        var z = s * width * width;
        double integral, logExtra = 0;
        if (s < 0 && z <= -1)
        {
            var kappa = Math.Sqrt(-s);
            var theta = kappa * width;
            var q = Math.Exp(-2 * theta);
            var alpha = 0.5 * (a + b / kappa);
            var beta = 0.5 * (a - b / kappa);
            integral = alpha * alpha * (1 - q) / (2 * kappa) + beta * beta * q * (1 - q) / (2 * kappa) + 2 * alpha * beta * width * q;
            logExtra = 2 * theta;
        }
        else
        {
            UniformLayerPropagator.UnscaledValues(s, width, out var c, out var sinc);
            UniformLayerPropagator.SquareIntegrals(s, width, c, sinc, out var cc, out var cs, out var ss);
            integral = a * a * cc + 2 * a * b * cs + b * b * ss;
        }
        return integral > 0 ? Math.Log(integral) + logExtra : double.NegativeInfinity;
    }
}
