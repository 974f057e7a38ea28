// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using Periodic.Numerics;
using Periodic.Units;

namespace Periodic.SpaceCharge;

/// <summary>
/// The part of the self-consistent iteration that a periodic cell and a finite stack share: the carrier states of one
/// iteration (electrons and, where a valence band is modelled, holes; each a density on the grid, an energy and a weight),
/// the Fermi level of charge neutrality, the nonlinear Poisson equation of the predictor–corrector step solved by Newton's
/// method, the dopants' ionisation, and the outer loop.
/// Buffers are reused across iterations (no allocation growth with the iteration count).
/// </summary>
/// <remarks>
/// Each electron state s holds (m∥/πħ²)·q_s·k_BT·ln(1 + e^((μ − E_s)/k_BT)) electrons per area, q_s the quadrature weight of
/// its wavevector (1 for a state of a closed domain), with density |ψ_s|² normalised on the grid's own control volumes, so
/// that the discrete domain is neutral to rounding (J. H. Davies, The Physics of Low-Dimensional Semiconductors, 1998, ch. 3).
/// A hole state, its energy E_s on the electron scale (the energy of the electron missing from it), holds
/// (m∥/πħ²)·q_s·k_BT·ln(1 + e^((E_s − μ)/k_BT)) holes per area (1 − f of the same Fermi–Dirac function). Every carrier and
/// every incompletely ionised dopant depends on μ − U only, so one bordered Newton system serves them all.
/// </remarks>
internal sealed class SchrodingerPoisson
{
    /// <summary>e/ε₀ in eV·nm: U in eV, densities in nm⁻³, lengths in nm (CODATA 2018 e and ε₀).</summary>
    internal const double ChargeOverPermittivityElectronVoltNanometres =
        PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.VacuumPermittivityFaradsPerMetre / PhysicalConstants.MetresPerNanometre;

    /// <summary>States more than this many k_BT above μ are left out (occupation below e^−40).</summary>
    internal const double OccupationCutoff = 40;

    private const int MaxNewtonSteps = 200;

    /// <summary>Largest Newton step of the nonlinear Poisson equation, in k_BT: the density is exponential in U.</summary>
    private const double NewtonStepLimitThermal = 4;

    private readonly SpaceChargeGrid _grid;
    private readonly SpaceChargeOptions _options;
    private readonly double _target;
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
    private double[] _signs = [];
    private int _states;
    private double _finalFermiLevel;

