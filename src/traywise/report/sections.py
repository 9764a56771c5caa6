"""Tables shared by the console summary and report.md, built from the results record.

Each function takes the dict of ``results.results_record`` and returns (headers, rows) of
text, in display units (see ``tables``), so that both outputs show the same numbers.
"""

from .comparison_view import comparison_heading, comparison_rows, verdict_line
from .tables import (SECONDS_PER_HOUR, Display, concentration, fraction, kg_per_hour, kilowatt, kmol_per_hour, number,
                     percent, percentage)


STREAMS = (("gas_in", "gas in"), ("solvent_in", "solvent in"), ("gas_out", "gas out (top)"),
           ("liquid_out", "liquid out (bottom)"))


def stream_table(results):
    """Streams in and out in engineering units: conditions, kmol/h and kg/h (and the case's flow
    unit when it is neither), liquid volume flow, then mol% and wt% of each component."""
    units = Display(results["display_units"])
    streams = [results[key] for key, _ in STREAMS]
    rows = [
        (f"temperature [{units.t_unit}]", *(units.temperature(s["temperature_K"]) for s in streams)),
        (f"pressure [{units.p_unit}]", *(units.pressure(s["pressure_Pa"]) for s in streams)),
        ("flow [kmol/h]", *(kmol_per_hour(s["flow_mol_per_s"]) for s in streams)),
        ("flow [kg/h]", *(kg_per_hour(s["mass_flow_kg_per_s"]) for s in streams)),
    ]
    if units.flow_unit not in ("kmol/h", "kg/h"):
        rows.append((f"flow [{units.flow_unit}]",
                     *(units.flow(s["flow_mol_per_s"], s["mass_flow_kg_per_s"]) for s in streams)))
    rows.append(("liquid volume flow [m3/h]", *(_volume(s.get("liquid_volume_flow_m3_per_s")) for s in streams)))
    for name in streams[0]["mole_fractions"]:
        rows.append((f"{name} [mol%]", *(percentage(s["mole_fractions"][name]) for s in streams)))
    for name in streams[0]["mole_fractions"]:
        rows.append((f"{name} [wt%]", *(percentage(s["mass_fractions"][name]) for s in streams)))
    return ["stream", *(label for _, label in STREAMS)], rows


def _volume(value):
    return "-" if value is None else f"{value * SECONDS_PER_HOUR:.4g}"


def component_table(results):
    """Per component: equilibrium model, fraction absorbed, solvent lost to the gas, closure."""
    rows = []
    for component in results["components"]:
        name = component["name"]
        lost = results["solvent_lost_mol_per_s"][name]
        rows.append(
            (
                name,
                component["equilibrium_model"],
                percent(results["fraction_absorbed"][name]),
                kg_per_hour(lost * component["molar_mass_kg_per_mol"]) if lost > 0.0 else "-",
                number(results["convergence"]["component_closure"][name], 2),
            )
        )
    return ["component", "model", "absorbed [%]", "net lost to gas [kg/h]", "balance closure [-]"], rows


def heat_table(results):
    """The heat budget [kW]: heat each component gives the liquid (each solute's absorption, the
    solvent's condensation or evaporation apart), then where the heat released went."""
    heat, solvent = results["heat"], results["column"]["solvent"]
    terms = heat.get("by_component_W") or {}
    scale = max([abs(heat[k]) for k in HEAT_SINKS] + [abs(heat["released_W"])])
    rounding = 1e-9 * scale  # closure noise, shown as 0
    rows = []
    for name, term in terms.items():
        if term is None or abs(term) <= rounding:
            continue
        if name == solvent:
            label = f"condensation of {name}" if term > 0.0 else f"evaporation of {name}"
        else:
            label = f"absorption of {name}" if term > 0.0 else f"desorption of {name}"
        rows.append((label, "released" if term > 0.0 else "taken up", kilowatt(abs(term))))
    rows.append(("total released in the liquid", "released", kilowatt(heat["released_W"])))
    for key, label in HEAT_SINKS.items():
        if key == "evaporation_W":
            continue  # listed per component above
        value = heat[key]
        rows.append((label, "taken up", kilowatt(value if abs(value) > rounding else 0.0)))
    return ["heat", "", "[kW]"], rows


HEAT_SINKS = {
    "evaporation_W": "evaporating components",
    "liquid_heating_W": "heating the liquid",
    "gas_heating_W": "heating the gas",
    "removed_by_coolers_W": "removed by coolers",
    "other_W": "carried by extra feeds and draws",
}


def water_balance_lines(results):
    """The solvent's balance in sentences: evaporated, condensed, make-up or gain [kg/h]."""
    balance = results.get("solvent_balance")
    if balance is None:
        return []
    name = balance["solvent"]
    lines = [f"{name.capitalize()} evaporated on the stages where it leaves the liquid: "
             f"{kg_per_hour(balance['evaporated_kg_per_s'])} kg/h; condensed where it returns: "
             f"{kg_per_hour(balance['condensed_kg_per_s'])} kg/h."]
    if balance["make_up_kg_per_s"] > 0.0:
        lines.append(f"Net, the gas carries away {kg_per_hour(balance['make_up_kg_per_s'])} kg/h of {name}: "
                     f"make-up {name} needed {kg_per_hour(balance['make_up_kg_per_s'])} kg/h.")
    elif balance["gained_kg_per_s"] > 0.0:
        lines.append(f"Net, the liquid takes up {kg_per_hour(balance['gained_kg_per_s'])} kg/h of {name} from the "
                     f"gas: no make-up needed (the liquid leaves diluted by it).")
    else:
        lines.append(f"Net, no {name} passes between the phases: no make-up needed.")
    return lines


