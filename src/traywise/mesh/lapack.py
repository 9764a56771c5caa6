"""LAPACK's banded solver dgbsv (LU with partial pivoting), called in place on Fortran-ordered
band storage, without importing scipy.linalg (about half a second of start-up).

numpy's wheels ship OpenBLAS with the whole of LAPACK and 64-bit integers (``numpy.show_config()``
names it 'scipy-openblas'); that library is loaded with numpy already, so its LAPACKE_dgbsv_work
is called through ctypes at no start-up cost. Where numpy is built against another library,
``scipy.linalg.lapack.dgbsv`` does the same job (its wrapper works in place on a Fortran-ordered
float64 array, so it copies nothing either).
"""

import ctypes
import functools
from pathlib import Path

import numpy as np

COLUMN_MAJOR = 102  # LAPACKE's LAPACK_COL_MAJOR


@functools.lru_cache(maxsize=1)
def _bundled():
    """numpy's OpenBLAS dgbsv through LAPACKE (64-bit integers), or None when not found."""
    folder = Path(np.__file__).resolve().parent.parent / "numpy.libs"
    for library in sorted(folder.glob("libscipy_openblas64_*.so*")):
        try:
            function = ctypes.CDLL(str(library)).scipy_LAPACKE_dgbsv_work64_
        except (OSError, AttributeError):
            continue
        integer = ctypes.c_int64
        function.restype = integer
        function.argtypes = [ctypes.c_int, integer, integer, integer, integer, ctypes.c_void_p, integer,
                             ctypes.c_void_p, ctypes.c_void_p, integer]
        return function
    return None


def solve_banded_in_place(below, above, band, rhs, pivots):
    """Solve A x = rhs with A in LAPACK band storage; returns LAPACK's info (0: solved, > 0:
    singular). ``band`` (2 below + above + 1, m) Fortran-ordered float64, rows below + 1 ..
    hold A and the first ``below`` rows are workspace; it is overwritten by the LU factors.
    ``rhs`` (m,) float64 contiguous is overwritten by x; ``pivots`` (m,) int64 is workspace."""
    m = rhs.size
    function = _bundled()
    if function is not None:
        return int(function(COLUMN_MAJOR, m, below, above, 1, band.ctypes.data, band.shape[0],
                            pivots.ctypes.data, rhs.ctypes.data, m))
    from scipy.linalg.lapack import dgbsv

    _, _, solution, info = dgbsv(below, above, band, rhs, overwrite_ab=1, overwrite_b=1)
    rhs[...] = solution
    return int(info)
