/* SPDX-License-Identifier: MIT
 * Copyright (c) 2026 Periodic contributors */

/*
 * periodic.h — the C ABI of Periodic (libperiodic.so, built by `dotnet publish src/Periodic.Native -r linux-x64`).
 *
 * Physics: single-band envelope-function (effective-mass) approximation with BenDaniel–Duke matching,
 * exactly as the .NET library. Strain, band mixing, many-body effects, scattering and space charge are not
 * modelled; published offsets and masses differ by 10 % or more. Treat results as a design guide and
 * confirm design-critical numbers by measurement.
 *
 * Conventions (every function):
 *  - Returns a periodic_status; PERIODIC_OK (0) is success. On any other code handles and scalar
 *    outputs are left unwritten, output arrays may be partly written, and periodic_last_error() gives a
 *    one-line message naming the argument, its value and what is allowed.
 *  - No exception or signal crosses the boundary; null pointers, short buffers and invalid values are
 *    reported as codes, never as crashes. (A pointer that is not null but points to freed or foreign
 *    memory cannot be detected, as in any C library.)
 *  - Units are in the names: _nm nanometres, _ev electron volts, _m0 free-electron masses,
 *    _per_nm 1/nm, _u unified atomic mass units; _recoil recoil energies of a lattice. Doubles are IEEE 754
 *    binary64; results are bit for bit those of the .NET API, and no function writes NaN.
 *  - Band indices and level numbers are 1-based (1 = lowest band or level), as in the .NET API.
 *
 * Ownership:
 *  - The caller allocates and frees every array and string buffer; the library only reads the inputs
 *    during the call and writes the outputs before it returns; it keeps no pointer to them.
 *  - Handles (periodic_cell, periodic_bands, periodic_stack, periodic_wannier) are owned by the caller from the moment a
 *    create or compute call returns PERIODIC_OK and must be released exactly once with the matching
 *    *_destroy. Destroying NULL is allowed and does nothing. A handle stays valid until destroyed even if
 *    the handle it was made from is destroyed first (bands keep their own reference to the cell).
 *  - Where a result's size varies (strings, bound levels, transitions, hopping) the call takes the buffer's capacity and
 *    writes the size needed to *required (or *count): call once with a NULL buffer and capacity 0 to ask,
 *    then again with a buffer that large. A buffer too small gives PERIODIC_ERROR_BUFFER_TOO_SMALL with
 *    the size still written.
 *
 * Threads: handles are immutable and may be used from any number of threads at once; the only state
 * the library keeps between calls apart from handles is each thread's last error message. Do not destroy
 * a handle while another thread still uses it.
 *
 * ABI versioning: periodic_abi_version() returns PERIODIC_ABI_VERSION of the library actually loaded.
 * Within one major ABI (this file's soname, libperiodic.so) functions are only ever added, each addition
 * increments the version, and no existing signature, meaning or status code changes. Check at start-up
 * that periodic_abi_version() >= PERIODIC_ABI_VERSION of the header you compiled against.
 */

#ifndef PERIODIC_H
#define PERIODIC_H

#include <stddef.h>
#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PERIODIC_ABI_VERSION 2

/** Status codes. Values are fixed for ever; new codes may be added. */
typedef enum periodic_status {
    PERIODIC_OK = 0,
    PERIODIC_ERROR_NULL_POINTER = 1,     /**< a required pointer argument is NULL */
    PERIODIC_ERROR_INVALID_ARGUMENT = 2, /**< a value is out of range (non-positive width, NaN, bad index…) */
    PERIODIC_ERROR_BUFFER_TOO_SMALL = 3, /**< capacity below what is needed; the size needed is written */
    PERIODIC_ERROR_INVALID_HANDLE = 4,   /**< a handle of another kind than the function expects */
    PERIODIC_ERROR_NUMERICAL = 5,        /**< the computation failed to reach its accuracy (a distinct failure) */
    PERIODIC_ERROR_INTERNAL = 6          /**< anything else, e.g. out of memory; the message says what */
} periodic_status;

typedef struct periodic_cell periodic_cell;   /**< a unit cell of uniform layers */
typedef struct periodic_bands periodic_bands; /**< the lowest N minibands of a cell */
typedef struct periodic_stack periodic_stack; /**< a finite stack: N periods of a cell between two leads */
typedef struct periodic_wannier periodic_wannier; /**< the Wannier function of one isolated band (ABI 2) */

/* ---- library ------------------------------------------------------------------------------------- */

/** The ABI version of the loaded library (never fails). */
int32_t periodic_abi_version(void);

/** The library's version (e.g. "1.0.0-alpha.0.231+<commit>") as a NUL-terminated UTF-8 string.
 *  *required receives the buffer size needed in bytes, including the NUL. */