def stage_profile_table(results):
    """Per stage: temperature, pressure, flows, key-solute fractions, heat removed."""
    units = Display(results["display_units"])
    stages = results["stages"]
    names = [component["name"] for component in results["components"]]
    key = results["column"]["key_component"]
    i = names.index(key)
    headers = ["stage", f"T [{units.t_unit}]", f"P [{units.p_unit}]", "V [kmol/h]", "L [kmol/h]", f"y {key}",
               f"x {key}", "Q removed [kW]"]
    rows = [
        (
            str(stage),
            units.temperature(stages["temperature_K"][j]),
            units.pressure(stages["pressure_Pa"][j]),
            kmol_per_hour(stages["vapour_flow_mol_per_s"][j]),
            kmol_per_hour(stages["liquid_flow_mol_per_s"][j]),
            fraction(stages["vapour_mole_fractions"][j][i]),
            fraction(stages["liquid_mole_fractions"][j][i]),
            kilowatt(stages["heat_removed_W"][j]),
        )
        for j, stage in enumerate(stages["stage"])
    ]
    return headers, rows


def convergence_lines(results):
    """Plain sentences on convergence and balance closure."""
    convergence = results["convergence"]
    worst = max(convergence["component_closure"].values())
    return [
        f"Converged in {convergence['iterations']} iterations; scaled residual {convergence['scaled_residual']:.2g} "
        f"(tolerance {convergence['tolerance']:.2g}).",
        f"Balance closure: worst component {worst:.2g}, energy {convergence['energy_closure']:.2g} (relative).",
        f"Method: {convergence['method']}.",
    ]


def column_lines(results):
    """The column in one or two sentences: stages, trays, pressure, mode, feeds."""
    column = results["column"]
    text = f"{column['theoretical_stages']} theoretical stages, {column['mode']}"
    if column["actual_trays"] is not None:
        text += f"; overall efficiency {column['overall_efficiency']:g} gives {column['actual_trays']} actual trays"
    units = Display(results["display_units"])
    top = column["top_pressure_Pa"]
    drop = column["pressure_drop_Pa_per_stage"]
    solvent, gas = results["solvent_in"], results["gas_in"]
    coolers = sum(q for q in results["stages"]["heat_removed_W"] if q > 0.0)
    lines = [
        text + ".",
        f"Top pressure {units.pressure(top)} {units.p_unit}, {drop / 1e3:.2f} kPa per stage. Solvent "
        f"({column['solvent']}) {_flow(units, solvent)} at {units.temperature(solvent['temperature_K'])} "
        f"{units.t_unit}; gas {_flow(units, gas)} at {units.temperature(gas['temperature_K'])} {units.t_unit}.",
    ]
    if coolers > 0.0:
        lines.append(f"Coolers remove {kilowatt(coolers)} kW.")
    return lines


def _flow(units, stream):
    """A stream's flow in the case's unit, kmol/h beside a mass unit."""
    shown = f"{units.flow(stream['flow_mol_per_s'], stream['mass_flow_kg_per_s'])} {units.flow_unit}"
    if units.flow_unit == "kmol/h":
        return shown
    return f"{shown} ({kmol_per_hour(stream['flow_mol_per_s'])} kmol/h)"


def temperature_line(results):
    """Hottest stage and the outlet temperatures in one sentence."""
    units = Display(results["display_units"])
    t, u = results["temperatures"], units.t_unit
    return (
        f"Hottest stage {t['hottest_stage']} at {units.temperature(t['max_temperature_K'])} {u}; gas leaves at "
        f"{units.temperature(t['gas_out_temperature_K'])} {u}, liquid at {units.temperature(t['liquid_out_temperature_K'])} {u}."
    )


def key_line(results):
    """The key solute's removal in one sentence."""
    key = results["column"]["key_component"]
    gas_in, gas_out = results["gas_in"], results["gas_out"]
    return (
        f"Key solute {key}: {percent(results['fraction_absorbed'][key])} % absorbed; "
        f"{concentration(gas_in['mole_fractions'][key])} in the gas in, "
        f"{concentration(gas_out['mole_fractions'][key])} in the gas out."
    )


def comparison_table(results):
    """(heading, headers, rows, verdict line) of the isothermal comparison and Kremser's rating;
    None without a comparison."""
    comparison = results["isothermal_comparison"]
    if comparison is None:
        return None
    headers = ["", "rigorous (MESH)", "isothermal inert basis", "Kremser"]
    return comparison_heading(comparison), headers, comparison_rows(comparison), verdict_line(comparison)


def flatten(mapping, prefix=""):
    """Nested dict -> list of (dotted key, value text) for echoing inputs."""
    items = []
    for key, value in mapping.items():
        path = f"{prefix}.{key}" if prefix else str(key)
        if isinstance(value, dict):
            items.extend(flatten(value, path))
        elif isinstance(value, list) and value and isinstance(value[0], dict):
            for index, entry in enumerate(value):
                items.extend(flatten(entry, f"{path}[{index}]"))
        elif isinstance(value, list):
            items.append((path, ", ".join(_value_text(v) for v in value) or "none"))
        else:
            items.append((path, _value_text(value)))
    return items


def _value_text(value):
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return f"{value:.6g}"
    return "-" if value is None else str(value)
