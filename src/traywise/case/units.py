"""Values with units written in case files ("150 kg/h", "40 degC") converted to SI floats.

pint is imported on first use, with one cached registry. Conventions (cases/README.md):
- a temperature with an offset unit ("40 degC", "104 degF") is an absolute temperature; the same
  units inside a compound unit ("4.18 kJ/(kg degC)") are temperature differences;
- pressures are absolute; gauge units ("barg", "psig") are refused, not guessed;
- "mol%", "ppmv", "ppbv", "vol%" are mole fractions, "wt%", "mass%", "ppmw", "ppbw" mass
  fractions, "%", "ppm", "ppb" plain numbers taken on the basis the composition states;
- gas volumes at reference conditions are amounts of substance (ideal gas): "Nm3" at 0 degC and
  101.325 kPa (DIN 1343), "Sm3" at 15 degC and 101.325 kPa (ISO 13443), "scf" at 60 degF and
  14.696 psi (common practice in the US gas trade).
"""

import functools
import math
import re
import sys

from ..properties.constants import GAS_CONSTANT, P_STANDARD

# Extra units: name = definition (pint syntax); each needs its own word in the unit text.
_DEFINITIONS = (
    "mol_percent = 0.01",
    "vol_percent = 0.01",
    "mass_percent = 0.01",
    "ppmv = 1e-6",
    "ppbv = 1e-9",
    "ppmw = 1e-6",
    "ppbw = 1e-9",
    "ppb = 1e-9",
    "pound_mole = 453.59237 * mole = lbmol",
    "m3 = meter ** 3",
    f"normal_cubic_metre = {P_STANDARD} * pascal * meter ** 3 / ({GAS_CONSTANT} * joule / mole / kelvin) / (273.15 * kelvin) = Nm3",
    f"standard_cubic_metre = {P_STANDARD} * pascal * meter ** 3 / ({GAS_CONSTANT} * joule / mole / kelvin) / (288.15 * kelvin) = Sm3",
    f"standard_cubic_foot = {P_STANDARD} * pascal * foot ** 3 / ({GAS_CONSTANT} * joule / mole / kelvin) / (288.705555555555556 * kelvin) = scf",
)
# Percent spellings rewritten to the unit names above before pint reads the text.
_PERCENT = (
    (re.compile(r"(mol|mole)\s*%"), "mol_percent"),
    (re.compile(r"(vol|v)\s*%"), "vol_percent"),
    (re.compile(r"(wt|mass|w)\s*%"), "mass_percent"),
    (re.compile(r"%"), "percent"),
)
_OFFSET_TEMPERATURE = re.compile(r"(°C|\bdegC\b|\bdegree_Celsius\b|°F|\bdegF\b|\bdegree_Fahrenheit\b)")
_DELTA = {"°C": "delta_degC", "degC": "delta_degC", "degree_Celsius": "delta_degC",
          "°F": "delta_degF", "degF": "delta_degF", "degree_Fahrenheit": "delta_degF"}
_GAUGE = re.compile(r"(barg|psig|kPag|kPa\(g\)|bar\(g\)|\bgauge\b)", re.IGNORECASE)
_SPELLINGS = (("℃", "degC"), ("℉", "degF"), ("Nm³", "Nm3"), ("Sm³", "Sm3"))
_NUMBER = re.compile(r"^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$")

MOLE_FRACTION_UNITS = frozenset({"mol_percent", "vol_percent", "ppmv", "ppbv"})
MASS_FRACTION_UNITS = frozenset({"mass_percent", "ppmw", "ppbw"})

