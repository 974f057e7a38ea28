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
/// Catch this type to handle every numerical failure of the library at once; derived types (for example
/// <see cref="Bands.BandSearchException"/>) say which algorithm failed. The <c>periodic</c> tool reports it with exit
/// code 1, and an <see cref="ArgumentException"/> with exit code 2.
/// </remarks>
public class PeriodicComputationException : Exception
{
    /// <summary>Creates the exception.</summary>
    public PeriodicComputationException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with an inner cause.</summary>
    public PeriodicComputationException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    /// <summary>Creates the exception with no message.</summary>
    public PeriodicComputationException()
    {
    }
}
