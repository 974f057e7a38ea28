# SPDX-License-Identifier: MIT
# Copyright (c) 2026 Periodic contributors
"""Periodic from Python: the minibands, E(k), density of states, transmission and bound levels of
one-dimensional periodic structures, through the C ABI of libperiodic.so (include/periodic.h) with
the standard library's ctypes. Arrays come back as NumPy arrays where NumPy is installed, else lists.

The physics is the single-band envelope-function (effective-mass) approximation of the .NET library,
bit for bit; strain, band mixing, many-body effects, scattering and space charge are not modelled, and
published material parameters differ by 10 % or more. Treat results as a design guide and confirm
design-critical numbers by measurement.

The library is found, in order, at $PERIODIC_LIBRARY, beside this file, in the repository's
artifacts/native/ (where `dotnet publish src/Periodic.Native -c Release -r linux-x64 -o artifacts/native`
writes it), or on the system's library path.
"""

import ctypes
import ctypes.util
import os
import threading

try:
    import numpy as _np
except ImportError:  # NumPy is optional: plain lists then
    _np = None

__all__ = ["Cell", "Bands", "Stack", "PeriodicError", "abi_version", "version", "library_path"]

ABI_VERSION = 1
"""The ABI version this module was written for (PERIODIC_ABI_VERSION of include/periodic.h)."""

STATUS_NAMES = {
    1: "null pointer",
    2: "invalid argument",
    3: "buffer too small",
    4: "invalid handle",
    5: "numerical failure",
    6: "internal error",
}


class PeriodicError(Exception):
    """A call into libperiodic failed: `status` is the C status code, the message the library's."""

    def __init__(self, status, message):
        super().__init__(f"{message} ({STATUS_NAMES.get(status, 'status')} {status})")
        self.status = status
        self.message = message


_c_double_p = ctypes.POINTER(ctypes.c_double)
_handle_p = ctypes.POINTER(ctypes.c_void_p)
_lock = threading.Lock()
_lib = None


def _candidates():
    here = os.path.dirname(os.path.abspath(__file__))
    env = os.environ.get("PERIODIC_LIBRARY")
    if env:
        yield env
        return
    yield os.path.join(here, "libperiodic.so")
    yield os.path.join(here, "..", "..", "artifacts", "native", "libperiodic.so")
    found = ctypes.util.find_library("periodic")
    if found:
        yield found


def library_path():
    """The path of the libperiodic.so this module loads."""
    for path in _candidates():
        if os.path.sep not in path or os.path.exists(path):
            return os.path.abspath(path) if os.path.exists(path) else path
    raise OSError("libperiodic.so not found: set PERIODIC_LIBRARY to its path, or build it with "
                  "`dotnet publish src/Periodic.Native -c Release -r linux-x64 -o artifacts/native`")


def _declare(lib):
    i32, size, dbl, vp = ctypes.c_int32, ctypes.c_size_t, ctypes.c_double, ctypes.c_void_p
    signatures = {
        "periodic_abi_version": [],
        "periodic_version": [ctypes.c_char_p, size, ctypes.POINTER(size)],
        "periodic_last_error": [ctypes.c_char_p, size, ctypes.POINTER(size)],
        "periodic_cell_create": [_c_double_p, _c_double_p, _c_double_p, size, _handle_p],
        "periodic_cell_destroy": [vp],
        "periodic_cell_period": [vp, _c_double_p],
        "periodic_bands_compute": [vp, i32, _handle_p],
        "periodic_bands_destroy": [vp],
        "periodic_bands_count": [vp, ctypes.POINTER(i32)],
        "periodic_bands_edges": [vp, _c_double_p, _c_double_p, size],
        "periodic_bands_edge_errors": [vp, _c_double_p, _c_double_p, size],
        "periodic_bands_masses": [vp, _c_double_p, _c_double_p, size],
        "periodic_bands_accuracy": [vp, _c_double_p, ctypes.POINTER(i32)],
        "periodic_bands_energies": [vp, i32, _c_double_p, _c_double_p, size],
        "periodic_bands_dos": [vp, _c_double_p, _c_double_p, size],
        "periodic_stack_create": [vp, i32, dbl, dbl, dbl, dbl, _handle_p],
        "periodic_stack_destroy": [vp],
        "periodic_stack_transmission": [vp, dbl, _c_double_p, _c_double_p, size],
        "periodic_stack_bound_levels": [vp, _c_double_p, _c_double_p, size, ctypes.POINTER(size)],
    }
    for name, argtypes in signatures.items():
        function = getattr(lib, name)
        function.argtypes = argtypes
        function.restype = i32
    return lib


