// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;
using System.Runtime.CompilerServices;

namespace Periodic;

/// <summary>
/// Argument checks shared by every public entry point. Messages name the parameter, the bad value
/// and the allowed range, formatted culture-invariantly so they read the same on every machine.
/// </summary>
internal static class Preconditions
{
    internal static string Format(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    internal static double CheckFinite(double value, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (!double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                $"{paramName} must be a finite number; got {Format(value)}.");
        }
        return value;
    }

    internal static double CheckPositiveFinite(double value, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                $"{paramName} must be positive and finite; got {Format(value)}.");
        }
        return value;
    }

    internal static double CheckNonNegativeFinite(double value, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (!double.IsFinite(value) || value < 0)
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                $"{paramName} must be zero or positive and finite; got {Format(value)}.");
        }
        return value;
    }

    internal static int CheckPositive(int value, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (value <= 0)
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                string.Create(CultureInfo.InvariantCulture, $"{paramName} must be at least 1; got {value}."));
        }
        return value;
    }

    internal static int CheckRange(int value, int minimum, int maximum, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (value < minimum || value > maximum)
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                string.Create(CultureInfo.InvariantCulture, $"{paramName} must be between {minimum} and {maximum}; got {value}."));
        }
        return value;
    }

    internal static double CheckRange(double value, double minimum, double maximum, [CallerArgumentExpression(nameof(value))] string? paramName = null)
    {
        if (!(value >= minimum && value <= maximum))
        {
            throw new ArgumentOutOfRangeException(paramName, value,
                $"{paramName} must be between {Format(minimum)} and {Format(maximum)}; got {Format(value)}.");
        }
        return value;
    }

    internal static void CheckDestination(int sourceLength, int destinationLength, string sourceName, string destinationName)
    {
        if (destinationLength < sourceLength)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"{destinationName} has length {destinationLength} but must hold at least {sourceLength} elements (the length of {sourceName})."),
                destinationName);
        }
    }

    internal static T CheckNotNull<T>(T? value, [CallerArgumentExpression(nameof(value))] string? paramName = null)
        where T : class
    {
        ArgumentNullException.ThrowIfNull(value, paramName);
        return value;
    }
}