int32_t periodic_version(char *buffer, size_t capacity, size_t *required);

/** The message of the most recent failed call on this thread (empty if none), NUL-terminated UTF-8.
 *  *required receives the buffer size needed in bytes, including the NUL. Never changes the message. */
int32_t periodic_last_error(char *buffer, size_t capacity, size_t *required);

/* ---- cells --------------------------------------------------------------------------------------- */

/** A unit cell of layer_count uniform layers in order: widths > 0 (nm), potentials finite (eV),
 *  masses > 0 (m0). Release with periodic_cell_destroy. */
int32_t periodic_cell_create(const double *widths_nm, const double *potentials_ev, const double *masses_m0,
                             size_t layer_count, periodic_cell **cell);

/** Releases a cell (NULL allowed). */
int32_t periodic_cell_destroy(periodic_cell *cell);

/** The period d of the cell in nm. */
int32_t periodic_cell_period(const periodic_cell *cell, double *period_nm);

/* ---- bands --------------------------------------------------------------------------------------- */

/** The lowest `count` minibands (1 to 10000) of a cell, each edge converged to the library's default
 *  tolerance (about 1e-14 relative). The library's solver chooses the method: exact transfer matrices for a
 *  cell of layers; for the smooth cell of an optical lattice (ABI 2) the method it prefers there, whose
 *  discretisation error the accuracy report includes. Release with periodic_bands_destroy. */
int32_t periodic_bands_compute(const periodic_cell *cell, int32_t count, periodic_bands **bands);

/** Releases a band structure (NULL allowed). */
int32_t periodic_bands_destroy(periodic_bands *bands);

/** The number of bands computed. */
int32_t periodic_bands_count(const periodic_bands *bands, int32_t *count);

/** Band edges in eV: bottom_ev[i] and top_ev[i] of band i+1. Both arrays hold at least `capacity`
 *  doubles, which must be at least the band count. */
int32_t periodic_bands_edges(const periodic_bands *bands, double *bottom_ev, double *top_ev, size_t capacity);

/** The accuracy of each edge: bound on the error of bottom and top of band i+1, in eV. */
int32_t periodic_bands_edge_errors(const periodic_bands *bands, double *bottom_error_ev, double *top_error_ev,
                                   size_t capacity);

/** Band-edge effective masses ħ²/(d²E/dk²) in m0 at the bottom and top of band i+1 (negative at a top). */
int32_t periodic_bands_masses(const periodic_bands *bands, double *bottom_mass_m0, double *top_mass_m0,
                              size_t capacity);

/** The accuracy report: the largest edge error bound (eV; root finding and, for smooth cells, discretisation)
 *  and how many oscillation-count checks confirmed that no band was missed. */
int32_t periodic_bands_accuracy(const periodic_bands *bands, double *max_edge_error_ev, int32_t *count_checks);

/** E(k) of band `band_index` (1-based) at `count` wavevectors k (1/nm, any real value; folded into the
 *  first Brillouin zone). */
int32_t periodic_bands_energies(const periodic_bands *bands, int32_t band_index, const double *k_per_nm,
                                double *energies_ev, size_t count);

/** Density of states per period length, 1/(eV nm), at `count` energies (eV) up to the top of the last
 *  band computed. */
int32_t periodic_bands_dos(const periodic_bands *bands, const double *energies_ev, double *dos_per_ev_nm,
                           size_t count);

/* ---- finite stacks ------------------------------------------------------------------------------- */

/** `periods` repetitions of a cell between a left and a right uniform lead (potential in eV, mass in m0).
 *  Release with periodic_stack_destroy. */
int32_t periodic_stack_create(const periodic_cell *cell, int32_t periods, double left_potential_ev,
                              double left_mass_m0, double right_potential_ev, double right_mass_m0,
                              periodic_stack **stack);

/** Releases a stack (NULL allowed). */
int32_t periodic_stack_destroy(periodic_stack *stack);

/** Transmission probability T(E) at `count` energies (eV), with a bias (eV, 0 for none) dropped linearly
 *  across the stack. T = 0 where a lead carries no propagating state (below its potential). */
int32_t periodic_stack_transmission(const periodic_stack *stack, double bias_ev, const double *energies_ev,
                                    double *transmission, size_t count);

/** Bound levels of the stack below the lower lead's potential, in increasing order, with each level's
 *  error bound (eV). *count receives the number of levels; energies_ev and errors_ev (either may be NULL
 *  when capacity is 0) receive them if capacity >= *count. The levels are computed once per stack. */
int32_t periodic_stack_bound_levels(const periodic_stack *stack, double *energies_ev, double *errors_ev,
                                    size_t capacity, size_t *count);

/* ---- ABI 2: optical lattices, intersubband transitions, Wannier functions and hopping --------------- */

