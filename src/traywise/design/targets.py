"""What a design aims at: a removal target on one key solute, a temperature limit, and a limit
on one component's concentration in the liquid leaving the bottom.

Each target gives a signed, smooth 'shortfall' that is positive while the target is not met and
negative once it is exceeded, so that an outer loop can bracket and solve shortfall = 0:

  outlet mole fraction y_t (or ppmv):  shortfall = ln(y / y_t)
  fraction absorbed f_t:               shortfall = ln((1 - f) / (1 - f_t))
  temperature limit T_max:             shortfall = T - T_max  [K]
  liquid outlet limit x_max (or w_max): shortfall = ln(x / x_max)

The logarithms make the solute shortfall nearly straight against the logarithm of the solvent
flow and against the stage count (Kremser's equation is geometric in both), which is what the
secant steps of Brent's method like. Outlet mole fractions are on the gas as it leaves,
solvent vapour included (wet basis); ppmv = 1e6 x mole fraction for an ideal gas.
"""

import math
from dataclasses import dataclass, replace

import numpy as np

from ..errors import InputError

SOLUTE_QUANTITIES = ("outlet_mole_fraction", "outlet_ppmv", "fraction_absorbed")
TEMPERATURE_PLACES = ("liquid_outlet", "column_maximum")
LIQUID_BASES = ("mole_fraction", "mass_fraction")
SMALLEST = float(np.nextafter(0.0, 1.0))


@dataclass(frozen=True)
class SoluteTarget:
    """A removal target on the key solute.

    key : str         The solute (name, alias, formula or CAS number)
    quantity : str    'outlet_mole_fraction' [-], 'outlet_ppmv' [ppmv] or 'fraction_absorbed' [-]
    value : float     The required value in those units: the outlet at most, or the fraction
                      absorbed at least
    """

    key: str
    quantity: str
    value: float

    def __post_init__(self):
        if self.quantity not in SOLUTE_QUANTITIES:
            expected = ", ".join(SOLUTE_QUANTITIES)
            raise InputError("target", f"quantity '{self.quantity}' unknown; expected one of {expected}")
        upper = 1e6 if self.quantity == "outlet_ppmv" else 1.0
        if not 0.0 < self.value < upper:
            raise InputError(
                "target", f"{self.quantity} must lie between 0 and {upper:g} (exclusive), found {self.value!r}"
            )

    def for_model(self, model):
        """The same target with the key written as the model's component name."""
        return replace(self, key=model.names[model.component_index(self.key)])

    @property
    def unit(self):
        return "ppmv" if self.quantity == "outlet_ppmv" else "-"

    def reached(self, solution):
        """The target quantity in a ``ColumnSolution``, in the target's units."""
        i = self._index(solution.component_names)
        if self.quantity == "fraction_absorbed":
            return float(solution.fraction_absorbed[i])
        mole_fraction = float(solution.gas_out[i] / solution.gas_out.sum())
        return mole_fraction * 1e6 if self.quantity == "outlet_ppmv" else mole_fraction

    def shortfall(self, solution):
        """Signed, positive while not met (see module docstring) [-]."""
        if self.quantity != "fraction_absorbed":
            return self._shortfall(self.reached(solution))
        i = self._index(solution.component_names)
        fed = solution.column.feed_matrix("vapour", len(solution.component_names)).sum(axis=0)[i]
        return _log_ratio(solution.gas_out[i] / fed, 1.0 - self.value)  # 1 - f without cancellation

    def shortfall_without_stages(self, column, names):
        """The shortfall of a column with no stages: the gas leaves as it came [-]."""
        i = self._index(names)
        gas = column.gas.component_flows
        if gas[i] <= 0.0:
            raise InputError("target", f"the gas feed carries no {self.key}, so there is nothing to absorb")
        if self.quantity == "fraction_absorbed":
            return self._shortfall(0.0)
        mole_fraction = gas[i] / gas.sum()
        return self._shortfall(mole_fraction * 1e6 if self.quantity == "outlet_ppmv" else mole_fraction)

    def describe(self, value=None):
        """Plain words for the target, or for a reached ``value``."""
        value = self.value if value is None else value
        words = {"outlet_mole_fraction": "mole fraction in the gas out", "outlet_ppmv": "ppmv in the gas out"}
        if self.quantity == "fraction_absorbed":
            return f"{value:.6g} of the {self.key} absorbed"
        return f"{value:.6g} {self.key} {words[self.quantity]}"

    def _shortfall(self, reached):
        if self.quantity == "fraction_absorbed":
            return _log_ratio(1.0 - reached, 1.0 - self.value)
        return _log_ratio(reached, self.value)

    def _index(self, names):
        key = self.key.strip().lower()
        lowered = [n.lower() for n in names]
        if key in lowered:
            return lowered.index(key)
        raise InputError("target", f"the key solute '{self.key}' is not among the components {', '.join(names)}")


