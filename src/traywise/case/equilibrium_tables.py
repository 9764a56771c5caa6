"""The ``[component."name".equilibrium_table]`` of a case: a solute's partial pressure over its
solution against the liquid loading, at one or more temperatures (plant or handbook data),
turned into the ``EquilibriumTable`` that ``PropertyModel(tables=...)`` takes, in SI.
Format: cases/README.md."""

import math

import numpy as np

from ..errors import InputError
from ..properties.equilibrium_table import EquilibriumTable

TABLE_KEYS = ("solvent", "loading_basis", "isotherm", "enthalpy_of_solution", "source")
ISOTHERM_KEYS = ("temperature", "loadings", "partial_pressures", "gas_mole_fractions", "pressure")
# loading basis as written -> EquilibriumTable basis
LOADING_BASES = {"mole fraction": "mole_fraction", "mole ratio": "mole_ratio", "mass ratio": "mass_ratio"}
TABLE_SOLVENT_KINDS = ("raoult", "nonvolatile")


def read_equilibrium_table(section, index, components, default_solvent):
    """(EquilibriumTable, echo) of the component ``components[index]`` from its table.

    Parameters
    ----------
    section : Section        The ``equilibrium_table`` table
    index : int              Position of the solute in ``components``
    components : sequence of Component   Every component of the case, its ``equilibrium`` the case's model
    default_solvent : int or None        The case's solvent, when known from the top level

    Returns
    -------
    (EquilibriumTable, dict)   The table in SI and its echo (SI, units in the keys)
    """
    solute = components[index]
    solvent = _solvent(section, index, components, default_solvent)
    written_basis = section.text("loading_basis", choices=tuple(LOADING_BASES))
    basis = LOADING_BASES[written_basis]
    isotherms = sorted(
        (_isotherm(item, basis) for item in section.tables("isotherm", ISOTHERM_KEYS)), key=lambda found: found[0]
    )
    if not isotherms:
        section.fail("isotherm", "missing; expected one or more [[...equilibrium_table.isotherm]] tables, each with "
                     "temperature, loadings and partial_pressures (or gas_mole_fractions and pressure)")
    for (t_low, *_), (t_high, _, _, item) in zip(isotherms, isotherms[1:]):
        if t_high - t_low < 1e-9:
            item.fail("temperature", f"{t_low:.2f} K is the temperature of another isotherm; give each temperature once")
    source = section.source("the data", "plant measurements, handbook table, or 'invented for a demo'")
    enthalpy = _enthalpy(section, solute, components[solvent], isotherms)
    if enthalpy is not None and "enthalpy_of_solution" not in section:
        citation = solute.cite(solute.henry_in_water.source)
        source += (f"; enthalpy of solution {enthalpy / 1e3:.4g} kJ/mol from the temperature dependence of the Henry's "
                   f"constant in water ({citation})")
    temperatures = tuple(found[0] for found in isotherms)
    try:
        table = EquilibriumTable(
            components[solvent].name,
            temperatures,
            tuple(tuple(found[1]) for found in isotherms),
            tuple(tuple(found[2]) for found in isotherms),
            basis=basis,
            enthalpy_of_solution=enthalpy,
            source=source,
        )
    except InputError as error:  # checked above; kept so that no input ever ends in a traceback
        section.fail(None, error.message)
    loading_key = "loadings_kg_per_kg" if basis == "mass_ratio" else "loadings_mol_per_mol"
    echo = {
        "solvent": components[solvent].name,
        "loading_basis": written_basis,
        "isotherms": [
            {"temperature_K": t, loading_key: list(loadings), "partial_pressures_Pa": list(pressures)}
            for t, loadings, pressures, _ in isotherms
        ],
        "enthalpy_of_solution_J_per_mol": enthalpy,
        "source": source,
    }
    return table, echo


def default_table_solvent(top, components):
    """Index of the case's solvent as far as the top level tells it before the property model
    exists (the ``solvent`` named there, else the only 'raoult' or 'nonvolatile' component), or None."""
    text = top.data.get("solvent")
    if isinstance(text, str):
        return next((i for i, c in enumerate(components) if c.name == text or c.matches(text)), None)
    liquids = [i for i, c in enumerate(components) if c.equilibrium in TABLE_SOLVENT_KINDS]
    return liquids[0] if len(liquids) == 1 else None


