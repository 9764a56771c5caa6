"""A sample of the robustness grid (the full 200-case grid is tests/benchmarks/bench_robustness.py):
concentrated, strongly heat-releasing cases converge from the automatic start, and every
solution passes the physical checks (sum K x = 1 on every stage, positive flows), which
solve_column applies before it returns anything."""

import numpy as np
import pytest

from support.hard_cases import hard_case
from support.balances import recomputed_closure
from traywise.mesh.equations import StageEquations
from traywise.mesh.newton import solve_column
from traywise.mesh.start import initial_estimate


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
