"""The ``[design]`` table: a removal target on the key solute and/or a temperature limit, the
input solved for to meet it, a concentration limit on the liquid leaving the bottom (checked), and the extra figures asked for (minimum solvent flow, O'Connell's
tray efficiency). Read into a ``DesignInput`` whose fields are those the design layer takes
(``traywise.design.plan``); the design itself is run by the command line."""

import re
from dataclasses import dataclass

from ..design.targets import LiquidOutletLimit
from ..design.variables import stage_bound
from ..errors import InputError
from .limits import check_range
from .units import UnitProblem, composition_basis_of, split_number, to_si

DESIGN_KEYS = (
    "outlet_mole_fraction",
    "fraction_absorbed",
    "liquid_out_temperature_limit",
    "column_temperature_limit",
    "liquid_out_concentration_limit",
    "solve_for",
    "cooler_stage",
    "minimum_solvent",
    "oconnell_efficiency",
)
# case word -> name in traywise.design.variables
SOLVABLE = {"solvent_flow": "solvent_flow", "stages": "n_stages", "cooler_duty": "cooler_duty"}
# case key -> place of traywise.design.targets.TemperatureLimit
LIMITS = {"liquid_out_temperature_limit": "liquid_outlet", "column_temperature_limit": "column_maximum"}
PER_MILLION_UNITS = ("ppmv", "ppm")  # an outlet written in these is reported in ppmv
REFERENCE_VOLUMES = ("Nm3", "Nm³", "Sm3", "Sm³", "scf")  # gas volumes at reference conditions (units.py)


@dataclass(frozen=True)
class DesignInput:
    """The design table in SI (cases/README.md, ``[design]``).

    solute : str or None          The key component when a removal target is given
    quantity : str or None        'outlet_mole_fraction', 'outlet_ppmv' or 'fraction_absorbed'
    value : float or None         In the quantity's units: mole fraction [-], ppmv, fraction [-]
    limit_place : str or None     'liquid_outlet' or 'column_maximum'
    limit_value : float or None   Highest temperature allowed [K]
    solve_for : str               'solvent_flow', 'n_stages' or 'cooler_duty'
    cooler_stage : int or None    1-based
    minimum_solvent : bool
    oconnell_efficiency : bool
    liquid_limit : LiquidOutletLimit or None   Checked on the designed column
    """

    solute: str | None
    quantity: str | None
    value: float | None
    limit_place: str | None
    limit_value: float | None
    solve_for: str
    cooler_stage: int | None
    minimum_solvent: bool
    oconnell_efficiency: bool
    liquid_limit: LiquidOutletLimit | None = None

    def echo(self):
        """The table as read, SI units in the key names (for results.json)."""
        return {
            "key_component": self.solute,
            "target_quantity": self.quantity,
            "target_value": self.value,
            "temperature_limit_place": self.limit_place,
            "temperature_limit_K": self.limit_value,
            "solve_for": next(word for word, name in SOLVABLE.items() if name == self.solve_for),
            "cooler_stage": self.cooler_stage,
            "minimum_solvent": self.minimum_solvent,
            "oconnell_efficiency": self.oconnell_efficiency,
            "liquid_out_limit": None if self.liquid_limit is None else {
                "component": self.liquid_limit.component, "basis": self.liquid_limit.basis,
                "value": self.liquid_limit.value},
        }


