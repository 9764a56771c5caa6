"""The sampled constants of the aqueous electrolyte liquid, and their perturbation as data.

For an 'electrolyte' solute two values are sampled (``inputs.QUANTITIES``):

  henry_constant         the Henry's constant of its molecular form at every T: from the component
                         file for NH3, CO2 and H2S (perturbed there, as for a 'henry' gas), from the
                         electrolyte data file for SO2 and HCl (its solubility constant there, ln K
                         less ln f: a Henry's constant times f is a solubility constant over f)
  dissociation_constant  its first dissociation constant (NH3 + H2O = NH4+ + OH-, CO2 + H2O =
                         H+ + HCO3-, H2S = H+ + HS-, SO2 + H2O = H+ + HSO3-) at every T, ln K plus ln f

A factor on ln K's constant term leaves its temperature dependence, and so the heats of solution
and dissociation, unchanged: the perturbed liquid stays consistent with its own enthalpy. The
relative uncertainty of a data-file constant is the one its note states (``K = 1.23 +- 0.05``),
else its difference from the second source the file checks it against at 25 degC, at least
DATA_FILE_FLOOR. Not sampled: the temperature dependence of the data file's constants, the
second dissociations, the carbamate constant and the Pitzer parameters (the run says so).
"""

import math
import re
from dataclasses import replace

HENRY, DISSOCIATION = "henry_constant", "dissociation_constant"
FIRST_DISSOCIATION = {"NH3": "ammonia", "CO2": "carbon_dioxide_1", "H2S": "hydrogen_sulfide_1",
                      "SO2": "sulfur_dioxide_1"}
DATA_FILE_FLOOR = 0.02  # smallest u of a data-file constant [-]: two sources agreeing closely do not
# make a constant known better than this (our judgement)
_STATED = re.compile(r"K = ([0-9.]+) \+- ([0-9.]+)")
ELECTROLYTE_NOT_SAMPLED = ("the Pitzer parameters, second dissociation and carbamate constants and the temperature "
                           "dependence of the data file's constants of the aqueous electrolyte liquid")


def data_constant(component, quantity, data):
    """(table, name) of the data-file constant behind a solute's quantity ('henry' or 'reactions'
    of ``data``), or None where the component file holds it (or there is none)."""
    from ..properties.electrolyte.liquid import CAS  # only cases with electrolytes load the liquid

    solute = CAS.get(component.cas)
    if quantity == DISSOCIATION:
        return ("reactions", FIRST_DISSOCIATION[solute]) if solute in FIRST_DISSOCIATION else None
    if quantity == HENRY:
        if solute == "HCl":
            return ("reactions", "hydrogen_chloride")
        if solute in data.henry:
            return ("henry", solute)
    return None


def data_uncertainty(constant, data):
    """(u [-], basis) of a data-file constant (module docstring)."""
    table, name = constant
    entry = getattr(data, table)[name]
    stated = _STATED.search(entry.note)
    if stated:
        value, spread = float(stated.group(1)), float(stated.group(2))
        return spread / value, f"uncertainty stated by {entry.source} (electrolyte data file note)"
    k_25 = math.exp(float(entry.ln_k(298.15)[0]))
    difference = abs(k_25 / entry.check_25C - 1.0)
    return (max(difference, DATA_FILE_FLOOR),
            f"difference from the second source at 25 degC ({entry.check_source.split(':')[0]}), at least "
            f"{100 * DATA_FILE_FLOOR:g} %")


def perturbed_data(data, shifts):
    """``data`` with ln K of each constant shifted: shifts {(table, name): added to ln K}."""
    if not shifts:
        return data
    tables = {"reactions": dict(data.reactions), "henry": dict(data.henry)}
    for (table, name), shift in shifts.items():
        entry = tables[table][name]
        a, b, c, d = entry.coefficients
        tables[table][name] = replace(entry, coefficients=(a, b, c, d + shift))
    return replace(data, **tables)


def ln_k_shift(quantity, factor):
    """What a factor on the sampled value adds to ln K of its data-file constant [-]."""
    return math.log(factor) if quantity == DISSOCIATION else -math.log(factor)
