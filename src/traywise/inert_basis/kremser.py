"""Kremser's equation for a counter-current cascade with straight operating and equilibrium lines.

With the equilibrium line Y* = m X and constant flows, the absorption factor A = L / (m V) is
the same on every stage and the stage-to-stage balances solve in closed form. In mole ratios on
an inert basis (L', V' the solute-free flows) this is exact for a straight Y* = m X; in mole
fractions it holds for dilute gases, where the total flows hardly change.

Symbols (docstrings only): A absorption factor [-], N theoretical stages [-], phi the fraction of
the approach to equilibrium that the gas achieves [-]:

    phi = (Y_in - Y_out) / (Y_in - m X_in) = (A**(N+1) - A) / (A**(N+1) - 1)

with Y_in the gas entering at the bottom, Y_out the gas leaving at the top and X_in the liquid
entering at the top. For a solute-free solvent phi is the fraction of the entering solute
absorbed. As N grows phi tends to min(A, 1): a pinch at the bottom (A < 1) or the top (A > 1).

References
----------
A. Kremser, Theoretical analysis of absorption process, Natl. Petroleum News 22 (1930) 43.
M. Souders, G. G. Brown, Fundamental design of absorbing and stripping columns for complex
vapors, Ind. Eng. Chem. 24 (1932) 519.
J. D. Seader, E. J. Henley, D. K. Roper, Separation Process Principles, 3rd ed., Wiley (2011),
ch. 6 (absorption and stripping, the Kremser method).
R. E. Treybal, Mass-Transfer Operations, 3rd ed., McGraw-Hill (1980), ch. 5 and 8.
"""

import numpy as np

from ..errors import InputError
from ..numerics import brent_root

_LARGEST_LN_A = 700.0  # ln A searched up to here (A about 1e304), the float range


def kremser_fraction_absorbed(absorption_factor, n_stages):
    """Kremser's fraction of the approach to equilibrium reached in N theoretical stages.

    phi = (A**(N+1) - A) / (A**(N+1) - 1), and phi = N / (N+1) at A = 1. Evaluated with expm1
    in the form that cannot overflow (A**-N for A > 1), so that it is continuous through A = 1
    to rounding error and finite for any A; N may be fractional or infinite (phi = min(A, 1)).

    Parameters
    ----------
    absorption_factor : array_like   A = L' / (m V'), finite, >= 0 [-]
    n_stages : array_like            Theoretical stages N >= 0, fractional allowed [-]

    Returns
    -------
    float or ndarray   phi = (Y_in - Y_out) / (Y_in - m X_in) [-]; for a solute-free solvent the
    fraction of the entering solute absorbed.

    References
    ----------
    A. Kremser, Natl. Petroleum News 22 (1930) 43; Seader, Henley & Roper, Separation Process
    Principles, 3rd ed., Wiley 2011, ch. 6.
    """
    a, n = np.broadcast_arrays(np.asarray(absorption_factor, dtype=float), np.asarray(n_stages, dtype=float))
    _require(np.isfinite(a) & (a >= 0.0), "absorption_factor", "a finite number >= 0", a)
    _require(n >= 0.0, "n_stages", "a number of stages >= 0", n)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        ln_a = np.log(a)
        above = np.expm1(-n * ln_a) / np.expm1(-(n + 1.0) * ln_a)  # A > 1, written in A**-N
        below = a * np.expm1(n * ln_a) / np.expm1((n + 1.0) * ln_a)  # A < 1
        at_one = 1.0 - 1.0 / (n + 1.0)
    phi = np.where(ln_a > 0.0, above, np.where(ln_a < 0.0, below, at_one))
    return _plain(np.where(n == 0.0, 0.0, phi))


