"""The composition-dependent liquids of a property model and how they are applied.

``PropertyModel.evaluate`` first fills every component's ideal-solution values (Henry's law,
Raoult's law, the liquid heat capacities) into a ``StageArrays``, then hands it, with the stage
temperatures, pressures and liquid mole fractions, to each composition-dependent liquid in turn:

    liquid.apply(props, t, p, x)     # in place: ln K, its T- and x-derivatives, h_L, dh_L/dT
    liquid.range_warnings(t, x)      # optional: plain-language warnings (list of str)

The liquids are, in this order: the activity-coefficient liquid (``ActivityMembers``, around
``liquid.AnchoredLiquid``), each equilibrium-table solute (``TableSolute``), the Peng-Robinson
liquid of the 'eos' components (``eos_liquid.EosLiquid``), the aqueous electrolyte liquid of the
'electrolyte' solutes (``electrolyte.AqueousElectrolyte``, built by ``aqueous_electrolyte``) and any further liquid with the same
two methods (the hook a new composition-dependent liquid plugs into: ``PropertyModel`` takes it
from ``liquids_of``). Whatever a liquid does to ln K, it must give h_L the matching enthalpy,
h_L = h_V - R T**2 d ln K/dT at fixed x, so the van 't Hoff identity holds (DESIGN.md section 3).
"""

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .binary import kij_matrix
from .constants import GAS_CONSTANT
from .eos_liquid import EosLiquid
from .equilibrium_table import TINY
from .liquid import AnchoredLiquid

SODIUM_HYDROXIDE_CAS = "1310-73-2"


@dataclass
class StageArrays:
    """The arrays of ``model.StageProperties`` while they are filled in, with ln K in place of K;
    each (n_stages, n_components) [as there], ``dlnk_dx`` (n_stages, n_components, n_components)."""

    ln_k: np.ndarray
    dlnk_dt: np.ndarray
    h_vapour: np.ndarray
    dh_vapour_dt: np.ndarray
    h_liquid: np.ndarray
    dh_liquid_dt: np.ndarray
    dlnk_dx: np.ndarray


class ActivityMembers:
    """The members of an activity-coefficient liquid inside a property model.

    Parameters
    ----------
    activity : Unifac or Nrtl        The activity model (``activity.py``)
    names, equilibrium, components   The property model's component names, models and records
    """

    def __init__(self, activity, names, equilibrium, components):
        n_components = len(names)
        members = [_position(names, name, "activity") for name in activity.names]
        for i in members:
            if equilibrium[i] not in ("raoult", "activity", "nonvolatile"):
                raise InputError(names[i], f"a member of the liquid activity model must be 'raoult', 'activity' or "
                                           f"'nonvolatile', not '{equilibrium[i]}'")
        outside = [names[i] for i, kind in enumerate(equilibrium) if kind == "activity" and i not in members]
        if outside:
            raise InputError("activity", f"{', '.join(outside)} use model 'activity' but are not in the activity model")
        water = [p for p, i in enumerate(members) if components[i].is_water]
        anchored = [(p, components[i].henry_in_water, components[i].vapour_pressure)
                    for p, i in enumerate(members) if equilibrium[i] == "activity"]
        self.liquid = AnchoredLiquid(activity, members, anchored, water[0] if water else None)
        self._ideal = np.array([p for p, i in enumerate(members) if equilibrium[i] != "activity"], dtype=int)
        self._pairs = (np.array(members)[:, None] * n_components + np.array(members)[None, :]).reshape(-1)

    def apply(self, props, t, p, x):
        """Activity coefficients into ln K, excess enthalpies into h_liquid (in place)."""
        liquid = self.liquid
        phi, dphi, d2phi, dphi_dx = liquid.evaluate(x, t)
        tt = t[:, None]
        ln_p = np.log(p)[:, None]
        h_excess = -GAS_CONSTANT * tt * tt * dphi
        dh_excess = -GAS_CONSTANT * (2.0 * tt * dphi + tt * tt * d2phi)
        ideal, anchored, members = self._ideal, liquid.anchored, liquid.members
        i, a = members[ideal], members[anchored]
        props.ln_k[:, i] += phi[:, ideal]
        props.dlnk_dt[:, i] += dphi[:, ideal]
        props.h_liquid[:, i] += h_excess[:, ideal]
        props.dh_liquid_dt[:, i] += dh_excess[:, ideal]
        # anchored solutes: phi = ln(gamma Psat); Henry reference, h_L = h_V - R T**2 dlnK/dT
        props.ln_k[:, a] = phi[:, anchored] - ln_p
        props.dlnk_dt[:, a] = dphi[:, anchored]
        props.h_liquid[:, a] = props.h_vapour[:, a] + h_excess[:, anchored]
        props.dh_liquid_dt[:, a] = props.dh_vapour_dt[:, a] + dh_excess[:, anchored]
        n = t.size
        props.dlnk_dx.reshape(n, -1)[:, self._pairs] += dphi_dx.reshape(n, -1)


