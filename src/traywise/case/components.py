"""The components of a case: library components, inline definitions and overrides of library
properties, read from ``components = [...]`` and the ``[component."name"]`` tables, with their
equilibrium tables and the ``[liquid_model]``, assembled into the case's property model."""

import dataclasses
import math

from ..errors import CaseError, ComponentDataError, InputError
from ..properties.component import MODEL_KINDS, MODEL_NEEDS, Quantity
from ..properties.constants import P_STANDARD, T_REFERENCE
from ..properties.inline import (
    USER,
    USER_SOURCE,
    heat_capacity_from_parameters,
    henry_from_reference,
    inline_component,
    vapour_pressure_from_reference,
)
from ..properties.library import find_component, library
from ..properties.model import PropertyModel
from .equilibrium_tables import TABLE_KEYS, default_table_solvent, read_equilibrium_table
from .in_water import in_water_defaults
from .liquid_model import read_liquid_model
from .reader import Section, suggestion, where
from .units import UnitProblem, quantity

COMPONENT_KEYS = (
    "formula",
    "molar_mass",
    "equilibrium",
    "gas_heat_capacity",
    "liquid_heat_capacity",
    "henry_constant",
    "henry_temperature",
    "enthalpy_of_solution",
    "vapour_pressure",
    "vapour_pressure_temperature",
    "normal_boiling_point",
    "heat_of_vaporisation",
    "melting_point",
    "equilibrium_table",
)
# Molar concentration of liquid water at 25 degC and 101.325 kPa [mol/m3]: density 997.05 kg/m3
# from the IAPWS-95 equation of state (W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 31 (2002)
# 387, evaluated with CoolProp) over the molar mass 0.01801528 kg/mol. Converts Henry's
# constants given per concentration to the mole-fraction basis (dilute aqueous solution), as in
# R. Sander, Atmos. Chem. Phys. 15 (2015) 4399, section 2.
WATER_MOLAR_CONCENTRATION = 55344.55
# The case-file keys that give each Component attribute an equilibrium model needs (the models'
# needs are properties.component.MODEL_NEEDS).
KEYS_OF = {
    "henry_in_water": "henry_constant and enthalpy_of_solution",
    "vapour_pressure": "vapour_pressure (at vapour_pressure_temperature) or normal_boiling_point",
    "heat_of_vaporisation": "heat_of_vaporisation",
    "liquid_cp": "liquid_heat_capacity",
    "critical_temperature": "a library component (critical constants and acentric factor)",
    "critical_pressure": "a library component (critical constants and acentric factor)",
    "acentric_factor": "a library component (critical constants and acentric factor)",
}


@dataclasses.dataclass(frozen=True)
class CaseComponents:
    """The components of a case (in the order of ``components = [...]``) and their model.

    ``concentration_henry``: names whose Henry's constant was given per concentration (converted
    with the molar concentration of water); ``library_henry``: names using the library's
    Henry's constant in water. Both matter when the solvent is not water. ``liquid_model``: the
    echo of the ``[liquid_model]`` table (SI), or None without one.
    """

    components: tuple
    model: PropertyModel
    echo: tuple
    concentration_henry: tuple
    library_henry: tuple
    warnings: tuple
    liquid_model: dict | None = None

    def find(self, text):
        """Index of the case component named by ``text`` (name, alias, formula, CAS), or None."""
        for i, component in enumerate(self.components):
            if component.name == text or component.matches(text):
                return i
        return None

    def names(self):
        return ", ".join(f"'{c.name}'" for c in self.components)


