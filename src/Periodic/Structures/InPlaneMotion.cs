// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Units;

namespace Periodic.Structures;

/// <summary>
/// Motion in the layer plane: the unit cell as a carrier with in-plane wavevector k∥ sees it. The envelope
/// equation at k∥ is the one at k∥ = 0 with the potential V(z) + ħ²k∥²/2m(z) (G. Bastard, Wave Mechanics Applied
/// to Semiconductor Heterostructures, 1988, ch. 3 [from memory]), so every exact solver of the library (bands, Bloch
/// functions, stacks) applies unchanged to the transformed cell, and the energies it returns are total energies
/// E_n(k_z, k∥).
/// </summary>
/// <remarks>
/// <para>Model: the single-band envelope-function approximation with BenDaniel–Duke matching, the in-plane dispersion of
/// each layer isotropic with the layer's own mass. A uniform parabolic layer (V, m) becomes (V + ħ²k∥²/2m, m): exact.
/// A delta barrier has no width and no in-plane kinetic energy of its own: unchanged. A <see cref="FourierSegment"/>
/// (one mass) shifts its constant term by ħ²k∥²/2m: exact.</para>
/// <para>A non-parabolic layer, m(E) = m(1 + α(E − V)), is taken with the energy-dependent mass in both terms, i.e.
/// the bulk Kane-type dispersion (E − V)(1 + α(E − V)) = ħ²(k_z² + k∥²)/2m: its z-wavenumber is
/// k_z² = 2m(E)(E − V)/ħ² − k∥². That in-plane term depends on E, so the cell is built for a reference energy E_r:
/// a layer with V′ = V + Δ, m′ = m(1 + αΔ), α′ = α/(1 + αΔ), Δ = ħ²k∥²/2m(E_r), whose mass m′(E) equals m(E) for
/// every E and whose z-wavenumber is exact at E = E_r. An eigenvalue E of the transformed cell is therefore exact when
/// E = E_r; <c>Periodic.Properties.InPlaneDispersion</c> iterates E_r to that fixed point.</para>
/// <para>Not covered (refused with an <see cref="ArgumentException"/> naming the element): <see cref="FunctionSegment"/>
/// and <see cref="SampledSegment"/>, whose potentials are not open to transformation.</para>
/// </remarks>
public static class InPlaneMotion
{
    /// <summary>
    /// The largest in-plane wavevector accepted, 1/nm (10 /nm = 1 /Å): beyond it the carrier's in-plane wavelength is
    /// below the lattice constant of any semiconductor and the envelope-function model has no meaning.
    /// </summary>
    public const double MaxWavevectorPerNanometre = 10;

    /// <summary>The in-plane kinetic energy ħ²k∥²/2m of a carrier of mass <paramref name="massElectronMasses"/> (m₀), eV.</summary>
    internal static double KineticEnergy(double inPlaneWavevectorPerNanometre, double massElectronMasses) =>
        PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2 * inPlaneWavevectorPerNanometre * inPlaneWavevectorPerNanometre / massElectronMasses;

    /// <summary>Checks an in-plane wavevector: finite, from 0 to <see cref="MaxWavevectorPerNanometre"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is NaN, infinite, negative or above the limit.</exception>
    internal static double CheckWavevector(double value, string paramName)
    {
        if (!(value >= 0 && value <= MaxWavevectorPerNanometre))
        {
            throw new ArgumentOutOfRangeException(paramName, value, string.Create(CultureInfo.InvariantCulture,
                $"{paramName} must be an in-plane wavevector from 0 to {MaxWavevectorPerNanometre} 1/nm (finite, not negative; its sign carries no meaning, only |k∥|); got {Preconditions.Format(value)}."));
        }
        return value;
    }

    /// <summary>True when no element of the cell has an energy-dependent mass (no non-parabolic layer).</summary>
    public static bool IsParabolic(UnitCell cell)
    {
        ArgumentNullException.ThrowIfNull(cell);
        foreach (var element in cell.ElementSpan)
        {
            if (element is Layer { NonParabolicityPerElectronVolt: > 0 })
            {
                return false;
            }
        }
        return true;
    }

