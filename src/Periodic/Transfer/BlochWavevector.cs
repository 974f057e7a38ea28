// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.Transfer;

/// <summary>
/// A complex Bloch wavevector k = <see cref="RealPerNanometre"/> + i·<see cref="ImaginaryPerNanometre"/>
/// in the reduced zone: the real part lies in [0, π/d], the imaginary part is ≥ 0 (the decay constant
/// of the evanescent Bloch wave in a gap, zero inside a band).
/// </summary>
public readonly record struct BlochWavevector
{
    internal BlochWavevector(double realPerNanometre, double imaginaryPerNanometre, double periodNanometres)
    {
        RealPerNanometre = realPerNanometre;
        ImaginaryPerNanometre = imaginaryPerNanometre;
        PeriodNanometres = periodNanometres;
    }

    /// <summary>Re k in 1/nm, in [0, π/d].</summary>
    public double RealPerNanometre { get; }

    /// <summary>Im k in 1/nm, ≥ 0: the amplitude of a gap state falls by e^(−Im k·d) per period.</summary>
    public double ImaginaryPerNanometre { get; }

    /// <summary>The period d in nm.</summary>
    public double PeriodNanometres { get; }

    /// <summary>True inside an allowed band (Im k = 0).</summary>
    public bool IsPropagating => ImaginaryPerNanometre == 0;

    /// <summary>The dimensionless Bloch phase Re(k)·d in [0, π].</summary>
    public double PhasePerPeriod => RealPerNanometre * PeriodNanometres;

    /// <summary>The decay length 1/Im k in nm; +∞ inside a band.</summary>
    public double DecayLengthNanometres => ImaginaryPerNanometre == 0 ? double.PositiveInfinity : 1.0 / ImaginaryPerNanometre;

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"k = {RealPerNanometre:G8} + {ImaginaryPerNanometre:G8}i /nm");
}
