/* SPDX-License-Identifier: MIT
 * Copyright (c) 2026 Periodic contributors */

/*
 * ABI tests of libperiodic: null pointers, short buffers, NaN, invalid layers and wrong handle kinds return
 * status codes with a message and never crash; the last error is per thread; results computed on several
 * threads at once equal the single-threaded ones bit for bit. Run by .ci/package-checks.sh:
 *   gcc -std=c11 -pthread -Iinclude tests/native/abi_test.c -Lartifacts/native -lperiodic -Wl,-rpath,'$ORIGIN' -o artifacts/native/abi_test
 * Prints one line per check and closes with "N passed, N failed"; exits 1 if any failed.
 */
#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <string.h>

#include "periodic.h"

static int passed, failed;

static void expect(int ok, const char *what)
{
    printf("%s %s\n", ok ? "ok  " : "FAIL", what);
    ok ? passed++ : failed++;
}

/* The status is the expected one and the thread's message contains `needle`. */
static void expect_error(int32_t status, int32_t expected, const char *needle, const char *what)
{
    char message[1024] = "";
    size_t required = 0;
    int32_t read = periodic_last_error(message, sizeof message, &required);
    int ok = status == expected && read == PERIODIC_OK && strstr(message, needle) != NULL && strchr(message, '\n') == NULL;
    if (!ok) {
        printf("     got status %d (expected %d), message \"%s\"\n", (int)status, (int)expected, message);
    }
    expect(ok, what);
}

static const double widths[] = {5.0, 2.0}, potentials[] = {0.0, 0.25}, masses[] = {0.067, 0.092};

enum { MAX_TRANSITIONS = 512 };

struct job {
    double bottom[4], top[4];
    int32_t status;
    char message[256];
    const periodic_stack *shared; /* a stack whose transitions no thread has asked for yet: they race to compute them */
    size_t transition_count;
    double dipoles[MAX_TRANSITIONS], strengths[MAX_TRANSITIONS], hopping[3], on_site, mean_energy;
};

static const double RB87_MASS_U = 86.9091805310; /* AME2020 (docs/references.md) */

static int32_t transitions_of(const periodic_stack *stack, size_t *count, double *dipoles, double *strengths)
{
    int32_t from[MAX_TRANSITIONS], to[MAX_TRANSITIONS], resolved[MAX_TRANSITIONS];
    double energies[MAX_TRANSITIONS];
    return periodic_stack_transitions(stack, from, to, energies, dipoles, strengths, resolved, MAX_TRANSITIONS, count);
}

static int32_t hopping_of(double *hopping, double *on_site, double *mean_energy)
{
    periodic_cell *lattice = NULL;
    periodic_wannier *wannier = NULL;
    size_t count = 0;
    int32_t status = periodic_cell_create_optical_lattice(1064.0, 12.0, RB87_MASS_U, &lattice);
    if (status == PERIODIC_OK) status = periodic_wannier_compute(lattice, 1, &wannier);
    if (status == PERIODIC_OK) status = periodic_wannier_hopping(wannier, hopping, 3, &count);
    if (status == PERIODIC_OK) status = periodic_wannier_on_site(wannier, on_site, mean_energy);
    periodic_wannier_destroy(wannier);
    periodic_cell_destroy(lattice);
    return status;
}

static void *compute(void *arg)
{
    struct job *job = arg;
    periodic_cell *cell = NULL;
    periodic_bands *bands = NULL;
    job->status = periodic_cell_create(widths, potentials, masses, 2, &cell);
    if (job->status == PERIODIC_OK) job->status = periodic_bands_compute(cell, 4, &bands);
    if (job->status == PERIODIC_OK) job->status = periodic_bands_edges(bands, job->bottom, job->top, 4);
    if (job->status == PERIODIC_OK) job->status = transitions_of(job->shared, &job->transition_count, job->dipoles, job->strengths);
    if (job->status == PERIODIC_OK) job->status = hopping_of(job->hopping, &job->on_site, &job->mean_energy);
    /* A failure on this thread must leave this thread's message, whatever the others do. */
    const double bad[] = {5.0, NAN};
    periodic_cell *unused = NULL;
    periodic_cell_create(bad, potentials, masses, 2, &unused);
    size_t required;
    periodic_last_error(job->message, sizeof job->message, &required);
    periodic_bands_destroy(bands);
    periodic_cell_destroy(cell);
    return NULL;
}

