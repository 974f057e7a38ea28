/* SPDX-License-Identifier: MIT
 * Copyright (c) 2026 Periodic contributors */

/*
 * ABI tests of libperiodic: null pointers, short buffers, invalid layers and wrong handle kinds return
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

struct job {
    double bottom[4], top[4];
    int32_t status;
    char message[256];
};

static void *compute(void *arg)
{
    struct job *job = arg;
    periodic_cell *cell = NULL;
    periodic_bands *bands = NULL;
    job->status = periodic_cell_create(widths, potentials, masses, 2, &cell);
    if (job->status == PERIODIC_OK) job->status = periodic_bands_compute(cell, 4, &bands);
    if (job->status == PERIODIC_OK) job->status = periodic_bands_edges(bands, job->bottom, job->top, 4);
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

    char small[4];
    size_t required = 0;
    expect(periodic_last_error(small, sizeof small, &required) == PERIODIC_ERROR_BUFFER_TOO_SMALL && required > sizeof small, "last_error: short buffer reports the size needed");
    expect(periodic_last_error(NULL, 0, NULL) == PERIODIC_ERROR_NULL_POINTER, "last_error: NULL required");
    expect(periodic_version(NULL, 0, &required) == PERIODIC_ERROR_BUFFER_TOO_SMALL && required > 1, "version: size query");

    /* Four threads at once: same edges bit for bit, each with its own last error. */
    enum { THREADS = 4 };
    pthread_t threads[THREADS];
    struct job jobs[THREADS];
    for (int i = 0; i < THREADS; i++) pthread_create(&threads[i], NULL, compute, &jobs[i]);
    for (int i = 0; i < THREADS; i++) pthread_join(threads[i], NULL);
    int same = 1, messages = 1;
    for (int i = 0; i < THREADS; i++) {
        same &= jobs[i].status == PERIODIC_OK && memcmp(jobs[i].bottom, bottom, sizeof bottom) == 0 && memcmp(jobs[i].top, top, sizeof top) == 0;
        messages &= strstr(jobs[i].message, "NaN") != NULL;
    }
    expect(same, "threads: edges computed concurrently equal the single-threaded ones bit for bit");
    expect(messages, "threads: each thread reads its own last error");

    expect(periodic_stack_destroy(stack) == PERIODIC_OK && periodic_bands_destroy(bands) == PERIODIC_OK && periodic_cell_destroy(cell) == PERIODIC_OK, "destroy: each handle once");
    expect(periodic_cell_destroy(NULL) == PERIODIC_OK, "destroy: NULL is allowed");

    printf("%d passed, %d failed\n", passed, failed);
    return failed == 0 ? 0 : 1;
}
