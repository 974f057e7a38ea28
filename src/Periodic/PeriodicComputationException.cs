// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic;

/// <summary>
/// A computation on valid input could not reach a trustworthy result: an iteration budget ran out, a quantity left
/// the double range, or rounding would swamp the answer. The message says what failed, where, and the limit that was
/// reached. Bad input is never reported this way: it throws <see cref="ArgumentException"/> (naming the parameter,
/// the value and what is allowed) before any work is done.
/// </summary>
/// <remarks>
/// Catch this type to handle every numerical failure of the library at once; the sealed derived types say what
/// kind of failure it was (<see cref="Bands.BandSearchException"/>: a band search could not finish or verify itself;
/// <see cref="PrecisionLimitException"/>: double precision cannot hold or resolve the result). The <c>periodic</c>
/// tool reports it with exit code 1, and an <see cref="ArgumentException"/> with exit code 2.
/// </remarks>
public abstract class PeriodicComputationException : Exception
{
    /// <summary>Creates the exception.</summary>
    private protected PeriodicComputationException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with an inner cause.</summary>
    private protected PeriodicComputationException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    /// <summary>Creates the exception with no message.</summary>
    private protected PeriodicComputationException()
    {
    }
}
