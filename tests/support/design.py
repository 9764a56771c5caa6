"""A concentrated, adiabatic scrubber shared by the design tests (no tests of its own).

Water-like evaporating solvent, air-like carrier (dissolving a little), ammonia-like solute:
test numbers chosen to resemble those systems, recalled from memory (water's vapour pressure
and heat of vaporisation at 25 degC, a Henry's constant of about 9.4e4 Pa for ammonia in water
and a heat of solution of 35 kJ/mol); not a reference check of any of them.
"""

import numpy as np

from traywise.column import Column, Feed
from traywise.properties.inline import inline_component
from traywise.properties.model import PropertyModel


def scrubber_model():
    water = inline_component(
        "water-like", molar_mass=0.018015, ideal_gas_cp=33.6, equilibrium="raoult",
        vapour_pressure=(3169.9, 298.15), heat_of_vaporisation=43990.0, liquid_cp=75.3,
    )
    air = inline_component("air-like", molar_mass=0.029, ideal_gas_cp=29.1, equilibrium="henry", henry=(7e9, 298.15, -10e3))
    solute = inline_component(
        "ammonia-like", molar_mass=0.017, ideal_gas_cp=35.6, equilibrium="henry", henry=(9.4e4, 298.15, -35e3)
    )
    return PropertyModel([water, air, solute])


def scrubber_column(n_stages, solvent_flow, solute_fraction=0.15, **options):
    """Solvent at 298.15 K on top, dry gas (1 mol/s) at 303.15 K below, 1 atm, adiabatic."""
    gas = np.array([0.0, 1.0 - solute_fraction, solute_fraction])
    return Column(
        n_stages,
        Feed(1, "liquid", np.array([solvent_flow, 0.0, 0.0]), 298.15),
        Feed(n_stages, "vapour", gas, 303.15),
        101325.0,
        **options,
    )
