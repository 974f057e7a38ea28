# SPDX-License-Identifier: MIT
# Copyright (c) 2026 Periodic contributors
"""Tests of the Python module over the C ABI: errors become PeriodicError with the library's message and
status, never a crash; NumPy and plain sequences give the same numbers; threads share handles safely.
Run from the repository root: python3 -m unittest discover -s python/tests -v"""

import math
import os
import sys
import threading
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), ".."))
import periodic  # noqa: E402

WIDTHS, POTENTIALS, MASSES = [5.0, 2.0], [0.0, 0.25], [0.067, 0.092]


class CellTest(unittest.TestCase):
    def test_create_invalidLayers_raiseWithStatusAndMessage(self):
        cases = [([5.0, -2.0], POTENTIALS, MASSES, "-2"), (WIDTHS, [0.0, math.nan], MASSES, "NaN"),
                 (WIDTHS, POTENTIALS, [0.067, 0.0], "mass"), ([], [], [], "at least one layer")]
        for widths, potentials, masses, needle in cases:
            with self.subTest(needle=needle), self.assertRaises(periodic.PeriodicError) as caught:
                periodic.Cell(widths, potentials, masses)
            self.assertEqual(caught.exception.status, 2)
            self.assertIn(needle, caught.exception.message)
            self.assertNotIn("\n", caught.exception.message)

    def test_create_unequalLengths_raiseValueError(self):
        with self.assertRaises(ValueError):
            periodic.Cell([5.0], POTENTIALS, MASSES)

    def test_period_sumOfWidths(self):
        # The period of a cell is the sum of its layer widths (definition).
        self.assertEqual(periodic.Cell(WIDTHS, POTENTIALS, MASSES).period_nm, 7.0)


class BandsTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.cell = periodic.Cell(WIDTHS, POTENTIALS, MASSES)
        cls.bands = cls.cell.bands(4)

    def test_edges_orderedWithAccuracyReport(self):
        b = self.bands
        self.assertEqual(b.count, 4)
        for n in range(4):
            self.assertLess(b.bottom_ev[n], b.top_ev[n])
            self.assertGreaterEqual(b.bottom_error_ev[n], 0.0)
        # Default tolerance 1e-14 relative: edges near 1 eV are bounded well below 1e-12 eV.
        self.assertLess(b.max_edge_error_ev, 1e-12)
        self.assertGreater(b.count_checks, 0)

    def test_energies_zoneCentreAndBoundaryAreEdges(self):
        # In a cell whose lowest band comes from a single well, band 1 has its bottom at k = 0 and its top at
        # k = π/d (common practice, no single source).
        e = self.bands.energies(1, [0.0, math.pi / 7.0])
        self.assertEqual(float(e[0]), float(self.bands.bottom_ev[0]))
        self.assertAlmostEqual(float(e[1]), float(self.bands.top_ev[0]), delta=1e-12)

    def test_energies_badBand_raises(self):
        with self.assertRaises(periodic.PeriodicError) as caught:
            self.bands.energies(5, [0.0])
        self.assertEqual(caught.exception.status, 2)

    def test_dos_aboveComputedBands_raises(self):
        with self.assertRaises(periodic.PeriodicError):
            self.bands.dos([100.0])

    def test_listsAndNumpy_sameNumbers(self):
        k = [0.0, 0.1, 0.2]
        self.assertEqual([float(v) for v in self.bands.energies(2, k)], [float(v) for v in self.bands.energies(2, tuple(k))])

    def test_threads_sameEdgesBitForBit(self):
        results, errors = [], []

        def work():
            try:
                cell = periodic.Cell(WIDTHS, POTENTIALS, MASSES)
                results.append([float(v) for v in cell.bands(4).bottom_ev])
            except Exception as error:  # reported below
                errors.append(error)

        threads = [threading.Thread(target=work) for _ in range(4)]
        for t in threads:
            t.start()
        for t in threads:
            t.join()
        self.assertEqual(errors, [])
        self.assertEqual(results, [[float(v) for v in self.bands.bottom_ev]] * 4)


