/* SPDX-License-Identifier: MIT
 * Copyright (c) 2026 Periodic contributors */

/*
 * Periodic from C: the minibands of a superlattice of 5 nm wells (m = 0.067 m0) between 2 nm barriers
 * 0.25 eV high (m = 0.092 m0) — the cell of docs/examples/structures/superlattice.json — then E(k),
 * the density of states, the transmission of ten periods, their bound levels and the intersubband
 * transitions between them; then the Hubbard hopping of rubidium-87 atoms in a 1064 nm optical lattice
 * 12 recoil energies deep (docs/examples/structures/rubidium-lattice.json).
 *
 * Build and run (from the repository root, after `dotnet publish src/Periodic.Native -c Release -r linux-x64 -o artifacts/native`):
 *   gcc -std=c11 -Wall -Wextra -Werror -Iinclude docs/embedding/c/example.c -Lartifacts/native -lperiodic \
 *       -Wl,-rpath,'$ORIGIN' -o artifacts/native/example && artifacts/native/example
 *
 * The "band", "transition" and "hopping" lines print every double with 17 significant digits, enough to
 * round-trip it exactly.
 */
#include <stdio.h>
#include <stdlib.h>

#include "periodic.h"

/* Prints the thread's last error message and exits: every call below returns a status. */
static void check(int32_t status, const char *what)
{
    if (status == PERIODIC_OK) {
        return;
    }
    char message[512];
    size_t required = 0;
    periodic_last_error(message, sizeof message, &required); /* truncated messages still end in NUL only if they fit */
    fprintf(stderr, "%s failed with status %d: %s\n", what, (int)status, required <= sizeof message ? message : "(message too long)");
    exit(1);
}

