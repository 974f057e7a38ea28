// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Buffers;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;

namespace Periodic.Cli.Output;

/// <summary>
/// Streams RFC 4180 CSV as UTF-8 into a stream through one pooled buffer, so memory does not grow with the
/// number of rows. Doubles are written in the shortest form that round-trips (<c>double.TryFormat</c>, the
/// default format, i.e. "R": the same digits as the JSON output); a value that is not finite (an infinite width, log10 of T = 0) is
/// an empty cell.
/// </summary>
// Hot methods are compiled optimised at once (AggressiveOptimization): the tool is a short-lived process that formats
// millions of numbers before tiered compilation would promote them.
internal sealed class CsvWriter : IDisposable
{
    private const int Capacity = 1 << 16;
    private const int Reserve = 64; // the longest double is 24 bytes; text cells are flushed through separately
    private readonly Stream _stream;
    private byte[] _buffer = ArrayPool<byte>.Shared.Rent(Capacity);
    private int _used;
    private bool _rowStarted;

    public CsvWriter(Stream stream) => _stream = stream;

    /// <summary>A header row: each cell a name with its unit, e.g. <c>energy (eV)</c>.</summary>
    public void Header(IEnumerable<string> names)
    {
        foreach (var name in names)
        {
            Text(name);
        }
        EndRow();
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Number(double value)
    {
        Separator();
        if (double.IsFinite(value))
        {
            Ensure();
            // The default format of double is the shortest string that round-trips (the same as "R", without parsing a format string).
            value.TryFormat(_buffer.AsSpan(_used), out var written, default, CultureInfo.InvariantCulture);
            _used += written;
        }
    }

    public void Integer(long value)
    {
        Separator();
        Ensure();
        value.TryFormat(_buffer.AsSpan(_used), out var written, default, CultureInfo.InvariantCulture);
        _used += written;
    }

    public void Text(string value)
    {
        Separator();
        var quoted = value.AsSpan().IndexOfAny(",\"\n\r") >= 0 ? "\"" + value.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : value;
        var bytes = Encoding.UTF8.GetByteCount(quoted);
        if (_used + bytes + Reserve > _buffer.Length)
        {
            Flush();
        }
        if (bytes + Reserve > _buffer.Length)
        {
            _stream.Write(Encoding.UTF8.GetBytes(quoted));
            return;
        }
        _used += Encoding.UTF8.GetBytes(quoted, _buffer.AsSpan(_used));
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void EndRow()
    {
        Ensure();
        _buffer[_used++] = (byte)'\n';
        _rowStarted = false;
    }

    public void Flush()
    {
        _stream.Write(_buffer, 0, _used);
        _used = 0;
    }

    public void Dispose()
    {
        if (_buffer.Length > 0)
        {
            Flush();
            ArrayPool<byte>.Shared.Return(_buffer);
            _buffer = [];
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Separator()
    {
        if (_rowStarted)
        {
            Ensure();
            _buffer[_used++] = (byte)',';
        }
        _rowStarted = true;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Ensure()
    {
        if (_used + Reserve > _buffer.Length)
        {
            Flush();
        }
    }
}
