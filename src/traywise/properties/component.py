"""Component data: frozen records of one component's identity and correlation coefficients.

A ``Component`` holds SI numbers and the source of each; it is built from a library file
(``library.load_component``), from a few plain parameters (``inline.inline_component``) or from
another component with some properties replaced (``dataclasses.replace``).
"""

from dataclasses import dataclass, field, replace

import numpy as np

from .constants import GAS_CONSTANT, T_REFERENCE
from .correlations import (
    WATER_CRITICAL_TEMPERATURE,
    dippr101,
    henry_solution_enthalpy,
    iapws_henry,
    iapws_if97_saturation_pressure,
    ln_henry,
    offset_scale,
    solution_enthalpy_from_slope,
    stable_polynomial,
    stable_polynomial_antiderivative,
)

WATER_CAS = "7732-18-5"
EQUILIBRIUM_KINDS = ("henry", "raoult", "nonvolatile", "insoluble")  # a component's own default model
# Models a property model can also give a component: they need more than the component's data
# (an activity model of the liquid, an equilibrium table, the other members of the aqueous
# electrolyte liquid), so they are chosen per case.
MODEL_KINDS = EQUILIBRIUM_KINDS + ("activity", "table", "eos", "electrolyte")
# Models a library file may name as its component's default with water as the solvent
# (``equilibrium_in_water``): models that need nothing the case has to state.
IN_WATER_KINDS = ("electrolyte",)
# What each equilibrium model needs of a component: the Component attributes that must not be
# None (an activity model or an equilibrium table, needed too, belongs to the case, not here).
MODEL_NEEDS = {
    "henry": ("henry_in_water",),
    "raoult": ("vapour_pressure", "heat_of_vaporisation", "liquid_cp"),
    "nonvolatile": ("liquid_cp",),
    "insoluble": (),
    "activity": ("henry_in_water", "vapour_pressure"),
    "table": (),
    "eos": ("critical_temperature", "critical_pressure", "acentric_factor"),
    "electrolyte": (),  # its CAS number must be one the electrolyte liquid knows (composition_liquids)
}


@dataclass(frozen=True)
class HeatCapacity:
    """Molar heat capacity as a polynomial in s = scale*T + offset (highest power first).

    ``coefficients`` [J/(mol K)]; valid between ``t_min`` and ``t_max`` [K]. A plain polynomial
    in T has offset 0 and scale 1 (``HeatCapacity.in_temperature``).
    """

    coefficients: tuple
    t_min: float
    t_max: float
    offset: float
    scale: float
    source: str

    @classmethod
    def stable(cls, coefficients, t_min, t_max, source):
        offset, scale = offset_scale(t_min, t_max)
        return cls(tuple(float(c) for c in coefficients), float(t_min), float(t_max), offset, scale, source)

    @classmethod
    def in_temperature(cls, coefficients, t_min, t_max, source):
        """Cp = sum c_k T**k with coefficients highest power first."""
        return cls(tuple(float(c) for c in coefficients), float(t_min), float(t_max), 0.0, 1.0, source)

    def heat_capacity(self, temperature):
        """Cp [J/(mol K)] at temperature [K]."""
        return stable_polynomial(temperature, np.array(self.coefficients), self.offset, self.scale)

    def enthalpy_change(self, temperature, t_from=T_REFERENCE):
        """Integral of Cp from t_from to temperature [J/mol]."""
        q = stable_polynomial_antiderivative(self.coefficients, self.scale)
        return stable_polynomial(temperature, q, self.offset, self.scale) - stable_polynomial(
            t_from, q, self.offset, self.scale
        )


@dataclass(frozen=True)
class VapourPressure:
    """Vapour pressure correlation: form 'iapws_if97' (no coefficients) or 'dippr101' (a..e)."""

    form: str
    t_min: float
    t_max: float
    source: str
    coefficients: tuple = ()

    def ln_pressure(self, temperature):
        """(ln(Psat/Pa), dln(Psat)/dT [1/K]) at temperature [K]."""
        if self.form == "iapws_if97":
            return iapws_if97_saturation_pressure(temperature)
        return dippr101(temperature, *self.coefficients)[:2]


HENRY_FORMS = ("ln_h", "iapws_2004")


