"""Sweep engine: one row per value in the order given, failures kept and marked, the same
numbers from one process or two, outputs checked against the model, invariants along a sweep
(more solvent or more stages never absorb less)."""

import numpy as np
import pytest

from support.design import scrubber_column, scrubber_model
from traywise.design import sweep
from traywise.errors import InputError
from traywise.mesh.newton import solve_column

OUTPUTS = ("fraction_absorbed:ammonia-like", "outlet_ppmv:ammonia-like", "max_temperature", "hottest_stage", "iterations")


@pytest.fixture(scope="module")
def scrubber():
    return scrubber_model()


def test_solvent_sweep_keeps_failed_points_and_matches_single_solves(scrubber):
    values = [1.0, 2.0, -1.0, 3.0, 4.0]  # a negative flow cannot be solved: kept as a failed row
    calls = []
    table = sweep(
        scrubber_column(8, 2.0), scrubber, variable="solvent_flow", values=values, outputs=OUTPUTS,
        progress=lambda done, total: calls.append((done, total)),
    )
    assert table.data.shape == (5, len(OUTPUTS)) and len(table.rows()) == 5
    assert list(table.failed) == [2]
    assert np.all(np.isnan(table.data[2])) and "solvent_flow" in table.messages[2]
    assert table.rows()[2][:2] == (-1.0, False)
    assert calls[-1] == (5, 5) and len(calls) == 5
    assert table.header[0] == "solvent_flow [mol/s]" and table.header[-1] == "message"
    absorbed = table.data[table.converged, 0]
    assert np.all(np.diff(absorbed) > 0.0)  # more solvent, more absorbed
    single = solve_column(scrubber_column(8, 3.0), scrubber)
    # Warm and cold starts converge to the same solution within the solver tolerance (1e-10 scaled).
    assert table.data[3, 0] == pytest.approx(single.fraction_absorbed[2], rel=1e-9)
    assert table.data[3, 2] == pytest.approx(single.max_temperature, abs=1e-7)


def test_two_processes_give_the_same_table(scrubber):
    values = np.linspace(1.0, 5.0, 12)
    column = scrubber_column(8, 2.0)
    one = sweep(column, scrubber, variable="solvent_flow", values=values, outputs=OUTPUTS[:3])
    two = sweep(column, scrubber, variable="solvent_flow", values=values, outputs=OUTPUTS[:3], processes=2)
    assert np.all(two.converged) and np.array_equal(one.values, two.values)
    # Chunks start cold where the single process warm-starts; both converge to 1e-10 scaled.
    np.testing.assert_allclose(two.data, one.data, rtol=1e-8)


def test_stage_sweep_and_cooler_sweep(scrubber):
    column = scrubber_column(8, 2.0)
    stages = sweep(column, scrubber, variable="n_stages", values=[1, 2, 4, 8, 16], outputs=OUTPUTS[:1])
    assert np.all(stages.converged) and np.all(np.diff(stages.data[:, 0]) >= 0.0)  # more stages never absorb less
    outputs = ("heat_removed", "max_temperature")
    duty = sweep(column, scrubber, variable="cooler_duty", stage=3, values=[0.0, 2000.0], outputs=outputs)
    assert duty.data[:, 0] == pytest.approx([0.0, 2000.0])
    assert duty.data[1, 1] < duty.data[0, 1]  # cooling lowers the hottest stage


def test_sweep_input_is_checked(scrubber):
    column = scrubber_column(4, 2.0)
    with pytest.raises(InputError, match="output 'colour' unknown"):
        sweep(column, scrubber, variable="solvent_flow", values=[1.0], outputs=("colour",))
    with pytest.raises(InputError, match="needs a component"):
        sweep(column, scrubber, variable="solvent_flow", values=[1.0], outputs=("fraction_absorbed:ozone",))
    with pytest.raises(InputError, match="cannot be swept"):
        sweep(column, scrubber, variable="colour", values=[1.0], outputs=OUTPUTS)
    with pytest.raises(InputError, match="stage"):
        sweep(column, scrubber, variable="cooler_duty", values=[1.0], outputs=OUTPUTS)
