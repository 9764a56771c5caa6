"""An uncertainty run's results folder and console text.

Folder (written all at once, ``folder.write_results_folder``): uncertainty.json (the record
below), samples.csv (one row per sample: factors, outputs, converged, reason), uncertainty.md
(the report, with the cautions) and, unless plots are off, uncertainty_histograms.png and
uncertainty_tornado.png (``uncertainty_plot.py``).
"""

import csv
import json
import math

from .. import __version__
from .cautions import SAFETY_CAUTIONS, safety_one_line
from ..uncertainty.electrolyte_inputs import ELECTROLYTE_NOT_SAMPLED
from ..uncertainty.inputs import COLUMN, MURPHREE, OVERALL
from ..uncertainty.statistics import RESOLVED_PPMV, below_resolution
from .folder import MARKER, write_results_folder

DISPLAY = {  # SI unit -> (display unit, scale, offset)
    "K": ("degC", 1.0, -273.15),
    "kg/s": ("kg/h", 3600.0, 0.0),
    "W": ("kW", 1e-3, 0.0),
}


UNRESOLVED = f"below {RESOLVED_PPMV:g} ppmv, what the solver resolves"


def display(unit, value):
    """(display unit, value shown in it) for an SI output value."""
    shown, scale, offset = DISPLAY.get(unit, (unit, 1.0, 0.0))
    return shown, value * scale + offset


def uncertainty_record(case, result, files=()):
    """The JSON-ready record of an uncertainty run (SI values; units beside each output)."""
    return {
        "software": {"name": "traywise", "version": __version__},
        "case": {"title": case.title, "file": case.source},
        "statement": result.sentence,
        "samples": result.n_samples,
        "seed": result.seed,
        "engine": result.engine,
        "converged_samples": int(result.converged.sum()),
        "failed_samples": int((~result.converged).sum()),
        "failure_reasons": [{"reason": reason, "samples": count} for reason, count in result.failure_reasons()],
        "inputs": [{"name": e.name, "component": e.component, "quantity": e.quantity, "relative_uncertainty": e.relative,
                    "basis": e.basis, "default": e.default} for e in result.inputs],
        "correlations": [{"inputs": [result.inputs[i].name, result.inputs[j].name], "coefficient": rho}
                         for i, j, rho in result.correlations],
        "not_sampled": not_sampled(case, result.inputs),
        "outputs": [_summary_json(s) for s in result.summaries],
        "seconds": result.seconds,
        "files": list(files),
        "cautions": list(SAFETY_CAUTIONS),
    }


def not_sampled(case, inputs):
    """What the samples leave out, each in one line: the equilibrium tables a case brings, the
    electrolyte liquid's constants, the real gas's parameters, and a tray efficiency that is not
    sampled (``uncertainty.inputs``)."""
    model = case.model
    lines = [f"the equilibrium table of {model.names[i]} (the case's own data, with no uncertainty stated): the "
             "figures here leave its uncertainty out"
             for i, kind in enumerate(model.equilibrium) if kind == "table"]
    electrolytes = [name for name, kind in zip(model.names, model.equilibrium) if kind == "electrolyte"]
    if electrolytes:
        lines.append(f"{ELECTROLYTE_NOT_SAMPLED} of {' and '.join(electrolytes)}: the figures here leave "
                     "their uncertainty out (its Henry's and first dissociation constants are sampled)")
    if model.gas_phase is not None:
        lines.append("the Peng-Robinson parameters of the real gas (critical constants, acentric factors, binary "
                     "parameters, partial molar volumes)")
    sampled = {e.quantity for e in inputs if e.component == COLUMN}
    held = "held at the case's value (uncertainty.tray_efficiency is 0 %, or scope 'listed' without it)"
    murphree_given = bool((case.column.murphree < 1.0).any())
    if murphree_given and MURPHREE not in sampled:
        lines.append(f"the Murphree efficiency: {held}")
    if case.overall_efficiency is not None and OVERALL not in sampled:
        stage_design = case.design is not None and case.design.solve_for == "n_stages"
        lines.append("the overall efficiency: " + (held if stage_design else "it turns theoretical stages into trays "
                     "and changes nothing solved on a column of fixed stages (it is sampled for a design on the stage "
                     "count)"))
    if not murphree_given and case.overall_efficiency is None:
        lines.append("the tray efficiency: the stages are theoretical, with no efficiency given to sample")
    return lines


