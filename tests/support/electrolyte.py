"""Builders for the electrolyte liquid's tests: library components, the property model's ideal
values, and ``AqueousElectrolyte.apply`` on top of them."""

from dataclasses import replace

import numpy as np

from traywise.errors import ComponentDataError
from traywise.properties.component import Quantity
from traywise.properties.electrolyte import AqueousElectrolyte
from traywise.properties.inline import inline_component
from traywise.properties.library import find_component
from traywise.properties.composition_liquids import StageArrays as _Arrays
from traywise.properties.model import PropertyModel

NAMES = {"NH3": "ammonia", "CO2": "carbon dioxide", "H2S": "hydrogen sulfide", "SO2": "sulfur dioxide",
         "HCl": "hydrogen chloride"}
MMHG = 133.322368  # Pa (common practice)


def sodium_hydroxide():
    """The library's sodium hydroxide when it has one, else a stand-in for these tests only:
    molar mass 0.039997 kg/mol (recalled from memory); heat capacities are placeholders that
    no check here depends on (the checks compare enthalpies at one temperature)."""
    try:
        return find_component("1310-73-2")
    except ComponentDataError:  # not in the library yet
        stand_in = inline_component("sodium hydroxide", molar_mass=0.039997, ideal_gas_cp=50.0,
                                    equilibrium="nonvolatile", liquid_cp=80.0, formula="NaOH")
        return replace(stand_in, cas="1310-73-2", molar_mass=Quantity(0.039997, "recalled from memory"))


def components(*solutes):
    """Water first, then the named solutes ('NH3', ..., 'NaOH')."""
    found = [find_component("water")]
    for solute in solutes:
        found.append(sodium_hydroxide() if solute == "NaOH" else find_component(NAMES[solute]))
    return found


class ElectrolyteCase:
    """Water and solutes with the electrolyte liquid over the property model's ideal values."""

    def __init__(self, *solutes):
        self.solutes = solutes
        self.components = components(*solutes)
        kinds = ["raoult"] + ["nonvolatile" if s == "NaOH" else "henry" for s in solutes]
        self.model = PropertyModel(self.components, kinds)
        self.liquid = AqueousElectrolyte(self.components, range(len(self.components)))
        self.m_w = self.components[0].molar_mass.value

    def mole_fractions(self, molalities):
        """Liquid mole fractions (n, c) of water and the solutes at molalities (n, k) [mol/kg]."""
        molalities = np.atleast_2d(np.asarray(molalities, dtype=float))
        moles = np.concatenate([np.full((molalities.shape[0], 1), 1.0 / self.m_w), molalities], axis=1)
        return moles / moles.sum(axis=1, keepdims=True)

    def properties(self, t, p, x):
        """``_Arrays`` after the electrolyte liquid is applied."""
        t = np.atleast_1d(np.asarray(t, dtype=float))
        p = np.broadcast_to(np.asarray(p, dtype=float), t.shape)
        x = np.asarray(x, dtype=float).reshape(t.size, -1)
        base = self.model.evaluate(t, p)
        with np.errstate(divide="ignore"):
            ln_k = np.log(base.k)
        props = _Arrays(ln_k, base.dlnk_dt.copy(), base.h_vapour.copy(), base.dh_vapour_dt.copy(),
                        base.h_liquid.copy(), base.dh_liquid_dt.copy(), np.zeros((t.size,) + (x.shape[1],) * 2))
        self.liquid.apply(props, t, p, x)
        return props

    def partial_pressures(self, t, molalities, p=101325.0):
        """Partial pressures [Pa] of the solutes over the liquid of those molalities (n, k)."""
        x = self.mole_fractions(molalities)
        props = self.properties(np.broadcast_to(t, x.shape[:1]), p, x)
        return np.exp(props.ln_k) * x * p
