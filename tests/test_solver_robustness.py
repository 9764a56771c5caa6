"""A sample of the robustness grid (the full 200-case grid is tests/benchmarks/bench_robustness.py):
concentrated, strongly heat-releasing cases converge from the automatic start, and every
solution passes the physical checks (sum K x = 1 on every stage, positive flows), which
solve_column applies before it returns anything."""

import numpy as np
import pytest

from support.hard_cases import hard_case
from support.balances import recomputed_closure
from traywise.mesh.newton import solve_column


@pytest.mark.parametrize("seed", range(40))
def test_generated_hard_case_converges_from_the_automatic_start(seed):
    column, model, description = hard_case(seed)
    solution = solve_column(column, model)
    component, energy = recomputed_closure(solution, model)
    assert np.all(component < 1e-9) and energy < 1e-7, description