class StackTest(unittest.TestCase):
    def test_boundLevels_tenPerMinibandBelowLeads(self):
        # N coupled wells split each level into N (tight-binding picture of a finite superlattice; common practice).
        cell = periodic.Cell(WIDTHS, POTENTIALS, MASSES)
        bands = cell.bands(1)
        levels, errors = cell.stack(10, (0.25, 0.092)).bound_levels()
        inside = [e for e in levels if bands.bottom_ev[0] - 1e-3 <= e <= bands.top_ev[0] + 1e-3]
        self.assertEqual(len(inside), 10)
        self.assertTrue(all(err >= 0 for err in errors))

    def test_transmission_unitIntervalAndZeroBelowLeads(self):
        stack = periodic.Cell(WIDTHS, POTENTIALS, MASSES).stack(10, (0.25, 0.092))
        t = [float(v) for v in stack.transmission([0.1, 0.26, 0.3, 0.5])]
        self.assertEqual(t[0], 0.0)  # no propagating state in the leads below their potential
        self.assertTrue(all(0.0 <= v <= 1.0 for v in t))

    def test_create_zeroPeriods_raises(self):
        with self.assertRaises(periodic.PeriodicError) as caught:
            periodic.Cell(WIDTHS, POTENTIALS, MASSES).stack(0, (0.25, 0.092))
        self.assertIn("periods", caught.exception.message)


class TransitionsTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.cell = periodic.Cell(WIDTHS, POTENTIALS, MASSES)
        cls.stack = cls.cell.stack(10, (0.25, 0.092))
        cls.levels, _ = cls.stack.bound_levels()
        cls.transitions = cls.stack.transitions()

    def test_pairs_everyPairOfBoundLevelsCountedFromOne(self):
        n = len(self.levels)
        t = self.transitions
        self.assertEqual(t.count, n * (n - 1) // 2)
        pairs = [(i, f) for i in range(1, n + 1) for f in range(i + 1, n + 1)]
        self.assertEqual(list(zip(t.from_level, t.to_level)), pairs)
        # The transition energy is the difference of the two levels (definition); the optics refine the levels to
        # 1e-16 eV beyond the bound-level list's 1e-12 eV tolerance, so the two agree within two such tolerances.
        for k, (i, f) in enumerate(pairs):
            self.assertLessEqual(abs(float(t.energy_ev[k]) - (float(self.levels[f - 1]) - float(self.levels[i - 1]))), 2e-12)

    def test_dipoles_paritySelectionRule(self):
        # The stack is mirror-symmetric (the leads equal the barriers), so its levels alternate in parity and
        # <i|z|f> vanishes between levels of equal parity, f - i even (parity selection rule, common practice; see
        # Helm 2000 in docs/references.md). "Vanishes" here is rounding of sums over ~1e3 quadrature nodes against dipoles of order
        # 1 nm: 1e-9 nm leaves six orders of margin on both sides.
        t = self.transitions
        self.assertTrue(all(t.resolved))
        largest = max(abs(float(d)) for d in t.dipole_nm)
        for k in range(t.count):
            if (t.to_level[k] - t.from_level[k]) % 2 == 0:
                self.assertLess(abs(float(t.dipole_nm[k])), 1e-9 * largest, (t.from_level[k], t.to_level[k]))
        self.assertGreater(largest, 0.1)

    def test_oscillatorStrengths_sumRuleFromGroundLevel(self):
        # Thomas-Reiche-Kuhn sum rule with a position-dependent mass: the strengths from level 1 to all states sum to
        # m* <1/m> <= 1 here (the reference mass is the well's, the lightest), and each upward strength is positive
        # (Sakurai; Sirtori et al. 1994 for the mass; docs/references.md).
        t = self.transitions
        self.assertAlmostEqual(t.reference_mass_m0, 0.067, delta=0)
        upward = [float(t.oscillator_strength[k]) for k in range(t.count) if t.from_level[k] == 1]
        self.assertTrue(all(f >= 0 for f in upward))
        self.assertLessEqual(sum(upward), 1.0)
        self.assertGreater(sum(upward), 0.5)  # most of the strength stays in bound levels of a 10-well stack
        self.assertLess(t.normalisation_error, 1e-10)

    def test_noBoundLevels_raises(self):
        # Leads far below the cell: nothing is bound, so no transition has a level to start from.
        with self.assertRaises(periodic.PeriodicError) as caught:
            self.cell.stack(2, (-1.0, 0.067)).transitions()
        self.assertEqual(caught.exception.status, 2)
        self.assertIn("bound", caught.exception.message)


RB87_MASS_U = 86.9091805310  # 87Rb, AME2020 atomic mass (Wang et al. 2021, docs/references.md)


class WannierTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.lattice = periodic.Cell.optical_lattice(1064.0, 12.0, RB87_MASS_U)
        cls.wannier = cls.lattice.wannier(1)

    def test_hopping_bandWidthIsFourTimesOddHoppings(self):
        # E(k) = E0 - 2 sum_n Jn cos(n k d) gives E(pi/d) - E(0) = 4 (J1 + J3 + J5 + ...) (tight-binding Fourier
        # series, common practice, no single source). The band edges are eigenvalues at k = 0 and pi/d from the
        # library's band solver; J comes from the Fourier series of E(k) sampled on the Wannier function's k-mesh: the
        # identity ties the two. J5 and beyond (about 1e-8 of J1 at 12 E_R, extrapolating the measured J3/J1 = 8e-5) and
        # the edges' own errors stay below the 1e-7 relative allowed.
        w = self.wannier
        self.assertEqual(len(w.hopping_ev), 3)
        j1, j2, j3 = (float(j) for j in w.hopping_ev)
        self.assertGreater(j1, 0)
        self.assertLess(abs(j2), 0.1 * j1)
        bands = self.lattice.bands(1)
        width = float(bands.top_ev[0]) - float(bands.bottom_ev[0])
        self.assertAlmostEqual(width / (4 * (j1 + j3)), 1.0, delta=1e-7)

    def test_onSite_positiveAndAccuracyReported(self):
        w = self.wannier
        # integral |w|^4 >= 1/(N d) for any normalised w, and a localised w has it of order 1/d (period 532 nm).
        self.assertGreater(w.on_site_integral_per_nm, 1 / 532.0)
        self.assertLess(w.normalisation_error, 1e-12)
        self.assertLess(w.tail_ratio, 1e-12)
        self.assertGreaterEqual(w.k_points, 32)

    def test_badInputs_raiseWithNames(self):
        cases = [(lambda: periodic.Cell.optical_lattice(1064.0, -1.0, RB87_MASS_U), "depth"),
                 (lambda: periodic.Cell.optical_lattice(math.nan, 12.0, RB87_MASS_U), "wavelength"),
                 (lambda: periodic.Cell.optical_lattice(1064.0, 12.0, 0.0), "mass"),
                 (lambda: self.lattice.wannier(0), "bandIndex"),
                 (lambda: periodic.Cell(WIDTHS, POTENTIALS, MASSES).wannier(1), "Fourier")]
        for make, needle in cases:
            with self.subTest(needle=needle), self.assertRaises(periodic.PeriodicError) as caught:
                make()
            self.assertEqual(caught.exception.status, 2)
            self.assertIn(needle, caught.exception.message)


class LibraryTest(unittest.TestCase):
    def test_abiVersion_atLeastModules(self):
        self.assertGreaterEqual(periodic.abi_version(), periodic.ABI_VERSION)

    def test_version_nonEmpty(self):
        self.assertTrue(periodic.version())


if __name__ == "__main__":
    unittest.main()