    /// <summary>
    /// The cell seen by a carrier with in-plane wavevector <paramref name="inPlaneWavevectorPerNanometre"/>: every layer's
    /// potential raised by ħ²k∥²/2m of its own mass. Exact for parabolic layers, delta barriers and Fourier segments.
    /// </summary>
    /// <param name="cell">The cell.</param>
    /// <param name="inPlaneWavevectorPerNanometre">|k∥| in 1/nm, from 0 to <see cref="MaxWavevectorPerNanometre"/>.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">k∥ is not finite, negative or above the limit.</exception>
    /// <exception cref="ArgumentException">The cell holds a non-parabolic layer (use the overload with a reference energy) or a
    /// function or sampled segment (the message names the element).</exception>
    public static UnitCell CellAt(UnitCell cell, double inPlaneWavevectorPerNanometre)
    {
        ArgumentNullException.ThrowIfNull(cell);
        CheckWavevector(inPlaneWavevectorPerNanometre, nameof(inPlaneWavevectorPerNanometre));
        var elements = cell.ElementSpan;
        for (var i = 0; i < elements.Length; i++)
        {
            if (elements[i] is Layer { NonParabolicityPerElectronVolt: > 0 })
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"cell element {i} is a non-parabolic layer: its in-plane energy depends on the energy itself, so the cell at k∥ needs a reference energy (CellAt(cell, k, referenceEnergyElectronVolts)) or the self-consistent InPlaneDispersion."),
                    nameof(cell));
            }
        }
        return Transform(cell, inPlaneWavevectorPerNanometre, 0.0);
    }

    /// <summary>
    /// The cell seen at in-plane wavevector k∥, exact at the energy <paramref name="referenceEnergyElectronVolts"/>: non-parabolic
    /// layers take their in-plane kinetic energy ħ²k∥²/2m(E_r) with the mass at that energy (see the remarks of the class);
    /// parabolic layers are transformed exactly as by <see cref="CellAt(UnitCell, double)"/>.
    /// </summary>
    /// <param name="cell">The cell.</param>
    /// <param name="inPlaneWavevectorPerNanometre">|k∥| in 1/nm, from 0 to <see cref="MaxWavevectorPerNanometre"/>.</param>
    /// <param name="referenceEnergyElectronVolts">E_r in eV; every non-parabolic layer's mass must be positive there.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">k∥ is out of range, or E_r is not finite or lies where a non-parabolic mass is not positive.</exception>
    /// <exception cref="ArgumentException">The cell holds a function or sampled segment.</exception>
    public static UnitCell CellAt(UnitCell cell, double inPlaneWavevectorPerNanometre, double referenceEnergyElectronVolts)
    {
        ArgumentNullException.ThrowIfNull(cell);
        CheckWavevector(inPlaneWavevectorPerNanometre, nameof(inPlaneWavevectorPerNanometre));
        Preconditions.CheckFinite(referenceEnergyElectronVolts);
        var elements = cell.ElementSpan;
        for (var i = 0; i < elements.Length; i++)
        {
            if (elements[i] is Layer { NonParabolicityPerElectronVolt: > 0 } layer && !(referenceEnergyElectronVolts > layer.LowestValidEnergyElectronVolts()))
            {
                throw new ArgumentOutOfRangeException(nameof(referenceEnergyElectronVolts), referenceEnergyElectronVolts, string.Create(CultureInfo.InvariantCulture,
                    $"referenceEnergyElectronVolts must lie above {Preconditions.Format(layer.LowestValidEnergyElectronVolts())} eV, where the mass of the non-parabolic cell element {i} stays positive; got {Preconditions.Format(referenceEnergyElectronVolts)}."));
            }
        }
        return Transform(cell, inPlaneWavevectorPerNanometre, referenceEnergyElectronVolts);
    }

    /// <summary>One element seen at k∥ (reference energy used by non-parabolic layers only).</summary>
    /// <exception cref="ArgumentException">A function or sampled segment.</exception>
    internal static CellElement ElementAt(CellElement element, double k, double referenceEnergy, int index, string paramName)
    {
        switch (element)
        {
            case DeltaBarrier:
                return element;
            case Layer { NonParabolicityPerElectronVolt: > 0 } layer:
            {
                var alpha = layer.NonParabolicityPerElectronVolt;
                var m = layer.Mass.ElectronMasses;
                var massAtReference = m * (1 + alpha * (referenceEnergy - layer.Potential.ElectronVolts));
                var shift = KineticEnergy(k, massAtReference);
                var stretch = 1 + alpha * shift;
                return Layer.Create(layer.Width, Energy.FromElectronVolts(layer.Potential.ElectronVolts + shift),
                    EffectiveMass.FromElectronMasses(m * stretch), alpha / stretch);
            }
            case Layer layer:
                return layer.WithPotential(Energy.FromElectronVolts(layer.Potential.ElectronVolts + KineticEnergy(k, layer.Mass.ElectronMasses)));
            case FourierSegment fourier:
            {
                var cosine = fourier.CosineElectronVolts.ToArray();
                var sine = fourier.SineElectronVolts.ToArray();
                return FourierSegment.Create(fourier.Width,
                    Energy.FromElectronVolts(fourier.Constant.ElectronVolts + KineticEnergy(k, fourier.Mass.ElectronMasses)),
                    cosine, sine, fourier.Mass, fourier.StepCount);
            }
            default:
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"element {index} is a {element.GetType().Name}: in-plane motion is modelled for layers, delta barriers and Fourier segments only (a function or sampled segment's potential cannot be shifted by ħ²k∥²/2m(z) here)."),
                    paramName);
        }
    }

    private static UnitCell Transform(UnitCell cell, double k, double referenceEnergy)
    {
        var elements = cell.ElementSpan;
        var transformed = new CellElement[elements.Length];
        for (var i = 0; i < elements.Length; i++)
        {
            transformed[i] = ElementAt(elements[i], k, referenceEnergy, i, nameof(cell));
        }
        return UnitCell.Create(transformed);
    }
}
