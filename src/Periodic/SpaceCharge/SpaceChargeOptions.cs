// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.SpaceCharge;

/// <summary>Tuning knobs of <see cref="SpaceChargeSolver"/>; every default lives here.</summary>
public sealed class SpaceChargeOptions
{
    /// <summary>Default tolerance on the Hartree potential between two iterations, eV.</summary>
    public const double DefaultToleranceElectronVolts = 1e-9;

    /// <summary>Default iteration budget of the outer (Schrödinger–Poisson) loop.</summary>
    public const int DefaultMaxIterations = 100;

    /// <summary>Default largest grid spacing of the Poisson grid and of the sampled potential, nm.</summary>
    public const double DefaultMaxGridSpacingNanometres = 0.1;

    /// <summary>Default number of Gauss–Legendre nodes in the Bloch phase θ = k_z·d ∈ [0, π] per band.</summary>
    public const int DefaultWavevectorNodes = 24;

    /// <summary>Default width of lead material kept inside the computed domain of a finite stack on each side, nm.</summary>
    public const double DefaultLeadBufferNanometres = 30;

    /// <summary>The most grid points a cell may need (period / spacing): bounds memory and time per iteration.</summary>
    public const int MaxGridPoints = 20000;

    private SpaceChargeOptions(double tolerance, int maxIterations, double spacing, int nodes, double buffer)
    {
        LeadBufferNanometres = buffer;
        ToleranceElectronVolts = tolerance;
        MaxIterations = maxIterations;
        MaxGridSpacingNanometres = spacing;
        WavevectorNodes = nodes;
    }

    /// <summary>The default options.</summary>
    public static SpaceChargeOptions Default { get; } = new(DefaultToleranceElectronVolts, DefaultMaxIterations, DefaultMaxGridSpacingNanometres, DefaultWavevectorNodes, DefaultLeadBufferNanometres);

    /// <summary>Stop when the largest change of the Hartree potential in one iteration is below this, eV.</summary>
    public double ToleranceElectronVolts { get; }

    /// <summary>Outer iterations allowed before the solver gives up.</summary>
    public int MaxIterations { get; }

    /// <summary>Largest grid spacing, nm (each layer gets an even number of equal intervals no wider than this).</summary>
    public double MaxGridSpacingNanometres { get; }

    /// <summary>Gauss–Legendre nodes in the Bloch phase per band.</summary>
    public int WavevectorNodes { get; }

    /// <summary>
    /// A finite stack's buffers: this width of each lead's material is kept inside the computed domain (where the leads' bands
    /// may bend), with no electric field through the domain's outer ends and hard walls there for the electrons' states, nm.
    /// </summary>
    public double LeadBufferNanometres { get; }

    /// <summary>Creates options.</summary>
    /// <param name="toleranceElectronVolts">In [1e-13, 1e-2] eV.</param>
    /// <param name="maxIterations">In [1, 1000].</param>
    /// <param name="maxGridSpacingNanometres">In [0.001, 5] nm.</param>
    /// <param name="wavevectorNodes">In [2, 512].</param>
    /// <param name="leadBufferNanometres">In [0, 1000] nm.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range.</exception>
    public static SpaceChargeOptions Create(double toleranceElectronVolts = DefaultToleranceElectronVolts, int maxIterations = DefaultMaxIterations,
        double maxGridSpacingNanometres = DefaultMaxGridSpacingNanometres, int wavevectorNodes = DefaultWavevectorNodes,
        double leadBufferNanometres = DefaultLeadBufferNanometres) => new(
            Preconditions.CheckRange(toleranceElectronVolts, 1e-13, 1e-2),
            Preconditions.CheckRange(maxIterations, 1, 1000),
            Preconditions.CheckRange(maxGridSpacingNanometres, 0.001, 5),
            Preconditions.CheckRange(wavevectorNodes, 2, 512),
            Preconditions.CheckRange(leadBufferNanometres, 0, 1000));

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"tolerance {ToleranceElectronVolts:G3} eV, max {MaxIterations} iterations, grid <= {MaxGridSpacingNanometres:G3} nm, {WavevectorNodes} k nodes per band, lead buffers {LeadBufferNanometres:G4} nm");
}
