"""Design loops past a failed solve (``design/loop_solver.py``), on ammonia and CO2 washes invented by
the generator of tests/benchmarks/bench_reliability.py: the solvent-flow search reaches a flow
its warm start cannot along flows between (valid case 154: a jump from 0.27 to 0.0021 mol/s of
water); the minimum-solvent search solves a longer column that fails from the automatic
estimates from the shorter one's solution stretched to its stages (valid case 116)."""

import numpy as np
import pytest

from support.electrolyte import components
from traywise.column import Column, Feed
from traywise.design import SoluteTarget, loop_solver, minimum_solvent, solvent_for_target
from traywise.design.minimum_solvent import _longer
from traywise.design.variables import with_solvent_flow
from traywise.errors import ConvergenceError
from traywise.mesh.newton import solve_column
from traywise.mesh.start import stretched
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
    real = loop_solver.solve_column

    def failing_below(column, model, **options):
        if column.solvent.flow < 0.01:
            raise ConvergenceError("made to fail", iterations=1, residual=1.0)
        return real(column, model, **options)

    monkeypatch.setattr(loop_solver, "solve_column", failing_below)
    with pytest.raises(ConvergenceError, match=r"made to fail; nor along paths of up to 7 solvent flows between it "
                                               r"and 0\.273834 mol/s, where the search converged"):
        solvent_for_target(column, model, TARGET)


def test_a_stretched_profile_keeps_the_ends_and_interpolates_between(wash):
    column, model = wash
    solution = solve_column(column, model)
    longer = stretched(solution, 27)
    assert longer.n_stages == 27 and longer.vapour_flows.shape == (27, 5)
    for name in ("temperature", "vapour_flows", "liquid_flows"):
        old, new = getattr(solution, name), getattr(longer, name)
        assert np.array_equal(new[[0, -1]], old[[0, -1]])
        assert np.allclose(new[2], old[1] + (2 * 13 / 26 - 1) * (old[2] - old[1]), rtol=1e-12)  # 2 of 26 = 1 of 13
    assert solve_column(column, model, start=stretched(solution, 14)).convergence.iterations <= 2  # itself


@pytest.fixture(scope="module")
def hot_wash():
    """Bench_reliability's valid case 116 (invented): 14 mol/s of gas at 60 degC with 1.5 % NH3 and
    1 % CO2 into 0.40 mol/s of water at 11.9 degC, a 37.7 kW cooler on stage 8, 1.56 bar."""
    model = PropertyModel(components("NH3", "CO2") + [find_component("nitrogen"), find_component("oxygen")],
                          ["raoult", "electrolyte", "electrolyte", "henry", "henry"])
    gas = np.array([0.2954977593, 0.2216233195, 0.1477488797, 11.1550404141, 2.9549775931])
    cooler = np.zeros(8)
    cooler[7] = 37700.0
    column = Column(8, Feed(1, "liquid", np.array([0.40202809, 0.0, 0.0, 0.0, 0.0]), 285.05),
                    Feed(8, "vapour", gas, 333.15), 156192.0, pressure_drop=400.0, heat_removed=cooler)
    return column, model, SoluteTarget("ammonia", "outlet_ppmv", 2276.0)


def test_the_longer_column_fails_cold_at_the_shorter_ones_minimum(hot_wash):
    """What the stretched start is for: the 80-stage column at the 40-stage minimum (0.3868 mol/s)
    does not converge from the automatic estimates."""
    column, model, _ = hot_wash
    longer = with_solvent_flow(_longer(column, 80), 0.3868006)
    with pytest.raises(ConvergenceError):
        solve_column(longer, model)


def test_the_minimum_solvent_search_goes_on_from_the_stretched_solution(hot_wash):
    column, model, target = hot_wash
    found = minimum_solvent(column, model, target)
    assert found.n_stages in (40, 80) and 0.3 < found.solvent_flow < 0.4  # mol/s of water
