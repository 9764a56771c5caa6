"""Property perturbations applied as data: component records with some values scaled, and the
property model rebuilt from them (the model's code is untouched).

A factor f multiplies, per quantity (``inputs.QUANTITIES``):
  henry_constant        H(T) at every T (ln H + ln f)
  enthalpy_of_solution  dH_sol(298.15 K), keeping H(298.15 K): ln H gains
                        (f - 1) q0 (1/T - 1/T0), q0 = dH_sol(T0)/R, so that R d ln H/d(1/T)
                        becomes dH_sol(T) + (f - 1) dH_sol(T0) (van 't Hoff); the liquid enthalpy
                        follows from the same coefficients, so the model stays consistent
  vapour_pressure       Psat(T) at every T (its slope, and so Clapeyron's latent heat, unchanged)
  heat_of_vaporisation  the latent heat at its temperature
  gas_heat_capacity, liquid_heat_capacity   Cp at every T (all coefficients)
  dissociation_constant the first dissociation constant of an 'electrolyte' solute, and the Henry's
                        constants the electrolyte data file holds (SO2, HCl): ln K of the data file's
                        constant shifted (``electrolyte_inputs``)
  murphree_efficiency   every stage's Murphree efficiency (capped at 1, ``perturbed_column``)
  overall_efficiency    the theoretical stages per actual tray (``sampled_overall_efficiency``)
"""

import math
from dataclasses import dataclass, replace

from ..properties.component import VapourPressure
from ..properties.model import PropertyModel
import numpy as np

from .electrolyte_inputs import data_constant, ln_k_shift, perturbed_data
from .inputs import COLUMN, HENRY, MURPHREE, OVERALL, REFERENCE_TEMPERATURE, SOLUTION


@dataclass(frozen=True)
class ScaledVapourPressure(VapourPressure):
    """A vapour pressure correlation times exp(ln_factor) [-]."""

    ln_factor: float = 0.0

    def ln_pressure(self, temperature):
        ln_p, slope = super().ln_pressure(temperature)
        return ln_p + self.ln_factor, slope


def perturbed_model(model, inputs, factors):
    """The property model with each input's property multiplied by its factor.

    Parameters
    ----------
    model : PropertyModel        The case's model
    inputs : sequence of UncertainInput
    factors : sequence of float  One factor per input [-]

    Returns
    -------
    PropertyModel   Same components (perturbed records), models, activity model, tables and real
    gas (its critical constants, binary parameters and partial volumes are not sampled)
    """
    scaled, shifts = {}, {}
    data = None if model.electrolyte is None else model.electrolyte.data
    for entry, factor in zip(inputs, factors):
        if entry.component == COLUMN:
            continue
        i = model.names.index(entry.component)
        constant = None if model.equilibrium[i] != "electrolyte" else data_constant(model.components[i], entry.quantity, data)
        if constant is not None:
            shifts[constant] = ln_k_shift(entry.quantity, float(factor))
        else:
            scaled.setdefault(entry.component, {})[entry.quantity] = float(factor)
    if not scaled and not shifts:
        return model
    components = [perturbed_component(c, scaled.get(c.name, {})) for c in model.components]
    return PropertyModel(components, model.equilibrium, activity=model.activity, tables=model.tables,
                         gas_phase=model.gas_phase, electrolyte_data=None if data is None else perturbed_data(data, shifts))


def perturbed_column(column, inputs, factors):
    """The column with its Murphree efficiencies times the factor of a 'murphree_efficiency'
    input, capped at 1 (the column itself without one)."""
    for entry, factor in zip(inputs, factors):
        if entry.component == COLUMN and entry.quantity == MURPHREE:
            return replace(column, murphree=np.minimum(1.0, column.murphree * float(factor)))
    return column


def sampled_overall_efficiency(inputs, factors):
    """The overall efficiency [-] of a sample (nominal times its factor, capped at 1), or None
    without an 'overall_efficiency' input."""
    for entry, factor in zip(inputs, factors):
        if entry.component == COLUMN and entry.quantity == OVERALL:
            return min(1.0, entry.value * float(factor))
    return None


def perturbed_component(component, factors):
    """A copy of ``component`` with its properties scaled by ``factors`` {quantity: f}."""
    if not factors:
        return component
    changes = {}
    if HENRY in factors or SOLUTION in factors:
        changes["henry_in_water"] = _scaled_henry(component.henry_in_water, factors.get(HENRY, 1.0),
                                                  factors.get(SOLUTION, 1.0))
    if "vapour_pressure" in factors:
        vp = component.vapour_pressure
        changes["vapour_pressure"] = ScaledVapourPressure(vp.form, vp.t_min, vp.t_max, vp.source, vp.coefficients,
                                                          math.log(factors["vapour_pressure"]))
    if "heat_of_vaporisation" in factors:
        latent = component.heat_of_vaporisation
        changes["heat_of_vaporisation"] = replace(latent, value=latent.value * factors["heat_of_vaporisation"])
    for quantity, attribute in (("gas_heat_capacity", "ideal_gas_cp"), ("liquid_heat_capacity", "liquid_cp")):
        if quantity in factors:
            cp = getattr(component, attribute)
            changes[attribute] = replace(cp, coefficients=tuple(c * factors[quantity] for c in cp.coefficients))
    return replace(component, **changes)


def _scaled_henry(henry, value_factor, enthalpy_factor):
    """Henry's-law coefficients with H(T0) times value_factor and dH_sol(T0) times enthalpy_factor."""
    return henry.scaled(value_factor, enthalpy_factor, REFERENCE_TEMPERATURE)  # either form of the constant