def _log_ratio(reached, required):
    """ln(reached / required); a reached value of exactly 0 (the key fully absorbed to the last
    bit) counts as the smallest positive float, so the sign stays right and the value finite."""
    return math.log(max(float(reached), SMALLEST) / required)


@dataclass(frozen=True)
class TemperatureLimit:
    """An upper limit on a column temperature.

    place : str       'liquid_outlet' (bottom stage) or 'column_maximum' (hottest stage)
    value : float     The highest temperature allowed [K]
    """

    place: str
    value: float

    def __post_init__(self):
        if self.place not in TEMPERATURE_PLACES:
            raise InputError("limit", f"place '{self.place}' unknown; expected one of {', '.join(TEMPERATURE_PLACES)}")
        if not (np.isfinite(self.value) and self.value > 0.0):
            raise InputError("limit", f"expected a temperature > 0 [K], found {self.value!r}")

    unit = "K"

    def reached(self, solution):
        """The limited temperature in a ``ColumnSolution`` [K]."""
        if self.place == "liquid_outlet":
            return solution.liquid_out_temperature
        return solution.max_temperature

    def shortfall(self, solution):
        """Temperature above the limit, positive while the limit is broken [K]."""
        return self.reached(solution) - self.value

    def describe(self, value=None):
        value = self.value if value is None else value
        where = "liquid outlet" if self.place == "liquid_outlet" else "hottest stage"
        return f"{where} at {value:.2f} K"


@dataclass(frozen=True)
class LiquidOutletLimit:
    """An upper limit on one component's concentration in the liquid leaving the bottom stage
    (a rich-solvent loading, say), checked on the solved column.

    component : str   The component (name, alias, formula or CAS number)
    basis : str       'mole_fraction' or 'mass_fraction'
    value : float     The highest fraction allowed on that basis [-]
    """

    component: str
    basis: str
    value: float

    def __post_init__(self):
        if self.basis not in LIQUID_BASES:
            raise InputError("liquid_limit", f"basis '{self.basis}' unknown; expected one of {', '.join(LIQUID_BASES)}")
        if not 0.0 < self.value < 1.0:
            raise InputError("liquid_limit", f"expected a fraction between 0 and 1 (exclusive), found {self.value!r}")

    unit = "-"

    def reached(self, solution):
        """The component's fraction in the liquid out of a ``ColumnSolution``, on the limit's basis [-]."""
        names = [name.lower() for name in solution.component_names]
        if self.component.strip().lower() not in names:
            raise InputError("liquid_limit", f"'{self.component}' is not among the components "
                                             f"{', '.join(solution.component_names)}")
        i = names.index(self.component.strip().lower())
        flows = solution.liquid_out * (solution.molar_mass if self.basis == "mass_fraction" else 1.0)
        return float(flows[i] / flows.sum())

    def shortfall(self, solution):
        """Signed, positive while the limit is broken [-]."""
        return _log_ratio(self.reached(solution), self.value)

    def describe(self, value=None):
        """Plain words for the limit, or for a reached ``value``."""
        value = self.value if value is None else value
        basis = "mole" if self.basis == "mole_fraction" else "mass"
        return f"{self.component} in the liquid out at {basis} fraction {value:.6g}"