# What each kind of value is, in SI, with an example for error messages.
# kind: (SI unit in pint syntax, description, example)
KINDS = {
    "temperature": ("kelvin", "a temperature", '"40 degC" or "313.15 K"'),
    "temperature_difference": ("kelvin", "a temperature difference", '"350 K"'),
    "pressure": ("pascal", "an absolute pressure", '"1.2 bar" or "120 kPa"'),
    "pressure_difference": ("pascal", "a pressure difference", '"0.5 kPa" or "5 mbar"'),
    "power": ("watt", "a heat flow", '"50 kW"'),
    "molar_flow": ("mole / second", "a molar flow", '"150 kmol/h"'),
    "mass_flow": ("kilogram / second", "a mass flow", '"2500 kg/h"'),
    "molar_mass": ("kilogram / mole", "a molar mass", '"17.03 g/mol"'),
    "molar_energy": ("joule / mole", "an energy per mole", '"-34.2 kJ/mol"'),
    "specific_energy": ("joule / kilogram", "an energy per mass", '"2257 kJ/kg"'),
    "molar_heat_capacity": ("joule / mole / kelvin", "a molar heat capacity", '"75.3 J/(mol K)"'),
    "specific_heat_capacity": ("joule / kilogram / kelvin", "a specific heat capacity", '"4.18 kJ/(kg K)"'),
    "henry_pressure": ("pascal", "Henry's constant as partial pressure over mole fraction", '"5.6e4 Pa"'),
    "henry_volatility": ("pascal * meter ** 3 / mole", "Henry's constant as partial pressure over concentration", '"0.016 atm*L/mol"'),
    "henry_solubility": ("mole / meter ** 3 / pascal", "Henry's constant as concentration over partial pressure", '"59 M/atm"'),
    "fraction": ("dimensionless", "a plain number or fraction", '"0.7" or "70 %"'),
    "length": ("meter", "a length", '"600 mm" or "0.6 m"'),
}
# What a value that fits none of the kinds asked for is, in words (first compatible entry wins).
_FOUND = (
    ("kelvin", "a temperature"),
    ("pascal", "a pressure"),
    ("mole / second", "a molar flow"),
    ("kilogram / second", "a mass flow"),
    ("meter ** 3 / second", "a volume flow"),
    ("watt", "a heat flow"),
    ("kilogram / mole", "a molar mass"),
    ("joule / mole", "an energy per mole"),
    ("joule / kilogram", "an energy per mass"),
    ("joule / mole / kelvin", "a molar heat capacity"),
    ("joule / kilogram / kelvin", "a specific heat capacity"),
    ("kilogram", "a mass"),
    ("mole", "an amount of substance"),
    ("meter ** 3", "a volume"),
    ("meter", "a length"),
    ("second", "a time"),
)


class UnitProblem(ValueError):
    """A value that cannot be read as the quantity asked for; the message says why and what would do."""


def import_pint():
    """pint, imported without its optional dask and scipy support: pint.compat imports both when
    they are installed (0.1 s of start-up with dask) for a dask Quantity and a preferred-units
    search that traywise never uses. Both stay importable afterwards."""
    if "pint" in sys.modules:
        return sys.modules["pint"]
    blocked = [name for name in _PINT_OPTIONAL if name not in sys.modules]
    for name in blocked:
        sys.modules[name] = None  # the import system's way to make "import dask" fail
    try:
        import pint
    finally:
        for name in blocked:
            if sys.modules.get(name, False) is None:
                del sys.modules[name]
    return pint


_PINT_OPTIONAL = ("dask", "scipy")


@functools.cache
def registry():
    """The one pint UnitRegistry of traywise, with the units of the trade added (see module docstring)."""
    pint = import_pint()

    try:  # pint keeps its parsed definitions in the user's cache folder: 0.02 s instead of 0.15-0.45 s
        units = pint.UnitRegistry(autoconvert_offset_to_baseunit=False, cache_folder=":auto:")
    except OSError:  # no writable cache folder: parse the definitions every time
        units = pint.UnitRegistry(autoconvert_offset_to_baseunit=False)
    for definition in _DEFINITIONS:
        units.define(definition)
    return units


def split_number(text):
    """(number, unit text) of "150 kg/h"; UnitProblem when it does not start with a number."""
    match = _NUMBER.match(text)
    if not match:
        raise UnitProblem(f"'{text}' does not start with a number")
    return float(match.group(1)), match.group(2)


