"""Words, display units and reference lines of a sweep, read from its record (sweep.json).

Inputs and outputs keep their code names in sweep.csv and sweep.json (``outlet_ppmv:ammonia``);
tables and the figure show words ("ammonia in the gas out") in the units the case was written in
(``display_units`` of the record: temperature, pressure, and the solvent flow in kg/h when the
case gives it as a mass flow). The design's target, temperature limit and liquid outlet limit are
drawn on the outputs they concern, and the designed value of the swept input is marked.
"""

from ..properties.constants import ZERO_CELSIUS

INPUT_WORDS = {
    "solvent_flow": "solvent flow",
    "stages": "theoretical stages",
    "gas_temperature": "gas feed temperature",
    "solvent_temperature": "solvent feed temperature",
    "top_pressure": "top pressure",
    "cooler_duty": "cooler duty",
}
COMPONENT_WORDS = {
    "fraction_absorbed": "{} absorbed",
    "outlet_mole_fraction": "{} in the gas out",
    "outlet_ppmv": "{} in the gas out",
    "liquid_out_mole_fraction": "{} in the liquid out",
    "liquid_out_mass_fraction": "{} in the liquid out",
}
COLUMN_WORDS = {
    "max_temperature": "hottest stage temperature",
    "hottest_stage": "hottest stage",
    "gas_out_temperature": "gas out temperature",
    "liquid_out_temperature": "liquid out temperature",
    "heat_released": "heat released",
    "heat_removed": "heat removed by coolers",
    "solvent_lost": "net flow the gas picks up",
    "iterations": "Newton iterations",
}
WHOLE_NUMBERS = ("stages", "hottest_stage", "iterations")  # drawn as steps, shown without decimals
_DEFAULT = {"temperature": {"unit": "degC", "scale": 1.0, "offset": -ZERO_CELSIUS},
            "pressure": {"unit": "kPa", "scale": 1e-3, "offset": 0.0}}


def words(name):
    """The words of an input or output code name."""
    if name in INPUT_WORDS:
        return INPUT_WORDS[name]
    if ":" in name:
        kind, component = name.split(":", 1)
        return COMPONENT_WORDS.get(kind, kind.replace("_", " ") + " {}").format(component)
    return COLUMN_WORDS.get(name, name.replace("_", " "))


def is_whole(name):
    return name in WHOLE_NUMBERS


def converter(record, name, unit):
    """(display unit, function SI -> display) of an input or output of the sweep ``record``."""
    units = record.get("display_units") or _DEFAULT
    if name.startswith("fraction_absorbed"):
        return "%", lambda v: 100.0 * v
    if unit == "K":
        entry = units["temperature"]
        return entry["unit"], lambda v: v * entry["scale"] + entry["offset"]
    if unit == "Pa":
        entry = units["pressure"]
        return entry["unit"], lambda v: v * entry["scale"]
    if unit == "W":
        return "kW", lambda v: v / 1e3
    if unit == "mol/s":
        flow = units.get("flow", {})
        molar_mass = record.get("solvent_molar_mass_kg_per_mol")
        if name == "solvent_flow" and flow.get("basis") == "mass" and molar_mass:
            return flow["unit"], lambda v: v * molar_mass * flow["scale"]
        return "kmol/h", lambda v: v * 3.6
    if unit == "-" and name.startswith(("outlet_mole_fraction", "liquid_out_mole_fraction")):
        return "mol frac", lambda v: v
    if unit == "-" and name.startswith("liquid_out_mass_fraction"):
        return "mass frac", lambda v: v
    return ("-" if unit == "-" else unit), lambda v: v


def label(record, name, unit):
    """Axis or column label: words and display unit."""
    shown = converter(record, name, unit)[0]
    return words(name) if shown == "-" else f"{words(name)} [{shown}]"


def reference_lines(record, name):
    """(value in SI, text) of the design's target or limits drawn on the output ``name``."""
    design = record.get("design") or {}
    lines = []
    target, key = design.get("target_quantity"), design.get("key_component")
    if target is not None and ":" in name and name.split(":", 1)[1] == key:
        kind = name.split(":", 1)[0]
        value = design["target_value"]
        fraction = value * 1e-6 if target == "outlet_ppmv" else value
        if kind == "outlet_ppmv" and target != "fraction_absorbed":
            lines.append((value if target == "outlet_ppmv" else 1e6 * value, "target"))
        elif kind == "outlet_mole_fraction" and target != "fraction_absorbed":
            lines.append((fraction, "target"))
        elif kind == "fraction_absorbed" and target == "fraction_absorbed":
            lines.append((value, "target"))
    place = design.get("temperature_limit_place")
    if place is not None and name == {"liquid_outlet": "liquid_out_temperature",
                                      "column_maximum": "max_temperature"}[place]:
        lines.append((design["temperature_limit_K"], "limit"))
    liquid = design.get("liquid_out_limit")
    if liquid is not None and name == f"liquid_out_{liquid['basis']}:{liquid['component']}":
        lines.append((liquid["value"], "liquid outlet limit"))
    return lines
