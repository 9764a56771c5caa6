"""Rigorous solver numerics: analytic Jacobian, Kremser agreement, the spurious root, cost."""

import dataclasses

import numpy as np
import pytest

from support.columns import dense_jacobian, dilute_column, ideal_dilute_model, jacobian_error, library_model, water_column
from traywise.errors import ConvergenceError
from traywise.inert_basis.kremser import kremser_fraction_absorbed
from traywise.mesh.balances import build_solution
from traywise.mesh.equations import StageEquations
from traywise.mesh.newton import solve_column
from traywise.mesh.start import estimate_with_properties, initial_estimate
from traywise.properties.inline import inline_component
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel
from traywise.properties.unifac_parameters import unifac


@pytest.mark.parametrize("murphree, mode", [(1.0, "adiabatic"), (0.6, "adiabatic"), (0.6, "isothermal")])
def test_analytic_jacobian_matches_central_differences(murphree, mode):
    model = library_model("water", "ammonia", "sulfur dioxide", "nitrogen")
    gas = np.array([0.02, 0.15, 0.03, 0.80])
    column = water_column(model, 4, gas=gas, solvent_flow=2.0, murphree=murphree)
    if mode == "isothermal":
        column = dataclasses.replace(column, mode="isothermal", temperature=np.full(4, 300.0))
    equations = StageEquations(column, model)
    x = initial_estimate(equations, "hot")
    x[equations.n - 1 :: equations.n] += np.linspace(0.0, 7.0, column.n_stages)  # off the start profile
    # central differences carry ~1e-8 relative truncation and rounding error at this step
    assert jacobian_error(equations, x) < 1e-5


# Kremser's equation: A. Kremser, Natl. Petroleum News 22(21) (1930) 43; fraction absorbed
# (A^(N+1) - A) / (A^(N+1) - 1) for a dilute solute, linear equilibrium, solute-free solvent.
@pytest.mark.parametrize("n_stages", [2, 3, 5, 8, 12, 20, 30])
@pytest.mark.parametrize("absorption_factor", [0.5, 0.8, 1.0, 1.5, 2.0, 3.0])
def test_dilute_isothermal_column_follows_kremser(n_stages, absorption_factor):
    model = ideal_dilute_model(henry_pa=2.0e5)
    k = 2.0e5 / 1.0e5
    column = dilute_column(n_stages, absorption_factor * k * 1.0, solute_fraction=5e-4)
    solution = solve_column(column, model)
    # Kremser takes A = L/(K V) on the inert flows here (solute at 0.05 mol %)
    expected = kremser_fraction_absorbed(absorption_factor, n_stages)
    assert solution.fraction_absorbed[1] == pytest.approx(expected, rel=1e-3)  # 0.1 % (issue 3)


def test_vapour_free_stage_is_refused():
    """The equilibrium rows also hold for V_j = 0 (DESIGN.md section 4): such an iterate must
    never become a result."""
    model = library_model("water", "ammonia", "nitrogen")
    column = water_column(model, 3, gas=np.array([0.0, 0.1, 0.9]), solvent_flow=2.0)
    equations = StageEquations(column, model)
    v, l, t = equations.split(initial_estimate(equations, "linear"))
    v[1] = 0.0
    with pytest.raises(ConvergenceError, match="phase vanished"):
        build_solution(equations, equations.join(v, l, t), 5, 1e-12, 1e-10)


def test_liquid_off_its_bubble_point_is_refused():
    model = library_model("water", "ammonia", "nitrogen")
    column = water_column(model, 3, gas=np.array([0.0, 0.1, 0.9]), solvent_flow=2.0)
    equations = StageEquations(column, model)
    v, l, t = equations.split(initial_estimate(equations, "linear"))
    t = t + 40.0  # K-values no longer sum to one against these liquid compositions
    with pytest.raises(ConvergenceError, match="non-physical root"):
        build_solution(equations, equations.join(v, l, t), 5, 1e-12, 1e-10)


def test_start_above_the_boiling_point_does_not_yield_a_vapour_free_answer():
    """Solvent and gas fed hot enough that a naive start sits above the solvent's boiling point."""
    model = library_model("water", "ammonia", "nitrogen")
    column = water_column(model, 6, gas=np.array([0.05, 0.1, 0.85]), solvent_flow=3.0, t_gas=420.0, t_solvent=360.0)
    solution = solve_column(column, model)
    assert np.all(solution.vapour_flow > 0.0)
    assert np.allclose(np.sum(solution.k_values * solution.liquid_mole_fractions, axis=1), 1.0, atol=1e-8)


def test_trace_solute_converges_to_relative_precision():
    """Row and unknown scaling by component feed (DESIGN.md section 4): a solute at 1e-8 of the
    gas still matches Kremser's equation to high relative precision."""
    model = ideal_dilute_model(henry_pa=2.0e5)
    solution = solve_column(dilute_column(10, 4.0, solute_fraction=1e-8), model)
    assert solution.fraction_absorbed[1] == pytest.approx(kremser_fraction_absorbed(2.0, 10), rel=1e-6)