def _fraction_left(absorption_factor, n_stages):
    """1 - phi = (A - 1) / (A**(N+1) - 1), and 1 / (N+1) at A = 1, formed without the difference
    1 - phi: where phi rounds to 1 (A**N beyond 1e16) the gas outlet stays its tiny true value
    instead of an exact zero. Arguments as for ``kremser_fraction_absorbed``."""
    a, n = np.broadcast_arrays(np.asarray(absorption_factor, dtype=float), np.asarray(n_stages, dtype=float))
    _require(np.isfinite(a) & (a >= 0.0), "absorption_factor", "a finite number >= 0", a)
    _require(n >= 0.0, "n_stages", "a number of stages >= 0", n)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore", under="ignore"):
        ln_a = np.log(a)
        above = np.expm1(-ln_a) * np.exp(-n * ln_a) / np.expm1(-(n + 1.0) * ln_a)  # A > 1, in A**-N
        below = np.expm1(ln_a) / np.expm1((n + 1.0) * ln_a)  # A < 1
        at_one = 1.0 / (n + 1.0)
    left = np.where(ln_a > 0.0, above, np.where(ln_a < 0.0, below, at_one))
    return np.where(n == 0.0, 1.0, np.where(np.isinf(n) & (ln_a > 0.0), 0.0, left))


def kremser_stages(absorption_factor, fraction_absorbed):
    """Theoretical stages for a given approach to equilibrium (Kremser's equation inverted).

    N = ln((A - phi) / (1 - phi)) / ln A - 1, and N = phi / (1 - phi) at A = 1; both logarithms
    are taken with log1p of (A - 1) so that N is continuous through A = 1.

    Parameters
    ----------
    absorption_factor : array_like   A > 0 [-]
    fraction_absorbed : array_like   phi, 0 <= phi < min(A, 1) [-]

    Returns
    -------
    float or ndarray   N, fractional [-]

    Raises
    ------
    InputError   when phi >= A (A < 1) or phi >= 1: no number of stages reaches it, because the
    operating line pinches the equilibrium line at the bottom (or top) of the column.

    References
    ----------
    A. Kremser, Natl. Petroleum News 22 (1930) 43; Treybal, Mass-Transfer Operations, 3rd ed.
    1980, ch. 5 (the Kremser equation solved for N).
    """
    a, phi = np.broadcast_arrays(np.asarray(absorption_factor, dtype=float), np.asarray(fraction_absorbed, dtype=float))
    _require(np.isfinite(a) & (a > 0.0), "absorption_factor", "a finite number > 0", a)
    _require(phi >= 0.0, "fraction_absorbed", "a fraction >= 0", phi)
    unreachable = phi >= np.minimum(a, 1.0)
    if np.any(unreachable):
        i = np.flatnonzero(unreachable.ravel())[0]
        raise InputError(
            "fraction_absorbed",
            f"{phi.ravel()[i]:.6g} cannot be reached with absorption factor {a.ravel()[i]:.6g}: even infinitely "
            f"many stages absorb at most min(A, 1) = {min(a.ravel()[i], 1.0):.6g} (a pinch makes it impossible); "
            "raise the solvent flow or lower the target",
        )
    d = a - 1.0
    with np.errstate(divide="ignore", invalid="ignore"):
        n = np.log1p(d / (1.0 - phi)) / np.log1p(d) - 1.0
    return _plain(np.where(d == 0.0, phi / (1.0 - phi), n))


def kremser_absorption_factor(n_stages, fraction_absorbed):
    """Absorption factor that reaches phi in N stages (Kremser's equation inverted for A).

    phi(A) rises monotonically from 0 (A = 0) to 1 (A -> infinity) at fixed N > 0, so the root
    in ln A is bracketed and found by Brent's method to machine precision.

    Parameters
    ----------
    n_stages : array_like            N > 0, fractional allowed [-]
    fraction_absorbed : array_like   0 < phi < 1 [-]

    Returns
    -------
    float or ndarray   A [-]

    References
    ----------
    A. Kremser, Natl. Petroleum News 22 (1930) 43; R. P. Brent, Algorithms for Minimization
    without Derivatives, Prentice-Hall (1973), ch. 4 (the root finder).
    """
    n, phi = np.broadcast_arrays(np.asarray(n_stages, dtype=float), np.asarray(fraction_absorbed, dtype=float))
    _require(np.isfinite(n) & (n > 0.0), "n_stages", "a finite number of stages > 0", n)
    _require((phi > 0.0) & (phi < 1.0), "fraction_absorbed", "a fraction between 0 and 1 (exclusive)", phi)
    result = np.empty(n.shape)
    for index in np.ndindex(n.shape):
        result[index] = _absorption_factor(float(n[index]), float(phi[index]))
    return _plain(result)


