"""PropertyModel.evaluate (stacked, vectorised) against the per-component correlation functions
of traywise.properties.correlations, one component at a time: same numbers to rounding."""

import dataclasses

import numpy as np
import pytest
from scipy.integrate import quad

from traywise.properties.component import HenryConstant
from traywise.properties.constants import P_STANDARD, T_REFERENCE
from traywise.properties.library import library
from traywise.properties.model import PropertyModel

COMPONENTS = list(library().values())
TEMPERATURES = np.linspace(270.0, 380.0, 12)
# Invented six-term Henry's constant (demo values, not data), so that every term c..f is exercised.
SIX_TERMS = HenryConstant((120.0, -9000.0, -15.0, 0.01, 2.0e5, -1.0e-5), 273.15, 373.15, "user")


def evaluate_each(component, kind):
    return PropertyModel([component], equilibrium=[kind]).evaluate(TEMPERATURES, np.full_like(TEMPERATURES, P_STANDARD))


def test_all_components_together_equal_each_alone():
    together = PropertyModel(COMPONENTS).evaluate(TEMPERATURES, np.full_like(TEMPERATURES, P_STANDARD))
    for i, component in enumerate(COMPONENTS):
        alone = evaluate_each(component, component.equilibrium)
        for name in ("k", "dlnk_dt", "h_vapour", "dh_vapour_dt", "h_liquid", "dh_liquid_dt"):
            assert getattr(together, name)[:, i] == pytest.approx(getattr(alone, name)[:, 0], rel=1e-13, abs=1e-9)


@pytest.mark.parametrize("component", [c for c in COMPONENTS if c.henry_in_water] + ["six terms"],
                         ids=[c.name for c in COMPONENTS if c.henry_in_water] + ["six terms"])
def test_henry_components_match_their_correlation(component):
    if component == "six terms":
        component = dataclasses.replace(library()["nitrogen"], henry_in_water=SIX_TERMS)
    stages = evaluate_each(component, "henry")
    ln_h, dln_h = component.henry_in_water.ln_constant(TEMPERATURES)
    assert np.log(stages.k[:, 0] * P_STANDARD) == pytest.approx(ln_h, rel=1e-13)
    assert stages.dlnk_dt[:, 0] == pytest.approx(dln_h, rel=1e-12)
    solution = component.henry_in_water.solution_enthalpy(TEMPERATURES)
    assert stages.h_liquid[:, 0] - stages.h_vapour[:, 0] == pytest.approx(solution, rel=1e-12)


@pytest.mark.parametrize("component", COMPONENTS, ids=[c.name for c in COMPONENTS])
def test_heat_capacities_and_enthalpies_match_their_polynomials(component):
    kind = "nonvolatile" if component.equilibrium == "nonvolatile" else (
        "raoult" if component.liquid_cp is not None else "henry")
    stages = evaluate_each(component, kind)
    gas = component.ideal_gas_cp
    assert stages.dh_vapour_dt[:, 0] == pytest.approx(gas.heat_capacity(TEMPERATURES), rel=1e-12)
    for t, h in zip(TEMPERATURES, stages.h_vapour[:, 0]):
        assert h == pytest.approx(quad(gas.heat_capacity, T_REFERENCE, t)[0], rel=1e-9, abs=1e-8)
    if component.liquid_cp is not None:
        assert stages.dh_liquid_dt[:, 0] == pytest.approx(component.liquid_cp.heat_capacity(TEMPERATURES), rel=1e-12)
