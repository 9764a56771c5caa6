"""Block-tridiagonal linear systems solved as one banded LAPACK call (cost linear in stages).

The unknowns (and equations) of every stage may be reordered before banding, the same
permutation for rows and columns so that the diagonal stays the diagonal. For the MESH blocks,
ordering each stage as (v, T, l) against rows (E, H, M) gives band widths of n = 2c+1 below and
n (n + c - 1 with Murphree efficiencies below one) above, instead of 2n - 1 on both sides:
about three times fewer operations in the factorisation.

``BandedSystem`` keeps one Fortran-ordered band storage, right-hand side and pivot array for a
column and refills them in place each Newton step; LAPACK's dgbsv factorises and solves in that
storage (``lapack.py``), so nothing is copied or allocated per step beyond the gathered
block entries (scipy.linalg.solve_banded copies its input, and a fresh C-ordered array is copied
again to Fortran order by the LAPACK wrapper: at 320 stages that costs as much as the
factorisation).
"""

import numpy as np

from ..errors import ConvergenceError
from .lapack import solve_banded_in_place


class BandedSystem:
    """The block-tridiagonal system of one column in LAPACK band storage.

    Parameters
    ----------
    n_stages, n : int            Stages and unknowns per stage (blocks are (N, n, n))
    band : (int, int)            (below, above) widths that hold every non-zero entry after the
                                 per-stage permutation (entries outside are dropped, so they
                                 must be zero)
    order : sequence of int      Per-stage permutation applied before banding
    row_scale, unknown_scale : array (n,), optional   The system solved is
                                 (D_r^-1 J D_u + shift I) y = D_r^-1 rhs, x = D_u y
    """

    def __init__(self, n_stages, n, band, order, row_scale=None, unknown_scale=None):
        below, above = band
        self.below, self.above = below, above
        size = n_stages * n
        self.storage = np.zeros((2 * below + above + 1, size), order="F")
        self.rhs = np.empty(size)
        self.pivots = np.empty(size, dtype=np.int64)
        self._flat = self.storage.T.reshape(-1)  # a view: flat index = column * rows + row
        inverse = np.empty(n, dtype=int)
        inverse[list(order)] = np.arange(n)
        a, b = np.meshgrid(inverse, inverse, indexing="ij")  # permuted row, column of entry (a, b)
        rows = self.storage.shape[0]
        row_scale = np.ones(n) if row_scale is None else np.asarray(row_scale, dtype=float)
        unknown_scale = np.ones(n) if unknown_scale is None else np.asarray(unknown_scale, dtype=float)
        scale = unknown_scale[None, :] / row_scale[:, None]

        def entries(stages, shift):
            offset = shift * n + b - a  # column minus row in the permuted matrix
            mask = (offset <= above) & (offset >= -below)
            row = stages[:, None] * n + a[mask]
            col = (stages[:, None] + shift) * n + b[mask]
            return (col * rows + below + above + row - col).ravel(), mask, scale[mask]

        stages = np.arange(n_stages)
        self._lower = entries(stages[1:], -1)
        self._diagonal = entries(stages, 0)
        self._upper = entries(stages[:-1], 1)
        # in-band entries that no block holds (two stages apart) are zero; the factorisation
        # overwrites them, so they are cleared before each fill
        col = np.arange(size)[:, None]
        row = col + np.arange(-above, below + 1)[None, :]
        inside = (row >= 0) & (row < size)
        in_band = np.zeros(self._flat.size, dtype=bool)
        in_band[(col * rows + below + above + row - col)[inside]] = True
        in_band[np.concatenate([self._lower[0], self._diagonal[0], self._upper[0]])] = False
        self._unheld = np.flatnonzero(in_band)
        self.permutation = (stages[:, None] * n + np.asarray(order)[None, :]).ravel()
        self._row_scale = np.tile(row_scale, n_stages)
        self._unknown_scale = np.tile(unknown_scale, n_stages)

    def solve(self, lower, diagonal, upper, rhs, diagonal_shift=0.0):
        """x with (J + shift D_r D_u^-1) x = rhs for the blocks of J (see class docstring):
        lower[j] couples stage j to j-1 (lower[0] unused), upper[j] stage j to j+1."""
        flat = self._flat
        flat[self._unheld] = 0.0
        positions, mask, scale = self._diagonal
        flat[positions] = (diagonal[:, mask] * scale).ravel()
        if diagonal.shape[0] > 1:
            positions, mask, scale = self._lower
            flat[positions] = (lower[1:, mask] * scale).ravel()
            positions, mask, scale = self._upper
            flat[positions] = (upper[:-1, mask] * scale).ravel()
        if diagonal_shift:
            self.storage[self.below + self.above] += diagonal_shift
        self.rhs[:] = (rhs / self._row_scale)[self.permutation]
        if solve_banded_in_place(self.below, self.above, self.storage, self.rhs, self.pivots) > 0:
            raise ConvergenceError("singular stage Jacobian", iterations=0, residual=np.inf)
        solution = np.empty_like(self.rhs)
        solution[self.permutation] = self.rhs
        return solution * self._unknown_scale
