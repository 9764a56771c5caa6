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
factorisation). Only the block entries that can be non-zero (the equations' pattern: about
half of the in-band ones for the MESH blocks) are gathered, in one take and one scatter over
the three blocks stacked; the rest of the storage is cleared with one fill.
"""

import functools

import numpy as np

from ..errors import ConvergenceError
from .lapack import solve_banded_in_place


@functools.lru_cache(maxsize=16)
def _layout(n_stages, n, below, above, order, pattern):
    """Where the block entries go in LAPACK band storage (2 below + above + 1, N n), flat in
    Fortran order: (positions, taken, masks, permutation). positions index the storage, taken
    the stacked (3, N, n, n) blocks flat, masks (3, n, n) the block entries gathered: in the
    band and in ``pattern`` (flat bools, 3 n n: the entries that can be non-zero); banded
    unknown k is original unknown permutation[k]. Cached: columns of one shape share it
    (design loops, sweeps)."""
    rows = 2 * below + above + 1
    inverse = np.empty(n, dtype=int)
    inverse[list(order)] = np.arange(n)
    a, b = np.meshgrid(inverse, inverse, indexing="ij")  # permuted row, column of entry (a, b)
    within = np.arange(n * n).reshape(n, n)  # flat index of entry (a, b) inside a block
    pattern = np.array(pattern, dtype=bool).reshape(3, n, n)

    def entries(kind, stages, shift):
        offset = shift * n + b - a  # column minus row in the permuted matrix
        mask = (offset <= above) & (offset >= -below) & pattern[kind]
        row = stages[:, None] * n + a[mask]
        col = (stages[:, None] + shift) * n + b[mask]
        taken = ((kind * n_stages + stages[:, None]) * n * n + within[mask]).ravel()
        return (col * rows + below + above + row - col).ravel(), taken, mask

    stages = np.arange(n_stages)
    blocks = (entries(0, stages[1:], -1), entries(1, stages, 0), entries(2, stages[:-1], 1))
    positions = np.concatenate([block[0] for block in blocks])
    taken = np.concatenate([block[1] for block in blocks])
    permutation = (stages[:, None] * n + np.asarray(order)[None, :]).ravel()
    masks = np.array([block[2] for block in blocks])
    return positions, taken, masks, permutation


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
    pattern : bool array (3, n, n), optional   Entries of the lower, diagonal and upper blocks
                                 that can be non-zero (default all); only these are gathered
    """

    def __init__(self, n_stages, n, band, order, row_scale=None, unknown_scale=None, pattern=None):
        below, above = (int(w) for w in band)
        self.below, self.above = below, above
        size = n_stages * n
        self.storage = np.zeros((2 * below + above + 1, size), order="F")
        self.rhs = np.empty(size)
        self.pivots = np.empty(size, dtype=np.int64)
        self._flat = self.storage.T.reshape(-1)  # a view: flat index = column * rows + row
        pattern = np.ones((3, n, n), dtype=bool) if pattern is None else np.asarray(pattern, dtype=bool)
        self._positions, self._taken, masks, self.permutation = _layout(
            n_stages, n, below, above, tuple(int(k) for k in order), tuple(pattern.ravel().tolist())
        )
        row_scale = np.ones(n) if row_scale is None else np.asarray(row_scale, dtype=float)
        unknown_scale = np.ones(n) if unknown_scale is None else np.asarray(unknown_scale, dtype=float)
        scale = unknown_scale[None, :] / row_scale[:, None]
        counts = (n_stages - 1, n_stages, n_stages - 1)  # lower[0] and upper[N-1] are not gathered
        self._scale = np.concatenate([np.tile(scale[mask], count) for mask, count in zip(masks, counts)])
        self._gathered = np.empty(self._taken.size)
        self._row_scale = np.tile(row_scale, n_stages)
        self._unknown_scale = np.tile(unknown_scale, n_stages)

    def solve(self, blocks, rhs, diagonal_shift=0.0):
        """x with (J + shift D_r D_u^-1) x = rhs for the blocks of J (see class docstring),
        stacked (3, N, n, n): lower (blocks[0][j] couples stage j to j-1, blocks[0][0] unused),
        diagonal, upper (blocks[2][j] couples stage j to j+1)."""
        self.fill(blocks, diagonal_shift)
        self.rhs[:] = (rhs / self._row_scale)[self.permutation]
        if solve_banded_in_place(self.below, self.above, self.storage, self.rhs, self.pivots) > 0:
            raise ConvergenceError("singular stage Jacobian", iterations=0, residual=np.inf)
        solution = np.empty_like(self.rhs)
        solution[self.permutation] = self.rhs
        return solution * self._unknown_scale

    def fill(self, blocks, diagonal_shift=0.0):
        """Write the scaled, shifted matrix of ``solve`` into the band storage (no factorisation)."""
        self.storage.fill(0.0)  # the factorisation overwrote it, fill-in too
        gathered = np.take(blocks.reshape(-1), self._taken, out=self._gathered)
        gathered *= self._scale
        self._flat[self._positions] = gathered
        if diagonal_shift:
            self.storage[self.below + self.above] += diagonal_shift
