// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using MathNet.Numerics.LinearAlgebra;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.PlaneWaves;

/// <summary>
/// Bloch energies of a periodic potential given by its Fourier series, from the central equation in a
/// plane-wave basis: an independent second method beside the transfer matrix. Immutable and thread-safe.
/// </summary>
/// <remarks>
/// <para>Method: with ψ = Σ c_G e^{i(k+G)x}, G = 2πn/d, n = −N … N, the equation −C(ψ′/m)′ + Vψ = Eψ becomes
/// the Hermitian eigenproblem Σ_G′ [C (k+G) η_{G−G′} (k+G′) + V_{G−G′}] c_G′ = E c_G (the central equation;
/// N. W. Ashcroft and N. D. Mermin, Solid State Physics, 1976, ch. 9), where V_G and η_G are the Fourier
/// coefficients of V and of 1/m. It is solved with MathNet.Numerics' dense eigenvalue decomposition, refined by one
/// Rayleigh–Ritz step on the lowest eigenvectors:
/// real symmetric when the potential and the inverse mass are even (cosine terms only), complex
/// Hermitian otherwise.</para>
/// <para>Basis size: N grows (by half, at least 8) until every requested energy changes by at most
/// <see cref="PlaneWaveOptions.RelativeTolerance"/> × max(|E|, energy scale) between two sizes; that change is reported as the error
/// estimate, floored at the rounding level 8ε·(|E| + S) of the energies (S the cell's energy scale; a dense
/// eigensolve followed by a Rayleigh–Ritz step reaches that level, see the internal Solve). When the change reaches that floor
/// first, the search stops there (a larger basis would only add rounding) and <see cref="PlaneWaveSpectrum.Converged"/>
/// says whether the tolerance was met. For a finite Fourier series the energies converge faster than any power of 1/N, so the change
/// bounds the error of the larger basis. The variational principle makes each energy decrease towards its
/// limit as N grows (the bases are nested).</para>
/// <para>Position-dependent mass: handled exactly in the BenDaniel–Duke ordering through the Fourier series of
/// 1/m (<see cref="CreateWithInverseMass"/>); a mass with jumps converges only algebraically. An
/// energy-dependent (non-parabolic) mass is not handled: it would make the problem a nonlinear eigenproblem.</para>
/// </remarks>
public sealed class PlaneWaveSolver
{
    /// <summary>Largest N (the basis holds 2N + 1 plane waves).</summary>
    public const int MaxHarmonicCutoff = 400;

    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly double _period;
    private readonly double _vConstant;
    private readonly double[] _vCos;
    private readonly double[] _vSin;
    private readonly double _etaConstant;
    private readonly double[] _etaCos;
    private readonly double[] _etaSin;
    private readonly double _scale;
    private readonly double _etaMax;
    private readonly double _vSpread;

    private PlaneWaveSolver(double period, double vConstant, double[] vCos, double[] vSin, double etaConstant, double[] etaCos, double[] etaSin)
    {
        _period = period;
        _vConstant = vConstant;
        _vCos = vCos;
        _vSin = vSin;
        _etaConstant = etaConstant;
        _etaCos = etaCos;
        _etaSin = etaSin;
        IsRealSymmetric = vSin.All(b => b == 0) && etaSin.All(b => b == 0);
        _vSpread = 2 * (vCos.Sum(Math.Abs) + vSin.Sum(Math.Abs));
        _etaMax = etaConstant + etaCos.Sum(Math.Abs) + etaSin.Sum(Math.Abs);
        var k = Math.PI / period;
        _scale = Math.Max(_vSpread, C * k * k * _etaMax);
    }

    /// <summary>The period d, nm.</summary>
    public double PeriodNanometres => _period;

    /// <summary>True when the Hamiltonian matrix is real symmetric (even potential and inverse mass).</summary>
    public bool IsRealSymmetric { get; }

    /// <summary>True when the mass varies with position.</summary>
    public bool HasPositionDependentMass => _etaCos.Any(a => a != 0) || _etaSin.Any(b => b != 0);

