// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using BenchmarkDotNet.Running;

BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
