"""Components stated in a few numbers, and library components with one property replaced.

The numbers here are invented for the test (demo values, not data); each check is that the
model reproduces exactly what it was given.
"""

import dataclasses
import math

import numpy as np
import pytest

from traywise.properties.constants import GAS_CONSTANT, P_STANDARD
from traywise.properties.inline import henry_from_reference, inline_component, vapour_pressure_from_reference
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

H_REFERENCE = 3.0e6  # Pa, invented
T_HENRY = 293.15  # K
SOLUTION_ENTHALPY = -25_000.0  # J/mol, invented
P_REFERENCE = 12_000.0  # Pa, invented
T_VAPOUR = 310.0  # K
LATENT_HEAT = 40_000.0  # J/mol, invented


@pytest.fixture
def solute():
    return inline_component("demo solute", molar_mass=0.05, ideal_gas_cp=[30.0, 0.02], equilibrium="henry",
                            henry=(H_REFERENCE, T_HENRY, SOLUTION_ENTHALPY))


@pytest.fixture
def solvent():
    return inline_component("demo solvent", molar_mass=0.1, ideal_gas_cp=80.0, equilibrium="raoult",
                            vapour_pressure=(P_REFERENCE, T_VAPOUR), heat_of_vaporisation=LATENT_HEAT,
                            liquid_cp=150.0)


def test_inline_components_make_a_working_model(solute, solvent):
    model = PropertyModel([solute, solvent])
    stages = model.evaluate([290.0, 300.0, 310.0], [P_STANDARD] * 3)
    for array in (stages.k, stages.h_vapour, stages.h_liquid, stages.dh_vapour_dt, stages.dh_liquid_dt):
        assert array.shape == (3, 2) and np.all(np.isfinite(array))
    assert np.allclose(stages.dh_vapour_dt[:, 0], 30.0 + 0.02 * np.array([290.0, 300.0, 310.0]))
    assert np.allclose(stages.dh_liquid_dt[:, 1], 150.0)


def test_henry_from_reference_reproduces_its_inputs(solute):
    henry = solute.henry_in_water
    assert math.exp(henry.ln_constant(T_HENRY)[0]) == pytest.approx(H_REFERENCE, rel=1e-12)
    for temperature in (280.0, T_HENRY, 340.0):
        assert henry.solution_enthalpy(temperature) == pytest.approx(SOLUTION_ENTHALPY, rel=1e-12)
    k = PropertyModel([solute]).evaluate([T_HENRY], [P_STANDARD]).k[0, 0]
    assert k == pytest.approx(H_REFERENCE / P_STANDARD, rel=1e-12)


def test_vapour_pressure_from_reference_reproduces_its_inputs(solvent):
    for correlation in (vapour_pressure_from_reference(P_REFERENCE, T_VAPOUR, LATENT_HEAT), solvent.vapour_pressure):
        ln_p, dln_p_dt = correlation.ln_pressure(T_VAPOUR)
        assert math.exp(ln_p) == pytest.approx(P_REFERENCE, rel=1e-12)
        assert GAS_CONSTANT * T_VAPOUR**2 * dln_p_dt == pytest.approx(LATENT_HEAT, rel=1e-12)  # Clausius-Clapeyron
    k = PropertyModel([solvent]).evaluate([T_VAPOUR], [P_STANDARD]).k[0, 0]
    assert k == pytest.approx(P_REFERENCE / P_STANDARD, rel=1e-12)


def test_replacing_a_library_property_gives_a_working_model():
    library_so2 = find_component("SO2")
    plant_fit = henry_from_reference(H_REFERENCE, T_HENRY, SOLUTION_ENTHALPY)
    so2 = dataclasses.replace(library_so2, henry_in_water=plant_fit)
    water = find_component("water")
    stages = PropertyModel([water, so2]).evaluate([T_HENRY], [P_STANDARD])
    assert stages.k[0, 1] == pytest.approx(H_REFERENCE / P_STANDARD, rel=1e-12)
    # Everything not replaced is the library's.
    assert so2.ideal_gas_cp == library_so2.ideal_gas_cp and so2.molar_mass == library_so2.molar_mass
    h_solution = stages.h_liquid[0, 1] - stages.h_vapour[0, 1]
    assert h_solution == pytest.approx(SOLUTION_ENTHALPY, rel=1e-12)
