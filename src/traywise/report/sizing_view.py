"""The sizing of a run in its outputs: results.json's ``sizing`` section, the equipment datasheet
of report.md, the console lines, hydraulics.csv and the percent-of-flood and pressure-drop plot.

Everything is read from the ``ColumnSizing`` (``sizing_json``) or from the record it made.
"""

import csv

import numpy as np

LENGTHS = ("tray_spacing", "hole_diameter", "weir_height", "top_space", "bottom_space", "hetp", "max_bed_height",
           "redistributor_space")  # internals given in m
HYDRAULICS_FILE = "hydraulics.csv"
HYDRAULICS_PLOT = "hydraulics.png"
SIZING_KEYS = {
    "sizing": "the column sized from the stage profile ([internals]); null without an [internals] table",
    "sizing.kind": "'trays' or 'packing'",
    "sizing.mode": "'design' (diameter for the fraction of flood) or 'rating' (diameter given)",
    "sizing.internals": "the internals as sized, SI (tray type and layout, or packing name and data)",
    "sizing.diameter_m": "column inside diameter [m]: the design diameter (not rounded up to a standard size) or the given one",
    "sizing.design_diameter_m": "diameter the worst stage needs at the design fraction of flood [m]",
    "sizing.design_stage": "1-based stage that needs the largest diameter",
    "sizing.fraction_of_flood_design": "the design approach to flood [-]",
    "sizing.worst_stage": "1-based stage with the highest fraction of flood at diameter_m",
    "sizing.worst_fraction_of_flood": "its fraction of flood [-]; null when a packed bed is beyond its flooding point "
                                      "(the flooding model has no solution there)",
    "sizing.floods": "true when a stage is above 100 % of flood at diameter_m (a rated column too narrow)",
    "sizing.flooded_stages": "1-based stages above 100 % of flood at diameter_m",
    "sizing.trays": "actual trays (trays), or null",
    "sizing.tray_spacing_m": "tray spacing (trays) [m], or null",
    "sizing.downcomer_area_fraction": "downcomer area over column area (trays) [-], or null",
    "sizing.weir_length_m": "outlet weir length (trays) [m], or null",
    "sizing.bed_height_m": "packed height, the sum of each stage's HETP (packing) [m], or null",
    "sizing.beds": "number of packed beds (packing), or null",
    "sizing.column_height_m": "tangent-to-tangent height with the allowances in sizing.internals [m]",
    "sizing.pressure_drop_Pa": "pressure drop over all trays or the whole bed [Pa]; null when the column floods",
    "sizing.stages": "per-stage hydraulics, stage 1 at the top (also in hydraulics.csv)",
    "sizing.stages.fraction_of_flood": "(N,) [-]; null on a packed stage beyond its flooding point",
    "sizing.stages.pressure_drop_Pa": "per tray, or over the stage's bed section (N,) [Pa]",
    "sizing.stages.gas_density_kg_per_m3": "(N,) [kg/m3]",
    "sizing.stages.liquid_density_kg_per_m3": "(N,) [kg/m3]",
    "sizing.stages.liquid_viscosity_Pa_s": "(N,) [Pa s]",
    "sizing.stages.gas_viscosity_Pa_s": "(N,) [Pa s]",
    "sizing.stages.surface_tension_N_per_m": "(N,) [N/m]",
    "sizing.stages.flow_parameter": "F_LV = (L/G)(rho_G/rho_L)^0.5 (N,) [-]",
    "sizing.stages.hetp_m": "HETP of each stage (packing) (N,) [m], or null",
    "sizing.stages.fractional_entrainment": "psi = e/(L + e) of each tray, Fair's entrainment chart (trays) (N,) [-], or null",
    "sizing.worst_fractional_entrainment": "the highest fractional entrainment of any tray (trays) [-], or null",
    "sizing.methods": "the correlations and mixing rules used, in words with their sources",
    "sizing.warnings": "the checks that failed (weeping, downcomer backup, wetting, flood ...) and property extrapolations",
}


