"""Converged demo columns shared by the sizing tests (solved once per test session)."""

import functools
from pathlib import Path

from traywise.case.load import load_case
from traywise.mesh.newton import solve_column
from traywise.sizing.stage_loads import stage_loads

CASES = Path(__file__).resolve().parents[2] / "cases"


@functools.cache
def solved(name):
    """(case, solution) of a demo case file in cases/."""
    case = load_case(CASES / name)
    return case, solve_column(case.column, case.model)


@functools.cache
def demo_stage_properties(name="acid-gas-vent-scrubber.toml"):
    case, solution = solved(name)
    return stage_loads(solution, case.components, case.key_component)
