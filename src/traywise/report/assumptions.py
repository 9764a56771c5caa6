"""The assumptions in force for one run, in words, generated from the models the run used.

Read from the results record only: the gas model (``inputs.gas_model``), each component's
equilibrium model, the liquid's activity model, the stage efficiencies, the mode, the pressure
profile, the coolers, the internals. Nothing here is fixed text about a model the run did not use.
"""

from .tables import Display, number

_EQUILIBRIUM = {
    "henry": "Henry's law (physical solubility at infinite dilution in the solvent, its temperature dependence "
             "giving the heat of solution)",
    "raoult": "Raoult's law (ideal liquid: vapour pressure times mole fraction; heat of vaporisation from the "
              "vapour-pressure correlation's reference value and the liquid heat capacity)",
    "nonvolatile": "non-volatile (stays in the liquid)",
    "insoluble": "insoluble (stays in the gas)",
    "activity": "activity-coefficient liquid anchored to the measured Henry's constant at infinite dilution",
    "table": "the case's equilibrium table (partial pressure against loading, van 't Hoff between isotherms)",
    "eos": "Peng-Robinson equation of state for both phases",
    "electrolyte": "the aqueous electrolyte liquid (Henry's law for the molecular form, dissociation and "
                   "neutralisation with charge balance, Pitzer activity coefficients; heats of dissociation and "
                   "neutralisation in the liquid enthalpy)",
}


def assumption_lines(results):
    """The assumptions of this run as sentences."""
    inputs, column = results["inputs"], results["column"]
    units = Display(results["display_units"])
    lines = ["Steady state; each stage's vapour and liquid leave at one temperature and pressure; no entrainment, "
             "weeping or heat loss to the surroundings unless stated below."]
    lines.append(_gas_line(inputs.get("gas_model") or {"model": "ideal"}, results))
    lines.extend(_equilibrium_lines(results))
    lines.append(_chemistry_line(results))
    lines.append(_stage_line(column))
    lines.append(_mode_line(column, inputs, units))
    lines.append(_pressure_line(results, units))
    coolers = [q for q in results["stages"]["heat_removed_W"] if q > 0.0]
    if coolers:
        lines.append(f"Heat removed on {len(coolers)} stage(s) as stated (coolers, intercoolers or heat loss).")
    lines.append("Enthalpies: each component as ideal gas at 25 degC as reference; the liquid's from the "
                 "equilibrium model's temperature dependence, so heats of solution and vaporisation agree with it.")
    if results["solvent_in"].get("liquid_volume_flow_m3_per_s") is not None:
        lines.append("Liquid volume flows: ideal mixing of the pure liquids' volumes; dissolved gases add mass only.")
    return lines


def _chemistry_line(results):
    ionic = [c["name"] for c in results["components"] if c["equilibrium_model"] == "electrolyte"]
    if ionic:
        others = [c["name"] for c in results["components"] if c["equilibrium_model"] == "henry"]
        rest = f"; {', '.join(others)} physical (no ionisation)" if others else ""
        return (f"Ionisation and reactions in the liquid for {', '.join(ionic)} (aqueous electrolyte liquid, with "
                f"water and any sodium hydroxide){rest}.")
    return ("No chemical reactions or ionisation in the liquid: physical absorption only (solutes that react "
            "with the solvent, such as ammonia, sulfur dioxide, carbon dioxide or hydrogen sulfide in water, "
            "dissolve somewhat more in reality when the liquid's pH favours their ions).")


def _gas_line(gas_model, results):
    pressure = max(results["stages"]["pressure_Pa"])
    units = Display(results["display_units"])
    if gas_model.get("model") == "peng_robinson":
        return (f"Real gas: Peng-Robinson fugacity coefficients and residual enthalpies (k_ij {gas_model.get('kij_source')}); "
                "Poynting factors for the Henry's-law gases.")
    return (f"Ideal gas (fugacity coefficients 1, no Poynting correction) up to {units.pressure(pressure)} "
            f"{units.p_unit}.")


def _equilibrium_lines(results):
    by_model = {}
    for component in results["components"]:
        by_model.setdefault(component["equilibrium_model"], []).append(component["name"])
    lines = []
    activity = (results["inputs"].get("liquid_model") or {})
    for model, names in by_model.items():
        text = f"{', '.join(names)}: {_EQUILIBRIUM.get(model, model)}"
        if model == "activity" and activity:
            text += f" ({activity.get('activity', '').upper()} {activity.get('version', '')})".rstrip()
        lines.append(text + ".")
    return lines


def _stage_line(column):
    murphree = column["murphree_efficiency"]
    if murphree is None or all(abs(e - 1.0) < 1e-12 for e in murphree):
        text = f"{column['theoretical_stages']} equilibrium (theoretical) stages"
    else:
        values = sorted({round(e, 6) for e in murphree})
        shown = number(values[0], 3) if len(values) == 1 else f"{number(values[0], 3)} to {number(values[-1], 3)}"
        text = f"{column['theoretical_stages']} trays with Murphree vapour efficiency {shown}"
    if column["overall_efficiency"] is not None:
        text += (f"; actual trays counted as stages over the overall efficiency {number(column['overall_efficiency'], 3)}"
                 f" = {column['actual_trays']}")
    return text + "."


def _mode_line(column, inputs, units):
    if column["mode"] == "isothermal":
        temperatures = inputs.get("column", {}).get("isothermal_temperature_K")  # one per stage
        low, high = (None, None) if not temperatures else (min(temperatures), max(temperatures))
        at = "" if low is None else f" at {units.temperature(low)} {units.t_unit}" if low == high else (
            f" at {units.temperature(low)} to {units.temperature(high)} {units.t_unit}")
        return f"Isothermal stages{at}: stage temperatures fixed, no energy balances."
    return "Adiabatic stages: the heat of absorption and the solvent's evaporation or condensation enter the energy balances."


def _pressure_line(results, units):
    column = results["column"]
    internals = (results["inputs"].get("internals") or {})
    if internals.get("pressure_drop_from_sizing"):
        return "Stage pressures from the pressure drop of the sized internals."
    drop = column["pressure_drop_Pa_per_stage"]
    if drop == 0.0:
        return f"Constant pressure {units.pressure(column['top_pressure_Pa'])} {units.p_unit} on every stage."
    return (f"Constant pressure drop per stage, {drop / 1e3:.3g} kPa, from {units.pressure(column['top_pressure_Pa'])} "
            f"{units.p_unit} at the top.")
