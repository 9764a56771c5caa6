"""The console summary of a run: what an engineer reads first, in display units.

Three levels: quiet (nothing but the warnings, which go to stderr), normal (streams, absorption,
temperatures, heat, closure, the isothermal check) and verbose (also the stage table and the
property sources).
"""

from .cautions import SAFETY_ONE_LINE
from .comparison_view import verdict_line
from .design_view import design_lines, trays_table
from .sizing_view import sizing_lines
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
from .tables import text_table


def summary_text(results, *, verbose=False, folder=None):
    """The console summary of a results record; ``folder`` is where the results were written."""
    case = results["case"]
    parts = [f"traywise {results['software']['version']}: {case['title']} ({case['file']})"]
    parts.append("\n".join([*column_lines(results), *convergence_lines(results)]))
    if results["design"] is not None:
        parts.append(design_text(results))
    if results.get("sizing") is not None:
        parts.append("\n".join(sizing_lines(results)))
    parts.append(text_table(*stream_table(results)))
    parts.append(text_table(*component_table(results)))
    parts.append("\n".join([key_line(results), temperature_line(results)]))
    parts.append("\n".join([text_table(*heat_table(results)), *water_balance_lines(results)]))
    parts.append(comparison_text(results))
    if verbose:
        parts.append(text_table(*stage_profile_table(results)))
        parts.append(sources_text(results))
    parts.append(warnings_text(results))
    if folder is not None:
        parts.append(f"Results written to {folder}")
    parts.append(SAFETY_ONE_LINE)
    return "\n\n".join(parts)


def design_text(results):
    """The design: target, adjusted input, minimum solvent flow, and the trays by each route."""
    text = "\n".join(design_lines(results))
    table = trays_table(results)
    return text if table is None else f"{text}\nTrays by efficiency route:\n{text_table(*table)}"


def comparison_text(results):
    """The isothermal check and Kremser's rating as a small table, and the verdict."""
    table = comparison_table(results)
    if table is None:
        return verdict_line(None) + "."
    heading, headers, rows, verdict = table
    return f"Compared with the {heading}:\n{text_table(headers, rows)}\n{verdict}."


def warnings_text(results):
    """The warnings as a list, or 'Warnings: none.'."""
    if not results["warnings"]:
        return "Warnings: none."
    return "Warnings:\n" + "\n".join(f"  - {warning}" for warning in results["warnings"])


def sources_text(results):
    """Property sources per component."""
    lines = ["Property sources:"]
    for name, sources in results["property_sources"].items():
        lines.append(f"  {name}:")
        lines.extend(f"    {label}: {citation}" for label, citation in sources.items())
    return "\n".join(lines)
