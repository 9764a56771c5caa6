"""The solvent-flow search reaches a flow that its warm start cannot by a path of flows between
(``solve_for._Solver``): an ammonia and CO2 wash (invented, from the generator of
tests/benchmarks/bench_reliability.py, valid case 154) whose search jumps from 0.27 to
0.0021 mol/s of water, where the solve from the last converged solution failed."""

import numpy as np
import pytest

from support.electrolyte import components
from traywise.column import Column, Feed
from traywise.design import SoluteTarget, solvent_for_target
from traywise.design import solve_for
from traywise.design.variables import with_solvent_flow
from traywise.errors import ConvergenceError
from traywise.mesh.newton import solve_column
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

TARGET = SoluteTarget("ammonia", "outlet_ppmv", 4080.0)


@pytest.fixture(scope="module")
def wash():
    """14 stages, 35 mol/s of water at 22.1 degC; 2 mol/s of gas at 28.1 degC, 1.5 % NH3, 1 % CO2."""
    model = PropertyModel(components("NH3", "CO2") + [find_component("nitrogen"), find_component("oxygen")],
                          ["raoult", "electrolyte", "electrolyte", "henry", "henry"])
    gas = np.array([0.03989873, 0.02992405, 0.01994936, 1.50617701, 0.39898729])
    column = Column(14, Feed(1, "liquid", np.array([35.0508, 0.0, 0.0, 0.0, 0.0]), 295.25),
                    Feed(14, "vapour", gas, 301.25), 124098.0, pressure_drop=400.0,
                    heat_removed=np.full(14, 190.714))
    return column, model


def test_the_jump_fails_from_the_warm_start(wash):
    """What the path is for: from the converged 0.27 mol/s the solve at 0.0021 mol/s fails."""
    column, model = wash
    near = solve_column(with_solvent_flow(column, 0.273834), model)
    with pytest.raises(ConvergenceError):
        solve_column(with_solvent_flow(column, 0.00213933), model, start=near)


def test_the_search_converges_along_a_path_of_flows(wash):
    column, model = wash
    design = solvent_for_target(column, model, TARGET)
    assert design.reached == pytest.approx(TARGET.value, rel=1e-6)
    assert 0.05 < design.value < 0.1  # mol/s of water


def test_when_no_path_converges_the_failure_says_so(wash, monkeypatch):
    """Every solve below 0.01 mol/s made to fail: the search's error names the path it tried."""
    column, model = wash
    real = solve_for.solve_column

    def failing_below(column, model, **options):
        if column.solvent.flow < 0.01:
            raise ConvergenceError("made to fail", iterations=1, residual=1.0)
        return real(column, model, **options)

    monkeypatch.setattr(solve_for, "solve_column", failing_below)
    with pytest.raises(ConvergenceError, match=r"made to fail; nor along paths of up to 7 solvent flows between it "
                                               r"and 0\.273834 mol/s, where the search converged"):
        solvent_for_target(column, model, TARGET)
