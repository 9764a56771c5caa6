"""report.md: the run written for a reviewer, from the results record.

Sections: summary, design (when the case has one), safety cautions, inputs (as read, in SI),
components and equilibrium models, streams, absorption per component, stage profile, where the
heat went, convergence and balance closure, the isothermal inert-basis comparison, figures,
property sources, warnings.
"""

from .cautions import SAFETY_CAUTIONS
from .sections import (
    column_lines,
    comparison_table,
    component_table,
    convergence_lines,
    flatten,
    heat_table,
    key_line,
    stage_profile_table,
    stream_table,
    temperature_line,
)
from .comparison_view import verdict_line
from .design_view import design_lines, trays_table
from .sizing_view import sizing_lines, sizing_markdown
from .tables import markdown_table

FIGURE_TITLES = {
    "temperature_profile.png": "Temperature profile",
    "composition_profiles.png": "Composition profiles",
    "xy_diagram.png": "x-y diagram (isothermal inert-basis design, with the passing streams of the rigorous solution)",
    "heat_balance.png": "Where the heat of absorption went",
}


def markdown_report(results):
    """The text of report.md for a results record."""
    case = results["case"]
    blocks = [
        f"# {case['title']}",
        f"Case file `{case['file']}`, solved by traywise {results['software']['version']}. "
        "Machine-readable results: `results.json` (all values in SI) and `stages.csv`.",
    ]
    if case["notes"]:
        blocks += ["## Notes", case["notes"]]
    blocks += [
        "## Summary",
        _bullets([*column_lines(results), *sizing_lines(results), key_line(results), temperature_line(results), verdict_line(results["isothermal_comparison"]) + "."]),
        *_design(results),
        *sizing_markdown(results),
        "## Safety cautions",
        _bullets(SAFETY_CAUTIONS),
        "## Inputs (as read, in SI units)",
        markdown_table(["input", "value"], [(f"`{key}`", value) for key, value in flatten(_inputs(results))]),
        "## Components",
        markdown_table(
            ["component", "formula", "CAS", "equilibrium model", "molar mass [g/mol]"],
            [
                (c["name"], c["formula"], c["cas"], c["equilibrium_model"], f"{c['molar_mass_kg_per_mol'] * 1e3:.4f}")
                for c in results["components"]
            ],
        ),
        "## Streams",
        markdown_table(*stream_table(results)),
        "## Absorption per component",
        markdown_table(*component_table(results)),
        "## Stage profile",
        markdown_table(*stage_profile_table(results)),
        "## Where the heat went",
        markdown_table(*heat_table(results)),
        "## Convergence and balance closure",
        _bullets(convergence_lines(results)),
        "## Isothermal inert-basis comparison",
        _comparison(results),
    ]
    figures = [name for name in FIGURE_TITLES if name in results["files"]]
    if figures:
        blocks += ["## Figures", *(f"![{FIGURE_TITLES[name]}]({name})" for name in figures)]
    blocks += ["## Property sources", _sources(results), "## Warnings", _bullets(results["warnings"]) or "None."]
    return "\n\n".join(blocks) + "\n"


def _design(results):
    """The design section's blocks, none without a design."""
    if results["design"] is None:
        return []
    blocks = ["## Design", _bullets(design_lines(results))]
    table = trays_table(results)
    if table is not None:
        blocks += ["Actual trays by each efficiency route (theoretical stages for the target divided by the overall "
                   "efficiency, and the target solved again on trays with the Murphree efficiency that Lewis's relation "
                   "gives for it):", markdown_table(*table)]
    return blocks


def _comparison(results):
    table = comparison_table(results)
    if table is None:
        return verdict_line(None) + "."
    heading, headers, rows, verdict = table
    text = f"Rigorous stage-by-stage solution compared with the {heading}.\n\n{markdown_table(headers, rows)}\n\n**{verdict}.**"
    if any(name.endswith(".png") for name in results["files"]) and "xy_diagram.png" not in results["files"]:
        text += "\n\nNo x-y diagram: the isothermal design gives no stages to step (see the verdict)."
    return text


def _inputs(results):
    """The echoed inputs without title and notes, which head the report."""
    return {key: value for key, value in results["inputs"].items() if key not in ("title", "notes")}


def _sources(results):
    lines = []
    for name, sources in results["property_sources"].items():
        lines.append(f"- **{name}**")
        lines.extend(f"  - {label}: {citation}" for label, citation in sources.items())
    return "\n".join(lines)


def _bullets(lines):
    return "\n".join(f"- {line}" for line in lines)