def _solvent(section, index, components, default_solvent):
    """Index of the table's solvent: named under ``solvent``, else the case's solvent."""
    if "solvent" not in section:
        if default_solvent is None:
            section.raw("solvent", expected="the component the solute is dissolved in, e.g. solvent = \"water\"")
        i, text = default_solvent, f"{components[default_solvent].name} (the case's solvent)"
    else:
        text = section.text("solvent")
        i = next((j for j, c in enumerate(components) if c.name == text or c.matches(text)), None)
        if i is None:
            names = ", ".join(f"'{c.name}'" for c in components)
            section.fail("solvent", f"'{text}' is not a component of this case; its components are {names}")
    if i == index:
        section.fail("solvent", f"'{text}' is the solute of this table; name the liquid it dissolves in")
    if components[i].equilibrium not in TABLE_SOLVENT_KINDS:
        section.fail("solvent", f"'{text}' has equilibrium '{components[i].equilibrium}'; the solvent of a table needs "
                     f"one of {TABLE_SOLVENT_KINDS}")
    return i


def _isotherm(item, basis):
    """(temperature [K], loadings, partial pressures [Pa], the Section) of one isotherm."""
    temperature = item.quantity("temperature", "temperature")
    loadings = _rising(item, "loadings", "fraction", "numbers such as [0.001, 0.005, 0.02]")
    if basis == "mole_fraction" and loadings[-1] >= 1.0:
        item.fail(f"loadings[{len(loadings) - 1}]", f"found {loadings[-1]:g}; a mole fraction is below 1")
    has_pressures, has_fractions = "partial_pressures" in item, "gas_mole_fractions" in item
    if has_pressures == has_fractions:
        item.fail(None, "give either partial_pressures, or gas_mole_fractions with the pressure they were measured at")
    if has_pressures:
        if "pressure" in item:
            item.fail("pressure", "applies only with gas_mole_fractions; partial pressures are absolute already")
        pressures = _rising(item, "partial_pressures", "pressure", 'pressures such as ["0.2 kPa", "1.5 kPa"]')
        key = "partial_pressures"
    else:
        fractions = _rising(item, "gas_mole_fractions", "fraction", 'fractions such as ["500 ppmv", "0.2 mol%"]')
        if fractions[-1] >= 1.0:
            item.fail(f"gas_mole_fractions[{len(fractions) - 1}]", f"found {fractions[-1]:g}; a mole fraction is below 1")
        total = item.quantity("pressure", "pressure")
        if total <= 0.0:
            item.fail("pressure", f"found {item.data['pressure']!r}; expected an absolute pressure > 0")
        pressures = fractions * total
        key = "gas_mole_fractions"
    if pressures.size != loadings.size:
        item.fail(key, f"has {pressures.size} values for {loadings.size} loadings; give one per loading")
    return temperature, loadings, pressures, item


def _rising(item, key, kinds, example):
    """A non-empty list of values > 0 that rise strictly, in SI."""
    values = item.raw(key, expected=f"a list of {example}")
    if not isinstance(values, list) or not values:
        item.fail(key, f"found {values!r}; expected a list of {example}")
    numbers = np.array([item.convert(f"{key}[{k}]", value, kinds)[0] for k, value in enumerate(values)])
    for k, number in enumerate(numbers):
        if not number > 0.0:
            item.fail(f"{key}[{k}]", f"found {values[k]!r}; expected a value > 0")
        if k and not number > numbers[k - 1]:
            item.fail(f"{key}[{k}]", f"found {values[k]!r} after {values[k - 1]!r}; the values must rise along the list")
    return numbers



def _enthalpy(section, solute, solvent, isotherms):
    """Enthalpy of solution [J/mol] for a single isotherm: as given, else from the solute's
    Henry's constant in water when the solvent is water; None with several isotherms."""
    if len(isotherms) > 1:
        if "enthalpy_of_solution" in section:
            section.fail("enthalpy_of_solution", "applies only to a single isotherm; with several, it follows from "
                         "how the partial pressures change between them")
        return None
    if "enthalpy_of_solution" in section:
        value, kind = section.convert("enthalpy_of_solution", section.data["enthalpy_of_solution"],
                                      ("molar_energy", "specific_energy"))
        value = value * solute.molar_mass.value if kind == "specific_energy" else value
        if not math.isfinite(value):
            section.fail("enthalpy_of_solution", "expected a finite energy")
        return value
    water = solvent.is_water
    if solute.henry_in_water is None or not water:
        section.raw("enthalpy_of_solution", expected='an energy such as "-30 kJ/mol" (negative when dissolving releases '
                    "heat): a single isotherm gives no temperature dependence (or add a second isotherm)")
    return float(solute.henry_in_water.solution_enthalpy(isotherms[0][0]))