    internal SchrodingerPoisson(SpaceChargeGrid grid, Temperature temperature, SpaceChargeOptions options)
    {
        _grid = grid;
        _options = options;
        KT = temperature.Kelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;
        _target = grid.FixedCharge.Sum(); // the fully ionised part; incompletely ionised donors follow μ and U
        var n = grid.Count;
        Positions = grid.Positions[..n];
        Hartree = new double[n];
        Next = new double[n];
        Density = new double[n];
        HoleDensity = new double[n];
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

    /// <summary>k_BT, eV.</summary>
    internal double KT { get; }

    /// <summary>The grid.</summary>
    internal SpaceChargeGrid Grid => _grid;

    /// <summary>Positions of the unknowns, nm.</summary>
    internal double[] Positions { get; }

    /// <summary>The Hartree energy U⁰ of the present iteration at the unknowns, eV.</summary>
    internal double[] Hartree { get; private set; }

    /// <summary>The corrected Hartree energy of the present iteration, eV.</summary>
    internal double[] Next { get; private set; }

    /// <summary>The electron density at the unknowns, nm⁻³ (after <see cref="FillDensity"/>: that of U⁰).</summary>
    internal double[] Density { get; }

    /// <summary>The hole density at the unknowns, nm⁻³ (after <see cref="FillDensity"/>: that of U⁰; zero without hole states).</summary>
    internal double[] HoleDensity { get; }

    /// <summary>States in the present set.</summary>
    internal int StateCount => _states;

    /// <summary>Energy of state <paramref name="s"/> of the present set, eV.</summary>
    internal double StateEnergy(int s) => _energies[s];

    /// <summary>Forgets the states of the last iteration.</summary>
    internal void ClearStates() => _states = 0;

    /// <summary>The row to fill with |ψ|² (any normalisation) at <see cref="Positions"/> for the next state; then call <see cref="EndState"/>.</summary>
    internal Span<double> BeginState()
    {
        var n = _grid.Count;
        var needed = (_states + 1) * n;
        if (_densities.Length < needed)
        {
            Array.Resize(ref _densities, Math.Max(needed, 2 * _densities.Length));
            Array.Resize(ref _energies, _densities.Length / n);
            Array.Resize(ref _weights, _densities.Length / n);
            Array.Resize(ref _signs, _densities.Length / n);
        }
        return _densities.AsSpan(_states * n, n);
    }

    /// <summary>
    /// Completes the state begun by <see cref="BeginState"/>: normalises it on the grid's own control volumes (so that the
    /// discrete domain is exactly neutral) and takes its in-plane mass 1/⟨1/m⟩ over the same volumes (the electrons' masses,
    /// or <paramref name="holeInverseMass"/> per interval for a hole band). A hole state's energy is on the electron scale.
    /// </summary>
    internal void EndState(double energyElectronVolts, double quadratureWeight, bool hole = false, double[]? holeInverseMass = null)
    {
        var masses = holeInverseMass ?? _grid.InverseMass;
        var n = _grid.Count;
        var row = _densities.AsSpan(_states * n, n);
        double norm = 0, inverseMass = 0;
        for (var i = 0; i < n; i++)
        {
            norm += row[i] * _grid.Volume[i];
            inverseMass += row[i] * (_grid.HalfBefore[i] * masses[_grid.IntervalBefore[i]] + _grid.HalfAfter[i] * masses[_grid.IntervalAfter[i]]);
        }
        var scale = 1 / norm;
        for (var i = 0; i < n; i++)
        {
            row[i] *= scale;
        }
        var mass = norm / inverseMass;
        const double massFactor = 1 / (2 * Math.PI * PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2); // m∥/(πħ²) per m₀, 1/(eV nm²)
        _energies[_states] = energyElectronVolts;
        _weights[_states] = quadratureWeight * mass * massFactor;
        _signs[_states] = hole ? -1 : 1;
        _states++;
    }

    /// <summary>Electrons and holes per area of the present states at μ (each state's density integrates to 1 on the grid).</summary>
    private (double Electrons, double Holes) Carriers(double mu)
    {
        double electrons = 0, holes = 0;
        for (var s = 0; s < _states; s++)
        {
            var sign = _signs[s];
            var amount = _weights[s] * KT * ElementaryFunctions.Softplus(sign * (mu - _energies[s]) / KT);
            if (sign > 0)
            {
                electrons += amount;
            }
            else
            {
                holes += amount;
            }
        }
        return (electrons, holes);
    }

    private readonly struct NeutralityFunction(SchrodingerPoisson owner) : IRealFunction
    {
        public double Evaluate(double x)
        {
            var (electrons, holes) = owner.Carriers(x);
            return electrons - holes - owner._target - owner.IonisedTotal(x);
        }
    }

    /// <summary>Net charge of the incompletely ionised dopants per area, N_D⁺ − N_A⁻, at μ in the present potential U⁰ (0 when every dopant is ionised).</summary>
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
    /// Net charge of the incompletely ionised dopants in the control volume of node i at Fermi level μ and Hartree energy
    /// U_i, nm⁻², and its derivative with respect to U_i: N_D⁺ − N_A⁻ with N_D⁺ = N_D/(1 + g_D·e^((μ − E_D − U)/k_BT)) and
    /// N_A⁻ = N_A/(1 + g_A·e^((E_A + U − μ)/k_BT)) (S. M. Sze, Physics of Semiconductor Devices, 2nd ed., ch. 1).
    /// </summary>
    private double Ionised(double mu, int i, double u, out double derivative)
    {
        derivative = 0;
        if (!_grid.HasPartialIonisation)
        {
            return 0;
        }
        int before = _grid.IntervalBefore[i], after = _grid.IntervalAfter[i];
        const double gd = LayerDoping.DonorDegeneracy, ga = LayerDoping.AcceptorDegeneracy;
        var (a, da) = Fraction(_grid.HalfBefore[i] * _grid.PartialDonors[before], (mu - _grid.PartialLevel[before] - u) / KT, gd);
        var (b, db) = Fraction(_grid.HalfAfter[i] * _grid.PartialDonors[after], (mu - _grid.PartialLevel[after] - u) / KT, gd);
        var (c, dc) = Fraction(_grid.SheetPartial[i], (mu - _grid.SheetLevel[i] - u) / KT, gd);
        var (p, dp) = Fraction(_grid.HalfBefore[i] * _grid.PartialAcceptors[before], (_grid.PartialAcceptorLevel[before] + u - mu) / KT, ga);
        var (q, dq) = Fraction(_grid.HalfAfter[i] * _grid.PartialAcceptors[after], (_grid.PartialAcceptorLevel[after] + u - mu) / KT, ga);
        // Both kinds grow more positive as U rises (the donor level empties, the acceptor level fills less).
        derivative = da + db + dc + dp + dq;
        return a + b + c - p - q;
    }

    /// <summary>
    /// amount/(1 + g·e^x) and amount·g·e^x/(1 + g·e^x)²/k_BT (the derivative with respect to U of the charge it stands for,
    /// with x = ±(μ − level − U)/k_BT).
    /// </summary>
    private (double Value, double Derivative) Fraction(double amount, double x, double g)
    {
        if (amount == 0)
        {
            return (0, 0);
        }
        // f = 1/(1 + g e^x) and |df/dU| = g e^x/(1 + g e^x)²/k_BT, written with e^(−x) for x > 0 so nothing overflows.
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
        return (amount * f, amount * slope / KT);
    }

    /// <summary>The Fermi level that neutralises the domain with the present states (Brent's method, R. P. Brent, 1973, ch. 4).</summary>
    internal double FermiLevel()
    {
        // The bracket grows from the lowest electron state (or, with hole states only, the highest hole state).
        double lowestElectron = double.PositiveInfinity, highestHole = double.NegativeInfinity;
        for (var s = 0; s < _states; s++)
        {
            if (_signs[s] > 0)
            {
                lowestElectron = Math.Min(lowestElectron, _energies[s]);
            }
            else
            {
                highestHole = Math.Max(highestHole, _energies[s]);
            }
        }
        var lowest = double.IsFinite(lowestElectron) ? lowestElectron : highestHole;
        var function = new NeutralityFunction(this);
        double step = KT, low = lowest - step, high = lowest + step;
        for (var attempt = 0; function.Evaluate(low) > 0; attempt++)
        {
            step *= 2;
            low = lowest - step;
            CheckBracket(attempt, low);
        }
        step = KT;
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
        var (electrons, holes) = Carriers(result.Root);
        if (!(electrons + holes > 0))
        {
            // A compensated domain so cold that e^(−gap/2k_BT) underflows: no carrier fixes μ or screens the potential.
            throw new SpaceChargeException(0, double.NaN, string.Create(CultureInfo.InvariantCulture,
                $"the neutral domain holds no free carrier within the double range at {KT:R} eV = k_BT (compensated doping at a temperature too low for its gap); the Fermi level is not determined"));
        }
        return result.Root;
    }

    private static void CheckBracket(int attempt, double value)
    {
        if (attempt > 200 || !double.IsFinite(value))
        {
            throw new SpaceChargeException(0, double.NaN, "no Fermi level neutralises the domain within the double range");
        }
    }

    /// <summary>Densities at the nodes for U = U⁰ (the reported n(z) and p(z)), nm⁻³.</summary>
    internal void FillDensity(double mu)
    {
        _finalFermiLevel = mu;
        Array.Copy(Hartree, _reference, Hartree.Length);
        Array.Copy(Hartree, Next, Hartree.Length);
        Evaluate(mu, Next, Density, _diagonal);
    }

    /// <summary>n_i(U) and p_i(U) (into <see cref="HoleDensity"/>) with every state shifted by U_i − U⁰_i, and ∂(n_i − p_i)/∂U_i.</summary>
    private void Evaluate(double mu, double[] u, double[] density, double[] derivative)
    {
        var n = _grid.Count;
        Array.Clear(density);
        Array.Clear(HoleDensity);
        Array.Clear(derivative);
        for (var s = 0; s < _states; s++)
        {
            var row = _densities.AsSpan(s * n, n);
            double w = _weights[s], e = _energies[s], sign = _signs[s];
            var target = sign > 0 ? density : HoleDensity;
            for (var i = 0; i < n; i++)
            {
                // An electron state fills as μ − U rises, a hole state empties: ∂n/∂U = −w·ψ²·σ(x), ∂p/∂U = +w·ψ²·σ(x).
                var x = sign * (mu - e - (u[i] - _reference[i])) / KT;
                target[i] += w * row[i] * KT * ElementaryFunctions.Softplus(x);
                derivative[i] -= w * row[i] * Logistic(x);
            }
        }
    }

    /// <summary>
    /// Relative |∫(p − n) + ∫(N_D⁺ − N_A⁻) + sheets| over the domain, relative to the free carriers ∫(n + p) (for electrons
    /// alone: to the net donors they neutralise).
    /// </summary>
    internal double NeutralityError()
    {
        double electrons = 0, holes = 0;
        for (var i = 0; i < _grid.Count; i++)
        {
            electrons += Density[i] * _grid.Volume[i];
            holes += HoleDensity[i] * _grid.Volume[i];
        }
        var fixedCharge = _target + IonisedTotal(_finalFermiLevel);
        return Math.Abs(holes - electrons + fixedCharge) / (electrons + holes);
    }

    /// <summary>
    /// Newton's method on the nonlinear Poisson equation of the predictor–corrector step; result in <see cref="Next"/>.
    /// </summary>
    /// <remarks>
    /// With periodic or no-flux boundaries the Laplacian is singular (a constant added to U changes nothing), and at low doping
    /// the density term that lifts the singularity is tiny, so the plain system would be ill-conditioned in exactly its
    /// constant mode. Instead the gauge pins δU₀ = 0 and the Fermi-level shift s becomes the extra unknown: rows 1 … N−1 of the
    /// Jacobian form a diagonally dominant tridiagonal matrix T (solved by the Thomas algorithm), and the sum of all rows (total
    /// charge) closes the system, δ = T⁻¹r − s·T⁻¹(d·1) with s from the total-charge row; a bordered solve without cancellation
    /// (Numerical Recipes, 3rd ed., §2.4 and §2.7). A periodic cell's U is then shifted to zero cell average; a closed domain
    /// keeps U = 0 at its left end.
    /// </remarks>
    internal void SolvePoisson(double mu, int iteration)
    {
        var n = _grid.Count;
        var c = ChargeOverPermittivityElectronVoltNanometres;
        Array.Copy(Hartree, _reference, n);
        Array.Copy(Hartree, Next, n);
        var u = Next;
        var limit = NewtonStepLimitThermal * KT;
        var tolerance = 1e-3 * _options.ToleranceElectronVolts;
        for (var step = 0; step < MaxNewtonSteps; step++)
        {
            Evaluate(mu, u, Density, _diagonal);
            double totalResidual = 0, totalDerivative = 0;
            for (var i = 0; i < n; i++)
            {
                int before = _grid.NodeBefore[i], after = _grid.NodeAfter[i];
                double right = _grid.CouplingAfter[i], left = _grid.CouplingBefore[i];
                // r = −F(U): F_i = ε∇²U − (e/ε₀)(fixed − V(n − p)); ∂F_i/∂U_i = −left − right + (e/ε₀)V ∂(n − p)/∂U; ∂F_i/∂μ = −(e/ε₀)V ∂(n − p)/∂U.
                var ionised = Ionised(mu, i, u[i], out var ionisedSlope);
                _residual[i] = -(right * (u[after] - u[i]) - left * (u[i] - u[before]) - c * (_grid.FixedCharge[i] + ionised - _grid.Volume[i] * (Density[i] - HoleDensity[i])));
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
                if (_grid.Periodic)
                {
                    RemoveMean(u);
                }
                return;
            }
        }
        throw new SpaceChargeException(iteration, double.NaN, string.Create(CultureInfo.InvariantCulture,
            $"Newton's method on the Poisson equation did not converge in {MaxNewtonSteps} steps"));
    }

    /// <summary>Shifts U to zero cell average (the periodic gauge); the Fermi level of the next iteration follows.</summary>
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

    /// <summary>
    /// The outer loop of the predictor–corrector scheme (A. Trellakis, A. T. Galick, A. Pacelli and U. Ravaioli, J. Appl. Phys.
    /// 81, 7880 (1997)): each iteration computes the states in U⁰ (<paramref name="computeStates"/>, which returns the neutral
    /// Fermi level), solves the nonlinear Poisson equation, and stops when max|U_new − U⁰| is below the tolerance; then the
    /// density of U⁰ is filled and <paramref name="finish"/> builds the result from (iterations, residual, μ).
    /// </summary>
    internal T Iterate<T>(Func<double> computeStates, Func<int, double, double, T> finish, IProgress<SpaceChargeProgress>? progress,
        CancellationToken cancellationToken)
    {
        var n = _grid.Count;
        var residual = double.PositiveInfinity;
        for (var iteration = 1; iteration <= _options.MaxIterations; iteration++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var mu = computeStates();
            SolvePoisson(mu, iteration);
            residual = 0;
            for (var i = 0; i < n; i++)
            {
                residual = Math.Max(residual, Math.Abs(Next[i] - Hartree[i]));
            }
            if (!double.IsFinite(residual))
            {
                throw new SpaceChargeException(iteration, residual, "the Hartree potential is no longer finite");
            }
            progress?.Report(new SpaceChargeProgress(iteration, residual, mu));
            if (residual <= _options.ToleranceElectronVolts)
            {
                FillDensity(mu);
                return finish(iteration, residual, mu);
            }
            (Hartree, Next) = (Next, Hartree);
        }
        throw new SpaceChargeException(_options.MaxIterations, residual,
            string.Create(CultureInfo.InvariantCulture, $"the tolerance {_options.ToleranceElectronVolts:R} eV was not reached in {_options.MaxIterations} iterations"));
    }

    private static double Logistic(double x) => MathNet.Numerics.SpecialFunctions.Logistic(x);
}