/** A cell of an optical lattice: one standing wave of wavelength wavelength_nm (> 0; the period is half of it)
 *  and depth depth_recoil (> 0) in recoil energies E_R = h^2/(2 m wavelength^2) of an atom of mass mass_u (> 0,
 *  unified atomic mass units), V(x) = depth_recoil E_R sin^2(pi x / period). The .NET library's
 *  OpticalLattice.Create(...).Cell. Release with periodic_cell_destroy. */
int32_t periodic_cell_create_optical_lattice(double wavelength_nm, double depth_recoil, double mass_u, periodic_cell **cell);

/** Intersubband transitions of a stack at zero bias for light polarised along the growth axis, as the .NET
 *  library's IntersubbandSpectrum.Compute(stack) with its default options: every pair of bound levels,
 *  ordered by from, then to. Levels are numbered from 1 upwards, exactly as periodic_stack_bound_levels lists
 *  them. For transition i: from[i] < to[i]; energies_ev[i] = E_to - E_from (eV), of the levels refined to
 *  1e-16 eV for the optics (so within the bound-level error bounds of the differences of periodic_stack_bound_levels'
 *  energies, not bit for bit equal to them); dipoles_nm[i] the dipole
 *  <from|z|to> (nm, signed: the wavefunctions are real and positive in the left lead); oscillator_strengths[i]
 *  f = 2 m* w |z|^2 / hbar (length form, dimensionless) with m* from periodic_stack_transitions_accuracy;
 *  resolved[i] = 1, or 0 where the two levels are closer than double precision separates (wells behind very
 *  thick barriers): then dipoles_nm[i] and oscillator_strengths[i] are written as 0, not as numbers to use.
 *  Query-then-fill: *count receives the number of transitions (0 for one bound level); the six arrays (all NULL
 *  when capacity is 0) receive them if capacity >= *count. A stack without bound levels gives
 *  PERIODIC_ERROR_INVALID_ARGUMENT. Computed once per stack handle (the first call may take a while). */
int32_t periodic_stack_transitions(const periodic_stack *stack, int32_t *from, int32_t *to, double *energies_ev,
                                   double *dipoles_nm, double *oscillator_strengths, int32_t *resolved,
                                   size_t capacity, size_t *count);

/** The accuracy report of periodic_stack_transitions: the reference mass m* of the oscillator strengths
 *  (the band-edge mass of the stack's layer with the lowest potential, m0) and the largest |integral of psi^2 - 1|
 *  of the bound states on the quadrature grid (the accuracy the dipole integrals reached). */
int32_t periodic_stack_transitions_accuracy(const periodic_stack *stack, double *reference_mass_m0,
                                            double *normalisation_error);

/** The maximally localised Wannier function of band `band_index` (1 to 50) of a cell made of one Fourier
 *  segment (periodic_cell_create_optical_lattice), as the .NET library's WannierFunction.Compute. The band
 *  must be isolated (open gaps below and above it); otherwise, or for a cell of layers,
 *  PERIODIC_ERROR_INVALID_ARGUMENT. Release with periodic_wannier_destroy. */
int32_t periodic_wannier_compute(const periodic_cell *cell, int32_t band_index, periodic_wannier **wannier);

/** Releases a Wannier function (NULL allowed). */
int32_t periodic_wannier_destroy(periodic_wannier *wannier);

/** The Hubbard (tight-binding) hopping J_n to the n-th neighbour, n = 1, 2, 3, in eV:
 *  hopping_ev[n-1] = J_n, with E(k) = E_0 - 2 sum_n J_n cos(n k d) (J_1 > 0 for the lowest band).
 *  Query-then-fill: *count receives the number of amplitudes (3); hopping_ev (NULL when capacity is 0)
 *  receives them if capacity >= *count. */
int32_t periodic_wannier_hopping(const periodic_wannier *wannier, double *hopping_ev, size_t capacity, size_t *count);

/** The on-site integral of |w(x)|^4 over x (1/nm), from which the Hubbard U of a given geometry and scattering
 *  length follows, and the band's mean energy E_0 (its on-site energy, eV). */
int32_t periodic_wannier_on_site(const periodic_wannier *wannier, double *on_site_integral_per_nm, double *mean_energy_ev);

/** The accuracy report of a Wannier function: |integral of |w|^2 - 1| on its grid, the largest |w| half a
 *  supercell away relative to its peak (the size of the periodic images neglected; the library aims for 1e-13),
 *  and the number of wavevectors used. */
int32_t periodic_wannier_accuracy(const periodic_wannier *wannier, double *normalisation_error, double *tail_ratio,
                                  int32_t *k_points);

/* ---- later ABI versions add functions here, each raising PERIODIC_ABI_VERSION by one ---------------- */

#ifdef __cplusplus
}
#endif

#endif /* PERIODIC_H */
