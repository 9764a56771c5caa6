"""Everything a run writes: the results folder of one solved case.

results.json (``results_keys.RESULTS_KEYS``), stages.csv (``stages``), report.md (``markdown``), report.html
(``html``, the same report self-contained) and,
unless switched off, the PNG figures (``plots``), written together by ``folder``.
"""

import json

from .folder import MARKER, write_results_folder
from .html import html_report
from .markdown import markdown_report
from .results import results_record
from .sizing_view import sizing_drawings, write_sizing_files
from .stages import component_labels, write_stages_csv

RESULTS_FILE = "results.json"
STAGES_FILE = "stages.csv"
REPORT_FILE = "report.md"
HTML_FILE = "report.html"


def write_outputs(target, run, *, plots=True):
    """Write the results folder ``target`` of a run; return the results record it holds.

    Parameters
    ----------
    target : path-like       Results folder (created, or replaced when it is an older one)
    run : traywise.run.CaseRun   The run, read only
    plots : bool             Draw the PNG figures
    """
    written = {}
    case, solution = run.case, run.solution

    def write_files(folder):
        write_stages_csv(folder / STAGES_FILE, solution, component_labels(case.model.components),
                         run.speciation)
        figures = []
        if plots:
            from .plots import write_plots

            figures = write_plots(folder, solution, run.comparison, run.xy_design, run.speciation,
                                  getattr(case, "display_units", None), more=sizing_drawings(run.sizing))
        figures += write_sizing_files(folder, run.sizing)
        record = results_record(run, [RESULTS_FILE, STAGES_FILE, REPORT_FILE, HTML_FILE, MARKER, *figures])
        (folder / REPORT_FILE).write_text(markdown_report(record), encoding="utf-8")
        (folder / HTML_FILE).write_text(html_report(record, folder), encoding="utf-8")
        (folder / RESULTS_FILE).write_text(results_json(record), encoding="utf-8")
        written["record"] = record

    write_results_folder(target, write_files, protect=() if case.path is None else (case.path,))
    return written["record"]


def results_json(record):
    """The record as strict JSON text (no NaN or infinity: they are null already)."""
    return json.dumps(record, indent=2, allow_nan=False) + "\n"