def _library():
    global _lib
    with _lock:
        if _lib is None:
            lib = _declare(ctypes.CDLL(library_path()))
            if lib.periodic_abi_version() < ABI_VERSION:
                raise OSError(f"libperiodic ABI {lib.periodic_abi_version()} is older than this module's {ABI_VERSION}")
            _lib = lib
        return _lib


def _string(function):
    required = ctypes.c_size_t(0)
    function(None, 0, ctypes.byref(required))
    buffer = ctypes.create_string_buffer(required.value)
    function(buffer, required.value, ctypes.byref(required))
    return buffer.value.decode("utf-8")


def _check(status):
    if status != 0:
        raise PeriodicError(status, _string(_library().periodic_last_error))


def abi_version():
    """The ABI version of the loaded library."""
    return _library().periodic_abi_version()


def version():
    """The library's version (the .NET package version it was built from)."""
    return _string(_library().periodic_version)


def _doubles(values, name):
    """A contiguous float64 copy of `values` and its ctypes pointer (the copy must outlive the call)."""
    if _np is not None:
        array = _np.ascontiguousarray(values, dtype=_np.float64)
        if array.ndim != 1:
            raise ValueError(f"{name} must be one-dimensional; got shape {array.shape}")
        return array, array.ctypes.data_as(_c_double_p), array.size
    values = [float(v) for v in values]
    array = (ctypes.c_double * len(values))(*values)
    return array, ctypes.cast(array, _c_double_p), len(values)


def _output(count):
    if _np is not None:
        array = _np.empty(count, dtype=_np.float64)
        return array, array.ctypes.data_as(_c_double_p)
    array = (ctypes.c_double * count)()
    return array, ctypes.cast(array, _c_double_p)


def _result(array):
    return array if _np is not None else list(array)


class _Handle:
    _destroy = None

    def __init__(self, handle):
        self._handle = handle

    def close(self):
        """Releases the native handle now (also done when the object is collected)."""
        if self._handle:
            getattr(_library(), self._destroy)(self._handle)
            self._handle = None

    def __del__(self):
        try:
            self.close()
        except Exception:  # interpreter shutdown: nothing left to release into
            pass

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()


class Cell(_Handle):
    """A unit cell of uniform layers: widths in nm, potentials in eV, effective masses in m0."""

    _destroy = "periodic_cell_destroy"

    def __init__(self, widths_nm, potentials_ev, masses_m0):
        w, wp, n = _doubles(widths_nm, "widths_nm")
        v, vp, nv = _doubles(potentials_ev, "potentials_ev")
        m, mp, nm = _doubles(masses_m0, "masses_m0")
        if not n == nv == nm:
            raise ValueError(f"widths_nm, potentials_ev and masses_m0 must have the same length; got {n}, {nv} and {nm}")
        handle = ctypes.c_void_p()
        _check(_library().periodic_cell_create(wp, vp, mp, n, ctypes.byref(handle)))
        super().__init__(handle)

    @property
    def period_nm(self):
        """The period d in nm."""
        value = ctypes.c_double()
        _check(_library().periodic_cell_period(self._handle, ctypes.byref(value)))
        return value.value

    def bands(self, count):
        """The lowest `count` minibands."""
        return Bands(self, count)

    def stack(self, periods, left_lead, right_lead=None):
        """`periods` repetitions of this cell between leads given as (potential eV, mass m0)."""
        return Stack(self, periods, left_lead, right_lead if right_lead is not None else left_lead)


