// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Numerics;
using Periodic.Structures;
using Periodic.Transfer;
using Periodic.Units;

namespace Periodic.Stacks;

/// <summary>
/// Transmission and reflection of a <see cref="LayerStack"/>, compiled once and evaluated at any real
/// energy. Immutable and thread-safe; evaluation does not allocate.
/// </summary>
/// <remarks>
/// <para>Method: scattering-matrix composition (D. Y. K. Ko and J. C. Inkson, Phys. Rev. B 38, 9945
/// (1988); Redheffer star product). Each layer's closed-form transfer matrix (from the core engine,
/// scaled by e^(−κw) in barriers) is turned into a unitary scattering matrix in the basis of a
/// zero-thickness reference medium; these are composed left to right, and a part of N repeated cells
/// uses the cell's matrix raised to the N-th power by repeated squaring, so its cost grows as log₂ N.
/// Transmission amplitudes are held as mantissa × e^scale: T down to 1e-300 and far below stays
/// finite in <see cref="TransmissionResult.LogTransmission"/>, never NaN.</para>
/// <para>At or below a lead's band edge no current flows in that lead: T = 0 and the result says so
/// (<see cref="TransmissionResult.Channels"/>).</para>
/// </remarks>
public sealed class StackTransmission
{
    private const double C = PhysicalConstants.HbarSquaredOverTwoElectronMassEvNm2;

    private readonly CompiledPart[] _parts;
    private readonly CompiledCell? _biased; // under bias: every element written out, layers with a linear potential; null at zero bias
    private readonly PhaseGuide[] _guides; // under bias: the repeated cells and the energy shift of each copy
    private readonly (double Lower, double Upper) _affordableEnergies = (double.NegativeInfinity, double.PositiveInfinity); // under bias: see AffordableEnergies

    // Distinct layer materials (potential, mass, mass slope) for choosing the reference impedance.
    private readonly double[] _potentials;
    private readonly double[] _masses;
    private readonly double[] _slopes;

    private StackTransmission(LayerStack stack)
    {
        Stack = stack;
        RightLead = stack.RightLead;
        var parts = stack.PartSpan;
        _parts = new CompiledPart[parts.Length];
        var materials = new List<(double V, double M, double Slope)>();
        var lowest = double.NegativeInfinity;
        for (var i = 0; i < parts.Length; i++)
        {
            var part = parts[i];
            var elements = part.Cell is null ? [part.Element!] : part.Cell.Elements.ToArray();
            // The kernel compiles every element kind it can propagate (layers, deltas, smooth segments) and rejects the rest.
            var compiled = new CompiledCell(elements, nameof(stack));
            lowest = Math.Max(lowest, compiled.LowestValidEnergyElectronVolts);
            foreach (var element in elements)
            {
                if (element is Layer layer)
                {
                    var material = (layer.Potential.ElectronVolts, layer.Mass.ElectronMasses, layer.Mass.ElectronMasses * layer.NonParabolicityPerElectronVolt);
                    if (!materials.Contains(material))
                    {
                        materials.Add(material);
                    }
                }
            }
            _parts[i] = new CompiledPart(compiled, part.Repetitions, part.Cell is null || part.Repetitions == 1 ? null : CellTransfer.Create(part.Cell));
        }
        _potentials = materials.Select(m => m.V).ToArray();
        _masses = materials.Select(m => m.M).ToArray();
        _slopes = materials.Select(m => m.Slope).ToArray();
        _biased = null;
        _guides = [];
        LowestValidEnergyElectronVolts = lowest;
    }