def sizing_json(sizing):
    """The ``sizing`` section of results.json for a ColumnSizing (JSON-ready, SI)."""
    h, p = sizing.hydraulics, sizing.properties
    trays = sizing.kind == "trays"
    internals = {(f"{key}_m" if key in LENGTHS else key): value for key, value in sizing.internals.__dict__.items()}
    if not trays:
        data = sizing.internals.data
        internals.update(type=data.type, material=data.material, nominal_size_m=data.nominal_size,
                         specific_area_m2_per_m3=data.specific_area, voidage=data.voidage,
                         stichlmair_constants=list(data.stichlmair), robbins_fpd_per_ft=data.robbins_fpd,
                         source=data.source, note=data.note)
    stages = {
        "fraction_of_flood": _list(h.fraction_of_flood),
        "pressure_drop_Pa": _list(h.stage_pressure_drop),
        "gas_density_kg_per_m3": _list(p.gas_density),
        "liquid_density_kg_per_m3": _list(p.liquid_density),
        "liquid_viscosity_Pa_s": _list(p.liquid_viscosity),
        "gas_viscosity_Pa_s": _list(p.gas_viscosity),
        "surface_tension_N_per_m": _list(p.surface_tension),
        "flow_parameter": _list(p.flow_parameter),
        "hetp_m": None if trays else _list(h.hetp),
        "fractional_entrainment": _list(h.entrainment) if trays else None,
    }
    return {
        "kind": sizing.kind,
        "mode": "rating" if sizing.rated else "design",
        "internals": internals,
        "diameter_m": sizing.diameter,
        "design_diameter_m": sizing.design_diameter,
        "design_stage": sizing.design_stage,
        "fraction_of_flood_design": sizing.internals.fraction_of_flood,
        "worst_stage": sizing.worst_stage,
        "worst_fraction_of_flood": _finite(sizing.worst_fraction_of_flood),
        "floods": sizing.floods,
        "flooded_stages": list(sizing.flooded_stages),
        "trays": sizing.trays,
        "tray_spacing_m": sizing.internals.tray_spacing if trays else None,
        "downcomer_area_fraction": h.downcomer_area_fraction if trays else None,
        "weir_length_m": h.weir_length if trays else None,
        "worst_fractional_entrainment": float(np.max(h.entrainment)) if trays else None,
        "bed_height_m": sizing.bed_height,
        "beds": sizing.beds,
        "column_height_m": sizing.column_height,
        "pressure_drop_Pa": _finite(sizing.total_pressure_drop),
        "stages": stages,
        "methods": list(_methods(sizing)),
        "warnings": list(sizing.warnings),
    }


def _methods(sizing):
    yield from sizing.notes
    if sizing.kind == "trays":
        yield ("flooding: Fair, Petro/Chem Eng. 33(10) (1961) 45, his chart as digitized and fitted by libpf.com (2012) "
               "from Perry's Chemical Engineers' Handbook, 7th ed., Fig. 14-26, with surface-tension, foaming and "
               "hole-area factors")
        yield ("tray pressure drop: dry tray (orifice equation) + aerated clear liquid over the weir (Francis weir) "
               "+ residual head 6 sigma/(g rho_L d_h)")
        yield "downcomer backup, residence time and weeping (hole Froude number, Lockett 1986) checked"
        yield ("fractional entrainment: Fair's entrainment chart (1961), approximate readings recalled from memory "
               "(indicative); limit 0.1 (common practice)")
    else:
        yield ("flooding and pressure drop: Stichlmair, Bravo & Fair, Gas Sep. Purif. 3 (1989) 19, or pressure drop by "
               "Robbins, Chem. Eng. Prog. 87(5) (1991) 87, both through fluids.packed_tower (ChEDL)")
        yield ("HETP: given" if sizing.internals.hetp is not None else
               "HETP = H_OG ln(lambda)/(lambda - 1) from Onda, Takeuchi & Okumoto, J. Chem. Eng. Jpn. 1 (1968) 56")
        yield "minimum wetting rate 0.08 m3/(m h) (Morris & Jackson 1953)"
    yield from (f"property mixing: {rule}" for rule in sizing.mixing_rules)


def _list(values):
    return [_finite(v) for v in np.asarray(values, dtype=float)]


def _finite(value):
    """A float for JSON, None where it is not defined (NaN, or inf beyond a flooding point)."""
    return float(value) if np.isfinite(value) else None


def flood_text(s):
    """'THE COLUMN FLOODS at this diameter: stages ...' for a sizing record that floods, else None."""
    if not s.get("floods"):
        return None
    stages = s["flooded_stages"]
    which = f"stage {stages[0]} is" if len(stages) == 1 else f"stages {_stage_ranges(stages)} are"
    return f"THE COLUMN FLOODS at this diameter: {which} above 100 % of flood"


