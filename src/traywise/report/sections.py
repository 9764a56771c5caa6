"""Tables shared by the console summary and report.md, built from the results record.

Each function takes the dict of ``results.results_record`` and returns (headers, rows) of
text, in display units (see ``tables``), so that both outputs show the same numbers.
"""

from .comparison_view import comparison_heading, comparison_rows, verdict_line
from .tables import celsius, concentration, kilopascal, kilowatt, kmol_per_hour, number, percent


def stream_table(results):
    """Streams in and out: conditions and mole fractions."""
    streams = [results[key] for key in ("gas_in", "solvent_in", "gas_out", "liquid_out")]
    rows = [
        ("temperature [degC]", *(celsius(s["temperature_K"]) for s in streams)),
        ("pressure [kPa]", *(kilopascal(s["pressure_Pa"]) for s in streams)),
        ("flow [kmol/h]", *(kmol_per_hour(s["flow_mol_per_s"]) for s in streams)),
    ]
    for name in streams[0]["mole_fractions"]:
        rows.append((f"{name} [mol frac]", *(number(s["mole_fractions"][name]) for s in streams)))
    return ["stream", "gas in", "solvent in", "gas out (top)", "liquid out (bottom)"], rows


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
                kmol_per_hour(lost) if lost > 0.0 else "-",
                number(results["convergence"]["component_closure"][name], 2),
            )
        )
    return ["component", "model", "absorbed [%]", "lost to gas [kmol/h]", "balance closure [-]"], rows


def heat_table(results):
    """Where the heat released by absorption went [kW]."""
    heat = results["heat"]
    labels = (
        ("released_W", "released by absorption"),
        ("liquid_heating_W", "heating the liquid"),
        ("gas_heating_W", "heating the gas"),
        ("evaporation_W", "evaporating solvent"),
        ("removed_by_coolers_W", "removed by coolers"),
        ("other_W", "carried by extra feeds and draws"),
    )
    rounding = 1e-9 * max(abs(heat[key]) for key, _ in labels)  # closure noise, shown as 0
    return ["heat", "[kW]"], [(label, kilowatt(heat[key] if abs(heat[key]) > rounding else 0.0)) for key, label in labels]


def stage_profile_table(results):
    """Per stage: temperature, pressure, flows, key-solute fractions, heat removed."""
    stages = results["stages"]
    names = [component["name"] for component in results["components"]]
    key = results["column"]["key_component"]
    i = names.index(key)
    headers = ["stage", "T [degC]", "P [kPa]", "V [kmol/h]", "L [kmol/h]", f"y {key}", f"x {key}", "Q removed [kW]"]
    rows = [
        (
            str(stage),
            celsius(stages["temperature_K"][j]),
            kilopascal(stages["pressure_Pa"][j]),
            kmol_per_hour(stages["vapour_flow_mol_per_s"][j]),
            kmol_per_hour(stages["liquid_flow_mol_per_s"][j]),
            number(stages["vapour_mole_fractions"][j][i]),
            number(stages["liquid_mole_fractions"][j][i]),
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
    top = column["top_pressure_Pa"]
    drop = column["pressure_drop_Pa_per_stage"]
    solvent, gas = results["solvent_in"], results["gas_in"]
    coolers = sum(q for q in results["stages"]["heat_removed_W"] if q > 0.0)
    lines = [
        text + ".",
        f"Top pressure {kilopascal(top)} kPa, {drop / 1e3:.2f} kPa per stage. Solvent ({column['solvent']}) "
        f"{kmol_per_hour(solvent['flow_mol_per_s'])} kmol/h at {celsius(solvent['temperature_K'])} degC; gas "
        f"{kmol_per_hour(gas['flow_mol_per_s'])} kmol/h at {celsius(gas['temperature_K'])} degC.",
    ]
    if coolers > 0.0:
        lines.append(f"Coolers remove {kilowatt(coolers)} kW.")
    return lines


def temperature_line(results):
    """Hottest stage and the outlet temperatures in one sentence."""
    t = results["temperatures"]
    return (
        f"Hottest stage {t['hottest_stage']} at {celsius(t['max_temperature_K'])} degC; gas leaves at "
        f"{celsius(t['gas_out_temperature_K'])} degC, liquid at {celsius(t['liquid_out_temperature_K'])} degC."
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
