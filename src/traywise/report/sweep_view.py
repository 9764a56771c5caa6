"""A sweep's results folder and console table.

Files: sweep.csv (one row per point in the order swept, SI units in the column names as in
stages.csv, failed points kept with converged = false, empty outputs and the reason),
sweep.png (each output against the varied input, failed points marked; ``sweep_plot``),
sweep.json (the record: case, sweep, points, warnings, cautions) and sweep.md (for a reviewer).
Written all at once by ``folder``; the console table shows display units (``tables``).
"""

import csv
import json
import math

from .. import __version__
from ..properties.constants import TRACE_PPMV
from .cautions import SAFETY_CAUTIONS, safety_one_line
from .folder import MARKER, write_results_folder
from .results import DEFAULT_UNITS, plain
from .sweep_labels import converter, is_whole, label, words
from .tables import TRACE_FLOOR, TRACE_TEXT, markdown_table, percent, text_table
from .warning_units import in_display_units

CSV_FILE, FIGURE_FILE, RECORD_FILE, REPORT_FILE = "sweep.csv", "sweep.png", "sweep.json", "sweep.md"
SI_SUFFIX = {"K": "_K", "W": "_W", "Pa": "_Pa", "mol/s": "_mol_per_s"}  # as in stages.csv and results.json


def write_sweep(target, case, request, table, *, plots=True, designed=None):
    """Write the sweep's results folder ``target``; return the record written to sweep.json.

    Parameters
    ----------
    target : path-like           Results folder (created, or replaced when it is an older one)
    case : the loaded case (path, title, notes, warnings)
    request : SweepRequest       What was swept (traywise.case.sweep)
    table : SweepTable           The points (traywise.design.sweep)
    plots : bool                 Draw sweep.png
    designed : dict or None      The input a design solved for ("input", "value" [SI], "stage"),
                                 when the sweep runs around the designed column
    """
    written = {}

    def write_files(folder):
        files = [CSV_FILE, RECORD_FILE, REPORT_FILE, MARKER]
        headers, rows = csv_table(request, table)
        with open(folder / CSV_FILE, "w", newline="", encoding="utf-8") as stream:
            writer = csv.writer(stream)
            writer.writerow(headers)
            writer.writerows(["" if value is None else repr(value) if isinstance(value, float) else value
                              for value in row] for row in rows)
        if plots:
            files.append(FIGURE_FILE)
        record = sweep_record(case, request, table, files, designed)
        if plots:
            from .sweep_plot import write_sweep_plot

            write_sweep_plot(folder / FIGURE_FILE, record, table)
        (folder / REPORT_FILE).write_text(sweep_markdown(record), encoding="utf-8")
        (folder / RECORD_FILE).write_text(json.dumps(record, indent=2, allow_nan=False) + "\n", encoding="utf-8")
        written["record"] = record

    write_results_folder(target, write_files, protect=() if case.path is None else (case.path,))
    return written["record"]


def csv_table(request, table):
    """(headers, rows) of sweep.csv: the input, converged, the outputs (None where failed), message."""
    headers = [request.variable + SI_SUFFIX.get(request.unit, ""), "converged"]
    headers += [name + SI_SUFFIX.get(unit, "") for name, unit in zip(table.outputs, table.units)]
    headers.append("message")
    rows = []
    for value, ok, data, message in zip(table.values, table.converged, table.data, table.messages):
        shown = int(value) if request.variable == "stages" else float(value)
        rows.append([shown, "true" if ok else "false", *(float(x) if ok else None for x in data), message])
    return headers, rows


def sweep_record(case, request, table, files, designed=None):
    """The JSON-ready record of a sweep (sweep.json)."""
    headers, rows = csv_table(request, table)
    points = [dict(zip(headers, row)) for row in rows]
    for point in points:
        point["converged"] = point["converged"] == "true"
    return {
        "software": {"name": "traywise", "version": __version__},
        "case": {"file": str(case.path), "title": case.title, "notes": case.notes},
        "sweep": plain({**request.echo(), "output_units": list(table.units)}),
        "columns": headers,
        "points": plain(points),
        "failed_points": int(table.failed.size),
        "display_units": getattr(case, "display_units", None),
        "solvent_molar_mass_kg_per_mol": _solvent_molar_mass(case),
        "design": _design(case, designed),
        "warnings": list(dict.fromkeys(in_display_units(w, getattr(case, "display_units", None) or DEFAULT_UNITS)
                                       for w in sweep_warnings(case, request, table, designed))),
        "files": sorted(files),
        "safety_cautions": list(SAFETY_CAUTIONS),
    }


def _solvent_molar_mass(case):
    """Mean molar mass of the solvent feed [kg/mol]: its molar flow shown as a mass flow."""
    solvent = case.column.solvent
    return float(solvent.component_flows @ case.model.molar_mass / solvent.flow)


def _design(case, designed):
    """The design the sweep runs around: its target and limit (drawn on the outputs) and the
    designed value of the input it solved for; None without a design carried out."""
    if designed is None or getattr(case, "design", None) is None:
        return None
    return plain({**case.design.echo(), "key_component": case.key_component, "designed_input": designed["input"],
                  "designed_value": designed["value"], "designed_cooler_stage": designed["stage"]})


POINT_WARNINGS_LISTED = 10  # converged points whose warnings are listed; the rest are counted


