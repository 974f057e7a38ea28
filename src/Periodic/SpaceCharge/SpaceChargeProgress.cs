// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Globalization;

namespace Periodic.SpaceCharge;

/// <summary>Progress of <see cref="SpaceChargeSolver.Solve"/>: reported after each outer iteration.</summary>
/// <param name="Iteration">Outer iterations done, from 1.</param>
/// <param name="ResidualElectronVolts">The largest change of the Hartree potential in this iteration, eV.</param>
/// <param name="FermiLevelElectronVolts">The neutral Fermi level of this iteration's states, eV.</param>
public readonly record struct SpaceChargeProgress(int Iteration, double ResidualElectronVolts, double FermiLevelElectronVolts)
{
    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"iteration {Iteration}: residual {ResidualElectronVolts:G3} eV, mu = {FermiLevelElectronVolts:G10} eV");
}
