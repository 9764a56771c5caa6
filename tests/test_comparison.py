"""The isothermal inert-basis check beside the rigorous solver (issue 3)."""

import numpy as np
import pytest

from support.columns import dilute_column, ideal_dilute_model, library_model, water_column
from traywise.inert_basis.comparison import compare
from traywise.mesh.newton import solve_column
from traywise.inert_basis.design import mole_ratio_equilibrium, step_stages


def _stepped_between_terminals(solution, model, key_index, temperature):
    """Inert-basis stages stepped between the rigorous solution's own terminal compositions."""
    column = solution.column
    inert_gas = column.gas.flow - column.gas.component_flows[key_index]
    inert_liquid = column.solvent.flow - column.solvent.component_flows[key_index]
    gas_in = column.gas.component_flows[key_index] / inert_gas
    gas_out = solution.gas_out[key_index] / (solution.gas_out.sum() - solution.gas_out[key_index])
    equilibrium = mole_ratio_equilibrium(model, model.names[key_index], temperature=temperature, pressure=column.top_pressure)
    stepping = step_stages(equilibrium, inert_liquid / inert_gas, gas_ratio_in=gas_in, gas_ratio_out=gas_out)
    return stepping.stages


@pytest.mark.parametrize("n_stages", [2, 3, 5, 8, 12, 16, 20])
def test_stepping_reproduces_the_rigorous_stage_count_in_the_dilute_isothermal_limit(n_stages):
    """Nonvolatile solvent, insoluble carrier, one solute at 0.05 mol %, isothermal: both
    methods rest on the same balances and equilibrium, so they must agree (issue 3: 0.02 stage)."""
    model = ideal_dilute_model(henry_pa=2.0e5)
    solution = solve_column(dilute_column(n_stages, 3.0, solute_fraction=5e-4), model)
    stages = _stepped_between_terminals(solution, model, 1, 298.15)
    assert stages == pytest.approx(n_stages, abs=0.02)


@pytest.mark.parametrize("humid", [False, True])
def test_water_and_air_differ_from_the_inert_basis_and_say_by_how_much(humid, capsys):
    """With water (evaporates) and air (dissolves a little) the inert-basis assumptions are only
    approximate: print the difference for the record. A dry gas picks up water on the bottom
    stages, which the classic method cannot see; gas fed saturated removes most of that."""
    model = library_model("water", "sulfur dioxide", "nitrogen", "oxygen")
    y_water = 3169.9 / 1.0e5 if humid else 0.0  # saturated at 25 degC (IAPWS-95 Psat, 3.1699 kPa)
    rows = []
    for n_stages in (2, 5, 10, 20):
        carrier = 1.0 - 5e-4 - y_water
        gas = np.array([y_water, 5e-4, 0.79 * carrier, 0.21 * carrier])
        column = water_column(model, n_stages, gas=gas, solvent_flow=60.0, t_gas=298.15, t_solvent=298.15, pressure=1.0e5)
        column = column.__class__(**{**column.__dict__, "mode": "isothermal", "temperature": 298.15})
        solution = solve_column(column, model)
        rows.append((n_stages, _stepped_between_terminals(solution, model, 1, 298.15)))
    with capsys.disabled():
        label = "saturated" if humid else "dry"
        print(f"\nwater/air ({label} gas), SO2 0.05 mol %, rigorous N -> inert-basis stages:", [(n, round(s, 3)) for n, s in rows])
    worst = max(abs(s - n) / n for n, s in rows)
    assert worst < (0.02 if humid else 0.10)  # measured: see the printed rows


@pytest.fixture(scope="module")
def concentrated():
    model = library_model("water", "ammonia", "nitrogen", "oxygen")
    gas = np.array([0.0, 0.20, 0.8 * 0.79, 0.8 * 0.21])
    column = water_column(model, 8, gas=gas, solvent_flow=1.5)
    return model, column, solve_column(column, model)


def test_heat_effects_change_the_stage_count_and_the_comparison_reports_it(concentrated):
    model, column, adiabatic = concentrated
    result = compare(adiabatic, model, "ammonia")
    assert result.max_temperature_rise > 15.0
    assert not result.held and result.verdict.startswith("unsafe:")  # the simple method asks for too few stages
    assert result.direction == "unsafe" and result.causes[0].startswith("temperature")
    # the same column with the heat effects removed (isothermal at the solvent temperature)
    isothermal = solve_column(
        column.__class__(**{**column.__dict__, "mode": "isothermal", "temperature": column.solvent.temperature}), model
    )
    assert isothermal.fraction_absorbed[1] > adiabatic.fraction_absorbed[1] + 0.05
    # the classic method reaches the adiabatic column's removal in far fewer stages
    assert result.stage_difference < -2.0


def test_dilute_isothermal_comparison_holds():
    model = ideal_dilute_model()
    result = compare(solve_column(dilute_column(6, 3.0), model), model)
    assert result.held
    assert result.isothermal_stages == pytest.approx(6.0, abs=0.02)
    assert result.solutes[0].isothermal_outlet_mole_fraction == pytest.approx(
        result.solutes[0].rigorous_outlet_mole_fraction, rel=1e-3
    )