class TableSolute:
    """One 'table' solute i of a property model with its solvent s (``equilibrium_table``).

    Parameters
    ----------
    index, solvent : int         Positions of the solute and of its table's solvent
    name : str                   The solute's name (for warnings)
    table : TableEquilibrium     The prepared table (``EquilibriumTable.prepared``)
    """

    def __init__(self, index, solvent, name, table):
        self.index, self.solvent, self.name, self.table = index, solvent, name, table

    def apply(self, props, t, p, x):
        """Solute i from its table, and the Gibbs-Duhem complement on its solvent s (in place).
        See ``equilibrium_table`` for the formulas."""
        i, s = self.index, self.solvent
        x_i, x_s = x[:, i], np.maximum(x[:, s], TINY)
        u = x_i / x_s
        r = self.table.evaluate(u, t)
        tau2 = 1.0 / (t * t)
        props.ln_k[:, i] = r["ln_p_over_u"] + np.log1p(u) - np.log(p)
        props.dlnk_dt[:, i] = -tau2 * r["dln_p_dtau"]
        props.h_liquid[:, i] = props.h_vapour[:, i] + GAS_CONSTANT * r["dln_p_dtau"]
        props.dh_liquid_dt[:, i] = props.dh_vapour_dt[:, i] - GAS_CONSTANT * tau2 * r["d2ln_p_dtau2"]
        props.ln_k[:, s] += np.log1p(u) - r["integral"]
        props.dlnk_dt[:, s] += tau2 * r["dintegral_dtau"]
        props.h_liquid[:, s] -= GAS_CONSTANT * r["dintegral_dtau"]
        props.dh_liquid_dt[:, s] += GAS_CONSTANT * tau2 * r["d2integral_dtau2"]
        # g = d ln K_i / d ln u; d ln gamma_s / d ln u = -u g; u = x_i / x_s
        g = r["slope"] - 1.0 / (1.0 + u)
        props.dlnk_dx[:, i, i] += np.divide(g, x_i, out=np.zeros_like(g), where=x_i > 0.0)
        props.dlnk_dx[:, i, s] -= g / x_s
        props.dlnk_dx[:, s, i] -= g / x_s
        props.dlnk_dx[:, s, s] += u * g / x_s

    def range_warnings(self, t, x):
        """The table's warnings for temperatures outside its isotherms or (given the liquid mole
        fractions (n, c)) loadings outside its points."""
        ratios = None if x is None else x[:, self.index] / np.maximum(x[:, self.solvent], TINY)
        return self.table.range_warnings(self.name, t, ratios)


def table_solutes(names, equilibrium, molar_mass, tables):
    """A ``TableSolute`` for every 'table' component, each checked against ``tables``
    (name -> ``EquilibriumTable``)."""
    prepared = []
    for i, kind in enumerate(equilibrium):
        if kind != "table":
            continue
        table = tables.get(names[i])
        if table is None:
            raise InputError(names[i], "equilibrium model 'table' needs an equilibrium table (tables={name: ...})")
        s = _position(names, table.solvent, f"{names[i]}: table.solvent")
        if equilibrium[s] not in ("raoult", "nonvolatile"):
            raise InputError(f"{names[i]}: table.solvent", f"'{table.solvent}' must be a 'raoult' or 'nonvolatile' liquid")
        prepared.append(TableSolute(i, s, names[i], table.prepared(molar_mass[i], molar_mass[s])))
    table_names = {names[i] for i, kind in enumerate(equilibrium) if kind == "table"}
    extra = [name for name in tables if name not in table_names]
    if extra:
        raise InputError("tables", f"tables given for {', '.join(extra)}, whose equilibrium model is not 'table'")
    return prepared


def eos_liquid(components, equilibrium):
    """The Peng-Robinson liquid of the 'eos' components (``eos_liquid.EosLiquid``), or None."""
    members = [i for i, kind in enumerate(equilibrium) if kind == "eos"]
    chosen = [components[i] for i in members]
    return EosLiquid(members, chosen, kij_matrix(chosen)[0]) if chosen else None


def aqueous_electrolyte(components, equilibrium, data=None):
    """The aqueous electrolyte liquid (``electrolyte.AqueousElectrolyte``, on ``data``: default the
    library's data file) of the 'electrolyte' solutes, with water (a 'raoult' component) and any
    non-volatile sodium hydroxide as members; None without 'electrolyte' solutes (then sodium
    hydroxide is a plain non-volatile liquid, as every component is under physical Henry's law).
    A solute the liquid does not know, or no water, is refused."""
    from .electrolyte import AqueousElectrolyte  # only cases with electrolytes load its data

    caustic = [i for i, c in enumerate(components) if c.cas == SODIUM_HYDROXIDE_CAS and equilibrium[i] == "nonvolatile"]
    solutes = [i for i, kind in enumerate(equilibrium) if kind == "electrolyte"]
    if not solutes:
        return None
    for i in solutes:
        if components[i].cas not in AqueousElectrolyte.SUPPORTED_CAS or components[i].is_water:
            raise InputError(components[i].name, "equilibrium model 'electrolyte' is known for ammonia, carbon dioxide, "
                             "hydrogen sulfide, sulfur dioxide, hydrogen chloride and sodium hydroxide in water "
                             f"only (CAS {components[i].cas} is none of them)")
    water = [i for i, c in enumerate(components) if c.is_water and equilibrium[i] == "raoult"]
    if not water:
        first = components[(solutes + caustic)[0]].name
        raise InputError(first, "the aqueous electrolyte liquid needs water in the liquid, with equilibrium 'raoult'")
    for i in solutes:
        if components[i].cas == SODIUM_HYDROXIDE_CAS:
            raise InputError(components[i].name, "sodium hydroxide is non-volatile: give it equilibrium 'nonvolatile' "
                             "(it joins the electrolyte liquid by itself)")
    return AqueousElectrolyte(components, sorted(water[:1] + solutes + caustic), data)


def _position(names, name, where):
    if name not in names:
        raise InputError(where, f"'{name}' is not a component of the model; expected one of {', '.join(names)}")
    return names.index(name)
