! SPDX-License-Identifier: MIT
! Copyright (c) 2026 Periodic contributors
!
! Periodic from Fortran 2003 (iso_c_binding): the minibands of the superlattice of
! docs/examples/structures/superlattice.json. Build and run from the repository root:
!   gfortran -std=f2008 -Wall -Werror docs/embedding/fortran/example.f90 -Lartifacts/native -lperiodic \
!       -Wl,-rpath,'$ORIGIN' -o artifacts/native/example-fortran && artifacts/native/example-fortran
module periodic_c
  use, intrinsic :: iso_c_binding
  implicit none
  interface
    integer(c_int32_t) function periodic_cell_create(widths, potentials, masses, n, cell) bind(c)
      import :: c_int32_t, c_double, c_size_t, c_ptr
      real(c_double), intent(in) :: widths(*), potentials(*), masses(*)
      integer(c_size_t), value :: n
      type(c_ptr), intent(out) :: cell
    end function
    integer(c_int32_t) function periodic_bands_compute(cell, count, bands) bind(c)
      import :: c_int32_t, c_ptr
      type(c_ptr), value :: cell
      integer(c_int32_t), value :: count
      type(c_ptr), intent(out) :: bands
    end function
    integer(c_int32_t) function periodic_bands_edges(bands, bottom, top, capacity) bind(c)
      import :: c_int32_t, c_double, c_size_t, c_ptr
      type(c_ptr), value :: bands
      real(c_double), intent(out) :: bottom(*), top(*)
      integer(c_size_t), value :: capacity
    end function
    integer(c_int32_t) function periodic_last_error(buffer, capacity, required) bind(c)
      import :: c_int32_t, c_char, c_size_t
      character(kind=c_char), intent(out) :: buffer(*)
      integer(c_size_t), value :: capacity
      integer(c_size_t), intent(out) :: required
    end function
    integer(c_int32_t) function periodic_bands_destroy(bands) bind(c)
      import :: c_int32_t, c_ptr
      type(c_ptr), value :: bands
    end function
    integer(c_int32_t) function periodic_cell_destroy(cell) bind(c)
      import :: c_int32_t, c_ptr
      type(c_ptr), value :: cell
    end function
  end interface
contains
  ! Stops with the library's message when a call failed.
  subroutine check(status, what)
    integer(c_int32_t), intent(in) :: status
    character(*), intent(in) :: what
    character(kind=c_char) :: message(512)
    integer(c_size_t) :: required
    integer(c_int32_t) :: ignored
    integer :: length
    if (status == 0) return
    message = c_null_char
    ignored = periodic_last_error(message, int(size(message), c_size_t), required)
    length = 0
    do while (length < size(message))
      if (message(length + 1) == c_null_char) exit
      length = length + 1
    end do
    print '(a, " failed (status ", i0, "): ", 512a)', what, status, message(1:length)
    error stop 1
  end subroutine
end module

program bands_example
  use periodic_c
  implicit none
  real(c_double) :: widths(2) = [5.0_c_double, 2.0_c_double]
  real(c_double) :: potentials(2) = [0.0_c_double, 0.25_c_double]
  real(c_double) :: masses(2) = [0.067_c_double, 0.092_c_double]
  real(c_double) :: bottom(4), top(4)
  type(c_ptr) :: cell, bands
  integer :: i
  call check(periodic_cell_create(widths, potentials, masses, 2_c_size_t, cell), "periodic_cell_create")
  call check(periodic_bands_compute(cell, 4_c_int32_t, bands), "periodic_bands_compute")
  call check(periodic_bands_edges(bands, bottom, top, 4_c_size_t), "periodic_bands_edges")
  do i = 1, 4
    ! ES25.17 prints 18 significant digits: enough to round-trip a double.
    print '("band ", i0, " bottom ", es25.17e3, " top ", es25.17e3)', i, bottom(i), top(i)
  end do
  call check(periodic_bands_destroy(bands), "periodic_bands_destroy")
  call check(periodic_cell_destroy(cell), "periodic_cell_destroy")
end program
