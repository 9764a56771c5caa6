"""The column inputs a design loop or a sweep may change, each as a function that returns a new
``Column`` with one value replaced (columns are frozen; nothing is changed in place).

Variables, their values and units (SI):
  solvent_flow         total solvent feed [mol/s]; the feed is scaled, its composition kept
  n_stages             theoretical (or Murphree) stages N [-]; the gas feed moves to stage N
  cooler_duty          heat removed from one stage [W] (needs ``stage``)
  gas_temperature      gas feed temperature [K]
  solvent_temperature  solvent feed temperature [K]
  top_pressure         pressure on stage 1 [Pa]; the pressure drop per stage is kept
"""

from dataclasses import replace

import numpy as np

from ..errors import InputError

UNITS = {
    "solvent_flow": "mol/s",
    "n_stages": "-",
    "cooler_duty": "W",
    "gas_temperature": "K",
    "solvent_temperature": "K",
    "top_pressure": "Pa",
}


def with_solvent_flow(column, flow):
    """The column with its solvent feed scaled to a total of ``flow`` [mol/s] (> 0)."""
    if not (np.isfinite(flow) and flow > 0.0):
        raise InputError("solvent_flow", f"expected a flow > 0 [mol/s], found {flow!r}")
    if column.solvent.flow <= 0.0:
        raise InputError("solvent", "the solvent feed is empty, so it cannot be scaled; give it a flow first")
    flows = column.solvent.component_flows * (flow / column.solvent.flow)
    return replace(column, solvent=replace(column.solvent, component_flows=flows))


def with_stages(column, n_stages):
    """The column with ``n_stages`` stages; the gas feed moves to the new bottom stage.

    Per-stage arrays are carried over only where that has one meaning: a uniform Murphree
    efficiency or isothermal temperature stays uniform; coolers, extra feeds and side draws keep
    their stage numbers (counted from the top) and must still fit. Anything else raises
    ``InputError`` rather than guessing.
    """
    n = int(n_stages)
    if n != n_stages or n < 1:
        raise InputError("n_stages", f"expected a whole number of stages >= 1, found {n_stages!r}")
    old = column.n_stages
    heat = np.zeros(n)
    keep = min(n, old)
    heat[:keep] = column.heat_removed[:keep]
    if np.any(column.heat_removed[keep:] != 0.0):
        first = keep + int(np.flatnonzero(column.heat_removed[keep:])[0]) + 1
        raise InputError("n_stages", f"a cooler sits on stage {first}, below the bottom of a {n}-stage column")
    for item in (*column.extra_feeds, *column.side_draws):
        if item.stage > n:
            raise InputError("n_stages", f"a feed or side draw on stage {item.stage} does not fit a {n}-stage column")
    temperature = None if column.temperature is None else _uniform(column.temperature, "isothermal temperature")
    return replace(
        column,
        n_stages=n,
        gas=replace(column.gas, stage=n),
        heat_removed=heat,
        murphree=_uniform(column.murphree, "Murphree efficiency"),
        temperature=temperature,
    )


# What a stage count other than the column's own leaves without a place, by core quantity; the
# first two fit a longer column (``with_stages`` keeps their stage numbers), the others fit none.
STAGE_BOUND = {
    "heat_removed": "heat removed on stages (coolers, heat loss)",
    "extra_feeds": "side feeds",
    "side_draws": "side draws",
    "murphree": "Murphree efficiencies differing from stage to stage",
    "temperature": "stage temperatures differing",
}
LONGER_COLUMN_KEEPS = ("heat_removed", "extra_feeds", "side_draws")


def stage_bound(column, *, longer_only=False):
    """The quantities of ``column`` (keys of ``STAGE_BOUND``) that a different stage count leaves
    without a place; with ``longer_only`` just those a column with more stages cannot carry."""
    present = {
        "heat_removed": bool(np.any(column.heat_removed != 0.0)),
        "extra_feeds": bool(column.extra_feeds),
        "side_draws": bool(column.side_draws),
        "murphree": bool(np.ptp(column.murphree) > 0.0),
        "temperature": column.temperature is not None and bool(np.ptp(column.temperature) > 0.0),
    }
    return tuple(name for name in STAGE_BOUND if present[name] and not (longer_only and name in LONGER_COLUMN_KEEPS))


def with_cooler_duty(column, duty, *, stage):
    """The column with ``duty`` [W] removed from ``stage`` (1-based); other stages unchanged."""
    if not 1 <= stage <= column.n_stages:
        raise InputError("stage", f"expected a stage from 1 to {column.n_stages}, found {stage!r}")
    heat = np.array(column.heat_removed, dtype=float)
    heat[stage - 1] = duty
    return replace(column, heat_removed=heat)


def with_gas_temperature(column, temperature):
    """The column with the gas fed at ``temperature`` [K]."""
    return replace(column, gas=replace(column.gas, temperature=_positive(temperature, "gas_temperature")))


def with_solvent_temperature(column, temperature):
    """The column with the solvent fed at ``temperature`` [K]."""
    return replace(column, solvent=replace(column.solvent, temperature=_positive(temperature, "solvent_temperature")))


def with_top_pressure(column, pressure):
    """The column with ``pressure`` [Pa] on stage 1, the drop per stage unchanged."""
    return replace(column, top_pressure=_positive(pressure, "top_pressure"))


def with_value(column, variable, value, *, stage=None):
    """Dispatch on the variable name (see module docstring); ``stage`` for 'cooler_duty'."""
    if variable == "cooler_duty":
        if stage is None:
            raise InputError("sweep_stage", "'cooler_duty' needs the stage the cooler sits on")
        return with_cooler_duty(column, value, stage=stage)
    setters = {
        "solvent_flow": with_solvent_flow,
        "n_stages": with_stages,
        "gas_temperature": with_gas_temperature,
        "solvent_temperature": with_solvent_temperature,
        "top_pressure": with_top_pressure,
    }
    if variable not in setters:
        raise InputError("sweep_variable", f"'{variable}' cannot be varied; expected one of {', '.join(UNITS)}")
    return setters[variable](column, value)


def _uniform(values, what):
    values = np.asarray(values, dtype=float)
    if np.any(values != values[0]):
        raise InputError(
            "n_stages", f"the {what} differs from stage to stage, so a column of another size is not defined"
        )
    return float(values[0])


def _positive(value, name):
    if not (np.isfinite(value) and value > 0.0):
        raise InputError(name, f"expected a finite value > 0, found {value!r}")
    return float(value)