    /// <summary>A solver for the potential and constant mass of a <see cref="FourierSegment"/> (a cell of that one segment).</summary>
    /// <exception cref="ArgumentNullException"><paramref name="segment"/> is null.</exception>
    public static PlaneWaveSolver Create(FourierSegment segment)
    {
        ArgumentNullException.ThrowIfNull(segment);
        return new PlaneWaveSolver(segment.Width.Nanometres, segment.Constant.ElectronVolts, segment.CosineElectronVolts.ToArray(),
            segment.SineElectronVolts.ToArray(), 1.0 / segment.Mass.ElectronMasses, [], []);
    }

    /// <summary>A solver for V(x) = V₀ + Σ [aₙ cos(2πnx/d) + bₙ sin(2πnx/d)] with a constant mass.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule (the message names the index).</exception>
    public static PlaneWaveSolver Create(Length period, Energy constant, ReadOnlySpan<double> cosineElectronVolts, ReadOnlySpan<double> sineElectronVolts, EffectiveMass mass) =>
        Create(FourierSegment.Create(period, constant, cosineElectronVolts, sineElectronVolts, mass, 1));

    /// <summary>
    /// A solver with a position-dependent mass given by the Fourier series of its inverse,
    /// 1/m(x) = η₀ + Σ [cₙ cos(2πnx/d) + sₙ sin(2πnx/d)] in 1/m₀, which must stay positive.
    /// </summary>
    /// <param name="period">The period d; positive.</param>
    /// <param name="constant">V₀.</param>
    /// <param name="cosineElectronVolts">aₙ, eV, finite.</param>
    /// <param name="sineElectronVolts">bₙ, eV, finite.</param>
    /// <param name="inverseMassConstantPerElectronMass">η₀ in 1/m₀, positive.</param>
    /// <param name="inverseMassCosinePerElectronMass">cₙ in 1/m₀, finite.</param>
    /// <param name="inverseMassSinePerElectronMass">sₙ in 1/m₀, finite.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value breaks its rule, or 1/m is not positive everywhere.</exception>
    public static PlaneWaveSolver CreateWithInverseMass(Length period, Energy constant, ReadOnlySpan<double> cosineElectronVolts, ReadOnlySpan<double> sineElectronVolts,
        double inverseMassConstantPerElectronMass, ReadOnlySpan<double> inverseMassCosinePerElectronMass, ReadOnlySpan<double> inverseMassSinePerElectronMass)
    {
        Preconditions.CheckPositiveFinite(inverseMassConstantPerElectronMass);
        CheckFiniteSeries(inverseMassCosinePerElectronMass, nameof(inverseMassCosinePerElectronMass));
        CheckFiniteSeries(inverseMassSinePerElectronMass, nameof(inverseMassSinePerElectronMass));
        var potential = FourierSegment.Create(period, constant, cosineElectronVolts, sineElectronVolts, EffectiveMass.FreeElectron, 1);
        // The inverse-mass series has the same form as a potential series; reuse its checks and range scan.
        var inverse = FourierSegment.Create(period, Energy.FromElectronVolts(inverseMassConstantPerElectronMass), inverseMassCosinePerElectronMass,
            inverseMassSinePerElectronMass, EffectiveMass.FreeElectron, 1);
        if (!(inverse.MinimumPotential.ElectronVolts > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(inverseMassConstantPerElectronMass), inverseMassConstantPerElectronMass,
                $"the inverse mass 1/m(x) must be positive everywhere; its series reaches {Preconditions.Format(inverse.MinimumPotential.ElectronVolts)} /m0.");
        }
        return new PlaneWaveSolver(period.Nanometres, potential.Constant.ElectronVolts, potential.CosineElectronVolts.ToArray(), potential.SineElectronVolts.ToArray(),
            inverse.Constant.ElectronVolts, inverse.CosineElectronVolts.ToArray(), inverse.SineElectronVolts.ToArray());
    }

