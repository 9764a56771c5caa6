"""The solvent must be liquid where the case puts it: in its feed, and on the stages of an
isothermal column (fixed temperatures no energy balance can move). A solvent fed frozen or
boiling, or a stage held above the solvent's boiling point at its pressure, is refused at case
load naming the key, instead of leaving the solver to fail on a column with no liquid."""

import numpy as np

from ..numerics import brent_root


def check_solvent_feed(section, model, solvent, top_pressure, temperature):
    """Refuse a solvent feed (Section ``section``, at ``temperature`` [K]) below the solvent's
    melting point or above its boiling point at the top pressure [Pa] (vapour pressure above it)."""
    component = model.components[solvent]
    shown = f"{section.data['temperature']!r} = {temperature:.2f} K"
    if component.melting_point is not None and temperature < component.melting_point.value:
        section.fail("temperature", f"found {shown}, below the melting point of {component.name} "
                     f"({component.melting_point.value:.2f} K): the solvent would be frozen")
    if model.equilibrium[solvent] == "raoult":
        k = _solvent_k(model, solvent, temperature, top_pressure)
        if k >= 1.0:
            section.fail("temperature", f"found {shown}, at which the vapour pressure of {component.name} "
                         f"({k * top_pressure / 1e3:.4g} kPa) exceeds the top pressure ({top_pressure / 1e3:.4g} kPa): "
                         "the solvent would boil; feed it colder or raise column.top_pressure")


def check_isothermal_stages(section, model, solvent, column, feed_temperature):
    """Refuse isothermal stage temperatures (``column.temperature`` [K]) at or above the solvent's
    boiling point at the stage's pressure, or below its melting point; ``section`` is the
    ``[column]`` table and ``feed_temperature`` [K] the solvent feed's (already below boiling)."""
    if column.temperature is None:
        return
    component = model.components[solvent]
    key = "isothermal_temperature"
    raw = section.data.get(key)
    for j, (t, p) in enumerate(zip(column.temperature, column.pressures)):
        where = f"{key}[{j}]" if isinstance(raw, list) else key
        shown = f"found {_shown(section.data, key, j)} = {t:.2f} K"
        if component.melting_point is not None and t < component.melting_point.value:
            section.fail(where, f"{shown} on stage {j + 1}, below the melting point of {component.name} "
                         f"({component.melting_point.value:.2f} K): the solvent would freeze")
        if model.equilibrium[solvent] == "raoult" and _solvent_k(model, solvent, t, p) >= 1.0:
            boiling = brent_root(lambda x: np.log(_solvent_k(model, solvent, x, p)), feed_temperature, t, xtol=1e-3)
            section.fail(where, f"{shown} on stage {j + 1}, at or above the boiling point of {component.name} at that "
                         f"stage's pressure ({p / 1e3:.4g} kPa), {boiling:.2f} K ({boiling - 273.15:.2f} degC): no "
                         "liquid solvent can stay on the stage; give a lower temperature or raise column.top_pressure")


def _solvent_k(model, solvent, temperature, pressure):
    return float(model.evaluate(np.array([temperature]), np.array([pressure])).k[0, solvent])


def _shown(data, key, j):
    raw = data.get(key)
    return repr(raw[j] if isinstance(raw, list) else raw)