def _stage_ranges(stages):
    """'1-4, 7' from [1, 2, 3, 4, 7]."""
    runs = []
    for stage in stages:
        if runs and stage == runs[-1][1] + 1:
            runs[-1][1] = stage
        else:
            runs.append([stage, stage])
    return ", ".join(str(first) if first == last else f"{first}-{last}" for first, last in runs)


def _percent_of_flood(s):
    if s["worst_fraction_of_flood"] is None:
        return f"beyond the flooding point on stage {s['worst_stage']}"
    return f"{100 * s['worst_fraction_of_flood']:.1f} % of flood on stage {s['worst_stage']}"


def _pressure_drop(s):
    return "not defined (the column floods)" if s["pressure_drop_Pa"] is None else f"{s['pressure_drop_Pa'] / 1e3:.3g} kPa"


def sizing_lines(record):
    """The sizing in a few lines (console summary and report summary); [] without one."""
    s = record.get("sizing")
    if s is None:
        return []
    if s["kind"] == "trays":
        internals = s["internals"]
        what = (f"{s['trays']} {internals['tray_type']} trays at {internals['tray_spacing_m'] * 1e3:.0f} mm spacing, "
                f"downcomers {100 * s['downcomer_area_fraction']:.0f} % of the area, weir {s['weir_length_m']:.2f} m")
    else:
        what = f"{s['internals']['packing']}, bed {s['bed_height_m']:.2f} m in {s['beds']} bed(s)"
    mode = "given (rating)" if s["mode"] == "rating" else f"for {100 * s['fraction_of_flood_design']:.0f} % of flood"
    lines = [
        f"Column diameter {s['diameter_m']:.3f} m {mode}; {what}",
        f"Column height {s['column_height_m']:.2f} m (tangent to tangent, allowances included); pressure drop "
        f"{_pressure_drop(s)}",
        f"Stage {s['design_stage']} sets the design diameter ({s['design_diameter_m']:.3f} m); highest load: "
        f"{_percent_of_flood(s)}",
    ]
    flooding = flood_text(s)
    return lines if flooding is None else [flooding] + lines


def sizing_markdown(record):
    """The equipment datasheet section of report.md (blocks), none without a sizing."""
    s = record.get("sizing")
    if s is None:
        return []
    from .tables import markdown_table

    rows = [("type", "trays" if s["kind"] == "trays" else f"{s['internals']['type']} packing"),
            ("mode", s["mode"]), ("inside diameter", f"{s['diameter_m']:.3f} m"),
            ("design diameter (worst stage)", f"{s['design_diameter_m']:.3f} m, stage {s['design_stage']}"),
            ("highest fraction of flood", _percent_of_flood(s)),
            ("column height, tangent to tangent", f"{s['column_height_m']:.2f} m"),
            ("pressure drop", _pressure_drop(s)),
            _stage_model_drop(record)]
    rows += [("packing type" if key == "type" else key.replace("_", " "), _shown(value))
             for key, value in s["internals"].items() if value is not None]
    if s["kind"] == "trays":
        rows += [("trays", s["trays"]), ("downcomer area / column area", f"{s['downcomer_area_fraction']:.3f}"),
                 ("weir length", f"{s['weir_length_m']:.3f} m"),
                 ("highest fractional entrainment", f"{s['worst_fractional_entrainment']:.3g} (Fair's chart; limit 0.1)")]
    else:
        rows += [("packed height", f"{s['bed_height_m']:.2f} m"), ("beds", s["beds"])]
    flooding = flood_text(s)
    blocks = ["## Equipment datasheet"] + ([f"**{flooding}.** The hydraulics below are not an operating point."]
                                           if flooding else []) + [markdown_table(["item", "value"], rows),
              "Diameter is the inside diameter the hydraulics need, not rounded up to a fabricable size. "
              "Per-stage hydraulics: `hydraulics.csv`.",
              "Methods:\n" + "\n".join(f"- {m}" for m in s["methods"])]
    if HYDRAULICS_PLOT in record["files"]:
        blocks.append(f"![Percent of flood and pressure drop per stage]({HYDRAULICS_PLOT})")
    blocks.append("Sizing checks: " + ("none failed." if not s["warnings"] else "\n" + "\n".join(f"- {w}" for w in s["warnings"])))
    return blocks


