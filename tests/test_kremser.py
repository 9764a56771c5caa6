"""Kremser's equation: hand checks, the stage-by-stage series it sums, a direct linear solution
of the stage balances, the A = 1 limit, and the two inverses.

Reference: A. Kremser, Natl. Petroleum News 22 (1930) 43; the series form and the general
form with solute in the entering solvent as derived in Treybal, Mass-Transfer Operations,
3rd ed. 1980, ch. 5.
"""

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from traywise.errors import InputError
from traywise.inert_basis.kremser import (
    approach_to_equilibrium,
    kremser_absorption_factor,
    kremser_fraction_absorbed,
    kremser_gas_outlet,
    kremser_stages,
)


# (A, N, phi) worked by hand from (A**(N+1) - A) / (A**(N+1) - 1) in exact fractions.
@pytest.mark.parametrize(
    "a, n, exact",
    [
        (2.0, 1, (4 - 2) / (4 - 1)),  # 2/3
        (2.0, 2, (8 - 2) / (8 - 1)),  # 6/7
        (3.0, 1, (9 - 3) / (9 - 1)),  # 3/4
        (0.5, 1, (0.25 - 0.5) / (0.25 - 1)),  # 1/3
        (0.5, 2, (0.125 - 0.5) / (0.125 - 1)),  # 3/7
        (1.0, 3, 3 / 4),  # the A = 1 form N / (N + 1)
    ],
)
def test_fraction_absorbed_matches_hand_values(a, n, exact):
    # A few roundings in expm1 and the division: 1e-14 relative.
    assert kremser_fraction_absorbed(a, n) == pytest.approx(exact, rel=1e-14)
    assert kremser_stages(a, exact) == pytest.approx(n, rel=1e-12)


@pytest.mark.parametrize("a", [0.3, 0.9, 1.0, 1.1, 1.4, 5.0])
@pytest.mark.parametrize("n", [1, 2, 5, 12])
def test_fraction_not_absorbed_is_the_stage_series(a, n):
    # Stage-by-stage derivation for a solute-free solvent: 1 - phi = 1 / (1 + A + ... + A**N).
    series = sum(a**k for k in range(n + 1))
    assert 1.0 - kremser_fraction_absorbed(a, n) == pytest.approx(1.0 / series, rel=1e-12)


@pytest.mark.parametrize("a, n", [(0.7, 3), (1.0, 4), (1.6, 6)])
def test_general_form_matches_a_direct_solution_of_the_stage_balances(a, n):
    # N stages, Y_j = m X_j, inert-basis balance on stage j: L'(X_{j-1} - X_j) + V'(Y_{j+1} - Y_j) = 0,
    # X_0 = X_in, Y_{N+1} = Y_in; solved as a linear system, independent of Kremser's algebra.
    m, v, x_in, y_in = 1.3, 1.0, 0.004, 0.05
    liquid = a * m * v
    matrix = np.zeros((n, n))
    rhs = np.zeros(n)
    for j in range(n):
        matrix[j, j] = -(liquid + v * m)
        if j > 0:
            matrix[j, j - 1] = liquid
        else:
            rhs[j] -= liquid * x_in
        if j < n - 1:
            matrix[j, j + 1] = v * m
        else:
            rhs[j] -= v * y_in
    y_out = m * np.linalg.solve(matrix, rhs)[0]
    kremser = kremser_gas_outlet(y_in, x_in, equilibrium_slope=m, absorption_factor=a, n_stages=n)
    assert kremser == pytest.approx(y_out, rel=1e-12)  # a well-conditioned solve: rounding only
    phi = approach_to_equilibrium(y_in, y_out, liquid_ratio_in=x_in, equilibrium_slope=m)
    assert kremser_stages(a, phi) == pytest.approx(n, rel=1e-9)


