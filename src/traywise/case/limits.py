"""The ranges of the process inputs traywise takes, each with its reason: one table.

A value outside its range is refused when the case is read (exit status 2, naming the key, the
range and the reason), before anything is solved: beyond these ranges the property models
are extrapolated past any meaning, floating-point numbers overflow or underflow, or a solve
needs more memory and time than a design calculation should.
"""

from dataclasses import dataclass


@dataclass(frozen=True)
class Range:
    """Closed interval ``low`` to ``high`` in SI; shown in ``unit`` (``scale`` SI per unit)."""

    low: float
    high: float
    unit: str
    scale: float
    reason: str

    def holds(self, value):
        return self.low <= value <= self.high

    def words(self):
        number = (lambda v: f"{v / self.scale:g}") if self.unit else (lambda v: f"{int(v)}")
        unit = f" {self.unit}" if self.unit else ""
        return f"{number(self.low)} to {number(self.high)}{unit}"


MAX_STAGES = 1000
RANGES = {
    "stages": Range(1, MAX_STAGES, "", 1.0,
                    "gas absorbers have at most a few hundred theoretical stages (common practice), and the "
                    "solver's memory and time grow with the stage count (100,000 stages take minutes and "
                    "over a gigabyte)"),
    "temperature": Range(100.0, 1000.0, "K", 1.0,
                         "the component data (vapour pressures, Henry's constants, activity models) are "
                         "fitted near the liquid range; a gas hotter than 1000 K is cooled before any "
                         "absorber (common practice)"),
    "pressure": Range(1e3, 1e8, "kPa", 1e3,
                      "from a deep vacuum to 1000 bar; the gas is ideal and the liquid incompressible in "
                      "traywise's models, which fail long before the upper end"),
    "pressure_difference": Range(0.0, 1e6, "kPa", 1e3,
                                 "a tray drops a few hundred pascal to a few kilopascal (common practice)"),
    "flow": Range(1e-6, 1e6, "mol/s", 1.0,
                  "from a laboratory column to far beyond the largest absorbers (1e6 mol/s is some "
                  "80 million Nm3/h); outside it the balances lose their floating-point precision"),
    "mass_flow": Range(1e-9, 1e6, "kg/s", 1.0,
                       "the molar flow it gives must lie within 1e-06 to 1e+06 mol/s (from a laboratory column "
                       "to far beyond the largest absorbers)"),
    "power": Range(0.0, 1e9, "MW", 1e6,
                   "a cooler or heat loss of up to 1000 MW, beyond any absorber"),
    "efficiency": Range(0.01, 1.0, "as a fraction", 1.0,
                        "a tray or stage of less than 1 % efficiency transfers nothing a design can count on, "
                        "and its tray count stages / efficiency would pass any column's"),
    "points": Range(2, 10_000, "", 1.0, "a sweep of more points than this is better split into several"),
}


def check_range(section, key, name, value, found=None, *, lower=True):
    """Refuse ``value`` [SI] read under ``key`` of ``section`` unless ``RANGES[name]`` holds it
    (only its upper end with ``lower`` False: a component flow may be 0).

    ``found`` is the value as written (for the message; default: the table's entry).
    """
    limits = RANGES[name]
    if not (limits.holds(value) or (not lower and value <= limits.high)):
        shown = found if found is not None else section.data.get(key, value)
        if isinstance(shown, int) and not isinstance(shown, bool) and abs(shown) > 10**15:
            shown = f"a whole number of {len(str(abs(shown)))} digits"
        else:
            shown = repr(shown)
        span = limits.words() if lower else f"at most {limits.words().split(' to ')[1]}"
        section.fail(key, f"found {shown}; expected {span}: {limits.reason}")
    return value