def _stage_model_drop(record):
    """The datasheet row of the pressure drop the stage model solved with: its drop per stage times
    the stages (the convention of ``sizing.pressure_loop``), and whether the sizing set it."""
    column = record["column"]
    per_stage, stages = column["pressure_drop_Pa_per_stage"], column["theoretical_stages"]
    looped = (record["inputs"].get("internals") or {}).get("pressure_drop_from_sizing")
    origin = "from the sized pressure drop" if looped else "as given; the stage pressures are not changed by the sizing"
    return ("pressure drop the stage model solved with",
            f"{per_stage * stages / 1e3:.3g} kPa ({per_stage / 1e3:.3g} kPa on each of {stages} stages, {origin})")


def _shown(value):
    if isinstance(value, float):
        return f"{value:.4g}"
    if isinstance(value, (list, tuple)):
        return ", ".join(_shown(v) for v in value)
    return str(value)


def write_sizing_files(folder, sizing):
    """Write hydraulics.csv into ``folder``; its name (none without sizing)."""
    if sizing is None:
        return []
    write_hydraulics_csv(folder / HYDRAULICS_FILE, sizing)
    return [HYDRAULICS_FILE]


def sizing_drawings(sizing):
    """hydraulics.png as (file name, draw, weight) for ``plots.write_plots``; none without sizing."""
    if sizing is None:
        return []
    return [(HYDRAULICS_PLOT, lambda figure: draw_hydraulics(figure, sizing), 1.3)]


def write_hydraulics_csv(path, sizing):
    """hydraulics.csv: one row per stage, SI units in the headers."""
    h, p = sizing.hydraulics, sizing.properties
    columns = {
        "stage": np.arange(1, p.temperature.size + 1),
        "fraction_of_flood": h.fraction_of_flood,
        "pressure_drop_Pa": h.stage_pressure_drop,
        "gas_mass_flow_kg_per_s": p.gas_mass_flow,
        "liquid_mass_flow_kg_per_s": p.liquid_mass_flow,
        "gas_density_kg_per_m3": p.gas_density,
        "liquid_density_kg_per_m3": p.liquid_density,
        "gas_viscosity_Pa_s": p.gas_viscosity,
        "liquid_viscosity_Pa_s": p.liquid_viscosity,
        "surface_tension_N_per_m": p.surface_tension,
        "flow_parameter": p.flow_parameter,
    }
    if sizing.kind == "trays":
        columns.update(flooding_velocity_m_per_s=h.flooding_velocity, net_area_velocity_m_per_s=h.net_velocity,
                       weir_loading_m3_per_s_m=h.weir_loading, downcomer_backup_m=h.downcomer_backup,
                       downcomer_residence_s=h.downcomer_residence, hole_froude_number=h.weep_froude,
                       fractional_entrainment=h.entrainment)
    else:
        columns.update(flooding_velocity_m_per_s=h.flooding_velocity, gas_velocity_m_per_s=h.gas_velocity,
                       pressure_drop_Pa_per_m=h.pressure_drop_per_height, hetp_m=h.hetp, wetting_rate_m3_per_s_m=h.wetting_rate)
    with open(path, "w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle)
        writer.writerow(columns)
        for row in zip(*columns.values()):
            writer.writerow([int(v) if i == 0 else f"{float(v):.6g}" if np.isfinite(v) else "" for i, v in enumerate(row)])


def draw_hydraulics(figure, sizing):
    """hydraulics.png: percent of flood and pressure drop against stage (stage 1 at the top)."""
    from .plots import _stage_axis

    h = sizing.hydraulics
    stages = np.arange(1, h.fraction_of_flood.size + 1)
    flood, drop = figure.subplots(1, 2, sharey=True)
    flood.plot(100 * np.where(np.isfinite(h.fraction_of_flood), h.fraction_of_flood, np.nan), stages, marker="o")
    flood.axvline(100 * sizing.internals.fraction_of_flood, linestyle="--", color="grey", label="design")
    flood.set_xlabel("percent of flood [%]")
    flood.legend(loc="best")
    drop.plot(h.stage_pressure_drop / 1e3, stages, marker="s", color="tab:red")
    drop.set_xlabel("pressure drop per tray [kPa]" if sizing.kind == "trays" else "pressure drop per stage's bed [kPa]")
    _stage_axis(flood, stages.size)
    drop.grid(True, alpha=0.3)
    floods = f" - THE COLUMN FLOODS (stages {_stage_ranges(list(sizing.flooded_stages))})" if sizing.floods else ""
    figure.suptitle(f"Hydraulics: D = {sizing.diameter:.3f} m{floods}")