def _summary_json(s):
    return {"name": s.name, "unit": s.unit, "nominal": s.nominal, "mean": _finite(s.mean), "std": _finite(s.std),
            "p10": _finite(s.p10), "p50": _finite(s.p50), "p90": _finite(s.p90),
            "drivers": [{"input": name, "spearman": _finite(rho), "swing_per_standard_uncertainty": swing}
                        for name, rho, swing in s.drivers],
            "first_order_indices": [{"input": name, "index": _finite(index), "half_width_95": _finite(half)}
                                    for name, index, half in s.first_order],
            "first_order_note": s.first_order_note}


def _finite(value):
    return value if math.isfinite(value) else None


def write_uncertainty(target, case, result, *, plots=True):
    """Write the results folder ``target``; return the record."""
    files = ["uncertainty.json", "samples.csv", "uncertainty.md", MARKER]
    if plots:
        files += ["uncertainty_histograms.png", "uncertainty_tornado.png"]
    record = uncertainty_record(case, result, files)

    def write_files(folder):
        with open(folder / "samples.csv", "w", newline="", encoding="utf-8") as stream:
            writer = csv.writer(stream)
            writer.writerows(sample_rows(result))
        (folder / "uncertainty.md").write_text(uncertainty_markdown(record), encoding="utf-8")
        if plots:
            from .uncertainty_plot import write_histograms, write_tornado

            write_histograms(folder / "uncertainty_histograms.png", result)
            write_tornado(folder / "uncertainty_tornado.png", result)
        (folder / "uncertainty.json").write_text(json.dumps(record, indent=2, allow_nan=False) + "\n", encoding="utf-8")

    write_results_folder(target, write_files, protect=() if case.path is None else (case.path,))
    return record


def sample_rows(result):
    """Header and one row per sample: input factors, converged, outputs [SI units], reason."""
    header = ["sample", *(f"factor {e.name} [-]" for e in result.inputs), "converged",
              *(f"{name} [{unit}]" for name, unit in result.outputs), "reason"]
    rows = [header]
    for i in range(result.n_samples):
        outputs = ["" if math.isnan(v) else repr(float(v)) for v in result.sample_outputs[i]]
        rows.append([i + 1, *(repr(float(f)) for f in result.factors[i]), bool(result.converged[i]), *outputs,
                     result.messages[i]])
    return rows


def _table(record):
    lines = ["| output | unit | nominal | P10 | P50 | P90 | mean | largest drivers (Spearman rho) |",
             "| --- | --- | --- | --- | --- | --- | --- | --- |"]
    for s in record["outputs"]:
        unit, _ = display(s["unit"], 0.0)
        shown = [_shown(s["unit"], s[k]) for k in ("nominal", "p10", "p50", "p90", "mean")]
        drivers = ", ".join(f"{d['input']} ({d['spearman']:+.2f})" for d in s["drivers"][:3] if d["spearman"] is not None)
        lines.append(f"| {s['name']} | {unit} | " + " | ".join(shown) + f" | {drivers or _no_drivers(s)} |")
    return "\n".join(lines)


def _first_order_section(record):
    """The first-order indices of each output, largest three, or why they are missing."""
    lines = ["## Share of each output's variance an input explains alone\n\nFirst-order sensitivity indices "
             "(an estimate of Sobol's) by RBD-FAST from the same samples (S. Tarantola, D. Gatelli, T. A. Mara, "
             "Reliab. Eng. Syst. Saf. 91 (2006) 717; SALib), with the 95 % half-width of the estimate.\n"]
    for s in record["outputs"]:
        found = sorted((d for d in s["first_order_indices"] if d["index"] is not None), key=lambda d: -d["index"])
        shown = ", ".join(f"{d['input']} {d['index']:.2f} +/- {d['half_width_95'] or 0.0:.2f}" for d in found[:3])
        lines.append(f"- {s['name']}: {shown or s['first_order_note']}")
    return "\n".join(lines)


