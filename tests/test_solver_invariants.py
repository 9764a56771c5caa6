"""Invariants of the rigorous solver over random valid cases (hypothesis, issue 3):
more solvent never absorbs less of a solute; more stages never absorb less; balances close."""

import dataclasses

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from support.columns import library_model, water_column
from support.balances import recomputed_closure
from traywise.mesh.newton import solve_column

SOLUTES = ("ammonia", "sulfur dioxide", "hydrogen sulfide", "acetone")
MODELS = {name: library_model("water", name, "nitrogen", "oxygen") for name in SOLUTES}
CLOSE = 1e-9  # relative; the solver's own closure requirement

cases = st.fixed_dictionaries(
    {
        "solute": st.sampled_from(SOLUTES),
        "fraction": st.floats(0.01, 0.25),
        "stages": st.integers(2, 12),
        "absorption_factor": st.floats(0.5, 3.0),
        "t_gas": st.floats(288.15, 333.15),
        "t_solvent": st.floats(283.15, 308.15),
        "pressure": st.floats(1.0e5, 3.0e5),
        "murphree": st.floats(0.4, 1.0),
    }
)


def _column(case, *, solvent_scale=1.0, extra_stages=0):
    model = MODELS[case["solute"]]
    y = case["fraction"]
    gas = np.array([0.0, y, 0.79 * (1 - y), 0.21 * (1 - y)])
    k = model.evaluate(np.array([case["t_solvent"]]), np.array([case["pressure"]])).k[0, 1]
    solvent = solvent_scale * case["absorption_factor"] * k
    column = water_column(
        model, case["stages"] + extra_stages, gas=gas, solvent_flow=max(solvent, 0.2), t_gas=case["t_gas"],
        t_solvent=case["t_solvent"], pressure=case["pressure"], murphree=case["murphree"],
    )
    return column, model


SETTINGS = settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])


@SETTINGS
@given(cases)
def test_more_solvent_never_absorbs_less(case):
    column, model = _column(case)
    richer, _ = _column(case, solvent_scale=1.3)
    base = solve_column(column, model).fraction_absorbed[1]
    more = solve_column(richer, model).fraction_absorbed[1]
    assert more >= base - CLOSE


@SETTINGS
@given(cases)
def test_more_stages_never_absorb_less(case):
    column, model = _column(case)
    taller, _ = _column(case, extra_stages=2)
    base = solve_column(column, model).fraction_absorbed[1]
    more = solve_column(taller, model).fraction_absorbed[1]
    assert more >= base - CLOSE


@SETTINGS
@given(cases, st.floats(0.0, 0.5))
def test_balances_close_whenever_converged(case, cooling):
    column, model = _column(case)
    duty = np.zeros(column.n_stages)
    duty[column.n_stages // 2] = cooling * case["fraction"] * 30e3  # W, up to half the heat released
    column = dataclasses.replace(column, heat_removed=duty)
    solution = solve_column(column, model)
    fed = column.solvent.component_flows + column.gas.component_flows
    assert np.all(np.abs(solution.gas_out + solution.liquid_out - fed) <= CLOSE * fed)
    assert recomputed_closure(solution, model)[1] < 1e-7