class Bands(_Handle):
    """The lowest minibands of a cell, with their edges, edge masses and accuracy."""

    _destroy = "periodic_bands_destroy"

    def __init__(self, cell, count):
        handle = ctypes.c_void_p()
        _check(_library().periodic_bands_compute(cell._handle, int(count), ctypes.byref(handle)))
        super().__init__(handle)
        n = ctypes.c_int32()
        _check(_library().periodic_bands_count(self._handle, ctypes.byref(n)))
        self.count = n.value
        self.bottom_ev, self.top_ev = self._pair("periodic_bands_edges")
        self.bottom_error_ev, self.top_error_ev = self._pair("periodic_bands_edge_errors")
        self.bottom_mass_m0, self.top_mass_m0 = self._pair("periodic_bands_masses")
        max_error, checks = ctypes.c_double(), ctypes.c_int32()
        _check(_library().periodic_bands_accuracy(self._handle, ctypes.byref(max_error), ctypes.byref(checks)))
        self.max_edge_error_ev = max_error.value
        self.count_checks = checks.value

    def _pair(self, function):
        first, fp = _output(self.count)
        second, sp = _output(self.count)
        _check(getattr(_library(), function)(self._handle, fp, sp, self.count))
        return _result(first), _result(second)

    def energies(self, band_index, k_per_nm):
        """E(k) in eV of band `band_index` (1 = lowest) at wavevectors in 1/nm."""
        k, kp, n = _doubles(k_per_nm, "k_per_nm")
        out, op = _output(n)
        _check(_library().periodic_bands_energies(self._handle, int(band_index), kp, op, n))
        return _result(out)

    def dos(self, energies_ev):
        """Density of states per period length, 1/(eV nm), at energies in eV."""
        e, ep, n = _doubles(energies_ev, "energies_ev")
        out, op = _output(n)
        _check(_library().periodic_bands_dos(self._handle, ep, op, n))
        return _result(out)

    def __repr__(self):
        rows = ", ".join(f"[{b:.6g}, {t:.6g}]" for b, t in zip(self.bottom_ev, self.top_ev))
        return f"Bands({self.count} bands, eV: {rows}; edges within {self.max_edge_error_ev:.2g} eV)"


class Stack(_Handle):
    """A finite stack: `periods` repetitions of a cell between two uniform leads (potential eV, mass m0)."""

    _destroy = "periodic_stack_destroy"

    def __init__(self, cell, periods, left_lead, right_lead):
        (lv, lm), (rv, rm) = left_lead, right_lead
        handle = ctypes.c_void_p()
        _check(_library().periodic_stack_create(cell._handle, int(periods), float(lv), float(lm), float(rv), float(rm), ctypes.byref(handle)))
        super().__init__(handle)

    def transmission(self, energies_ev, bias_ev=0.0):
        """Transmission probability at energies (eV) above both leads, with an optional bias (eV)."""
        e, ep, n = _doubles(energies_ev, "energies_ev")
        out, op = _output(n)
        _check(_library().periodic_stack_transmission(self._handle, float(bias_ev), ep, op, n))
        return _result(out)

    def bound_levels(self):
        """(energies, error bounds) in eV of the levels below both leads, lowest first."""
        lib, count = _library(), ctypes.c_size_t(0)
        _check(lib.periodic_stack_bound_levels(self._handle, None, None, 0, ctypes.byref(count)))
        energies, ep = _output(count.value)
        errors, rp = _output(count.value)
        _check(lib.periodic_stack_bound_levels(self._handle, ep, rp, count.value, ctypes.byref(count)))
        return _result(energies), _result(errors)
