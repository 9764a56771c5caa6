"""A sample of the robustness grid (the full 200-case grid is tests/benchmarks/bench_robustness.py):
concentrated, strongly heat-releasing cases converge from the automatic start, and every
solution passes the physical checks (sum K x = 1 on every stage, positive flows), which
solve_column applies before it returns anything."""

import sys
from pathlib import Path

import numpy as np
import pytest

sys.path.insert(0, str(Path(__file__).parent / "benchmarks"))
from hard_cases import hard_case  # noqa: E402

from traywise.mesh.newton import solve_column  # noqa: E402


@pytest.mark.parametrize("seed", range(40))
def test_generated_hard_case_converges_from_the_automatic_start(seed):
    column, model, description = hard_case(seed)
    solution = solve_column(column, model)
    assert np.all(solution.convergence.component_closure < 1e-9), description
    assert solution.convergence.energy_closure < 1e-7, description
