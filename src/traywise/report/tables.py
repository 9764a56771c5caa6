"""Plain-text and Markdown tables and the display units of reports.

Reports show temperatures in degC, pressures in kPa and flows in kmol/h (common practice in
basic-engineering documents); results.json and stages.csv stay in SI.
"""

import math

from ..properties.constants import ZERO_CELSIUS

SECONDS_PER_HOUR = 3600.0


def celsius(temperature):
    """Temperature [K] as text in degC."""
    return f"{temperature - ZERO_CELSIUS:.1f}"


def kilopascal(pressure):
    """Pressure [Pa] as text in kPa."""
    return f"{pressure / 1e3:.1f}"


def kmol_per_hour(flow):
    """Molar flow [mol/s] as text in kmol/h."""
    return f"{flow * SECONDS_PER_HOUR / 1e3:.4g}"


def kilowatt(power):
    """Heat flow [W] as text in kW."""
    return f"{power / 1e3:.3g}"


def concentration(fraction):
    """A mole fraction [-] as text: mol% from 0.1 % up, ppm (mol) below."""
    if fraction >= 1e-3:
        return f"{100.0 * fraction:.4g} mol%"
    return f"{1e6 * fraction:.4g} ppm (mol)"


def number(value, digits=4):
    """A float in ``digits`` significant figures; '-' where it is not defined (NaN, None)."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    return f"{value:.{digits}g}"


def percent(fraction, digits=4):
    """A fraction [-] as a percentage; '-' where it is not defined. Near 100 % the decimals
    show two significant digits of what is left (99.99990, not 100), down to 1e-6 %."""
    if fraction is None or math.isnan(fraction):
        return "-"
    left = 100.0 * (1.0 - fraction)
    if 0.0 < left < 1e-6:
        return "> 99.999999"
    if 0.0 < left < 1.0:
        return f"{100.0 * fraction:.{math.ceil(-math.log10(left)) + 1}f}"
    return f"{100.0 * fraction:.{digits}g}"


def text_table(headers, rows):
    """Rows of strings aligned under headers: first column left, the others right."""
    cells = [list(map(str, headers))] + [list(map(str, row)) for row in rows]
    widths = [max(len(row[i]) for row in cells) for i in range(len(headers))]

    def line(row):
        first = row[0].ljust(widths[0])
        rest = (cell.rjust(width) for cell, width in zip(row[1:], widths[1:]))
        return "  ".join([first, *rest]).rstrip()

    return "\n".join([line(cells[0]), *(line(row) for row in cells[1:])])


def markdown_table(headers, rows):
    """A GitHub-flavoured Markdown table; numbers right-aligned after the first column."""
    head = "| " + " | ".join(map(_escape, headers)) + " |"
    rule = "| --- |" + " ---: |" * (len(headers) - 1)
    body = ["| " + " | ".join(map(_escape, row)) + " |" for row in rows]
    return "\n".join([head, rule, *body])


def _escape(cell):
    return " ".join(str(cell).split()).replace("|", "\\|")