def read_design(top, *, model, column, column_input, key, gas_flows, solvent):
    """The ``[design]`` table of the top-level Section as a DesignInput, or None when absent.

    Parameters
    ----------
    top : Section                 The case file's top level
    model : PropertyModel
    column : Column               The column built from the case
    column_input : ColumnInput    The ``[column]`` table as read
    key : int                     Index of the key component
    gas_flows : ndarray (c,)      Component flows of the gas feed [mol/s]
    solvent : int                 Index of the solvent component
    """
    section = top.table("design", DESIGN_KEYS)
    if section is None:
        return None
    solve_for = SOLVABLE[section.text("solve_for", choices=tuple(SOLVABLE))]
    quantity, value = _removal_target(section, model.names[key], gas_flows[key] / gas_flows.sum(),
                                      float(model.molar_mass[key]))
    limits = [name for name in LIMITS if name in section]
    if len(limits) > 1:
        section.fail(limits[1], f"give one temperature limit, not both {' and '.join(limits)}")
    limit_place = LIMITS[limits[0]] if limits else None
    limit_value = check_range(section, limits[0], "temperature", section.quantity(limits[0], "temperature")) if limits else None
    liquid_limit = _liquid_limit(section, model, key)
    cooler_stage = _cooler_stage(section, solve_for, column_input)
    minimum = section.boolean("minimum_solvent", False)
    oconnell = section.boolean("oconnell_efficiency", False)
    needs_target = [name for name, asked in (("minimum_solvent", minimum), ("oconnell_efficiency", oconnell)) if asked]
    if solve_for != "cooler_duty":
        needs_target.insert(0, "solve_for")
    if quantity is None and needs_target:
        section.fail(needs_target[0], "needs a removal target on the key solute: add outlet_mole_fraction (e.g. "
                     "\"20 ppmv\") or fraction_absorbed (e.g. \"99 %\")")
    if solve_for == "cooler_duty" and limit_place is None:
        section.fail("solve_for", "solving for 'cooler_duty' needs a temperature limit to hold: add "
                     "liquid_out_temperature_limit or column_temperature_limit (e.g. \"40 degC\")")
    fixed = _fixed_in_place(column, column_input)
    if solve_for == "n_stages" and fixed:
        section.fail("solve_for", f"'stages' changes the stage count, which leaves {' and '.join(fixed)} without a fixed "
                     "place; remove them or solve for 'solvent_flow' instead")
    if oconnell and (fixed or solve_for == "cooler_duty"):
        what = " and ".join(fixed) if fixed else "the cooler being designed"
        section.fail("oconnell_efficiency", f"trays are found by changing the stage count, which leaves {what} without "
                     "a fixed place; remove oconnell_efficiency (the column table's overall_efficiency still gives "
                     "the trays of the designed column)")
    unfit = _fixed_in_place(column, column_input, longer_only=True)
    if minimum and unfit:
        section.fail("minimum_solvent", f"the minimum solvent flow is found on columns with many more stages, which "
                     f"leave {' and '.join(unfit)} without a fixed place; give one value for every stage or remove "
                     "minimum_solvent")
    if oconnell and not model.components[solvent].is_water:
        section.fail("oconnell_efficiency", f"O'Connell's correlation needs the liquid's viscosity and density, which "
                     f"traywise has for water only (the solvent is {model.names[solvent]}); give "
                     "column.overall_efficiency instead")
    return DesignInput(
        solute=None if quantity is None else model.names[key],
        quantity=quantity,
        value=value,
        limit_place=limit_place,
        limit_value=limit_value,
        solve_for=solve_for,
        cooler_stage=cooler_stage,
        minimum_solvent=minimum,
        oconnell_efficiency=oconnell,
        liquid_limit=liquid_limit,
    )


def _removal_target(section, key_name, inlet, molar_mass):
    """(quantity, value) of the removal target, or (None, None); ``inlet`` is the key's mole
    fraction in the gas feed [-], ``molar_mass`` the key's [kg/mol]. A mass concentration at
    reference conditions ("20 mg/Nm3": Nm3 at 0 degC and 101.325 kPa, common practice for emission
    limits in Europe; also Sm3, scf) is per volume of the gas as it leaves (water vapour
    included) and becomes ppmv: y = (mass of solute per mole of gas) / M."""
    given = [name for name in ("outlet_mole_fraction", "fraction_absorbed") if name in section]
    if len(given) > 1:
        section.fail(given[1], "give one removal target, not both outlet_mole_fraction and fraction_absorbed")
    if not given:
        return None, None
    if given[0] == "fraction_absorbed":
        return "fraction_absorbed", section.fraction("fraction_absorbed", open_high=True)
    raw = section.data["outlet_mole_fraction"]
    concentration = _reference_concentration(section, raw)
    if concentration is not None:
        fraction = concentration / molar_mass
        if not 0.0 < fraction < inlet:
            section.fail("outlet_mole_fraction", f"found {raw!r} = {1e6 * fraction:.6g} ppmv of {key_name}; expected a "
                         f"value above 0 and below the gas fed ({1e6 * inlet:.6g} ppmv)")
        return "outlet_ppmv", 1e6 * fraction
    fraction = section.fraction("outlet_mole_fraction", open_high=True)
    if isinstance(raw, str) and composition_basis_of(raw) == "mass":
        section.fail("outlet_mole_fraction", f"found '{raw}', a mass fraction; give a mole fraction such as "
                     "\"20 ppmv\", \"0.05 mol%\" or 2e-5, or a mass concentration at reference conditions such "
                     "as \"15 mg/Nm3\"")
    if fraction >= inlet:
        section.fail("outlet_mole_fraction", f"found {raw!r} = {fraction:.6g}, not below the {key_name} mole fraction "
                     f"of the gas fed ({inlet:.6g}): there is nothing to absorb")
    if isinstance(raw, str) and split_number(raw)[1] in PER_MILLION_UNITS:
        return "outlet_ppmv", split_number(raw)[0]  # the number as written: "30 ppmv" is 30, not 29.999999999999996
    return "outlet_mole_fraction", fraction