def read_components(top):
    """Read ``components`` and ``component`` of the top-level Section into CaseComponents."""
    names = top.raw("components", expected='a list of component names, e.g. ["water", "nitrogen", "ammonia"]')
    if not isinstance(names, list) or not names or not all(isinstance(n, str) and n.strip() for n in names):
        top.fail("components", f"found {names!r}; expected a list of component names, e.g. [\"water\", \"nitrogen\", \"ammonia\"]")
    tables = top.table("component") or Section({}, "component", top.file)
    for name in tables.data:
        if name not in names:
            tables.fail(name, f"'{name}' is not listed in components = {names}; add it there or correct the name"
                        f"{suggestion(name, names)}")
    components, readers, concentration, warnings, table_sections = [], [], [], [], {}
    for i, name in enumerate(names):
        section = tables.table(name, COMPONENT_KEYS) if name in tables.data else None
        base = _library_component(name)
        if base is None and section is None:
            known = ", ".join(c.name for c in library().values())
            top.fail(f"components[{i}]", f"unknown component '{name}'; the library has: {known}; "
                     f"or define it in a [component.\"{name}\"] table")
        reader = _ComponentReader(section or Section({}, tables.key_path(name), top.file), base, name)
        component = reader.component()
        for j, other in enumerate(components):
            if other.name == component.name:
                top.fail(f"components[{i}]", f"'{name}' is the same component as components[{j}] ('{names[j]}')")
        components.append(component)
        readers.append(reader)
        if reader.table_section is not None:
            table_sections[i] = reader.table_section
        warnings.extend(reader.warnings)
        if reader.concentration_form:
            concentration.append(component.name)
    if len(components) < 2:
        top.fail("components", f"found {names}; a case needs at least a solvent and one gas component")
    solvent = default_table_solvent(top, components)
    components = in_water_defaults(components, readers, solvent)
    library_henry = [c.name for c, r in zip(components, readers) if c.equilibrium in ("henry", "activity")
                     and r.base is not None and c.henry_in_water is r.base.henry_in_water]
    echo = [reader.echo(component) for reader, component in zip(readers, components)]
    equilibrium_tables = {}
    for i, section in table_sections.items():
        equilibrium_tables[components[i].name], echo[i]["given_in_case"]["equilibrium_table"] = read_equilibrium_table(
            section, i, components, solvent)
    liquid = read_liquid_model(top, components)
    try:
        model = PropertyModel(components, activity=None if liquid is None else liquid.activity, tables=equilibrium_tables)
    except InputError as error:  # the readers check what it refuses; kept so that no input ends in a traceback
        raise CaseError(where(top.file, "liquid_model" if liquid else "component"), str(error)) from None
    return CaseComponents(tuple(components), model, tuple(echo), tuple(concentration), tuple(library_henry),
                          tuple(warnings), None if liquid is None else liquid.echo)


def _library_component(name):
    try:
        return find_component(name)
    except ComponentDataError as error:
        if error.where:  # a malformed library file: its own error names the file and key
            raise
        return None