def kremser_gas_outlet(gas_ratio_in, liquid_ratio_in, *, equilibrium_slope, absorption_factor, n_stages):
    """Gas leaving the top of N stages when the entering solvent already carries solute.

    Y_out = Y_in - phi(A, N) (Y_in - m X_in), Kremser's equation in its general form.

    Parameters
    ----------
    gas_ratio_in : array_like        Y_in, solute per inert gas entering at the bottom [mol/mol]
    liquid_ratio_in : array_like     X_in, solute per solute-free solvent entering at the top [mol/mol]
    equilibrium_slope : array_like   m in Y* = m X [-]
    absorption_factor : array_like   A = L' / (m V') [-]
    n_stages : array_like            N [-]

    Returns
    -------
    float or ndarray   Y_out [mol/mol]

    References
    ----------
    A. Kremser, Natl. Petroleum News 22 (1930) 43; Treybal, Mass-Transfer Operations, 3rd ed.
    1980, ch. 5 (solvent entering with solute).
    """
    in_equilibrium = np.multiply(equilibrium_slope, liquid_ratio_in)
    return _plain(in_equilibrium + _fraction_left(absorption_factor, n_stages) * (gas_ratio_in - in_equilibrium))


def approach_to_equilibrium(gas_ratio_in, gas_ratio_out, *, liquid_ratio_in, equilibrium_slope):
    """Fraction of the approach to equilibrium, phi = (Y_in - Y_out) / (Y_in - m X_in) [-].

    The quantity Kremser's equation gives; pass it to ``kremser_stages``. Ratios as in
    ``kremser_gas_outlet`` [mol/mol]; ``equilibrium_slope`` m [-].

    References
    ----------
    A. Kremser, Natl. Petroleum News 22 (1930) 43.
    """
    equilibrium_gas = np.multiply(equilibrium_slope, liquid_ratio_in)
    _require(
        np.asarray(gas_ratio_in) > equilibrium_gas,
        "gas_ratio_in",
        "a gas richer than the gas in equilibrium with the entering solvent (m X_in)",
        gas_ratio_in,
    )
    return _plain(np.subtract(gas_ratio_in, gas_ratio_out) / np.subtract(gas_ratio_in, equilibrium_gas))


def _absorption_factor(n, phi):
    """Scalar root of phi(A, n) = phi in s = ln A; the bracket starts at A = phi, where phi(A) < A."""
    def residual(s):
        return float(kremser_fraction_absorbed(np.exp(s), n)) - phi

    low = np.log(phi)
    high = max(1.0, low + 1.0)
    while residual(high) < 0.0:
        if high > _LARGEST_LN_A:
            raise InputError(
                "fraction_absorbed",
                f"{phi!r} in {n:g} stages needs an absorption factor beyond 1e304; use more stages or a lower target",
            )
        high *= 2.0
    return float(np.exp(brent_root(residual, low, high, xtol=1e-15, rtol=4.0 * np.finfo(float).eps, maxiter=200)))


def _require(condition, name, expected, values):
    """Raise naming the argument and its first offending value unless condition holds everywhere."""
    condition = np.asarray(condition)
    if not np.all(condition):
        found = np.broadcast_to(np.asarray(values, dtype=float), condition.shape)[~condition].flat[0]
        raise InputError(name, f"expected {expected}, found {found:.6g}")


def _plain(value):
    """A 0-d result as a Python float, otherwise the array."""
    value = np.asarray(value, dtype=float)
    return float(value) if value.ndim == 0 else value