@dataclass(frozen=True)
class HenryConstant:
    """Henry's-law constant in water, volatility form H = p_i/x_i [Pa], in one of two forms:

    'ln_h'        ln(H/Pa) = a + b/T + c ln T + d T + e/T**2 + f T**2 (coefficients a..f);
    'iapws_2004'  the IAPWS guideline's ln(H/p1*) = A/Tr + B tau**0.355/Tr + C Tr**-0.41 exp(tau)
                  (+ offset): coefficients (A, B, C, offset), ``correlations.iapws_henry``.
    """

    coefficients: tuple
    t_min: float
    t_max: float
    source: str
    form: str = "ln_h"

    def terms(self, temperature):
        """(ln(H/Pa), dln(H)/dT [1/K], dH_sol/R [K], d(dH_sol/R)/dT [-]) at temperature [K]."""
        if self.form == "iapws_2004":
            ln_h, dln_h, d2ln_h = iapws_henry(temperature, *self.coefficients)
            return ln_h, dln_h, *solution_enthalpy_from_slope(temperature, dln_h, d2ln_h)
        return (*ln_henry(temperature, *self.coefficients), *henry_solution_enthalpy(temperature, *self.coefficients))

    def ln_constant(self, temperature):
        """(ln(H/Pa), dln(H)/dT [1/K])."""
        return self.terms(temperature)[:2]

    def scaled(self, value_factor, enthalpy_factor, t0):
        """The same constant with H(t0) times value_factor and the enthalpy of solution at t0 [K]
        times enthalpy_factor: ln H + ln(value_factor) + extra (1/T - 1/t0), extra = (f - 1) dH_sol(t0)/R."""
        extra = (enthalpy_factor - 1.0) * float(self.terms(t0)[2])
        shift = float(np.log(value_factor)) - extra / t0
        if self.form == "iapws_2004":  # A/Tr = A Tc/T carries the 1/T term
            a, b, c, offset = self.coefficients
            return replace(self, coefficients=(a + extra / WATER_CRITICAL_TEMPERATURE, b, c, offset + shift))
        a, b, *rest = self.coefficients
        return replace(self, coefficients=(a + shift, b + extra, *rest))

    def solution_enthalpy(self, temperature):
        """Enthalpy of solution implied by the temperature dependence (van 't Hoff) [J/mol]."""
        return GAS_CONSTANT * self.terms(temperature)[2]


@dataclass(frozen=True)
class Quantity:
    """One sourced scalar: value in SI, at ``temperature`` [K] where it depends on it."""

    value: float
    source: str
    temperature: float | None = None


@dataclass(frozen=True)
class Component:
    """Identity and property data of one component (SI units).

    ``equilibrium`` is the component's own phase-equilibrium model, which needs only its data:
    'henry' for gases, 'raoult' for solvents and condensables. ``equilibrium_in_water``, or None,
    is the model a case gives it instead when water is the solvent (``case.components``):
    'electrolyte' for the gases that dissociate or react in water.
    ``sources`` maps each source key used by a property to its full citation.
    """

    name: str
    formula: str
    cas: str
    molar_mass: Quantity  # kg/mol
    ideal_gas_cp: HeatCapacity
    equilibrium: str
    aliases: tuple = ()
    equilibrium_in_water: str | None = None
    liquid_cp: HeatCapacity | None = None
    vapour_pressure: VapourPressure | None = None
    heat_of_vaporisation: Quantity | None = None  # J/mol at its temperature
    henry_in_water: HenryConstant | None = None
    melting_point: Quantity | None = None  # K
    critical_temperature: Quantity | None = None  # K
    critical_pressure: Quantity | None = None  # Pa
    acentric_factor: Quantity | None = None  # -
    partial_molar_volume: Quantity | None = None  # m3/mol at infinite dilution in water, at its temperature
    sources: dict = field(default_factory=dict, compare=False)
    notes: dict = field(default_factory=dict, compare=False)
    origin: str = "library"

    @property
    def is_water(self):
        """True for water (CAS number 7732-18-5, or an inline component without a CAS number
        named 'water'), the solvent several models single out."""
        return self.cas == WATER_CAS or (not self.cas and self.matches("water"))

    def matches(self, text):
        """True when text names this component (name, alias, formula or CAS number; any case)."""
        key = text.strip().lower()
        return key in {self.name.lower(), self.formula.lower(), self.cas, *(a.lower() for a in self.aliases)}

    def cite(self, key):
        """Full citation of a source key, or the key itself when it is already a citation."""
        return self.sources.get(key, key)