def sweep_warnings(case, request, table, designed=None):
    """The case's warnings, what was done to the range, the points that failed, and the warnings
    of converged points (a correlation or the electrolyte liquid out of its range, caustic used up)."""
    view = {"display_units": getattr(case, "display_units", None),
            "solvent_molar_mass_kg_per_mol": _solvent_molar_mass(case)}
    warnings = [*case.warnings, *request.notes]
    if designed is not None:
        lo, hi = min(table.values), max(table.values)
        if designed["input"] == request.variable and not lo <= designed["value"] <= hi:
            warnings.append(f"the designed {words(request.variable)} lies outside the range swept")
    if table.failed.size:
        first = table.failed[0]
        warnings.append(
            f"{table.failed.size} of {table.values.size} points did not converge (marked in {CSV_FILE}); the first, "
            f"{words(request.variable)} = {_display_value(view, request.variable, request.unit, table.values[first])} "
            f"{converter(view, request.variable, request.unit)[0]}: {table.messages[first]}"
        )
    warned = [i for i in range(table.values.size) if table.converged[i] and table.messages[i]]
    for i in warned[:POINT_WARNINGS_LISTED]:
        warnings.append(f"at {words(request.variable)} = {_display_value(view, request.variable, request.unit, table.values[i])} "
                        f"{converter(view, request.variable, request.unit)[0]}: {table.messages[i]}")
    if len(warned) > POINT_WARNINGS_LISTED:
        warnings.append(f"and at {len(warned) - POINT_WARNINGS_LISTED} more converged points (their warnings are in the "
                        f"message column of {CSV_FILE})")
    return warnings


def display_table(record):
    """(headers, rows) of the points in words and the case's units, 'failed' where a point did
    not converge."""
    sweep = record["sweep"]
    units = [sweep["unit"], *sweep["output_units"]]
    names = [sweep["input"], *sweep["outputs"]]
    headers = [label(record, name, unit) for name, unit in zip(names, units)]
    rows = []
    for point in record["points"]:
        values = [point[column] for column in record["columns"] if column not in ("converged", "message")]
        cells = [_display_value(record, name, unit, value) for name, unit, value in zip(names, units, values)]
        if not point["converged"]:
            cells[1:] = ["failed"] * (len(cells) - 1)
        rows.append(cells)
    return headers, rows


def sweep_text(record, folder=None):
    """The console output of a sweep: the table, the warnings, where it was written, the caution."""
    sweep = record["sweep"]
    spacing = "logarithmic" if sweep["log"] else "linear"
    parts = [
        f"traywise {record['software']['version']}: {record['case']['title']} ({record['case']['file']})",
        f"Sweep of the {words(sweep['input'])} over {sweep['points']} points ({spacing} spacing); "
        f"{sweep['points'] - record['failed_points']} converged; {_base_text(record)}.",
        text_table(*display_table(record)),
        "Warnings:\n" + "\n".join(f"  - {w}" for w in record["warnings"]) if record["warnings"] else "Warnings: none.",
    ]
    if folder is not None:
        parts.append(f"Results written to {folder}")
    parts.append(safety_one_line(REPORT_FILE))
    return "\n\n".join(parts)


def sweep_markdown(record):
    """The text of sweep.md."""
    sweep = record["sweep"]
    blocks = [
        f"# {record['case']['title']}: sweep of the {words(sweep['input'])}",
        f"Case file `{record['case']['file']}`, swept by traywise {record['software']['version']}: {sweep['points']} "
        f"points, {'logarithmic' if sweep['log'] else 'linear'} spacing; {_base_text(record)}, with only the "
        f"{words(sweep['input'])} changed. Machine-readable: `{CSV_FILE}` and `{RECORD_FILE}` (SI units, code names "
        "of the inputs and outputs).",
    ]
    if record["case"]["notes"]:
        blocks += ["## Notes", record["case"]["notes"]]
    blocks += ["## Safety cautions", "\n".join(f"- {c}" for c in record["safety_cautions"]),
               "## Points", markdown_table(*display_table(record))]
    if FIGURE_FILE in record["files"]:
        blocks += ["## Figure", f"![Outputs against the {words(sweep['input'])}]({FIGURE_FILE})"]
    blocks += ["## Warnings", "\n".join(f"- {w}" for w in record["warnings"]) or "None."]
    return "\n\n".join(blocks) + "\n"


def _base_text(record):
    """How each point's column is set up: as written, or around the designed column."""
    design = record.get("design")
    if design is None:
        return "the column is solved at each point as the case writes it"
    name = design["designed_input"]
    unit, convert = converter(record, name, "-" if name == "stages" else {"solvent_flow": "mol/s",
                                                                          "cooler_duty": "W"}[name])
    value = convert(design["designed_value"])
    shown = f"{value:.0f}" if is_whole(name) else f"{value:.5g} {unit}"
    return (f"each point starts from the designed column (the case's [design] solved for the {words(name)}: {shown}; "
            "the other inputs as written)")


def _display_value(record, name, unit, value):
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    if name.startswith("fraction_absorbed"):
        return percent(value, 5)
    if is_whole(name):
        return f"{value:.0f}"
    shown = converter(record, name, unit)[1](value)
    if unit == "-" and 0.0 < abs(shown) < TRACE_FLOOR:
        return TRACE_TEXT
    if unit == "ppmv" and 0.0 < abs(shown) < TRACE_PPMV:
        return f"< {TRACE_PPMV:g}"
    return f"{shown:.5g}"
