"""The library's equilibrium models for water as the solvent: a library component whose file names
``equilibrium_in_water`` (NH3, CO2, H2S, SO2 and HCl: 'electrolyte') takes that model in a case
whose solvent is water, unless the case gives its ``equilibrium``; with any other solvent it
keeps its own (``equilibrium``, 'henry')."""

import dataclasses

HENRY_KEYS = ("henry_constant", "henry_temperature", "enthalpy_of_solution")  # physical Henry's law's values


def in_water_defaults(components, readers, solvent):
    """The components (list) with ``equilibrium_in_water`` applied where it is due.

    ``readers``: the case's component readers (``components._ComponentReader``), one per component;
    ``solvent``: index of the case's solvent, or None when not yet known (then nothing changes).
    Applies only when the solvent is water with 'raoult'. A component table that gives Henry's-law
    values but no ``equilibrium`` is refused: the values would not be used.
    """
    if solvent is None or not components[solvent].is_water or components[solvent].equilibrium != "raoult":
        return components
    out = list(components)
    for i, (component, reader) in enumerate(zip(components, readers)):
        if reader.base is None or component.equilibrium_in_water is None or reader.has("equilibrium"):
            continue
        given = [key for key in HENRY_KEYS if reader.has(key)]
        if given:
            reader.fail(given[0], f"is a value of physical Henry's law, but in water '{component.name}' takes the "
                        f"model '{component.equilibrium_in_water}' by default (the library's), which would not "
                        "use it; write equilibrium = \"henry\" in this table to keep Henry's law with it")
        out[i] = dataclasses.replace(component, equilibrium=component.equilibrium_in_water)
        reader.in_water_default = True
    return out
