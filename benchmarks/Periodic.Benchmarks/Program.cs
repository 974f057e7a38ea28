// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Running;

if (args.Length > 0 && args[0] == "--calibrate")
{
    Periodic.Benchmarks.Calibration.Run();
    return;
}
if (args.Length > 0 && args[0] == "--calibrate-optics")
{
    Periodic.Benchmarks.Optics.IntersubbandBenchmarks.Calibrate();
    return;
}
BenchmarkSwitcher.FromAssembly(typeof(Periodic.Benchmarks.Scenarios).Assembly).Run(args);
