// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Text;
namespace Periodic.Native;

/// <summary>The status codes of include/periodic.h (values fixed for ever).</summary>
internal static class Status
{
    public const int Ok = 0;
    public const int NullPointer = 1;
    public const int InvalidArgument = 2;
    public const int BufferTooSmall = 3;
    public const int InvalidHandle = 4;
    public const int Numerical = 5;
    public const int Internal = 6;

    /// <summary>The message of the last failed call on this thread: the only state kept between calls.</summary>
    [ThreadStatic]
    private static string? s_lastError;

    public static string LastError => s_lastError ?? "";

    public static int Fail(int status, string message)
    {
        // One line, as C callers print it: .NET's "(Parameter 'x')" and "Actual value was" suffixes join the line.
        s_lastError = string.Join(' ', message.Split(['\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
        return status;
    }

    /// <summary>Turns any exception into its status code and message; nothing is rethrown.</summary>
    public static int FromException(Exception exception) => exception switch
    {
        BufferTooSmallException e => Fail(BufferTooSmall, e.Message),
        HandleException e => Fail(e.IsNull ? NullPointer : InvalidHandle, e.Message),
        ArgumentException e => Fail(InvalidArgument, e.Message),
        PeriodicComputationException e => Fail(Numerical, e.Message),
        ArithmeticException e => Fail(Numerical, e.Message),
        _ => Fail(Internal, $"{exception.GetType().Name}: {exception.Message}"),
    };

    public static unsafe void RequireNotNull(void* pointer, string name)
    {
        if (pointer == null)
        {
            throw new HandleException(true, $"{name} must not be NULL.");
        }
    }

    public static void RequireCapacity(nuint capacity, long needed, string name)
    {
        if (capacity < (ulong)needed)
        {
            throw new BufferTooSmallException($"{name} holds {capacity} elements; {needed} are needed.");
        }
    }

    /// <summary>Writes a NUL-terminated UTF-8 string into a caller's buffer (query-size-then-fill).</summary>
    public static unsafe int WriteString(string text, byte* buffer, nuint capacity, nuint* required)
    {
        var bytes = Encoding.UTF8.GetBytes(text);
        var needed = (nuint)bytes.Length + 1;
        if (required != null)
        {
            *required = needed;
        }
        if (buffer == null || capacity < needed)
        {
            return BufferTooSmall;
        }
        bytes.CopyTo(new Span<byte>(buffer, bytes.Length));
        buffer[bytes.Length] = 0;
        return Ok;
    }
}

/// <summary>A caller's buffer is shorter than the result.</summary>
internal sealed class BufferTooSmallException(string message) : Exception(message);

/// <summary>A handle argument is NULL or of the wrong kind.</summary>
internal sealed class HandleException(bool isNull, string message) : Exception(message)
{
    public bool IsNull { get; } = isNull;
}
