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
/// Self-consistent (Schrödinger–Poisson, Hartree) bands of a doped superlattice: the electrons of the cell's minibands,
/// in thermal equilibrium at one Fermi level, and the ionised dopants set the electrostatic potential, which in turn
/// shapes the minibands.
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
/// <para>Donors are fully ionised unless their layer gives an ionisation energy (<see cref="LayerDoping.WithDonorIonisationEnergy"/>):
/// then N_D⁺ = N_D/(1 + 2e^((μ − E_D)/k_BT)) follows the local level E_D = V + U − E_b in the neutrality condition and in
/// the Newton steps. Not modelled: holes (acceptors are fixed negative charge only, always ionised), exchange and
/// correlation, bias. Grid error: the Poisson discretisation and the piecewise-linear potential are second order in the
/// spacing; measure it by halving <see cref="SpaceChargeOptions.MaxGridSpacingNanometres"/>.</para>
/// </remarks>
public static class SpaceChargeSolver
{
    /// <summary>e/ε₀ in eV·nm: U in eV, densities in nm⁻³, lengths in nm (CODATA 2018 e and ε₀).</summary>
    internal const double ChargeOverPermittivityElectronVoltNanometres =
        PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.VacuumPermittivityFaradsPerMetre / PhysicalConstants.MetresPerNanometre;

    /// <summary>Bands whose bottom lies more than this many k_BT above μ are left out (occupation below e^−40).</summary>
    private const double OccupationCutoff = 40;

    /// <summary>The most bands the quadrature may occupy: bounds the states per iteration.</summary>
    public const int MaxOccupiedBands = 200;

    private const int MaxNewtonSteps = 200;

