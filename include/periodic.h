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
 *    _per_nm 1/nm. Doubles are IEEE 754 binary64; results are bit for bit those of the .NET API.
 *  - Band indices are 1-based (1 = lowest band), as in the .NET API.
 *
 * Ownership:
 *  - The caller allocates and frees every array and string buffer; the library only reads the inputs
 *    during the call and writes the outputs before it returns; it keeps no pointer to them.
 *  - Handles (periodic_cell, periodic_bands, periodic_stack) are owned by the caller from the moment a
 *    create or compute call returns PERIODIC_OK and must be released exactly once with the matching
 *    *_destroy. Destroying NULL is allowed and does nothing. A handle stays valid until destroyed even if
 *    the handle it was made from is destroyed first (bands keep their own reference to the cell).
 *  - Where a result's size varies (strings, bound levels) the call takes the buffer's capacity and
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

#define PERIODIC_ABI_VERSION 1

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
 *  tolerance (about 1e-14 relative). Release with periodic_bands_destroy. */
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

/** The accuracy report: the largest edge error bound (eV) and how many oscillation-count checks
 *  confirmed that no band was missed. */
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

/* ---- reserved for later ABI versions --------------------------------------------------------------
 * Optical transitions between levels and Hubbard/tight-binding hopping will be added here as functions
 * on periodic_bands and periodic_stack handles, each raising PERIODIC_ABI_VERSION by one, following the
 * same conventions. Nothing above changes when they arrive. */

#ifdef __cplusplus
}
#endif

#endif /* PERIODIC_H */
