// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Diagnostics;
using System.Globalization;

namespace Periodic.Cli.Output;

/// <summary>
/// A progress line on stderr for long runs: shown only when stderr is a terminal and only once the
/// run has taken more than a second, so pipelines and quick runs see nothing.
/// </summary>
internal sealed class Progress : IDisposable
{
    private static readonly TimeSpan ShowAfter = TimeSpan.FromSeconds(1);
    private static readonly TimeSpan Interval = TimeSpan.FromMilliseconds(200);
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly string _label;
    private readonly int _total;
    private readonly bool _enabled;
    private TimeSpan _lastShown = TimeSpan.MinValue;
    private bool _shown;

    public Progress(string label, int total)
    {
        _label = label;
        _total = total;
        _enabled = !Console.IsErrorRedirected;
    }

    public void Report(int done)
    {
        if (!_enabled)
        {
            return;
        }
        var elapsed = _clock.Elapsed;
        if (elapsed < ShowAfter || elapsed - _lastShown < Interval)
        {
            return;
        }
        _lastShown = elapsed;
        _shown = true;
        Console.Error.Write(string.Create(CultureInfo.InvariantCulture, $"\r{_label}: {done}/{_total} ({100.0 * done / Math.Max(1, _total):F0} %)   "));
    }

    public void Dispose()
    {
        if (_shown)
        {
            Console.Error.Write("\r" + new string(' ', _label.Length + 30) + "\r");
        }
    }
}
