// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic;

/// <summary>
/// Double precision cannot hold or resolve the result for this (valid) input: a quantity would leave the double range,
/// or the estimated rounding error would exceed the limit the method guarantees. The message gives the value reached
/// and the limit. A numerical failure, like every <see cref="PeriodicComputationException"/>; not bad input.
/// </summary>
public sealed class PrecisionLimitException : PeriodicComputationException
{
    /// <summary>Creates the exception.</summary>
    public PrecisionLimitException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with an inner cause.</summary>
    public PrecisionLimitException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    /// <summary>Creates the exception with no message.</summary>
    public PrecisionLimitException()
    {
    }
}
