"""Column and Feed are immutable records that compare by value (numbers invented for the test)."""

import dataclasses

import numpy as np
import pytest

from traywise.column import Column, Feed


def column(duty=0.0):
    heat = np.zeros(4)
    heat[2] = duty
    return Column(
        4,
        Feed(1, "liquid", np.array([2.0, 0.0, 0.0]), 298.15),
        Feed(4, "vapour", np.array([0.0, 0.1, 0.9]), 313.15),
        1.2e5,
        heat_removed=heat,
    )


def test_arrays_are_read_only_copies():
    flows = np.array([2.0, 0.0, 0.0])
    feed = Feed(1, "liquid", flows, 298.15)
    flows[0] = 5.0  # the caller's array stays the caller's
    assert feed.component_flows[0] == 2.0
    built = column()
    for array in (feed.component_flows, built.heat_removed, built.murphree, built.gas.component_flows):
        with pytest.raises(ValueError):
            array[0] = 1.0
    with pytest.raises(dataclasses.FrozenInstanceError):
        built.n_stages = 5


def test_columns_compare_and_hash_by_value():
    assert column() == column() and hash(column()) == hash(column())
    assert column() != column(duty=1.0)
    assert column() != "a column"
    assert len({column(), column(), column(duty=1.0)}) == 2
    assert dataclasses.replace(column(), top_pressure=1.3e5) != column()