    private StackTransmission(LayerStack stack, double drop)
    {
        Stack = stack;
        Bias = Energy.FromElectronVolts(drop);
        RightLead = Lead.Create(Energy.FromElectronVolts(stack.RightLead.PotentialElectronVolts - drop), EffectiveMass.FromElectronMasses(stack.RightLead.MassElectronMasses));
        _parts = [];
        var field = drop / stack.Thickness.Nanometres; // eV/nm; V(x) = V_layer − field·x
        var written = new CellElement[stack.ElementCount];
        var materials = new List<(double V, double M)>();
        var guides = new List<PhaseGuide>();
        var i = 0;
        double x = 0;
        foreach (var part in stack.PartSpan)
        {
            var elements = part.Cell is null ? [part.Element!] : part.Cell.Elements.ToArray();
            var shifts = part.Cell is null || part.Repetitions == 1 ? null : new double[part.Repetitions];
            if (shifts is not null)
            {
                guides.Add(new PhaseGuide(CellTransfer.Create(part.Cell!), shifts));
            }
            for (var r = 0; r < part.Repetitions; r++)
            {
                if (shifts is not null)
                {
                    // Copy r sees the cell's potential lowered by field·x at its middle: E there is E + field·x in the cell's terms.
                    shifts[r] = field * (x + 0.5 * part.Cell!.Period.Nanometres);
                }
                foreach (var element in elements)
                {
                    // Deltas have zero width: nothing drops across them, and their jump of ψ′/m does not depend on the potential.
                    if (element is Layer layer) // the only other kind (checked by Create)
                    {
                        var material = (layer.Potential.ElectronVolts, layer.Mass.ElectronMasses);
                        if (!materials.Contains(material))
                        {
                            materials.Add(material);
                        }
                        x += layer.Width.Nanometres;
                    }
                    written[i++] = element;
                }
            }
        }
        _biased = new CompiledCell(written, field, nameof(stack));
        _affordableEnergies = AffordableEnergies(_biased);
        _potentials = materials.Select(m => m.V).ToArray();
        _masses = materials.Select(m => m.M).ToArray();
        _slopes = new double[materials.Count];
        _guides = [.. guides];
        LowestValidEnergyElectronVolts = double.NegativeInfinity;
    }

    /// <summary>The stack.</summary>
    public LayerStack Stack { get; }

    /// <summary>
    /// Energies must exceed this bound (eV) so that every non-parabolic mass m(E) = m(1 + α(E − V)) stays
    /// positive; −∞ for a stack of parabolic layers.
    /// </summary>
    public double LowestValidEnergyElectronVolts { get; }

    /// <summary>
    /// The potential drop eU across the stack (positive: the right lead's band edge lies lower); zero for an unbiased
    /// stack.
    /// </summary>
    public Energy Bias { get; }

    /// <summary>
    /// The right lead as the calculation sees it: the stack's right lead with its band edge shifted by −eU
    /// (<see cref="Bias"/>); the stack's own right lead when unbiased.
    /// </summary>
    public Lead RightLead { get; }

    /// <summary>
    /// The largest number of elements (repeated cells written out) of a stack under bias: a field breaks the
    /// periodicity, so every element costs one scattering matrix per energy.
    /// </summary>
    public const long MaxBiasedElements = 100_000;

    /// <summary>Compiles the transmission calculation of <paramref name="stack"/> at zero bias.</summary>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    public static StackTransmission Create(LayerStack stack)
    {
        ArgumentNullException.ThrowIfNull(stack);
        return new StackTransmission(stack);
    }

    /// <summary>
    /// Compiles the transmission calculation of <paramref name="stack"/> under an applied bias: a uniform electric
    /// field across the layers, so that the potential drops linearly by <paramref name="bias"/> (= eU) from the left
    /// lead's interface (x = 0) to the right lead's (x = L). The leads stay flat; the right lead's band edge is
    /// shifted by −eU (<see cref="RightLead"/>). Energies are measured on the scale of the unshifted left lead.
    /// </summary>
    /// <remarks>
    /// <para>Each layer then has a linear potential; its exact transfer matrix comes from Airy functions (the
    /// Airy-function transfer-matrix method, K. F. Brennan and C. J. Summers, J. Appl. Phys. 61, 614 (1987);
    /// M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions, §10.4), exponentially scaled so
    /// that nothing overflows, or, where Airy functions of large argument or small span would lose digits
    /// (small fields), from an exact power series on sublayers. Delta barriers keep their strength (nothing
    /// drops across zero width). The elements are composed with the same scattering-matrix star product as at
    /// zero bias.</para>
    /// <para><b>Cost.</b> A field breaks the periodicity: repeated cells are written out, and each evaluation costs
    /// one scattering matrix per element (O(elements), not O(log N)), at most <see cref="MaxBiasedElements"/>.
    /// A zero bias gives exactly <see cref="Create(LayerStack)"/>.</para>
    /// <para>The field is that of an ideal capacitor: no charge, no space charge and no self-consistent potential
    /// are modelled. Results under bias are a guide; check them against measurement.</para>
    /// </remarks>
    /// <param name="stack">The stack.</param>
    /// <param name="bias">The potential drop eU across the stack; finite, either sign.</param>
    /// <exception cref="ArgumentNullException"><paramref name="stack"/> is null.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="bias"/> is not zero for a stack of zero thickness (no layer for the field to act in).</exception>
    /// <exception cref="ArgumentException">Under a non-zero bias: the stack has more than <see cref="MaxBiasedElements"/> elements
    /// when written out, or holds an element other than a parabolic layer or a delta barrier (the message names it).</exception>
    public static StackTransmission Create(LayerStack stack, Energy bias)
    {
        CheckBias(stack, bias);
        return bias.ElectronVolts == 0 ? new StackTransmission(stack) : new StackTransmission(stack, bias.ElectronVolts);
    }

