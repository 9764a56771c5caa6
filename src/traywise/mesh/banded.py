"""Block-tridiagonal linear systems solved as one banded LAPACK call (cost linear in stages)."""

import functools

import numpy as np
from scipy.linalg import solve_banded


@functools.lru_cache(maxsize=32)
def _band_indices(n_stages, n):
    """Flat positions in banded storage (u = l = 2n - 1) of every block entry.

    Returns (positions of lower blocks 1.., diagonal blocks, upper blocks ..N-1), each a flat
    index into the (4n - 1, N n) band array, ordered like the blocks' own ravel().
    """
    width = 2 * n - 1
    columns = n_stages * n
    a, b = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")

    def positions(stages, shift):
        rows = stages[:, None, None] * n + a
        cols = (stages[:, None, None] + shift) * n + b
        return ((width + rows - cols) * columns + cols).ravel()

    stages = np.arange(n_stages)
    return positions(stages[1:], -1), positions(stages, 0), positions(stages[:-1], 1)


def solve_block_tridiagonal(lower, diagonal, upper, rhs, diagonal_shift=0.0):
    """Solve the block-tridiagonal system (blocks (N, n, n)) plus ``diagonal_shift`` * I.

    lower[j] couples stage j to j-1 (lower[0] unused); upper[j] couples j to j+1.
    """
    n_stages, n, _ = diagonal.shape
    width = 2 * n - 1
    band = np.zeros((2 * width + 1, n_stages * n))
    flat = band.reshape(-1)
    low, mid, up = _band_indices(n_stages, n)
    flat[mid] = diagonal.ravel()
    if n_stages > 1:
        flat[low] = lower[1:].ravel()
        flat[up] = upper[:-1].ravel()
    if diagonal_shift:
        band[width] += diagonal_shift
    return solve_banded((width, width), band, rhs, overwrite_ab=True, check_finite=False)
