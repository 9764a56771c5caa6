"""Everything a run writes: the results folder of one solved case.

results.json (``results.RESULTS_KEYS``), stages.csv (``stages``), report.md (``markdown``) and,
unless switched off, the PNG figures (``plots``), written together by ``folder``.
"""

import json

from .comparison_view import comparison_json, xy_design
from .design_view import design_json
from .folder import MARKER, write_results_folder
from .markdown import markdown_report
from .results import results_record
from .sizing_view import sizing_json, write_sizing_files
from .stages import component_labels, write_stages_csv

RESULTS_FILE = "results.json"
STAGES_FILE = "stages.csv"
REPORT_FILE = "report.md"


def write_outputs(target, case, solution, comparison, *, plots=True, design=None, sizing=None):
    """Write the results folder ``target``; return the results record it holds.

    Parameters
    ----------
    target : path-like       Results folder (created, or replaced when it is an older one)
    case : the loaded case
    solution : ColumnSolution
    comparison : traywise.inert_basis.comparison.Comparison
    plots : bool             Draw the PNG figures
    design : DesignOutcome, optional   The design whose column ``solution`` solves
    sizing : ColumnSizing, optional    The column sized from ``solution`` (hydraulics.csv and plot)
    """
    written = {}

    def write_files(folder):
        write_stages_csv(folder / STAGES_FILE, solution, component_labels(case.model.components))
        figures = []
        if plots:
            from .plots import write_plots

            figures = write_plots(folder, solution, comparison, xy_design(case, solution, comparison))
        figures += write_sizing_files(folder, sizing, plots=plots)
        record = results_record(
            case, solution, comparison_json(comparison), [RESULTS_FILE, STAGES_FILE, REPORT_FILE, MARKER, *figures],
            design=None if design is None else design_json(design),
            design_warnings=() if design is None else design.warnings,
            sizing=None if sizing is None else sizing_json(sizing),
        )
        (folder / REPORT_FILE).write_text(markdown_report(record), encoding="utf-8")
        (folder / RESULTS_FILE).write_text(results_json(record), encoding="utf-8")
        written["record"] = record

    write_results_folder(target, write_files, protect=() if case.path is None else (case.path,))
    return written["record"]


def results_json(record):
    """The record as strict JSON text (no NaN or infinity: they are null already)."""
    return json.dumps(record, indent=2, allow_nan=False) + "\n"