    /// <summary>
    /// Throws what <see cref="Create(LayerStack, Energy)"/> would throw for this stack and bias, without compiling or
    /// evaluating anything (the structure file validates its <c>stack.bias</c> with it).
    /// </summary>
    internal static void CheckBias(LayerStack stack, Energy bias)
    {
        ArgumentNullException.ThrowIfNull(stack);
        var drop = bias.ElectronVolts;
        if (drop == 0)
        {
            return;
        }
        if (!(stack.Thickness.Nanometres > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(bias), drop,
                $"bias must be 0 eV for a stack of zero thickness (a uniform field needs layers to drop across); got {Preconditions.Format(drop)} eV.");
        }
        if (stack.ElementCount > MaxBiasedElements)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"stack has {stack.ElementCount} elements when its repeated cells are written out; under bias every element is evaluated separately (cost O(elements) per energy), so at most {MaxBiasedElements} are accepted."),
                nameof(stack));
        }
        var parts = stack.PartSpan;
        for (var i = 0; i < parts.Length; i++)
        {
            var elements = parts[i].Cell is null ? [parts[i].Element!] : parts[i].Cell!.Elements.ToArray();
            for (var j = 0; j < elements.Length; j++)
            {
                var problem = elements[j] switch
                {
                    DeltaBarrier => null,
                    Layer { NonParabolicityPerElectronVolt: > 0 } => "is a non-parabolic layer (its mass would vary with position in a field, which the Airy-function form does not cover)",
                    Layer => null,
                    var other => $"is a {other.GetType().Name} (only layers and delta barriers can be put under bias)",
                };
                if (problem is not null)
                {
                    var where = parts[i].Cell is null
                        ? string.Create(CultureInfo.InvariantCulture, $"part {i}")
                        : string.Create(CultureInfo.InvariantCulture, $"element {j} of the cell of part {i}");
                    throw new ArgumentException(
                        $"stack {where} {problem}; bias must be 0 eV for such a stack, got {Preconditions.Format(drop)} eV.",
                        nameof(stack));
                }
            }
        }
    }

    /// <summary>Transmission, reflection and their amplitudes at <paramref name="energyElectronVolts"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The energy is not finite, or not above <see cref="LowestValidEnergyElectronVolts"/>, or (under bias) so far from a layer's potential that its exact propagation would need more than 10⁶ sublayers (|E − V| of order 1e7 eV for 100 nm).</exception>
    public TransmissionResult Evaluate(double energyElectronVolts)
    {
        CheckEnergy(energyElectronVolts, "energyElectronVolts");
        return EvaluateCore(energyElectronVolts);
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = T(energiesElectronVolts[i])</c>; a value below the double
    /// range is returned as 0 (see <see cref="Log10Transmissions"/>), never NaN. Does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not finite or not above <see cref="LowestValidEnergyElectronVolts"/>, or (under bias) absurdly far from the layer potentials (the message names its index); destination is then unchanged.</exception>
    public void Transmissions(ReadOnlySpan<double> energiesElectronVolts, Span<double> destination)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        CheckEnergies(energiesElectronVolts);
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            destination[i] = EvaluateCore(energiesElectronVolts[i]).Transmission;
        }
    }

    /// <summary>
    /// Effectively computes <c>destination[i] = log₁₀ T(energiesElectronVolts[i])</c>; −∞ where a lead is
    /// closed, finite otherwise, never NaN. Does not allocate.
    /// </summary>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is not finite or not above <see cref="LowestValidEnergyElectronVolts"/>, or (under bias) absurdly far from the layer potentials; destination is then unchanged.</exception>
    public void Log10Transmissions(ReadOnlySpan<double> energiesElectronVolts, Span<double> destination)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        CheckEnergies(energiesElectronVolts);
        for (var i = 0; i < energiesElectronVolts.Length; i++)
        {
            destination[i] = EvaluateCore(energiesElectronVolts[i]).Log10Transmission;
        }
    }

    /// <summary>
    /// As <see cref="Transmissions(ReadOnlySpan{double}, Span{double})"/>, for long sweeps: reports progress
    /// about every 1% of the points and checks <paramref name="cancellationToken"/> before every point.
    /// </summary>
    /// <param name="energiesElectronVolts">Energies, eV.</param>
    /// <param name="destination">Receives T; may be longer than the input.</param>
    /// <param name="progress">Receives <see cref="SweepProgress"/> reports (may be null); the last report has Completed = Total.</param>
    /// <param name="cancellationToken">Cancels the sweep.</param>
    /// <exception cref="OperationCanceledException">The sweep was cancelled. No partial output is left: the first
    /// <c>energiesElectronVolts.Length</c> entries of <paramref name="destination"/> are reset to zero.</exception>
    /// <exception cref="ArgumentException"><paramref name="destination"/> is shorter than the input.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An energy is invalid; destination is then unchanged.</exception>
    public void Transmissions(ReadOnlySpan<double> energiesElectronVolts, Span<double> destination,
        IProgress<SweepProgress>? progress, CancellationToken cancellationToken)
    {
        Preconditions.CheckDestination(energiesElectronVolts.Length, destination.Length, nameof(energiesElectronVolts), nameof(destination));
        CheckEnergies(energiesElectronVolts);
        var n = energiesElectronVolts.Length;
        var stride = Math.Max(1, n / 100);
        for (var i = 0; i < n; i++)
        {
            if (cancellationToken.IsCancellationRequested)
            {
                destination[..n].Clear();
                cancellationToken.ThrowIfCancellationRequested();
            }
            destination[i] = EvaluateCore(energiesElectronVolts[i]).Transmission;
            if (progress is not null && ((i + 1) % stride == 0 || i + 1 == n))
            {
                progress.Report(new SweepProgress(i + 1, n));
            }
        }
        if (n == 0)
        {
            progress?.Report(new SweepProgress(0, 0));
        }
    }

    /// <summary>
    /// Finds the transmission peaks (resonances) in [<paramref name="lowerElectronVolts"/>, <paramref name="upperElectronVolts"/>]:
    /// their energies, heights, full widths at half maximum and lifetimes ħ/Γ.
    /// </summary>
    /// <remarks>
    /// Method: a uniform scan, refined by halving wherever a phase turns by more than
    /// <see cref="ResonanceSearchOptions.MaxPhaseStepRadians"/> between samples: the wrapped change of arg t
    /// (a resonance turns the transmission phase by about π, so an isolated peak is caught however narrow
    /// it is), the slope of arg t times the step, and, for repeated cells, the change of N·kd with kd the
    /// Bloch phase unfolded into the extended zone (monotonic, from the core's band-edge count: it rises by π
    /// from one peak of the N-period stack to the next, so the dense narrow peaks near miniband edges are
    /// all resolved). Each local maximum
    /// of ln T is refined by golden section (J. Kiefer, Proc. AMS 4, 502 (1953)), its half-maximum points
    /// by Brent's method (R. P. Brent, 1973), and its energy as the Brent root of
    /// ln T(E + h) − ln T(E − h) at h, h/2 and h/4 with Richardson extrapolation (h = 0.2% of the half width); the
    /// difference of the two extrapolations is the reported error bound.
    /// The energy tolerance is <see cref="ResonanceSearchOptions.AbsoluteToleranceElectronVolts"/>; each
    /// result carries its own error bound. Peaks at the window ends are not reported. The window is raised
    /// to the higher lead band edge when it starts below it.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">A bound is not finite, or <paramref name="upperElectronVolts"/> is not above <paramref name="lowerElectronVolts"/>, or an option is out of range, or (under bias) a bound is absurdly far from the layer potentials (see <see cref="Evaluate"/>).</exception>
    /// <exception cref="OperationCanceledException"><paramref name="cancellationToken"/> was cancelled (checked between transmission
    /// evaluations; under bias each costs O(elements)); nothing is returned.</exception>
    public ResonanceSpectrum FindResonances(double lowerElectronVolts, double upperElectronVolts, ResonanceSearchOptions? options = null,
        CancellationToken cancellationToken = default)
    {
        Preconditions.CheckFinite(lowerElectronVolts);
        Preconditions.CheckFinite(upperElectronVolts);
        if (!(upperElectronVolts > lowerElectronVolts))
        {
            throw new ArgumentOutOfRangeException(nameof(upperElectronVolts), upperElectronVolts,
                $"upperElectronVolts must exceed lowerElectronVolts ({Preconditions.Format(lowerElectronVolts)} eV); got {Preconditions.Format(upperElectronVolts)}.");
        }
        options ??= ResonanceSearchOptions.Default;
        // The cost of a biased layer grows with |E − V|, largest at an end of the window.
        CheckBiasedCost(lowerElectronVolts, nameof(lowerElectronVolts), nameof(lowerElectronVolts));
        CheckBiasedCost(upperElectronVolts, nameof(upperElectronVolts), nameof(upperElectronVolts));
        return ResonanceFinder.Find(this, lowerElectronVolts, upperElectronVolts, options, cancellationToken);
    }

    /// <summary>
    /// The Tsu–Esaki current density through the stack at its <see cref="Bias"/>, for a left lead with Fermi level
    /// <paramref name="fermiLevel"/> (the right lead's is μ − eU) at <paramref name="temperature"/>:
    /// J = (e m_L k_BT/(2π²ħ³)) ∫ T(E) ln[(1 + e^((μ−E)/k_BT))/(1 + e^((μ−eU−E)/k_BT))] dE
    /// (R. Tsu and L. Esaki, Appl. Phys. Lett. 22, 562 (1973)), m_L the left lead's mass.
    /// </summary>
    /// <remarks>
    /// <para>Method: globally adaptive Gauss–Kronrod (7/15) quadrature (R. Piessens et al., QUADPACK, Springer 1983) from
    /// the higher lead band edge upwards, split at both Fermi levels and at every transmission peak
    /// (<see cref="FindResonances"/>) and its points ±Γ, ±4Γ, ±16Γ, so sharp resonances are resolved; the interval with
    /// the largest |Kronrod − Gauss| is halved until the sum of these estimates falls below
    /// <see cref="CurrentDensityOptions.RelativeTolerance"/>·|J|. The upper limit rises in steps of 40 k_BT until the
    /// bound k_BT·e^((μ_max − E_max)/k_BT) on the rest (T ≤ 1) is negligible; that bound is part of the reported error.</para>
    /// <para>Model: the transverse motion is free with the left lead's mass in every layer (the energy separates), the
    /// contacts are in equilibrium at their Fermi levels, transport is coherent, and the field is uniform with no
    /// charge in the stack (see <see cref="Create(LayerStack, Energy)"/>). Use the result to compare designs and read
    /// trends; check it against measured I–V curves.</para>
    /// <para>Zero bias gives J = 0 exactly (the supply function vanishes).</para>
    /// </remarks>
    /// <param name="fermiLevel">Fermi level μ of the left lead, on the same scale as the energies.</param>
    /// <param name="temperature">Temperature of both leads; from <see cref="MinCurrentTemperatureKelvin"/> to <see cref="MaxCurrentTemperatureKelvin"/>.</param>
    /// <param name="options">Tolerances and budget (null: <see cref="CurrentDensityOptions.Default"/>).</param>
    /// <param name="cancellationToken">Cancels the integral between quadrature rules.</param>
    /// <exception cref="ArgumentOutOfRangeException">The Fermi level is not finite or puts the higher Fermi level more than
    /// <see cref="MaxFermiLevelAboveEdgeElectronVolts"/> above the higher lead edge, the temperature is outside
    /// [<see cref="MinCurrentTemperatureKelvin"/>, <see cref="MaxCurrentTemperatureKelvin"/>], or an option is out of range; or
    /// the integral would reach energies too far from the layer potentials for the biased propagation (see <see cref="Evaluate"/>).</exception>
    /// <exception cref="OperationCanceledException"><paramref name="cancellationToken"/> was cancelled (checked between quadrature
    /// rules and the peak search's evaluations); nothing is returned.</exception>
    public CurrentDensityResult CurrentDensity(Energy fermiLevel, Temperature temperature, CurrentDensityOptions? options = null,
        CancellationToken cancellationToken = default)
    {
        var fermiLevelElectronVolts = fermiLevel.ElectronVolts;
        var temperatureKelvin = Preconditions.CheckRange(temperature.Kelvin, MinCurrentTemperatureKelvin, MaxCurrentTemperatureKelvin, nameof(temperature));
        options ??= CurrentDensityOptions.Default;
        var edge = Math.Max(Stack.LeftLead.PotentialElectronVolts, RightLead.PotentialElectronVolts);
        var highestFermiLevel = Math.Max(fermiLevelElectronVolts, fermiLevelElectronVolts - Bias.ElectronVolts);
        if (highestFermiLevel - edge > MaxFermiLevelAboveEdgeElectronVolts)
        {
            throw new ArgumentOutOfRangeException(nameof(fermiLevel), fermiLevelElectronVolts,
                string.Create(CultureInfo.InvariantCulture,
                    $"fermiLevel = {Preconditions.Format(fermiLevelElectronVolts)} eV puts the higher Fermi level (μ or μ − eU = {Preconditions.Format(highestFermiLevel)} eV) more than {MaxFermiLevelAboveEdgeElectronVolts} eV above the higher lead band edge ({Preconditions.Format(edge)} eV); the energy window of the integral, and its cost, grow with that distance."));
        }
        // The integral reaches at most 700 k_BT above the higher Fermi level (and starts at the higher lead edge).
        var kT = PhysicalConstants.BoltzmannElectronVoltsPerKelvin * temperatureKelvin;
        CheckBiasedCost(Math.Max(edge, highestFermiLevel) + 740 * kT, "the top of the energy integral (the higher Fermi level or lead edge + 740 kT)", nameof(fermiLevel));
        return TsuEsakiIntegrator.Compute(this, fermiLevelElectronVolts, temperatureKelvin, options, cancellationToken);
    }

    /// <summary>Lowest temperature <see cref="CurrentDensity"/> accepts, K: below it k_BT approaches the resolution of the energies.</summary>
    public const double MinCurrentTemperatureKelvin = 0.1;

    /// <summary>Highest temperature <see cref="CurrentDensity"/> accepts, K: the integral's window grows like 40 k_BT, and no
    /// heterostructure survives far above it.</summary>
    public const double MaxCurrentTemperatureKelvin = 1000;

    /// <summary>How far the higher Fermi level may lie above the higher lead band edge in <see cref="CurrentDensity"/>, eV.</summary>
    public const double MaxFermiLevelAboveEdgeElectronVolts = 20;

    internal void CheckEnergy(double energyElectronVolts, string name, string? paramName = null)
    {
        // ParamName is the real parameter; the message may name the element of a span.
        paramName ??= name;
        if (!double.IsFinite(energyElectronVolts))
        {
            throw new ArgumentOutOfRangeException(paramName, energyElectronVolts,
                $"{name} must be a finite energy in eV; got {Preconditions.Format(energyElectronVolts)}.");
        }
        if (energyElectronVolts <= LowestValidEnergyElectronVolts)
        {
            throw new ArgumentOutOfRangeException(paramName, energyElectronVolts,
                $"{name} must exceed {Preconditions.Format(LowestValidEnergyElectronVolts)} eV, below which a non-parabolic mass m(E) = m(1 + a(E - V)) would not be positive; got {Preconditions.Format(energyElectronVolts)}.");
        }
        CheckBiasedCost(energyElectronVolts, name, paramName);
    }

    /// <summary>
    /// Under bias, the cost of a layer grows as k_max·w (sublayers of the exact series): an energy absurdly far from
    /// the potentials (|E − V| ≳ C(10⁶/w)²/m, ~1e7 eV for 100 nm) is rejected instead of taking hours.
    /// </summary>
    private void CheckBiasedCost(double energyElectronVolts, string name, string paramName)
    {
        if (energyElectronVolts >= _affordableEnergies.Lower && energyElectronVolts <= _affordableEnergies.Upper)
        {
            return; // every layer is within its sublayer budget (see AffordableEnergies): no per-layer check per energy
        }
        for (var i = 0; i < (_biased?.Count ?? 0); i++)
        {
            if (!_biased!.LinearLayerData(i, out var width, out var potentialAtLeft, out var slope, out var mass))
            {
                continue;
            }
            var count = LinearLayerPropagator.SublayerCount(energyElectronVolts, potentialAtLeft, slope, width, mass);
            if (count > LinearLayerPropagator.MaxSublayers)
            {
                throw new ArgumentOutOfRangeException(paramName, energyElectronVolts,
                    string.Create(CultureInfo.InvariantCulture,
                        $"{name} = {Preconditions.Format(energyElectronVolts)} eV is too far from the potential of element {i} of the biased stack: its exact propagation would need {count} sublayers (k_max times width), at most {LinearLayerPropagator.MaxSublayers} are allowed."));
            }
        }
    }

    /// <summary>
    /// The energies at which no layer of the biased stack exceeds <see cref="LinearLayerPropagator.MaxSublayers"/>: a layer
    /// from V₀ to V₁ needs ⌈max(√(m/C·|V − E|), ∛(m/C·|slope|))·w⌉ sublayers (<see cref="LinearLayerPropagator.SublayerCount"/>),
    /// within budget while |V − E| ≤ (N/w)²·C/m at both ends. Shrunk by 1e-6 relative so that rounding at the border cannot
    /// admit an energy the exact count would refuse; energies outside take the exact per-layer check. Empty when the slope
    /// term alone exceeds the budget.
    /// </summary>
    private static (double Lower, double Upper) AffordableEnergies(CompiledCell elements)
    {
        double lower = double.NegativeInfinity, upper = double.PositiveInfinity;
        const double budget = LinearLayerPropagator.MaxSublayers * (1 - 1e-6);
        for (var i = 0; i < elements.Count; i++)
        {
            if (!elements.LinearLayerData(i, out var width, out var v0, out var slope, out var mass) || width <= 0)
            {
                continue;
            }
            var scale = mass / C;
            if (Math.Cbrt(Math.Abs(scale * slope)) * width > budget)
            {
                return (double.PositiveInfinity, double.NegativeInfinity);
            }
            var reach = budget / width;
            var allowed = reach * reach / scale;
            var v1 = v0 + slope * width;
            lower = Math.Max(lower, Math.Max(v0, v1) - allowed);
            upper = Math.Min(upper, Math.Min(v0, v1) + allowed);
        }
        return (lower, upper);
    }

    private void CheckEnergies(ReadOnlySpan<double> energies)
    {
        for (var i = 0; i < energies.Length; i++)
        {
            var e = energies[i];
            if (!double.IsFinite(e) || e <= LowestValidEnergyElectronVolts || _biased is not null)
            {
                CheckEnergy(e, string.Create(CultureInfo.InvariantCulture, $"energiesElectronVolts[{i}]"), "energiesElectronVolts");
            }
        }
    }

    /// <summary>
    /// The reference impedance: geometric mean of |k|/m over the materials present (each taken at least
    /// 1e-3 of the largest, so a layer at its own band edge does not drag the mean away from the rest),
    /// so that every element converts well-conditioned.
    /// </summary>
    private double ReferenceImpedance(double e)
    {
        double max = 0;
        for (var i = 0; i < _potentials.Length; i++)
        {
            max = Math.Max(max, Impedance(e, _potentials[i], _masses[i], _slopes[i]));
        }
        max = Math.Max(max, Impedance(e, Stack.LeftLead.PotentialElectronVolts, Stack.LeftLead.MassElectronMasses, 0));
        max = Math.Max(max, Impedance(e, RightLead.PotentialElectronVolts, RightLead.MassElectronMasses, 0));
        if (!(max > 0) || !double.IsFinite(max))
        {
            return 1.0;
        }
        var floor = 1e-3 * max;
        double sumLog = Math.Log(Math.Max(floor, Impedance(e, Stack.LeftLead.PotentialElectronVolts, Stack.LeftLead.MassElectronMasses, 0)))
            + Math.Log(Math.Max(floor, Impedance(e, RightLead.PotentialElectronVolts, RightLead.MassElectronMasses, 0)));
        for (var i = 0; i < _potentials.Length; i++)
        {
            sumLog += Math.Log(Math.Max(floor, Impedance(e, _potentials[i], _masses[i], _slopes[i])));
        }
        return Math.Exp(sumLog / (_potentials.Length + 2));
    }

    private static double Impedance(double e, double potential, double mass, double slope)
    {
        var excess = e - potential;
        var m = mass + slope * excess;
        return Math.Sqrt(Math.Abs(m * excess / C)) / m;
    }

    /// <summary>The scattering matrix of everything between the leads, in the reference basis q.</summary>
    internal ScatteringMatrix Interior(double e, double q)
    {
        var total = ScatteringMatrix.Identity;
        for (var i = 0; i < (_biased?.Count ?? 0); i++)
        {
            total = ScatteringMatrix.Compose(total, ElementScattering(_biased!, i, e, q));
        }
        foreach (var part in _parts)
        {
            var s = ScatteringMatrix.Identity;
            for (var i = 0; i < part.Elements.Count; i++)
            {
                s = ScatteringMatrix.Compose(s, ElementScattering(part.Elements, i, e, q));
            }
            if (part.Repetitions > 1)
            {
                s = ScatteringMatrix.Power(s, part.Repetitions);
            }
            total = ScatteringMatrix.Compose(total, s);
        }
        return total;
    }

    internal TransmissionResult EvaluateCore(double e)
    {
        var left = Stack.LeftLead;
        var right = RightLead;
        var kLeft = left.WavenumberPerNanometre(e);
        if (kLeft == 0)
        {
            return new TransmissionResult(e, LeadChannels.LeftLeadClosed, double.NegativeInfinity, Complex.One, Complex.Zero, 0);
        }
        var q = ReferenceImpedance(e);
        var qLeft = kLeft / left.MassElectronMasses;
        var s = ScatteringMatrix.Compose(ScatteringMatrix.Interface(qLeft, q), Interior(e, q));
        var kRight = right.WavenumberPerNanometre(e);
        if (kRight == 0)
        {
            // Evanescent right lead: the load reflects b/a of the decaying state (1, −κ/m) in the q basis.
            var beta = right.DecayConstantPerNanometre(e) / (right.MassElectronMasses * q);
            var load = new Complex(1, -beta) / new Complex(1, beta);
            var den = Complex.One - s.Rp * load;
            var r = den == Complex.Zero ? s.R : s.R + s.T * s.Tp * Math.Exp(2 * s.LogScale) * load / den;
            return new TransmissionResult(e, LeadChannels.RightLeadClosed, double.NegativeInfinity, r, Complex.Zero, 0);
        }
        var qRight = kRight / right.MassElectronMasses;
        s = ScatteringMatrix.Compose(s, ScatteringMatrix.Interface(q, qRight));
        var logT = Math.Log(qRight / qLeft) + 2 * (Math.Log(s.T.Magnitude) + s.LogScale);
        return new TransmissionResult(e, LeadChannels.Open, logT, s.R, s.T, s.LogScale);
    }

    /// <summary>The scattering matrix of element <paramref name="i"/> of a compiled sequence, in the reference basis q.</summary>
    private static ScatteringMatrix ElementScattering(CompiledCell elements, int i, double e, double q)
    {
        elements.ElementMatrix(i, e, out var m11, out var m12, out var m21, out var m22, out var logScale);
        return ScatteringMatrix.FromTransfer(m11, m12, m21, m22, logScale, q);
    }

    private readonly record struct CompiledPart(CompiledCell Elements, int Repetitions, CellTransfer? Cell);

    /// <summary>A repeated cell of a biased stack and, per copy, the energy shift field·x of the copy's middle.</summary>
    private readonly record struct PhaseGuide(CellTransfer Cell, double[] Shifts);

    /// <summary>
    /// Σ over repeated parts of N·θ(E), θ the Bloch phase kd of the part's cell unfolded into the extended
    /// zone (band n: θ from (n − 1)π to nπ; constant in gaps), from the core's band-edge count. It rises by
    /// π between consecutive zeros of sin(N kd), i.e. between the transmission peaks a repeated cell makes.
    /// </summary>
    /// <remarks>
    /// Under bias the cells are no longer periodic; the guide is then the local version, Σ over the copies of each repeated
    /// cell of θ(E + field·x), x the copy's middle: the count of local miniband states below E, which rises by about π per
    /// resonance while the field changes the potential little across one period (a semiclassical count, used only to add
    /// samples, never to remove them).
    /// </remarks>
    internal double UnfoldedBlochPhase(double e)
    {
        double total = 0;
        foreach (var part in _parts)
        {
            if (part.Cell is not null)
            {
                total += part.Repetitions * UnfoldedPhase(part.Cell, e);
            }
        }
        foreach (var guide in _guides)
        {
            foreach (var shift in guide.Shifts)
            {
                total += UnfoldedPhase(guide.Cell, e + shift);
            }
        }
        return total;
    }

    private static double UnfoldedPhase(CellTransfer cell, double e)
    {
        if (!(e > cell.LowestValidEnergyElectronVolts))
        {
            return 0;
        }
        var edges = cell.CountBandEdgesBelow(e);
        if ((edges & 1) == 0)
        {
            return edges / 2 * Math.PI; // in the gap above band edges/2
        }
        var band = (edges + 1) / 2;
        var kd = cell.Dispersion(e).Wavevector.PhasePerPeriod; // in [0, π]
        var within = (band & 1) == 1 ? kd : Math.PI - kd;
        return (band - 1) * Math.PI + within;
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"StackTransmission of {Stack.ElementCount} element(s), {Stack.Thickness.Nanometres:G6} nm, bias {Bias.ElectronVolts:G6} eV, S-matrix composition");
}
