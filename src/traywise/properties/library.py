"""The component library: one TOML file per component in ``components/``.

Files are read with the standard library only (tomllib); values are SI numbers with their
unit written beside them, checked literally, so loading needs no unit library. The format is
described in components/README.md.
"""

import functools
import tomllib
from importlib import resources
from pathlib import Path

from ..errors import ComponentDataError
from .component import (
    EQUILIBRIUM_KINDS,
    HENRY_FORMS,
    IN_WATER_KINDS,
    Component,
    HeatCapacity,
    HenryConstant,
    Quantity,
    VapourPressure,
)

HEAT_CAPACITY_FORMS = ("stable_polynomial", "polynomial")
VAPOUR_PRESSURE_FORMS = {"iapws_if97": (), "dippr101": ("a", "b", "c", "d", "e")}
HENRY_KEYS = {"ln_h": ("a", "b", "c", "d", "e", "f"), "iapws_2004": ("A", "B", "C")}


def library_directory():
    """The folder of component files: the repository's components/ when running from a
    checkout, else the copy installed inside the package."""
    checkout = Path(__file__).resolve().parents[3] / "components"
    if checkout.is_dir():
        return checkout
    # a regular package's files() is a real path; the data folder has no __init__.py of its own
    return Path(str(resources.files("traywise.data").joinpath("components")))


@functools.cache
def library():
    """All library components, keyed by file stem, sorted by name."""
    found = {path.stem: load_component(path) for path in sorted(library_directory().glob("*.toml"))}
    return dict(sorted(found.items(), key=lambda item: item[1].name))


def find_component(text):
    """The library component named by ``text`` (name, alias, formula or CAS number)."""
    for component in library().values():
        if component.matches(text):
            return component
    known = ", ".join(c.name for c in library().values())
    raise ComponentDataError("", f"unknown component '{text}'; the library has: {known}")


def load_component(path):
    """Read one component file into a ``Component``; errors name the file and key."""
    path = Path(path)
    try:
        data = tomllib.loads(path.read_text(encoding="utf-8"))
    except (OSError, tomllib.TOMLDecodeError) as exc:
        raise ComponentDataError(str(path), f"cannot read component file: {exc}") from None
    return _FileReader(str(path), data).component()


