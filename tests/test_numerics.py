"""Brent's root finder and bounded minimiser (traywise.numerics) against scipy.optimize, the
reference implementation of the same published algorithms (brentq, fminbound)."""

import math

import pytest
from scipy.optimize import brentq, minimize_scalar

from traywise.numerics import brent_minimum, brent_root

FUNCTIONS = [
    (lambda x: math.cos(x) - x, 0.0, 1.0),
    (lambda x: x**3 - 2.0 * x - 5.0, 2.0, 3.0),  # Wallis's cubic
    (lambda x: math.exp(x) - 1e6, 0.0, 50.0),
    (lambda x: math.atan(x - 0.3) * 1e-9, -40.0, 40.0),
    (lambda x: (x - 1e-3) ** 3, -1.0, 1.0),  # triple root: slow for interpolation
    (lambda x: 1.0 if x > 0.123456 else -1.0, -1.0, 1.0),  # a step: bisection only
]


@pytest.mark.parametrize("f, a, b", FUNCTIONS)
def test_root_agrees_with_scipy(f, a, b):
    ours = brent_root(f, a, b, xtol=1e-14, rtol=1e-15, maxiter=3000)
    theirs = brentq(f, a, b, xtol=1e-14, rtol=1e-15, maxiter=3000)
    assert ours == pytest.approx(theirs, abs=1e-13)
    assert ours == pytest.approx(brent_root(f, b, a, xtol=1e-14, rtol=1e-15, maxiter=3000), abs=1e-13)  # either order


def test_root_needs_a_sign_change_and_finds_exact_ends():
    with pytest.raises(ValueError, match="same sign"):
        brent_root(lambda x: x * x + 1.0, -1.0, 1.0)
    assert brent_root(lambda x: x - 2.0, 2.0, 5.0) == 2.0
    with pytest.raises(RuntimeError):
        brent_root(lambda x: math.exp(x) - 2.0, 0.0, 1.0, xtol=0.0, rtol=0.0, maxiter=2)


@pytest.mark.parametrize(
    "f, a, b",
    [
        (lambda x: (x - 0.7) ** 2, 0.0, 2.0),
        (lambda x: -math.sin(x), 0.0, 3.0),
        (lambda x: x**4 - 3.0 * x**3 + 2.0, 0.5, 4.0),
        (lambda x: abs(x - 0.25), 0.0, 1.0),  # a kink: golden section only
    ],
)
def test_minimum_agrees_with_scipy(f, a, b):
    x, fx = brent_minimum(f, a, b, xatol=1e-10)
    reference = minimize_scalar(f, bounds=(a, b), method="bounded", options={"xatol": 1e-10})
    assert x == pytest.approx(reference.x, abs=1e-7)
    assert fx == pytest.approx(reference.fun, abs=1e-8)
    assert fx == f(x)
