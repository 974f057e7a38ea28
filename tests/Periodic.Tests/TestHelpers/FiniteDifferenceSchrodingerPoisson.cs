// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Numerics;
using MathNet.Numerics.LinearAlgebra;
using Periodic.Units;

namespace Periodic.Tests.TestHelpers;

/// <summary>
/// An independent finite-difference Schrödinger–Poisson solver for a doped superlattice cell of uniform layers on a uniform
/// grid of spacing h (interfaces and sheet positions on nodes). Schrödinger: the three-point BenDaniel–Duke operator
/// −C d/dz(1/m d/dz) + V + U (masses at interval midpoints, an interface node takes the mean band edge) with the Bloch
/// condition ψ_N = e^(iθ)ψ₀, a dense Hermitian matrix per Bloch phase diagonalised by MathNet; the k integral by the
/// midpoint rule in θ ∈ [0, π] (spectrally accurate for the smooth, even, 2π-periodic integrand). Occupation: the 2D
/// electron gas, (m∥/πħ²)k_BT ln(1 + e^((μ−E)/k_BT)) per state with m∥ = 1/⟨1/m⟩ (J. H. Davies, The Physics of
/// Low-Dimensional Semiconductors, 1998, ch. 3). Poisson: d/dz(ε dU/dz) = (e/ε₀)(N_D − N_A − n) by three-point
/// differences with periodic rows, Newton's method with the local-shift density estimate (A. Trellakis et al., J. Appl.
/// Phys. 81, 7880 (1997)) solved by MathNet's dense LU; μ by bisection on neutrality. Gauge: zero mean of U on the grid.
/// Second order in h (R. J. LeVeque, Finite Difference Methods for ODEs and PDEs, SIAM 2007, ch. 2).
/// Closed (a finite stack with lead buffers): ψ = 0 at both ends (one real symmetric matrix of the interior nodes, no Bloch
/// phase), Poisson with no flux through the ends (half control volumes there), the gauge U = 0 at the left end.
/// </summary>
internal sealed class FiniteDifferenceSchrodingerPoisson
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;
    private const double ChargeOverPermittivity = PhysicalConstants.ElementaryChargeCoulombs / PhysicalConstants.VacuumPermittivityFaradsPerMetre * 1e9; // eV nm

    internal sealed record LayerSpec(double Width, double Potential, double Mass, double Permittivity, double NetDopingPerCubicCentimetre, double SheetPerSquareCentimetre);

    internal FiniteDifferenceSchrodingerPoisson(IReadOnlyList<LayerSpec> layers, double h, double temperatureKelvin, int phases, int bands, bool closed = false)
    {
        _closed = closed;
        var mass = new List<double>();
        var potential = new List<double>();
        var eps = new List<double>();
        var doping = new List<double>();
        var sheets = new List<double>();
        foreach (var layer in layers)
        {
            var cells = (int)Math.Round(layer.Width / h);
            if (Math.Abs(cells * h - layer.Width) > 1e-9 * h || cells % 2 != 0)
            {
                throw new ArgumentException("layer widths must be even multiples of h", nameof(h));
            }
            var start = mass.Count;
            for (var j = 0; j < cells; j++)
            {
                mass.Add(layer.Mass);
                potential.Add(layer.Potential);
                eps.Add(layer.Permittivity);
                doping.Add(layer.NetDopingPerCubicCentimetre * 1e-21);
                sheets.Add(0);
            }
            sheets[start + cells / 2] += layer.SheetPerSquareCentimetre * 1e-14;
        }
        var intervals = mass.Count;
        N = closed ? intervals + 1 : intervals; // unknowns of Poisson's equation
        sheets.Add(0);
        H = h;
        _mass = [.. mass];
        _eps = [.. eps];
        _band = new double[N];
        _fixed = new double[N];
        for (var i = 0; i < N; i++)
        {
            // Closed ends have one interval only: there the missing side contributes nothing.
            var before = closed ? Math.Max(i - 1, 0) : (i + N - 1) % N;
            var after = closed ? Math.Min(i, intervals - 1) : i;
            double halfBefore = closed && i == 0 ? 0 : 0.5 * h, halfAfter = closed && i == intervals ? 0 : 0.5 * h;
            _band[i] = 0.5 * (potential[before] + potential[after]);
            _fixed[i] = halfBefore * doping[before] + halfAfter * doping[after] + sheets[i];
        }
        _kT = temperatureKelvin * PhysicalConstants.BoltzmannElectronVoltsPerKelvin;
        _phases = phases;
        _bands = bands;
        Hartree = new double[N];
        Density = new double[N];
    }

    private readonly bool _closed;
    private readonly double[] _mass;
    private readonly double[] _eps;
    private readonly double[] _band;
    private readonly double[] _fixed;
    private readonly double _kT;
    private readonly int _phases;
    private readonly int _bands;
    private List<(double Energy, double Weight, double[] Density)> _states = [];

    internal int N { get; }

    internal double H { get; }

    internal double[] Hartree { get; private set; }

    internal double[] Density { get; }

    internal double FermiLevel { get; private set; }

    /// <summary>The lowest state at θ = 0 in the converged potential, eV.</summary>
    internal double LowestEnergy { get; private set; }

    internal int Iterations { get; private set; }

    internal void Solve(double tolerance = 1e-10, int maxIterations = 100)
    {
        for (var iteration = 1; iteration <= maxIterations; iteration++)
        {
            ComputeStates();
            FermiLevel = Neutral();
            var next = Newton(FermiLevel);
            var change = next.Zip(Hartree, (a, b) => Math.Abs(a - b)).Max();
            if (change < tolerance)
            {
                Iterations = iteration;
                FillDensity(FermiLevel, Hartree, Hartree, Density);
                return;
            }
            Hartree = next;
        }
        throw new InvalidOperationException("the finite-difference reference did not converge");
    }

    private void ComputeStates()
    {
        if (_closed)
        {
            ComputeBoxStates();
            return;
        }
        _states = [];
        LowestEnergy = double.PositiveInfinity;
        for (var j = 0; j < _phases; j++)
        {
            var theta = (j + 0.5) * Math.PI / _phases;
            var m = Matrix<Complex>.Build.Dense(N, N);
            for (var i = 0; i < N; i++)
            {
                var before = (i + N - 1) % N;
                double left = 1 / _mass[before], right = 1 / _mass[i];
                m[i, i] = C * (left + right) / (H * H) + _band[i] + Hartree[i];
                var hop = -C * right / (H * H);
                var phase = i == N - 1 ? Complex.FromPolarCoordinates(1, theta) : Complex.One;
                m[i, (i + 1) % N] += hop * Complex.Conjugate(phase);
                m[(i + 1) % N, i] += hop * phase;
            }
            var evd = m.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Hermitian);
            var order = Enumerable.Range(0, N).OrderBy(k => evd.EigenValues[k].Real).Take(_bands).ToArray();
            foreach (var k in order)
            {
                var energy = evd.EigenValues[k].Real;
                var vector = evd.EigenVectors.Column(k);
                var density = new double[N];
                double norm = 0, inverseMass = 0;
                for (var i = 0; i < N; i++)
                {
                    var before = (i + N - 1) % N;
                    density[i] = vector[i].Magnitude * vector[i].Magnitude;
                    norm += density[i] * H;
                    inverseMass += density[i] * H * 0.5 * (1 / _mass[before] + 1 / _mass[i]);
                }
                for (var i = 0; i < N; i++)
                {
                    density[i] /= norm;
                }
                var inPlaneMass = norm / inverseMass;
                _states.Add((energy, inPlaneMass / (2 * Math.PI * C) / _phases, density));
            }
            LowestEnergy = Math.Min(LowestEnergy, evd.EigenValues[order[0]].Real);
        }
    }

    /// <summary>The states of the closed domain: ψ = 0 at nodes 0 and N − 1, the interior nodes a real symmetric matrix.</summary>
    private void ComputeBoxStates()
    {
        _states = [];
        var inner = N - 2;
        var m = Matrix<double>.Build.Dense(inner, inner);
        for (var k = 0; k < inner; k++)
        {
            var i = k + 1; // grid node; interval i − 1 before it, interval i after it
            double left = 1 / _mass[i - 1], right = 1 / _mass[i];
            m[k, k] = C * (left + right) / (H * H) + _band[i] + Hartree[i];
            if (k + 1 < inner)
            {
                m[k, k + 1] = m[k + 1, k] = -C * right / (H * H);
            }
        }
        var evd = m.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
        var order = Enumerable.Range(0, inner).OrderBy(k => evd.EigenValues[k].Real).Take(_bands).ToArray();
        foreach (var k in order)
        {
            var vector = evd.EigenVectors.Column(k);
            var density = new double[N];
            double norm = 0, inverseMass = 0;
            for (var j = 0; j < inner; j++)
            {
                var i = j + 1;
                density[i] = vector[j] * vector[j];
                norm += density[i] * H;
                inverseMass += density[i] * H * 0.5 * (1 / _mass[i - 1] + 1 / _mass[i]);
            }
            for (var i = 0; i < N; i++)
            {
                density[i] /= norm;
            }
            _states.Add((evd.EigenValues[k].Real, norm / inverseMass / (2 * Math.PI * C), density));
        }
        LowestEnergy = evd.EigenValues[order[0]].Real;
    }

    /// <summary>ln(1 + e^x), by MathNet's accurate ln(1 + y) where e^x is tiny.</summary>
    private static double Softplus(double x) => x > 0 ? x + MathNet.Numerics.SpecialFunctions.Log1p(Math.Exp(-x)) : MathNet.Numerics.SpecialFunctions.Log1p(Math.Exp(x));

    private double Neutral()
    {
        var target = _fixed.Sum();
        double low = _states.Min(s => s.Energy) - 2, high = _states.Min(s => s.Energy) + 2;
        for (var i = 0; i < 200; i++)
        {
            var mid = 0.5 * (low + high);
            var electrons = _states.Sum(s => s.Weight * _kT * Softplus((mid - s.Energy) / _kT));
            (low, high) = electrons > target ? (low, mid) : (mid, high);
        }
        return 0.5 * (low + high);
    }

    private void FillDensity(double mu, double[] u, double[] reference, double[] density, double[]? derivative = null)
    {
        Array.Clear(density);
        foreach (var (energy, weight, rho) in _states)
        {
            for (var i = 0; i < N; i++)
            {
                var x = (mu - energy - (u[i] - reference[i])) / _kT;
                density[i] += weight * rho[i] * _kT * Softplus(x);
                if (derivative is not null)
                {
                    derivative[i] -= weight * rho[i] / (1 + Math.Exp(-x));
                }
            }
        }
    }

    private double[] Newton(double mu)
    {
        var u = (double[])Hartree.Clone();
        var density = new double[N];
        for (var step = 0; step < 300; step++)
        {
            var derivative = new double[N];
            FillDensity(mu, u, Hartree, density, derivative);
            var jacobian = Matrix<double>.Build.Dense(N, N);
            var residual = MathNet.Numerics.LinearAlgebra.Vector<double>.Build.Dense(N);
            for (var i = 0; i < N; i++)
            {
                int before, after;
                double left, right, volume = H;
                if (_closed)
                {
                    // No flux through the ends: the missing coupling is zero and the control volume half.
                    (before, after) = (Math.Max(i - 1, 0), Math.Min(i + 1, N - 1));
                    left = i == 0 ? 0 : _eps[i - 1] / H;
                    right = i == N - 1 ? 0 : _eps[i] / H;
                    volume = i == 0 || i == N - 1 ? 0.5 * H : H;
                }
                else
                {
                    (before, after) = ((i + N - 1) % N, (i + 1) % N);
                    (left, right) = (_eps[before] / H, _eps[i] / H);
                }
                residual[i] = -(right * (u[after] - u[i]) - left * (u[i] - u[before]) - ChargeOverPermittivity * (_fixed[i] - volume * density[i]));
                jacobian[i, before] += left;
                jacobian[i, after] += right;
                jacobian[i, i] += -left - right + ChargeOverPermittivity * volume * derivative[i];
            }
            var delta = jacobian.Solve(residual);
            var largest = delta.AbsoluteMaximum();
            var scale = Math.Min(1, 4 * _kT / largest);
            for (var i = 0; i < N; i++)
            {
                u[i] += scale * delta[i];
            }
            if (largest < 1e-13)
            {
                var gauge = _closed ? u[0] : u.Average();
                return [.. u.Select(v => v - gauge)];
            }
        }
        throw new InvalidOperationException("Newton did not converge in the finite-difference reference");
    }
}
