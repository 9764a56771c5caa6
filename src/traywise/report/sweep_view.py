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
from ..properties.constants import ZERO_CELSIUS
from .cautions import SAFETY_CAUTIONS, safety_one_line
from .folder import MARKER, write_results_folder
from .results import plain
from .tables import SECONDS_PER_HOUR, markdown_table, percent, text_table

CSV_FILE, FIGURE_FILE, RECORD_FILE, REPORT_FILE = "sweep.csv", "sweep.png", "sweep.json", "sweep.md"
SI_SUFFIX = {"K": "_K", "W": "_W", "Pa": "_Pa", "mol/s": "_mol_per_s"}  # as in stages.csv and results.json
# SI unit -> (display unit, conversion from SI); reports show degC, kW, kPa and kmol/h (tables.py)
DISPLAY = {
    "K": ("degC", lambda v: v - ZERO_CELSIUS),
    "W": ("kW", lambda v: v / 1e3),
    "Pa": ("kPa", lambda v: v / 1e3),
    "mol/s": ("kmol/h", lambda v: v * SECONDS_PER_HOUR / 1e3),
}


def write_sweep(target, case, request, table, *, plots=True):
    """Write the sweep's results folder ``target``; return the record written to sweep.json.

    Parameters
    ----------
    target : path-like           Results folder (created, or replaced when it is an older one)
    case : the loaded case (path, title, notes, warnings)
    request : SweepRequest       What was swept (traywise.case.sweep)
    table : SweepTable           The points (traywise.design.sweep)
    plots : bool                 Draw sweep.png
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
            from .sweep_plot import write_sweep_plot

            write_sweep_plot(folder / FIGURE_FILE, case.title, request, table)
            files.append(FIGURE_FILE)
        record = sweep_record(case, request, table, files)
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


def sweep_record(case, request, table, files):
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
        "warnings": sweep_warnings(case, request, table),
        "files": sorted(files),
        "safety_cautions": list(SAFETY_CAUTIONS),
    }


def sweep_warnings(case, request, table):
    """The case's warnings, what was done to the range, and the points that failed."""
    warnings = [*case.warnings, *request.notes]
    if getattr(case, "design", None) is not None:
        warnings.append("the case's [design] table is not applied in a sweep: every point solves the column as written")
    if table.failed.size:
        first = table.failed[0]
        warnings.append(
            f"{table.failed.size} of {table.values.size} points did not converge (marked in {CSV_FILE}); the first, "
            f"{request.variable} = {_display_value(request.variable, request.unit, table.values[first])} "
            f"{display_unit(request.variable, request.unit)[0]}: {table.messages[first]}"
        )
    return warnings


def display_unit(name, unit):
    """(display unit, conversion from SI) of an input or output: degC, kW, kPa, kmol/h, and the
    fraction absorbed in %."""
    if name.startswith("fraction_absorbed"):
        return "%", lambda v: 100.0 * v
    return DISPLAY.get(unit, (unit, lambda v: v))


def display_table(record):
    """(headers, rows) of the points in display units, 'failed' where a point did not converge."""
    sweep = record["sweep"]
    units = [sweep["unit"], *sweep["output_units"]]
    names = [sweep["input"], *sweep["outputs"]]
    headers = [f"{name} [{display_unit(name, unit)[0]}]" for name, unit in zip(names, units)]
    rows = []
    for point in record["points"]:
        values = [point[column] for column in record["columns"] if column not in ("converged", "message")]
        cells = [_display_value(name, unit, value) for name, unit, value in zip(names, units, values)]
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
        f"Sweep of {sweep['input']} over {sweep['points']} points ({spacing} spacing); "
        f"{sweep['points'] - record['failed_points']} converged.",
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
        f"# {record['case']['title']}: sweep of {sweep['input']}",
        f"Case file `{record['case']['file']}`, swept by traywise {record['software']['version']}: {sweep['points']} "
        f"points, {'logarithmic' if sweep['log'] else 'linear'} spacing; the column is solved at each point as the case "
        f"writes it, with only {sweep['input']} changed. Machine-readable: `{CSV_FILE}` and `{RECORD_FILE}` (SI units).",
    ]
    if record["case"]["notes"]:
        blocks += ["## Notes", record["case"]["notes"]]
    blocks += ["## Safety cautions", "\n".join(f"- {c}" for c in record["safety_cautions"]),
               "## Points", markdown_table(*display_table(record))]
    if FIGURE_FILE in record["files"]:
        blocks += ["## Figure", f"![Outputs against {sweep['input']}]({FIGURE_FILE})"]
    blocks += ["## Warnings", "\n".join(f"- {w}" for w in record["warnings"]) or "None."]
    return "\n\n".join(blocks) + "\n"


def _display_value(name, unit, value):
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    if name.startswith("fraction_absorbed"):
        return percent(value, 5)
    return f"{display_unit(name, unit)[1](value):.5g}"