class _FileReader:
    """Pulls typed values out of a parsed component file, naming the key on any error."""

    def __init__(self, where, data):
        self.where = where
        self.data = data

    def fail(self, key, message):
        raise ComponentDataError(f"{self.where}: {key}", message)

    def table(self, key, required=False):
        value = self.data.get(key)
        if value is None:
            if required:
                self.fail(key, "missing table")
            return None
        if not isinstance(value, dict):
            self.fail(key, "must be a table")
        return value

    def number(self, table, table_key, key, unit=None):
        if key not in table:
            self.fail(f"{table_key}.{key}", "missing value")
        value = table[key]
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            self.fail(f"{table_key}.{key}", f"must be a number, found {value!r}")
        if unit is not None and table.get("unit") != unit:
            self.fail(f"{table_key}.unit", f"must be '{unit}', found {table.get('unit')!r}")
        return float(value)

    def source(self, table, table_key):
        source = table.get("source")
        if not isinstance(source, str) or not source:
            self.fail(f"{table_key}.source", "every value needs its source")
        if source not in self.data.get("sources", {}):
            self.fail(f"{table_key}.source", f"'{source}' is not a key of [sources]")
        return source

    def quantity(self, key, unit, required=False, with_temperature=False):
        table = self.table(key, required)
        if table is None:
            return None
        temperature = self.number(table, key, "temperature") if with_temperature else None
        return Quantity(self.number(table, key, "value", unit), self.source(table, key), temperature)

    def heat_capacity(self, key, required=False):
        table = self.table(key, required)
        if table is None:
            return None
        form = table.get("form")
        if form not in HEAT_CAPACITY_FORMS:
            self.fail(f"{key}.form", f"must be one of {HEAT_CAPACITY_FORMS}, found {form!r}")
        if table.get("unit") != "J/(mol K)":
            self.fail(f"{key}.unit", f"must be 'J/(mol K)', found {table.get('unit')!r}")
        coefficients = table.get("coefficients")
        if not isinstance(coefficients, list) or not coefficients:
            self.fail(f"{key}.coefficients", "must be a non-empty list of numbers")
        t_min, t_max = self.number(table, key, "t_min"), self.number(table, key, "t_max")
        build = HeatCapacity.stable if form == "stable_polynomial" else HeatCapacity.in_temperature
        return build(coefficients, t_min, t_max, self.source(table, key))

    def vapour_pressure(self):
        key = "vapour_pressure"
        table = self.table(key)
        if table is None:
            return None
        form = table.get("form")
        if form not in VAPOUR_PRESSURE_FORMS:
            self.fail(f"{key}.form", f"must be one of {tuple(VAPOUR_PRESSURE_FORMS)}, found {form!r}")
        if table.get("unit") != "Pa":
            self.fail(f"{key}.unit", f"must be 'Pa', found {table.get('unit')!r}")
        coefficients = tuple(self.number(table, key, k) for k in VAPOUR_PRESSURE_FORMS[form])
        t_min, t_max = self.number(table, key, "t_min"), self.number(table, key, "t_max")
        return VapourPressure(form, t_min, t_max, self.source(table, key), coefficients)

    def henry(self):
        key = "henry_in_water"
        table = self.table(key)
        if table is None:
            return None
        form = table.get("form")
        if form not in HENRY_FORMS:
            self.fail(f"{key}.form", f"must be one of {HENRY_FORMS}, found {form!r}")
        if table.get("unit") != "Pa":
            self.fail(f"{key}.unit", f"must be 'Pa', found {table.get('unit')!r}")
        if form == "ln_h":
            coefficients = tuple(self.number(table, key, k) if k in table else 0.0 for k in HENRY_KEYS[form])
        else:
            coefficients = (*(self.number(table, key, k) for k in HENRY_KEYS[form]), 0.0)  # offset 0
        t_min, t_max = self.number(table, key, "t_min"), self.number(table, key, "t_max")
        return HenryConstant(coefficients, t_min, t_max, self.source(table, key), form)

    def text(self, key):
        value = self.data.get(key)
        if not isinstance(value, str) or not value:
            self.fail(key, "missing or not a string")
        return value

    def component(self):
        sources = self.table("sources", required=True)
        equilibrium = self.text("equilibrium")
        if equilibrium not in EQUILIBRIUM_KINDS:
            self.fail("equilibrium", f"must be one of {EQUILIBRIUM_KINDS}, found {equilibrium!r}")
        in_water = self.data.get("equilibrium_in_water")
        if in_water is not None and in_water not in IN_WATER_KINDS:
            self.fail("equilibrium_in_water", f"must be one of {IN_WATER_KINDS} (or absent), found {in_water!r}")
        notes = {k: v["note"] for k, v in self.data.items() if isinstance(v, dict) and "note" in v}
        component = Component(
            name=self.text("name"),
            formula=self.text("formula"),
            cas=self.text("cas"),
            aliases=tuple(self.data.get("aliases", ())),
            equilibrium=equilibrium,
            equilibrium_in_water=in_water,
            molar_mass=self.quantity("molar_mass", "kg/mol", required=True),
            ideal_gas_cp=self.heat_capacity("ideal_gas_cp", required=True),
            liquid_cp=self.heat_capacity("liquid_cp"),
            vapour_pressure=self.vapour_pressure(),
            heat_of_vaporisation=self.quantity("heat_of_vaporisation", "J/mol", with_temperature=True),
            henry_in_water=self.henry(),
            melting_point=self.quantity("melting_point", "K"),
            critical_temperature=self.quantity("critical_temperature", "K"),
            critical_pressure=self.quantity("critical_pressure", "Pa"),
            acentric_factor=self.quantity("acentric_factor", "-"),
            partial_molar_volume=self.quantity("partial_molar_volume_in_water", "m3/mol", with_temperature=True),
            sources=dict(sources),
            notes=notes,
            origin=self.where,
        )
        if equilibrium == "henry" and component.henry_in_water is None:
            self.fail("henry_in_water", "equilibrium = 'henry' needs a [henry_in_water] table")
        if equilibrium == "raoult":
            for key in ("vapour_pressure", "heat_of_vaporisation", "liquid_cp"):
                if getattr(component, key) is None:
                    self.fail(key, "equilibrium = 'raoult' needs this table")
        return component
