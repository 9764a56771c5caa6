"""The units reports show: those the case was written in, or the ``[report] units`` choice.

Three quantities follow the case: temperature (the unit of ``gas_feed.temperature``, else of
``solvent_feed.temperature``), pressure (``column.top_pressure``) and flow (``solvent_feed.flow``,
else ``gas_feed.flow``; a mass-flow unit makes the reports lead with mass flows, a molar one with
molar flows; gas volumes at reference conditions such as Nm3/h are shown as kmol/h). Reports show
both kmol/h and kg/h in stream tables whatever the choice. ``[report] units = "kg/h, bar, degC"``
names one or more units, each replacing the case's unit of its kind. pint is used here, so that
the report layer gets plain factors: a value shown is ``si * scale + offset``.
"""

from ..errors import CaseError
from .units import UnitProblem, quantity, registry

DEFAULT = {"temperature": "degC", "pressure": "kPa", "flow": "kmol/h"}
_TEMPERATURES = {"degC": ("degC", 1.0, -273.15), "°C": ("degC", 1.0, -273.15), "K": ("K", 1.0, 0.0),
                 "degF": ("degF", 1.8, -459.67), "°F": ("degF", 1.8, -459.67)}
_SI = {"pressure": "pascal", "mass_flow": "kilogram / second", "molar_flow": "mole / second"}


def display_units(data, where):
    """Display units of a case (the tables as read, ``data``) as a JSON-ready dict:
    kind -> {"unit", "scale", "offset"} for 'temperature', 'pressure' and 'flow' (with "basis":
    'mass' or 'molar'); CaseError naming ``report.units`` for a choice that cannot be read."""
    chosen = {}
    written = (data.get("report") or {}).get("units")
    if written is not None and written != "case":
        if not isinstance(written, str) or not written.strip():
            raise CaseError(f"{where}: report.units", f"expected \"case\" or units such as \"kg/h, bar, degC\", found {written!r}")
        for text in written.split(","):
            kind, entry = _entry(text.strip())
            if entry is None:
                raise CaseError(f"{where}: report.units", f"'{text.strip()}' is not a temperature, pressure or flow "
                                "unit; give e.g. \"degC\", \"K\", \"bar\", \"kPa\", \"kg/h\", \"kmol/h\", \"t/h\"")
            chosen[kind] = entry
    found = {}
    for kind, places in (("temperature", (("gas_feed", "temperature"), ("solvent_feed", "temperature"))),
                         ("pressure", (("column", "top_pressure"),)),
                         ("flow", (("solvent_feed", "flow"), ("gas_feed", "flow")))):
        for table, key in places:
            value = (data.get(table) or {}).get(key)
            entry = _entry(_unit_of(value)) if isinstance(value, str) else (None, None)
            if entry[1] is not None and entry[0] == kind:
                found[kind] = entry[1]
                break
    result = {}
    for kind, unit in DEFAULT.items():
        result[kind] = chosen.get(kind) or found.get(kind) or _entry(unit)[1]
    return result


def _unit_of(text):
    parts = text.strip().split(maxsplit=1)
    return parts[1] if len(parts) == 2 else ""


def _entry(unit):
    """(kind, {"unit", "scale", "offset"[, "basis"]}) of a unit text, or (None, None)."""
    if unit in _TEMPERATURES:
        name, scale, offset = _TEMPERATURES[unit]
        return "temperature", {"unit": name, "scale": scale, "offset": offset}
    try:
        value = quantity(f"1 {unit}")
    except UnitProblem:
        return None, None
    import pint

    for kind, si in _SI.items():
        try:
            factor = float(value.to(registry()(si)).magnitude)
        except (pint.errors.DimensionalityError, ValueError):
            continue
        if kind == "pressure":
            return "pressure", {"unit": unit, "scale": 1.0 / factor, "offset": 0.0}
        if kind == "molar_flow" and any(volume in unit for volume in ("Nm3", "Sm3", "scf")):
            return "flow", {"unit": "kmol/h", "scale": 3.6, "offset": 0.0, "basis": "molar"}
        basis = "mass" if kind == "mass_flow" else "molar"
        return "flow", {"unit": unit, "scale": 1.0 / factor, "offset": 0.0, "basis": basis}
    return None, None
