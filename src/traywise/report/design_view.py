"""The design of a run (``traywise.design.plan.DesignOutcome``) for results.json, the console
summary and report.md: the target and what was reached, the input solved for, the minimum solvent
flow with the pinch, and the trays by each efficiency route.

A liquid outlet limit is shown on the basis it was written in (wt% or ppmw, mol% or ppm (mol)).

``design_json`` builds the "design" section of results.json (keys in ``results_keys.RESULTS_KEYS``);
the text functions read that section, so that every output shows the same numbers.
"""

from .results import DEFAULT_UNITS, plain
from .tables import (SECONDS_PER_HOUR, Display, concentration, kilowatt, kmol_per_hour, mass_concentration, number,
                     percent)

SOURCE_WORDS = {"given": "given", "O'Connell's absorber correlation": "O'Connell"}  # short labels for tables
SOLVE_FOR_WORDS = {"solvent_flow": "solvent_flow", "n_stages": "stages", "cooler_duty": "cooler_duty"}  # design -> case


def design_json(outcome):
    """The "design" section of results.json: JSON-ready, SI, units in the key names."""
    result, solution = outcome.result, outcome.result.solution
    column = result.column
    molar_mass = solution.molar_mass
    return plain({
        "solve_for": SOLVE_FOR_WORDS[result.variable],
        "solvent_flow_mol_per_s": column.solvent.flow,
        "solvent_mass_flow_kg_per_s": column.solvent.component_flows @ molar_mass,
        "stages": column.n_stages,
        "fractional_stages": result.fractional_stages,
        "cooler_stage": outcome.cooler_stage,
        "cooler_duty_W": result.value if result.variable == "cooler_duty" else None,
        "target": None if outcome.target is None else {
            "key_component": outcome.target.key,
            "quantity": outcome.target.quantity,
            "required": outcome.target.value,
            "reached": outcome.target.reached(solution),
            "met": outcome.target_met,
            "solved_for": result.variable != "cooler_duty",
        },
        "temperature_limit": None if outcome.limit is None else {
            "place": outcome.limit.place,
            "limit_K": outcome.limit.value,
            "reached_K": outcome.limit.reached(solution),
            "held": outcome.limit_held,
            "solved_for": result.variable == "cooler_duty",
        },
        "liquid_out_limit": None if outcome.liquid_limit is None else {
            "component": outcome.liquid_limit.component,
            "basis": outcome.liquid_limit.basis,
            "limit": outcome.liquid_limit.value,
            "reached": outcome.liquid_limit.reached(solution),
            "held": outcome.liquid_limit_held,
        },
        "solves": result.solves,
        "iterations": result.iterations,
        "minimum_solvent": None if outcome.minimum is None else _minimum_json(outcome.minimum, column, molar_mass),
        "trays": [_trays_json(trays) for trays in outcome.trays],
    })


def _minimum_json(minimum, column, molar_mass):
    from ..design.minimum_solvent import COMMON_PRACTICE_RANGE

    mass_per_mole = float(column.solvent.component_flows @ molar_mass) / column.solvent.flow  # kg/mol of solvent feed
    low, high = COMMON_PRACTICE_RANGE
    return {
        "solvent_flow_mol_per_s": minimum.solvent_flow,
        "solvent_mass_flow_kg_per_s": minimum.solvent_flow * mass_per_mole,
        "stages_used": minimum.n_stages,
        "resolution": minimum.resolution,
        "design_multiple": minimum.multiple,
        "common_practice_range": [low, high],
        "pinch": {
            "location": minimum.pinch.location,
            "stage": minimum.pinch.stage,
            "zone": list(minimum.pinch.zone),
            "temperature_K": minimum.pinch.temperature,
        },
        "inert_basis_solvent_flow_mol_per_s": minimum.inert_basis_solvent_flow,
        "inert_basis_solvent_mass_flow_kg_per_s": minimum.inert_basis_solvent_flow * mass_per_mole,
        "inert_basis_liquid_to_gas_ratio": minimum.inert_basis_ratio,
        "inert_basis_temperature_K": minimum.inert_basis_temperature,
        "inert_basis_pressure_Pa": minimum.inert_basis_pressure,
        "inert_basis_design_multiple": minimum.inert_basis_multiple,
    }


def _trays_json(trays):
    return {
        "efficiency_source": trays.efficiency_source,
        "overall_efficiency": trays.overall_efficiency,
        "theoretical_stages": trays.theoretical.fractional_stages,
        "trays_by_overall_efficiency": trays.trays_from_overall,
        "murphree_efficiency": trays.murphree,
        "trays_by_murphree_efficiency": trays.rigorous_trays,
        "stripping_factor": trays.stripping_factor,
        "oconnell_group": trays.oconnell_group,
        "recommended_trays": trays.recommended_trays,
        "recommendation": trays.recommendation,
    }


