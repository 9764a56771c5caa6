"""NRTL with user parameters (properties/activity.py): against an independent implementation,
Gibbs-Duhem, anchoring to a Henry's constant, and the derivatives the Newton solver uses.

Every NRTL parameter here is invented for the test (not fitted to any data).
"""

import numpy as np
import pytest
from thermo.nrtl import NRTL

from traywise.errors import InputError
from traywise.properties.activity import Nrtl
from traywise.properties.constants import GAS_CONSTANT, P_STANDARD
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

WATER, ACETONE, METHANOL = (find_component(n) for n in ("water", "acetone", "methanol"))
NAMES = ("water", "acetone", "methanol")
A = np.array([[0.0, 0.6, -0.4], [1.2, 0.0, 0.3], [0.9, -0.2, 0.0]])  # invented
B = np.array([[0.0, 450.0, 120.0], [-150.0, 0.0, 60.0], [-80.0, 90.0, 0.0]])  # invented [K]
ALPHA = np.array([[0.0, 0.3, 0.25], [0.3, 0.0, 0.2], [0.25, 0.2, 0.0]])  # invented
X = np.array([[0.7, 0.2, 0.1], [0.2, 0.5, 0.3], [0.05, 0.15, 0.8]])
T = np.array([290.0, 320.0, 350.0])


def test_nrtl_matches_an_independent_implementation():
    """The same equations (H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135) as coded in
    thermo 0.6.1 (C. Bell et al.): ln gamma and d ln gamma/dT to rounding, the second
    temperature derivative and the composition derivative against central differences."""
    model = Nrtl(NAMES, A, B, ALPHA, source="invented for the test")
    ours = model.evaluate(X, T, composition_derivative=True, infinite_dilution_in=0)

    def theirs(t, x):
        return NRTL(T=t, xs=list(x), tau_as=A.tolist(), tau_bs=B.tolist(), alpha_cs=ALPHA.tolist())

    for j in range(3):
        reference = theirs(T[j], X[j])
        assert ours.ln_gamma[j] == pytest.approx(np.log(reference.gammas()), abs=1e-13)
        assert ours.dln_gamma_dt[j] == pytest.approx(np.array(reference.dlngammas_dT()), abs=1e-13)
        h = 1e-3  # K; central difference of thermo's analytic first derivative, truncation ~1e-11
        second = (np.array(theirs(T[j] + h, X[j]).dlngammas_dT()) - np.array(theirs(T[j] - h, X[j]).dlngammas_dT())) / (2 * h)
        assert ours.d2ln_gamma_dt2[j] == pytest.approx(second, abs=1e-10)
        for k in range(3):  # the formula as written, x_k alone perturbed
            up, down = X[j].copy(), X[j].copy()
            up[k] += 1e-7
            down[k] -= 1e-7
            numeric = (np.log(theirs(T[j], up).gammas()) - np.log(theirs(T[j], down).gammas())) / 2e-7
            assert ours.dln_gamma_dx[j, :, k] == pytest.approx(numeric, abs=1e-7)
        dilute = theirs(T[j], [1.0 - 2e-13, 1e-13, 1e-13])
        assert ours.infinite[0][j, 1:] == pytest.approx(np.log(dilute.gammas())[1:], abs=1e-10)


def test_nrtl_obeys_gibbs_duhem():
    """sum_i x_i d ln gamma_i = 0 along any change of composition (a Gibbs-energy model)."""
    result = Nrtl(NAMES, A, B, ALPHA, source="invented").evaluate(X, T, composition_derivative=True)
    tangent = np.array([0.3, -0.1, -0.2])  # sums to zero: stays on the simplex
    assert np.einsum("ni,nij,j->n", X, result.dln_gamma_dx, tangent) == pytest.approx(0.0, abs=1e-13)


def anchored_model():
    return PropertyModel([WATER, ACETONE, METHANOL], equilibrium=["raoult", "activity", "activity"],
                         activity=Nrtl(NAMES, A, B, ALPHA, source="invented for the test"))


def test_anchored_nrtl_reproduces_the_henry_constant_and_its_enthalpy():
    model = anchored_model()
    t = np.array([280.0, 300.0, 330.0])
    dilute = model.evaluate(t, np.full(3, P_STANDARD))
    henry = PropertyModel([WATER, ACETONE, METHANOL], equilibrium=["raoult", "henry", "henry"]).evaluate(t, np.full(3, P_STANDARD))
    assert dilute.k[:, 1:] == pytest.approx(henry.k[:, 1:], rel=1e-12)
    assert dilute.h_liquid[:, 1:] == pytest.approx(henry.h_liquid[:, 1:], rel=1e-12)


def test_anchored_nrtl_is_consistent_and_its_composition_derivative_is_right():
    model = anchored_model()
    x = np.array([[0.9, 0.06, 0.04], [0.4, 0.35, 0.25], [0.1, 0.6, 0.3]])
    p = np.full(3, P_STANDARD)
    props = model.evaluate(T, p, x)
    inverse, step = 1.0 / T, 1e-7
    numeric = (np.log(model.evaluate(1.0 / (inverse + step), p, x).k) - np.log(model.evaluate(1.0 / (inverse - step), p, x).k)) / (2 * step)
    identity = -(props.h_vapour - props.h_liquid) / GAS_CONSTANT
    assert numeric[:, 1:] == pytest.approx(identity[:, 1:], rel=1e-6)  # central differences: ~1e-9
    for j in range(3):
        up, down = x.copy(), x.copy()
        up[:, j] += 1e-7
        down[:, j] -= 1e-7
        derivative = (np.log(model.evaluate(T, p, up).k) - np.log(model.evaluate(T, p, down).k)) / 2e-7
        assert props.dlnk_dx[:, :, j] == pytest.approx(derivative, rel=1e-6, abs=1e-7)


@pytest.mark.parametrize(
    "a, b, alpha, message",
    [
        (A[:2, :2], B, ALPHA, "expected a finite 3 x 3 matrix"),
        (A + np.eye(3), B, ALPHA, "tau_ii must be zero"),
        (A, B, ALPHA + np.triu(np.ones((3, 3)), 1) * 0.1, "alpha_ij must equal alpha_ji"),
    ],
)
def test_bad_nrtl_parameters_are_refused(a, b, alpha, message):
    with pytest.raises(InputError, match=message):
        Nrtl(NAMES, a, b, alpha, source="invented")
