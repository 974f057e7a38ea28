// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
// A file-based script that restores Periodic as a user's script would, and prints the version it loaded.
// .ci/package-checks.sh pins the version below to the build just packed and runs it beside a nuget.config
// that points at nuget/packages.
#:package Periodic@1.0.0

using System.Reflection;
using Periodic.Bands;

Console.WriteLine(typeof(BandStructure).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "unknown");
