// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Serialization;

namespace Periodic.Cli;

/// <summary>
/// The structure the tool shows when run without arguments. Demo data in a scenario of our own:
/// the absorber of a hypothetical mid-infrared detector, 6 nm wells and 3 nm barriers with
/// GaAs/AlGaAs-like parameters. Illustrative only; not a checked material description.
/// </summary>
internal static class BuiltInExample
{
    public const string SourceName = "(built-in example)";

    public const string Json = """
        {
          "name": "demo absorber superlattice, 6 nm wells / 3 nm barriers",
          "description": "Illustrative GaAs/AlGaAs-like parameters for a hypothetical detector absorber; demo data, not a material model.",
          "cell": [
            { "label": "well",    "width": "6 nm", "potential": "0 eV",   "mass": 0.067 },
            { "label": "barrier", "width": "3 nm", "potential": "230 meV", "mass": 0.092 }
          ]
        }
        """;

    public static StructureDefinition Load() => StructureFile.Parse(Json, SourceName);
}
