"""A sample of the robustness grid (the full 200-case grid is tests/benchmarks/bench_robustness.py):
concentrated, strongly heat-releasing cases converge from the automatic start, and every
solution passes the physical checks (sum K x = 1 on every stage, positive flows), which
solve_column applies before it returns anything; the race of the starting estimates; ammonia and
CO2 washes on the electrolyte liquid that the step control once let fail."""

import numpy as np
import pytest

import traywise.mesh.newton as newton
from support.balances import recomputed_closure
from support.electrolyte import components
from support.hard_cases import hard_case
from traywise.column import Column, Feed
from traywise.mesh.equations import StageEquations
from traywise.mesh.newton import SolverSettings, solve_column
from traywise.mesh.start import initial_estimate
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel


# 164: little solvent for much heat (160 stages, L/G 0.3, up to 62 kJ/mol), which failed while the
# hot starting estimate could lie far above the solvent's boiling point
@pytest.mark.parametrize("seed", [*range(40), 164])
def test_generated_hard_case_converges_from_the_automatic_start(seed):
    column, model, description = hard_case(seed)
    solution = solve_column(column, model)
    component, energy = recomputed_closure(solution, model)
    assert np.all(component < 1e-9) and energy < 1e-7, description


def test_hot_estimate_stays_at_or_below_the_solvent_boiling_point():
    """The balance alone puts this case's hot zone at about 540 K; the estimate keeps the liquid
    at or below the bubble point of the solvent (water) at the bottom pressure."""
    column, model, _ = hard_case(164)
    equations = StageEquations(column, model)
    _, _, t = equations.split(initial_estimate(equations, "hot"))
    k_water = model.evaluate(t[-1:], equations.pressure[-1:]).k[0, 0]
    assert 0.95 < k_water <= 1.0


def test_the_starts_take_turns_after_the_solo_steps_and_reach_the_same_answer(monkeypatch):
    """With a solo budget of two steps, 'hot' and then 'linear' are built and iterate in turn
    until one converges (on the default budget 'hot' converges alone); the answer is the same."""
    column, model, description = hard_case(17)  # 19 Newton steps from 'hot' alone
    alone = solve_column(column, model)
    built, estimate = [], newton.estimate_with_properties
    monkeypatch.setattr(newton, "estimate_with_properties",
                        lambda equations, profile: built.append(profile) or estimate(equations, profile))
    raced = solve_column(column, model, settings=SolverSettings(solo_iterations=2))
    assert built == ["hot", "linear"], description
    assert np.allclose(raced.temperature, alone.temperature, rtol=0.0, atol=1e-7)
    assert np.allclose(raced.liquid_flows, alone.liquid_flows, rtol=1e-7, atol=1e-12)
    assert np.allclose(raced.vapour_flows, alone.vapour_flows, rtol=1e-7, atol=1e-12)


# Ammonia and CO2 from nitrogen into water (invented washes from the generator of
# tests/benchmarks/bench_electrolyte_cases.py, seed 12345): (stages, water [mol/s], solvent T [K],
# gas NH3, CO2, N2 [mol/s], gas T [K], pressure [Pa]). Each failed to converge (300 Newton steps
# over the three starts) while a trial step that raised the RMS residual more than tenfold was
# rejected; each converges in 7-10 steps now that only a thousandfold rise is.
AMMONIA_CO2_WASHES = [
    (25, 2.7377, 308.83, (0.014814, 0.012354, 2.6967), 301.66, 1.2383e5),
    (19, 7.6383, 292.41, (0.020904, 0.016397, 1.0099), 306.90, 2.0787e5),
    (28, 7.7523, 290.50, (0.0017274, 0.0016956, 1.3214), 300.38, 1.7418e5),
]


@pytest.mark.parametrize("stages, water, t_solvent, gas, t_gas, pressure", AMMONIA_CO2_WASHES)
def test_ammonia_with_carbon_dioxide_washes_converge_where_a_grown_residual_was_rejected(
        stages, water, t_solvent, gas, t_gas, pressure):
    model = PropertyModel(components("NH3", "CO2") + [find_component("nitrogen")],
                          ["raoult", "electrolyte", "electrolyte", "henry"])
    column = Column(stages, Feed(1, "liquid", np.array([water, 0.0, 0.0, 0.0]), t_solvent),
                    Feed(stages, "vapour", np.array([0.0, *gas]), t_gas), pressure)
    solution = solve_column(column, model)
    assert solution.convergence.iterations <= 20
    component, energy = recomputed_closure(solution, model)
    assert np.all(component < 1e-9) and energy < 1e-7
