# SPDX-License-Identifier: MIT
# Copyright (c) 2026 Periodic contributors
"""Periodic from Python: the minibands, E(k), density of states, transmission, bound levels and
intersubband transitions of one-dimensional periodic structures, and the Wannier functions and Hubbard
hopping of optical lattices, through the C ABI of libperiodic.so (include/periodic.h) with
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

__all__ = ["Cell", "Bands", "Stack", "Transitions", "Wannier", "PeriodicError", "abi_version", "version", "library_path"]

ABI_VERSION = 2
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
_c_int32_p = ctypes.POINTER(ctypes.c_int32)
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
        "periodic_cell_create_optical_lattice": [dbl, dbl, dbl, _handle_p],
        "periodic_stack_transitions": [vp, _c_int32_p, _c_int32_p, _c_double_p, _c_double_p, _c_double_p, _c_int32_p,
                                       size, ctypes.POINTER(size)],
        "periodic_stack_transitions_accuracy": [vp, _c_double_p, _c_double_p],
        "periodic_wannier_compute": [vp, i32, _handle_p],
        "periodic_wannier_destroy": [vp],
        "periodic_wannier_hopping": [vp, _c_double_p, size, ctypes.POINTER(size)],
        "periodic_wannier_on_site": [vp, _c_double_p, _c_double_p],
        "periodic_wannier_accuracy": [vp, _c_double_p, _c_double_p, ctypes.POINTER(i32)],
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


def _output(count, ctype=ctypes.c_double):
    """An output array of `count` values of `ctype` (c_double or c_int32) and its ctypes pointer."""
    pointer = ctypes.POINTER(ctype)
    if _np is not None:
        array = _np.empty(count, dtype=_np.float64 if ctype is ctypes.c_double else _np.int32)
        return array, array.ctypes.data_as(pointer)
    array = (ctype * count)()
    return array, ctypes.cast(array, pointer)


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

    @classmethod
    def optical_lattice(cls, wavelength_nm, depth_recoil, mass_u):
        """A cell of an optical lattice: a standing wave of wavelength `wavelength_nm` (period half of it), depth
        `depth_recoil` in recoil energies of an atom of mass `mass_u` (unified atomic mass units)."""
        handle = ctypes.c_void_p()
        _check(_library().periodic_cell_create_optical_lattice(float(wavelength_nm), float(depth_recoil), float(mass_u),
                                                               ctypes.byref(handle)))
        cell = cls.__new__(cls)
        _Handle.__init__(cell, handle)
        return cell

    def wannier(self, band_index=1):
        """The Wannier function of isolated band `band_index` (1 = lowest) of an optical-lattice cell."""
        return Wannier(self, band_index)

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

    def transitions(self):
        """The intersubband transitions between the stack's bound levels (levels numbered from 1 as in
        bound_levels), for light polarised along the growth axis."""
        return Transitions(self)


class Transitions:
    """Intersubband transitions of a stack: `from_level`, `to_level` (counted from 1), `energy_ev` (E_to - E_from),
    `dipole_nm` (signed <from|z|to>), `oscillator_strength` (f = 2m*w|z|^2/hbar), `resolved` (False where the two
    levels are closer than double precision separates: dipole and strength are 0 there, not numbers to use),
    `reference_mass_m0` (m*) and `normalisation_error` (the accuracy of the integrals)."""

    def __init__(self, stack):
        lib, count = _library(), ctypes.c_size_t(0)
        h = stack._handle
        _check(lib.periodic_stack_transitions(h, None, None, None, None, None, None, 0, ctypes.byref(count)))
        n = count.value
        from_level, fp = _output(n, ctypes.c_int32)
        to_level, tp = _output(n, ctypes.c_int32)
        resolved, rp = _output(n, ctypes.c_int32)
        energy, ep = _output(n)
        dipole, dp = _output(n)
        strength, sp = _output(n)
        _check(lib.periodic_stack_transitions(h, fp, tp, ep, dp, sp, rp, n, ctypes.byref(count)))
        mass, norm = ctypes.c_double(), ctypes.c_double()
        _check(lib.periodic_stack_transitions_accuracy(h, ctypes.byref(mass), ctypes.byref(norm)))
        self.count = n
        self.from_level = [int(v) for v in from_level]
        self.to_level = [int(v) for v in to_level]
        self.resolved = [bool(v) for v in resolved]
        self.energy_ev = _result(energy)
        self.dipole_nm = _result(dipole)
        self.oscillator_strength = _result(strength)
        self.reference_mass_m0 = mass.value
        self.normalisation_error = norm.value

    def __len__(self):
        return self.count

    def __repr__(self):
        return f"Transitions({self.count}, m* = {self.reference_mass_m0:.4g} m0, integrals to {self.normalisation_error:.2g})"


class Wannier(_Handle):
    """The maximally localised Wannier function of one isolated band of an optical-lattice cell: `hopping_ev`
    (J1, J2, J3; E(k) = E0 - 2 sum Jn cos(n k d)), `on_site_integral_per_nm` (integral of |w|^4), `mean_energy_ev`
    (E0), and its accuracy: `normalisation_error`, `tail_ratio`, `k_points`."""

    _destroy = "periodic_wannier_destroy"

    def __init__(self, cell, band_index):
        lib, handle = _library(), ctypes.c_void_p()
        _check(lib.periodic_wannier_compute(cell._handle, int(band_index), ctypes.byref(handle)))
        super().__init__(handle)
        self.band_index = int(band_index)
        count = ctypes.c_size_t(0)
        _check(lib.periodic_wannier_hopping(self._handle, None, 0, ctypes.byref(count)))
        hopping, hp = _output(count.value)
        _check(lib.periodic_wannier_hopping(self._handle, hp, count.value, ctypes.byref(count)))
        self.hopping_ev = _result(hopping)
        on_site, mean = ctypes.c_double(), ctypes.c_double()
        _check(lib.periodic_wannier_on_site(self._handle, ctypes.byref(on_site), ctypes.byref(mean)))
        self.on_site_integral_per_nm, self.mean_energy_ev = on_site.value, mean.value
        norm, tail, k_points = ctypes.c_double(), ctypes.c_double(), ctypes.c_int32()
        _check(lib.periodic_wannier_accuracy(self._handle, ctypes.byref(norm), ctypes.byref(tail), ctypes.byref(k_points)))
        self.normalisation_error, self.tail_ratio, self.k_points = norm.value, tail.value, k_points.value

    def __repr__(self):
        return (f"Wannier(band {self.band_index}: J = {[float(j) for j in self.hopping_ev]} eV, "
                f"integral |w|^4 = {self.on_site_integral_per_nm:.6g} /nm, tail {self.tail_ratio:.2g})")