    private static void CheckFiniteSeries(ReadOnlySpan<double> values, string paramName)
    {
        for (var i = 0; i < values.Length; i++)
        {
            if (!double.IsFinite(values[i]))
            {
                throw new ArgumentOutOfRangeException(paramName, values[i], string.Create(CultureInfo.InvariantCulture,
                    $"{paramName}[{i}] (harmonic {i + 1}) must be finite; got {Preconditions.Format(values[i])}."));
            }
        }
    }

    /// <summary>
    /// The lowest <paramref name="bandCount"/> Bloch energies at wavevector <paramref name="wavevectorPerNanometre"/>,
    /// with the basis enlarged until they converge to the options' relative tolerance.
    /// </summary>
    /// <param name="wavevectorPerNanometre">Any finite k (1/nm); energies are periodic in k with period 2π/d.</param>
    /// <param name="bandCount">1 to 200.</param>
    /// <param name="options">The tolerance, relative to max(|E|, energy scale of the cell); <see cref="PlaneWaveOptions.Default"/> when null.</param>
    /// <exception cref="ArgumentOutOfRangeException">A value lies outside its range.</exception>
    public PlaneWaveSpectrum EnergiesAt(double wavevectorPerNanometre, int bandCount, PlaneWaveOptions? options = null)
    {
        Preconditions.CheckFinite(wavevectorPerNanometre);
        Preconditions.CheckRange(bandCount, 1, 200);
        var relativeTolerance = (options ?? PlaneWaveOptions.Default).RelativeTolerance;
        // The matrix is solved in units of the energy scale (MathNet's iteration is tuned for entries of order one).
        var n = InitialCutoff(bandCount);
        var previous = Solve(wavevectorPerNanometre, n, bandCount, false).Energies;
        var errors = new double[bandCount];
        while (true)
        {
            var next = NextCutoff(n);
            var current = Solve(wavevectorPerNanometre, next, bandCount, false).Energies;
            var converged = true;
            var roundingLimited = true;
            for (var i = 0; i < bandCount; i++)
            {
                var change = Math.Abs(current[i] - previous[i]);
                var rounding = RoundingFloor(current[i]);
                errors[i] = Math.Max(change, rounding);
                converged &= errors[i] <= relativeTolerance * Math.Max(Math.Abs(current[i]), _scale);
                roundingLimited &= change <= rounding;
            }
            if (converged || roundingLimited || next == MaxHarmonicCutoff)
            {
                return new PlaneWaveSpectrum(wavevectorPerNanometre, current, errors, 2 * next + 1, converged, relativeTolerance);
            }
            previous = current;
            n = next;
        }
    }

    /// <summary>The smallest N tried for <paramref name="bandCount"/> bands.</summary>
    internal int InitialCutoff(int bandCount) => Math.Min(MaxHarmonicCutoff, Math.Max(Math.Max(8, 2 * Math.Max(_vCos.Length, _etaCos.Length)), bandCount));

    /// <summary>The next N of the basis-size search: N grows by half, at least 8.</summary>
    internal static int NextCutoff(int cutoff) => Math.Min(MaxHarmonicCutoff, cutoff + Math.Max(8, cutoff / 2));

    /// <summary>The energy scale of the cell, eV: max(potential spread, C(π/d)²·max(1/m)).</summary>
    internal double EnergyScaleElectronVolts => _scale;

    /// <summary>
    /// Rounding level of a Rayleigh–Ritz energy E, eV: the Ritz values carry errors of a few ε times the local energy
    /// scale (|E| plus the cell's scale), not ε·‖H‖ as a dense eigensolver alone would (see <see cref="Solve"/>).
    /// </summary>
    internal double RoundingFloor(double energy) => RoundingUlps * 2.220446049250313e-16 * (Math.Abs(energy) + _scale);

    /// <summary>Multiple of ε in <see cref="RoundingFloor"/>.</summary>
    private const double RoundingUlps = 8;

