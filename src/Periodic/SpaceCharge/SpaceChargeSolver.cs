// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Bands;
using Periodic.Numerics;
using Periodic.Properties;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// Self-consistent (Schrödinger–Poisson, Hartree) bands of a doped superlattice, and of a finite doped stack between leads at
/// zero bias (<see cref="SolveStack(DopedStack, SpaceChargeOptions?, IProgress{SpaceChargeProgress}?, CancellationToken)"/>): the electrons of the cell's minibands,
/// in thermal equilibrium at one Fermi level, and the ionised dopants set the electrostatic potential, which in turn
/// shapes the minibands; holes of the cell's valence bands, where given, take part at the same Fermi level.
/// </summary>
/// <remarks>
/// <para>Model. Electrons occupy the Bloch states ψ_nk of the cell with potential V(z) + U(z) (V the rigid band edge, U the
/// Hartree energy −eφ); in-plane motion is free with the state's mass m∥ = 1/⟨ψ|1/m|ψ⟩ (first order in k∥²), so each
/// state holds (m∥/πħ²)·k_BT·ln(1 + e^((μ − E_nk)/k_BT)) electrons per area (the two-dimensional electron gas with spin,
/// J. H. Davies, The Physics of Low-Dimensional Semiconductors, 1998, ch. 3) and
/// n(z) = d·Σ_n ∫ dk/2π |ψ_nk(z)|²·(m∥/πħ²)·k_BT ln(1 + e^((μ − E_nk)/k_BT)), ψ normalised over one period. The k integral
/// runs over θ = kd ∈ [0, π] (E and |ψ|² are even in k) with a Gauss–Legendre rule of
/// <see cref="SpaceChargeOptions.WavevectorNodes"/> nodes per band, for every band whose bottom lies below μ + 40 k_BT.
/// Poisson's equation d/dz(ε_r dU/dz) = (e/ε₀)(N_D − N_A − n) with periodic boundary conditions is discretised by finite
/// volumes on the grid (interfaces and sheet positions are nodes); the gauge is the zero cell average of U. Charge
/// neutrality per period fixes μ, found by Brent's method (R. P. Brent, 1973, ch. 4) on the quadrature's own states, so
/// the discrete cell is neutral to rounding.</para>
/// <para>Iteration: the predictor–corrector scheme of A. Trellakis, A. T. Galick, A. Pacelli and U. Ravaioli,
/// J. Appl. Phys. 81, 7880 (1997). Each outer iteration solves the Schrödinger problem in the present potential U⁰, then
/// solves the nonlinear Poisson equation in which every state's energy follows the local potential change,
/// E_nk → E_nk + U(z) − U⁰(z), by Newton's method (per step a tridiagonal system bordered by the Fermi-level shift, solved by the
/// Thomas algorithm; W. H. Press et al., Numerical Recipes, 3rd ed., §2.4). This estimate of the quantum response makes
/// the outer loop converge in a handful of iterations where plain potential mixing oscillates. The loop stops when
/// max|U_new − U⁰| falls below <see cref="SpaceChargeOptions.ToleranceElectronVolts"/>; the result reports the cell,
/// states, density and Fermi level of U⁰, with that last change as its residual.</para>
/// <para>Holes: a cell given valence bands (<see cref="DopedCell.ValenceBands"/>) has the holes of each as carriers too, in the
/// Bloch states of its hole cell with potential V_h − U (hole energies count downwards), each state of electron energy E
/// holding (m∥/πħ²)·k_BT·ln(1 + e^((E − μ)/k_BT)) holes per area at the same μ; Poisson's equation then has +p, and neutrality
/// p − n + N_D⁺ − N_A⁻ = 0 fixes μ. A carrier whose lowest band lies more than 42 k_BT beyond μ holds no state (density
/// zero); one that takes part sums every band within max(40 k_BT, b₁ + 20 k_BT) of μ, b₁ its lowest band's distance.
/// Single parabolic hole bands: no heavy/light-hole mixing, no split-off band, no strain.</para>
/// <para>Donors are fully ionised unless their layer gives an ionisation energy (<see cref="LayerDoping.WithDonorIonisationEnergy"/>):
/// then N_D⁺ = N_D/(1 + 2e^((μ − E_D)/k_BT)) follows the local level E_D = V + U − E_b in the neutrality condition and in
/// the Newton steps; acceptors likewise with <see cref="LayerDoping.WithAcceptorIonisationEnergy"/>, N_A⁻ = N_A/(1 + 4e^((E_A − μ)/k_BT)),
/// E_A = E_v + U + E_b. Not modelled: holes of a cell or stack without valence bands (acceptors are fixed negative charge
/// there), exchange and correlation, bias. Grid error: the Poisson discretisation and the piecewise-linear potential are second order in the
/// spacing; measure it by halving <see cref="SpaceChargeOptions.MaxGridSpacingNanometres"/>.</para>
/// </remarks>
public static partial class SpaceChargeSolver
{
    /// <summary>The most bands the quadrature may occupy: bounds the states per iteration.</summary>
    public const int MaxOccupiedBands = 200;