def test_nonvolatile_solvent_and_insoluble_carrier_stay_in_their_phase():
    model = ideal_dilute_model()
    solution = solve_column(dilute_column(5, 3.0, solute_fraction=0.05), model)
    assert np.all(solution.vapour_flows[:, 0] <= 1e-15 * 3.0)  # zero up to the linear solve's rounding
    assert np.all(solution.liquid_flows[:, 2] <= 1e-15 * 1.0)


def test_isothermal_mode_reports_the_duty_that_holds_the_temperature():
    solvent = inline_component("test solvent", molar_mass=0.1, ideal_gas_cp=100.0, equilibrium="nonvolatile", liquid_cp=200.0)
    solute = inline_component("test solute", molar_mass=0.05, ideal_gas_cp=35.0, equilibrium="henry", henry=(1e5, 298.15, -40e3))
    carrier = inline_component("test carrier", molar_mass=0.028, ideal_gas_cp=29.1, equilibrium="insoluble")
    model = PropertyModel([solvent, solute, carrier])
    solution = solve_column(dilute_column(6, 2.0, solute_fraction=0.2), model)
    absorbed = 0.2 * solution.fraction_absorbed[1]
    # all feeds at the stage temperature and Cp-free transfer: the duty is the heat of solution
    assert solution.heat_removed.sum() == pytest.approx(absorbed * 40e3, rel=1e-9)


@pytest.mark.parametrize("murphree", [1.0, 0.7])
def test_band_widths_hold_every_jacobian_entry(murphree):
    """The banded solve drops entries outside the band it is given: check that none is non-zero."""
    model = library_model("water", "ammonia", "sulfur dioxide", "nitrogen")
    column = water_column(model, 5, gas=np.array([0.02, 0.15, 0.03, 0.80]), solvent_flow=2.0, murphree=murphree)
    equations = StageEquations(column, model)
    x = initial_estimate(equations, "hot")
    dense = dense_jacobian(*equations.jacobian(x, equations.residual(x)[1]))
    n = equations.n
    permutation = (np.arange(column.n_stages)[:, None] * n + equations.band_order[None, :]).ravel()
    rows, cols = np.nonzero(dense[np.ix_(permutation, permutation)])
    below, above = equations.band
    assert np.max(rows - cols) <= below and np.max(cols - rows) <= above


@pytest.mark.parametrize("murphree", [1.0, 0.7])
def test_jacobian_pattern_holds_every_entry(murphree):
    """The banded solve gathers only the entries of ``jacobian_pattern``: check that no other is
    non-zero (and that the pattern leaves out a good part of the blocks, the point of it)."""
    model = library_model("water", "ammonia", "sulfur dioxide", "nitrogen")
    column = water_column(model, 5, gas=np.array([0.02, 0.15, 0.03, 0.80]), solvent_flow=2.0, murphree=murphree)
    equations = StageEquations(column, model)
    x = initial_estimate(equations, "hot")
    blocks = equations.jacobian(x, equations.residual(x)[1])
    outside = ~equations.jacobian_pattern()
    for block, zero in zip(blocks, outside):
        assert not np.any(block[:, zero])
    assert equations.jacobian_pattern().sum() < 0.7 * 3 * equations.n**2


def test_insoluble_carrier_with_murphree_efficiency_is_accepted():
    """sum y* = 1 on every stage also when a carrier is insoluble and trays are not ideal."""
    model = ideal_dilute_model()
    column = dilute_column(5, 3.0, solute_fraction=0.05)
    solution = solve_column(column.__class__(**{**column.__dict__, "murphree": 0.6}), model)
    assert solution.fraction_absorbed[1] < solve_column(column, model).fraction_absorbed[1]


def test_estimate_hands_on_its_properties_only_where_they_are_the_residuals():
    """The solver's first residual takes the properties of the starting estimate's last
    evaluation when the model depends on temperature and pressure only; they must be what
    the residual would evaluate at the estimate (with its compositions), and none is handed
    on for a model whose liquid is composition-dependent."""
    model = library_model("water", "ammonia", "sulfur dioxide", "nitrogen")
    column = water_column(model, 6, gas=np.array([0.02, 0.15, 0.03, 0.80]), solvent_flow=2.0)
    equations = StageEquations(column, model)
    for profile in ("hot", "linear"):
        x, props = estimate_with_properties(equations, profile)
        f_given, _ = equations.residual(x, props)
        f_evaluated, fresh = equations.residual(x)
        assert np.array_equal(f_given, f_evaluated) and np.array_equal(props.h_liquid, fresh.h_liquid)
    water, acetone, nitrogen = (find_component(name) for name in ("water", "acetone", "nitrogen"))
    organic = PropertyModel([water, acetone, nitrogen], equilibrium=["raoult", "activity", "insoluble"],
                            activity=unifac([water, acetone]))
    column = water_column(organic, 4, gas=np.array([0.0, 0.1, 0.9]), solvent_flow=1.0)
    assert estimate_with_properties(StageEquations(column, organic), "hot")[1] is None