class _ComponentReader:
    """Builds one component from its table: inline (``base`` None) or a library component with
    the table's values replacing the library's."""

    def __init__(self, section, base, name):
        self.section = section
        self.base = base
        self.name = name
        self.given = {}  # echo of the values the table gave, SI
        self.warnings = []
        self.concentration_form = False
        self.table_section = None  # the equilibrium_table Section of a 'table' component
        self.in_water_default = False  # the model is the library's default with water as solvent

    def has(self, key):
        return key in self.section

    def fail(self, key, message):
        self.section.fail(key, message)

    def component(self):
        s = self.section
        if self.base is None:
            component = self._inline()
        else:
            if self.has("formula"):
                self.fail("formula", f"'{self.name}' is a library component ({self.base.name}); its identity cannot be "
                          "changed: give the inline component another name to define a new one")
            component = self._overridden()
        if s.data:
            component = dataclasses.replace(component, sources={**component.sources, USER: USER_SOURCE})
        self._check_model(component)
        self._table(component.equilibrium)
        return component

    def _table(self, equilibrium):
        """Keep the equilibrium_table Section of a 'table' component (read once every component is known)."""
        if self.has("equilibrium_table"):
            if equilibrium != "table":
                self.fail("equilibrium_table", f"given, but equilibrium is '{equilibrium}'; write "
                          "equilibrium = \"table\" to use it")
            self.table_section = self.section.table("equilibrium_table", TABLE_KEYS)
        elif equilibrium == "table":
            self.fail("equilibrium_table", f"missing; equilibrium = 'table' needs a "
                      f"[{self.section.path}.equilibrium_table] with the tabulated partial pressures")

    # -- inline definitions -------------------------------------------------------------------
    def _inline(self):
        s = self.section
        molar_mass = self._molar_mass(required=True)
        equilibrium = s.text("equilibrium", choices=MODEL_KINDS)
        self.given["equilibrium"] = equilibrium
        gas_cp = self._heat_capacity("gas_heat_capacity", molar_mass, required=True)
        component = inline_component(
            self.name,
            molar_mass=molar_mass,
            ideal_gas_cp=gas_cp,
            equilibrium=equilibrium,
            formula=s.text("formula", None),
        )
        return self._with_properties(component, molar_mass)

    # -- overrides of library components ------------------------------------------------------
    def _overridden(self):
        component = self.base
        molar_mass = self._molar_mass(required=False)
        if molar_mass is not None:
            component = dataclasses.replace(component, molar_mass=Quantity(molar_mass, USER))
        if self.has("equilibrium"):
            equilibrium = self.section.text("equilibrium", choices=MODEL_KINDS)
            self.given["equilibrium"] = equilibrium
            component = dataclasses.replace(component, equilibrium=equilibrium)
        gas_cp = self._heat_capacity("gas_heat_capacity", component.molar_mass.value)
        if gas_cp is not None:
            component = dataclasses.replace(component, ideal_gas_cp=heat_capacity_from_parameters(gas_cp))
        return self._with_properties(component, component.molar_mass.value)

    # -- properties shared by both ------------------------------------------------------------
    def _with_properties(self, component, molar_mass):
        s = self.section
        changes = {}
        liquid_cp = self._heat_capacity("liquid_heat_capacity", molar_mass)
        if liquid_cp is not None:
            changes["liquid_cp"] = heat_capacity_from_parameters(liquid_cp)
        latent = self._energy("heat_of_vaporisation", molar_mass)
        if latent is not None:
            if latent <= 0.0:
                self.fail("heat_of_vaporisation", f"found {s.data['heat_of_vaporisation']!r}; expected a positive energy")
            changes["heat_of_vaporisation"] = Quantity(latent, USER, T_REFERENCE)
        vapour_pressure = self._vapour_pressure(changes.get("heat_of_vaporisation", component.heat_of_vaporisation))
        if vapour_pressure is not None:
            changes["vapour_pressure"] = vapour_pressure
        henry = self._henry(component.henry_in_water, molar_mass)
        if henry is not None:
            changes["henry_in_water"] = henry
        if self.has("melting_point"):
            changes["melting_point"] = Quantity(self._quantity("melting_point", "temperature"), USER)
        return dataclasses.replace(component, **changes)

    def _quantity(self, key, kinds):
        value = self.section.quantity(key, kinds)
        self.given[f"{key}{_SUFFIX[kinds if isinstance(kinds, str) else kinds[0]]}"] = value
        return value

    def _molar_mass(self, *, required):
        if not self.has("molar_mass"):
            return self.section.raw("molar_mass", expected='a molar mass such as "17.03 g/mol"') if required else None
        value = self._quantity("molar_mass", "molar_mass")
        if value <= 0.0:
            self.fail("molar_mass", f"found {self.section.data['molar_mass']!r}; expected a positive molar mass")
        return value

    def _energy(self, key, molar_mass):
        """A molar energy [J/mol], given per mole or per mass (then times the molar mass)."""
        if not self.has(key):
            return None
        value, kind = self.section.convert(key, self.section.data[key], ("molar_energy", "specific_energy"))
        value = value * molar_mass if kind == "specific_energy" else value
        self.given[f"{key}_J_per_mol"] = value
        return value

    def _heat_capacity(self, key, molar_mass, *, required=False):
        """Cp [J/(mol K)]: one value, or a list of polynomial coefficients c0, c1, ... of
        Cp = c0 + c1 T + c2 T**2 + ... (lowest power first), per mole or per mass."""
        s = self.section
        if not self.has(key):
            if required:
                s.raw(key, expected='a heat capacity such as "29.1 J/(mol K)" or a list of polynomial coefficients')
            return None
        value = s.data[key]
        items = value if isinstance(value, list) else [value]
        if not items:
            self.fail(key, "found an empty list; expected a heat capacity or polynomial coefficients")
        coefficients = [self._coefficient(key, item, power, molar_mass, len(items) > 1) for power, item in enumerate(items)]
        self.given[f"{key}_J_per_mol_K"] = coefficients if isinstance(value, list) else coefficients[0]
        return coefficients if isinstance(value, list) else coefficients[0]

    def _coefficient(self, key, item, power, molar_mass, in_list):
        import pint

        label = f"{key}[{power}]" if in_list else key
        k_unit = "kelvin" if power == 0 else f"kelvin ** {power + 1}"
        molar, specific = f"joule / mole / {k_unit}", f"joule / kilogram / {k_unit}"
        example = '"30 J/(mol K)", "0.01 J/(mol K^2)", ...' if in_list else '"29.1 J/(mol K)"'
        if not isinstance(item, str):
            self.fail(label, f"{item!r} has no unit; write e.g. {example}")
        try:
            value = quantity(item)
            if value.is_compatible_with(molar):
                return float(value.to(molar).magnitude)
            if value.is_compatible_with(specific):
                return float(value.to(specific).magnitude) * molar_mass
        except (UnitProblem, pint.errors.PintError) as problem:
            self.fail(label, str(problem))
        k_text = "K" if power == 0 else f"K^{power + 1}"
        self.fail(label, f"'{item}' is not in J/(mol {k_text}) or J/(kg {k_text}); "
                  f"a heat capacity is written {example} (coefficients of T^0, T^1, ... in a list)")

    def _vapour_pressure(self, latent):
        s = self.section
        given = [k for k in ("vapour_pressure", "vapour_pressure_temperature", "normal_boiling_point") if self.has(k)]
        if not given:
            return None
        if self.has("normal_boiling_point"):
            if self.has("vapour_pressure") or self.has("vapour_pressure_temperature"):
                self.fail("normal_boiling_point", "give either normal_boiling_point or vapour_pressure with "
                          "vapour_pressure_temperature, not both")
            reference = (P_STANDARD, self._quantity("normal_boiling_point", "temperature"))
        else:
            if not self.has("vapour_pressure"):
                s.raw("vapour_pressure", expected='a vapour pressure such as "3.17 kPa" at vapour_pressure_temperature')
            pressure = self._quantity("vapour_pressure", "pressure")
            if pressure <= 0.0:
                self.fail("vapour_pressure", f"found {s.data['vapour_pressure']!r}; expected a positive pressure")
            temperature = self._quantity("vapour_pressure_temperature", "temperature") if self.has(
                "vapour_pressure_temperature") else T_REFERENCE
            reference = (pressure, temperature)
        if latent is None:
            s.raw("heat_of_vaporisation", expected='an energy such as "40 kJ/mol" (the vapour pressure is '
                  "extrapolated with it by Clausius-Clapeyron)")
        return vapour_pressure_from_reference(*reference, latent.value)

    def _henry(self, library_henry, molar_mass):
        s = self.section
        if not any(self.has(k) for k in ("henry_constant", "henry_temperature", "enthalpy_of_solution")):
            return None
        if not (self.has("henry_constant") or self.has("enthalpy_of_solution")):
            self.fail("henry_temperature", "is the temperature of henry_constant; give henry_constant "
                      "(and enthalpy_of_solution) with it")
        t_ref = self._quantity("henry_temperature", "temperature") if self.has("henry_temperature") else T_REFERENCE
        if self.has("henry_constant"):
            h_ref = self._henry_constant()
        elif library_henry is not None:
            h_ref = math.exp(float(library_henry.ln_constant(t_ref)[0]))
        else:
            s.raw("henry_constant", expected='a Henry\'s constant such as "5.6e4 Pa" (partial pressure over mole fraction)')
        enthalpy = self._energy("enthalpy_of_solution", molar_mass)
        if enthalpy is None:
            if library_henry is None:
                s.raw("enthalpy_of_solution", expected='an energy such as "-34 kJ/mol" (negative when dissolving '
                      "releases heat)")
            enthalpy = float(library_henry.solution_enthalpy(t_ref))
        elif enthalpy > 0.0:
            self.warnings.append(
                f"{self.section.key_path('enthalpy_of_solution')} is positive ({enthalpy / 1e3:.3g} kJ/mol): the gas "
                "would dissolve with heat taken up and grow more soluble as the liquid warms; the usual sign for "
                "gases dissolving in water is negative (heat released)"
            )
        return henry_from_reference(h_ref, t_ref, enthalpy)

    def _henry_constant(self):
        s = self.section
        kinds = ("henry_pressure", "henry_volatility", "henry_solubility")
        value, kind = s.convert("henry_constant", s.data["henry_constant"], kinds)
        if value <= 0.0:
            self.fail("henry_constant", f"found {s.data['henry_constant']!r}; expected a positive value")
        if kind == "henry_volatility":
            value *= WATER_MOLAR_CONCENTRATION
        elif kind == "henry_solubility":
            value = WATER_MOLAR_CONCENTRATION / value
        self.concentration_form = kind != "henry_pressure"
        self.given["henry_constant_Pa"] = value
        return value

    def _check_model(self, component):
        """Every property the equilibrium model needs is there (else name the keys to add)."""
        for attribute in MODEL_NEEDS[component.equilibrium]:
            keys = KEYS_OF[attribute]
            if getattr(component, attribute) is None:
                if self.base is None:
                    self.fail(keys.split()[0], f"missing; equilibrium = '{component.equilibrium}' needs {keys}")
                self.fail("equilibrium" if self.has("equilibrium") else None,
                          f"equilibrium = '{component.equilibrium}' needs {keys}, which the library's "
                          f"'{self.base.name}' lacks; add it to [{self.section.path}]")

    def echo(self, component):
        entry = {
            "name": component.name,
            "origin": "inline" if self.base is None else "library",
            "equilibrium": component.equilibrium,
            "molar_mass_kg_per_mol": component.molar_mass.value,
        }
        if self.in_water_default:
            entry["equilibrium_from"] = "the library's default with water as the solvent"
        if self.given:
            entry["given_in_case"] = dict(self.given)
        return entry


_SUFFIX = {"temperature": "_K", "pressure": "_Pa", "molar_mass": "_kg_per_mol"}