def test_limits_of_no_stages_and_infinitely_many():
    assert kremser_fraction_absorbed(1.7, 0) == 0.0
    assert kremser_fraction_absorbed(0.0, 3) == 0.0
    # Infinitely many stages pinch: at the bottom for A < 1 (phi = A), at the top for A > 1 (phi = 1).
    assert kremser_fraction_absorbed(0.6, math.inf) == pytest.approx(0.6, rel=1e-15)
    assert kremser_fraction_absorbed(1.0, math.inf) == 1.0
    assert kremser_fraction_absorbed(2.5, math.inf) == 1.0
    assert kremser_fraction_absorbed(400.0, 200.0) == 1.0  # A**(N+1) overflows the naive form


@pytest.mark.parametrize("n", [1.0, 3.5, 20.0])
@pytest.mark.parametrize("d", [1e-3, -1e-3, 1e-7, -1e-7, 1e-11, -1e-11, 1e-14])
def test_continuous_through_absorption_factor_one(n, d):
    # Taylor expansions about A = 1 (worked by hand from the closed forms, q = 1 / (1 - phi)):
    # phi(1 + d) = N/(N+1) (1 + d/2) + O(d**2), N(1 + d, phi) = q - 1 - q (q - 1) d / 2 + O(d**2).
    # The naive quotient loses about 1e-16 / d here (1e-2 at d = 1e-14); the O(d**2) term bounds the rest.
    phi_one = n / (n + 1.0)
    assert kremser_fraction_absorbed(1.0 + d, n) == pytest.approx(phi_one * (1.0 + d / 2.0), abs=1e-15 + (n * d) ** 2)
    q = 1.0 / (1.0 - phi_one)
    expected = q - 1.0 - q * (q - 1.0) * d / 2.0
    assert kremser_stages(1.0 + d, phi_one) == pytest.approx(expected, abs=1e-12 * q + (q**2 * d) ** 2)


def test_vectorised_over_both_arguments():
    a = np.array([[0.5], [1.0], [2.0]])
    n = np.array([1.0, 2.0])
    phi = kremser_fraction_absorbed(a, n)
    assert phi.shape == (3, 2)
    assert phi[1, 1] == pytest.approx(2.0 / 3.0, rel=1e-15)
    assert np.allclose(kremser_stages(a, phi), np.broadcast_to(n, (3, 2)), rtol=1e-12)
    assert np.allclose(kremser_absorption_factor(n, phi), np.broadcast_to(a, (3, 2)), rtol=1e-12)


@settings(max_examples=300, deadline=None)
@given(a=st.floats(0.2, 5.0), n=st.floats(0.1, 40.0))
def test_stage_count_round_trip(a, n):
    phi = kremser_fraction_absorbed(a, n)
    # Keep phi 1e-6 (relative) short of its limit min(A, 1): closer, rounding of phi (1e-16)
    # becomes a loss of significance of 1e-10 in the remaining approach and grows beyond 1e-9 in N.
    assume(min(a, 1.0) - phi > 1e-6 * min(a, 1.0))
    assert kremser_stages(a, phi) == pytest.approx(n, rel=1e-9, abs=1e-9)


@settings(max_examples=300, deadline=None)
@given(a=st.floats(0.2, 5.0), n=st.floats(0.5, 40.0))
def test_absorption_factor_round_trip(a, n):
    phi = kremser_fraction_absorbed(a, n)
    assume(min(a, 1.0) - phi > 1e-6 * min(a, 1.0))  # as above: A stays resolvable from phi
    assert kremser_absorption_factor(n, phi) == pytest.approx(a, rel=1e-9)


@pytest.mark.parametrize("a, phi", [(0.8, 0.8), (0.8, 0.95), (2.0, 1.0)])
def test_unreachable_fraction_names_the_pinch(a, phi):
    with pytest.raises(InputError, match="pinch makes it impossible"):
        kremser_stages(a, phi)


def test_invalid_arguments_are_refused():
    with pytest.raises(InputError, match="absorption_factor"):
        kremser_fraction_absorbed(-0.5, 2)
    with pytest.raises(InputError, match="n_stages"):
        kremser_fraction_absorbed(1.5, -1)
    with pytest.raises(InputError, match="fraction_absorbed"):
        kremser_absorption_factor(3, 1.0)
    with pytest.raises(InputError, match="gas_ratio_in"):
        approach_to_equilibrium(0.01, 0.005, liquid_ratio_in=0.01, equilibrium_slope=2.0)