int main(void)
{
    expect(periodic_abi_version() == PERIODIC_ABI_VERSION, "periodic_abi_version equals the header's");

    periodic_cell *cell = NULL;
    expect_error(periodic_cell_create(NULL, potentials, masses, 2, &cell), PERIODIC_ERROR_NULL_POINTER, "widths_nm", "cell_create: NULL widths");
    expect_error(periodic_cell_create(widths, potentials, masses, 2, NULL), PERIODIC_ERROR_NULL_POINTER, "cell", "cell_create: NULL out-handle");
    expect_error(periodic_cell_create(widths, potentials, masses, 0, &cell), PERIODIC_ERROR_INVALID_ARGUMENT, "at least one layer", "cell_create: no layers");
    const double negative[] = {5.0, -2.0}, nan_potential[] = {0.0, NAN}, zero_mass[] = {0.067, 0.0};
    expect_error(periodic_cell_create(negative, potentials, masses, 2, &cell), PERIODIC_ERROR_INVALID_ARGUMENT, "-2", "cell_create: negative width named with its value");
    expect_error(periodic_cell_create(widths, nan_potential, masses, 2, &cell), PERIODIC_ERROR_INVALID_ARGUMENT, "NaN", "cell_create: NaN potential");
    expect_error(periodic_cell_create(widths, potentials, zero_mass, 2, &cell), PERIODIC_ERROR_INVALID_ARGUMENT, "mass", "cell_create: zero mass");
    expect(cell == NULL, "failed create leaves the out-handle unwritten");

    expect(periodic_cell_create(widths, potentials, masses, 2, &cell) == PERIODIC_OK && cell != NULL, "cell_create: valid cell");
    periodic_bands *bands = NULL;
    expect_error(periodic_bands_compute(NULL, 4, &bands), PERIODIC_ERROR_NULL_POINTER, "cell", "bands_compute: NULL cell");
    expect_error(periodic_bands_compute(cell, 0, &bands), PERIODIC_ERROR_INVALID_ARGUMENT, "count", "bands_compute: count 0");
    expect(periodic_bands_compute(cell, 4, &bands) == PERIODIC_OK, "bands_compute: 4 bands");
    expect_error(periodic_bands_compute((const periodic_cell *)bands, 4, &bands), PERIODIC_ERROR_INVALID_HANDLE, "periodic_cell", "bands_compute: a bands handle where a cell belongs");

    double bottom[4], top[4];
    expect_error(periodic_bands_edges(bands, bottom, top, 3), PERIODIC_ERROR_BUFFER_TOO_SMALL, "4", "bands_edges: capacity 3 for 4 bands");
    expect_error(periodic_bands_edges(bands, NULL, top, 4), PERIODIC_ERROR_NULL_POINTER, "bottom_ev", "bands_edges: NULL bottom_ev");
    expect(periodic_bands_edges(bands, bottom, top, 4) == PERIODIC_OK && bottom[0] > 0 && bottom[0] < top[0] && top[0] < bottom[1], "bands_edges: ordered edges above the well bottom");

    double k[2] = {0.0, 0.1}, e[2];
    expect_error(periodic_bands_energies(bands, 5, k, e, 2), PERIODIC_ERROR_INVALID_ARGUMENT, "5", "bands_energies: band 5 of 4");
    expect_error(periodic_bands_energies(bands, 1, NULL, e, 2), PERIODIC_ERROR_NULL_POINTER, "k_per_nm", "bands_energies: NULL k");
    expect(periodic_bands_energies(bands, 1, NULL, NULL, 0) == PERIODIC_OK, "bands_energies: zero points with NULL arrays is fine");
    double nan_k[1] = {NAN};
    expect_error(periodic_bands_energies(bands, 1, nan_k, e, 1), PERIODIC_ERROR_INVALID_ARGUMENT, "NaN", "bands_energies: NaN wavevector");
    double far[1] = {100.0}, dos[1];
    expect_error(periodic_bands_dos(bands, far, dos, 1), PERIODIC_ERROR_INVALID_ARGUMENT, "100", "bands_dos: energy above the computed bands");

    periodic_stack *stack = NULL;
    expect_error(periodic_stack_create(cell, 0, 0.25, 0.092, 0.25, 0.092, &stack), PERIODIC_ERROR_INVALID_ARGUMENT, "periods", "stack_create: 0 periods");
    expect_error(periodic_stack_create(cell, 10, 0.25, -1.0, 0.25, 0.092, &stack), PERIODIC_ERROR_INVALID_ARGUMENT, "-1", "stack_create: negative lead mass");
    expect(periodic_stack_create(cell, 10, 0.25, 0.092, 0.25, 0.092, &stack) == PERIODIC_OK, "stack_create: 10 periods");
    size_t count = 0;
    expect(periodic_stack_bound_levels(stack, NULL, NULL, 0, &count) == PERIODIC_OK && count > 0, "stack_bound_levels: size query");
    double levels[64], errors[64];
    expect_error(periodic_stack_bound_levels(stack, levels, errors, count - 1, &count), PERIODIC_ERROR_BUFFER_TOO_SMALL, "needed", "stack_bound_levels: buffer one short");
    expect(count > 0 && count <= 64 && periodic_stack_bound_levels(stack, levels, errors, 64, &count) == PERIODIC_OK && levels[0] < levels[count - 1], "stack_bound_levels: fill");
    /* Below the leads' band edge no state propagates in them, so nothing is transmitted (common practice, no single source). */
    double below[1] = {0.1}, nan_energy[1] = {NAN}, t[1] = {-1};
    expect(periodic_stack_transmission(stack, 0.0, below, t, 1) == PERIODIC_OK && t[0] == 0.0, "stack_transmission: T = 0 below the leads");
    expect_error(periodic_stack_transmission(stack, 0.0, nan_energy, t, 1), PERIODIC_ERROR_INVALID_ARGUMENT, "NaN", "stack_transmission: NaN energy");
    expect_error(periodic_stack_transmission((const periodic_stack *)cell, 0.0, below, t, 1), PERIODIC_ERROR_INVALID_HANDLE, "periodic_stack", "stack_transmission: a cell handle where a stack belongs");

    /* ABI 2: intersubband transitions of the stack. */
    size_t transition_count = 0;
    int32_t from[MAX_TRANSITIONS], to[MAX_TRANSITIONS], resolved[MAX_TRANSITIONS];
    double de[MAX_TRANSITIONS], dipoles[MAX_TRANSITIONS], strengths[MAX_TRANSITIONS];
    expect_error(periodic_stack_transitions(stack, NULL, NULL, NULL, NULL, NULL, NULL, 0, NULL), PERIODIC_ERROR_NULL_POINTER, "count", "stack_transitions: NULL count");
    expect(periodic_stack_transitions(stack, NULL, NULL, NULL, NULL, NULL, NULL, 0, &transition_count) == PERIODIC_OK
           && transition_count == count * (count - 1) / 2 && transition_count <= MAX_TRANSITIONS, "stack_transitions: size query gives every pair of bound levels");
    expect_error(periodic_stack_transitions(stack, from, to, de, dipoles, strengths, resolved, transition_count - 1, &transition_count), PERIODIC_ERROR_BUFFER_TOO_SMALL, "needed", "stack_transitions: buffer one short");
    expect_error(periodic_stack_transitions(stack, from, NULL, de, dipoles, strengths, resolved, MAX_TRANSITIONS, &transition_count), PERIODIC_ERROR_NULL_POINTER, "to", "stack_transitions: NULL to");
    expect_error(periodic_stack_transitions((const periodic_stack *)bands, from, to, de, dipoles, strengths, resolved, MAX_TRANSITIONS, &transition_count), PERIODIC_ERROR_INVALID_HANDLE, "periodic_stack", "stack_transitions: a bands handle where a stack belongs");
    int pairs_ok = periodic_stack_transitions(stack, from, to, de, dipoles, strengths, resolved, MAX_TRANSITIONS, &transition_count) == PERIODIC_OK;
    size_t t_index = 0;
    for (size_t i = 1; pairs_ok && i <= count; i++) {
        for (size_t f = i + 1; f <= count; f++, t_index++) {
            /* Levels counted from 1 as periodic_stack_bound_levels lists them; E_to - E_from of the same levels, which the
               optics refine to 1e-16 eV beyond the list's 1e-12 eV tolerance: the difference agrees within 2e-12 eV. */
            pairs_ok &= from[t_index] == (int32_t)i && to[t_index] == (int32_t)f && resolved[t_index] == 1
                        && fabs(de[t_index] - (levels[f - 1] - levels[i - 1])) <= 2e-12 && !isnan(dipoles[t_index]) && strengths[t_index] >= 0;
        }
    }
    expect(pairs_ok, "stack_transitions: fill, ordered by from then to, energies are level differences");
    double reference_mass = 0, normalisation_error = -1;
    expect_error(periodic_stack_transitions_accuracy(stack, NULL, &normalisation_error), PERIODIC_ERROR_NULL_POINTER, "reference_mass_m0", "stack_transitions_accuracy: NULL mass");
    /* The reference mass is the band-edge mass of the lowest-potential layer, the well's 0.067 m0 (library's documented default). */
    expect(periodic_stack_transitions_accuracy(stack, &reference_mass, &normalisation_error) == PERIODIC_OK && reference_mass == 0.067
           && normalisation_error >= 0 && normalisation_error < 1e-10, "stack_transitions_accuracy: the well's mass, integrals normalised");
    periodic_stack *unbound = NULL;
    size_t none = 0;
    expect(periodic_stack_create(cell, 2, -1.0, 0.067, -1.0, 0.067, &unbound) == PERIODIC_OK, "stack_create: leads below the whole cell");
    expect_error(periodic_stack_transitions(unbound, NULL, NULL, NULL, NULL, NULL, NULL, 0, &none), PERIODIC_ERROR_INVALID_ARGUMENT, "bound state", "stack_transitions: no bound level to start from");
    expect_error(periodic_stack_transitions(unbound, NULL, NULL, NULL, NULL, NULL, NULL, 0, &none), PERIODIC_ERROR_INVALID_ARGUMENT, "bound state", "stack_transitions: the failure is reported again on a second call");
    periodic_stack_destroy(unbound);

    /* ABI 2: optical-lattice cells and Wannier functions. */
    periodic_cell *lattice = NULL;
    expect_error(periodic_cell_create_optical_lattice(1064.0, 12.0, RB87_MASS_U, NULL), PERIODIC_ERROR_NULL_POINTER, "cell", "cell_create_optical_lattice: NULL out-handle");
    expect_error(periodic_cell_create_optical_lattice(NAN, 12.0, RB87_MASS_U, &lattice), PERIODIC_ERROR_INVALID_ARGUMENT, "wavelength", "cell_create_optical_lattice: NaN wavelength");
    expect_error(periodic_cell_create_optical_lattice(1064.0, -3.0, RB87_MASS_U, &lattice), PERIODIC_ERROR_INVALID_ARGUMENT, "-3", "cell_create_optical_lattice: negative depth named with its value");
    expect_error(periodic_cell_create_optical_lattice(1064.0, 12.0, 0.0, &lattice), PERIODIC_ERROR_INVALID_ARGUMENT, "mass", "cell_create_optical_lattice: zero mass");
    expect(lattice == NULL, "failed create leaves the out-handle unwritten");
    expect(periodic_cell_create_optical_lattice(1064.0, 12.0, RB87_MASS_U, &lattice) == PERIODIC_OK, "cell_create_optical_lattice: 87Rb, 1064 nm, 12 E_R");
    periodic_wannier *wannier = NULL;
    expect_error(periodic_wannier_compute(cell, 1, &wannier), PERIODIC_ERROR_INVALID_ARGUMENT, "Fourier", "wannier_compute: a cell of layers");
    expect_error(periodic_wannier_compute(lattice, 0, &wannier), PERIODIC_ERROR_INVALID_ARGUMENT, "bandIndex", "wannier_compute: band 0");
    expect_error(periodic_wannier_compute(lattice, 1, NULL), PERIODIC_ERROR_NULL_POINTER, "wannier", "wannier_compute: NULL out-handle");
    expect_error(periodic_wannier_compute((const periodic_cell *)stack, 1, &wannier), PERIODIC_ERROR_INVALID_HANDLE, "periodic_cell", "wannier_compute: a stack handle where a cell belongs");
    expect(periodic_wannier_compute(lattice, 1, &wannier) == PERIODIC_OK && wannier != NULL, "wannier_compute: band 1");
    size_t hopping_count = 0;
    double hopping[3] = {0}, on_site = 0, mean_energy = 0, wannier_norm = -1, tail = -1;
    int32_t k_points = 0;
    expect(periodic_wannier_hopping(wannier, NULL, 0, &hopping_count) == PERIODIC_OK && hopping_count == 3, "wannier_hopping: size query gives J1..J3");
    expect_error(periodic_wannier_hopping(wannier, hopping, 2, &hopping_count), PERIODIC_ERROR_BUFFER_TOO_SMALL, "3 are needed", "wannier_hopping: buffer one short");
    expect_error(periodic_wannier_hopping(wannier, NULL, 3, &hopping_count), PERIODIC_ERROR_NULL_POINTER, "hopping_ev", "wannier_hopping: NULL buffer with a capacity");
    expect_error(periodic_wannier_hopping((const periodic_wannier *)lattice, hopping, 3, &hopping_count), PERIODIC_ERROR_INVALID_HANDLE, "periodic_wannier", "wannier_hopping: a cell handle where a Wannier function belongs");
    /* The lowest band's J1 is positive and the longer hops much smaller in a 12 E_R lattice (tight-binding
       picture; docs/references.md, Bloch, Dalibard and Zwerger 2008). */
    expect(periodic_wannier_hopping(wannier, hopping, 3, &hopping_count) == PERIODIC_OK && hopping[0] > 0 && fabs(hopping[1]) < 0.1 * hopping[0]
           && fabs(hopping[2]) < 0.1 * hopping[0], "wannier_hopping: J1 > 0 and |J2|, |J3| < J1 / 10");
    expect_error(periodic_wannier_on_site(wannier, &on_site, NULL), PERIODIC_ERROR_NULL_POINTER, "mean_energy_ev", "wannier_on_site: NULL mean energy");
    expect(periodic_wannier_on_site(wannier, &on_site, &mean_energy) == PERIODIC_OK && on_site > 0 && mean_energy > 0, "wannier_on_site: positive");
    expect_error(periodic_wannier_accuracy(wannier, &wannier_norm, &tail, NULL), PERIODIC_ERROR_NULL_POINTER, "k_points", "wannier_accuracy: NULL k_points");
    expect(periodic_wannier_accuracy(wannier, &wannier_norm, &tail, &k_points) == PERIODIC_OK && wannier_norm < 1e-12 && tail < 1e-12 && k_points >= 32,
           "wannier_accuracy: normalised, tail below 1e-12");
    expect_error(periodic_wannier_destroy((periodic_wannier *)lattice), PERIODIC_ERROR_INVALID_HANDLE, "periodic_wannier", "wannier_destroy: a cell handle");

    char small[4];
    size_t required = 0;
    expect(periodic_last_error(small, sizeof small, &required) == PERIODIC_ERROR_BUFFER_TOO_SMALL && required > sizeof small, "last_error: short buffer reports the size needed");
    expect(periodic_last_error(NULL, 0, NULL) == PERIODIC_ERROR_NULL_POINTER, "last_error: NULL required");
    expect(periodic_version(NULL, 0, &required) == PERIODIC_ERROR_BUFFER_TOO_SMALL && required > 1, "version: size query");

    /* Four threads at once: same edges bit for bit, each with its own last error. */
    enum { THREADS = 4 };
    pthread_t threads[THREADS];
    struct job jobs[THREADS];
    periodic_stack *fresh = NULL;
    expect(periodic_stack_create(cell, 10, 0.25, 0.092, 0.25, 0.092, &fresh) == PERIODIC_OK, "stack_create: a fresh stack for the threads");
    for (int i = 0; i < THREADS; i++) {
        jobs[i].shared = fresh;
        pthread_create(&threads[i], NULL, compute, &jobs[i]);
    }
    for (int i = 0; i < THREADS; i++) pthread_join(threads[i], NULL);
    int same = 1, messages = 1, same_transitions = 1, same_hopping = 1;
    for (int i = 0; i < THREADS; i++) {
        same &= jobs[i].status == PERIODIC_OK && memcmp(jobs[i].bottom, bottom, sizeof bottom) == 0 && memcmp(jobs[i].top, top, sizeof top) == 0;
        messages &= strstr(jobs[i].message, "NaN") != NULL;
        same_transitions &= jobs[i].status == PERIODIC_OK && jobs[i].transition_count == transition_count
                            && memcmp(jobs[i].dipoles, dipoles, transition_count * sizeof *dipoles) == 0
                            && memcmp(jobs[i].strengths, strengths, transition_count * sizeof *strengths) == 0;
        same_hopping &= jobs[i].status == PERIODIC_OK && memcmp(jobs[i].hopping, hopping, sizeof hopping) == 0
                        && memcmp(&jobs[i].on_site, &on_site, sizeof on_site) == 0 && memcmp(&jobs[i].mean_energy, &mean_energy, sizeof mean_energy) == 0;
    }
    expect(same, "threads: edges computed concurrently equal the single-threaded ones bit for bit");
    expect(same_transitions, "threads: transitions of one shared stack, first asked for by four threads at once, equal the single-threaded ones bit for bit");
    expect(same_hopping, "threads: hopping and on-site integral computed concurrently equal the single-threaded ones bit for bit");
    expect(messages, "threads: each thread reads its own last error");

    expect(periodic_stack_destroy(stack) == PERIODIC_OK && periodic_bands_destroy(bands) == PERIODIC_OK && periodic_cell_destroy(cell) == PERIODIC_OK
           && periodic_stack_destroy(fresh) == PERIODIC_OK && periodic_wannier_destroy(wannier) == PERIODIC_OK && periodic_cell_destroy(lattice) == PERIODIC_OK,
           "destroy: each handle once");
    expect(periodic_wannier_destroy(NULL) == PERIODIC_OK, "destroy: NULL Wannier function is allowed");
    expect(periodic_cell_destroy(NULL) == PERIODIC_OK, "destroy: NULL is allowed");

    printf("%d passed, %d failed\n", passed, failed);
    return failed == 0 ? 0 : 1;
}