def _no_drivers(summary):
    """Why an output has no drivers: below what the solver resolves, or it does not vary."""
    return f"none ({UNRESOLVED})" if below_resolution(summary["unit"], summary["p90"]) else "none (does not vary)"


def _shown(unit, value):
    """An output value as text in its display unit; an outlet below what the solver resolves
    (``statistics.RESOLVED_PPMV``) as '< 1e-06' ppmv."""
    if value is None:
        return "n/a"
    if unit == "ppmv" and value < RESOLVED_PPMV:
        return f"< {RESOLVED_PPMV:g}"
    return f"{display(unit, value)[1]:.5g}"


def uncertainty_markdown(record):
    """The report: statement, outputs, inputs with their basis, failures, method, cautions."""
    failed = record["failed_samples"]
    parts = [
        f"# Uncertainty: {record['case']['title']}",
        f"Case file `{record['case']['file']}`, traywise {record['software']['version']}: {record['samples']} "
        f"Latin hypercube samples (seed {record['seed']}, engine {record['engine']}), each solved rigorously; "
        f"{record['converged_samples']} converged, {failed} failed.",
        f"**{record['statement']}**",
        "## Outputs\n\nP90 is the value the output stays at or below in 90 % of the converged samples.\n\n" + _table(record),
        _first_order_section(record),
        "## Uncertain inputs\n\nEach is sampled as a log-normal factor of median 1 and log-standard deviation u. "
        "'default' marks a stated default where the source gives no uncertainty.\n\n"
        "| input | u | default | basis |\n| --- | --- | --- | --- |\n"
        + "\n".join(f"| {e['name']} | {100 * e['relative_uncertainty']:.3g} % | {'yes' if e['default'] else 'no'} | "
                    f"{e['basis']} |" for e in record["inputs"]),
    ]
    if record["correlations"]:
        parts.append("Correlated inputs: " + "; ".join(f"{' and '.join(c['inputs'])}: {c['coefficient']:+.2f}"
                                                       for c in record["correlations"]))
    if record["not_sampled"]:
        parts.append("Not sampled: " + "; ".join(record["not_sampled"]) + ".")
    if failed:
        parts.append("## Failed samples\n\nKept in samples.csv with their reason:\n\n"
                     + "\n".join(f"- {f['samples']} x {f['reason']}" for f in record["failure_reasons"]))
    parts.append("## Method\n\nProperty uncertainties carried through the rigorous stage model by sampling, after "
                 "W. B. Whiting, V. R. Vasquez, M. M. Meerschaert, Fluid Phase Equilib. 158-160 (1999) 627. Drivers: "
                 "Spearman's rank correlation between an input's sampled value and the output. The figures cover the "
                 "property data and, where the case gives one, the tray efficiency (see the inputs); not the model's own "
                 "assumptions or the feed.")
    parts.append("## Safety\n\n" + "\n".join(f"- {c}" for c in record["cautions"]))
    return "\n\n".join(parts) + "\n"


def uncertainty_text(record, folder=None):
    """Console summary."""
    lines = [f"traywise {record['software']['version']}: {record['case']['title']} ({record['case']['file']})",
             f"{record['samples']} samples (seed {record['seed']}): {record['converged_samples']} converged, "
             f"{record['failed_samples']} failed", "", record["statement"], ""]
    for s in record["outputs"]:
        unit, _ = display(s["unit"], 0.0)
        lines.append(f"  {s['name']} [{unit}]: P10 {_shown(s['unit'], s['p10'])}, P50 {_shown(s['unit'], s['p50'])}, "
                     f"P90 {_shown(s['unit'], s['p90'])} (nominal {_shown(s['unit'], s['nominal'])})")
        top = [d for d in s["drivers"] if d["spearman"] is not None][:2]
        if top:
            lines.append("    driven by " + ", ".join(f"{d['input']} ({d['spearman']:+.2f})" for d in top))
    for f in record["failure_reasons"]:
        lines.append(f"  failed: {f['samples']} x {f['reason']}")
    for line in record["not_sampled"]:
        lines.append(f"  not sampled: {line}")
    if folder is not None:
        lines += ["", f"Results in {folder}", safety_one_line(folder / "uncertainty.md")]
    return "\n".join(lines)
