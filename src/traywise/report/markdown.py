"""report.md: the run written for a reviewer, from the results record.

Sections, in the order a reviewer reads them: summary (with the isothermal verdict), warnings,
safety cautions, assumptions in force for this run (``assumptions``), the equipment result (the
design and the sizing, when the case has them), streams, stage profile, heat budget (per
component, and the solvent balance), the isothermal inert-basis comparison, convergence, inputs
as written in the case (``inputs_view``), property sources. ``report_blocks`` gives the same
content as (heading, kind, body) blocks, which ``html`` renders as report.html.
"""

from .assumptions import assumption_lines
from .cautions import SAFETY_CAUTIONS
from .comparison_view import verdict_line
from .design_view import design_lines, trays_table
from .inputs_view import input_rows
from .sections import (
    column_lines,
    comparison_table,
    component_table,
    convergence_lines,
    heat_table,
    key_line,
    stage_profile_table,
    stream_table,
    temperature_line,
    water_balance_lines,
)
from .electrolyte_view import SECTION, electrolyte_blocks
from .sizing_view import sizing_lines, sizing_markdown
from .tables import TRACE_TEXT, markdown_table

FIGURE_TITLES = {
    "temperature_profile.png": "Temperature profile",
    "composition_profiles.png": "Composition profiles",
    "xy_diagram.png": "x-y diagram (isothermal inert-basis design, with the passing streams of the rigorous solution)",
    "heat_balance.png": "Where the heat of absorption went",
    "ph_profile.png": "pH profile of the liquid",
}
FIGURES_BY_SECTION = {
    "Stage profile": ("temperature_profile.png", "composition_profiles.png"),
    "Heat budget": ("heat_balance.png",),
    "Isothermal inert-basis comparison": ("xy_diagram.png",),
    SECTION: ("ph_profile.png",),
}
TRACE_NOTE = (f"Fractions below 1e-12 are printed as \"{TRACE_TEXT}\" (\"< 1e-10\" as a percentage): the solver "
              "converges component flows to about 1e-9 of each feed, so smaller values carry no information.")


def unique(lines):
    """``lines`` without repeats, in their first order."""
    return list(dict.fromkeys(lines))


def report_blocks(results):
    """The report as a list of (heading or None, kind, body): kind 'text' (a paragraph), 'bullets'
    (list of str), 'table' ((headers, rows)), 'figure' ((file, title)), 'markdown' (ready text)."""
    blocks = [("Summary", "bullets", [*column_lines(results), *sizing_lines(results), key_line(results),
                                      temperature_line(results),
                                      verdict_line(results["isothermal_comparison"]) + "."])]
    blocks.append(("Warnings", "bullets", unique(results["warnings"])) if results["warnings"]
                  else ("Warnings", "text", "None."))
    blocks.append(("Safety cautions", "bullets", list(SAFETY_CAUTIONS)))
    blocks.append(("Assumptions in force for this run", "bullets", assumption_lines(results)))
    blocks.append((None, "table", (["component", "formula", "CAS", "equilibrium model", "molar mass [g/mol]"], [
        (c["name"], c["formula"], c["cas"], c["equilibrium_model"], f"{c['molar_mass_kg_per_mol'] * 1e3:.4f}")
        for c in results["components"]])))
    blocks.extend(_equipment(results))
    blocks.append(("Streams", "table", stream_table(results)))
    blocks.append((None, "text", TRACE_NOTE))
    blocks.append((None, "table", component_table(results)))
    blocks.append(("Stage profile", "table", stage_profile_table(results)))
    blocks.extend(_figures(results, "Stage profile"))
    blocks.extend(electrolyte_blocks(results))
    blocks.extend(_figures(results, SECTION))
    blocks.append(("Heat budget", "table", heat_table(results)))
    blocks.append((None, "bullets", water_balance_lines(results)))
    blocks.extend(_figures(results, "Heat budget"))
    blocks.extend(_comparison(results))
    blocks.append(("Convergence and balance closure", "bullets", convergence_lines(results)))
    blocks.append(("Inputs (as written in the case)", "table", input_rows(results)))
    blocks.append(("Property sources", "sources", results["property_sources"]))
    return blocks


def markdown_report(results):
    """The text of report.md for a results record."""
    case = results["case"]
    parts = [
        f"# {case['title']}",
        f"Case file `{case['file']}`, solved by traywise {results['software']['version']}. "
        "Machine-readable results: `results.json` (all values in SI) and `stages.csv`; the same report as "
        "`report.html` (figures embedded, printable).",
    ]
    if case["notes"]:
        parts += ["## Notes", case["notes"]]
    for heading, kind, body in report_blocks(results):
        if heading is not None:
            parts.append(f"## {heading}")
        parts.append(_markdown(kind, body))
    return "\n\n".join(part for part in parts if part) + "\n"


def _markdown(kind, body):
    if kind == "text" or kind == "markdown":
        return body
    if kind == "bullets":
        return "\n".join(f"- {line}" for line in body)
    if kind == "table":
        return markdown_table(*body)
    if kind == "figure":
        name, title = body
        return f"![{title}]({name})"
    if kind == "sources":
        lines = []
        for name, sources in body.items():
            lines.append(f"- **{name}**")
            lines.extend(f"  - {label}: {citation}" for label, citation in sources.items())
        return "\n".join(lines)
    raise ValueError(kind)


def _equipment(results):
    """The equipment result: the design (target, adjusted input, trays) and the sizing."""
    blocks = []
    if results["design"] is not None:
        blocks.append(("Design", "bullets", design_lines(results)))
        table = trays_table(results)
        if table is not None:
            blocks.append((None, "text", "Actual trays by each efficiency route (theoretical stages for the target "
                           "divided by the overall efficiency, and the target solved again on trays with the Murphree "
                           "efficiency that Lewis's relation gives for it):"))
            blocks.append((None, "table", table))
    sizing = sizing_markdown(results)
    if sizing:
        blocks.append((None, "markdown", "\n\n".join(sizing)))
    return blocks


def _figures(results, section):
    return [(None, "figure", (name, FIGURE_TITLES[name])) for name in FIGURES_BY_SECTION[section]
            if name in results["files"]]


def _comparison(results):
    table = comparison_table(results)
    heading = "Isothermal inert-basis comparison"
    if table is None:
        return [(heading, "text", verdict_line(None) + ".")]
    title, headers, rows, verdict = table
    blocks = [(heading, "text", f"Rigorous stage-by-stage solution compared with the {title}."),
              (None, "table", (headers, rows)), (None, "text", f"**{verdict}.**")]
    if any(name.endswith(".png") for name in results["files"]) and "xy_diagram.png" not in results["files"]:
        blocks.append((None, "text", "No x-y diagram: the isothermal design gives no stages to step (see the verdict)."))
    return blocks + _figures(results, heading)
