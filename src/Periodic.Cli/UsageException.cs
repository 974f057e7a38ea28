// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli;

/// <summary>Bad input or usage found by the tool itself (exit code 2).</summary>
internal sealed class UsageException(string message) : Exception(message);
