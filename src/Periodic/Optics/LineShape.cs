// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Optics;

/// <summary>The broadening of each absorption line; both are normalised to unit area and set by their full width at half maximum.</summary>
public enum LineShape
{
    /// <summary>Lorentzian (homogeneous broadening): (Γ/2π)/((E − E₀)² + Γ²/4).</summary>
    Lorentzian,

    /// <summary>Gaussian (inhomogeneous broadening, e.g. well-width fluctuations): σ = Γ/(2√(2 ln 2)).</summary>
    Gaussian,
}