def _reference_concentration(section, raw):
    """Solute mass per mole of gas [kg/mol] of a target written as mass per reference gas volume
    ("20 mg/Nm3"), or None for any other target."""
    if not isinstance(raw, str):
        return None
    if not any(volume in raw for volume in REFERENCE_VOLUMES):
        if re.search(r"g\s*/\s*(m3|m³|m\*\*3|L)\b", raw):
            section.fail("outlet_mole_fraction", f"found '{raw}', a mass per volume at the actual temperature and "
                         "pressure, which traywise does not guess; give it at reference conditions (\"15 mg/Nm3\": "
                         "0 degC and 101.325 kPa) or as a mole fraction (\"20 ppmv\")")
        return None
    try:
        value, _ = to_si(raw, ("molar_mass",))
    except UnitProblem as problem:
        section.fail("outlet_mole_fraction", f"{problem}; a concentration at reference conditions is a mass per "
                     "reference volume, such as \"20 mg/Nm3\"")
    return value


def _liquid_limit(section, model, key):
    """The LiquidOutletLimit of ``liquid_out_concentration_limit``, or None: "2 wt%" limits the key
    component, { ammonia = "2 wt%" } names one. wt%, mass%, ppmw are mass fractions; mol%, a plain
    number (0.02) mole fractions; "%" and "ppm" say neither and are refused."""
    name = "liquid_out_concentration_limit"
    if name not in section:
        return None
    raw, component = section.data[name], model.names[key]
    example = f"\"2 wt%\", \"500 ppmw\", \"1 mol%\" or a mole fraction such as 0.01"
    if isinstance(raw, dict):
        if len(raw) != 1:
            section.fail(name, f"found {len(raw)} components; name one, e.g. {{ {component} = \"2 wt%\" }}")
        ((written, raw),) = raw.items()
        try:
            component = model.names[model.component_index(written)]
        except InputError:
            section.fail(name, f"'{written}' is not a component of this case; expected one of {', '.join(model.names)}")
    basis = "mole"
    if isinstance(raw, str):
        try:
            to_si(raw, ("fraction",))
            basis = composition_basis_of(raw)
        except UnitProblem:
            section.fail(name, f"found '{raw}', which is not a mass or mole fraction; give {example}")
        if basis is None and split_number(raw)[1]:
            section.fail(name, f"found '{raw}', which says neither a mass nor a mole fraction; give {example}")
    elif isinstance(raw, bool) or not isinstance(raw, (int, float)):
        section.fail(name, f"found {raw!r}; expected {example}, or a table naming the component "
                     f"({{ {component} = \"2 wt%\" }})")
    value = section.fraction(name, value=raw, open_high=True)
    return LiquidOutletLimit(component, "mass_fraction" if basis == "mass" else "mole_fraction", value)


def _cooler_stage(section, solve_for, column_input):
    if solve_for != "cooler_duty":
        if "cooler_stage" in section:
            section.fail("cooler_stage", "is used only with solve_for = 'cooler_duty'; remove it or change solve_for")
        return None
    if column_input.mode != "adiabatic":
        section.fail("solve_for", "'cooler_duty' needs mode = 'adiabatic' (in an isothermal column coolers have no effect)")
    stage = section.integer("cooler_stage")
    n = column_input.n_stages
    if not 1 <= stage <= n:
        section.fail("cooler_stage", f"found {stage}; the column has stages 1 to {n} (numbered from the top)")
    return stage


def _fixed_in_place(column, column_input, *, longer_only=False):
    """The case keys of what a different stage count (``longer_only``: a larger one) leaves
    without a place in ``column`` (the rule is the design layer's ``stage_bound``)."""
    keys = {
        "extra_feeds": ["[[column.side_feed]] tables"],
        "side_draws": ["[[column.side_draw]] tables"],
        "murphree": ["a column.murphree_efficiency that differs from stage to stage"],
        "temperature": ["a column.isothermal_temperature that differs from stage to stage"],
        "heat_removed": [what for present, what in ((bool(column_input.coolers), "[[column.cooler]] tables"),
                                                    (column_input.heat_loss > 0.0, "column.heat_loss")) if present],
    }
    return [what for name in stage_bound(column, longer_only=longer_only) for what in keys[name]]