# -- text, from the results record ------------------------------------------------------------
def design_lines(results):
    """Sentences on the design: what was solved for, the target, the limit, the minimum solvent."""
    design = results["design"]
    units = Display(results.get("display_units") or DEFAULT_UNITS)
    lines = [_solved_line(design)]
    if design["target"] is not None:
        lines.append(_target_line(design["target"]))
    if design["temperature_limit"] is not None:
        lines.append(_limit_line(design["temperature_limit"], units))
    if design.get("liquid_out_limit") is not None:
        lines.append(_liquid_limit_line(design["liquid_out_limit"]))
    if design["minimum_solvent"] is not None:
        lines.extend(_minimum_lines(design["minimum_solvent"], units))
    for route in design["trays"]:
        source = SOURCE_WORDS.get(route["efficiency_source"], route["efficiency_source"])
        lines.append(f"Trays to use, E_o {number(route['overall_efficiency'], 3)} ({source}): "
                     f"{route['recommendation']}.")
    return lines


def trays_table(results):
    """(headers, rows) of the trays by each efficiency route, or None without any."""
    routes = results["design"]["trays"]
    if not routes:
        return None
    headers = ["overall efficiency E_o", "theoretical stages N", "trays N / E_o", "Murphree E_MV", "trays, rigorous"]
    rows = [
        (f"{number(r['overall_efficiency'], 3)} ({SOURCE_WORDS.get(r['efficiency_source'], r['efficiency_source'])})",
         f"{r['theoretical_stages']:.2f}", str(r["trays_by_overall_efficiency"]), number(r["murphree_efficiency"], 3),
         str(r["trays_by_murphree_efficiency"]))
        for r in routes
    ]
    return headers, rows


def _solved_line(design):
    work = f"{design['solves']} rigorous solves, {design['iterations']} Newton iterations"
    if design["solve_for"] == "solvent_flow":
        return (f"Design: solvent flow adjusted to {_kg_per_hour(design['solvent_mass_flow_kg_per_s'])} kg/h "
                f"({kmol_per_hour(design['solvent_flow_mol_per_s'])} kmol/h); {work}.")
    if design["solve_for"] == "stages":
        return (f"Design: {design['stages']} stages, the fewest that meet the target ({design['fractional_stages']:.2f} "
                f"by interpolation); {work}.")
    return f"Design: cooler on stage {design['cooler_stage']} removing {kilowatt(design['cooler_duty_W'])} kW; {work}."


def _target_line(target):
    state = "solved for" if target["solved_for"] else ("met" if target["met"] else "NOT MET")
    key, quantity = target["key_component"], target["quantity"]
    if quantity == "fraction_absorbed":
        return (f"Target: at least {percent(target['required'])} % of the {key} absorbed; reached "
                f"{percent(target['reached'])} % ({state}).")
    shown = (lambda v: f"{v:.4g} ppmv") if quantity == "outlet_ppmv" else concentration
    return f"Target: {key} in the gas out at most {shown(target['required'])}; reached {shown(target['reached'])} ({state})."


def _limit_line(limit, units):
    state = "solved for" if limit["solved_for"] else ("held" if limit["held"] else "BROKEN")
    where = "liquid outlet" if limit["place"] == "liquid_outlet" else "hottest stage"
    return (f"Temperature limit: {where} at most {units.temperature(limit['limit_K'])} {units.t_unit}; reached "
            f"{units.temperature(limit['reached_K'])} {units.t_unit} ({state}).")


def _liquid_limit_line(limit):
    shown = concentration if limit["basis"] == "mole_fraction" else mass_concentration
    state = "held" if limit["held"] else "BROKEN"
    return (f"Liquid outlet limit: {limit['component']} in the liquid leaving the bottom at most "
            f"{shown(limit['limit'])}; reached {shown(limit['reached'])} ({state}).")


def _minimum_lines(minimum, units):
    pinch = minimum["pinch"]
    low, high = minimum["common_practice_range"]
    zone = f"stages {pinch['zone'][0]}-{pinch['zone'][1]} of {minimum['stages_used']}"
    where = {"bottom": "at the bottom (rich end)", "top": "at the top (lean end)", "inside": "inside the column",
             "throughout": "throughout the column"}[pinch["location"]]
    return [
        f"Minimum solvent flow (rigorous, {minimum['stages_used']} stages for infinitely many): "
        f"{_kg_per_hour(minimum['solvent_mass_flow_kg_per_s'])} kg/h; the design is {minimum['design_multiple']:.3g} "
        f"x the minimum (common practice {low:g}-{high:g} x). Pinch {where}: {zone}, "
        f"{units.temperature(pinch['temperature_K'])} {units.t_unit} at stage {pinch['stage']}.",
        f"Minimum solvent flow (isothermal inert basis at {units.temperature(minimum['inert_basis_temperature_K'])} "
        f"{units.t_unit}): "
        f"{_kg_per_hour(minimum['inert_basis_solvent_mass_flow_kg_per_s'])} kg/h "
        f"(L'/V' {minimum['inert_basis_liquid_to_gas_ratio']:.4g}); the design is "
        f"{minimum['inert_basis_design_multiple']:.3g} x that.",
    ]


def _kg_per_hour(flow):
    """Mass flow [kg/s] as text in kg/h."""
    return f"{flow * SECONDS_PER_HOUR:.5g}"
