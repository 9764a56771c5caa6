"""Plain-text and Markdown tables and the display units of reports.

Reports show temperatures, pressures and the leading flow in the units the case was written in
(or its ``[report] units`` choice): ``Display`` reads them from the results record's
``display_units`` (scale and offset from SI, resolved by the case layer). A case that names none
is shown in degC, kPa and kmol/h (common practice in basic-engineering documents). results.json
and stages.csv stay in SI. Fractions below ``TRACE_FLOOR`` print as "< 1e-12": a solution's
component flows are converged to a relative precision of about 1e-9 of each feed, so smaller
fractions carry no information.
"""

import math

from ..properties.constants import TRACE_MOLE_FRACTION, ZERO_CELSIUS

SECONDS_PER_HOUR = 3600.0
TRACE_FLOOR = TRACE_MOLE_FRACTION  # fractions below it print as "< 1e-12"
TRACE_TEXT = f"< {TRACE_FLOOR:g}"


class Display:
    """The units of one report: ``temperature``, ``pressure``, ``flow`` texts of SI values, and
    their unit names ``t_unit``, ``p_unit``, ``flow_unit`` (from ``results["display_units"]``)."""

    def __init__(self, units):
        self.units = units
        self.t_unit = units["temperature"]["unit"]
        self.p_unit = units["pressure"]["unit"]
        self.flow_unit = units["flow"]["unit"]
        self.flow_basis = units["flow"].get("basis", "molar")

    def _shown(self, kind, value):
        entry = self.units[kind]
        return value * entry["scale"] + entry["offset"]

    def temperature(self, kelvin):
        """Temperature [K] as text in the report's unit."""
        return f"{self._shown('temperature', kelvin):.1f}"

    def temperature_difference(self, kelvin):
        """Temperature difference [K] as text in the report's unit."""
        return f"{kelvin * self.units['temperature']['scale']:.2g}"

    def pressure(self, pascal):
        """Pressure [Pa] as text in the report's unit, four significant figures."""
        return f"{self._shown('pressure', pascal):.4g}"

    def flow(self, mol_per_s, kg_per_s):
        """The leading flow of a stream (molar [mol/s] and mass [kg/s] given) in the report's unit."""
        return f"{self._shown('flow', kg_per_s if self.flow_basis == 'mass' else mol_per_s):.4g}"


def fraction(value, digits=4):
    """A mole or mass fraction [-]: '-' where undefined, "< 1e-12" below the trace floor."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    if 0.0 < abs(value) < TRACE_FLOOR:
        return TRACE_TEXT
    return f"{value:.{digits}g}"


def celsius(temperature):
    """Temperature [K] as text in degC."""
    return f"{temperature - ZERO_CELSIUS:.1f}"


def kilopascal(pressure):
    """Pressure [Pa] as text in kPa."""
    return f"{pressure / 1e3:.1f}"


def kmol_per_hour(flow):
    """Molar flow [mol/s] as text in kmol/h."""
    return f"{flow * SECONDS_PER_HOUR / 1e3:.4g}"


def kg_per_hour(flow):
    """Mass flow [kg/s] as text in kg/h."""
    return f"{flow * SECONDS_PER_HOUR:.4g}"


def percentage(value, digits=4):
    """A mole or mass fraction [-] as a percentage text (mol%, wt%); "< 1e-10" below the trace floor
    (a fraction of 1e-12), '-' where undefined."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    if 0.0 < abs(value) < TRACE_FLOOR:
        return f"< {100.0 * TRACE_FLOOR:g}"
    return f"{100.0 * value:.{digits}g}"


def kilowatt(power):
    """Heat flow [W] as text in kW."""
    return f"{power / 1e3:.3g}"


def concentration(fraction):
    """A mole fraction [-] as text: mol% from 0.1 % up, ppm (mol) below, "< 1e-12" below the
    trace floor."""
    if fraction >= 1e-3:
        return f"{100.0 * fraction:.4g} mol%"
    if 0.0 < fraction < TRACE_FLOOR:
        return f"{TRACE_TEXT} (mole fraction)"
    return f"{1e6 * fraction:.4g} ppm (mol)"


def mass_concentration(fraction):
    """A mass fraction [-] as text: wt% from 0.1 % up, ppmw below, "< 1e-12" below the trace floor."""
    if fraction >= 1e-3:
        return f"{100.0 * fraction:.4g} wt%"
    if 0.0 < fraction < TRACE_FLOOR:
        return f"{TRACE_TEXT} (mass fraction)"
    return f"{1e6 * fraction:.4g} ppmw"


def number(value, digits=4):
    """A float in ``digits`` significant figures; '-' where it is not defined (NaN, None), and
    "< 1e-12" for magnitudes below the trace floor (trace outlets, closures at round-off)."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    if 0.0 < abs(value) < TRACE_FLOOR:
        return TRACE_TEXT
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
