"""The isothermal inert-basis check uses the same, composition-dependent equilibrium as the
rigorous model: its curve Y*(X) evaluates K at the liquid of solute and solvent along X.

References: A. Kremser, Natl. Petroleum News 22 (1930) 43 (dilute limit); Treybal,
Mass-Transfer Operations, 3rd ed. 1980, ch. 8 (equilibrium curve and stepping in mole ratios).
"""

import numpy as np
import pytest

from traywise.inert_basis.equilibrium_curve import ConstantKEquilibrium, MixtureEquilibrium
from traywise.inert_basis.kremser import kremser_stages
from traywise.properties.equilibrium_table import EquilibriumTable
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel
from traywise.properties.unifac_parameters import unifac
from traywise.inert_basis.design import inert_basis_design, mole_ratio_equilibrium

WATER, ACETONE, NITROGEN = (find_component(n) for n in ("water", "acetone", "nitrogen"))
T, P = 298.15, 1.2e5  # K, Pa


def anchored_model():
    return PropertyModel([WATER, ACETONE, NITROGEN], equilibrium=["raoult", "activity", "insoluble"],
                         activity=unifac([WATER, ACETONE]))


def test_curve_follows_k_at_the_binary_liquid_of_each_x():
    model = anchored_model()
    curve = mole_ratio_equilibrium(model, "acetone", temperature=T, pressure=P)
    assert isinstance(curve, MixtureEquilibrium)
    ratios = np.array([0.0, 1e-3, 0.02, 0.1, 0.3])
    x = ratios / (1.0 + ratios)
    liquid = np.column_stack([1.0 - x, x, np.zeros_like(x)])
    k = model.evaluate(np.full(x.size, T), np.full(x.size, P), liquid).k[:, 1]
    assert curve(ratios) == pytest.approx(k * x / (1.0 - k * x), rel=1e-12)
    assert curve.k_value == pytest.approx(k[0], rel=1e-14)  # infinite dilution
    assert curve(0.1) < ConstantKEquilibrium(curve.k_value, T, P)(0.1)  # gamma falls with concentration


def test_ideal_models_keep_the_constant_k_curve():
    model = PropertyModel([WATER, ACETONE, NITROGEN], equilibrium=["raoult", "henry", "insoluble"])
    curve = mole_ratio_equilibrium(model, "acetone", temperature=T, pressure=P)
    assert isinstance(curve, ConstantKEquilibrium)
    assert curve.k_value == pytest.approx(anchored_model().evaluate([T], [P]).k[0, 1], rel=1e-12)


def test_dilute_inert_basis_design_matches_kremser_with_the_infinite_dilution_k():
    model = anchored_model()
    gas = np.array([0.0, 1e-6, 1.0 - 1e-6])
    k = model.evaluate([T], [P]).k[0, 1]
    design = inert_basis_design(model, "acetone", gas_flows=gas, solvent_flows=np.array([1.5 * k, 0.0, 0.0]),
                                temperature=T, pressure=P, target_fraction_absorbed=0.95)
    assert design.k_value == pytest.approx(k, rel=1e-14)
    absorption_factor = 1.5 / (1.0 - 1e-6)  # L' over V' (the gas less the key) and K
    assert design.absorption_factor == pytest.approx(absorption_factor, rel=1e-12)
    constant = inert_basis_design(model, "acetone", gas_flows=gas, solvent_flows=np.array([1.5 * k, 0.0, 0.0]),
                                  temperature=T, pressure=P, target_fraction_absorbed=0.95,
                                  equilibrium=ConstantKEquilibrium(k, T, P))
    # liquid below 2e-6 mol/mol: gamma within ~1e-5 of gamma-infinity, a few 1e-5 of a stage
    assert design.theoretical_stages == pytest.approx(constant.theoretical_stages, abs=1e-4)
    # the partial last stage differs from Kremser's count by at most |1 - 2/(1 + sqrt(A))| (shortcut.step_stages)
    bound = abs(1.0 - 2.0 / (1.0 + np.sqrt(absorption_factor)))
    assert design.theoretical_stages == pytest.approx(kremser_stages(absorption_factor, 0.95), abs=bound)


def test_concentrated_design_needs_fewer_stages_than_the_dilute_k_suggests():
    """10 % acetone: the liquid reaches several mol %, where acetone's gamma (and K) is well
    below its infinite-dilution value, so the curve bends down and fewer stages do."""
    model = anchored_model()
    gas = np.array([0.0, 0.1, 0.9])
    common = dict(gas_flows=gas, solvent_flows=np.array([3.0, 0.0, 0.0]), temperature=T, pressure=P, target_fraction_absorbed=0.95)
    mixture = inert_basis_design(model, "acetone", **common)
    constant = inert_basis_design(model, "acetone", equilibrium=ConstantKEquilibrium(mixture.k_value, T, P), **common)
    assert mixture.liquid_ratio_out == pytest.approx(constant.liquid_ratio_out, rel=1e-12)  # same balance
    assert mixture.theoretical_stages < constant.theoretical_stages - 0.2  # measured: 3.02 against 3.32


def test_curve_of_a_table_solute_passes_through_the_table():
    """A table in mole ratios (numbers invented for the test) read back along the curve:
    Y* = p / (P - p) at each tabulated X, the liquid being the binary the table describes."""
    loadings = [0.002, 0.01, 0.05]
    pressures = [300.0, 1800.0, 11000.0]
    table = EquilibriumTable("water", (T,), (loadings,), (pressures,), basis="mole_ratio", enthalpy_of_solution=-30e3)
    model = PropertyModel([WATER, find_component("sulfur dioxide"), NITROGEN], equilibrium=["raoult", "table", "insoluble"],
                          tables={"sulfur dioxide": table})
    curve = mole_ratio_equilibrium(model, "sulfur dioxide", temperature=T, pressure=P)
    p = np.array(pressures)
    assert curve(np.array(loadings)) == pytest.approx(p / (P - p), rel=1e-12)


def test_single_values_of_the_curve_are_the_array_values():
    """The curve remembers single values (the stepping asks for the same X repeatedly): asked
    once, twice, or inside an array, X gives the same Y*."""
    curve = mole_ratio_equilibrium(anchored_model(), "acetone", temperature=T, pressure=P)
    ratios = np.array([0.0, 1e-3, 0.02, 0.3])
    along = curve(ratios)
    single = [curve(float(r)) for r in ratios]
    assert single == pytest.approx(along, rel=1e-14)  # one row or four: the same arithmetic up to rounding
    assert [curve(float(r)) for r in ratios] == single  # remembered: exactly the first answers
    assert curve(np.float64(0.02)) == single[2] and isinstance(curve(0.02), float)
