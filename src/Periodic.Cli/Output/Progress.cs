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
    // PERIODIC_PROGRESS_DELAY_MS overrides the one-second delay; the tests use it to see the line on short runs.
    private static readonly TimeSpan ShowAfter = TimeSpan.FromMilliseconds(
        int.TryParse(Environment.GetEnvironmentVariable("PERIODIC_PROGRESS_DELAY_MS"), NumberStyles.None, CultureInfo.InvariantCulture, out var ms) ? ms : 1000);
    private static readonly TimeSpan Interval = TimeSpan.FromMilliseconds(200);
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly string _label;
    private readonly int _total;
    private readonly bool _enabled;
    private TimeSpan _lastShown = TimeSpan.Zero;
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
        if (elapsed < ShowAfter || (_shown && elapsed - _lastShown < Interval))
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