def normalised_unit_text(unit_text, *, absolute_temperature):
    """Unit text ready for pint: percent spellings named; offset temperatures inside compound
    units turned into differences (unless ``absolute_temperature`` and the unit stands alone)."""
    if _GAUGE.search(unit_text):
        raise UnitProblem(f"'{unit_text}' is a gauge pressure; give the absolute pressure (e.g. \"2.2 bar\")")
    for written, name in _SPELLINGS:
        unit_text = unit_text.replace(written, name)
    for pattern, name in _PERCENT:
        unit_text = pattern.sub(name, unit_text)
    stands_alone = _OFFSET_TEMPERATURE.fullmatch(unit_text.strip()) is not None
    if not (absolute_temperature and stands_alone):
        unit_text = _OFFSET_TEMPERATURE.sub(lambda m: _DELTA[m.group(0)], unit_text)
    return unit_text


def quantity(text, *, absolute_temperature=False):
    """A pint Quantity from "number unit" text; UnitProblem when it cannot be read."""
    pint = import_pint()

    number, unit_text = split_number(text)
    unit_text = normalised_unit_text(unit_text, absolute_temperature=absolute_temperature)
    try:
        return registry().Quantity(number, unit_text or "dimensionless")
    except (pint.errors.PintError, AttributeError, TypeError, ValueError, SyntaxError) as exc:
        raise UnitProblem(f"cannot read the unit of '{text}' ({exc})") from None


def to_si(text, kinds):
    """Convert ``text`` to SI as the first of ``kinds`` (keys of KINDS) whose dimension fits.

    Returns (value in SI [float], the kind that fitted). Raises UnitProblem naming what was
    found and what would be valid.
    """
    pint = import_pint()

    if isinstance(kinds, str):
        kinds = (kinds,)
    value = quantity(text, absolute_temperature="temperature" in kinds)
    for kind in kinds:
        try:
            si = float(value.to(KINDS[kind][0]).magnitude)
        except pint.errors.DimensionalityError:
            continue
        if not math.isfinite(si):
            raise UnitProblem(f"'{text}' is not a finite number")
        if kind == "temperature" and not si > 0.0:
            raise UnitProblem(f"'{text}' is {si:.6g} K, at or below absolute zero")
        return si, kind
    wanted = " or ".join(f"{KINDS[k][1]} such as {KINDS[k][2]}" for k in kinds)
    if not split_number(text)[1]:
        found = f"'{text}' has no unit"
    else:
        found = f"'{text}' is {_description(value)}"
    raise UnitProblem(f"{found}; expected {wanted}")


def _description(value):
    """'a mass flow', 'a plain number' or 'in kg/m³ (dimension ...)': what a quantity is."""
    if value.dimensionless:
        return "a plain number"
    for si_unit, description in _FOUND:
        if value.is_compatible_with(si_unit):
            return description
    return f"in {value.units:~P} (dimension {value.dimensionality})"


def composition_basis_of(text):
    """'mole', 'mass' or None: the basis a composition value's unit implies ("3 mol%" is a mole
    fraction, "2 wt%" a mass fraction, "0.05" and "5 %" say nothing)."""
    unit_text = normalised_unit_text(split_number(text)[1], absolute_temperature=False)
    words = set(re.findall(r"[A-Za-z_]+", unit_text))
    bases = set()
    for word in words:
        if word in MOLE_FRACTION_UNITS:
            bases.add("mole")
        elif word in MASS_FRACTION_UNITS:
            bases.add("mass")
        else:
            dimensionality = registry().get_dimensionality(word)
            if "[substance]" in dimensionality:
                bases.add("mole")
            if "[mass]" in dimensionality:
                bases.add("mass")
    if len(bases) > 1:
        raise UnitProblem(f"'{text}' mixes mole and mass units")
    return bases.pop() if bases else None
