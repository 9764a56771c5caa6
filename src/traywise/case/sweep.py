"""The ``[sweep]`` table and the options of ``traywise sweep``: the input varied, its range and
number of points, and the outputs tabulated. Options given on the command line replace the
table's values one by one; each value is checked where it was written (the table's key path,
or the option's name), and the table is checked when the case is read."""

from dataclasses import dataclass

import numpy as np

from ..errors import CaseError, InputError
from .limits import check_range
from .reader import Section, suggestion
from .units import UnitProblem, to_si

SWEEP_KEYS = ("input", "from", "to", "points", "log", "outputs", "cooler_stage")
# case word -> name of its range in limits.RANGES
RANGE_OF = {"solvent_flow": "flow", "stages": "stages", "gas_temperature": "temperature",
            "solvent_temperature": "temperature", "top_pressure": "pressure", "cooler_duty": "power"}
# case word -> (name in traywise.design.variables, kinds of the range values, SI unit)
VARIABLES = {
    "solvent_flow": ("solvent_flow", ("molar_flow", "mass_flow"), "mol/s"),
    "stages": ("n_stages", (), "-"),
    "gas_temperature": ("gas_temperature", ("temperature",), "K"),
    "solvent_temperature": ("solvent_temperature", ("temperature",), "K"),
    "top_pressure": ("top_pressure", ("pressure",), "Pa"),
    "cooler_duty": ("cooler_duty", ("power",), "W"),
}
OPTIONS = {
    "input": "--input",
    "from": "--from",
    "to": "--to",
    "points": "--points",
    "log": "--log",
    "outputs": "--output",
    "cooler_stage": "--stage",
}
DEFAULT_POINTS = 21
EXAMPLES = {
    "solvent_flow": '"1500 kg/h" or "80 kmol/h"',
    "stages": "4",
    "gas_temperature": '"20 degC"',
    "solvent_temperature": '"15 degC"',
    "top_pressure": '"1.1 bar"',
    "cooler_duty": '"10 kW"',
}


@dataclass(frozen=True)
class SweepRequest:
    """A sweep ready for ``traywise.design.sweep``.

    variable : str              The case word ('stages', 'solvent_flow', ...)
    design_variable : str       Its name in traywise.design.variables ('n_stages', ...)
    unit : str                  SI unit of ``values``
    values : tuple of float     The points, in order [SI]
    outputs : tuple of str      Output names (traywise.design.sweep)
    cooler_stage : int or None  1-based, for 'cooler_duty'
    log : bool                  Points spaced evenly in the logarithm
    notes : tuple of str        What was done to the range (repeated stage counts dropped)
    """

    variable: str
    design_variable: str
    unit: str
    values: tuple
    outputs: tuple
    cooler_stage: int | None
    log: bool
    notes: tuple

    def echo(self):
        """The request in SI, units in the key names (for sweep.json)."""
        return {
            "input": self.variable,
            "unit": self.unit,
            "from": self.values[0],
            "to": self.values[-1],
            "points": len(self.values),
            "log": self.log,
            "outputs": list(self.outputs),
            "cooler_stage": self.cooler_stage,
        }


def default_outputs(key, liquid_limit=None):
    """Outputs tabulated when none are asked for: the key solute's removal and the temperatures,
    and the liquid outlet concentration a design's ``liquid_limit`` (LiquidOutletLimit) bounds."""
    outputs = (f"fraction_absorbed:{key}", f"outlet_ppmv:{key}", "max_temperature", "liquid_out_temperature")
    if liquid_limit is None:
        return outputs
    return outputs + (f"liquid_out_{liquid_limit.basis}:{liquid_limit.component}",)


def sweep_request(case, *, input_name=None, start=None, end=None, points=None, log=None, outputs=(), cooler_stage=None,
                  around=None):
    """The sweep of ``case``: its ``[sweep]`` table with the command-line options that are given
    (not None, not empty) in place of the table's values.

    Parameters
    ----------
    case : Case                      With ``sweep_table`` (the raw table or None) and ``source``
    input_name, start, end : str or None   Texts as typed ('solvent_flow', '50 kmol/h', '20 degC', '8')
    points : int or None
    log : bool or None
    outputs : tuple of str
    cooler_stage : int or None
    around : dict or None            The designed input ("input", "value" [SI], "stage";
                                     ``traywise.run.designed_for_sweep``): when neither the options
                                     nor the table give a range, the input solved for is swept
                                     around its designed value (``AROUND``)

    Returns
    -------
    SweepRequest

    Raises
    ------
    CaseError   naming the table key or the option
    """
    given = {"input": input_name, "from": start, "to": end, "points": points, "log": log, "outputs": outputs or None,
             "cooler_stage": cooler_stage}
    reader = _Reader(case, given)
    if around is not None and not any(reader.present(key) for key in ("from", "to")):
        if not reader.present("input") or reader.raw("input") == around["input"]:
            return _around(reader, around)
    return reader.request(complete=True)