    private const double OccupationCutoff = SchrodingerPoisson.OccupationCutoff;

    /// <summary>Solves the doped cell self-consistently.</summary>
    /// <param name="cell">The doped cell.</param>
    /// <param name="options">Tolerances; null for <see cref="SpaceChargeOptions.Default"/>.</param>
    /// <param name="progress">Told after each outer iteration; may be null.</param>
    /// <param name="cancellationToken">Checked between iterations.</param>
    /// <exception cref="ArgumentNullException"><paramref name="cell"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The cell needs more grid points than <see cref="SpaceChargeOptions.MaxGridPoints"/> at the spacing asked for.</exception>
    /// <exception cref="SpaceChargeException">The iteration did not reach the tolerance within the budget, diverged, or needs more
    /// than <see cref="MaxOccupiedBands"/> bands.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static SelfConsistentCell Solve(DopedCell cell, SpaceChargeOptions? options = null, IProgress<SpaceChargeProgress>? progress = null,
        CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(cell);
        options ??= SpaceChargeOptions.Default;
        var valence = cell.ValenceBands;
        double[]? edges = null;
        if (valence.Count > 0)
        {
            // The first valence band's edge of each layer, on the electron scale: where its acceptor level sits above.
            var holeElements = valence[0].Cell.Elements;
            edges = new double[holeElements.Count];
            for (var e = 0; e < edges.Length; e++)
            {
                edges[e] = valence[0].EdgeElectronVolts - ((Layer)holeElements[e]).Potential.ElectronVolts;
            }
        }
        var grid = new SpaceChargeGrid(cell.Cell.Elements, cell.Doping, periodic: true, options.MaxGridSpacingNanometres, cell.Cell.Period.Nanometres, edges);
        var core = new SchrodingerPoisson(grid, cell.Temperature, options);
        var rule = GaussLegendre.OfOrder(options.WavevectorNodes);
        // Carrier 0: the electrons; then one per valence band, its potential V_h − U (hole energies count downwards).
        var carriers = new BlochCarrier[1 + valence.Count];
        carriers[0] = new BlochCarrier(cell.Cell, false, 0, null, "electron");
        for (var b = 0; b < valence.Count; b++)
        {
            carriers[b + 1] = new BlochCarrier(valence[b].Cell, true, valence[b].EdgeElectronVolts, grid.InverseMassOf(valence[b].Cell.Elements), valence[b].Name);
        }
        // The first iteration starts from the carriers the net doping calls for (both when it is zero); the Fermi level then
        // adds a minority carrier that matters, so this only saves computing states that would be dropped.
        var net = cell.NetDonorsPerSquareNanometre;
        for (var c = 0; c < carriers.Length; c++)
        {
            carriers[c].Active = carriers.Length == 1 || net == 0 || (net > 0) != carriers[c].IsHole;
        }
        double ComputeStates()
        {
            foreach (var carrier in carriers)
            {
                carrier.Sampled = BuildCell(carrier.Rigid, grid, core.Hartree, carrier.IsHole ? -1 : 1);
            }
            return ComputeBlochStates(core, carriers, rule, cancellationToken);
        }
        return core.Iterate(ComputeStates, (iterations, residual, mu) => new SelfConsistentCell(cell, carriers[0].Sampled!, options, grid.Positions, core.Hartree,
            core.Density, core.HoleDensity, mu, core.NeutralityError(), iterations, residual, carriers[0].Bands,
            [.. carriers.Skip(1).Select(c => c.Sampled!)], [.. carriers.Skip(1).Select(c => c.Bands)]), progress, cancellationToken);
    }

    /// <summary>One carrier of a periodic cell: its rigid cell, its self-consistent cell of the present iteration and the bands it occupies.</summary>
    private sealed class BlochCarrier(UnitCell rigid, bool isHole, double edge, double[]? inverseMass, string name)
    {
        public UnitCell Rigid { get; } = rigid;

        public bool IsHole { get; } = isHole;

        /// <summary>A hole cell's zero on the electron scale, eV.</summary>
        public double Edge { get; } = edge;

        /// <summary>1/m per grid interval (null: the electrons' own, from the grid).</summary>
        public double[]? InverseMass { get; } = inverseMass;

        public string Name { get; } = name;

        public UnitCell? Sampled { get; set; }

        /// <summary>Bands in the quadrature (0 until the first iteration and while the carrier holds no state; a starting guess for the next iteration).</summary>
        public int Bands { get; set; }

        public BandStructure? Structure { get; set; }

        /// <summary>Whether the carrier holds states (see <see cref="ComputeBlochStates"/>).</summary>
        public bool Active { get; set; }

        /// <summary>How far band <paramref name="band"/>'s edge lies beyond μ on the carrier's own scale, eV (negative: on the occupied side).</summary>
        public double Beyond(int band, double mu)
        {
            var bottom = Structure!.GetBand(band).BottomElectronVolts;
            // Electrons: band bottom E above μ; holes: the band's top on the electron scale, edge − E, below μ.
            return IsHole ? bottom - (Edge - mu) : bottom - mu;
        }
    }

    /// <summary>The rigid cell with U added: each layer a sampled segment on the grid, delta barriers kept.</summary>
    private static UnitCell BuildCell(UnitCell rigid, SpaceChargeGrid grid, double[] hartree, double sign = 1)
    {
        var elements = rigid.Elements;
        var built = new CellElement[elements.Count];
        for (var e = 0; e < elements.Count; e++)
        {
            built[e] = elements[e] is Layer layer ? Sampled(layer, grid, grid.ElementStart[e], grid.ElementEnd[e], hartree, layer.Width.Nanometres, sign) : elements[e];
        }
        return UnitCell.Create(built);
    }

    /// <summary>
    /// Layer <paramref name="layer"/>'s nodes <paramref name="start"/> … <paramref name="end"/> as a sampled segment of its band
    /// edge plus U (a periodic grid's node N is node 0); <paramref name="width"/>, where given, is the segment's exact width.
    /// A hole band (<paramref name="sign"/> −1) takes V − U: its energies count downwards.
    /// </summary>
    internal static SampledSegment Sampled(Layer layer, SpaceChargeGrid grid, int start, int end, double[] hartree, double? width = null, double sign = 1)
    {
        var x = new double[end - start + 1];
        var v = new double[x.Length];
        for (var j = 0; j < x.Length; j++)
        {
            var node = start + j;
            x[j] = grid.Positions[node] - grid.Positions[start];
            v[j] = layer.Potential.ElectronVolts + sign * hartree[node == grid.Count ? 0 : node];
        }
        if (width is { } w)
        {
            x[^1] = w;
        }
        return SampledSegment.Create(x, v, layer.Mass);
    }

    /// <summary>
    /// Bloch states of every carrier on the quadrature; returns the neutral Fermi level. A carrier takes part while its lowest
    /// band (on its own scale: electrons upwards, holes downwards) lies less than 40 k_BT beyond μ; it is dropped once that band
    /// lies more than 42 k_BT beyond (the margin keeps a carrier at the threshold from flipping), and then holds no state: its
    /// density, below e^−40 of its band's, counts as zero. A carrier that takes part has every band whose bottom lies less than
    /// max(40 k_BT, b₁ + 20 k_BT) beyond μ, b₁ its lowest band's distance beyond μ: at least e^−40 for the carriers that set μ,
    /// and e^−20 relative to its own density for a minority carrier.
    /// </summary>
    private static double ComputeBlochStates(SchrodingerPoisson core, BlochCarrier[] carriers, GaussLegendre rule, CancellationToken cancellationToken)
    {
        var cutoff = OccupationCutoff * core.KT;
        foreach (var carrier in carriers)
        {
            // The last iteration's band count (plus the next band's edge) is computed at once: the count barely changes. A carrier
            // without states needs only its lowest band's edge.
            carrier.Structure = BandStructure.Compute(carrier.Sampled!, carrier.Active ? Math.Max(1, carrier.Bands) + 1 : 1);
        }
        if (!carriers.Any(c => c.Active))
        {
            foreach (var carrier in carriers)
            {
                carrier.Active = true;
            }
        }
        for (var restart = 0; ; restart++)
        {
            core.ClearStates();
            foreach (var carrier in carriers)
            {
                carrier.Bands = 0;
                if (carrier.Active)
                {
                    cancellationToken.ThrowIfCancellationRequested();
                    AddBand(core, carrier, 1, rule);
                }
            }
            var dropped = false;
            while (!dropped)
            {
                var mu = core.FermiLevel();
                var added = false;
                foreach (var carrier in carriers)
                {
                    var first = carrier.Beyond(1, mu);
                    if (!carrier.Active)
                    {
                        if (first < cutoff)
                        {
                            carrier.Active = true;
                            AddBand(core, carrier, 1, rule);
                            added = true;
                        }
                        continue;
                    }
                    if (first > cutoff + 2 * core.KT && carriers.Count(c => c.Active) > 1 && restart < 2 * carriers.Length)
                    {
                        carrier.Active = false;
                        dropped = true;
                        break;
                    }
                    var next = carrier.Bands + 1;
                    if (next > carrier.Structure!.Bands.Count)
                    {
                        carrier.Structure = BandStructure.Compute(carrier.Sampled!, next + 1);
                    }
                    if (carrier.Beyond(next, mu) < Math.Max(cutoff, first + 0.5 * cutoff))
                    {
                        if (next > MaxOccupiedBands)
                        {
                            throw new SpaceChargeException(0, double.NaN, string.Create(CultureInfo.InvariantCulture,
                                $"more than {MaxOccupiedBands} {carrier.Name} minibands lie within {OccupationCutoff} kT of mu; the doping or temperature is beyond what the quadrature over bands is bounded to"));
                        }
                        cancellationToken.ThrowIfCancellationRequested();
                        AddBand(core, carrier, next, rule);
                        added = true;
                    }
                }
                if (!dropped && !added)
                {
                    return mu;
                }
            }
        }
    }

    private static void AddBand(SchrodingerPoisson core, BlochCarrier carrier, int band, GaussLegendre rule)
    {
        var structure = carrier.Structure!;
        var d = structure.PeriodNanometres;
        for (var j = 0; j < rule.Order; j++)
        {
            var theta = 0.5 * Math.PI * (1 + rule.Nodes[j]);
            var function = BlochFunction.CreateUnrefined(structure, band, theta / d);
            function.ProbabilityDensities(core.Positions, core.BeginState());
            var energy = carrier.IsHole ? carrier.Edge - function.EnergyElectronVolts : function.EnergyElectronVolts;
            core.EndState(energy, 0.5 * rule.Weights[j], carrier.IsHole, carrier.InverseMass);
        }
        carrier.Bands = band;
    }
}
