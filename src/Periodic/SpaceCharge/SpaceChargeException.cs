// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.SpaceCharge;

/// <summary>
/// The self-consistent iteration could not reach a trustworthy answer: it did not converge within its budget, diverged,
/// or needs more bands or a Fermi level than the model is bounded to. No unconverged potential is ever returned.
/// </summary>
public sealed class SpaceChargeException : PeriodicComputationException
{
    /// <summary>Creates the exception.</summary>
    public SpaceChargeException()
    {
    }

    /// <summary>Creates the exception with a message.</summary>
    public SpaceChargeException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with a message and an inner cause.</summary>
    public SpaceChargeException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    internal SpaceChargeException(int iterations, double residual, string reason)
        : base(string.Create(CultureInfo.InvariantCulture,
            $"self-consistent space charge failed: {reason} (after {iterations} iteration(s), last change of the Hartree potential {residual:G3} eV)."))
    {
        Iterations = iterations;
        ResidualElectronVolts = residual;
    }

    /// <summary>Outer iterations done when the solver gave up (0 when it failed inside the first).</summary>
    public int Iterations { get; }

    /// <summary>The last change of the Hartree potential, eV (NaN when none was measured).</summary>
    public double ResidualElectronVolts { get; } = double.NaN;
}