AROUND = 0.5  # a sweep around a designed value spans it -50 % to +50 % (stages: 4 either side); our choice
STAGES_AROUND = 4


def _around(reader, around):
    """The SweepRequest around the designed value of the input a design solved for."""
    variable, value = around["input"], around["value"]
    if variable == "stages":
        n = int(round(value))
        values = tuple(float(v) for v in range(max(1, n - STAGES_AROUND), n + STAGES_AROUND + 1))
    else:
        points = reader._points()
        values = tuple(float(v) for v in np.linspace(value * (1.0 - AROUND), value * (1.0 + AROUND), points))
    design_variable, _, unit = VARIABLES[variable]
    note = (f"no range given: the {variable.replace('_', ' ')} is swept around its designed value, "
            f"{'4 stages either side' if variable == 'stages' else f'{100 * AROUND:.0f} % either side'}")
    return SweepRequest(variable, design_variable, unit, values, reader._outputs(), around["stage"], False, (note,))


def check_sweep_table(case):
    """Check the case's ``[sweep]`` table alone (when the case is read); CaseError on a problem."""
    if case.sweep_table is not None:
        _Reader(case, {}).request(complete=False)


class _Reader:
    """Each value from the command line when given there, else from the table."""

    def __init__(self, case, given):
        self.case = case
        self.table = Section(case.sweep_table or {}, "sweep", case.source, SWEEP_KEYS)
        self.given = {key: value for key, value in given.items() if value is not None}

    def fail(self, key, message):
        if key in self.given:
            raise CaseError(OPTIONS[key], message)
        self.table.fail(key, message)

    def present(self, key):
        return key in self.given or key in self.table

    def raw(self, key):
        return self.given[key] if key in self.given else self.table.data[key]

    def request(self, *, complete):
        """The SweepRequest; with ``complete`` False, None after checking what is there."""
        missing = [key for key in ("input", "from", "to") if not self.present(key)]
        if missing and complete:
            options = " and ".join(OPTIONS[key] for key in missing)
            raise CaseError(self.case.source, f"the sweep needs {options} (or sweep.{missing[0]} in "
                            "the case's [sweep] table), e.g. --input solvent_flow --from \"1000 kg/h\" --to \"3000 kg/h\"")
        variable = self._variable() if self.present("input") else None
        points, log, outputs = self._points(), self._log(), self._outputs()
        stage = self._cooler_stage(variable)
        ends = [self._value(key, variable) for key in ("from", "to") if variable is not None and self.present(key)]
        if missing:
            return None
        values, notes = self._spaced(variable, *ends, points, log)
        design_variable, _, unit = VARIABLES[variable]
        return SweepRequest(variable, design_variable, unit, values, outputs, stage, log, notes)

    def _variable(self):
        value = self.raw("input")
        if not isinstance(value, str) or value not in VARIABLES:
            hint = suggestion(value, VARIABLES) if isinstance(value, str) else ""
            self.fail("input", f"found {value!r}{hint}; expected one of {', '.join(VARIABLES)}")
        return value

    def _points(self):
        if not self.present("points"):
            return DEFAULT_POINTS
        value = self.raw("points")
        if isinstance(value, bool) or not isinstance(value, int) or value < 2:
            self.fail("points", f"found {value!r}; expected a whole number >= 2")
        return check_range(self, "points", "points", value, found=value)

    def _log(self):
        if not self.present("log"):
            return False
        value = self.raw("log")
        if not isinstance(value, bool):
            self.fail("log", f"found {value!r}; expected true or false (no quotes)")
        return value

    def _outputs(self):
        if not self.present("outputs"):
            design = getattr(self.case, "design", None)
            return default_outputs(self.case.key_component, None if design is None else design.liquid_limit)
        value = self.raw("outputs")
        if isinstance(value, tuple):
            value = list(value)
        if not isinstance(value, list) or not value or not all(isinstance(v, str) for v in value):
            self.fail("outputs", f"found {value!r}; expected a list of output names, e.g. "
                      f"[\"{default_outputs(self.case.key_component)[0]}\", \"max_temperature\"]")
        from ..design.sweep import output_spec  # the design layer owns the output names

        for name in value:
            try:
                output_spec(name, self.case.model)
            except InputError as problem:
                self.fail("outputs", problem.message)
        return tuple(value)

    def _cooler_stage(self, variable):
        if variable != "cooler_duty":
            if self.present("cooler_stage") and variable is not None:
                self.fail("cooler_stage", "is used only when the cooler duty is varied (input = 'cooler_duty')")
            return None
        if not self.present("cooler_stage"):
            self.fail("input", f"'cooler_duty' needs the stage of the cooler: {OPTIONS['cooler_stage']} N, or "
                      "cooler_stage = N in the [sweep] table")
        value, n = self.raw("cooler_stage"), self.case.column.n_stages
        if isinstance(value, bool) or not isinstance(value, int) or not 1 <= value <= n:
            self.fail("cooler_stage", f"found {value!r}; expected a stage from 1 to {n} (numbered from the top)")
        return value

    def _value(self, key, variable):
        """The range end under ``key`` in SI for ``variable``."""
        value = self.raw(key)
        if variable == "stages":
            number = _whole_number(value)
            if number is None or number < 1:
                self.fail(key, f"found {value!r}; expected a whole number of stages >= 1, e.g. 4")
            return float(check_range(self, key, "stages", number, found=value))
        kinds = VARIABLES[variable][1]
        if not isinstance(value, str):
            self.fail(key, f"found {value!r}; expected a text with its unit, e.g. {EXAMPLES[variable]}")
        try:
            si, kind = to_si(value, kinds)
        except UnitProblem as problem:
            self.fail(key, str(problem))
        if kind == "mass_flow":
            solvent = self.case.column.solvent.component_flows
            si /= float(solvent @ self.case.model.molar_mass) / float(solvent.sum())  # kg/s -> mol/s
        if variable == "cooler_duty" and si < 0.0:
            self.fail(key, f"found '{value}'; a cooler removes heat: expected a duty >= 0")
        if variable != "cooler_duty" and not si > 0.0:
            self.fail(key, f"found '{value}'; expected a value > 0")
        check_range(self, key, RANGE_OF[variable], si, found=f"{value} = {si:.6g} mol/s" if kind == "mass_flow" else value)
        column = self.case.column
        if variable == "solvent_temperature":
            self._check_solvent_liquid(key, value, si, column.top_pressure)
        if variable == "top_pressure":
            self._check_solvent_liquid(key, value, column.solvent.temperature, si)
        return si

    def _check_solvent_liquid(self, key, value, temperature, pressure):
        """The solvent must enter liquid, as the case format requires of its feed: above its
        melting point, below its boiling point at the top pressure."""
        model = self.case.model
        i = model.names.index(self.case.solvent)
        melting = model.components[i].melting_point
        if melting is not None and temperature < melting.value:
            self.fail(key, f"found '{value}': the solvent ({self.case.solvent}) would be fed below its melting point "
                      f"({melting.value:.2f} K)")
        if model.equilibrium[i] == "raoult":
            k = model.evaluate(np.array([temperature]), np.array([pressure])).k[0, i]
            if k >= 1.0:
                self.fail(key, f"found '{value}': the solvent ({self.case.solvent}) fed at {temperature:.2f} K would "
                          f"boil on the top stage at {pressure / 1e3:.4g} kPa")

    def _spaced(self, variable, low, high, points, log):
        if log and not (low > 0.0 and high > 0.0):
            self.fail("log", "points spaced in the logarithm need a range above zero; start the range above 0")
        values = np.geomspace(low, high, points) if log else np.linspace(low, high, points)
        notes = []
        if variable == "stages":
            counts = list(dict.fromkeys(int(round(v)) for v in values))
            if len(counts) < points:
                notes.append(f"{points} points give {len(counts)} different whole stage counts; each is solved once")
            values = np.array(counts, dtype=float)
        return tuple(float(v) for v in values), tuple(notes)


def _whole_number(value):
    """An int from 4 or "4"; None when it is not a whole number."""
    if isinstance(value, bool):
        return None
    if isinstance(value, int):
        return value
    if isinstance(value, str) and value.strip().isdigit():
        return int(value.strip()) if len(value.strip()) <= 18 else 10**18  # no int() of thousands of digits
    return None
