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


class LibraryTest(unittest.TestCase):
    def test_abiVersion_atLeastModules(self):
        self.assertGreaterEqual(periodic.abi_version(), periodic.ABI_VERSION)

    def test_version_nonEmpty(self):
        self.assertTrue(periodic.version())


if __name__ == "__main__":
    unittest.main()