    /// <summary>
    /// Lowest eigenvalues (and, when asked, eigenvectors) for the basis n = −cutoff … cutoff: a dense eigensolve
    /// followed by one Rayleigh–Ritz step on the subspace of the lowest eigenvectors.
    /// </summary>
    /// <remarks>
    /// A dense eigensolver is backward stable in norm: its eigenvalues carry errors of order ε·‖H‖, and ‖H‖ grows
    /// like the kinetic energy of the largest plane wave, hundreds of times the energies of the low bands. The
    /// eigenvectors it returns, however, span the low invariant subspace to order ε‖H‖/δ (δ the distance to the
    /// rest of the spectrum), so the Ritz values of H on that subspace are exact to second order in that error, and
    /// the rounding of the projection VᴴHV is componentwise: each term is weighted by the small high-momentum
    /// components of the vectors. The Ritz values are then accurate to a few ε times the energies of the subspace
    /// (B. N. Parlett, The Symmetric Eigenvalue Problem, 1998, ch. 11). Two vectors more than asked for are kept so
    /// that a nearly degenerate pair is not split at the edge of the subspace.
    /// </remarks>
    internal (double[] Energies, Complex[][]? Vectors) Solve(double k, int cutoff, int count, bool vectors)
    {
        var size = 2 * cutoff + 1;
        var g = 2 * Math.PI / _period;
        var kept = Math.Min(size, count + 2);
        var h = Matrix<Complex>.Build.Dense(size, size, (r, c) =>
        {
            double kr = k + (r - cutoff) * g, kc = k + (c - cutoff) * g;
            var j = r - c;
            return IsRealSymmetric
                ? (C * kr * kc * RealCoefficient(_etaConstant, _etaCos, j) + RealCoefficient(_vConstant, _vCos, j)) / _scale
                : (C * kr * kc * ComplexCoefficient(_etaConstant, _etaCos, _etaSin, j) + ComplexCoefficient(_vConstant, _vCos, _vSin, j)) / _scale;
        });
        Matrix<Complex> basis;
        if (IsRealSymmetric)
        {
            // Real arithmetic where the matrix is real (half the work); the vectors are then widened for the projection.
            var real = Matrix<double>.Build.Dense(size, size, (r, c) => h[r, c].Real);
            var evd = real.Evd(Symmetricity.Symmetric);
            var order = Lowest(evd.EigenValues.Select(z => z.Real).ToArray(), kept);
            basis = Matrix<Complex>.Build.Dense(size, kept, (r, c) => evd.EigenVectors[r, order[c]]);
        }
        else
        {
            var evd = h.Evd(Symmetricity.Hermitian);
            var order = Lowest(evd.EigenValues.Select(z => z.Real).ToArray(), kept);
            basis = Matrix<Complex>.Build.Dense(size, kept, (r, c) => evd.EigenVectors[r, order[c]]);
        }
        Orthonormalise(basis);
        var projected = basis.ConjugateTranspose() * (h * basis);
        projected = 0.5 * (projected + projected.ConjugateTranspose());
        var small = projected.Evd(Symmetricity.Hermitian);
        var ritzOrder = Lowest(small.EigenValues.Select(z => z.Real).ToArray(), count);
        // The small eigensolve is accurate to ε times the largest Ritz value only; the Rayleigh quotient of each Ritz
        // vector with H restores the componentwise accuracy (its error is second order in the vector's).
        var ritzVectors = basis * small.EigenVectors; // orthonormal columns times a unitary matrix
        var applied = h * ritzVectors;
        var energies = new double[count];
        var result = vectors ? new Complex[count][] : null;
        for (var b = 0; b < count; b++)
        {
            var x = ritzVectors.Column(ritzOrder[b]);
            var norm = x.L2Norm();
            energies[b] = x.ConjugateDotProduct(applied.Column(ritzOrder[b])).Real / (norm * norm) * _scale;
            if (result is not null)
            {
                result[b] = x.Select(z => z / norm).ToArray();
            }
        }
        // Rayleigh quotients of nearly degenerate pairs may leave their order by a rounding.
        if (result is null)
        {
            Array.Sort(energies);
        }
        else
        {
            Array.Sort(energies, result);
        }
        return (energies, result);
    }

