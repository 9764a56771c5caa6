"""Hydrocarbon absorption oil described by the Peng-Robinson equation in both phases (phi-phi):
K-values against thermo's PRMIX, the van 't Hoff identity with residual enthalpies on both sides,
composition derivatives, and the dilute isothermal column against Kremser's equation."""

import numpy as np
import pytest
from thermo import PRMIX

from traywise.column import Column, Feed
from traywise.inert_basis.kremser import kremser_fraction_absorbed
from traywise.mesh.newton import solve_column
from traywise.properties.binary import kij_matrix
from traywise.properties.constants import GAS_CONSTANT
from traywise.properties.gas_phase import GasPhase
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

OIL = ["n-hexadecane", "methane", "ethane", "propane", "n-butane"]


def oil_model(names=OIL, kinds=None, gas=None):
    components = [find_component(n) for n in names]
    model = PropertyModel(components, kinds or ["eos"] * len(names))
    gas = np.array([0.0, 0.85, 0.08, 0.05, 0.02]) if gas is None else np.asarray(gas, dtype=float)
    kij, _ = kij_matrix(components)
    model.gas_phase = GasPhase(components, model.equilibrium, gas, kij, np.zeros(len(names)))
    return model, components, kij


def test_k_values_are_phi_liquid_over_phi_vapour_of_thermo():
    model, components, kij = oil_model()
    x = np.array([[0.80, 0.08, 0.04, 0.05, 0.03], [0.70, 0.12, 0.06, 0.07, 0.05]])
    t, p = np.array([303.15, 318.15]), np.array([20e5, 30e5])
    y = np.array([0.0, 0.85, 0.08, 0.05, 0.02])
    k = model.evaluate(t, p, x).k
    constants = {key: [getattr(c, key).value for c in components]
                 for key in ("critical_temperature", "critical_pressure", "acentric_factor")}
    for j in range(2):
        liquid = PRMIX(Tcs=constants["critical_temperature"], Pcs=constants["critical_pressure"],
                       omegas=constants["acentric_factor"], zs=list(x[j]), kijs=kij.tolist(), T=t[j], P=p[j])
        vapour = PRMIX(Tcs=constants["critical_temperature"], Pcs=constants["critical_pressure"],
                       omegas=constants["acentric_factor"], zs=list(y + 1e-12), kijs=kij.tolist(), T=t[j], P=p[j])
        expected = np.exp(np.array(liquid.lnphis_l) - np.array(vapour.lnphis_g))
        assert k[j] == pytest.approx(expected, rel=1e-7)


@pytest.mark.parametrize("temperature", [288.15, 313.15])
def test_van_t_hoff_identity_with_residual_enthalpies_in_both_phases(temperature):
    model, _, _ = oil_model()
    x = np.array([[0.85, 0.05, 0.03, 0.04, 0.03]])
    p = np.array([20e5])
    step = 1e-5 / temperature

    def ln_k(inverse):
        return np.log(model.evaluate([1.0 / inverse], p, x).k[0])

    slope = (ln_k(1 / temperature + step) - ln_k(1 / temperature - step)) / (2 * step)
    props = model.evaluate([temperature], p, x)
    assert slope == pytest.approx(-(props.h_vapour[0] - props.h_liquid[0]) / GAS_CONSTANT, rel=1e-5)
    h = 1e-2
    up, down = model.evaluate([temperature + h], p, x), model.evaluate([temperature - h], p, x)
    assert props.dh_liquid_dt[0] == pytest.approx((up.h_liquid[0] - down.h_liquid[0]) / (2 * h), rel=1e-4)


def test_composition_derivative_matches_differences_along_the_simplex():
    model, _, _ = oil_model()
    x = np.array([0.85, 0.05, 0.03, 0.04, 0.03])
    direction = np.array([-0.3, 0.1, 0.05, 0.1, 0.05])  # sums to zero
    props = model.evaluate([303.15], [20e5], x[None, :])
    h = 1e-5
    plus = np.log(model.evaluate([303.15], [20e5], (x + h * direction)[None, :]).k[0])
    minus = np.log(model.evaluate([303.15], [20e5], (x - h * direction)[None, :]).k[0])
    assert props.dlnk_dx[0] @ direction == pytest.approx((plus - minus) / (2 * h), rel=1e-4, abs=1e-8)


@pytest.mark.parametrize("n_stages, absorption_factor", [(4, 0.8), (8, 1.4)])
def test_dilute_isothermal_column_follows_kremser(n_stages, absorption_factor):
    # trace propane in an insoluble methane carrier, taken up by the oil at 30 degC and 10 bar
    names = ["n-hexadecane", "methane", "propane"]
    gas = np.array([0.0, 1.0, 1e-5])
    model, _, _ = oil_model(names, ["eos", "insoluble", "eos"], gas)
    t, p = 303.15, 10e5
    k = model.evaluate([t], [p]).k[0, 2]  # pure oil, the feed gas: the dilute limit
    oil = absorption_factor * k * gas.sum()
    column = Column(n_stages, Feed(1, "liquid", np.array([oil, 0.0, 0.0]), t), Feed(n_stages, "vapour", gas, t),
                    p, mode="isothermal", temperature=t)
    solution = solve_column(column, model)
    expected = kremser_fraction_absorbed(absorption_factor, n_stages)
    print(f"K = {k:.4f}; absorbed {solution.fraction_absorbed[2]:.6f}, Kremser {expected:.6f}")
    assert solution.fraction_absorbed[2] == pytest.approx(expected, rel=5e-3)
