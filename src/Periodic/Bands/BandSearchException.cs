// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Bands;

/// <summary>
/// A band search could not complete (an iteration budget ran out, or the oscillation count and the
/// edges found disagree). The message says which edge, the bracket and the iteration count. A numerical failure,
/// like every <see cref="PeriodicComputationException"/>.
/// </summary>
public sealed class BandSearchException : PeriodicComputationException
{
    /// <summary>Creates the exception.</summary>
    public BandSearchException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with an inner cause.</summary>
    public BandSearchException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    /// <summary>Creates the exception with no message.</summary>
    public BandSearchException()
    {
    }
}