    /// <summary>
    /// Modified Gram–Schmidt, twice (W. Kahan's "twice is enough"): the dense solver's vectors are orthonormal only to
    /// about ε·size, which would shift the Ritz values by that fraction of themselves.
    /// </summary>
    private static void Orthonormalise(Matrix<Complex> basis)
    {
        for (var pass = 0; pass < 2; pass++)
        {
            for (var j = 0; j < basis.ColumnCount; j++)
            {
                var column = basis.Column(j);
                for (var i = 0; i < j; i++)
                {
                    var previous = basis.Column(i);
                    column -= previous * previous.ConjugateDotProduct(column);
                }
                basis.SetColumn(j, column / column.L2Norm());
            }
        }
    }

    /// <summary>Indices of the <paramref name="count"/> smallest values, ascending.</summary>
    private static int[] Lowest(double[] values, int count) =>
        Enumerable.Range(0, values.Length).OrderBy(i => values[i]).Take(count).ToArray();

    private static double RealCoefficient(double constant, double[] cosine, int j)
    {
        if (j == 0)
        {
            return constant;
        }
        var n = Math.Abs(j);
        return n <= cosine.Length ? 0.5 * cosine[n - 1] : 0;
    }

    /// <summary>Coefficient of e^{i j g x}: (a − i b)/2 for j &gt; 0, (a + i b)/2 for j &lt; 0.</summary>
    private static Complex ComplexCoefficient(double constant, double[] cosine, double[] sine, int j)
    {
        if (j == 0)
        {
            return constant;
        }
        var n = Math.Abs(j);
        if (n > cosine.Length)
        {
            return Complex.Zero;
        }
        return new Complex(0.5 * cosine[n - 1], j > 0 ? -0.5 * sine[n - 1] : 0.5 * sine[n - 1]);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"PlaneWaveSolver: period {_period:G6} nm, {_vCos.Length} potential harmonic(s), {(HasPositionDependentMass ? "position-dependent" : "constant")} mass, {(IsRealSymmetric ? "real symmetric" : "complex Hermitian")}");
}

/// <summary>Bloch energies at one wavevector from <see cref="PlaneWaveSolver"/>, with the basis size and error estimate reached.</summary>
public sealed class PlaneWaveSpectrum
{
    private readonly double[] _energies;
    private readonly double[] _errors;

    internal PlaneWaveSpectrum(double k, double[] energies, double[] errors, int basisSize, bool converged, double relativeTolerance)
    {
        WavevectorPerNanometre = k;
        _energies = energies;
        _errors = (double[])errors.Clone();
        EnergiesElectronVolts = Array.AsReadOnly(_energies);
        EstimatedErrorsElectronVolts = Array.AsReadOnly(_errors);
        BasisSize = basisSize;
        Converged = converged;
        RelativeTolerance = relativeTolerance;
    }

    /// <summary>The wavevector, 1/nm.</summary>
    public double WavevectorPerNanometre { get; }

    /// <summary>The energies E₁(k) ≤ E₂(k) ≤ …, eV.</summary>
    public IReadOnlyList<double> EnergiesElectronVolts { get; }

    /// <summary>Estimated error of each energy (its change over the last basis enlargement), eV.</summary>
    public IReadOnlyList<double> EstimatedErrorsElectronVolts { get; }

    /// <summary>The largest estimated error, eV.</summary>
    public double MaxEstimatedErrorElectronVolts => _errors.Max();

    /// <summary>Number of plane waves in the final basis (2N + 1).</summary>
    public int BasisSize { get; }

    /// <summary>True when the requested tolerance was met before the basis reached its cap.</summary>
    public bool Converged { get; }

    /// <summary>The relative tolerance requested.</summary>
    public double RelativeTolerance { get; }

    /// <inheritdoc />
    public override string ToString()
    {
        var energies = string.Join(", ", _energies.Select(e => e.ToString("G12", CultureInfo.InvariantCulture)));
        return string.Create(CultureInfo.InvariantCulture,
            $"PlaneWaveSpectrum k = {WavevectorPerNanometre:G6} /nm: [{energies}] eV, basis {BasisSize}, max error {MaxEstimatedErrorElectronVolts:G3} eV{(Converged ? "" : " (NOT converged)")}");
    }
}