    /// <summary>Largest Newton step of the nonlinear Poisson equation, in k_BT: the density is exponential in U.</summary>
    private const double NewtonStepLimitThermal = 4;

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
        var grid = new SpaceChargeGrid(cell, options.MaxGridSpacingNanometres);
        var work = new Workspace(cell, grid, options);
        var n = grid.Count;
        var residual = double.PositiveInfinity;
        for (var iteration = 1; iteration <= options.MaxIterations; iteration++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var sampled = work.BuildCell(work.Hartree);
            var mu = work.ComputeStates(sampled, cancellationToken);
            work.SolvePoisson(mu, iteration);
            residual = 0;
            for (var i = 0; i < n; i++)
            {
                residual = Math.Max(residual, Math.Abs(work.Next[i] - work.Hartree[i]));
            }
            if (!double.IsFinite(residual))
            {
                throw new SpaceChargeException(iteration, residual, "the Hartree potential is no longer finite");
            }
            progress?.Report(new SpaceChargeProgress(iteration, residual, mu));
            if (residual <= options.ToleranceElectronVolts)
            {
                work.FillDensity(mu);
                return new SelfConsistentCell(cell, sampled, options, grid.Positions, work.Hartree, work.Density, mu,
                    work.NeutralityError(), iteration, residual, work.Bands);
            }
            (work.Hartree, work.Next) = (work.Next, work.Hartree);
        }
        throw new SpaceChargeException(options.MaxIterations, residual,
            string.Create(CultureInfo.InvariantCulture, $"the tolerance {options.ToleranceElectronVolts:R} eV was not reached in {options.MaxIterations} iterations"));
    }

    /// <summary>Buffers reused across iterations (no allocation growth with the iteration count).</summary>
    private sealed class Workspace
    {
        private readonly DopedCell _doped;
        private readonly SpaceChargeGrid _grid;
        private readonly SpaceChargeOptions _options;
        private readonly GaussLegendre _rule;
        private readonly double _kT;
        private readonly double _target;
        private readonly double[] _positions;
        private readonly double[] _reference;
        private readonly double[] _diagonal;
        private readonly double[] _residual;
        private readonly double[] _step;
        private readonly double[] _scratchA;
        private readonly double[] _scratchB;
        private readonly double[] _scratchC;
        private readonly double[] _thomas;
        private readonly double[] _z;
        private double[] _densities = [];
        private double[] _energies = [];
        private double[] _weights = [];
        private int _states;
        private double _finalFermiLevel;

        internal Workspace(DopedCell doped, SpaceChargeGrid grid, SpaceChargeOptions options)
        {
            _doped = doped;
            _grid = grid;
            _options = options;
            _rule = GaussLegendre.OfOrder(options.WavevectorNodes);
            _kT = doped.Temperature.Kelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;
            _target = grid.FixedCharge.Sum(); // the fully ionised part; incompletely ionised donors follow μ and U
            var n = grid.Count;
            _positions = grid.Positions[..n];
            Hartree = new double[n];
            Next = new double[n];
            Density = new double[n];
            _reference = new double[n];
            _diagonal = new double[n];
            _residual = new double[n];
            _step = new double[n];
            _scratchA = new double[n];
            _scratchB = new double[n];
            _scratchC = new double[n];
            _thomas = new double[n];
            _z = new double[n];
        }

        internal double[] Hartree { get; set; }

        internal double[] Next { get; set; }

        internal double[] Density { get; }

        internal int Bands { get; private set; } = 1;

        /// <summary>The rigid cell with U added: each layer a sampled segment on the grid, delta barriers kept.</summary>
        internal UnitCell BuildCell(double[] hartree)
        {
            var elements = _doped.Cell.Elements;
            var built = new CellElement[elements.Count];
            for (var e = 0; e < elements.Count; e++)
            {
                if (elements[e] is not Layer layer)
                {
                    built[e] = elements[e];
                    continue;
                }
                int start = _grid.ElementStart[e], end = _grid.ElementEnd[e];
                var x = new double[end - start + 1];
                var v = new double[x.Length];
                for (var j = 0; j < x.Length; j++)
                {
                    var node = start + j;
                    x[j] = _grid.Positions[node] - _grid.Positions[start];
                    v[j] = layer.Potential.ElectronVolts + hartree[node == _grid.Count ? 0 : node];
                }
                x[^1] = layer.Width.Nanometres;
                built[e] = SampledSegment.Create(x, v, layer.Mass);
            }
            return UnitCell.Create(built);
        }

        /// <summary>Bloch states of the cell on the quadrature; returns the neutral Fermi level. Adds bands until the next lies above μ + 40 k_BT.</summary>
        internal double ComputeStates(UnitCell cell, CancellationToken cancellationToken)
        {
            var count = Bands;
            var structure = BandStructure.Compute(cell, count + 1);
            _states = 0;
            for (var band = 1; ; band++)
            {
                if (band > count)
                {
                    count = band;
                    if (count > MaxOccupiedBands)
                    {
                        throw new SpaceChargeException(0, double.NaN, string.Create(CultureInfo.InvariantCulture,
                            $"more than {MaxOccupiedBands} minibands lie below mu + {OccupationCutoff} kT; the doping or temperature is beyond what the quadrature over bands is bounded to"));
                    }
                    structure = BandStructure.Compute(cell, count + 1);
                }
                cancellationToken.ThrowIfCancellationRequested();
                AddBand(structure, band);
                var mu = FermiLevel();
                if (structure.GetBand(band + 1).BottomElectronVolts >= mu + OccupationCutoff * _kT)
                {
                    Bands = band;
                    return mu;
                }
            }
        }

        private void AddBand(BandStructure structure, int band)
        {
            var nodes = _rule.Order;
            var n = _grid.Count;
            var needed = (_states + nodes) * n;
            if (_densities.Length < needed)
            {
                Array.Resize(ref _densities, Math.Max(needed, 2 * _densities.Length));
                Array.Resize(ref _energies, _densities.Length / n);
                Array.Resize(ref _weights, _densities.Length / n);
            }
            var d = structure.PeriodNanometres;
            var massFactor = 1 / (2 * Math.PI * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2); // m∥/(πħ²) per m₀, 1/(eV nm²)
            for (var j = 0; j < nodes; j++)
            {
                var theta = 0.5 * Math.PI * (1 + _rule.Nodes[j]);
                var function = BlochFunction.CreateUnrefined(structure, band, theta / d);
                var row = _densities.AsSpan(_states * n, n);
                function.ProbabilityDensities(_positions, row);
                // Normalise on the grid's own control volumes so that the discrete cell is exactly neutral; the
                // in-plane mass is 1/⟨1/m⟩ over the same volumes.
                double norm = 0, inverseMass = 0;
                for (var i = 0; i < n; i++)
                {
                    var before = i == 0 ? n - 1 : i - 1;
                    norm += row[i] * _grid.Volume[i];
                    inverseMass += row[i] * 0.5 * (_grid.Widths[before] * _grid.InverseMass[before] + _grid.Widths[i] * _grid.InverseMass[i]);
                }
                var scale = 1 / norm;
                for (var i = 0; i < n; i++)
                {
                    row[i] *= scale;
                }
                var mass = norm / inverseMass;
                _energies[_states] = function.EnergyElectronVolts;
                _weights[_states] = 0.5 * _rule.Weights[j] * mass * massFactor;
                _states++;
            }
        }

        /// <summary>Electrons per area of the present states at μ (each state's density integrates to 1 on the grid).</summary>
        private double Electrons(double mu)
        {
            double total = 0;
            for (var s = 0; s < _states; s++)
            {
                total += _weights[s] * _kT * ElementaryFunctions.Softplus((mu - _energies[s]) / _kT);
            }
            return total;
        }

        private readonly struct NeutralityFunction(Workspace owner) : IRealFunction
        {
            public double Evaluate(double x) => owner.Electrons(x) - owner._target - owner.IonisedTotal(x);
        }

        /// <summary>Incompletely ionised donors per area at μ in the present potential U⁰ (0 when every donor is ionised).</summary>
        private double IonisedTotal(double mu)
        {
            if (!_grid.HasPartialIonisation)
            {
                return 0;
            }
            double total = 0;
            for (var i = 0; i < _grid.Count; i++)
            {
                total += Ionised(mu, i, Hartree[i], out _);
            }
            return total;
        }

        /// <summary>
        /// Ionised donors (of the incompletely ionised kind) in the control volume of node i at Fermi level μ and Hartree
        /// energy U_i, nm⁻², and the derivative with respect to U_i: N⁺ = N/(1 + g·e^((μ − E_D − U)/k_BT)).
        /// </summary>
        private double Ionised(double mu, int i, double u, out double derivative)
        {
            derivative = 0;
            if (!_grid.HasPartialIonisation)
            {
                return 0;
            }
            var before = i == 0 ? _grid.Count - 1 : i - 1;
            var (a, da) = Donor(0.5 * _grid.Widths[before] * _grid.PartialDonors[before], _grid.PartialLevel[before], mu, u);
            var (b, db) = Donor(0.5 * _grid.Widths[i] * _grid.PartialDonors[i], _grid.PartialLevel[i], mu, u);
            var (c, dc) = Donor(_grid.SheetPartial[i], _grid.SheetLevel[i], mu, u);
            derivative = da + db + dc;
            return a + b + c;
        }

        private (double Value, double Derivative) Donor(double amount, double level, double mu, double u)
        {
            if (amount == 0)
            {
                return (0, 0);
            }
            const double g = LayerDoping.DonorDegeneracy;
            var x = (mu - level - u) / _kT;
            // f = 1/(1 + g e^x) and df/dU = g e^x/(1 + g e^x)²/k_BT, written with e^(−x) for x > 0 so nothing overflows.
            double f, slope;
            if (x > 0)
            {
                var e = Math.Exp(-x);
                f = e / (e + g);
                slope = g * e / ((e + g) * (e + g));
            }
            else
            {
                var e = Math.Exp(x);
                f = 1 / (1 + g * e);
                slope = g * e / ((1 + g * e) * (1 + g * e));
            }
            return (amount * f, amount * slope / _kT);
        }

        private double FermiLevel()
        {
            var lowest = double.PositiveInfinity;
            for (var s = 0; s < _states; s++)
            {
                lowest = Math.Min(lowest, _energies[s]);
            }
            var function = new NeutralityFunction(this);
            double step = _kT, low = lowest - step, high = lowest + step;
            for (var attempt = 0; function.Evaluate(low) > 0; attempt++)
            {
                step *= 2;
                low = lowest - step;
                CheckBracket(attempt, low);
            }
            step = _kT;
            for (var attempt = 0; function.Evaluate(high) < 0; attempt++)
            {
                step *= 2;
                high = lowest + step;
                CheckBracket(attempt, high);
            }
            var result = RootFinding.Brent(ref function, low, high, 1e-15 * Math.Max(1, Math.Abs(lowest)), 0, 500);
            if (result.Status != RootStatus.Converged)
            {
                throw new SpaceChargeException(0, double.NaN, "the Fermi level search for charge neutrality did not converge");
            }
            return result.Root;
        }

        private static void CheckBracket(int attempt, double value)
        {
            if (attempt > 200 || !double.IsFinite(value))
            {
                throw new SpaceChargeException(0, double.NaN, "no Fermi level neutralises the cell within the double range");
            }
        }

        /// <summary>Density at the nodes for U = U⁰ (the reported n(z)), nm⁻³.</summary>
        internal void FillDensity(double mu)
        {
            _finalFermiLevel = mu;
            Array.Copy(Hartree, _reference, Hartree.Length);
            Array.Copy(Hartree, Next, Hartree.Length);
            Evaluate(mu, Next, Density, _diagonal);
        }

        /// <summary>n_i(U) with every state shifted by U_i − U⁰_i, and ∂n_i/∂U_i.</summary>
        private void Evaluate(double mu, double[] u, double[] density, double[] derivative)
        {
            var n = _grid.Count;
            Array.Clear(density);
            Array.Clear(derivative);
            for (var s = 0; s < _states; s++)
            {
                var row = _densities.AsSpan(s * n, n);
                double w = _weights[s], e = _energies[s];
                for (var i = 0; i < n; i++)
                {
                    var x = (mu - e - (u[i] - _reference[i])) / _kT;
                    density[i] += w * row[i] * _kT * ElementaryFunctions.Softplus(x);
                    derivative[i] -= w * row[i] * Logistic(x);
                }
            }
        }

        /// <summary>Relative |∫n − ∫(N_D − N_A) − sheets| per period.</summary>
        internal double NeutralityError()
        {
            double electrons = 0;
            for (var i = 0; i < _grid.Count; i++)
            {
                electrons += Density[i] * _grid.Volume[i];
            }
            var donors = _target + IonisedTotal(_finalFermiLevel);
            return Math.Abs(electrons - donors) / donors;
        }

        /// <summary>
        /// Newton's method on the nonlinear Poisson equation of the predictor–corrector step; result in <see cref="Next"/>.
        /// </summary>
        /// <remarks>
        /// The periodic Laplacian is singular (a constant added to U changes nothing), and at low doping the density term that
        /// lifts the singularity is tiny, so the plain cyclic system would be ill-conditioned in exactly its constant mode.
        /// Instead the gauge pins δU₀ = 0 and the Fermi-level shift s becomes the extra unknown: rows 1 … N−1 of the Jacobian
        /// form a diagonally dominant tridiagonal matrix T (solved by the Thomas algorithm), and the sum of all rows (total
        /// charge) closes the system, δ = T⁻¹r − s·T⁻¹(d·1) with s from the total-charge row; a bordered solve without
        /// cancellation (Numerical Recipes, 3rd ed., §2.4 and §2.7). At the end U is shifted to zero cell average.
        /// </remarks>
        internal void SolvePoisson(double mu, int iteration)
        {
            var n = _grid.Count;
            var c = ChargeOverPermittivityElectronVoltNanometres;
            Array.Copy(Hartree, _reference, n);
            Array.Copy(Hartree, Next, n);
            var u = Next;
            var limit = NewtonStepLimitThermal * _kT;
            var tolerance = 1e-3 * _options.ToleranceElectronVolts;
            for (var step = 0; step < MaxNewtonSteps; step++)
            {
                Evaluate(mu, u, Density, _diagonal);
                double totalResidual = 0, totalDerivative = 0;
                for (var i = 0; i < n; i++)
                {
                    int before = i == 0 ? n - 1 : i - 1, after = i == n - 1 ? 0 : i + 1;
                    double right = _grid.Permittivity[i] / _grid.Widths[i], left = _grid.Permittivity[before] / _grid.Widths[before];
                    // r = −F(U): F_i = ε∇²U − (e/ε₀)(fixed − V n); ∂F_i/∂U_i = −left − right + (e/ε₀)V ∂n/∂U; ∂F_i/∂μ = −(e/ε₀)V ∂n/∂U.
                    var ionised = Ionised(mu, i, u[i], out var ionisedSlope);
                    _residual[i] = -(right * (u[after] - u[i]) - left * (u[i] - u[before]) - c * (_grid.FixedCharge[i] + ionised - _grid.Volume[i] * Density[i]));
                    var d = c * (_grid.Volume[i] * _diagonal[i] - ionisedSlope);
                    _scratchA[i] = left;
                    _scratchC[i] = right;
                    _scratchB[i] = -right - left + d;
                    _diagonal[i] = d;
                    totalResidual += _residual[i];
                    totalDerivative += d;
                }
                // Rows 1 … N−1 with δ₀ = 0: T y = r, T z = d (the ∂/∂μ column is −d).
                Thomas(_scratchA, _scratchB, _scratchC, _residual, _step, 1, n);
                Thomas(_scratchA, _scratchB, _scratchC, _diagonal, _z, 1, n);
                // Total charge: Σ_i d_i(δ_i − s) = Σ r with δ = y + s z ⇒ s(d·z − Σd) = Σr − d·y.
                double dy = 0, dz = 0;
                for (var i = 1; i < n; i++)
                {
                    dy += _diagonal[i] * _step[i];
                    dz += _diagonal[i] * _z[i];
                }
                var shift = (totalResidual - dy) / (dz - totalDerivative);
                _step[0] = 0;
                var largest = Math.Abs(shift);
                for (var i = 1; i < n; i++)
                {
                    _step[i] += shift * _z[i];
                    largest = Math.Max(largest, Math.Abs(_step[i]));
                }
                if (!double.IsFinite(largest))
                {
                    throw new SpaceChargeException(iteration, largest, "the Newton step of the Poisson equation is not finite");
                }
                var scale = largest > limit ? limit / largest : 1;
                for (var i = 0; i < n; i++)
                {
                    u[i] += scale * _step[i];
                }
                mu += scale * shift;
                if (largest <= tolerance)
                {
                    RemoveMean(u);
                    return;
                }
            }
            throw new SpaceChargeException(iteration, double.NaN, string.Create(CultureInfo.InvariantCulture,
                $"Newton's method on the Poisson equation did not converge in {MaxNewtonSteps} steps"));
        }

        /// <summary>Shifts U to zero cell average (the gauge); the Fermi level of the next iteration follows.</summary>
        private void RemoveMean(double[] u)
        {
            double sum = 0;
            for (var i = 0; i < u.Length; i++)
            {
                sum += u[i] * _grid.Volume[i];
            }
            var mean = sum / _grid.Positions[^1];
            for (var i = 0; i < u.Length; i++)
            {
                u[i] -= mean;
            }
        }

        /// <summary>
        /// The Thomas algorithm for rows and columns <paramref name="first"/> … <paramref name="end"/> − 1 of the tridiagonal
        /// matrix lower[i]·x[i−1] + diagonal[i]·x[i] + upper[i]·x[i+1] (couplings outside the range dropped: those unknowns are
        /// pinned to zero) (Numerical Recipes, 3rd ed., §2.4, "tridag").
        /// </summary>
        private void Thomas(double[] lower, double[] diagonal, double[] upper, double[] rhs, double[] x, int first, int end)
        {
            var gamma = _thomas;
            var beta = diagonal[first];
            x[first] = rhs[first] / beta;
            for (var i = first + 1; i < end; i++)
            {
                gamma[i] = upper[i - 1] / beta;
                beta = diagonal[i] - lower[i] * gamma[i];
                x[i] = (rhs[i] - lower[i] * x[i - 1]) / beta;
            }
            for (var i = end - 2; i >= first; i--)
            {
                x[i] -= gamma[i + 1] * x[i + 1];
            }
        }
    }

    private static double Logistic(double x) => MathNet.Numerics.SpecialFunctions.Logistic(x);
}