int main(void)
{
    if (periodic_abi_version() < PERIODIC_ABI_VERSION) {
        fprintf(stderr, "libperiodic ABI %d is older than this header's %d\n", (int)periodic_abi_version(), PERIODIC_ABI_VERSION);
        return 1;
    }
    char version[128];
    size_t required = 0;
    check(periodic_version(version, sizeof version, &required), "periodic_version");
    printf("libperiodic %s, ABI %d\n", version, (int)periodic_abi_version());

    const double widths_nm[] = {5.0, 2.0};
    const double potentials_ev[] = {0.0, 0.25};
    const double masses_m0[] = {0.067, 0.092};
    periodic_cell *cell = NULL;
    check(periodic_cell_create(widths_nm, potentials_ev, masses_m0, 2, &cell), "periodic_cell_create");

    enum { BANDS = 4 };
    periodic_bands *bands = NULL;
    check(periodic_bands_compute(cell, BANDS, &bands), "periodic_bands_compute");
    double bottom[BANDS], top[BANDS], bottom_mass[BANDS], top_mass[BANDS], max_error = 0;
    int32_t checks = 0;
    check(periodic_bands_edges(bands, bottom, top, BANDS), "periodic_bands_edges");
    check(periodic_bands_masses(bands, bottom_mass, top_mass, BANDS), "periodic_bands_masses");
    check(periodic_bands_accuracy(bands, &max_error, &checks), "periodic_bands_accuracy");
    for (int i = 0; i < BANDS; i++) {
        printf("band %d bottom %.17g top %.17g massAtBottom %.17g massAtTop %.17g\n",
               i + 1, bottom[i], top[i], bottom_mass[i], top_mass[i]);
    }
    printf("accuracy: edges within %.3g eV, %d oscillation-count checks\n", max_error, (int)checks);

    /* E(k) of band 1 from the zone centre to the zone boundary, and the density of states. */
    double period_nm = 0;
    check(periodic_cell_period(cell, &period_nm), "periodic_cell_period");
    const double pi = 3.14159265358979323846;
    double k[5], energy[5], dos[5];
    for (int i = 0; i < 5; i++) {
        k[i] = i * (pi / period_nm) / 4;
    }
    check(periodic_bands_energies(bands, 1, k, energy, 5), "periodic_bands_energies");
    for (int i = 0; i < 5; i++) {
        energy[i] += 1e-4; /* just inside the band, for the density of states below */
    }
    check(periodic_bands_dos(bands, energy, dos, 5), "periodic_bands_dos");
    for (int i = 0; i < 5; i++) {
        printf("k = %.4f /nm: E = %.6f eV, DOS(E + 0.1 meV) = %.4f /(eV nm)\n", k[i], energy[i] - 1e-4, dos[i]);
    }

    /* Ten periods between leads like the barriers: transmission above the leads, levels below them. */
    periodic_stack *stack = NULL;
    check(periodic_stack_create(cell, 10, 0.25, 0.092, 0.25, 0.092, &stack), "periodic_stack_create");
    const double energies_ev[] = {0.26, 0.3, 0.35, 0.4, 0.5};
    double transmission[5];
    check(periodic_stack_transmission(stack, 0.0, energies_ev, transmission, 5), "periodic_stack_transmission");
    for (int i = 0; i < 5; i++) {
        printf("T(%.2f eV) = %.6g\n", energies_ev[i], transmission[i]);
    }
    size_t level_count = 0;
    check(periodic_stack_bound_levels(stack, NULL, NULL, 0, &level_count), "periodic_stack_bound_levels (size)");
    double *levels = malloc(level_count * sizeof *levels), *errors = malloc(level_count * sizeof *errors);
    if (level_count > 0 && (levels == NULL || errors == NULL)) {
        fprintf(stderr, "out of memory\n");
        return 1;
    }
    check(periodic_stack_bound_levels(stack, levels, errors, level_count, &level_count), "periodic_stack_bound_levels");
    printf("%zu bound levels below the leads; lowest %.6f eV, highest %.6f eV\n", level_count, levels[0], levels[level_count - 1]);
    free(levels);
    free(errors);

    /* Intersubband transitions between those levels (light polarised along the growth axis), query-then-fill. */
    size_t transition_count = 0;
    check(periodic_stack_transitions(stack, NULL, NULL, NULL, NULL, NULL, NULL, 0, &transition_count), "periodic_stack_transitions (size)");
    size_t n = transition_count > 0 ? transition_count : 1;
    int32_t *from = malloc(n * sizeof *from), *to = malloc(n * sizeof *to), *resolved = malloc(n * sizeof *resolved);
    double *de = malloc(n * sizeof *de), *dipole = malloc(n * sizeof *dipole), *strength = malloc(n * sizeof *strength);
    if (from == NULL || to == NULL || resolved == NULL || de == NULL || dipole == NULL || strength == NULL) {
        fprintf(stderr, "out of memory\n");
        return 1;
    }
    check(periodic_stack_transitions(stack, from, to, de, dipole, strength, resolved, n, &transition_count), "periodic_stack_transitions");
    double reference_mass = 0, normalisation_error = 0;
    check(periodic_stack_transitions_accuracy(stack, &reference_mass, &normalisation_error), "periodic_stack_transitions_accuracy");
    printf("%zu transitions; f with m* = %.4g m0, integrals to %.2g\n", transition_count, reference_mass, normalisation_error);
    for (size_t i = 0; i < transition_count; i++) {
        if (resolved[i]) {
            printf("transition %d %d energy %.17g dipole %.17g oscillatorStrength %.17g\n",
                   (int)from[i], (int)to[i], de[i], dipole[i], strength[i]);
        } else {
            printf("transition %d %d energy %.17g not resolved\n", (int)from[i], (int)to[i], de[i]);
        }
    }
    free(from);
    free(to);
    free(resolved);
    free(de);
    free(dipole);
    free(strength);

    /* Rubidium-87 (86.9091805310 u) in a 1064 nm standing wave 12 recoil energies deep: Wannier function of
       the lowest band, its hopping J1..J3 and the on-site integral of |w|^4 (Hubbard U follows from it). */
    periodic_cell *lattice = NULL;
    periodic_wannier *wannier = NULL;
    check(periodic_cell_create_optical_lattice(1064.0, 12.0, 86.9091805310, &lattice), "periodic_cell_create_optical_lattice");
    check(periodic_wannier_compute(lattice, 1, &wannier), "periodic_wannier_compute");
    double hopping[3], on_site = 0, mean_energy = 0, wannier_norm = 0, tail = 0;
    size_t hopping_count = 0;
    int32_t k_points = 0;
    check(periodic_wannier_hopping(wannier, hopping, 3, &hopping_count), "periodic_wannier_hopping");
    check(periodic_wannier_on_site(wannier, &on_site, &mean_energy), "periodic_wannier_on_site");
    check(periodic_wannier_accuracy(wannier, &wannier_norm, &tail, &k_points), "periodic_wannier_accuracy");
    printf("hopping 1 J1 %.17g J2 %.17g J3 %.17g wannierIntegral %.17g meanEnergy %.17g\n",
           hopping[0], hopping[1], hopping[2], on_site, mean_energy);
    printf("Wannier function: %d wavevectors, normalised to %.2g, tail %.2g of the peak\n", (int)k_points, wannier_norm, tail);
    periodic_wannier_destroy(wannier);
    periodic_cell_destroy(lattice);

    periodic_stack_destroy(stack);
    periodic_bands_destroy(bands);
    periodic_cell_destroy(cell);
    return 0;
}
