"""The heat budget per component and the solvent's balance: each solute's heat of absorption,
the solvent's evaporation and condensation apart, the make-up water; and the liquid volume flow.

Columns solved for real from library data (flows and temperatures invented for the tests)."""

import numpy as np
import pytest
from support.columns import library_model, water_column

from traywise.mesh.balances import _heat_breakdown
from traywise.mesh.equations import StageEquations
from traywise.mesh.newton import solve_column
from traywise.mesh.phase_transfer import liquid_to_vapour, solvent_balance
from traywise.properties.liquid_volume import liquid_volume_flow


@pytest.fixture(scope="module")
def dry_hot_gas():
    """Dry gas at 40 degC over water at 25 degC: the water evaporates, SO2 is absorbed."""
    model = library_model("water", "sulfur dioxide", "nitrogen")
    column = water_column(model, 6, gas=[0.0, 0.02, 0.98], solvent_flow=20.0, t_gas=313.15)
    return model, solve_column(column, model)


@pytest.fixture(scope="module")
def humid_cold_solvent():
    """Gas saturated at 40 degC over water at 10 degC: water condenses out of the gas."""
    model = library_model("water", "sulfur dioxide", "nitrogen")
    column = water_column(model, 6, gas=[0.07, 0.02, 0.91], solvent_flow=20.0, t_gas=313.15, t_solvent=283.15)
    return model, solve_column(column, model)


@pytest.mark.parametrize("which", ["dry_hot_gas", "humid_cold_solvent"])
def test_terms_per_component_add_up_to_released_and_evaporation(which, request):
    model, solution = request.getfixturevalue(which)
    heat = solution.heat
    terms = np.array(heat.by_component)
    absorbed = solution.column.gas.component_flows - solution.gas_out
    assert terms.shape == (model.n_components,)
    assert np.sum(terms[absorbed > 0.0]) == pytest.approx(heat.released, rel=1e-12)
    assert -np.sum(terms[absorbed < 0.0]) == pytest.approx(heat.evaporation, rel=1e-12, abs=1e-9)
    assert terms[1] > 0.0  # SO2 absorbed gives heat to the liquid


def test_dry_gas_evaporates_water_and_needs_make_up(dry_hot_gas):
    model, solution = dry_hot_gas
    balance = solvent_balance(solution, 0)
    picked_up = solution.gas_out[0] - solution.column.gas.component_flows[0]
    assert picked_up > 0.0
    assert balance.make_up == pytest.approx(picked_up, rel=1e-9)
    assert balance.gained == 0.0
    assert balance.evaporated >= balance.make_up
    assert solution.heat.by_component[0] < 0.0  # evaporation takes heat from the liquid


def test_humid_gas_over_cold_water_condenses_and_is_not_called_absorption(humid_cold_solvent):
    model, solution = humid_cold_solvent
    balance = solvent_balance(solution, 0)
    gained = solution.column.gas.component_flows[0] - solution.gas_out[0]
    assert gained > 0.0
    assert balance.gained == pytest.approx(gained, rel=1e-9)
    assert balance.make_up == 0.0
    assert balance.condensed >= balance.gained
    assert solution.heat.by_component[0] > 0.0  # condensing water gives heat; its own line, not SO2's


def test_stage_transfers_sum_to_the_gas_pick_up(dry_hot_gas):
    _, solution = dry_hot_gas
    transfer = liquid_to_vapour(solution)
    net = solution.gas_out - solution.column.gas.component_flows
    assert np.allclose(transfer.sum(axis=0), net, rtol=1e-9, atol=1e-12 * solution.vapour_flow.max())


def test_liquid_volume_of_water_at_20_degC():
    # density of water at 20 degC: 998.21 kg/m3 (IAPWS-95; CRC Handbook of Chemistry and Physics, 97th ed., 6-7)
    model = library_model("water", "ammonia")
    flows = np.array([1000.0 / 3600.0 / model.molar_mass[0], 0.0])  # 1000 kg/h of water
    volume = liquid_volume_flow(model.components, flows, 293.15)
    assert volume * 3600.0 == pytest.approx(1000.0 / 998.21, rel=2e-3)


def test_no_volume_for_an_empty_stream():
    model = library_model("water")
    assert liquid_volume_flow(model.components, [0.0], 293.15) is None


def test_breakdown_from_the_properties_already_evaluated_equals_a_fresh_evaluation(dry_hot_gas):
    """Where the properties depend on temperature and pressure only, the heat breakdown reads
    the feeds' and the end stages' enthalpies from the evaluations the solve made; the same
    breakdown from a fresh evaluation of the four states (as for other models) agrees."""
    model, solution = dry_hot_gas
    equations = StageEquations(solution.column, model)
    x = equations.join(solution.vapour_flows, solution.liquid_flows, solution.temperature)
    props = equations.residual(x)[1]
    args = (equations, solution.vapour_flows, solution.liquid_flows, solution.temperature, solution.heat_removed, props)
    reused = _heat_breakdown(*args)
    model.composition_dependent = True  # the branch that evaluates the four states
    try:
        fresh = _heat_breakdown(*args)
    finally:
        model.composition_dependent = False
    assert reused == solution.heat
    for name in ("released", "gas_heating", "liquid_heating", "evaporation", "removed_by_coolers", "other"):
        assert getattr(reused, name) == pytest.approx(getattr(fresh, name), rel=1e-12, abs=1e-9)
